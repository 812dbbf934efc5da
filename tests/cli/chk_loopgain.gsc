# check on return ratios and the asymptotic-gain parts (their exact
# reference solves the circuit with the controlled source replaced, as
# the derivation defines them), and on a figure that recombines them:
# A = T_inf T/(1 + T) + T_direct/(1 + T), the asymptotic-gain formula
# (Rosenstark 1974, from memory), which must equal Av.
vsource  vin in gnd
resistor RS  in g
resistor RF  d g
mosfet   M1  d g gnd gm=gm rds=inf cgs=Cgs
resistor RD  d gnd
transfer Av = v(d) / vin
loopgain T  = M1.gm for Av
figure   Achk = T_inf*T/(1 + T) + T_direct/(1 + T)
value    RS = 1k
value    RF = 100k
value    gm = 2m
value    Cgs = 1p
value    RD = 10k
