vsource  vin in gnd
resistor R1 in out
resistor R2 out gnd
vccs     G1 out gnd in gnd = g
transfer H = v(out) / vin
loopgain T1 = R1
loopgain T2 = Gx
loopgain T3 =
loopgain T4 = G1 for Zq
