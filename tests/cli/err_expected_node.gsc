# error case: expected node
vsource vin in gnd
resistor R1 in = 10k
