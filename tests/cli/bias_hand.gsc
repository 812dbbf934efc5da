# The same stage as bias_e2e.gsc, with gm and rds of the square law with
# channel-length modulation written out by hand (Razavi, Design of Analog
# CMOS Integrated Circuits, ch. 2, from memory):
#   gm  = sqrt(2 K ID (1 + lambda VDS))
#   rds = 1/gds = (1 + lambda VDS) / (lambda ID)
title      "Degenerated common-source stage, biased"
ground     vdd
vsource    vin   in   gnd
mosfet     M1    out  in  src  gm=gm1 rds=ro1
resistor   RD    out  vdd
resistor   RS    src  gnd
value      RD  = 10k
value      RS  = 1k
value      gm1 = sqrt(2*4m*200u*(1 + 0.05*1.5))
value      ro1 = (1 + 0.05*1.5)/(0.05*200u)
transfer   Av  = v(out) / vin
