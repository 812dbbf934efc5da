# A follower with positive feedback tuned to the edge of instability:
# the gain A makes the denominator R1 + R2 - A*R1 vanish.
title      "Positive feedback at the edge"
vsource    vin   in   gnd
resistor   R1    in   n
resistor   R2    n    out
vcvs       A     out  gnd  n gnd
value      R1 = 1k
value      R2 = 1k
value      A  = 2
transfer   Av = v(out) / vin
