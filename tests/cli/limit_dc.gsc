# A switch's off-resistance ron shunting a filter node: --limit ron=inf
# alone holds s fixed and keeps the pole; --limit s=0 first takes the DC
# value, then its limit.
title "filter with a shunt switch"
vsource   vin in  gnd
resistor  R1  in  out
resistor  ron out gnd
capacitor CL  out gnd
transfer  Av = v(out) / vin
