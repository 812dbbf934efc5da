# R2 = 0 shorts the output of the divider: the exact result is H = 0, but
# a resistor of 0 ohms has no conductance to stamp.
vsource  vin  in   gnd
resistor R1   in   out
resistor R2   out  gnd
value    R1 = 1k
value    R2 = 0
transfer H  = v(out) / vin
