# error case: unknown param list
vsource vin b gnd
bjt Q1 c b gnd rds=ro1
resistor RC c gnd
