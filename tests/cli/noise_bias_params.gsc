# A common-source stage whose noise parameters sit on the bias line of
# M1, with units as the other figures take them.  The square law gives
# gm = sqrt(2*K*ID) = sqrt(2*2m*1m) = 2 mS (Razavi, ch. 2, from memory;
# rds=inf, so no lambda), and at 1 kHz the gate-referred density of M1
# is, by hand from the models of docs/noise.md (Razavi, noise chapter,
# from memory):
#   channel 4kT*gamma/gm = 4*1.380649e-23*300*1.25/2m = 1.0355e-17 V^2/Hz
#   flicker kf/(cox*w*l*f) = 1e-25/(5m*20u*0.5u*1k) = 2e-15 V^2/Hz
# the figures of noise_device_params, where they sit on the mosfet line.
vsource vin g gnd
mosfet M1 d g gnd rds=inf
bias   M1 id=1mA vds=2V k=2mA/V^2 nthermal=5/4 kf=1e-25 cox=5mF/m^2 w=20um l=0.5um
resistor RD d vdd = 5k
ground vdd
transfer Av = v(d) / vin
