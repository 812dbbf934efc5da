# An ideal differentiator, H = -s*R1*C1: the gain rises without bound,
# so H(s)/s has no partial-fraction expansion and step has no response
# to show.  Exit 1.
title      "Ideal differentiator"
vsource    vin   in   gnd
capacitor  C1    in   n
resistor   R1    n    out
opamp      U1    out  gnd  n
value      C1 = 1n
value      R1 = 1k
transfer   H = v(out) / vin
