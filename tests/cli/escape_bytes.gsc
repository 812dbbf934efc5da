# stray invisible and control characters are shown as escapestitle "t"
vsource vin in gnd ï»¿
resistor R1 in out
resistor R2 out gnd€
transfer Av = v(out) / vin
