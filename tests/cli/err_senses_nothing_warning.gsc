# error case: senses nothing warning
vsource vin in gnd
resistor R1 in gnd
vccs G1 in gnd x x
resistor Rx x gnd
vsource V2 in gnd
