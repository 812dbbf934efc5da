# Two-stage Miller op-amp, 7 transistors, full caps; the matched pairs
# (input pair, mirror) share their symbols, as a hand analysis writes them.
vsource   vin  inp gnd
vsource   vref inn gnd
value vref = 0
vccs      gm1 d1 tail inp tail
resistor  rds1 d1 tail
capacitor cgs1 inp tail
capacitor cgd1 inp d1
capacitor cdb1 d1 gnd
value gm1 = 1m
value rds1 = 100k
value cgs1 = 30f
value cgd1 = 4f
value cdb1 = 10f
vccs      gm2 o1 tail inn tail = gm1
resistor  rds2 o1 tail = rds1
capacitor cgs2 inn tail = cgs1
capacitor cgd2 inn o1 = cgd1
capacitor cdb2 o1 gnd = cdb1
vccs      gm3 d1 gnd d1 gnd
resistor  rds3 d1 gnd
capacitor cgs3 d1 gnd
capacitor cgd3 d1 d1
capacitor cdb3 d1 gnd
value gm3 = 0.6m
value rds3 = 120k
value cgs3 = 30f
value cgd3 = 4f
value cdb3 = 10f
vccs      gm4 o1 gnd d1 gnd = gm3
resistor  rds4 o1 gnd = rds3
capacitor cgs4 d1 gnd = cgs3
capacitor cgd4 d1 o1 = cgd3
capacitor cdb4 o1 gnd = cdb3
vccs      gm5 tail gnd b1 gnd
resistor  rds5 tail gnd
capacitor cgs5 b1 gnd
capacitor cgd5 b1 tail
capacitor cdb5 tail gnd
value gm5 = 0.5m
value rds5 = 200k
value cgs5 = 30f
value cgd5 = 4f
value cdb5 = 10f
vccs      gm6 out gnd o1 gnd
resistor  rds6 out gnd
capacitor cgs6 o1 gnd
capacitor cgd6 o1 out
capacitor cdb6 out gnd
value gm6 = 4m
value rds6 = 40k
value cgs6 = 30f
value cgd6 = 4f
value cdb6 = 10f
vccs      gm7 out gnd b1 gnd
resistor  rds7 out gnd
capacitor cgs7 b1 gnd
capacitor cgd7 b1 out
capacitor cdb7 out gnd
value gm7 = 1m
value rds7 = 60k
value cgs7 = 30f
value cgd7 = 4f
value cdb7 = 10f
resistor  Rb b1 gnd
value Rb = 10k
capacitor Cc o1 x
resistor Rz x out
value Cc = 2p
value Rz = 1k
capacitor CL out gnd
value CL = 5p
transfer  H = v(out) / vin
