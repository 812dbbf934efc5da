# R3 in series with the current source leaves the transimpedance alone,
# so v(out)/iin needs no value for it, but its own noise does: exit 2.
title      "A resistor in series with a current source"
isource    iin   gnd  a
resistor   R3    a    out
resistor   R2    out  gnd
value      R2 = 1k
transfer   Z = v(out) / iin
