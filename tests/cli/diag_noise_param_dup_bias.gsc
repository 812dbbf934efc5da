# kf_M1 bound by the mosfet line and again by the bias line, and w_M1 by
# the bias line and again by a later value line: each second one is
# reported, as for two value lines.
vsource vin g gnd
mosfet M1 d g gnd rds=inf kf=1e-25
bias   M1 id=1m vds=2 k=2m kf=2e-25 cox=5m w=20u l=1u
resistor RD d gnd = 10k
value w_M1 = 10u
transfer Av = v(d) / vin
