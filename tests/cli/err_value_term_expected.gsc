# error case: value term expected
vsource vin in gnd
resistor R1 in gnd = 2*
