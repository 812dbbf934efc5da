# Common-source chain of 8 stages with cgs, cgd, cdb per device.
vsource   vin  n0 gnd
resistor  Rsig n0 g1
value Rsig = 1k
vccs      gm1  g2 gnd g1 gnd
resistor  rds1 g2 gnd
resistor  RD1  g2 gnd
capacitor cgs1 g1 gnd
capacitor cgd1 g1 g2
capacitor cdb1 g2 gnd
value gm1 = 1.1m
value rds1 = 41k
value RD1 = 5.2k
value cgs1 = 21f
value cgd1 = 3.1f
value cdb1 = 8.3f
vccs      gm2  g3 gnd g2 gnd
resistor  rds2 g3 gnd
resistor  RD2  g3 gnd
capacitor cgs2 g2 gnd
capacitor cgd2 g2 g3
capacitor cdb2 g3 gnd
value gm2 = 1.2m
value rds2 = 42k
value RD2 = 5.4k
value cgs2 = 22f
value cgd2 = 3.2f
value cdb2 = 8.6f
vccs      gm3  g4 gnd g3 gnd
resistor  rds3 g4 gnd
resistor  RD3  g4 gnd
capacitor cgs3 g3 gnd
capacitor cgd3 g3 g4
capacitor cdb3 g4 gnd
value gm3 = 1.3m
value rds3 = 43k
value RD3 = 5.6k
value cgs3 = 23f
value cgd3 = 3.3f
value cdb3 = 8.9f
vccs      gm4  g5 gnd g4 gnd
resistor  rds4 g5 gnd
resistor  RD4  g5 gnd
capacitor cgs4 g4 gnd
capacitor cgd4 g4 g5
capacitor cdb4 g5 gnd
value gm4 = 1.4m
value rds4 = 44k
value RD4 = 5.8k
value cgs4 = 24f
value cgd4 = 3.4f
value cdb4 = 9.2f
vccs      gm5  g6 gnd g5 gnd
resistor  rds5 g6 gnd
resistor  RD5  g6 gnd
capacitor cgs5 g5 gnd
capacitor cgd5 g5 g6
capacitor cdb5 g6 gnd
value gm5 = 1.5m
value rds5 = 45k
value RD5 = 6k
value cgs5 = 25f
value cgd5 = 3.5f
value cdb5 = 9.5f
vccs      gm6  g7 gnd g6 gnd
resistor  rds6 g7 gnd
resistor  RD6  g7 gnd
capacitor cgs6 g6 gnd
capacitor cgd6 g6 g7
capacitor cdb6 g7 gnd
value gm6 = 1.6m
value rds6 = 46k
value RD6 = 6.2k
value cgs6 = 26f
value cgd6 = 3.6f
value cdb6 = 9.8f
vccs      gm7  g8 gnd g7 gnd
resistor  rds7 g8 gnd
resistor  RD7  g8 gnd
capacitor cgs7 g7 gnd
capacitor cgd7 g7 g8
capacitor cdb7 g8 gnd
value gm7 = 1.7m
value rds7 = 47k
value RD7 = 6.4k
value cgs7 = 27f
value cgd7 = 3.7f
value cdb7 = 10.1f
vccs      gm8  out gnd g8 gnd
resistor  rds8 out gnd
resistor  RD8  out gnd
capacitor cgs8 g8 gnd
capacitor cgd8 g8 out
capacitor cdb8 out gnd
value gm8 = 1.8m
value rds8 = 48k
value RD8 = 6.6k
value cgs8 = 28f
value cgd8 = 3.8f
value cdb8 = 10.4f
capacitor CL out gnd
value CL = 50f
transfer  H = v(out) / vin
