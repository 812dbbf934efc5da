# error case: device node
vsource vin g gnd
mosfet M1 d g
resistor RD d gnd
