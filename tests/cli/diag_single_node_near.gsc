# 'otu' for 'out': each of the two single-connection nodes gets a warning
# whose hint names the other, one swap of neighbours away.
vsource  vin in  gnd
resistor R1  in  otu
resistor R2  out gnd
transfer H = v(out) / vin
