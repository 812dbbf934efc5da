# A vcvs buffers the divider's middle onto a node of its own, observed and
# nothing else: no "only one connection" warning for 'obs'; the resistor
# left hanging at 'spare' is still reported.
title "observed through a buffer"
vsource  vin in  gnd
resistor R1  in  mid
resistor R2  mid gnd
resistor R3  mid spare
vcvs     Eo  obs gnd mid gnd
transfer Av = v(obs) / vin
