# error case: unknown statement
vsource vin in gnd
resistr R1 in gnd
