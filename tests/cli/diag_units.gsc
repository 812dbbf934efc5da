# Bias figures that are not numbers with a unit that fits: every bad
# figure of a bias line is reported: exit 2.
title      "Figures with bad units"
vsource    vin   in   gnd
resistor   RD    out  gnd
value      RD  = 10k
mosfet     M1    out  in  gnd  gm=gm1 rds=ro1
bjt        Q1    out  in  gnd  gm=gq1 rpi=rp1
bias       M1    id=abc vds=2A vth=2q k=1/3m lambda=1/0 vov=1e99999
bias       Q1    ic=1m vce=2 beta=100 temp=27mC
transfer   Av  = v(out) / vin
