# Output resistance of a cascode current sink in a bias generator: M1 is
# the current source, M2 the cascode device with its gate at a quiet bias
# (small-signal ground).
title      "Cascode output resistance"
mosfet     M1    mid  gnd  gnd  gm=gm1 rds=ro1
mosfet     M2    out  gnd  mid  gm=gm2 rds=ro2
value      gm1 = 1m
value      gm2 = 1m
value      ro1 = 100k
value      ro2 = 100k
impedance  Rout = out, gnd
