# error case: not keyword
vsource vin in gnd
= R1 in gnd
