# Two-stage op-amp with class-AB output and bias, 24 transistors.
vsource   vin  inp gnd
vsource   vref inn gnd
value vref = 0
vccs      gm1 a1 tail inp tail
resistor  rds1 a1 tail
capacitor cgs1 inp tail
capacitor cgd1 inp a1
capacitor cdb1 a1 gnd
value gm1 = 1m
value rds1 = 100k
value cgs1 = 30f
value cgd1 = 4f
value cdb1 = 10f
vccs      gm2 a2 tail inn tail
resistor  rds2 a2 tail
capacitor cgs2 inn tail
capacitor cgd2 inn a2
capacitor cdb2 a2 gnd
value gm2 = 1m
value rds2 = 100k
value cgs2 = 30f
value cgd2 = 4f
value cdb2 = 10f
vccs      gm3 c1 a1 bc a1
resistor  rds3 c1 a1
capacitor cgs3 bc a1
capacitor cgd3 bc c1
capacitor cdb3 c1 gnd
value gm3 = 1.2m
value rds3 = 90k
value cgs3 = 30f
value cgd3 = 4f
value cdb3 = 10f
vccs      gm4 c2 a2 bc a2
resistor  rds4 c2 a2
capacitor cgs4 bc a2
capacitor cgd4 bc c2
capacitor cdb4 c2 gnd
value gm4 = 1.2m
value rds4 = 90k
value cgs4 = 30f
value cgd4 = 4f
value cdb4 = 10f
vccs      gm5 c1 m1 c1 m1
resistor  rds5 c1 m1
capacitor cgs5 c1 m1
capacitor cgd5 c1 c1
capacitor cdb5 c1 gnd
value gm5 = 0.8m
value rds5 = 110k
value cgs5 = 30f
value cgd5 = 4f
value cdb5 = 10f
vccs      gm6 c2 m2 c1 m2
resistor  rds6 c2 m2
capacitor cgs6 c1 m2
capacitor cgd6 c1 c2
capacitor cdb6 c2 gnd
value gm6 = 0.8m
value rds6 = 110k
value cgs6 = 30f
value cgd6 = 4f
value cdb6 = 10f
vccs      gm7 m1 gnd bm gnd
resistor  rds7 m1 gnd
capacitor cgs7 bm gnd
capacitor cgd7 bm m1
capacitor cdb7 m1 gnd
value gm7 = 0.7m
value rds7 = 130k
value cgs7 = 30f
value cgd7 = 4f
value cdb7 = 10f
vccs      gm8 m2 gnd bm gnd
resistor  rds8 m2 gnd
capacitor cgs8 bm gnd
capacitor cgd8 bm m2
capacitor cdb8 m2 gnd
value gm8 = 0.7m
value rds8 = 130k
value cgs8 = 30f
value cgd8 = 4f
value cdb8 = 10f
vccs      gm9 s2 gnd c2 gnd
resistor  rds9 s2 gnd
capacitor cgs9 c2 gnd
capacitor cgd9 c2 s2
capacitor cdb9 s2 gnd
value gm9 = 3m
value rds9 = 50k
value cgs9 = 30f
value cgd9 = 4f
value cdb9 = 10f
vccs      gm10 s2 gnd bt gnd
resistor  rds10 s2 gnd
capacitor cgs10 bt gnd
capacitor cgd10 bt s2
capacitor cdb10 s2 gnd
value gm10 = 1m
value rds10 = 70k
value cgs10 = 30f
value cgd10 = 4f
value cdb10 = 10f
vccs      gm11 gp k1 s2 k1
resistor  rds11 gp k1
capacitor cgs11 s2 k1
capacitor cgd11 s2 gp
capacitor cdb11 gp gnd
value gm11 = 1.5m
value rds11 = 80k
value cgs11 = 30f
value cgd11 = 4f
value cdb11 = 10f
vccs      gm12 gn k2 s2 k2
resistor  rds12 gn k2
capacitor cgs12 s2 k2
capacitor cgd12 s2 gn
capacitor cdb12 gn gnd
value gm12 = 1.5m
value rds12 = 80k
value cgs12 = 30f
value cgd12 = 4f
value cdb12 = 10f
vccs      gm13 k1 gnd k1 gnd
resistor  rds13 k1 gnd
capacitor cgs13 k1 gnd
capacitor cgd13 k1 k1
capacitor cdb13 k1 gnd
value gm13 = 1m
value rds13 = 90k
value cgs13 = 30f
value cgd13 = 4f
value cdb13 = 10f
vccs      gm14 k2 gnd k2 gnd
resistor  rds14 k2 gnd
capacitor cgs14 k2 gnd
capacitor cgd14 k2 k2
capacitor cdb14 k2 gnd
value gm14 = 1m
value rds14 = 90k
value cgs14 = 30f
value cgd14 = 4f
value cdb14 = 10f
vccs      gm15 gp gnd bt gnd
resistor  rds15 gp gnd
capacitor cgs15 bt gnd
capacitor cgd15 bt gp
capacitor cdb15 gp gnd
value gm15 = 0.6m
value rds15 = 150k
value cgs15 = 30f
value cgd15 = 4f
value cdb15 = 10f
vccs      gm16 gn gnd bm gnd
resistor  rds16 gn gnd
capacitor cgs16 bm gnd
capacitor cgd16 bm gn
capacitor cdb16 gn gnd
value gm16 = 0.6m
value rds16 = 150k
value cgs16 = 30f
value cgd16 = 4f
value cdb16 = 10f
vccs      gm17 out gnd gp gnd
resistor  rds17 out gnd
capacitor cgs17 gp gnd
capacitor cgd17 gp out
capacitor cdb17 out gnd
value gm17 = 8m
value rds17 = 20k
value cgs17 = 30f
value cgd17 = 4f
value cdb17 = 10f
vccs      gm18 out gnd gn gnd
resistor  rds18 out gnd
capacitor cgs18 gn gnd
capacitor cgd18 gn out
capacitor cdb18 out gnd
value gm18 = 8m
value rds18 = 20k
value cgs18 = 30f
value cgd18 = 4f
value cdb18 = 10f
vccs      gm19 tail gnd bt gnd
resistor  rds19 tail gnd
capacitor cgs19 bt gnd
capacitor cgd19 bt tail
capacitor cdb19 tail gnd
value gm19 = 0.5m
value rds19 = 200k
value cgs19 = 30f
value cgd19 = 4f
value cdb19 = 10f
vccs      gm20 bt gnd bt gnd
resistor  rds20 bt gnd
capacitor cgs20 bt gnd
capacitor cgd20 bt bt
capacitor cdb20 bt gnd
value gm20 = 0.4m
value rds20 = 250k
value cgs20 = 30f
value cgd20 = 4f
value cdb20 = 10f
vccs      gm21 bm gnd bm gnd
resistor  rds21 bm gnd
capacitor cgs21 bm gnd
capacitor cgd21 bm bm
capacitor cdb21 bm gnd
value gm21 = 0.4m
value rds21 = 250k
value cgs21 = 30f
value cgd21 = 4f
value cdb21 = 10f
vccs      gm22 bc bt bc bt
resistor  rds22 bc bt
capacitor cgs22 bc bt
capacitor cgd22 bc bc
capacitor cdb22 bc gnd
value gm22 = 0.4m
value rds22 = 250k
value cgs22 = 30f
value cgd22 = 4f
value cdb22 = 10f
vccs      gm23 bm gnd bt gnd
resistor  rds23 bm gnd
capacitor cgs23 bt gnd
capacitor cgd23 bt bm
capacitor cdb23 bm gnd
value gm23 = 0.3m
value rds23 = 300k
value cgs23 = 30f
value cgd23 = 4f
value cdb23 = 10f
vccs      gm24 bc gnd bm gnd
resistor  rds24 bc gnd
capacitor cgs24 bm gnd
capacitor cgd24 bm bc
capacitor cdb24 bc gnd
value gm24 = 0.3m
value rds24 = 300k
value cgs24 = 30f
value cgd24 = 4f
value cdb24 = 10f
capacitor Cc1 s2 c2
value Cc1 = 1p
capacitor Cc2 out s2
value Cc2 = 2p
capacitor CL out gnd
value CL = 10p
resistor  RL out gnd
value RL = 10k
transfer  H = v(out) / vin
