# --points has an upper limit: a huge count is refused at once, not run for days.
vsource  Vin in 0
resistor R1 in out
capacitor C1 out 0
value R1 = 1k
value C1 = 1n
transfer H = v(out)/Vin
