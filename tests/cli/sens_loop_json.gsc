# A single-pole loop of an invented servo: T = A0/(1 + s/p), A0 = G1*R1*E1
# = 10, p = 1/(R1*C1) = 1000 rad/s; its ugf is p*sqrt(A0^2 - 1).
isource  iin  gnd  a
vccs     G1   gnd  b  a  gnd
resistor R1   b    gnd
capacitor C1  b    gnd
vcvs     E1   a    gnd gnd b
value G1 = 10m
value R1 = 1k
value C1 = 1u
value E1 = 1
loopgain T = G1
