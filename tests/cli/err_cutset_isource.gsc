# error case: cutset isource
isource iin in gnd
resistor R1 in x
transfer Z = v(in) / iin
