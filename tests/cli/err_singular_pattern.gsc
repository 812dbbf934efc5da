# error case: singular pattern
vsource vin p gnd
resistor Rn n gnd
opamp U1 out p n
resistor RL out gnd
transfer H = v(out) / vin
