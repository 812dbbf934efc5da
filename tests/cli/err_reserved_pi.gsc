# error case: reserved pi
vsource vin in gnd
capacitor C1 in gnd = 1/(2*pi*f0)
