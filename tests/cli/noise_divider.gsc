# A resistor divider: its output noise is the thermal noise of R1 || R2.
title "Divider noise"
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
value R1 = 10k
value R2 = 40k
temperature 300
transfer Av = v(out) / vin
