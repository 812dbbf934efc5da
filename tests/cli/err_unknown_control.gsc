# error case: unknown control
vsource vin in gnd
resistor Rsense in gnd
cccs F1 out gnd Rsens
resistor RL out gnd
