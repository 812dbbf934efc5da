# approx on values that cancel in the denominator: an error naming the file and output (exit 1)
vsource Vin in 0
resistor R1 in out
resistor R2 out 0
value R1 = 1k
value R2 = -1k
transfer H = v(out)/Vin
