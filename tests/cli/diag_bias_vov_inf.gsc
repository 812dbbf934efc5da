# A drain current and a K so far apart that the overdrive sqrt(2*ID/K)
# overflows a long double: exit 2.
title      "An overdrive out of range"
vsource    vin   in   gnd
resistor   RD    out  gnd
mosfet     M1    out  in  gnd  gm=gm1 rds=ro1
value      RD  = 10k
bias       M1    id=1e4900 k=1e-4900 vds=1 lambda=0.05
transfer   Av  = v(out) / vin
