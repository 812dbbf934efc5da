/* spectrum.c - noise densities and their integrals over frequency.
 * See LICENSE.
 */
#include "numeric/spectrum.h"

#include <complex.h>
#include <math.h>

typedef long double complex cplx;

static cplx horner(const long double *c, int deg, cplx s)
{
    cplx acc = 0;
    int k;
    for (k = deg; k >= 0; k--)
        acc = acc * s + c[k];
    return acc;
}

long double gs_spectrum_gain2(const long double *num, int dn,
                              const long double *den, int dd,
                              long double f)
{
    cplx s = 2 * acosl(-1) * f * I;
    cplx n = horner(num, dn, s), d = horner(den, dd, s);
    long double an = cabsl(n), ad = cabsl(d);
    if (dn < 0)
        return 0;
    return (an / ad) * (an / ad);
}

long double gs_spectrum_term(const gs_noise_term *t, long double f)
{
    long double s = t->white + (t->flicker != 0 ? t->flicker / f : 0);
    if (s == 0)
        return 0;
    return s * gs_spectrum_gain2(t->num, t->dn, t->den, t->dd, f);
}

/* 8-point Gauss-Legendre nodes and weights on [-1, 1] (Abramowitz and
   Stegun 25.4.30, table 25.4). */
static const long double gl_x[4] = {
    0.183434642495649804939476142360184L,
    0.525532409916328985817739049189254L,
    0.796666477413626739591553936475831L,
    0.960289856497536231683560868569473L
};
static const long double gl_w[4] = {
    0.362683783378361982965150449277196L,
    0.313706645877887287337962201986601L,
    0.222381034453374470544355994426241L,
    0.101228536290376259152531354309962L
};

/* The integral over u in [a, b] of fn(e^u) e^u du (that is, over f). */
static long double gl8(gs_spectrum_fn fn, const void *arg, long double a,
                       long double b)
{
    long double m = (a + b) / 2, h = (b - a) / 2, acc = 0, f;
    int i;
    for (i = 0; i < 4; i++) {
        f = expl(m - h * gl_x[i]);
        acc += gl_w[i] * fn(arg, f) * f;
        f = expl(m + h * gl_x[i]);
        acc += gl_w[i] * fn(arg, f) * f;
    }
    return acc * h;
}

static long double adapt(gs_spectrum_fn fn, const void *arg, long double a,
                         long double b, long double whole, long double rel,
                         int depth)
{
    long double m = (a + b) / 2;
    long double l = gl8(fn, arg, a, m), r = gl8(fn, arg, m, b);
    if (depth >= 12 || fabsl(l + r - whole) <= rel * fabsl(l + r))
        return l + r;
    return adapt(fn, arg, a, m, l, rel, depth + 1)
         + adapt(fn, arg, m, b, r, rel, depth + 1);
}

long double gs_spectrum_integrate(gs_spectrum_fn fn, const void *arg,
                                  long double f1, long double f2,
                                  long double rel)
{
    long double u1 = logl(f1), u2 = logl(f2), acc = 0, a, b, step;
    long pieces, i;
    if (!(f1 > 0 && f2 > f1))
        return 0;
    step = logl(10) / 8;
    pieces = (long)ceill((u2 - u1) / step);
    if (pieces < 1)
        pieces = 1;
    step = (u2 - u1) / (long double)pieces;
    for (i = 0; i < pieces; i++) {
        a = u1 + step * (long double)i;
        b = i + 1 == pieces ? u2 : a + step;
        acc += adapt(fn, arg, a, b, gl8(fn, arg, a, b), rel, 0);
    }
    return acc;
}
