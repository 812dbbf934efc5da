# error case: bias device missing
vsource vin g gnd
mosfet M1 d g gnd
resistor RD d gnd
bias id=1m
