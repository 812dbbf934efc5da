# error case: impedance node
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
impedance Z = out,
