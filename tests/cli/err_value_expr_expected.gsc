# error case: value expr expected
vsource vin in gnd
resistor R1 in gnd
value R1 = 10k *
