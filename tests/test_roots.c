/* test_roots.c - tests of the polynomial root finder and pole helpers.
 * See LICENSE. */
#include <complex.h>
#include <float.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "gainsmith.h"
#include "numeric/roots.h"

#define PI_L 3.141592653589793238462643383279502884L
#define MAXN 64

typedef long double complex ldc;

static ldc mk(long double re, long double im)
{
    ldc z = re;
    ((long double *)&z)[1] = im;
    return z;
}

/* Real coefficients of prod (s - r_k); the r_k must be closed under
   conjugation. */
static void from_roots(long double *a, const ldc *r, int n)
{
    ldc c[MAXN + 1];
    c[0] = 1;
    for (int m = 0; m < n; m++) {
        c[m + 1] = 0;
        for (int k = m + 1; k > 0; k--)
            c[k] = c[k - 1] - r[m] * c[k];
        c[0] = -r[m] * c[0];
    }
    for (int k = 0; k <= n; k++)
        a[k] = creall(c[k]);
}

/* Relative distance from want[i] to the nearest root in got[] */
static long double nearest(const ldc *got, int n, ldc want)
{
    long double best = INFINITY;
    for (int i = 0; i < n; i++) {
        long double d = cabsl(got[i] - want);
        if (d < best)
            best = d;
    }
    return cabsl(want) > 0 ? best / cabsl(want) : best;
}

/* Largest relative error over want[], each matched to its nearest root */
static long double worst_match(const ldc *got, int ngot, const ldc *want,
                               int n)
{
    long double w = 0;
    for (int i = 0; i < n; i++) {
        long double d = nearest(got, ngot, want[i]);
        if (d > w)
            w = d;
    }
    return w;
}

/* Normalised Butterworth polynomial coefficients by the recurrence
   c_k = c_{k-1} cos((k-1) g) / sin(k g), g = pi/(2n), c_0 = 1 (A. B.
   Williams & F. J. Taylor, "Electronic Filter Design Handbook", ch. 2,
   from memory); the poles are s_k = exp(j pi (2k+n-1)/(2n)), k = 1..n
   (same handbook; any filter text). */
static void test_butterworth(void)
{
    for (int n = 1; n <= 8; n++) {
        long double a[MAXN + 1], g = PI_L / (2 * n);
        ldc r[MAXN], want[MAXN];
        gs_roots_info info;
        a[0] = 1;
        for (int k = 1; k <= n; k++)
            a[k] = a[k - 1] * cosl((k - 1) * g) / sinl(k * g);
        int rc = gs_roots(r, NULL, a, n, &info);
        CHECK_MSG(rc == GS_OK && info.nroots == n, "order %d rc %d", n, rc);
        for (int k = 1; k <= n; k++) {
            long double th = PI_L * (2 * k + n - 1) / (2 * n);
            want[k - 1] = mk(cosl(th), sinl(th));
            if (2 * k + n - 1 == 2 * n)     /* the real pole at -1 */
                want[k - 1] = -1;
        }
        long double err = worst_match(r, n, want, n);
        CHECK_MSG(err < 1e-17L, "order %d: worst relative error %Lg", n, err);
        for (int k = 0; k < n; k++)
            CHECK_MSG(fabsl(cabsl(r[k]) - 1) < 1e-17L,
                      "order %d: |s| = %.21Lg", n, cabsl(r[k]));
        CHECK(info.max_residual < 1e-18L);
    }
}

/* Real root of s^3 + b s^2 + c s + d with one real root, by Cardano's
   formula (any algebra text). */
static long double cardano_real(long double b, long double c, long double d)
{
    long double p = c - b * b / 3;
    long double q = 2 * b * b * b / 27 - b * c / 3 + d;
    long double disc = sqrtl(q * q / 4 + p * p * p / 27);
    return cbrtl(-q / 2 + disc) + cbrtl(-q / 2 - disc) - b / 3;
}

/* Bessel (Thomson) polynomial of order 3, s^3 + 6 s^2 + 15 s + 15; roots
   -2.3222 and -1.8389 +- 1.7544j from the usual filter tables (values
   from memory), and the real one by Cardano. */
static void test_bessel3(void)
{
    const long double a[4] = {15, 15, 6, 1};
    ldc r[3], want[3] = {-2.3222L, mk(-1.8389L, 1.7544L),
                         mk(-1.8389L, -1.7544L)};
    long double res[3];
    int rc = gs_roots(r, res, a, 3, NULL);
    CHECK(rc == GS_OK);
    CHECK(worst_match(r, 3, want, 3) < 1e-4L);
    long double x = cardano_real(6, 15, 15);
    CHECK_MSG(nearest(r, 3, x) < 1e-17L, "Cardano %.20Lg", x);
    /* sorted by magnitude: the pair (|.| = 2.5416) before -2.3222? no:
       2.3222 < 2.5416, so the real root comes first, then +j, then -j */
    CHECK(cimagl(r[0]) == 0 && creall(r[0]) < 0);
    CHECK(cimagl(r[1]) > 0 && r[2] == conjl(r[1]));
    for (int i = 0; i < 3; i++)
        CHECK(res[i] < 1e-18L);
}

/* Chebyshev type I, 0.5 dB ripple, order 3: s^3 + 1.2529 s^2 + 1.5349 s +
   0.7157 (handbook coefficient table, from memory), and its poles from
   the closed form s_k = -sinh(v) sin(t_k) + j cosh(v) cos(t_k), t_k =
   (2k-1) pi/(2n), v = asinh(1/e)/n, e = sqrt(10^(0.5/10) - 1) (same). */
static void test_chebyshev3(void)
{
    const long double a[4] = {0.7157L, 1.5349L, 1.2529L, 1};
    long double e = sqrtl(powl(10, 0.05L) - 1), v = asinhl(1 / e) / 3;
    ldc r[3], want[3];
    for (int k = 1; k <= 3; k++) {
        long double t = (2 * k - 1) * PI_L / 6;
        want[k - 1] = mk(-sinhl(v) * sinl(t), coshl(v) * cosl(t));
    }
    want[1] = creall(want[1]);      /* cos(pi/2): exactly real */
    CHECK(gs_roots(r, NULL, a, 3, NULL) == GS_OK);
    long double err = worst_match(r, 3, want, 3);
    CHECK_MSG(err < 2e-4L, "error %Lg", err);
}

/* prod_{k=-3}^{10} (s + 10^k): fourteen real roots over 13 decades. */
static void test_decades_real(void)
{
    ldc want[14], r[14];
    long double a[15], res[14];
    gs_roots_info info;
    for (int k = -3; k <= 10; k++)
        want[k + 3] = -powl(10, k);
    from_roots(a, want, 14);
    CHECK(gs_roots(r, res, a, 14, &info) == GS_OK);
    for (int i = 0; i < 14; i++) {
        long double e = cabsl(r[i] - want[i]) / cabsl(want[i]);
        CHECK_MSG(e < 1e-16L, "root %d: %Lg vs %Lg, rel err %Lg", i,
                  creall(r[i]), creall(want[i]), e);
        CHECK(cimagl(r[i]) == 0);
    }
    CHECK(info.max_residual < 1e-18L);
}

/* Complex pairs w^2 (s^2 + s/Q_k w... ): poles at w_k exp(+-j 3pi/4) for
   w_k = 10^k, k = -3..9: conjugate pairs over 12 decades. */
static void test_decades_complex(void)
{
    ldc want[26], r[26];
    long double a[27];
    int n = 0;
    for (int k = -3; k <= 9; k++) {
        long double w = powl(10, k);
        want[n++] = mk(-w * sqrtl(0.5L), w * sqrtl(0.5L));
        want[n++] = mk(-w * sqrtl(0.5L), -w * sqrtl(0.5L));
    }
    from_roots(a, want, n);
    CHECK(gs_roots(r, NULL, a, n, NULL) == GS_OK);
    long double err = worst_match(r, n, want, n);
    CHECK_MSG(err < 1e-15L, "worst relative error %Lg", err);
    for (int i = 0; i + 1 < n; i += 2)
        CHECK(r[i + 1] == conjl(r[i]) && cimagl(r[i]) > 0);
}

/* Wilkinson's polynomial prod_{k=1}^{20} (s - k) (J. H. Wilkinson,
   "Rounding Errors in Algebraic Processes", 1963): its coefficients are
   integers below 2^64, exact in an x87 long double, and double-word
   polishing then gives every root to 1e-16 or better. */
static void test_wilkinson(void)
{
    ldc want[20], r[20];
    long double a[21];
    int mult[20];
    for (int k = 1; k <= 20; k++)
        want[k - 1] = k;
    from_roots(a, want, 20);
    CHECK(a[0] == 2432902008176640000.0L);  /* 20! */
    CHECK(a[19] == -210);
    int rc = gs_roots(r, NULL, a, 20, NULL);
    CHECK(rc == GS_OK);
    long double tol = LDBL_MANT_DIG >= 64 ? 1e-16L : 1e-6L;
    for (int k = 0; k < 20; k++) {
        long double e = fabsl(creall(r[k]) - (k + 1)) / (k + 1);
        CHECK_MSG(e < tol && cimagl(r[k]) == 0, "root %d: %.20Lg %Lg", k + 1,
                  creall(r[k]), cimagl(r[k]));
    }
    CHECK(gs_roots_mult(mult, NULL, r, 20, a, 20) == GS_OK);
    for (int k = 0; k < 20; k++)
        CHECK(mult[k] == 1);
}

/* Double and triple roots: a root of multiplicity m moves by about
   eps^(1/m) under rounding of the coefficients (Wilkinson 1963), so an
   m-fold root is only asked to eps^(1/m) times a margin, and the cluster
   must be reported with multiplicity m. */
static void test_clusters(void)
{
    /* (s + 0.1)^2 (s + 3): 0.1 is not exact, so the double root splits */
    ldc want[3] = {-0.1L, -0.1L, -3}, r[6];
    long double a[7], rel[6];
    int mult[6];
    from_roots(a, want, 3);
    CHECK(gs_roots(r, NULL, a, 3, NULL) == GS_OK);
    CHECK(gs_roots_mult(mult, rel, r, 3, a, 3) == GS_OK);
    CHECK(mult[0] == 2 && mult[1] == 2 && mult[2] == 1);
    for (int i = 0; i < 2; i++)
        CHECK_MSG(cabsl(r[i] + 0.1L) / 0.1L < 1e-8L, "%Lg%+Lgj",
                  creall(r[i]), cimagl(r[i]));
    CHECK(rel[0] < 1e-7L && rel[2] < 1e-17L);
    /* (s + 1)^3 (s + 2)(s^2 + 1) */
    ldc w3[6] = {-1, -1, -1, -2, mk(0, 1), mk(0, -1)};
    from_roots(a, w3, 6);
    CHECK(gs_roots(r, NULL, a, 6, NULL) == GS_OK);
    CHECK(gs_roots_mult(mult, rel, r, 6, a, 6) == GS_OK);
    int triple = 0;
    for (int i = 0; i < 6; i++) {
        if (cabsl(r[i] + 1) < 1e-5L) {  /* eps^(1/3) = 5e-7, margin 20 */
            triple++;
            CHECK(mult[i] == 3);
        } else {
            CHECK(mult[i] == 1);
        }
    }
    CHECK(triple == 3);
    CHECK(worst_match(r, 6, w3 + 3, 3) < 1e-17L);
    /* close but distinct: (s + 1)(s + 1.001) stay simple */
    ldc w2[2] = {-1, -1.001L};
    from_roots(a, w2, 2);
    CHECK(gs_roots(r, NULL, a, 2, NULL) == GS_OK);
    CHECK(gs_roots_mult(mult, NULL, r, 2, a, 2) == GS_OK);
    CHECK(mult[0] == 1 && mult[1] == 1);
    CHECK(worst_match(r, 2, w2, 2) < 1e-15L);
}

/* Trailing zeros give exact zero roots; leading zeros are dropped. */
static void test_zero_and_trim(void)
{
    const long double a[6] = {0, 0, 2, 1, 0, 0};   /* s^2 (s + 2) */
    ldc r[5];
    int mult[3];
    gs_roots_info info;
    CHECK(gs_roots(r, NULL, a, 5, &info) == GS_OK);
    CHECK(info.nroots == 3 && info.nzero == 2);
    CHECK(r[0] == 0 && r[1] == 0 && r[2] == -2);
    CHECK(gs_roots_mult(mult, NULL, r, 3, a, 5) == GS_OK);
    CHECK(mult[0] == 2 && mult[1] == 2 && mult[2] == 1);
    const long double c[2] = {3, 0};                /* constant */
    CHECK(gs_roots(r, NULL, c, 1, &info) == GS_OK && info.nroots == 0);
    const long double z[3] = {0, 0, 0};
    CHECK(gs_roots(r, NULL, z, 2, &info) == GS_EINVAL);
    const long double bad[2] = {1, NAN};
    CHECK(gs_roots(r, NULL, bad, 1, &info) == GS_EINVAL);
    CHECK(gs_roots(r, NULL, c, -1, &info) == GS_EINVAL);
    const long double lin[2] = {-6, 4};             /* 4 s - 6 */
    CHECK(gs_roots(r, NULL, lin, 1, &info) == GS_OK && r[0] == 1.5L);
}

/* Eigenvalues of the n x n tridiagonal matrix with 2 on the diagonal but
   1 in the last place and -1 beside it are 2 - 2 cos((2k-1) pi/(2n+1)),
   k = 1..n (W.-C. Yueh, "Eigenvalues of several tridiagonal matrices",
   Appl. Math. E-Notes 5 (2005), from memory).  That matrix is the nodal
   matrix of a uniform RC ladder driven at one end and open at the other,
   so the ladder's poles are -lambda_k/(RC).  The denominator is built by
   the continuant recurrence from the open end; its s coefficient is the
   Elmore delay RC n(n+1)/2 (W. C. Elmore, J. Appl. Phys. 19 (1948)). */
static void test_rc_ladder(void)
{
    for (int n = 1; n <= 12; n++) {
        long double v[MAXN + 1] = {1}, i[MAXN + 1] = {0}, rc = 0x1p-20L;
        ldc r[MAXN], want[MAXN];
        /* node voltage V and branch current I, as polynomials in s */
        for (int sec = 0; sec < n; sec++) {
            for (int k = n; k > 0; k--)         /* I += s C V */
                i[k] += rc * v[k - 1];          /* R = 1: C = rc */
            for (int k = 0; k <= n; k++)        /* V += R I */
                v[k] += i[k];
        }
        CHECK(v[0] == 1);
        CHECK(fabsl(v[1] - rc * n * (n + 1) / 2) < 1e-15L * v[1]);
        for (int k = 1; k <= n; k++)
            want[k - 1] = -(2 - 2 * cosl((2 * k - 1) * PI_L / (2 * n + 1)))
                          / rc;
        CHECK(gs_roots(r, NULL, v, n, NULL) == GS_OK);
        long double err = worst_match(r, n, want, n);
        CHECK_MSG(err < 1e-15L, "n = %d: worst relative error %Lg", n, err);
    }
}

static uint64_t next_rand(uint64_t *s)     /* splitmix64 */
{
    uint64_t z = (*s += 0x9E3779B97F4A7C15ULL);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
}

static long double uniform(uint64_t *s)
{
    return (long double)(next_rand(s) >> 11) / 9007199254740992.0L;
}

/* Random roots, real and complex, moduli 1e-6 .. 1e6: the backward error
   (residual) of every computed root must be at rounding level, and roots
   that are well separated from the others must be found to 1e-14. */
static void test_random(void)
{
    uint64_t seed = 20261201;
    for (int trial = 0; trial < 200; trial++) {
        uint64_t s = seed + (uint64_t)trial;
        int n = 1 + (int)(next_rand(&s) % 24);
        ldc want[MAXN], r[MAXN];
        long double a[MAXN + 1];
        gs_roots_info info;
        int k = 0;
        while (k < n) {
            long double m = powl(10, -6 + 12 * uniform(&s));
            long double th = PI_L * (0.5L + uniform(&s));
            if (k + 1 < n && uniform(&s) < 0.5L) {
                want[k++] = mk(m * cosl(th), m * sinl(th));
                want[k] = conjl(want[k - 1]);
                k++;
            } else {
                want[k++] = -m;
            }
        }
        from_roots(a, want, n);
        int rc = gs_roots(r, NULL, a, n, &info);
        CHECK_MSG(rc == GS_OK && info.max_residual < 64 * LDBL_EPSILON,
                  "seed %llu trial %d n %d: rc %d residual %Lg",
                  (unsigned long long)seed, trial, n, rc, info.max_residual);
        for (int i = 0; i < n; i++) {
            long double gap = INFINITY;
            for (int j = 0; j < n; j++)
                if (j != i && cabsl(want[j] - want[i]) < gap)
                    gap = cabsl(want[j] - want[i]);
            if (gap < 0.1L * cabsl(want[i]))
                continue;
            long double e = nearest(r, n, want[i]);
            CHECK_MSG(e < 1e-14L, "seed %llu trial %d root %d: err %Lg",
                      (unsigned long long)seed, trial, i, e);
        }
    }
}

/* Series RLC, output across C: H = 1/(LC s^2 + RC s + 1), w0 = 1/sqrt(LC),
   Q = (1/R) sqrt(L/C) (any circuits text, e.g. Nilsson & Riedel,
   "Electric Circuits", ch. 8). */
static void test_rlc_describe(void)
{
    long double R = 10, L = 1e-3L, C = 1e-6L;
    const long double num[1] = {1}, den[3] = {1, R * C, L * C};
    gs_tfn h;
    gs_pz_info pi;
    CHECK(gs_tfn_init(&h, num, 0, den, 2) == GS_OK);
    CHECK(h.npoles == 2 && h.nzeros == 0);
    gs_pz_describe(&pi, h.poles[0]);
    CHECK(pi.kind == GS_PZ_COMPLEX && !pi.rhp);
    CHECK(fabsl(pi.w0 * sqrtl(L * C) - 1) < 1e-17L);
    CHECK(fabsl(pi.q / (sqrtl(L / C) / R) - 1) < 1e-16L);
    CHECK(fabsl(pi.zeta * 2 * pi.q - 1) < 1e-16L);
    CHECK(fabsl(pi.f0 * 2 * PI_L - pi.w0) < 1e-17L * pi.w0);
    CHECK(gs_tfn_stability(&h) == GS_STABLE);
    CHECK(gs_tfn_dc_gain(&h) == 1);
    gs_pz_describe(&pi, -5);
    CHECK(pi.kind == GS_PZ_REAL && isnan(pi.q) && pi.w0 == 5);
    gs_pz_describe(&pi, 0);
    CHECK(pi.kind == GS_PZ_ORIGIN);
    gs_pz_describe(&pi, mk(0, 2));
    CHECK(isinf(pi.q) && pi.zeta == 0);
    gs_tfn_clear(&h);
}

static int stability_of(const long double *den, int deg)
{
    const long double one = 1;
    gs_tfn h;
    int v = -1;
    if (gs_tfn_init(&h, &one, 0, den, deg) == GS_OK)
        v = gs_tfn_stability(&h);
    gs_tfn_clear(&h);
    return v;
}

/* Stability from pole positions: Re p < 0 stable; simple poles on the
   imaginary axis marginal; right half plane or repeated axis poles
   unstable (BIBO stability, e.g. Ogata, "Modern Control Engineering",
   ch. 5). */
static void test_stability(void)
{
    const long double st[3] = {2, 3, 1};        /* (s+1)(s+2) */
    const long double osc[3] = {1, 0, 1};       /* s^2 + 1 */
    const long double un[3] = {-1, 0, 1};       /* (s-1)(s+1) */
    const long double integ[3] = {0, 1, 1};     /* s (s+1) */
    const long double dbl[4] = {0, 0, 1, 1};    /* s^2 (s+1) */
    const long double dosc[5] = {1, 0, 2, 0, 1};    /* (s^2+1)^2 */
    CHECK(stability_of(st, 2) == GS_STABLE);
    CHECK(stability_of(osc, 2) == GS_MARGINAL);
    CHECK(stability_of(un, 2) == GS_UNSTABLE);
    CHECK(stability_of(integ, 2) == GS_MARGINAL);
    CHECK(stability_of(dbl, 3) == GS_UNSTABLE);
    CHECK(stability_of(dosc, 4) == GS_UNSTABLE);
}

/* A zero 1e-7 away from a pole is a near cancellation; others are not. */
static void test_cancellation(void)
{
    const long double num[2] = {1.0000001L, 1};         /* s + 1.0000001 */
    const long double den[3] = {10, 11, 1};             /* (s+1)(s+10) */
    gs_tfn h;
    gs_pz_pair p[2];
    CHECK(gs_tfn_init(&h, num, 1, den, 2) == GS_OK);
    CHECK(gs_pz_cancellations(p, 2, &h, 1e-6L) == 1);
    CHECK(p[0].pole == 0 && p[0].zero == 0);
    CHECK(fabsl(p[0].rel_dist / 1e-7L - 1) < 1e-6L);
    CHECK(gs_pz_cancellations(NULL, 0, &h, 1e-8L) == 0);
    gs_tfn_clear(&h);
}

/* Common powers of s cancel exactly; H(0) and the asymptote. */
static void test_tfn_origin(void)
{
    const long double num[3] = {0, -2, 0};      /* -2 s */
    const long double den[4] = {0, 0, 4, 1};    /* s^2 (s + 4) */
    const long double zero[2] = {0, 0};
    gs_tfn h;
    CHECK(gs_tfn_init(&h, num, 2, den, 3) == GS_OK);
    CHECK(h.num_deg == 0 && h.den_deg == 2 && h.origin == -1);
    CHECK(h.lf_gain == -0.5L && gs_tfn_dc_gain(&h) == -INFINITY);
    CHECK(h.npoles == 2 && h.poles[0] == 0 && h.poles[1] == -4);
    CHECK(cabsl(gs_tfn_eval(&h, 1) - (-2.0L / 5)) < 1e-18L);
    gs_tfn_clear(&h);
    CHECK(gs_tfn_init(&h, zero, 1, den, 3) == GS_OK);
    CHECK(h.num_deg == -1 && h.nzeros == 0 && gs_tfn_dc_gain(&h) == 0);
    gs_tfn_clear(&h);
    CHECK(gs_tfn_init(&h, num, 2, zero, 1) == GS_EINVAL);
    gs_tfn_clear(&h);
}

int main(void)
{
    test_butterworth();
    test_bessel3();
    test_chebyshev3();
    test_decades_real();
    test_decades_complex();
    test_wilkinson();
    test_clusters();
    test_zero_and_trim();
    test_rc_ladder();
    test_random();
    test_rlc_describe();
    test_stability();
    test_cancellation();
    test_tfn_origin();
    return check_report("roots");
}
