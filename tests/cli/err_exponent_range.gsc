# error case: exponent range
vsource vin in gnd
resistor R1 in gnd = (R^10)^10
