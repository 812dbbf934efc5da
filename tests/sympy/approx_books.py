# approx_books.py - textbook pole and zero forms come back out of the text
# output of `gainsmith approx` at values that satisfy the books'
# conditions, compared by exact identity with sympy; the bench op-amp's
# figures compared with the exact numbers of `gainsmith poles` and `eval`.
# usage: python3 approx_books.py BUILD-or-GAINSMITH
# par(a, b) = a*b/(a + b), as docs/approx.md defines it.
import json, os, re, subprocess, sys, tempfile
import sympy as sp

bin_ = sys.argv[1] if len(sys.argv) > 1 else 'build'
if os.path.isdir(bin_):
    bin_ = os.path.join(bin_, 'gainsmith')
a_, b_ = sp.symbols('a b')
par = sp.Lambda((a_, b_), a_ * b_ / (a_ + b_))
passes = fails = 0


def ok(name, cond, detail=''):
    global passes, fails
    if cond:
        passes += 1
    else:
        fails += 1
        print('FAIL', name, detail)


def run(*args):
    return subprocess.run([bin_] + list(args), capture_output=True,
                          text=True, check=True).stdout


def expr(text):
    return sp.sympify(text, locals={'par': par})


def same(name, got, want):
    ok(name, got is not None and sp.simplify(got - want) == 0,
       '%s expected %s' % (got, want))


FLT = r'[0-9.]+(?:e[+-]?[0-9]+)?'
NUM = r'(-?' + FLT + r'(?:[+-]' + FLT + r'j)?|nan|inf)'


def parse_text(out):
    """approx's text output of one output: the DC form and number, and per
    pole and zero the form (None without an estimate), the estimate's
    number and the exact root, as the text prints them."""
    lines = out.splitlines()
    r = {'pole': [], 'zero': []}
    for i, ln in enumerate(lines):
        m = re.match(r'DC gain ~ (.*)$', ln)
        if m:
            r['dc'] = expr(m.group(1))
            v = re.match(r'\s+= ' + NUM + r' \(exact ' + NUM, lines[i + 1])
            r['dc_value'], r['dc_exact'] = float(v.group(1)), float(v.group(2))
        m = re.match(r'(pole|zero) (\d+): (.*)$', ln)
        if not m:
            continue
        kind, rest = m.group(1), m.group(3)
        if rest.startswith('~ '):
            v = re.match(r'\s+= ' + NUM + r' \(exact ' + NUM, lines[i + 1])
            r[kind].append({'expr': expr(rest[2:]),
                            'value': complex(v.group(1)),
                            'exact': complex(v.group(2))})
        else:       # no estimate, or the conjugate of a pair
            v = re.search(r'(?:exact|above:) ' + NUM + '$', rest)
            x = complex(v.group(1)) if v else None
            r[kind].append({'expr': None, 'value': None, 'exact': x})
    return r


def approx_text(path, *args):
    return parse_text(run('approx', path, *args))


S = sp.symbols

# ---- the common-source stage's Miller pole ------------------------------
# Razavi, "Design of Analog CMOS Integrated Circuits", ch. 6, from memory:
# a CS stage driven through RS, with CGS, CGD, load RD || CL (ro folded
# into RD), has the dominant pole
#   p1 = -1/(RS*(CGS + (1 + gm*RD)*CGD) + RD*(CGD + CL)).
# The book form is checked first by hand derivation: nodal equations
#   (vin - vg)/RS = s*CGS*vg + s*CGD*(vg - vd)
#   s*CGD*(vd - vg) + gm*vg + vd/RD + s*CL*vd = 0
# solved by sympy give D(s) = a0 + a1*s + a2*s^2, and -a0/a1 is the form.
RS, RD, gm, CGS, CGD, CL, s = S('RS RD gm CGS CGD CL s')
vin, vg, vd = S('vin vg vd')
sol = sp.solve([(vin - vg) / RS - s * CGS * vg - s * CGD * (vg - vd),
                s * CGD * (vd - vg) + gm * vg + vd / RD + s * CL * vd],
               [vg, vd], dict=True)[0]
num, den = sp.fraction(sp.cancel(sol[vd] / vin))
den = sp.Poly(sp.expand(den), s)
a0, a1 = den.coeff_monomial(1), den.coeff_monomial(s)
book_p1 = -1 / (RS * (CGS + (1 + gm * RD) * CGD) + RD * (CGD + CL))
same('cs miller: the book form is -a0/a1', -a0 / a1, book_p1)
# values making the Miller term RS*gm*RD*CGD the largest part of a1 and
# p1 dominant (separation about 25 from p2)
CS_STAGE = """title "Common-source stage driven through RS"
vsource    vin   in   gnd
resistor   RS    in   g
mosfet     M1    d    g    gnd  gm=gm rds=inf cgs=CGS cgd=CGD
resistor   RD    d    gnd
capacitor  CL    d    gnd
value      RS  = 10k
value      gm  = 1m
value      RD  = 20k
value      CGS = 100f
value      CGD = 20f
value      CL  = 50f
transfer   Av  = v(d) / vin
"""
with tempfile.NamedTemporaryFile('w', suffix='.gsc', delete=False) as f:
    f.write(CS_STAGE)
    cs_path = f.name
try:
    r = approx_text(cs_path)
finally:
    os.unlink(cs_path)
same('cs miller p1', r['pole'][0]['expr'], book_p1)
# the right-half-plane zero gm/CGD (Razavi, ch. 6, from memory)
same('cs zero', r['zero'][0]['expr'], gm / CGD)

# ---- the two-stage Miller op-amp's second pole and zero -----------------
# Gray, Hurst, Lewis, Meyer, "Analysis and Design of Analog Integrated
# Circuits", ch. 9, from memory: with R1, C1 at the first stage's output,
# R2, C2 at the second's, gain stage gm2 and Cc between the two nodes,
#   p2 ~ -gm2*Cc/(C1*C2 + C1*Cc + C2*Cc),  z = +gm2/Cc.
# Checked first on the two-node model itself: a2 = R1*R2*(C1*C2 + C1*Cc +
# C2*Cc), the gm2 term of a1 is gm2*R1*R2*Cc, so -a1/a2 with that term is
# the book's p2; the numerator vanishes at s = gm2/Cc.
gm1, gm2, R1, R2, C1, C2, Cc = S('gm1 gm2 R1 R2 C1 C2 Cc')
v1, v2 = S('v1 v2')
sol = sp.solve([gm1 * vin + v1 / R1 + s * C1 * v1 + s * Cc * (v1 - v2),
                gm2 * v1 + v2 / R2 + s * C2 * v2 + s * Cc * (v2 - v1)],
               [v1, v2], dict=True)[0]
num, den = sp.fraction(sp.cancel(sol[v2] / vin))
den = sp.Poly(sp.expand(den), s)
# D normalised to D(0) = 1, the book's 1 + a1*s + a2*s^2
a0 = den.coeff_monomial(1)
a1 = sp.expand(sp.cancel(den.coeff_monomial(s) / a0))
a2 = sp.expand(sp.cancel(den.coeff_monomial(s ** 2) / a0))
same('miller model a2', a2, R1 * R2 * (C1 * C2 + C1 * Cc + C2 * Cc))
same('miller model a1 gm2 term', a1.coeff(gm2), R1 * R2 * Cc)
same('miller model zero', sp.solve(num, s)[0], gm2 / Cc)
# examples/miller_opamp.gsc: gm2 = gm6, C1 = cg6 (the only capacitance at
# the first stage's output once the mirror's are negligible), C2 = CL.  The
# book's conditions: the mirror and input nodes much faster (cg1, cg3 made
# 0.1 fF), C1, C2 and Cc of one size so that none of the three products
# may go; --tol 1 as for p1 in approx_check.py.
gm6, cg6 = S('gm6 cg6')
r = approx_text('examples/miller_opamp.gsc', '--tol', '1',
                '--set', 'cg1=0.1f', '--set', 'cg3=0.1f',
                '--set', 'cg6=3p', '--set', 'CL=4p', '--set', 'Cc=2p')
p2 = r['pole'][1]
same('miller p2', p2['expr'], -gm6 * Cc / (cg6 * CL + cg6 * Cc + CL * Cc))
z = [x for x in r['zero'] if x['exact'] is not None and x['exact'].real > 0]
same('miller rhp zero', z[0]['expr'] if z else None, gm6 / Cc)
# at the file's own values and the default tolerance the zero has no
# dominant-root estimate (its neighbour is 3.9 times away), but it is the
# root of the factor gm6 - Cc*s of the exact N, so approx prints it exact
r0 = approx_text('examples/miller_opamp.gsc')
z = [x for x in r0['zero'] if x['exact'] is not None and x['exact'].real > 0]
same('miller rhp zero at the defaults', z[0]['expr'] if z else None,
     gm6 / Cc)
# the printed numbers are those of the forms at the values (the set ones)
vals = {gm6: 2e-3, cg6: 3e-12, CL: 4e-12, Cc: 2e-12}
ok('miller p2 value', abs(complex(p2['expr'].subs(vals)) - p2['value'])
   <= 1e-5 * abs(p2['value']), p2['value'])

# ---- the bench op-amp with every device capacitance ---------------------
# tests/bench/opamp_full_caps.gsc: approx's DC gain, dominant pole, GBW
# = |A0*p1| and right-half-plane zero against the exact numbers of
# `gainsmith poles` (its root finder on the exact polynomials) and the DC
# value of `gainsmith eval`, within the tolerance: the default 0.1 dB as a
# relative error, 10^(0.1/20) - 1 (docs/approx.md), twice that for the
# product GBW.
BENCH = 'tests/bench/opamp_full_caps.gsc'
tol = 10 ** (0.1 / 20) - 1
pz = json.loads(run('poles', BENCH, '--format', 'json'))[0]
dc_eval = float(re.search(r'^\s+DC\s+(\S+)', run('eval', BENCH),
                          re.M).group(1))
ok('bench poles and eval agree on DC', abs(pz['dc_gain'] - dc_eval)
   <= 1e-6 * abs(dc_eval))
r = approx_text(BENCH)
rel = lambda x, y: abs(x - y) / abs(y)
ok('bench DC', rel(r['dc_value'], dc_eval) <= tol, r['dc_value'])
p1x = complex(pz['poles'][0]['re'], pz['poles'][0]['im'])
p1 = r['pole'][0]
ok('bench p1', p1['expr'] is not None and rel(p1['value'], p1x) <= tol,
   p1['value'])
ok('bench GBW', rel(abs(r['dc_value'] * p1['value']), abs(dc_eval * p1x))
   <= 2 * tol)
zx = [complex(x['re'], x['im']) for x in pz['zeros'] if x['rhp']]
z = [x for x in r['zero'] if x['exact'] is not None and x['exact'].real > 0]
ok('bench rhp zero exact', len(zx) == 1 and len(z) == 1
   and rel(z[0]['exact'], zx[0]) <= 1e-5)   # 6 digits printed

# the zero by identity: the root of the factor (Cc + cgdc)*s - gmc of the
# exact N, the Miller zero gm/Cf with Cf = Cc + Cgd the whole capacitance
# from the second stage's gate to its drain (Gray et al., ch. 9, from
# memory; the CS stage's gm/CGD of Razavi, ch. 6, above)
gma, gmb, gmc, ra, rb, rc, rd, cgsc, cgdc = S('gma gmb gmc ra rb rc rd cgsc '
                                              'cgdc')
same('bench rhp zero form', z[0]['expr'] if z else None, gmc / (Cc + cgdc))
ok('bench rhp zero value', len(zx) == 1 and len(z) == 1
   and z[0]['value'] is not None and rel(z[0]['value'], zx[0]) <= tol)
# The textbook forms when the values make them dominant (Gray et al.,
# ch. 9, from memory): A0 = gm1*R1*gm2*R2 with R1 = ra||rb, R2 = rc||rd,
# p1 = -1/(gm2*R1*R2*Cc), p2 = -gm2*Cc/(C1*C2 + C1*Cc + C2*Cc) with C1 =
# cgsc, C2 = CL, z = gm2/Cc.  The conditions: the parasitic capacitances
# of M1-M4 a tenth of the file's (their poles and zeros far out), the
# mirror's gmb*rb = 300 >> 1, C1 of the size of CL and Cc; --tol 1.
BOOK = ['--tol', '1', '--set', 'cgsa=6f', '--set', 'cgda=0.8f',
        '--set', 'cdba=1.5f', '--set', 'cgsb=4.5f', '--set', 'cgdb=0.6f',
        '--set', 'cdbb=1.2f', '--set', 'gmb=1.2m', '--set', 'cgsc=3p']
r = approx_text(BENCH, *BOOK)
R1b, R2b = ra * rb / (ra + rb), rc * rd / (rc + rd)
same('bench book A0', r['dc'], -gma * R1b * gmc * R2b)
same('bench book p1', r['pole'][0]['expr'], -1 / (gmc * R1b * R2b * Cc))
same('bench book p2', r['pole'][1]['expr'],
     -gmc * Cc / (cgsc * CL + cgsc * Cc + CL * Cc))
z = [x for x in r['zero'] if x['exact'] is not None and x['exact'].real > 0]
same('bench book z', z[0]['expr'] if z else None, gmc / Cc)
# and their numbers within that tolerance (1 dB as a relative error) of
# the exact ones at the same values
tol1 = 10 ** (1 / 20) - 1
pz = json.loads(run('poles', BENCH, '--format', 'json', *BOOK[2:]))[0]
p1x = complex(pz['poles'][0]['re'], pz['poles'][0]['im'])
ok('bench book A0 value', rel(r['dc_value'], pz['dc_gain']) <= tol1)
ok('bench book p1 value', rel(r['pole'][0]['value'], p1x) <= tol1)
ok('bench book GBW', rel(abs(r['dc_value'] * r['pole'][0]['value']),
                         abs(pz['dc_gain'] * p1x)) <= 2 * tol1)

print('approx_books: %d passed, %d failed' % (passes, fails))
sys.exit(1 if fails else 0)
