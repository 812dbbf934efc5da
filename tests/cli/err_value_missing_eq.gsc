# error case: value missing eq
vsource vin in gnd
resistor R1 in gnd
value R1 10k
