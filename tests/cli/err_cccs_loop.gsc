# error case: cccs loop
vsource vin in gnd
resistor R1 in gnd
cccs F1 a gnd F2
cccs F2 a gnd F1
resistor Ra a gnd
