# Node x holds a conductance g1 and a vccs of transconductance g2 that
# draws the current back; with g1 = g2 its net conductance is zero.  The
# exact result cancels the factor g1 - g2 (x does not reach the output),
# but the numeric solve that check compares it with meets a singular
# matrix.  Exit 1.
title      "A cancellation away from the output"
vsource    vin   in   gnd
resistor   R1    in   out
resistor   R2    out  gnd
conductance G1   x    gnd  = g1
vccs       G2    gnd  x    x  gnd = g2
value      R1 = 1k
value      R2 = 1k
value      g1 = 1m
value      g2 = 1m
transfer   H = v(out) / vin
