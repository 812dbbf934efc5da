# The mesh of diag_work_elim with a larger budget: a product passes 8
# times the budget before the exact division that would shrink it.
# Exit 1.
title      "Six nodes, every pair joined by a resistor"
vsource vin n1 gnd
resistor R12 n1 n2
resistor R13 n1 n3
resistor R14 n1 n4
resistor R15 n1 n5
resistor R16 n1 n6
resistor G1 n1 gnd
resistor R23 n2 n3
resistor R24 n2 n4
resistor R25 n2 n5
resistor R26 n2 n6
resistor G2 n2 gnd
resistor R34 n3 n4
resistor R35 n3 n5
resistor R36 n3 n6
resistor G3 n3 gnd
resistor R45 n4 n5
resistor R46 n4 n6
resistor G4 n4 gnd
resistor R56 n5 n6
resistor G5 n5 gnd
resistor G6 n6 gnd
transfer H = v(n6) / vin
