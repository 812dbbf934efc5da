# Six identical stages: a 6-fold zero exactly at gm/Cgd = 1e9 rad/s,
# printed once at the mean of its cluster and confirmed by the squarefree
# factorisation of the exact numerator (Yun 1976).
title "six identical common-source stages"
vsource vin n0 gnd
vccs G1 n1 gnd n0 gnd = gm
capacitor C1 n0 n1 = Cgd
resistor R1 n1 gnd = RL
vccs G2 n2 gnd n1 gnd = gm
capacitor C2 n1 n2 = Cgd
resistor R2 n2 gnd = RL
vccs G3 n3 gnd n2 gnd = gm
capacitor C3 n2 n3 = Cgd
resistor R3 n3 gnd = RL
vccs G4 n4 gnd n3 gnd = gm
capacitor C4 n3 n4 = Cgd
resistor R4 n4 gnd = RL
vccs G5 n5 gnd n4 gnd = gm
capacitor C5 n4 n5 = Cgd
resistor R5 n5 gnd = RL
vccs G6 n6 gnd n5 gnd = gm
capacitor C6 n5 n6 = Cgd
resistor R6 n6 gnd = RL
value gm = 1m
value Cgd = 1p
value RL = 10k
transfer Av = v(n6) / vin
