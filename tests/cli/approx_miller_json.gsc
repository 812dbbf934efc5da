# Two-stage Miller-compensated op-amp: an NMOS input pair with a PMOS
# current-mirror load, a common-source second stage with a current-source
# load, and a compensation capacitor Cc from the second stage's input to
# the output.  The values are an invented design point for the examples.
title      "Two-stage Miller op-amp with a mirror load"
ground     vdd
vsource    vin   in   gnd
# input pair, tail node t: M2's gate is grounded, so the output inverts vin
mosfet     M1    x    in   t    gm=gm1 rds=r1 cgs=cg1
mosfet     M2    y    gnd  t    gm=gm1 rds=r1 cgs=cg1
resistor   r5    t    gnd                 # tail current source's output resistance
# mirror load: M3 diode-connected, M4 its output
mosfet     M3    x    x    vdd  gm=gm3 rds=r3 cgs=cg3
mosfet     M4    y    x    vdd  gm=gm3 rds=r3 cgs=cg3
# second stage and its current-source load
mosfet     M6    out  y    gnd  gm=gm6 rds=r6 cgs=cg6
resistor   R7    out  vdd
capacitor  Cc    y    out
capacitor  CL    out  gnd
value      gm1 = 200u
value      r1  = 400k
value      gm3 = 150u
value      r3  = 300k
value      r5  = 1M
value      gm6 = 2m
value      r6  = 100k
value      R7  = 120k
value      Cc  = 2p
value      CL  = 5p
value      cg1 = 50f
value      cg3 = 40f
value      cg6 = 300f
transfer   Av  = v(out) / vin
