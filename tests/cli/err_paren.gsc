# error case: paren
vsource vin in gnd
resistor R1 in gnd = 1/(2*R
