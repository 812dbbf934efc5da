# error case: opamp output gnd
vsource vin in gnd
resistor R1 in m
resistor R2 m gnd
opamp U1 gnd gnd m
