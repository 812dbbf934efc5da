# error case: opamp inputs shorted
vsource vin p gnd
opamp U1 o p p
resistor Ro o gnd
transfer H = v(o) / vin
