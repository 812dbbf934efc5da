# The Wheatstone bridge of chk_bridge_near.gsc without C1: the output is
# (R2 R3 - R1 R4)/((R1 + R2)(R3 + R4)) at every frequency, a difference
# of two products that long double cannot resolve.  No point can be
# decided, so check says so and exits with status 1 (nothing was checked).
vsource   vin  in  gnd
resistor  R1   in  a
resistor  R2   a   gnd
resistor  R3   in  b
resistor  R4   b   gnd
value     R1 = 1.1k
value     R2 = 2.3k
value     R3 = 1.3k
value     R4 = R2*R3/R1
transfer  H  = v(a, b) / vin
