# error case: unterminated string
title "Half a title
vsource vin in gnd
resistor R1 in gnd
