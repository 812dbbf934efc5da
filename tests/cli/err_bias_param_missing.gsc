# error case: bias param missing
vsource vin g gnd
mosfet M1 d g gnd
resistor RD d gnd
bias M1
