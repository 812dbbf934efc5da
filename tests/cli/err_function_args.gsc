# error case: function args
vsource vin in gnd
resistor R1 in gnd
value R1 = sqrt(2, 3)
