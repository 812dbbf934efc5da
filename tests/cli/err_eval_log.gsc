# error case: eval log
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
value R1 = log10(0)
value R2 = 1k
transfer H = v(out) / vin
