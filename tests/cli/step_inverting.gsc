# An inverting stage with a pole: the response falls monotonically from 0
# to -20 (no overshoot, no peak at t = 0).  An underdamped RLC low-pass
# inverted by a gain of -20 overshoots below -20: the peak is of |y|.
title "inverting stages"
vsource   vin in  gnd
resistor  R1  in  n
resistor  R2  n   out
capacitor C2  n   out
vcvs      A   out gnd gnd n
resistor  R3  in  m
inductor  L3  m   lc
capacitor C3  lc  gnd
vcvs      Ai  inv gnd gnd lc
value R1 = 1k
value R2 = 20k
value C2 = 1n
value A  = 1M
value R3 = 10
value L3 = 1m
value C3 = 1u
value Ai = 20
transfer  Av = v(out) / vin
transfer  Ar = v(inv) / vin
