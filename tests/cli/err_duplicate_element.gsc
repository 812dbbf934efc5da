# error case: duplicate element
vsource vin in gnd
resistor R1 in out
resistor R1 out gnd
