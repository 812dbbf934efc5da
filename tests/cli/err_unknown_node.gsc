# error case: unknown node
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
transfer H = v(ot) / vin
