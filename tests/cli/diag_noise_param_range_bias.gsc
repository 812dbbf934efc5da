# Noise parameters at or below zero on a bias line are refused where
# they are written, when the file is read.
vsource vin g gnd
mosfet M1 d g gnd rds=inf
bias   M1 id=1m vds=2 k=2m nthermal=-2/3 kf=1e-25 cox=5m w=0 l=1u
resistor RD d gnd = 10k
transfer Av = v(d) / vin
