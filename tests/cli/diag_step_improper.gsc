# A differentiator whose gain rises without bound: H(s)/s has no partial-fraction expansion, so step fails.
title      "Ideal differentiator"
vsource    vin   in   gnd
capacitor  C1    in   x
vcvs       E1    out  gnd  gnd  x  1meg
resistor   R1    x    out
value      C1 = 1n
value      R1 = 1k
transfer   H = v(out) / vin
