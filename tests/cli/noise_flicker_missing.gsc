vsource vin g gnd
mosfet M1 d g gnd gm=1m rds=inf
resistor RD d gnd = 10k
value kf_M1 = 1e-25
value w_M1 = 10u
transfer Av = v(d) / vin
