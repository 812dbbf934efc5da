# R2 = -R1 makes the divider's denominator R1 + R2 zero: the node out has
# no defined voltage, the MNA matrix is singular at every frequency.  Rx,
# across the source, cancels out and gets a generic value.
vsource  vin  in   gnd
resistor Rx   in   gnd
resistor R1   in   out
resistor R2   out  gnd
value    R1 = 1k
value    R2 = -R1
transfer H  = v(out) / vin
