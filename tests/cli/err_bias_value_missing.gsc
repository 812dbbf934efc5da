# error case: bias value missing
vsource vin g gnd
mosfet M1 d g gnd
resistor RD d gnd
bias M1 id= vds=2
