# Bias lines that fix a mosfet twice, too little, or with words a
# mosfet bias does not take; all are reported: exit 2.
title      "Four mosfets, four ill-formed bias lines"
vsource    vin   in   gnd
resistor   RD    out  gnd
value      RD  = 10k
mosfet     M1    out  in  gnd  gm=gm1 rds=ro1
mosfet     M2    out  in  gnd  gm=gm2 rds=ro2
mosfet     M3    out  in  gnd  gm=gm3 rds=ro3
mosfet     M4    out  in  gnd  gm=gm4 rds=ro4
bias       M1    id=100u k=2m vov=0.2 vds=1 lambda=0.05
bias       M2    id=100u vds=1
bias       M3    id=100u vds=1 vov=0.2 lambda=0.05 idss=1m
bias       M4    type=cmos id=100u vds=1 vov=0.2 lambda=0.05
transfer   Av  = v(out) / vin
