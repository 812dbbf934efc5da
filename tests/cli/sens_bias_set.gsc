# The degenerated common-source stage again, with M1's small-signal values
# worked out from its operating point by a bias line (square law with
# channel-length modulation) instead of being written by hand.
title      "Degenerated common-source stage, biased"
ground     vdd
vsource    vin   in   gnd
mosfet     M1    out  in  src  gm=gm1 rds=ro1
bias       M1    id=200u vds=1.5 k=4m vth=0.45 lambda=0.05
resistor   RD    out  vdd
resistor   RS    src  gnd
value      RD  = 10k
value      RS  = 1k
transfer   Av  = v(out) / vin
