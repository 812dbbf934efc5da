# error case: eval overflow
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
value R1 = exp(20000)
value R2 = 1e5000
transfer H = v(out) / vin
