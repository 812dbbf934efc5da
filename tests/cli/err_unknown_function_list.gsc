# error case: unknown function list
vsource vin in gnd
resistor R1 in gnd
value R1 = cosh(1)
