# error case: value cycle
vsource vin in gnd
resistor R1 in gnd
value R1 = 2*k
value k = R1/2
