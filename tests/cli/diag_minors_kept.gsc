# Every value a number, so each minor is a single term and none passes
# --max-terms 1; but the expansion keeps many minors of a level at once,
# and their count passes the memory bound of 8 times the budget.  Exit 1.
title      "Five nodes, every pair joined by a resistor"
vsource vin n1 gnd
resistor R12 n1 n2 = 120
resistor R13 n1 n3 = 130
resistor R14 n1 n4 = 140
resistor R15 n1 n5 = 150
resistor G1 n1 gnd = 110
resistor R23 n2 n3 = 230
resistor R24 n2 n4 = 240
resistor R25 n2 n5 = 250
resistor G2 n2 gnd = 120
resistor R34 n3 n4 = 340
resistor R35 n3 n5 = 350
resistor G3 n3 gnd = 130
resistor R45 n4 n5 = 450
resistor G4 n4 gnd = 140
resistor G5 n5 gnd = 150
transfer H = v(n5) / vin
