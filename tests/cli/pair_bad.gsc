vsource vin a gnd
resistor R1 a b
resistor R2 b gnd
balanced vi b b
balanced R1 a b
sense so a
sense vo. a b
transfer H = v(b) / vin
