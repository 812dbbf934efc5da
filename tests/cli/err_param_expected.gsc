# error case: param expected
vsource vin g gnd
mosfet M1 d g gnd gm=gm1 rds
resistor RD d gnd
