# A circuit with no transfer or impedance line: nothing to derive, exit 2.
title      "A divider with no output line"
vsource    vin   in   gnd
resistor   R1    in   out
resistor   R2    out  gnd
