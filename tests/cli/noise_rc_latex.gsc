vsource vin in gnd
resistor R in out
capacitor C out gnd
transfer H = v(out) / vin
