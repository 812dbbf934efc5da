# A common-source stage with a resistor load and a source resistance: the
# input-referred noise of the channel and of RD, and of the source.
title "Common-source stage noise"
ground  vdd
vsource vin sig gnd
resistor RS sig g
mosfet  M1 d g gnd gm=gm1 rds=ro1 cgs=Cgs cgd=Cgd
resistor RD d vdd
capacitor CL d gnd
value gm1 = 2m
value ro1 = 50k
value RD  = 10k
value RS  = 1k
value Cgs = 200f
value Cgd = 20f
value CL  = 1p
value kf_M1  = 2e-25
value cox_M1 = 8m
value w_M1   = 20u
value l_M1   = 0.5u
temperature 300
transfer Av = v(d) / vin
