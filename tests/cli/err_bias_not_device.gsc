# error case: bias not device
vsource vin g gnd
mosfet M1 d g gnd
resistor RD d gnd
bias RD id=1m
