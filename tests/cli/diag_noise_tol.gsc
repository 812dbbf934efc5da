# noise --format takes text, pretty, latex or json: exit 2.
title      "First-order RC lowpass"
vsource    vin   in   gnd
resistor   R1    in   out
capacitor  C1    out  gnd
value      R1 = 1k
value      C1 = 1n
transfer   H = v(out) / vin
