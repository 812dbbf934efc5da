# error case: value symbol
vsource vin in gnd
resistor R1 in gnd
value 10k = R1
