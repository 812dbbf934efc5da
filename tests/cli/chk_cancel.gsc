# Rx sits across the ideal source vin, so it cancels out of H
# (H = R2/(R1 + R2), the voltage divider) and needs no value; check gives
# it a generic value for the numeric solve and says so.
vsource  vin  in   gnd
resistor Rx   in   gnd
resistor R1   in   out
resistor R2   out  gnd
value    R1 = 1k
value    R2 = 3k
transfer H  = v(out) / vin
