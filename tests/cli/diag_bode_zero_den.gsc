# Values that cancel in the denominator (R1 + R2 = 0): bode refuses them, exit 1.
title      "A divider whose values cancel"
vsource    vin   in   gnd
resistor   R1    in   out
resistor   R2    out  gnd
value      R1 = 1k
value      R2 = -1k
transfer   H = v(out) / vin
