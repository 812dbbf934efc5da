# error case: output eq
vsource vin in gnd
resistor R1 in gnd
impedance Z in
