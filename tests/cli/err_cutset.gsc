# error case: cutset
vsource vin g gnd
mosfet M1 d g gnd rds=inf
capacitor CL d out
transfer H = v(d) / vin
