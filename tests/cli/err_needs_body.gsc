# error case: needs body
vsource vin g gnd
mosfet M1 d g gnd gmb=gmb1
resistor RD d gnd
