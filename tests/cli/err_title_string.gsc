# error case: title string
title One
vsource vin in gnd
resistor R1 in gnd
