# The return ratio of a vccs whose controlling voltage its output never
# reaches is zero, so the asymptotic gain of H for it does not exist.
# Exit 1.
title      "A loop gain of zero"
vsource    vin   in   gnd
resistor   R1    in   gnd
resistor   R2    out  gnd
vccs       G1    out  gnd  in  gnd = g
transfer   H = v(out) / vin
loopgain   T = G1 for H
