#!/usr/bin/env python3
# gcd_sympy.py - the gcd benchmark of bench_gcd.c, computed by sympy.
# See LICENSE.
#
# usage: gcd_sympy.py [BUILD | INPUTS]
# Runs BUILD/bench/bench_gcd --dump (BUILD defaults to "build") to get
# the very inputs that bench_gcd timed, or reads an INPUTS file written
# that way, and computes each gcd with sympy's sparse polynomial ring over
# ZZ.  Prints "bench gcd-NAME-sympy terms_gcd=G seconds=S check=C", S the
# median of up to 3 timings (one when the first takes over 2 s), C "ok"
# when sympy's gcd equals bench_gcd's up to sign, else "MISMATCH"; the
# exit status is 1 on any mismatch.  A case still running after
# GS_BENCH_SYMPY_LIMIT seconds (default 60) is abandoned and reported as
# "seconds=LIMIT status=timeout", a lower bound.
import os
import signal
import subprocess
import sys
import tempfile
import time

from sympy.polys.domains import ZZ
from sympy.polys.rings import ring


def read_cases(path):
    """Yield (name, nvars, {tag: [(coeff, exps)]}) from a dump file."""
    with open(path) as f:
        lines = iter(f.read().splitlines())
    for line in lines:
        word, name, nvars = line.split()
        assert word == "case"
        polys = {}
        for _ in range(3):
            tag, n = next(lines).split()
            terms = []
            for _ in range(int(n)):
                fields = next(lines).split()
                terms.append((int(fields[0]), tuple(map(int, fields[1:]))))
            polys[tag] = terms
        yield name, int(nvars), polys


class Timeout(Exception):
    pass


def on_alarm(signum, frame):
    raise Timeout()


def timed_gcd(a, b):
    times = []
    g = None
    for _ in range(3):
        t0 = time.perf_counter()
        g = a.gcd(b)
        times.append(time.perf_counter() - t0)
        if times[0] > 2.0:
            break
    times.sort()
    return g, times[len(times) // 2]


def main():
    arg = sys.argv[1] if len(sys.argv) > 1 else "build"
    tmp = None
    if os.path.isdir(arg):
        fd, tmp = tempfile.mkstemp(suffix=".txt")
        os.close(fd)
        subprocess.run([os.path.join(arg, "bench", "bench_gcd"), "--dump",
                        tmp], check=True, stdout=subprocess.DEVNULL)
        path = tmp
    else:
        path = arg
    limit = int(os.environ.get("GS_BENCH_SYMPY_LIMIT", "60"))
    signal.signal(signal.SIGALRM, on_alarm)
    status = 0
    try:
        for name, nvars, polys in read_cases(path):
            R = ring(",".join("x%d" % i for i in range(nvars)), ZZ)[0]
            a, b, ours = (R.from_dict({e: c for c, e in polys[t]})
                          for t in ("a", "b", "g"))
            signal.alarm(limit)
            try:
                g, seconds = timed_gcd(a, b)
            except Timeout:
                print("bench gcd-%s-sympy seconds=%d status=timeout"
                      % (name, limit))
                sys.stdout.flush()
                continue
            finally:
                signal.alarm(0)
            ok = g == ours or g == -ours
            status |= not ok
            print("bench gcd-%s-sympy terms_gcd=%d seconds=%.6f check=%s"
                  % (name, len(g), seconds, "ok" if ok else "MISMATCH"))
            sys.stdout.flush()
    finally:
        if tmp is not None:
            os.unlink(tmp)
    return status


if __name__ == "__main__":
    sys.exit(main())
