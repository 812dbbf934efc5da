#!/usr/bin/env python3
# print_check.py - the text and JSON forms read back exactly. See LICENSE.
#
# usage: python3 tests/sympy/print_check.py BUILD
# Runs BUILD/tests/tool_print, which prints random polynomial pairs as raw
# terms together with their text and JSON forms.  For every form:
#   - text: sympy's sympify reads "NAME = (N)/(D)" back; N and D, expanded,
#     equal the polynomials built here from the raw terms, and so does the
#     whole right-hand side as a rational function;
#   - text: grouped by a variable, the groups come in strictly decreasing
#     powers of it;
#   - json: Python's json module parses it, and the groups rebuild N and D.
# The reference is sympy (Debian's python3-sympy), independent of gainsmith.
import json
import os
import re
import subprocess
import sys

import sympy

passed = 0
failed = 0


def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print("print_check.py: FAILED: " + what)


def split_text(line):
    """'NAME = (N)/(D)' -> (NAME, N, D), by matching parentheses; a
    polynomial result 'NAME = N' gives D = '1'."""
    name, rhs = line.split(" = ", 1)
    if not rhs.startswith("("):
        return name, rhs, "1"
    depth = 0
    for i, ch in enumerate(rhs):
        depth += ch == "("
        depth -= ch == ")"
        if depth == 0:
            break
    num = rhs[1:i]
    rest = rhs[i + 1:]
    if not rest.startswith("/("):
        return name, rhs, "1"
    if not rest.endswith(")"):
        raise ValueError("not (N)/(D): " + line)
    return name, num, rest[2:-1]


def top_level_powers(expr_text, var):
    """Powers of var of the top-level groups of a grouped text."""
    powers = []
    depth = 0
    piece = ""
    for ch in expr_text + "\0":
        if ch in "+-\0" and depth == 0 and piece.strip():
            m = re.search(r"\*?\b" + re.escape(var) + r"(\^(\d+))?$",
                          piece.strip())
            if m and (piece.strip().endswith(")*" + m.group(0).lstrip("*"))
                      or "(" not in piece):
                powers.append(int(m.group(2) or 1))
            else:
                powers.append(0)
            piece = ""
            continue
        depth += ch == "("
        depth -= ch == ")"
        piece += ch
    return powers


def build(terms, syms):
    out = sympy.Integer(0)
    for coeff, exps in terms:
        mono = sympy.Integer(coeff)
        for sym, e in zip(syms, exps):
            mono *= sym ** e
        out += mono
    return sympy.expand(out)


def from_json(groups, collect, table):
    out = sympy.Integer(0)
    for g in groups:
        base = table[collect] ** g["power"] if collect else 1
        for t in g["terms"]:
            mono = sympy.Integer(int(t["coeff"]))
            for name, e in t["exps"].items():
                mono *= table[name] ** e
            out += mono * base
    return sympy.expand(out)


def check_case(case):
    names = case["vars"]
    syms = [sympy.Symbol(n) for n in names]
    table = dict(zip(names, syms))
    num = build(case["num"], syms)
    den = build(case["den"], syms)
    for var, line in case["text"]:
        tag = "case %s text %s: %s" % (case["id"], var, line)
        name, ntext, dtext = split_text(line)
        n = sympy.sympify(ntext, locals=table)
        d = sympy.sympify(dtext, locals=table)
        check(sympy.expand(n - num) == 0, tag + " (numerator)")
        check(sympy.expand(d - den) == 0, tag + " (denominator)")
        whole = sympy.sympify(line.split(" = ", 1)[1], locals=table)
        check(sympy.cancel(whole - num / den) == 0, tag + " (ratio)")
        if var != "-":
            for part in (ntext, dtext):
                p = top_level_powers(part, var)
                nz = [k for k in p if k > 0]
                check(nz == sorted(set(nz), reverse=True)
                      and p[len(nz):] == [0] * (len(p) - len(nz)),
                      tag + " (group order %s)" % p)
    for var, line in case["json"]:
        tag = "case %s json %s" % (case["id"], var)
        try:
            obj = json.loads(line)
        except ValueError as e:
            check(False, tag + " does not parse: %s" % e)
            continue
        collect = None if var == "-" else var
        check(obj["collect"] == collect, tag + " (collect)")
        check(from_json(obj["num"], collect, table) == num, tag + " (num)")
        check(from_json(obj["den"], collect, table) == den, tag + " (den)")
        used = sorted(str(x) for x in (num.free_symbols | den.free_symbols)
                      if str(x) != "s")
        check(sorted(obj["symbols"]) == used, tag + " (symbols)")
        powers = [g["power"] for g in obj["num"]]
        check(powers == sorted(set(powers), reverse=True), tag + " (order)")


def read_cases(text):
    case = None
    lines = iter(text.splitlines())
    for line in lines:
        word, _, rest = line.partition(" ")
        if word == "case":
            case = {"id": rest, "text": [], "json": []}
        elif word == "vars":
            case["vars"] = rest.split()
        elif word in ("num", "den"):
            terms = []
            for _ in range(int(rest)):
                fields = next(lines).split()
                terms.append((int(fields[0]), [int(e) for e in fields[1:]]))
            case[word] = terms
        elif word in ("text", "json"):
            var, _, body = rest.partition(" ")
            case[word].append((var, body))
        elif word == "end":
            yield case


def main():
    build_dir = sys.argv[1] if len(sys.argv) > 1 else "build"
    tool = os.path.join(build_dir, "tests", "tool_print")
    if not os.access(tool, os.X_OK):
        check(False, "%s not found (make tests)" % tool)
    else:
        for seed in (1, 2, 3):
            out = subprocess.run([tool, str(seed), "60"], check=True,
                                 stdout=subprocess.PIPE,
                                 universal_newlines=True).stdout
            for case in read_cases(out):
                try:
                    check_case(case)
                except Exception as e:  # a parse error is a failure
                    check(False, "seed %d case %s: %r" % (seed, case["id"], e))
    print("print_check.py: %d passed, %d failed" % (passed, failed))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
