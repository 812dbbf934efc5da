# error case: shorted vsource
ground vdd
vsource vdd_supply vdd gnd
vsource vin in gnd
resistor R1 in vdd
