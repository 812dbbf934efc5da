# Two letters swapped are one edit: the hints name 'out' and 'vin'.
title "divider with typing slips"
vsource  vin in  gnd
resistor R1  in  out
resistor R2  out gnd
transfer Av = v(otu) / vni
