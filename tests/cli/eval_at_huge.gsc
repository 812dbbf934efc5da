# A frequency outside the range of a long double is refused, as the same
# number in a file is.
vsource  Vin in 0
resistor R1 in out
capacitor C1 out 0
value R1 = 1k
value C1 = 1n
transfer H = v(out)/Vin
