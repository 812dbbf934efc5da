# error case: unknown function
vsource vin in gnd
resistor R1 in gnd
value R1 = sqr(4)
