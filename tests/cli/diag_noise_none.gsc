# A circuit of sources and an ideal amplifier only: nothing in it makes
# noise.  Exit 2.
title      "A noiseless ideal amplifier"
vsource    vin   in   gnd
vcvs       E1    out  gnd  in  gnd = 10
transfer   H = v(out) / vin
