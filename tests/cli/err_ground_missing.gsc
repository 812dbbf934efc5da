# error case: ground missing
ground
vsource vin in gnd
resistor R1 in gnd
