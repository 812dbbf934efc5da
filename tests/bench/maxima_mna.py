#!/usr/bin/env python3
# maxima_mna.py - writes a maxima batch file that solves a .gsc circuit by MNA.
# See LICENSE.
#
# usage: python3 tests/bench/maxima_mna.py FILE.gsc > FILE.mac
#        maxima --very-quiet --batch=FILE.mac
#
# The speed anchor for `make bench`: the same circuit solved from scratch
# in a general computer algebra system.  Only the netlist is translated
# here; the modified nodal analysis itself is written in maxima (the
# stamping functions below), so the timed maxima process does all of the
# algebra: it stamps the matrix, takes D = det(A) and, by Cramer's rule,
# N = det(A with the output's column replaced by the right-hand side),
# reduces N/D with ratsimp, expands numerator and denominator and prints
#
#     terms_N=... terms_D=...
#
# Understood statements (all the benchmark circuits use): vsource,
# resistor, capacitor, inductor, vccs, and `transfer NAME = v(node) / src`;
# `#` starts a comment, a trailing `\` continues a line, title is ignored.
# Resistors stamp as the admittance 1/R, capacitors as s*C; inductors and
# voltage sources add a branch-current unknown (Ho, Ruehli and Brennan,
# "The modified nodal approach to network analysis", IEEE Trans. Circuits
# Syst., 1975).

import re
import sys

GROUND = ("gnd", "0")
KINDS = {"vsource": 2, "resistor": 2, "capacitor": 2, "inductor": 2,
         "vccs": 4}
# Names maxima gives a meaning to, plus s (the Laplace variable): a circuit
# symbol spelled like one of these is renamed in the batch file.
RESERVED = {"s", "true", "false", "done", "and", "or", "not", "if", "then",
            "else", "elseif", "for", "do", "while", "unless", "step", "thru",
            "from", "in", "next", "inf", "minf", "infinity", "und", "ind",
            "zeroa", "zerob", "block", "return", "go", "matrix", "num",
            "denom", "expand", "ratsimp", "determinant", "nterms"}
IDENT = re.compile(r"^[A-Za-z][A-Za-z0-9_]*$")
TRANSFER = re.compile(r"^v\(\s*([A-Za-z0-9_]+)\s*\)\s*/\s*([A-Za-z0-9_]+)$")


class GscError(Exception):
    pass


def logical_lines(text):
    """Yields (line number, statement) with comments and continuations
    folded away."""
    pending, start = "", 0
    for number, raw in enumerate(text.splitlines(), 1):
        line = raw.split("#", 1)[0].rstrip()
        if not pending:
            start = number
        if line.endswith("\\"):
            pending += line[:-1] + " "
            continue
        line = (pending + line).strip()
        pending = ""
        if line:
            yield start, line


def parse(text):
    """Returns (elements, output node, input source name)."""
    elements, transfer = [], None
    for number, line in logical_lines(text):
        words = line.split()
        kind = words[0]
        if kind == "title":
            continue
        if kind == "transfer":
            m = TRANSFER.match(line.split("=", 1)[-1].strip())
            if "=" not in line or not m:
                raise GscError("%d: expected 'transfer NAME = v(node) / src'"
                               % number)
            transfer = (m.group(1), m.group(2))
            continue
        if kind not in KINDS:
            raise GscError("%d: statement '%s' is not supported here"
                           % (number, kind))
        if "=" in line or len(words) != 2 + KINDS[kind]:
            raise GscError("%d: expected '%s NAME' and %d nodes, no value"
                           % (number, kind, KINDS[kind]))
        elements.append((kind, words[1], words[2:]))
    if transfer is None:
        raise GscError("no 'transfer' statement")
    return elements, transfer[0], transfer[1]


def number_nodes(elements):
    """Numbers the nodes 1, 2, ... in order of first appearance; ground is
    0.  Branch currents (vsource, inductor) follow the nodes."""
    nodes = {}
    for _, _, terminals in elements:
        for t in terminals:
            if t not in GROUND and t not in nodes:
                nodes[t] = len(nodes) + 1
    branches = {}
    for kind, name, _ in elements:
        if kind in ("vsource", "inductor"):
            branches[name] = len(nodes) + len(branches) + 1
    return nodes, branches


def maxima_names(elements):
    """Circuit symbol -> maxima symbol; renames anything maxima reserves
    or that could meet the batch file's own mna_ names."""
    names = {}
    for i, (_, name, _) in enumerate(elements, 1):
        ok = (IDENT.match(name) and name not in RESERVED
              and not name.lower().startswith("mna_"))
        names[name] = name if ok else "sym_%d" % i
    return names


PROGRAM = r"""
/* Modified nodal analysis, written in maxima.  mna_M is the matrix, mna_b
   the right-hand side; index 0 (ground) is dropped from every stamp. */
mna_add(mna_M, mna_i, mna_j, mna_v) :=
    if mna_i > 0 and mna_j > 0 then
        mna_M[mna_i, mna_j] : mna_M[mna_i, mna_j] + mna_v$

/* An admittance y between nodes a and b (KCL rows, node-voltage columns). */
mna_admittance(mna_M, mna_a, mna_b, mna_y) := (
    mna_add(mna_M, mna_a, mna_a, mna_y),
    mna_add(mna_M, mna_b, mna_b, mna_y),
    mna_add(mna_M, mna_a, mna_b, -mna_y),
    mna_add(mna_M, mna_b, mna_a, -mna_y))$

/* Branch current k flowing from a through the element to b, and the
   branch equation v(a) - v(b) - z*i(k) = rhs. */
mna_branch(mna_M, mna_a, mna_b, mna_k, mna_z) := (
    mna_add(mna_M, mna_a, mna_k, 1),
    mna_add(mna_M, mna_b, mna_k, -1),
    mna_add(mna_M, mna_k, mna_a, 1),
    mna_add(mna_M, mna_k, mna_b, -1),
    mna_add(mna_M, mna_k, mna_k, -mna_z))$

/* i(p -> q) = g * (v(c) - v(d)). */
mna_vccs(mna_M, mna_p, mna_q, mna_c, mna_d, mna_g) := (
    mna_add(mna_M, mna_p, mna_c, mna_g),
    mna_add(mna_M, mna_p, mna_d, -mna_g),
    mna_add(mna_M, mna_q, mna_c, -mna_g),
    mna_add(mna_M, mna_q, mna_d, mna_g))$

/* One element [kind, symbol, terminals..., branch]; the source named
   mna_input drives the circuit with amplitude 1, any other is zeroed. */
mna_stamp(mna_M, mna_b, mna_e) := block([mna_k : mna_e[1]],
    if mna_k = "resistor" then
        mna_admittance(mna_M, mna_e[3], mna_e[4], 1 / mna_e[2])
    elseif mna_k = "capacitor" then
        mna_admittance(mna_M, mna_e[3], mna_e[4], s * mna_e[2])
    elseif mna_k = "inductor" then
        mna_branch(mna_M, mna_e[3], mna_e[4], mna_e[5], s * mna_e[2])
    elseif mna_k = "vsource" then (
        mna_branch(mna_M, mna_e[3], mna_e[4], mna_e[5], 0),
        if mna_e[2] = mna_input then mna_b[mna_e[5], 1] : 1)
    elseif mna_k = "vccs" then
        mna_vccs(mna_M, mna_e[3], mna_e[4], mna_e[5], mna_e[6], mna_e[2]))$

mna_A : zeromatrix(mna_size, mna_size)$
mna_b : zeromatrix(mna_size, 1)$
for mna_e in mna_elements do mna_stamp(mna_A, mna_b, mna_e)$

/* Cramer's rule for the output unknown. */
mna_An : copymatrix(mna_A)$
for mna_i : 1 thru mna_size do mna_An[mna_i, mna_out] : mna_b[mna_i, 1]$
mna_D : determinant(mna_A)$
mna_N : determinant(mna_An)$
mna_H : ratsimp(mna_N / mna_D)$
mna_num : expand(num(mna_H))$
mna_den : expand(denom(mna_H))$
printf(true, "terms_N=~d terms_D=~d~%", nterms(mna_num), nterms(mna_den))$
"""


def element_list(elements, nodes, branches, names):
    rows = []
    for kind, name, terminals in elements:
        items = ['"%s"' % kind, names[name]]
        items += [str(nodes.get(t, 0)) for t in terminals]
        if name in branches:
            items.append(str(branches[name]))
        rows.append("    [" + ", ".join(items) + "]")
    return "[\n" + ",\n".join(rows) + "]"


def batch_file(path, text):
    elements, out, src = parse(text)
    nodes, branches = number_nodes(elements)
    names = maxima_names(elements)
    if out not in nodes:
        raise GscError("output node '%s' is not in the circuit" % out)
    if not any(k == "vsource" and n == src for k, n, _ in elements):
        raise GscError("input '%s' is not a vsource" % src)
    head = [
        "/* %s, written by maxima_mna.py: the netlist as maxima lists;"
        % path.split("/")[-1],
        "   [kind, symbol, node numbers (0 = ground), branch unknown]. */",
        "mna_size : %d$" % (len(nodes) + len(branches)),
        "mna_out : %d$" % nodes[out],
        "mna_input : %s$" % names[src],
        "mna_elements : %s$" % element_list(elements, nodes, branches, names),
    ]
    return "\n".join(head) + "\n" + PROGRAM


def main(argv):
    if len(argv) != 2:
        sys.stderr.write("usage: maxima_mna.py FILE.gsc\n")
        return 2
    try:
        with open(argv[1]) as f:
            sys.stdout.write(batch_file(argv[1], f.read()))
    except (OSError, GscError) as e:
        sys.stderr.write("maxima_mna.py: %s: %s\n" % (argv[1], e))
        return 2
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
