# error case: dotted name
vsource vin in gnd
resistor R1 in M1.d
