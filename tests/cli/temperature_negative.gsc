vsource vin in gnd
resistor R1 in out = 1k
resistor R2 out gnd = 1k
value Tamb = 20
temperature Tamb - 273.15
transfer H = v(out) / vin
