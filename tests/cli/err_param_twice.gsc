# error case: param twice
vsource vin g gnd
mosfet M1 d g gnd gm=gm1 gm=gm2
resistor RD d gnd
