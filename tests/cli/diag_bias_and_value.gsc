# M1's gm has a value line and the bias line sets it as well: exit 2.
title      "A value line and a bias line for one symbol"
vsource    vin   in   gnd
resistor   RD    out  gnd
mosfet     M1    out  in  gnd  gm=gm1 rds=ro1
value      RD  = 10k
value      gm1 = 2m
bias       M1    id=100u vds=1 vov=0.2 lambda=0.05
transfer   Av  = v(out) / vin
