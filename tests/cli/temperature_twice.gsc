temperature 300
vsource vin in gnd
resistor R1 in gnd = 1k
temperature 290
temperature
transfer H = i(R1) / vin
