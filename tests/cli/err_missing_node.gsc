# error case: missing node
vsource vin in gnd
resistor R1 in
