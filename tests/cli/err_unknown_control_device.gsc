# error case: unknown control device
vsource vin g gnd
mosfet M1 d g gnd
resistor RD d gnd
ccvs H1 out gnd M1
resistor RL out gnd
