# The widely scaled Sallen-Key low-pass of chk_sk_scaled.gsc with a gain
# of K = 1 + R4/R3 = 2 (a non-inverting amplifier in place of the
# follower); its denominator R1 R2 C1 C2 s^2 + (R1 C2 + R2 C2
# + (1 - K) R1 C1) s + 1 has a negative middle coefficient here, as the
# textbook form says for K > 1 + (R1 C2 + R2 C2)/(R1 C1).
title      "Sallen-Key low-pass, gain 1 + R4/R3, widely scaled"
vsource    vin   in   gnd
resistor   R1    in   a
resistor   R2    a    b
capacitor  C1    a    out
capacitor  C2    b    gnd
opamp      U1    out  b    m
resistor   R3    m    gnd
resistor   R4    out  m
value      R1 = 0.8m
value      R2 = 137.5k
value      C1 = 2
value      C2 = 1p
value      R3 = 10k
value      R4 = 10k
transfer   H  = v(out) / vin
