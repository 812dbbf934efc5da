# A common-emitter stage: collector and base shot noise, base resistance
# and the source's thermal noise; the noise figure names RS.
title "Common-emitter stage noise"
ground  vcc
vsource vin sig gnd
resistor RS sig b
bjt     Q1 c b gnd gm=gm1 rpi=rpi1 ro=ro1 cpi=Cpi cmu=Cmu rb=rbb
resistor RC c vcc
value gm1  = 40m
value rpi1 = 2.5k
value ro1  = 100k
value rbb  = 50
value Cpi  = 10p
value Cmu  = 0.5p
value RC   = 2k
value RS   = 250
temperature 290
transfer Av = v(c) / vin
