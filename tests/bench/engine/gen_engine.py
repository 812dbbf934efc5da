#!/usr/bin/env python3
# gen_engine.py - writes the engine benchmark circuits. See LICENSE.
#
# usage: python3 tests/bench/engine/gen_engine.py DIR
# Circuits of our own design (tests/bench/README.md): every element is its
# own symbol with a value line, so that derive, eval and bode all run.
import sys, os

def cs_chain(k):
    L = ["# Common-source chain of %d stages with cgs, cgd, cdb per device." % k,
         "vsource   vin  n0 gnd", "resistor  Rsig n0 g1", "value Rsig = 1k"]
    for i in range(1, k + 1):
        g, d = "g%d" % i, ("g%d" % (i + 1) if i < k else "out")
        L += ["vccs      gm%d  %s gnd %s gnd" % (i, d, g),
              "resistor  rds%d %s gnd" % (i, d),
              "resistor  RD%d  %s gnd" % (i, d),
              "capacitor cgs%d %s gnd" % (i, g),
              "capacitor cgd%d %s %s" % (i, g, d),
              "capacitor cdb%d %s gnd" % (i, d),
              "value gm%d = %gm" % (i, 1 + 0.1 * i),
              "value rds%d = %gk" % (i, 40 + i),
              "value RD%d = %gk" % (i, 5 + 0.2 * i),
              "value cgs%d = %gf" % (i, 20 + i),
              "value cgd%d = %gf" % (i, 3 + 0.1 * i),
              "value cdb%d = %gf" % (i, 8 + 0.3 * i)]
    L += ["capacitor CL out gnd", "value CL = 50f",
          "transfer  H = v(out) / vin"]
    return L

def rc_ladder(k):
    L = ["# RC ladder of %d sections." % k, "vsource   vin  n0 gnd"]
    for i in range(1, k + 1):
        L += ["resistor  R%d n%d n%d" % (i, i - 1, i),
              "capacitor C%d n%d gnd" % (i, i),
              "value R%d = %gk" % (i, 1 + 0.01 * i),
              "value C%d = %gp" % (i, 1 + 0.02 * i)]
    L += ["transfer  H = v(n%d) / vin" % k]
    return L

def fet(L, name, d, g, s, gm, rds):
    """One transistor in small-signal form: gm, rds, cgs, cgd, cdb."""
    L += ["vccs      gm%s %s %s %s %s" % (name, d, s, g, s),
          "resistor  rds%s %s %s" % (name, d, s),
          "capacitor cgs%s %s %s" % (name, g, s),
          "capacitor cgd%s %s %s" % (name, g, d),
          "capacitor cdb%s %s gnd" % (name, d),
          "value gm%s = %s" % (name, gm), "value rds%s = %s" % (name, rds),
          "value cgs%s = 30f" % name, "value cgd%s = 4f" % name,
          "value cdb%s = 10f" % name]

def folded_cascode():
    # differential input pair M1/M2 (tail source ideal), folding nodes f1/f2,
    # cascodes M3/M4 (common gate), current-source loads M5/M6 (gates at ac
    # ground), cascoded mirror on the output side M7..M10, output out.
    L = ["# Folded-cascode OTA, 11 transistors, small-signal with full caps.",
         "vsource   vin  inp gnd", "vsource   vref inn gnd",
         "value vref = 0"]
    fet(L, "1", "f1", "inp", "tail", "1m", "100k")
    fet(L, "2", "f2", "inn", "tail", "1m", "100k")
    fet(L, "11", "tail", "b2", "gnd", "0.5m", "200k")
    fet(L, "5", "f1", "b2", "gnd", "1.2m", "60k")
    fet(L, "6", "f2", "b2", "gnd", "1.2m", "60k")
    fet(L, "3", "c1", "gnd", "f1", "1.5m", "80k")
    fet(L, "4", "out", "gnd", "f2", "1.5m", "80k")
    fet(L, "7", "c1", "b1", "m1", "1m", "90k")
    fet(L, "8", "out", "b1", "m2", "1m", "90k")
    fet(L, "9", "m1", "c1", "gnd", "0.8m", "70k")
    fet(L, "10", "m2", "c1", "gnd", "0.8m", "70k")
    L += ["resistor  Rb b1 gnd", "value Rb = 10k",
          "resistor  Rb2 b2 gnd", "value Rb2 = 10k",
          "capacitor CL out gnd", "value CL = 1p",
          "transfer  H = v(out) / vin"]
    return L

def miller_two_stage():
    # NMOS pair M1/M2 with PMOS mirror M3/M4, tail M5, second stage M6 with
    # current-source load M7, Miller capacitor Cc with nulling resistor Rz.
    L = ["# Two-stage Miller op-amp, 7 transistors, full caps.",
         "vsource   vin  inp gnd", "vsource   vref inn gnd",
         "value vref = 0"]
    fet(L, "1", "d1", "inp", "tail", "1m", "100k")
    fet(L, "2", "o1", "inn", "tail", "1m", "100k")
    fet(L, "3", "d1", "d1", "gnd", "0.6m", "120k")
    fet(L, "4", "o1", "d1", "gnd", "0.6m", "120k")
    fet(L, "5", "tail", "b1", "gnd", "0.5m", "200k")
    fet(L, "6", "out", "o1", "gnd", "4m", "40k")
    fet(L, "7", "out", "b1", "gnd", "1m", "60k")
    L += ["resistor  Rb b1 gnd", "value Rb = 10k",
          "capacitor Cc o1 x", "resistor Rz x out",
          "value Cc = 2p", "value Rz = 1k",
          "capacitor CL out gnd", "value CL = 5p",
          "transfer  H = v(out) / vin"]
    return L

def class_ab():
    # 24 transistors: a cascoded differential input stage (M1..M8), a
    # second gain stage (M9, M10), a translinear class-AB driver
    # (M11..M16), a push-pull output (M17, M18), and a bias network in
    # small-signal form (M19..M24, each a diode-connected or mirror device
    # whose gate node has its own capacitance to ground).
    L = ["# Two-stage op-amp with class-AB output and bias, 24 transistors.",
         "vsource   vin  inp gnd", "vsource   vref inn gnd",
         "value vref = 0"]
    fet(L, "1", "a1", "inp", "tail", "1m", "100k")
    fet(L, "2", "a2", "inn", "tail", "1m", "100k")
    fet(L, "3", "c1", "bc", "a1", "1.2m", "90k")
    fet(L, "4", "c2", "bc", "a2", "1.2m", "90k")
    fet(L, "5", "c1", "c1", "m1", "0.8m", "110k")
    fet(L, "6", "c2", "c1", "m2", "0.8m", "110k")
    fet(L, "7", "m1", "bm", "gnd", "0.7m", "130k")
    fet(L, "8", "m2", "bm", "gnd", "0.7m", "130k")
    fet(L, "9", "s2", "c2", "gnd", "3m", "50k")
    fet(L, "10", "s2", "bt", "gnd", "1m", "70k")
    fet(L, "11", "gp", "s2", "k1", "1.5m", "80k")
    fet(L, "12", "gn", "s2", "k2", "1.5m", "80k")
    fet(L, "13", "k1", "k1", "gnd", "1m", "90k")
    fet(L, "14", "k2", "k2", "gnd", "1m", "90k")
    fet(L, "15", "gp", "bt", "gnd", "0.6m", "150k")
    fet(L, "16", "gn", "bm", "gnd", "0.6m", "150k")
    fet(L, "17", "out", "gp", "gnd", "8m", "20k")
    fet(L, "18", "out", "gn", "gnd", "8m", "20k")
    fet(L, "19", "tail", "bt", "gnd", "0.5m", "200k")
    fet(L, "20", "bt", "bt", "gnd", "0.4m", "250k")
    fet(L, "21", "bm", "bm", "gnd", "0.4m", "250k")
    fet(L, "22", "bc", "bc", "bt", "0.4m", "250k")
    fet(L, "23", "bm", "bt", "gnd", "0.3m", "300k")
    fet(L, "24", "bc", "bm", "gnd", "0.3m", "300k")
    L += ["capacitor Cc1 s2 c2", "value Cc1 = 1p",
          "capacitor Cc2 out s2", "value Cc2 = 2p",
          "capacitor CL out gnd", "value CL = 10p",
          "resistor  RL out gnd", "value RL = 10k",
          "transfer  H = v(out) / vin"]
    return L

out = sys.argv[1] if len(sys.argv) > 1 else "."
cases = {"cs_chain_%d" % k: cs_chain(k) for k in (6, 8, 12, 20)}
cases["rc_ladder_50"] = rc_ladder(50)
cases["folded_cascode"] = folded_cascode()
cases["miller_two_stage"] = miller_two_stage()
cases["class_ab_24"] = class_ab()
for name, lines in cases.items():
    with open(os.path.join(out, name + ".gsc"), "w") as f:
        f.write("\n".join(lines) + "\n")
