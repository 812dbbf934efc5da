# error case: exponent integer
vsource vin in gnd
resistor R1 in gnd = R^0.5
