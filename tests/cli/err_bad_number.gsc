# error case: bad number
vsource vin in gnd
resistor R1 in gnd = 4.7q
