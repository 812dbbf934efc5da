# error case: output name
vsource vin in gnd
resistor R1 in gnd
transfer = v(in) / vin
