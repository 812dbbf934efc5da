# error case: warning with error
vsource vin in gnd
resistor R1 in gnd
resistor R2 in tap
vsource V2 in gnd
