# A chain of 10 common-source stages, each device with gm, its output
# resistance ro (load included) and cgs, cgd, cdb; values invented.  Its
# denominator has about 5e7 terms, past the expansion budget, so approx
# takes the dominant terms from the graph of minors.
vsource vin n0 gnd
resistor Rs n0 g1
value Rs = 1k
vccs gm1 g2 gnd g1 gnd
resistor ro1 g2 gnd
capacitor cgs1 g1 gnd
capacitor cgd1 g1 g2
capacitor cdb1 g2 gnd
value gm1 = 1.1m
value ro1 = 5.2k
value cgs1 = 21f
value cgd1 = 3.1f
value cdb1 = 8.3f
vccs gm2 g3 gnd g2 gnd
resistor ro2 g3 gnd
capacitor cgs2 g2 gnd
capacitor cgd2 g2 g3
capacitor cdb2 g3 gnd
value gm2 = 1.2m
value ro2 = 5.4k
value cgs2 = 22f
value cgd2 = 3.2f
value cdb2 = 8.6f
vccs gm3 g4 gnd g3 gnd
resistor ro3 g4 gnd
capacitor cgs3 g3 gnd
capacitor cgd3 g3 g4
capacitor cdb3 g4 gnd
value gm3 = 1.3m
value ro3 = 5.6k
value cgs3 = 23f
value cgd3 = 3.3f
value cdb3 = 8.9f
vccs gm4 g5 gnd g4 gnd
resistor ro4 g5 gnd
capacitor cgs4 g4 gnd
capacitor cgd4 g4 g5
capacitor cdb4 g5 gnd
value gm4 = 1.4m
value ro4 = 5.8k
value cgs4 = 24f
value cgd4 = 3.4f
value cdb4 = 9.2f
vccs gm5 g6 gnd g5 gnd
resistor ro5 g6 gnd
capacitor cgs5 g5 gnd
capacitor cgd5 g5 g6
capacitor cdb5 g6 gnd
value gm5 = 1.5m
value ro5 = 6k
value cgs5 = 25f
value cgd5 = 3.5f
value cdb5 = 9.5f
vccs gm6 g7 gnd g6 gnd
resistor ro6 g7 gnd
capacitor cgs6 g6 gnd
capacitor cgd6 g6 g7
capacitor cdb6 g7 gnd
value gm6 = 1.6m
value ro6 = 6.2k
value cgs6 = 26f
value cgd6 = 3.6f
value cdb6 = 9.8f
vccs gm7 g8 gnd g7 gnd
resistor ro7 g8 gnd
capacitor cgs7 g7 gnd
capacitor cgd7 g7 g8
capacitor cdb7 g8 gnd
value gm7 = 1.7m
value ro7 = 6.4k
value cgs7 = 27f
value cgd7 = 3.7f
value cdb7 = 10.1f
vccs gm8 g9 gnd g8 gnd
resistor ro8 g9 gnd
capacitor cgs8 g8 gnd
capacitor cgd8 g8 g9
capacitor cdb8 g9 gnd
value gm8 = 1.8m
value ro8 = 6.6k
value cgs8 = 28f
value cgd8 = 3.8f
value cdb8 = 10.4f
vccs gm9 g10 gnd g9 gnd
resistor ro9 g10 gnd
capacitor cgs9 g9 gnd
capacitor cgd9 g9 g10
capacitor cdb9 g10 gnd
value gm9 = 1.9m
value ro9 = 6.8k
value cgs9 = 29f
value cgd9 = 3.9f
value cdb9 = 10.7f
vccs gm10 out gnd g10 gnd
resistor ro10 out gnd
capacitor cgs10 g10 gnd
capacitor cgd10 g10 out
capacitor cdb10 out gnd
value gm10 = 2m
value ro10 = 7k
value cgs10 = 30f
value cgd10 = 4f
value cdb10 = 11f
capacitor CL out gnd
value CL = 50f
transfer H = v(out) / vin
