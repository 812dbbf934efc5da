# error case: sum in value
vsource vin in gnd
resistor R1 in gnd = Ra + Rb
