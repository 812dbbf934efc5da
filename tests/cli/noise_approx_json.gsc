# A divider whose R2 = 1000 R1 makes a thousandth of the output noise
# (its share R1/(R1 + R2) at every frequency): the short form at 0.5 dB
# leaves it out, at an error of 10 log10(1.001) = 0.00434 dB.
title "Divider noise, short form"
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
value R1 = 1k
value R2 = 1M
transfer Av = v(out) / vin
