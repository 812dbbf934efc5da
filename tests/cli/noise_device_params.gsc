# A common-source stage whose noise parameters sit on the mosfet line.
# At 1 kHz the gate-referred density of M1 is, by hand from the models
# of docs/noise.md (Razavi, noise chapter, from memory):
#   channel 4kT*gamma/gm = 4*1.380649e-23*300*1.25/2m = 1.0355e-17 V^2/Hz
#   flicker kf/(cox*w*l*f) = 1e-25/(5m*20u*0.5u*1k) = 2e-15 V^2/Hz
# so the flicker noise leads the table.
vsource vin g gnd
mosfet M1 d g gnd gm=2m rds=inf nthermal=5/4 kf=1e-25 cox=5m w=20u l=w_M1/40
resistor RD d vdd = 5k
ground vdd
transfer Av = v(d) / vin
