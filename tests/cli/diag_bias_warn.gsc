# Bias lines that work but deserve a word: a mosfet in triode, body
# figures for a device with no gmb, a part the device line fixes, a
# saturated bjt, va and ft for a bjt with no ro and no cpi.  Warnings
# only: exit 0.
title      "Biased, with warnings"
vsource    vin   in   gnd
resistor   RD    out  gnd
value      RD  = 10k
mosfet     M1    out  in  gnd  gm=gm1 rds=ro1
mosfet     M2    out  in  gnd  gm=gm2 rds=ro2
mosfet     M3    out  in  gnd  gm=gm3 rds=50k
bjt        Q1    out  in  gnd  gm=gq1 rpi=rp1
bias       M1    id=100u vds=0.1 vov=0.2 lambda=0.05
bias       M2    id=100u vds=1 vov=0.2 lambda=0.05 gamma=0.4 phi=0.4 vsb=0
bias       M3    id=100u vds=1 vov=0.2 lambda=0.05
bias       Q1    ic=1m vce=0.1 beta=100 va=50 ft=300M cmu=1p
transfer   Av  = v(out) / vin
