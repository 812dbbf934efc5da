title "PMOS common-source stage with an NMOS current-source load"
vsource  vin in  gnd
ground   vdd
mosfet   M1 out in  vdd gm=gm1 rds=ro1
mosfet   M2 out bn  gnd gm=gm2 rds=ro2
ground   bn
bias     M1 type=pmos id=-200u vds=-1.5 vgs=-1.1 vth=-0.6 lambda=0.05
bias     M2 id=200u vds=1.5 vgs=0.9 vth=0.5 lambda=0.04
transfer Av = v(out) / vin
