# A current into a resistor: v(out)/iin = R1 grows without bound as R1
# -> inf.  Exit 1.
title      "A resistor driven by a current"
isource    iin   gnd  out
resistor   R1    out  gnd
transfer   Z = v(out) / iin
