# error case: no path
vsource vin in gnd
resistor R1 in gnd
resistor R2 a b
capacitor C2 a b
