# Node x holds a conductance g and a vccs of transconductance g that
# draws the same current back: its net conductance is zero whatever g is,
# a cancellation the check of the pattern of nonzeros cannot see.  Exit 1.
title      "A conductance cancelled by a vccs"
vsource    vin   in   gnd
resistor   R1    in   out
resistor   R2    out  gnd
conductance G1   x    gnd  = g
vccs       G2    gnd  x    x  gnd = g
transfer   H = v(out) / vin
