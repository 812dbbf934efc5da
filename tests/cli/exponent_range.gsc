# Numbers written correctly whose exponent is out of range, in element
# values and value lines, and one that is no number at all.
title "exponents out of range"
vsource  vin in  gnd
resistor R1  in  out = 1e999999
resistor R2  out gnd
capacitor C1 out gnd = 2.2E-999999
value R2 = 1e99999k
resistor R3  out gnd = 1e3x
transfer Av = v(out) / vin
