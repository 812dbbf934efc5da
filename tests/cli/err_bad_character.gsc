# error case: bad character
vsource vin in gnd
resistor R1 in gnd = 10k; 
