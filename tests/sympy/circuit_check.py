#!/usr/bin/env python3
# circuit_check.py - random circuits solved by gainsmith and by an MNA
# written here in sympy, compared exactly.  See LICENSE.
#
# usage: python3 tests/sympy/circuit_check.py BUILD_DIR [COUNT]
# Each seeded random circuit (R, C, L, the four controlled sources, ideal
# op-amps, up to 8 nodes) is written as a .gsc file and derived by
# gainsmith, once by expansion in minors and once by elimination (which
# must print the same bytes); the same circuit is solved independently below by modified
# nodal analysis in sympy (Cramer's rule with sympy's determinant), and
# the two ratios must agree exactly: expand(N_g * D_s - N_s * D_g) == 0.
# A circuit that gainsmith rejects as structurally unsound, or finds
# singular, must have det A == 0 in sympy too (or be rejected for a
# structural reason sympy cannot see, which is counted, not failed).
# Ends with "circuit_check.py: N passed, N failed".
import os
import random
import signal
import subprocess
import sys
import tempfile

import sympy as sp
from sympy.polys.matrices import DomainMatrix

S = sp.Symbol('s')


def conductance(name):
    """The symbol of 1/R: entries stay polynomials, which sympy's
    polynomial-domain determinant handles fast; G = 1/R is put back at the
    end."""
    return sp.Symbol('G_' + name)


def make_circuit(rng):
    """A random circuit as (text, elements, output)."""
    nnodes = rng.randint(2, 8)
    nodes = ['n%d' % i for i in range(1, nnodes + 1)]
    allnodes = nodes + ['gnd']
    elems = [('vsource', 'vin', 'n1', 'gnd')]
    counts = {}

    def name(prefix):
        counts[prefix] = counts.get(prefix, 0) + 1
        return '%s%d' % (prefix, counts[prefix])

    # a spanning chain of resistors keeps most circuits connected
    order = nodes[:]
    rng.shuffle(order)
    prev = 'gnd'
    for n in order:
        kind = rng.choice(['resistor', 'resistor', 'capacitor'])
        elems.append((kind, name('R' if kind == 'resistor' else 'C'),
                      n, prev))
        prev = n
    for _ in range(rng.randint(1, nnodes + 2)):
        a, b = rng.sample(allnodes, 2)
        c, d = rng.sample(allnodes, 2)
        kind = rng.choice(['resistor', 'capacitor', 'inductor', 'vccs',
                           'vcvs', 'cccs', 'ccvs', 'opamp', 'resistor'])
        if kind == 'resistor':
            elems.append((kind, name('R'), a, b))
        elif kind == 'capacitor':
            elems.append((kind, name('C'), a, b))
        elif kind == 'inductor':
            elems.append((kind, name('L'), a, b))
        elif kind == 'vccs':
            elems.append((kind, name('g'), a, b, c, d))
        elif kind == 'vcvs':
            elems.append((kind, name('E'), a, 'gnd', c, d))
        elif kind in ('cccs', 'ccvs'):
            ctrl = rng.choice([e[1] for e in elems
                               if e[0] in ('resistor', 'vsource',
                                           'inductor', 'capacitor')])
            prefix = 'F' if kind == 'cccs' else 'H'
            elems.append((kind, name(prefix), a,
                          'gnd' if kind == 'ccvs' else b, ctrl))
        elif kind == 'opamp' and (c != 'gnd' or d != 'gnd'):
            out = rng.choice(nodes)
            elems.append(('opamp', name('U'), out, c, d))
    r = rng.random()
    if r < 0.6:
        out = ('v', rng.choice(nodes))
    elif r < 0.8:
        out = ('i', rng.choice([e[1] for e in elems
                                if e[0] in ('resistor', 'inductor')]))
    else:
        out = ('z', rng.choice(nodes))
    lines = []
    for e in elems:
        lines.append('%-9s %s' % (e[0], ' '.join(e[1:])))
    if out[0] == 'v':
        lines.append('transfer H = v(%s) / vin' % out[1])
    elif out[0] == 'i':
        lines.append('transfer H = i(%s) / vin' % out[1])
    else:
        lines.append('impedance H = %s, gnd' % out[1])
    return '\n'.join(lines) + '\n', elems, out


def sympy_mna(elems, out):
    """(N, D) of the output by an independent MNA in sympy."""
    nodes = sorted({n for e in elems for n in node_args(e)} - {'gnd'})
    idx = {n: i for i, n in enumerate(nodes)}
    branches = [e[1] for e in elems
                if e[0] in ('vsource', 'inductor', 'vcvs', 'ccvs', 'opamp')]
    bidx = {b: len(nodes) + i for i, b in enumerate(branches)}
    n = len(nodes) + len(branches)
    A = sp.zeros(n, n)
    rhs = sp.zeros(n, 1)
    by_name = {e[1]: e for e in elems}
    zin = out[0] == 'z'

    def v(node):
        row = sp.zeros(1, n)
        if node != 'gnd':
            row[idx[node]] = 1
        return row

    def current(name_):
        """Row vector (and known part) of an element's current."""
        e = by_name[name_]
        sym = sp.Symbol(e[1])
        if e[1] in bidx:
            row = sp.zeros(1, n)
            row[bidx[e[1]]] = 1
            return row, 0
        if e[0] == 'resistor':
            return (v(e[2]) - v(e[3])) * conductance(e[1]), 0
        if e[0] == 'capacitor':
            return (v(e[2]) - v(e[3])) * S * sym, 0
        if e[0] == 'vccs':
            return (v(e[4]) - v(e[5])) * sym, 0
        if e[0] == 'cccs':
            row, known = current(e[4])
            return row * sym, known * sym
        raise ValueError(e)

    def kcl(node, row, known):
        if node == 'gnd':
            return
        i = idx[node]
        for j in range(n):
            A[i, j] += row[j]
        rhs[i] -= known

    for e in elems:
        kind, nm = e[0], e[1]
        sym = sp.Symbol(nm)
        if kind in ('resistor', 'capacitor', 'vccs', 'cccs'):
            row, known = current(nm)
            kcl(e[2], row, known)
            kcl(e[3], -row, -known)
        elif kind == 'opamp':
            k = bidx[nm]
            if e[2] != 'gnd':
                A[idx[e[2]], k] += 1
            A[k, :] += v(e[3]) - v(e[4])
        else:
            k = bidx[nm]
            if e[2] != 'gnd':
                A[idx[e[2]], k] += 1
            if e[3] != 'gnd':
                A[idx[e[3]], k] -= 1
            A[k, :] += v(e[2]) - v(e[3])
            if kind == 'vsource' and not zin:
                rhs[k] += 1
            elif kind == 'inductor':
                A[k, k] -= S * sym
            elif kind == 'vcvs':
                A[k, :] -= (v(e[4]) - v(e[5])) * sym
            elif kind == 'ccvs':
                row, known = current(e[4])
                A[k, :] -= row * sym
                rhs[k] += known * sym
    if zin:
        rhs[idx[out[1]]] += 1
        probe, known = v(out[1]), 0
    elif out[0] == 'v':
        probe, known = v(out[1]), 0
    else:
        probe, known = current(out[1])
    # H = c^T A^-1 b + known = (known det A - det [[A, b], [c^T, 0]]) / det A
    M = A.row_join(rhs).col_join(probe.row_join(sp.zeros(1, 1)))
    det = det_poly(A)
    if det == 0:
        return None, 0
    num = sp.expand(known * det - det_poly(M))
    subs = {conductance(e[1]): 1 / sp.Symbol(e[1])
            for e in elems if e[0] == 'resistor'}
    return num.subs(subs), det.subs(subs)


def det_poly(A):
    """det A, exactly, by sympy's fraction-free determinant over the
    polynomial ring of A's entries."""
    dm = DomainMatrix.from_Matrix(A)
    return dm.domain.to_sympy(dm.det())


def node_args(e):
    if e[0] in ('vccs', 'vcvs'):
        return e[2:6]
    if e[0] in ('cccs', 'ccvs'):
        return e[2:4]
    return e[2:]


class TooSlow(Exception):
    pass


def on_alarm(signum, frame):
    raise TooSlow()


def sympy_within(elems, out, seconds):
    """sympy_mna, or TooSlow past the time limit: a few random circuits
    take sympy minutes, and the check must stay quick."""
    signal.signal(signal.SIGALRM, on_alarm)
    signal.alarm(seconds)
    try:
        return sympy_mna(elems, out)
    finally:
        signal.alarm(0)


def run_gainsmith(binary, text, method):
    with tempfile.NamedTemporaryFile('w', suffix='.gsc', delete=False) as f:
        f.write(text)
        path = f.name
    try:
        p = subprocess.run([binary, 'derive', '--method', method, path],
                           capture_output=True,
                           text=True, timeout=60)
    finally:
        os.unlink(path)
    return p.returncode, p.stdout, p.stderr


def main():
    build = sys.argv[1] if len(sys.argv) > 1 else 'build'
    count = int(sys.argv[2]) if len(sys.argv) > 2 else 120
    binary = os.path.join(build, 'gainsmith')
    passed = failed = rejected = slow = 0
    for seed in range(count):
        rng = random.Random(seed)
        text, elems, out = make_circuit(rng)
        # both determinant methods must print the same bytes
        rc, stdout, stderr = run_gainsmith(binary, text, 'minors')
        rc2, stdout2, _ = run_gainsmith(binary, text, 'bareiss')
        if (rc, stdout) != (rc2, stdout2):
            failed += 1
            print('seed %d: --method minors and bareiss differ:\n%s%s%s'
                  % (seed, text, stdout, stdout2))
            continue
        try:
            num, det = sympy_within(elems, out, 4)
        except TooSlow:
            slow += 1
            continue
        if rc != 0:
            # gainsmith refused: fine when sympy also finds no solution,
            # or when the refusal names a structural fault.
            if num is None or 'error' in stderr and rc == 2:
                if num is not None:
                    rejected += 1
                passed += 1
            else:
                failed += 1
                print('seed %d: gainsmith failed (%d) but sympy solved it:'
                      '\n%s%s' % (seed, rc, text, stderr))
            continue
        if num is None:
            failed += 1
            print('seed %d: sympy finds det A = 0 but gainsmith gave %s'
                  % (seed, stdout))
            continue
        rhs = stdout.strip().split(' = ', 1)[1]
        names = {e[1] for e in elems} | {'s'}
        ours = sp.sympify(rhs, locals={n: sp.Symbol(n) for n in names})
        on, od = sp.fraction(sp.together(ours))
        sn, sd = sp.fraction(sp.together(num / det))
        if sp.expand(on * sd - sn * od) == 0:
            passed += 1
        else:
            failed += 1
            print('seed %d: results differ\n%sgainsmith: %ssympy: (%s)/(%s)'
                  % (seed, text, stdout, num, det))
    print('circuit_check.py: %d circuits, %d rejected as unsound by '
          'gainsmith while sympy found a solution, %d skipped because sympy '
          'needed more than 4 s' % (count, rejected, slow))
    if slow > count // 5:
        failed += 1
        print('circuit_check.py: too many circuits skipped')
    print('circuit_check.py: %d passed, %d failed' % (passed, failed))
    return 1 if failed else 0


if __name__ == '__main__':
    sys.exit(main())
