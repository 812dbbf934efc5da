#!/usr/bin/env python3
# fateman_sympy.py - Fateman's sparse multiplication benchmark in sympy.
# See LICENSE.
#
# The same product as bench_fateman.c, f = (1 + x + y + z + t)^20 and
# p = f (f + 1) (R. Fateman, SIGSAM Bulletin 37(1), 2003), with sympy's
# sparse polynomial ring over ZZ, for comparison.  Prints
# "bench fateman-sympy terms=N seconds=S" (S for the product alone, one
# run: it takes about a minute); exit status 1 if N is not 135751.
import sys
import time

from sympy.polys.domains import ZZ
from sympy.polys.rings import ring


def main():
    _, x, y, z, t = ring("x,y,z,t", ZZ)
    f = (1 + x + y + z + t) ** 20
    g = f + 1
    t0 = time.perf_counter()
    p = f * g
    seconds = time.perf_counter() - t0
    print("bench fateman-sympy terms=%d seconds=%.3f" % (len(p), seconds))
    return 0 if len(p) == 135751 else 1


if __name__ == "__main__":
    sys.exit(main())
