# error case: opamp no feedback
vsource vin p gnd
resistor Rn n gnd
opamp U1 o p n
transfer H = v(o) / vin
