resistor R1 a gnd
impedance Z = a
