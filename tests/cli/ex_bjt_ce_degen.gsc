# A common-emitter stage with emitter degeneration, the gain block of a
# small intercom receiver; hybrid-pi model with output resistance.
title      "Common-emitter stage with emitter degeneration"
ground     vcc
vsource    vin   in   gnd
bjt        Q1    out  in   e   gm=gm1 rpi=rpi1 ro=ro1
resistor   RC    out  vcc
resistor   RE    e    gnd
value      gm1  = 40m
value      rpi1 = 2.5k
value      ro1  = 100k
value      RC   = 4.7k
value      RE   = 220
transfer   Av   = v(out) / vin
