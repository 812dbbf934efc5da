# An RC low-pass whose only noise is the resistor's: over any band the
# output noise power is (kT/C)(2/pi)(atan(f2/fc) - atan(f1/fc)),
# fc = 1/(2 pi R C), and kT/C over all frequencies whatever R (Gray,
# Hurst, Lewis and Meyer, noise chapter, from memory).
vsource vin in gnd
resistor R in out = 1k
capacitor C out gnd = 1n
transfer H = v(out) / vin
