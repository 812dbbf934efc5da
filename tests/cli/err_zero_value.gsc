# error case: zero value
vsource vin in gnd
resistor R1 in gnd = 0
