#!/usr/bin/env python3
# poly_check.py - cross-checks the polynomial module against sympy.
# See LICENSE.
#
# usage: python3 tests/sympy/poly_check.py BUILD_DIR
#
# Generates seeded random sparse polynomials in several variables (one of
# them the reciprocal symbol 1/R) with coefficients up to a few hundred
# bits, sends them to BUILD_DIR/tests/tool_poly, reads its answers back
# with sympy's sympify, and compares them with what sympy computes.  One
# line per failure with its seed; the last line is
# "poly_check.py: N passed, N failed"; exit status 1 on any failure.
import math
import random
import re
import subprocess
import sys

from sympy import Rational, Symbol, expand, limit, oo, sympify, zoo
from sympy.polys.domains import ZZ
from sympy.polys.rings import ring

NAMES = ["x", "y", "z", "t", "u", "v", "w", "gm", "s"]
RING, *GENS = ring(",".join(NAMES + ["Rinv"]), ZZ)
NV = len(GENS)                      # the last one is 1/R
SYMS = {n: Symbol(n) for n in NAMES + ["R"]}
RINV = Symbol("Rinv")
BASE_SEED = 20261201


def rand_poly(rng, nterms, nvars, maxexp, bits):
    """nterms random terms in the first nvars generators (1/R included
    when nvars is NV)."""
    terms = {}
    for _ in range(nterms):
        mono = [0] * NV
        for v in rng.sample(range(nvars), rng.randint(0, min(nvars, 4))):
            mono[v] = rng.randint(1, maxexp)
        c = rng.randint(1, 2 ** rng.randint(1, bits)) * rng.choice((1, -1))
        terms[tuple(mono)] = c
    return RING.from_dict(terms)


def fmt(p):
    """p in the syntax of gs_poly_set_str, terms in sympy's order."""
    if p == 0:
        return "0"
    out = []
    for mono, c in p.terms():
        factors = []
        for v, e in enumerate(mono):
            if e:
                name = "(1/R)" if v == NV - 1 else NAMES[v]
                factors.append(name + ("^%d" % e if e > 1 else ""))
        if not factors:
            body = str(abs(c))
        elif abs(c) == 1:
            body = "*".join(factors)
        else:
            body = str(abs(c)) + "*" + "*".join(factors)
        sign = "-" if c < 0 else "+"
        out.append((sign, body))
    text = ("-" if out[0][0] == "-" else "") + out[0][1]
    for sign, body in out[1:]:
        text += " %s %s" % (sign, body)
    return text


def from_sympy(text):
    e = sympify(text, locals=SYMS)
    return RING.from_expr(e.xreplace({SYMS["R"]: 1 / RINV}))


def read_back(text):
    """The tool's text through sympify, as an element of RING.  sympify
    builds a long sum one addition at a time, in quadratic time, so a long
    answer is read term by term, split at the printer's " + " and " - "."""
    if len(text) < 3000:
        return from_sympy(text)
    parts = re.split(r" ([+-]) ", text)
    total = from_sympy(parts[0])
    for sign, term in zip(parts[1::2], parts[2::2]):
        total += from_sympy(term) if sign == "+" else -from_sympy(term)
    return total


def as_expr(p):
    return p.as_expr().xreplace({RINV: 1 / SYMS["R"]})


def shape(rng, big=True):
    n = rng.randint(1, 25)
    nvars = rng.choice((2, 3, 4, 6, NV))
    maxexp = rng.choice((1, 2, 3, 6, 12))
    bits = rng.choice((4, 30, 62, 64, 200)) if big else rng.choice((3, 8))
    return rand_poly(rng, n, nvars, maxexp, bits)


def cases():
    """(seed, command, check) triples; check(answer) -> None or a
    complaint."""
    out = []
    ops = ["mul", "mulheap", "muldense", "mulbig", "add", "sub", "div",
           "inexact", "pow", "diff", "coeff", "subst", "substrat",
           "content", "prim", "print", "degree", "gcd"]
    k = 0
    for rep in range(20):
        for op in ops:
            seed = BASE_SEED + k
            k += 1
            out.append(make_case(op, seed))
    for j in range(16):
        out.append(make_case("limit", BASE_SEED + 5000 + j))
    for j in range(12):         # dense enough for the block method
        out.append(make_case("mul-dense", BASE_SEED + 6000 + j))
    for j in range(12):         # sums past 128 bits of 64-bit products
        out.append(make_case("mul-wide", BASE_SEED + 7000 + j))
    return out


def rand_wide(rng, nterms, nvars, maxexp):
    """rand_poly with every coefficient of 63 bits, below 2^63 in size:
    the largest that the three-word accumulator takes."""
    terms = {}
    for _ in range(nterms):
        mono = [0] * NV
        for v in range(nvars):
            mono[v] = rng.randint(0, maxexp)
        terms[tuple(mono)] = (rng.randint(2 ** 62, 2 ** 63 - 1)
                              * rng.choice((1, -1)))
    return RING.from_dict(terms)


def expect_poly(want):
    def check(ans):
        got = read_back(ans)
        return None if got == want else "expected %s" % fmt(want)
    return check


def make_case(op, seed):
    rng = random.Random(seed)
    a, b = shape(rng), shape(rng)
    if b == 0:
        b = RING(1)
    x = rng.randrange(NV - 1)
    xname = NAMES[x]
    if op == "mul-dense":
        nvars, e = rng.choice(((1, 60), (2, 8), (3, 5), (4, 3)))
        a, b = (rand_poly(rng, rng.randint(20, 80), nvars, e,
                          rng.choice((8, 62, 100))) for _ in range(2))
        op = rng.choice(("mul", "muldense", "mulbig", "div"))
        if op == "div":
            return (seed, "%s %s ; %s" % (rng.choice(("div", "divdense")),
                                          fmt(a * b), fmt(b)),
                    expect_poly(a))
    if op == "mul-wide":
        nvars, e = rng.choice(((1, 60), (2, 8), (3, 4)))
        a, b = (rand_wide(rng, rng.randint(30, 90), nvars, e)
                for _ in range(2))
        op = rng.choice(("mul", "mulheap", "muldense", "mulmid"))
    if op.startswith("mul"):
        return seed, "%s %s ; %s" % (op, fmt(a), fmt(b)), expect_poly(a * b)
    if op in ("add", "sub"):
        want = a + b if op == "add" else a - b
        return seed, "%s %s ; %s" % (op, fmt(a), fmt(b)), expect_poly(want)
    if op == "div":
        div = rng.choice(("div", "divheap", "divdense", "divbig"))
        return seed, "%s %s ; %s" % (div, fmt(a * b), fmt(b)), expect_poly(a)
    if op == "inexact":
        # a b + c for a constant c != 0 is not divisible by a nonconstant b
        b = b + GENS[x]
        c = rng.randint(1, 10 ** 20)
        div = rng.choice(("div", "divheap", "divdense", "divbig"))
        return (seed, "%s %s ; %s" % (div, fmt(a * b + c), fmt(b)),
                lambda ans: None if ans == "inexact" else "expected inexact")
    if op == "pow":
        a = rand_poly(rng, rng.randint(1, 6), rng.choice((2, 4, NV)), 4,
                      rng.choice((3, 70)))
        n = rng.randint(0, 5)
        return seed, "pow %s ; %d" % (fmt(a), n), expect_poly(a ** n)
    if op == "diff":
        return (seed, "diff %s ; %s" % (fmt(a), xname),
                expect_poly(a.diff(GENS[x])))
    if op == "coeff":
        k = rng.randint(0, 3)
        want = RING.from_dict({m[:x] + (0,) + m[x + 1:]: c
                               for m, c in a.terms() if m[x] == k})
        return (seed, "coeff %s ; %s ; %d" % (fmt(a), xname, k),
                expect_poly(want))
    if op == "subst":
        a = rand_poly(rng, rng.randint(1, 10), NV, 3, 40)
        b = rand_poly(rng, rng.randint(1, 4), NV, 2, 8)
        return (seed, "subst %s ; %s ; %s" % (fmt(a), xname, fmt(b)),
                expect_poly(a.compose(GENS[x], b)))
    if op == "substrat":
        p, q = rng.randint(-50, 50), rng.randint(1, 30)
        return (seed, "substrat %s ; %s ; %d/%d" % (fmt(a), xname, p, q),
                check_substrat(a, x, Rational(p, q)))
    if op == "content":
        g = 0
        for c in a.coeffs():
            g = math.gcd(g, int(c))
        want = -g if a.LC < 0 else g
        return (seed, "content %s" % fmt(a),
                lambda ans: None if int(ans) == want else "expected %d" % want)
    if op == "prim":
        g = 0
        for c in a.coeffs():
            g = math.gcd(g, int(c))
        want = a.quo_ground(-g if a.LC < 0 else g)
        return seed, "prim %s" % fmt(a), expect_poly(want)
    if op == "print":
        return seed, "print %s" % fmt(a), expect_poly(a)
    if op == "degree":
        want = a.degree(GENS[x]) if a != 0 else -1
        return (seed, "degree %s ; %s" % (fmt(a), xname),
                lambda ans: None if int(ans) == want else "expected %d" % want)
    if op == "gcd":
        nvars = rng.choice((2, 3, 4, 6))
        a, b, g = (rand_poly(rng, rng.randint(1, 8), nvars, 3, 20)
                   for _ in range(3))
        a, b = a * g, b * g
        return seed, "gcd %s ; %s" % (fmt(a), fmt(b)), check_gcd(a.gcd(b))
    if op == "limit":
        return limit_case(rng, seed)
    raise ValueError(op)


def check_substrat(a, x, r):
    expr_a = as_expr(a)

    def check(ans):
        scale, poly = ans.split(";")
        n = a.degree(GENS[x])
        want_scale = r.q ** n if n >= 0 else 1
        if int(scale) != want_scale:
            return "expected scale %d" % want_scale
        got = sympify(poly, locals=SYMS)
        want = want_scale * expr_a.subs(SYMS[NAMES[x]], r)
        return None if expand(got - want) == 0 else "wrong value"
    return check


def check_gcd(want):
    """gs_poly_gcd's gcd is primitive with a positive leading coefficient
    (sympy's keeps the integer content)."""
    if want != 0:
        want = want.primitive()[1]

    def check(ans):
        got = read_back(ans)
        ok = got == want or got == -want
        if ok and got != 0 and got.LC < 0:
            return "leading coefficient must be positive"
        return None if ok else "expected +-%s" % fmt(want)
    return check


def limit_case(rng, seed):
    """n/d in x -> oo or 0 with small random coefficients; sympy's limit
    decides (other symbols positive, so the limit is unambiguous)."""
    nvars = 3
    n = rand_poly(rng, rng.randint(1, 4), nvars, 3, 4)
    d = rand_poly(rng, rng.randint(1, 4), nvars, 3, 4)
    if d == 0:
        d = RING(1)
    to = rng.choice(("inf", "zero"))
    pos = {n_: Symbol(n_, positive=True) for n_ in NAMES[:nvars]}
    ratio = (n.as_expr() / d.as_expr()).xreplace(
        {Symbol(k): v for k, v in pos.items()})
    want = limit(ratio, pos["x"], oo if to == "inf" else 0)

    def check(ans):
        if ans == "infinite":
            return None if want.has(oo, -oo, zoo) \
                else "expected %s" % want
        rn, rd = ans.split(";")
        got = sympify(rn, locals=pos) / sympify(rd, locals=pos)
        return None if expand(got - want) == 0 or \
            (got - want).simplify() == 0 else "expected %s" % want
    return seed, "limit %s ; %s ; x ; %s" % (fmt(n), fmt(d), to), check


def main():
    if len(sys.argv) != 2:
        print("usage: poly_check.py BUILD_DIR", file=sys.stderr)
        return 2
    tool = sys.argv[1] + "/tests/tool_poly"
    todo = cases()
    text = "vars " + " ".join(NAMES) + " 1/R\n"
    text += "".join(cmd + "\n" for _, cmd, _ in todo)
    try:
        run = subprocess.run([tool], input=text, capture_output=True,
                             text=True, timeout=300)
        answers = run.stdout.split("\n")
    except (OSError, subprocess.TimeoutExpired) as err:
        print("poly_check.py: cannot run %s: %s" % (tool, err))
        answers = []
    passed = failed = 0
    for k, (seed, cmd, check) in enumerate(todo):
        ans = answers[k + 1] if k + 1 < len(answers) else None
        try:
            why = "no answer" if ans is None else check(ans.strip())
        except Exception as err:        # unreadable answer
            why = "answer %r: %s" % (ans[:80] if ans else ans, err)
        if why is None:
            passed += 1
        else:
            failed += 1
            print("poly_check.py: FAIL seed %d: %s: %s" % (seed, cmd[:100],
                                                          why[:200]))
    print("poly_check.py: %d passed, %d failed" % (passed, failed))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
