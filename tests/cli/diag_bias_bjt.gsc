# Bias lines whose figures the forward-active bjt model cannot take, one
# fault per transistor; every bias line is checked: exit 2.
title      "Eight bjts, eight faulty bias lines"
vsource    vin   in   gnd
resistor   RC    out  gnd
value      RC  = 10k
bjt        Q1    out  in  gnd  gm=g1 rpi=rp1
bjt        Q2    out  in  gnd  gm=g2 rpi=rp2
bjt        Q3    out  in  gnd  gm=g3 rpi=rp3
bjt        Q4    out  in  gnd  gm=g4 rpi=rp4
bjt        Q5    out  in  gnd  gm=g5 rpi=rp5 ro=ro5
bjt        Q6    out  in  gnd  gm=g6 rpi=rp6 cpi=cp6
bjt        Q7    out  in  gnd  gm=g7 rpi=rp7 cpi=cp7
bjt        Q8    out  in  gnd  gm=g8 rpi=rp8 cpi=cp8
bias       Q1    ic=1m vce=2 beta=100 temp=0K
bias       Q2    ic=-1m vce=2 beta=100
bias       Q3    ic=1m vce=-2 beta=100
bias       Q4    ic=1m vce=2 beta=0
bias       Q5    ic=1m vce=2 beta=100 va=-50
bias       Q6    ic=1m vce=2 beta=100 ft=0 cmu=1p
bias       Q7    ic=1m vce=2 beta=100 ft=300M cmu=-1p
bias       Q8    ic=1m vce=2 beta=100 ft=300M cmu=1n
transfer   Av  = v(out) / vin
