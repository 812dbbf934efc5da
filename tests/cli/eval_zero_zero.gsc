# R1 = R2 = 0: numerator and denominator R2/(R1 + R2) both vanish, 0/0 is
# undetermined, not infinite.
vsource  Vin in 0
resistor R1 in out
resistor R2 out 0
value R1 = 0
value R2 = 0
transfer H = v(out)/Vin
