vsource vin in gnd
resistor R1 in out
capacitor C out gnd
transfer H = v(out) / vin
figure A = H / Hx
figure B = B * H
figure C1 = sqrt(H)
figure D = H ^ H
figure E =
figure F = C2 / H
figure C2 = F * 2
