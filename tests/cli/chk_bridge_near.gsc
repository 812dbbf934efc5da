# A Wheatstone bridge one rounding away from balance: R4 = R2 R3 / R1 in
# long double, so the DC output (R2 R3 - R1 R4)/((R1 + R2)(R3 + R4)) is
# of the order of the rounding of R2 R3 (the balance condition
# R1 R4 = R2 R3 of any circuits textbook).  C1 across R1 adds
# s R1 R2 R3 C1 to the numerator, which resolves the value from a few
# hertz up; below, long double cannot, and check says inconclusive there
# rather than mismatch.
vsource   vin  in  gnd
resistor  R1   in  a
resistor  R2   a   gnd
resistor  R3   in  b
resistor  R4   b   gnd
capacitor C1   in  a
value     R1 = 1.1k
value     R2 = 2.3k
value     R3 = 1.3k
value     R4 = R2*R3/R1
value     C1 = 1f
transfer  H  = v(a, b) / vin
