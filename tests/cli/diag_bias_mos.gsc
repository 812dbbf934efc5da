# Bias lines whose figures a square-law mosfet cannot take, one fault
# per device; every bias line is checked, so all are reported: exit 2.
# Eight identical common-source devices in parallel, of our own invention.
title      "Eight mosfets, eight faulty bias lines"
vsource    vin   in   gnd
resistor   RD    out  gnd
value      RD  = 10k
mosfet     M1    out  in  gnd  gm=gm1 rds=ro1
mosfet     M2    out  in  gnd  gm=gm2 rds=ro2
mosfet     M3    out  in  gnd  gm=gm3 rds=ro3
mosfet     M4    out  in  gnd  gm=gm4 rds=ro4
mosfet     M5    out  in  gnd  gm=gm5 rds=ro5
mosfet     M6    out  in  gnd  gm=gm6 rds=ro6
mosfet     M7    out  in  gnd  gnd  gm=gm7 rds=ro7 gmb=gb7
mosfet     M8    out  in  gnd  gnd  gm=gm8 rds=ro8 gmb=gb8
bias       M1    id=100u vds=-1 k=2m lambda=0.05
bias       M2    id=100u vds=0 k=2m lambda=0.05
bias       M3    id=100u vds=1 vov=-0.1 lambda=0.05
bias       M4    vds=1 k=2m vgs=0.3 vth=0.5 lambda=0.05
bias       M5    id=100u vds=1 vov=0.2 lambda=0
bias       M6    id=100u vds=1 vov=0.2 vgs=0.7 vth=0.5 lambda=0.05
bias       M7    id=100u vds=1 vov=0.2 lambda=0.05 gamma=-0.4 phi=0.4 vsb=0
bias       M8    id=100u vds=1 vov=0.2 lambda=0.05 gamma=0.4 phi=-0.4 vsb=0
transfer   Av  = v(out) / vin
