# An amplifier and a feedback divider as two separate parts of one file;
# the closed loop A/(1 + A*beta) and the loop gain from the two outputs.
# Acl = gm*RL*(R1 + R2)/((R1 + R2)*(RL*CL*s + 1) + gm*RL*R2) by hand from
# A/(1 + A*beta): the golden must be that, in lowest terms.
vsource  va  in gnd
vccs     G1  out gnd in gnd = -gm
resistor RL  out gnd
capacitor CL out gnd
vsource  vb  x gnd
resistor R1  x fb
resistor R2  fb gnd
transfer A    = v(out) / va
transfer beta = v(fb) / vb
figure   Acl  = A / (1 + A*beta)
figure   L    = A*beta
