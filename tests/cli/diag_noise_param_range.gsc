# A noise parameter below zero on the mosfet line is refused when the
# noise analysis reads it.
vsource vin g gnd
mosfet M1 d g gnd gm=1m rds=inf nthermal=-2/3
resistor RD d gnd = 10k
transfer Av = v(d) / vin
