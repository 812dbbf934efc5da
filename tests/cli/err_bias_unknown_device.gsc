# error case: bias unknown device
vsource vin g gnd
mosfet M1 d g gnd
resistor RD d gnd
bias M2 id=1m
