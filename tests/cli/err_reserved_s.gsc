# error case: reserved s
vsource vin in gnd
resistor R1 in gnd = 2*s
