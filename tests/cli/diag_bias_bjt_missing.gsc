# A bjt bias line without the figures its model needs: exit 2.
title      "A bjt bias line without beta and vce"
vsource    vin   in   gnd
resistor   RC    out  gnd
value      RC  = 10k
bjt        Q1    out  in  gnd  gm=g1 rpi=rp1
bias       Q1    ic=1m
transfer   Av  = v(out) / vin
