# An inverting amplifier for a lab signal conditioner, with an amplifier
# of finite open-loop gain A (a VCVS) instead of an ideal one.
title      "Inverting amplifier, finite open-loop gain"
vsource    vin   in   gnd
resistor   R1    in   n
resistor   R2    n    out
vcvs       A     out  gnd  gnd n
value      R1 = 1k
value      R2 = 10k
value      A  = 100k
transfer   Av = v(out) / vin
