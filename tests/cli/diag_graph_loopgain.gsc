# A return ratio over the term budget: its numbers are not read off the
# graph of minors (which is the transfer's), so eval says so instead of
# printing numbers of another circuit.
vsource  vin in gnd
resistor RS  in g
resistor RF  d g
mosfet   M1  d g gnd gm=gm rds=inf cgs=Cgs
resistor RD  d gnd
transfer Av = v(d) / vin
loopgain T  = M1.gm for Av
value    RS = 1k
value    RF = 100k
value    gm = 2m
value    Cgs = 1p
value    RD = 10k
