# approx --format json where the one output has no short form (its
# denominator R1 + R2 - A*R1 is zero at A = 2, R1 = R2): the error on
# standard error, and no half-written JSON array on standard output.
vsource    vin   in   gnd
resistor   R1    in   n
resistor   R2    n    out
vcvs       A     out  gnd  n gnd
value      R1 = 1k
value      R2 = 1k
value      A  = 2
transfer   Av = v(out) / vin
