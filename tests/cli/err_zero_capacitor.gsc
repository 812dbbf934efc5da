# error case: zero capacitor
vsource vin in gnd
resistor R1 in gnd
capacitor C1 in gnd = 0*C
