# error case: inf value
vsource vin in gnd
resistor R1 in gnd = inf
