# A unity-gain Sallen-Key low-pass whose values span fifteen decades:
# R1 = 0.8 mOhm and C1 = 2 F, with R2 and C2 chosen to keep the corner of
# the 10k/10k/2.2n/1n filter of examples/sallen_key.gsc
# (w0 = 1/sqrt(R1 R2 C1 C2), the textbook second-order form).  At 10 GHz
# the response is near 1e-12; a long double solve of the equations loses
# the digits there, the exact reference does not, so check must not
# report a mismatch.
title      "Sallen-Key low-pass, unity gain, widely scaled"
vsource    vin   in   gnd
resistor   R1    in   a
resistor   R2    a    b
capacitor  C1    a    out
capacitor  C2    b    gnd
opamp      U1    out  b    out
value      R1 = 0.8m
value      R2 = 137.5k
value      C1 = 2
value      C2 = 1p
transfer   H  = v(out) / vin
