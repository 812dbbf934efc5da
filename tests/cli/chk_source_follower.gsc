# A source follower buffering a bias DAC, with body effect (bulk tied to
# the substrate, small-signal ground) and a resistive load.
title      "Source follower with body effect"
ground     vdd
vsource    vin   in   gnd
mosfet     M1    vdd  in  out  gnd  gm=gm1 rds=ro1 gmb=gmb1
resistor   RL    out  gnd
value      gm1  = 1.5m
value      gmb1 = 0.3m
value      ro1  = 80k
value      RL   = 5k
transfer   Av   = v(out) / vin
impedance  Zout = out, gnd
