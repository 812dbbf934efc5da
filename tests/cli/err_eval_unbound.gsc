# error case: eval unbound
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
value R1 = 2*Rbase
value R2 = 1k
transfer H = v(out) / vin
