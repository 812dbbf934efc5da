# One output of each kind, each with its unit: a voltage gain (V/V), a
# current gain (A/A), a transimpedance (V/A), a transadmittance (A/V) and
# an impedance (ohms).  Impedances get no gain figures.
title "units of outputs"
vsource   vin in  gnd
resistor  R1  in  out
capacitor C1  out gnd
isource   iin gnd a
resistor  R2  a   gnd
resistor  R3  a   b
vsource   vm  b   gnd
value R1 = 1k
value C1 = 1n
value R2 = 2k
value R3 = 500
transfer  Av = v(out) / vin
transfer  Ai = i(vm) / iin
transfer  Zt = v(a) / iin
transfer  Gt = i(R1) / vin
impedance Zo = out
