# error case: ground bad
ground vdd = 0
vsource vin in gnd
resistor R1 in vdd
