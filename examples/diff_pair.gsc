# A resistively loaded differential pair with a tail resistance and
# unequal loads: the four gains of a balanced stage from one file.
title "Differential pair, unequal loads"
ground   vdd
balanced vi  g1 g2
mosfet   M1  d1 g1 t gm=gm rds=inf
mosfet   M2  d2 g2 t gm=gm rds=inf
resistor RT  t  gnd
resistor RD1 d1 vdd
resistor RD2 d2 vdd
sense    vo  d1 d2
transfer Adm   = v(vo.dm) / vi.dm
transfer Acm   = v(vo.cm) / vi.cm
transfer Acmdm = v(vo.dm) / vi.cm
transfer Admcm = v(vo.cm) / vi.dm
figure   CMRR  = Adm / Acm
# an invented design point: 1 mS pair, 20 k tail, loads 5 % apart
value    gm  = 1m
value    RT  = 20k
value    RD1 = 10k
value    RD2 = 10.5k
