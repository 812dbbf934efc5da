# error case: output twice
vsource vin in gnd
resistor R1 in out
resistor R2 out gnd
transfer H = v(out) / vin
impedance H = out
