# error case: voltage loop
vsource vin in gnd
vcvs E1 out gnd in gnd = A
vsource vtest out in
resistor RL out gnd
