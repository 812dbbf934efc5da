# error case: sense only
vsource vin in gnd
resistor R1 in gnd
vcvs E1 out gnd p n
resistor RL out gnd
resistor Rn n gnd
