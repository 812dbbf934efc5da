# error case: division by zero
vsource vin in gnd
resistor R1 in gnd = R/0
