# error case: expected control
vsource vin in gnd
resistor R1 in gnd
cccs F1 out gnd = 3
