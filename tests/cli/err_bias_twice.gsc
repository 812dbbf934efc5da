# error case: bias twice
vsource vin g gnd
mosfet M1 d g gnd
resistor RD d gnd
bias M1 id=1m
bias M1 id=2m
