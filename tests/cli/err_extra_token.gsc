# error case: extra token
vsource vin in gnd
resistor R1 in gnd out
