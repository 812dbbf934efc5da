# Two buffered RC sections with equal time constants by their values only
# (R1 C1 = R2 C2 = 1 ms): a double pole numerically, two distinct factors
# in the exact denominator, so it is shown as a numeric cluster.
title "two buffered RC sections"
vsource   vin in  gnd
resistor  R1  in  a
capacitor C1  a   gnd
vcvs      E1  b   gnd a gnd
resistor  R2  b   out
capacitor C2  out gnd
value R1 = 1k
value C1 = 1u
value R2 = 2k
value C2 = 500n
value E1 = 1
transfer  Av = v(out) / vin
