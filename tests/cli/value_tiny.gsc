# 1e-9999 would read as 0 in a long double: refused, not silently zero.
vsource  Vin in 0
resistor R1 in out
capacitor C1 out 0
value R1 = 1k
value C1 = 1e-9999
transfer H = v(out)/Vin
