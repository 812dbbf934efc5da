# kf_M1 bound twice: by the mosfet line and by a value line.
vsource vin g gnd
mosfet M1 d g gnd gm=1m rds=inf kf=1e-25 cox=5m w=10u l=1u
resistor RD d gnd = 10k
value kf_M1 = 2e-25
transfer Av = v(d) / vin
