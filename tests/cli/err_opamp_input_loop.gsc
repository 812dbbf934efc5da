# error case: opamp input loop
vsource vin p gnd
vsource V2 p n
resistor Rn n gnd
opamp U1 o p n
resistor Ro o gnd
transfer H = v(o) / vin
