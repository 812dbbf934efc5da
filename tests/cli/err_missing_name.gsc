# error case: missing name
vsource vin in gnd
capacitor
