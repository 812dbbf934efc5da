# A figure that divides by an output which is zero: v(gnd) is 0 for any
# input.  Exit 1.
title      "A figure over a zero output"
vsource    vin   in   gnd
resistor   R1    in   out
resistor   R2    out  gnd
transfer   H = v(out) / vin
transfer   Z0 = v(gnd) / vin
figure     F = H / Z0
