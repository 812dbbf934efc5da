# error case: device zero
vsource vin b gnd
bjt Q1 c b gnd rpi=0
resistor RC c gnd
