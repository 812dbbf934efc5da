# error case: transfer source
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
transfer H = v(out) /
