# eval with one output left out: the probe's input resistance Rin is
# ideal (--limit Rin=inf), so Zs (a sensor current into Rin alone) has
# no finite limit, and only Av is evaluated.  Exit 1.
#
# By hand, Ohm's law/voltage divider: Zs = Rin, unbounded; Av = Zb/(R1 +
# Zb) with Zb = Rin || 1/(s Cb), which tends to 1/(1 + s R1 Cb) as
# Rin -> inf.  With R1 = 1k and Cb = 1u its corner is 1/(2 pi R1 Cb) =
# 159.1549431 Hz, where |Av| = 1/sqrt(2) = 0.7071067812, -3.0103 dB,
# and the phase is -45 degrees; DC is 1.
title     "sensor and low-pass into an ideal probe"
isource   isens gnd a
resistor  Ra    a   gnd = Rin
vsource   vin   in  gnd
resistor  R1    in  out
resistor  Rb    out gnd = Rin
capacitor Cb    out gnd
transfer  Zs = v(a) / isens
transfer  Av = v(out) / vin
value     R1 = 1k
value     Cb = 1u
