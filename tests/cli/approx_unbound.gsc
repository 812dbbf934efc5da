title "unbound"
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
value R1 = 1k
transfer H = v(out) / vin
