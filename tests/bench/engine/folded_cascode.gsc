# Folded-cascode OTA, 11 transistors, small-signal with full caps.
vsource   vin  inp gnd
vsource   vref inn gnd
value vref = 0
vccs      gm1 f1 tail inp tail
resistor  rds1 f1 tail
capacitor cgs1 inp tail
capacitor cgd1 inp f1
capacitor cdb1 f1 gnd
value gm1 = 1m
value rds1 = 100k
value cgs1 = 30f
value cgd1 = 4f
value cdb1 = 10f
vccs      gm2 f2 tail inn tail
resistor  rds2 f2 tail
capacitor cgs2 inn tail
capacitor cgd2 inn f2
capacitor cdb2 f2 gnd
value gm2 = 1m
value rds2 = 100k
value cgs2 = 30f
value cgd2 = 4f
value cdb2 = 10f
vccs      gm11 tail gnd b2 gnd
resistor  rds11 tail gnd
capacitor cgs11 b2 gnd
capacitor cgd11 b2 tail
capacitor cdb11 tail gnd
value gm11 = 0.5m
value rds11 = 200k
value cgs11 = 30f
value cgd11 = 4f
value cdb11 = 10f
vccs      gm5 f1 gnd b2 gnd
resistor  rds5 f1 gnd
capacitor cgs5 b2 gnd
capacitor cgd5 b2 f1
capacitor cdb5 f1 gnd
value gm5 = 1.2m
value rds5 = 60k
value cgs5 = 30f
value cgd5 = 4f
value cdb5 = 10f
vccs      gm6 f2 gnd b2 gnd
resistor  rds6 f2 gnd
capacitor cgs6 b2 gnd
capacitor cgd6 b2 f2
capacitor cdb6 f2 gnd
value gm6 = 1.2m
value rds6 = 60k
value cgs6 = 30f
value cgd6 = 4f
value cdb6 = 10f
vccs      gm3 c1 f1 gnd f1
resistor  rds3 c1 f1
capacitor cgs3 gnd f1
capacitor cgd3 gnd c1
capacitor cdb3 c1 gnd
value gm3 = 1.5m
value rds3 = 80k
value cgs3 = 30f
value cgd3 = 4f
value cdb3 = 10f
vccs      gm4 out f2 gnd f2
resistor  rds4 out f2
capacitor cgs4 gnd f2
capacitor cgd4 gnd out
capacitor cdb4 out gnd
value gm4 = 1.5m
value rds4 = 80k
value cgs4 = 30f
value cgd4 = 4f
value cdb4 = 10f
vccs      gm7 c1 m1 b1 m1
resistor  rds7 c1 m1
capacitor cgs7 b1 m1
capacitor cgd7 b1 c1
capacitor cdb7 c1 gnd
value gm7 = 1m
value rds7 = 90k
value cgs7 = 30f
value cgd7 = 4f
value cdb7 = 10f
vccs      gm8 out m2 b1 m2
resistor  rds8 out m2
capacitor cgs8 b1 m2
capacitor cgd8 b1 out
capacitor cdb8 out gnd
value gm8 = 1m
value rds8 = 90k
value cgs8 = 30f
value cgd8 = 4f
value cdb8 = 10f
vccs      gm9 m1 gnd c1 gnd
resistor  rds9 m1 gnd
capacitor cgs9 c1 gnd
capacitor cgd9 c1 m1
capacitor cdb9 m1 gnd
value gm9 = 0.8m
value rds9 = 70k
value cgs9 = 30f
value cgd9 = 4f
value cdb9 = 10f
vccs      gm10 m2 gnd c1 gnd
resistor  rds10 m2 gnd
capacitor cgs10 c1 gnd
capacitor cgd10 c1 m2
capacitor cdb10 m2 gnd
value gm10 = 0.8m
value rds10 = 70k
value cgs10 = 30f
value cgd10 = 4f
value cdb10 = 10f
resistor  Rb b1 gnd
value Rb = 10k
resistor  Rb2 b2 gnd
value Rb2 = 10k
capacitor CL out gnd
value CL = 1p
transfer  H = v(out) / vin
