# A two-stage op-amp of our own design for the approx benchmark: an NMOS
# input pair with a PMOS mirror load, a common-source second stage with a
# PMOS current-source load, Miller capacitor Cc.  Every transistor has
# gm, rds, cgs, cgd and cdb (bodies tied to their sources' rails), so the
# exact result has thousands of terms.  The values are invented.
title      "Two-stage op-amp, all device capacitances"
ground     vdd
vsource    vin   in   gnd
mosfet     M1    x    in   t    gnd  gm=gma rds=ra cgs=cgsa cgd=cgda cdb=cdba
mosfet     M2    y    gnd  t    gnd  gm=gma rds=ra cgs=cgsa cgd=cgda cdb=cdba
resistor   rt    t    gnd
mosfet     M3    x    x    vdd  vdd  gm=gmb rds=rb cgs=cgsb cgd=cgdb cdb=cdbb
mosfet     M4    y    x    vdd  vdd  gm=gmb rds=rb cgs=cgsb cgd=cgdb cdb=cdbb
mosfet     M6    out  y    gnd  gnd  gm=gmc rds=rc cgs=cgsc cgd=cgdc cdb=cdbc
mosfet     M7    out  gnd  vdd  vdd  gm=gmd rds=rd cgs=cgsd cgd=cgdd cdb=cdbd
capacitor  Cc    y    out
capacitor  CL    out  gnd
value      gma = 250u
value      ra  = 300k
value      rt  = 800k
value      gmb = 120u
value      rb  = 250k
value      gmc = 2.5m
value      rc  = 80k
value      gmd = 1m
value      rd  = 100k
value      Cc  = 3p
value      CL  = 8p
value      cgsa = 60f
value      cgda = 8f
value      cdba = 15f
value      cgsb = 45f
value      cgdb = 6f
value      cdbb = 12f
value      cgsc = 350f
value      cgdc = 40f
value      cdbc = 60f
value      cgsd = 200f
value      cgdd = 25f
value      cdbd = 40f
transfer   Av  = v(out) / vin
