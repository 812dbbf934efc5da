# error case: title twice
title "One"
title "Two"
vsource vin in gnd
resistor R1 in gnd
