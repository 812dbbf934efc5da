# Two stages read by a probe whose input resistance Rin is ideal
# (--limit Rin=inf).  Zs, a sensor current into Rin alone, has no finite
# limit and is left out with its message; bode runs on Av.  Exit 1.
#
# By hand, Ohm's law/voltage divider:
#   Zs = v(a) / isens = Rin (Ohm's law), unbounded as Rin -> inf;
#   Av = v(out) / vin = Rin / (R1 + Rin) (voltage divider), which tends
#   to 1 as Rin -> inf: "Av = 1".
title    "sensor and divider into an ideal probe"
isource  isens gnd a
resistor Ra    a   gnd = Rin
vsource  vin   in  gnd
resistor R1    in  out
resistor Rb    out gnd = Rin
transfer Zs = v(a) / isens
transfer Av = v(out) / vin
