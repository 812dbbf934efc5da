# error case: value paren
vsource vin in gnd
resistor R1 in gnd
value R1 = (1 + 2 * 3
