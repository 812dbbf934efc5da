# A common-source stage with shunt feedback RF from drain to gate, driven
# through RS.  By hand (Bode's return ratio with M1.gm made an
# independent current source): the returned gate voltage is the drain
# current through RD || (RF + RS) divided by RS/(RF + RS), so
# T = gm*RD*RS/(RD + RF + RS) at DC; the asymptotic gain is -RF/RS (the
# ideal shunt-feedback gain), and Achk rebuilds Av from the three parts
# (A = Ainf*T/(1 + T) + d/(1 + T)), so it must print as Av does.
vsource  vin in gnd
resistor RS  in g
resistor RF  d g
mosfet   M1  d g gnd gm=gm rds=inf cgs=Cgs
resistor RD  d gnd
transfer Av = v(d) / vin
loopgain T  = M1.gm for Av
figure   Achk = T_inf*T/(1 + T) + T_direct/(1 + T)
