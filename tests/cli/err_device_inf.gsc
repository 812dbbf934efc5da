# error case: device inf
vsource vin g gnd
mosfet M1 d g gnd gm=inf
resistor RD d gnd
