# error case: eval power
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
value R1 = (-8)^(1/3)
value R2 = 0^-1
transfer H = v(out) / vin
