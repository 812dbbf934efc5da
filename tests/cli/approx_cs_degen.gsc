# A common-source stage with source degeneration: the input stage of a
# sensor front end, biased from a 3.3 V rail (the rail is small-signal
# ground).  Numbers are a demo operating point.
title      "Degenerated common-source stage"
ground     vdd
vsource    vin   in   gnd
mosfet     M1    out  in  src  gm=gm1 rds=ro1
resistor   RD    out  vdd
resistor   RS    src  gnd
value      RD  = 10k
value      RS  = 1k
value      gm1 = 2m
value      ro1 = 50k
transfer   Av  = v(out) / vin
impedance  Zout = out, gnd
