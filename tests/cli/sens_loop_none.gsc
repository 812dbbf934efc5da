# Unity-gain Sallen-Key low-pass, the anti-alias filter ahead of an audio
# converter; the buffer is an ideal op-amp wired as a follower.
title      "Sallen-Key low-pass, unity gain"
vsource    vin   in   gnd
resistor   R1    in   a
resistor   R2    a    b
capacitor  C1    a    out
capacitor  C2    b    gnd
opamp      U1    out  b    out
value      R1 = 10k
value      R2 = 10k
value      C1 = 2.2n
value      C2 = 1n
transfer   H  = v(out) / vin
