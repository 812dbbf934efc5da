# Three-section RC ladder low-pass, an invented sensor front end: its
# denominator is too long for one line of LaTeX and is broken.
vsource    vin  in  gnd
resistor   R1   in  a
capacitor  C1   a   gnd
resistor   R2   a   b
capacitor  C2   b   gnd
resistor   R3   b   out
capacitor  C3   out gnd
transfer   H  = v(out) / vin
