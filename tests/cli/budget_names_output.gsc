# Two outputs over the term budget: the message names the file and the
# output that failed, so that a file with several outputs says which.
vsource  Vin in 0
resistor R1 in a
resistor R2 a 0
capacitor C1 a b
resistor R3 b 0
capacitor C2 b 0
transfer Va = v(a)/Vin
transfer Vb = v(b)/Vin
