# error case: value twice
vsource vin in gnd
resistor R1 in gnd
value R1 = 1k
value R1 = 2k
