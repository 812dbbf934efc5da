# error case: unknown param
vsource vin g gnd
mosfet M1 d g gnd gmm=gm1
resistor RD d gnd
