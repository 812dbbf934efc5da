/* roots.c - polynomial roots by the Aberth-Ehrlich iteration. See LICENSE.
 *
 * Method (docs/analysis.md has the long form):
 *  1. Leading zero coefficients are dropped; trailing ones give exact zero
 *     roots and are divided out.
 *  2. s = 2^e z with e from the geometric mean of the root moduli, and the
 *     coefficients are scaled by a power of two: both exact.
 *  3. Initial approximations lie on circles whose radii come from the upper
 *     convex hull of (k, log|a_k|), the Newton polygon (D. A. Bini,
 *     "Numerical computation of polynomial zeros by means of Aberth's
 *     method", Numer. Algorithms 13 (1996) 179-200).  That is what lets
 *     one polynomial hold roots 12 or more decades apart.
 *  4. Aberth-Ehrlich sweeps (O. Aberth, Math. Comp. 27 (1973) 339-344),
 *     Gauss-Seidel style; a root stops moving once |p(z)| is below the
 *     rounding-error bound of Horner's rule (Bini 1996, sec. 4).
 *  5. Polishing: Newton-Aberth corrections on the original coefficients
 *     with p and p' evaluated in double-word arithmetic (T. J. Dekker,
 *     "A floating-point technique for extending the available precision",
 *     Numer. Math. 18 (1971) 224-242), kept only while |p| decreases.
 *  6. Real-axis and conjugate symmetry of a real polynomial is restored
 *     exactly, then the roots are sorted.
 */
#include "numeric/roots.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"

typedef long double complex ldc;

#define MAX_SWEEPS 1000         /* Aberth sweeps before giving up */
#define MAX_POLISH 60           /* polishing passes over all roots */
#define UNIT_ROUNDOFF (LDBL_EPSILON / 2)
#define COEF_ULPS 8             /* assumed coefficient uncertainty, ulps */
#define STALL 1e-12L            /* relative size of a stalled correction */
#define PI_L 3.141592653589793238462643383279502884L
/* Dekker's splitting constant 2^ceil(p/2) + 1 */
#define SPLITTER (1.0L + (long double)(1ULL << ((LDBL_MANT_DIG + 1) / 2)))

static ldc cmul(ldc a, ldc b)
{
    long double ar = creall(a), ai = cimagl(a);
    long double br = creall(b), bi = cimagl(b);
    return gs_cmplxl(ar * br - ai * bi, ar * bi + ai * br);
}

static ldc cinv(ldc a)      /* 1/a, a != 0, |a| far from over/underflow */
{
    long double ar = creall(a), ai = cimagl(a), m = ar * ar + ai * ai;
    return gs_cmplxl(ar / m, -ai / m);
}

ldc gs_roots_horner(const long double *a, int degree, ldc z)
{
    ldc v = 0;
    for (int k = degree; k >= 0; k--)
        v = cmul(v, z) + a[k];
    return v;
}

/* p(z) and p'(z) by Horner's rule */
static void horner2(ldc *p, ldc *dp, const long double *a, int n, ldc z)
{
    ldc v = a[n], d = 0;
    for (int k = n - 1; k >= 0; k--) {
        d = cmul(d, z) + v;
        v = cmul(v, z) + a[k];
    }
    *p = v;
    *dp = d;
}

/* r(y) = y^n p(1/y) and r'(y): the reversed polynomial */
static void horner2_rev(ldc *p, ldc *dp, const long double *a, int n, ldc y)
{
    ldc v = a[0], d = 0;
    for (int k = 1; k <= n; k++) {
        d = cmul(d, y) + v;
        v = cmul(v, y) + a[k];
    }
    *p = v;
    *dp = d;
}

/* Rounding-error bound of complex Horner, sum |a_k| (4k+1) x^k, without
   the unit roundoff (Bini 1996, eq. 14); rev: for the reversed order. */
static long double err_weight(const long double *a, int n, long double x,
                              int rev)
{
    long double s = 0;
    for (int k = n; k >= 0; k--)
        s = s * x + fabsl(a[rev ? n - k : k]) * (4 * k + 1);
    return s;
}

/* Newton correction p(z)/p'(z).  *small is set when |p(z)| is at the level
   of its own rounding error, so the iteration can do no better.  For
   |z| > 1 the reversed polynomial is used so nothing overflows. */
static ldc newton_ratio(const long double *a, int n, ldc z, int *small)
{
    long double az = cabsl(z);
    ldc p, dp;

    if (az <= 1) {
        horner2(&p, &dp, a, n, z);
        *small = cabsl(p) <= UNIT_ROUNDOFF * err_weight(a, n, az, 0);
        if (p == 0)
            return 0;
        return p / dp;
    }
    ldc y = cinv(z);
    horner2_rev(&p, &dp, a, n, y);
    *small = cabsl(p) <= UNIT_ROUNDOFF * err_weight(a, n, 1 / az, 1);
    if (p == 0)
        return 0;
    return z / ((long double)n - cmul(y, dp) / p);
}

/* Aberth's correction N / (1 - N sum_{j != i} 1/(z_i - z_j)) */
static ldc aberth_step(ldc ratio, const ldc *z, int n, int i)
{
    ldc s = 0;
    for (int j = 0; j < n; j++) {
        ldc d = z[i] - z[j];
        if (j != i && d != 0)
            s += cinv(d);
    }
    return ratio / (1 - cmul(ratio, s));
}

/* Upper convex hull of (k, lg[k]) over the k with finite lg[k], by the
   monotone chain; returns the number of vertices written to hull. */
static int newton_polygon(int *hull, const long double *lg, int n)
{
    int h = 0;
    for (int k = 0; k <= n; k++) {
        if (!isfinite(lg[k]))
            continue;
        while (h >= 2) {
            int a = hull[h - 2], b = hull[h - 1];
            long double cross = (long double)(b - a) * (lg[k] - lg[a])
                                - (long double)(k - a) * (lg[b] - lg[a]);
            if (cross < 0)
                break;
            h--;            /* b is on or below the chord from a to k */
        }
        hull[h++] = k;
    }
    return h;
}

/* Bini's initial approximations: for the hull edge from k0 to k1, k1 - k0
   points on the circle of radius (|b_k0|/|b_k1|)^(1/(k1-k0)), rotated by
   2 pi e/n + 0.7 for edge e (Bini 1996, sec. 3). */
static void initial_guesses(ldc *z, const long double *b, int n)
{
    long double *lg = gs_malloc((size_t)(n + 1) * sizeof *lg);
    int *hull = gs_malloc((size_t)(n + 1) * sizeof *hull);
    int idx = 0;

    for (int k = 0; k <= n; k++)
        lg[k] = b[k] != 0 ? logl(fabsl(b[k])) : -INFINITY;
    int h = newton_polygon(hull, lg, n);
    for (int e = 0; e + 1 < h; e++) {
        int k0 = hull[e], m = hull[e + 1] - k0;
        long double u = expl((lg[k0] - lg[k0 + m]) / m);
        for (int j = 0; j < m; j++) {
            long double ang = 2 * PI_L * j / m + 2 * PI_L * e / n + 0.7L;
            z[idx++] = gs_cmplxl(u * cosl(ang), u * sinl(ang));
        }
    }
    gs_free(hull);
    gs_free(lg);
}

/* Run Aberth sweeps on b[0..n] (b[0], b[n] nonzero).  Returns the number
   of sweeps, or -1 if some root never met the stopping rule. */
static int aberth(ldc *z, const long double *b, int n)
{
    char *done = gs_calloc((size_t)n, 1);
    long double *last = gs_malloc((size_t)n * sizeof *last);
    int ndone = 0, sweep;

    for (int i = 0; i < n; i++)
        last[i] = INFINITY;
    for (sweep = 0; sweep < MAX_SWEEPS && ndone < n; sweep++) {
        for (int i = 0; i < n; i++) {
            int small;
            if (done[i])
                continue;
            ldc r = newton_ratio(b, n, z[i], &small);
            if (!small && isfinite(creall(r)) && isfinite(cimagl(r))) {
                ldc w = aberth_step(r, z, n, i);
                z[i] -= w;
                /* a correction that no longer shrinks, though already
                   tiny, means rounding noise: arithmetic coarser than
                   LDBL_EPSILON promises ends here, not at MAX_SWEEPS */
                small = cabsl(w) >= last[i] && cabsl(w) < STALL * cabsl(z[i]);
                last[i] = cabsl(w);
            } else if (!small) {    /* p'(z) = 0: step off the critical point */
                z[i] = cmul(z[i], gs_cmplxl(1, 1e-3L)) + gs_cmplxl(0, 1e-30L);
            }
            if (small) {
                done[i] = 1;
                ndone++;
            }
        }
    }
    gs_free(last);
    gs_free(done);
    return ndone == n ? sweep : -1;
}

/* --- Double-word arithmetic (Dekker 1971; the sum is algorithm 6 and the
   product by a word algorithm 9 of Joldes, Muller & Popescu, "Tight and
   rigorous error bounds for basic building blocks of double-word
   arithmetic", ACM TOMS 44 (2017)).  Assumes round-to-nearest and no
   contraction of a*b+c into a fused operation, which holds for long
   double on the targets we build for. */

typedef struct dw {
    long double hi, lo;
} dw;

typedef struct dwc {
    dw re, im;
} dwc;

static dw fast_two_sum(long double a, long double b)    /* |a| >= |b| */
{
    long double s = a + b;
    return (dw){s, b - (s - a)};
}

static dw two_sum(long double a, long double b)
{
    long double s = a + b, bb = s - a;
    return (dw){s, (a - (s - bb)) + (b - bb)};
}

static dw split(long double a)
{
    long double c = SPLITTER * a, hi = c - (c - a);
    return (dw){hi, a - hi};
}

static dw two_prod(long double a, long double b)
{
    long double p = a * b;
    dw x = split(a), y = split(b);
    long double e = ((x.hi * y.hi - p) + x.hi * y.lo + x.lo * y.hi)
                    + x.lo * y.lo;
    return (dw){p, e};
}

static dw dw_add(dw x, dw y)
{
    dw s = two_sum(x.hi, y.hi), t = two_sum(x.lo, y.lo);
    s = fast_two_sum(s.hi, s.lo + t.hi);
    return fast_two_sum(s.hi, s.lo + t.lo);
}

static dw dw_neg(dw x)
{
    return (dw){-x.hi, -x.lo};
}

static dw dw_mul1(dw x, long double y)
{
    dw p = two_prod(x.hi, y);
    return fast_two_sum(p.hi, p.lo + x.lo * y);
}

static dwc dwc_mul1(dwc x, ldc z)     /* x * z, z in working precision */
{
    long double zr = creall(z), zi = cimagl(z);
    dwc r;
    r.re = dw_add(dw_mul1(x.re, zr), dw_neg(dw_mul1(x.im, zi)));
    r.im = dw_add(dw_mul1(x.re, zi), dw_mul1(x.im, zr));
    return r;
}

static dwc dwc_add(dwc x, dwc y)
{
    return (dwc){dw_add(x.re, y.re), dw_add(x.im, y.im)};
}

static ldc dwc_round(dwc x)
{
    return gs_cmplxl(x.re.hi + x.re.lo, x.im.hi + x.im.lo);
}

/* p(z) and p'(z) by Horner's rule in double-word complex arithmetic */
static void horner2_dw(ldc *p, ldc *dp, const long double *a, int n, ldc z)
{
    dwc v = {{a[n], 0}, {0, 0}}, d = {{0, 0}, {0, 0}};
    for (int k = n - 1; k >= 0; k--) {
        d = dwc_add(dwc_mul1(d, z), v);
        v = dwc_add(dwc_mul1(v, z), (dwc){{a[k], 0}, {0, 0}});
    }
    *p = dwc_round(v);
    *dp = dwc_round(d);
}

static long double abs_poly(const long double *a, int n, long double x)
{
    long double s = 0;
    for (int k = n; k >= 0; k--)
        s = s * x + fabsl(a[k]);
    return s;
}

/* One polishing correction of z[i] on q; returns 1 if it was kept. */
static int polish_one(ldc *z, int i, const long double *q, int n)
{
    ldc p, dp, p2, dp2;

    horner2_dw(&p, &dp, q, n, z[i]);
    if (p == 0 || dp == 0)
        return 0;
    ldc w = aberth_step(p / dp, z, n, i), old = z[i];
    if (!isfinite(creall(w)) || !isfinite(cimagl(w)) || w == 0)
        return 0;
    z[i] -= w;
    horner2_dw(&p2, &dp2, q, n, z[i]);
    if (cabsl(p2) < cabsl(p))
        return 1;
    z[i] = old;
    return 0;
}

static int polish(ldc *z, const long double *q, int n)
{
    char *stuck = gs_calloc((size_t)n, 1);
    int steps = 0, moved = 1;

    for (int pass = 0; pass < MAX_POLISH && moved; pass++) {
        moved = 0;
        for (int i = 0; i < n; i++) {
            if (stuck[i])
                continue;
            if (polish_one(z, i, q, n)) {
                moved = 1;
                steps++;
            } else {
                stuck[i] = 1;
            }
        }
    }
    gs_free(stuck);
    return steps;
}

/* --- Clusters ---------------------------------------------------------

   A root of multiplicity m of p spreads, when the coefficients are
   perturbed by eta relative, into m roots within about
       rho_m = (eta sum |q_k| |c|^k / |q_n prod_{j out} (c - z_j)|)^(1/m)
   of the cluster's centre c, the product running over the roots outside
   the cluster (it is |p^(m)(c)/m!|); Wilkinson, "Rounding Errors in
   Algebraic Processes" (1963), ch. 2.  So m approximations within
   CLUSTER_SLACK rho_m of their centroid are taken for one m-fold root.
   For a lone root (m = 1), n rho_1, with |p(z)| added to the numerator,
   is the radius of the Gerschgorin-type
   inclusion disk, which holds a root of every polynomial within eta of
   q (Neumaier, "Enclosing clusters of zeros of polynomials", J. Comput.
   Appl. Math. 156 (2003) 389-401; Bini & Fiorentino, Numer. Algorithms 23
   (2000) 127-173). */

#define CLUSTER_SLACK 2
#define MAX_CLUSTER 32
/* A cluster wider than this, relative, is not a multiple root but a
   badly conditioned stretch of roots (a Butterworth polynomial of degree
   64 in coefficient form, say): eps^(1/m) stays below it up to m = 16. */
#define CLUSTER_MAX 0.05L

typedef struct near_root {
    long double d;
    int i;
} near_root;

static int cmp_near(const void *pa, const void *pb)
{
    const near_root *a = pa, *b = pb;
    if (a->d != b->d)
        return a->d < b->d ? -1 : 1;
    return a->i < b->i ? -1 : a->i > b->i;
}

/* rho_m for the m roots near[0..m-1] of the n roots z of q; *spread gets
   their largest distance from the centroid. */
static long double cluster_rho(long double *spread, const ldc *z,
                               const near_root *near, int m,
                               const long double *q, int n)
{
    ldc c = 0, p, dp;
    long double lg = logl(fabsl(q[n])), eta = COEF_ULPS * LDBL_EPSILON;

    for (int k = 0; k < m; k++)
        c += z[near[k].i];
    c /= m;
    *spread = 0;
    for (int k = 0; k < m; k++)
        *spread = fmaxl(*spread, cabsl(z[near[k].i] - c));
    for (int k = m; k < n; k++) {
        long double d = cabsl(c - z[near[k].i]);
        if (d == 0)
            return INFINITY;
        lg += logl(d);
    }
    /* a lone root's own residual counts; a cluster centre's does not, as
       |p(c)| / |prod_out| is just the spread of the members, to the m */
    long double num = eta * abs_poly(q, n, cabsl(c));
    if (m == 1) {
        horner2_dw(&p, &dp, q, n, c);
        num += cabsl(p);
    }
    return num == 0 ? 0 : expl((logl(num) - lg) / m);
}

/* Largest cluster about z[i]: returns its size, sets *rad to the radius
   that bounds the error of z[i], and leaves the members first in near. */
static int cluster_about(long double *rad, near_root *near, const ldc *z,
                         int i, const long double *q, int n)
{
    int best = 1, top = n < MAX_CLUSTER ? n : MAX_CLUSTER;
    long double spread;

    for (int j = 0; j < n; j++)
        near[j] = (near_root){cabsl(z[j] - z[i]), j};
    qsort(near, (size_t)n, sizeof *near, cmp_near);
    *rad = n * cluster_rho(&spread, z, near, 1, q, n);
    for (int m = 2; m <= top; m++) {
        long double rho = cluster_rho(&spread, z, near, m, q, n);
        if (spread <= CLUSTER_SLACK * rho
            && CLUSTER_SLACK * rho <= CLUSTER_MAX * cabsl(z[i])) {
            best = m;
            *rad = spread + CLUSTER_SLACK * rho;
        }
    }
    return best;
}

/* Union-find root with path halving */
static int find(int *parent, int i)
{
    while (parent[i] != i) {
        parent[i] = parent[parent[i]];
        i = parent[i];
    }
    return i;
}

/* Multiplicity estimate mult[i] (may be NULL) and absolute error radius
   rad[i] of each of the n roots z of q[0..n]. */
static void analyse(int *mult, long double *rad, const ldc *z,
                    const long double *q, int n)
{
    near_root *near = gs_malloc((size_t)n * sizeof *near);
    int *parent = gs_malloc((size_t)n * sizeof *parent);
    int *size = gs_calloc((size_t)n, sizeof *size);

    for (int i = 0; i < n; i++)
        parent[i] = i;
    for (int i = 0; i < n; i++) {
        int m = cluster_about(&rad[i], near, z, i, q, n);
        for (int k = 1; k < m; k++)
            parent[find(parent, near[k].i)] = find(parent, i);
    }
    for (int i = 0; i < n; i++)
        size[find(parent, i)]++;
    for (int i = 0; mult != NULL && i < n; i++)
        mult[i] = size[find(parent, i)];
    gs_free(size);
    gs_free(parent);
    gs_free(near);
}

static long double backward_error(const long double *q, int n, ldc z)
{
    ldc p, dp;
    horner2_dw(&p, &dp, q, n, z);
    return cabsl(p) / abs_poly(q, n, cabsl(z));
}

/* Make real the roots whose error disk meets the real axis, if the disk
   is a useful bound and that keeps their backward error at rounding
   level, and pair the others as exact conjugates: a real polynomial's
   roots are symmetric. */
static void symmetrize(ldc *z, const long double *rad, const long double *q,
                       int n)
{
    char *used = gs_calloc((size_t)n, 1);

    for (int i = 0; i < n; i++) {
        ldc x = gs_cmplxl(creall(z[i]), 0);
        if (cimagl(z[i]) == 0 || (fabsl(cimagl(z[i])) <= rad[i]
            && rad[i] <= CLUSTER_MAX * cabsl(z[i])
            && backward_error(q, n, x) <= fmaxl(64 * LDBL_EPSILON,
                                                backward_error(q, n, z[i]))))
            z[i] = x;
    }
    for (int i = 0; i < n; i++) {
        int best = -1;
        long double bd = INFINITY;
        if (cimagl(z[i]) <= 0)
            continue;
        for (int j = 0; j < n; j++) {
            long double d = cabsl(z[i] - conjl(z[j]));
            if (cimagl(z[j]) < 0 && !used[j] && d < bd) {
                bd = d;
                best = j;
            }
        }
        if (best < 0) {
            z[i] = gs_cmplxl(creall(z[i]), 0);
            continue;
        }
        used[best] = 1;
        z[i] = (z[i] + conjl(z[best])) / 2;
        z[best] = conjl(z[i]);
    }
    for (int j = 0; j < n; j++)
        if (cimagl(z[j]) < 0 && !used[j])
            z[j] = gs_cmplxl(creall(z[j]), 0);
    gs_free(used);
}

static int cmp_roots(const void *pa, const void *pb)
{
    ldc a = *(const ldc *)pa, b = *(const ldc *)pb;
    long double ma = cabsl(a), mb = cabsl(b);
    if (ma != mb)
        return ma < mb ? -1 : 1;
    if (cimagl(a) != cimagl(b))
        return cimagl(a) > cimagl(b) ? -1 : 1;
    if (creall(a) != creall(b))
        return creall(a) < creall(b) ? -1 : 1;
    return 0;
}

/* Scaled copy b_k = q_k 2^(e k + c), exact: e from the geometric mean of
   the root moduli (|q_0|/|q_n|)^(1/n), c so that max |b_k| is near 1. */
static int scale_poly(long double *b, const long double *q, int n)
{
    int e0, en;
    frexpl(q[0], &e0);
    frexpl(q[n], &en);
    int e = (int)lroundl((long double)(e0 - en) / n);
    long double top = -INFINITY;
    for (int k = 0; k <= n; k++)
        if (q[k] != 0 && log2l(fabsl(q[k])) + (long double)e * k > top)
            top = log2l(fabsl(q[k])) + (long double)e * k;
    int c = -(int)lroundl(top);
    for (int k = 0; k <= n; k++)
        b[k] = ldexpl(q[k], e * k + c);
    return e;
}

static int check_coeffs(const long double *a, int degree, int *top,
                        int *low)
{
    if (a == NULL || degree < 0)
        return GS_EINVAL;
    *top = -1;
    *low = -1;
    for (int k = 0; k <= degree; k++) {
        if (!isfinite(a[k]))
            return GS_EINVAL;
        if (a[k] != 0) {
            *top = k;
            if (*low < 0)
                *low = k;
        }
    }
    return *top < 0 ? GS_EINVAL : GS_OK;
}

/* Nonzero roots of q[0..n] (q[0], q[n] nonzero) into z; 0 or -1 */
static int nonzero_roots(ldc *z, const long double *q, int n,
                         gs_roots_info *info)
{
    long double *b = gs_malloc((size_t)(n + 1) * sizeof *b);
    long double *rad = gs_malloc((size_t)n * sizeof *rad);

    info->scale_exp = scale_poly(b, q, n);
    initial_guesses(z, b, n);
    info->iterations = aberth(z, b, n);
    info->converged = info->iterations >= 0;
    for (int i = 0; i < n; i++)
        z[i] = gs_cmplxl(ldexpl(creall(z[i]), info->scale_exp),
                  ldexpl(cimagl(z[i]), info->scale_exp));
    info->polish_steps = polish(z, q, n);
    analyse(NULL, rad, z, q, n);
    symmetrize(z, rad, q, n);
    gs_free(rad);
    gs_free(b);
    return info->converged ? 0 : -1;
}

int gs_roots(ldc *roots, long double *residuals, const long double *a,
             int degree, gs_roots_info *info)
{
    gs_roots_info tmp;
    int top, low, rc;

    if (info == NULL)
        info = &tmp;
    memset(info, 0, sizeof *info);
    rc = check_coeffs(a, degree, &top, &low);
    if (rc != GS_OK)
        return rc;
    info->nroots = top;
    info->nzero = low;
    info->converged = 1;
    for (int i = 0; i < low; i++)
        roots[i] = 0;
    if (top > low && nonzero_roots(roots + low, a + low, top - low, info))
        rc = GS_ERANGE;
    qsort(roots, (size_t)top, sizeof *roots, cmp_roots);
    for (int i = 0; i < top; i++) {
        ldc p, dp;
        long double r = 0;
        if (roots[i] != 0) {
            horner2_dw(&p, &dp, a + low, top - low, roots[i]);
            r = cabsl(p) / abs_poly(a + low, top - low, cabsl(roots[i]));
        }
        if (residuals != NULL)
            residuals[i] = r;
        if (r > info->max_residual)
            info->max_residual = r;
    }
    return rc;
}

int gs_roots_mult(int *mult, long double *relerr, const ldc *roots,
                  int nroots, const long double *a, int degree)
{
    int top, low, n, k = 0;

    if (check_coeffs(a, degree, &top, &low) != GS_OK || nroots != top)
        return GS_EINVAL;
    n = top - low;
    ldc *z = gs_malloc((size_t)(n + 1) * sizeof *z);
    long double *rad = gs_malloc((size_t)(n + 1) * sizeof *rad);
    int *m = gs_malloc((size_t)(n + 1) * sizeof *m);
    for (int i = 0; i < nroots; i++)
        if (roots[i] != 0 && k < n)
            z[k++] = roots[i];
    if (k != n) {
        gs_free(m);
        gs_free(rad);
        gs_free(z);
        return GS_EINVAL;
    }
    analyse(m, rad, z, a + low, n);
    k = 0;
    for (int i = 0; i < nroots; i++) {
        int zero = roots[i] == 0 || k >= n;
        mult[i] = zero ? low : m[k];
        if (relerr != NULL)
            relerr[i] = zero ? 0 : rad[k] / cabsl(z[k]);
        k += !zero;
    }
    gs_free(m);
    gs_free(rad);
    gs_free(z);
    return GS_OK;
}

/* --- Poles and zeros of a rational function ---------------------------- */

/* Copy a[lo..hi] into a fresh array */
static long double *copy_range(const long double *a, int lo, int hi)
{
    long double *r = gs_malloc((size_t)(hi - lo + 1) * sizeof *r);
    if (hi >= lo)
        memcpy(r, a + lo, (size_t)(hi - lo + 1) * sizeof *r);
    return r;
}

/* Roots of p[0..n] with their multiplicities, errors and residuals */
static int tfn_roots(ldc **z, int **mult, long double **err,
                     long double **res, const long double *p, int n)
{
    size_t m = (size_t)(n > 0 ? n : 0);
    int rc = GS_OK;

    *z = gs_malloc(m * sizeof **z);
    *mult = gs_malloc(m * sizeof **mult);
    *err = gs_malloc(m * sizeof **err);
    *res = gs_malloc(m * sizeof **res);
    if (n > 0) {
        rc = gs_roots(*z, *res, p, n, NULL);
        if (gs_roots_mult(*mult, *err, *z, n, p, n) != GS_OK)
            rc = GS_EINVAL;
    }
    return rc;
}

static int valid_coeffs(const long double *a, int deg)
{
    if (deg >= 0 && a == NULL)
        return 0;
    for (int k = 0; k <= deg; k++)
        if (!isfinite(a[k]))
            return 0;
    return 1;
}

/* Lowest and highest index of a nonzero coefficient; -1, -1 if none */
static void support(int *low, int *top, const long double *a, int deg)
{
    *low = *top = -1;
    for (int k = 0; k <= deg; k++)
        if (a[k] != 0) {
            *top = k;
            if (*low < 0)
                *low = k;
        }
}

int gs_tfn_init(gs_tfn *h, const long double *num, int num_deg,
                const long double *den, int den_deg)
{
    int nlo, ntop, dlo, dtop, c, rc, rc2;

    memset(h, 0, sizeof *h);
    h->num_deg = -1;
    h->den_deg = -1;
    if (!valid_coeffs(num, num_deg) || !valid_coeffs(den, den_deg))
        return GS_EINVAL;
    support(&nlo, &ntop, num, num_deg);
    support(&dlo, &dtop, den, den_deg);
    if (dtop < 0)
        return GS_EINVAL;
    c = nlo >= 0 && nlo < dlo ? nlo : dlo;
    h->den = copy_range(den, c, dtop);
    h->den_deg = dtop - c;
    if (ntop >= 0) {
        h->num = copy_range(num, c, ntop);
        h->num_deg = ntop - c;
        h->origin = nlo - dlo;
        h->lf_gain = num[nlo] / den[dlo];
    } else {
        h->num = copy_range(num, 0, -1);
    }
    rc = tfn_roots(&h->zeros, &h->zero_mult, &h->zero_err, &h->zero_res,
                   h->num, h->num_deg);
    rc2 = tfn_roots(&h->poles, &h->pole_mult, &h->pole_err, &h->pole_res,
                    h->den, h->den_deg);
    h->nzeros = h->num_deg > 0 ? h->num_deg : 0;
    h->npoles = h->den_deg;
    return rc != GS_OK ? rc : rc2;
}

void gs_tfn_clear(gs_tfn *h)
{
    gs_free(h->num);
    gs_free(h->den);
    gs_free(h->zeros);
    gs_free(h->poles);
    gs_free(h->zero_mult);
    gs_free(h->pole_mult);
    gs_free(h->zero_err);
    gs_free(h->pole_err);
    gs_free(h->zero_res);
    gs_free(h->pole_res);
    memset(h, 0, sizeof *h);
}

ldc gs_tfn_eval(const gs_tfn *h, ldc s)
{
    return gs_roots_horner(h->num, h->num_deg, s)
           / gs_roots_horner(h->den, h->den_deg, s);
}

long double gs_tfn_dc_gain(const gs_tfn *h)
{
    if (h->origin > 0 || h->lf_gain == 0)
        return 0;
    if (h->origin < 0)
        return h->lf_gain > 0 ? INFINITY : -INFINITY;
    return h->lf_gain;
}

void gs_pz_describe(gs_pz_info *out, ldc p)
{
    long double re = creall(p), im = cimagl(p);

    out->rhp = re > 0;
    out->w0 = cabsl(p);
    out->f0 = out->w0 / (2 * PI_L);
    out->q = NAN;
    out->zeta = NAN;
    if (p == 0) {
        out->kind = GS_PZ_ORIGIN;
    } else if (im == 0) {
        out->kind = GS_PZ_REAL;
    } else {
        out->kind = GS_PZ_COMPLEX;
        out->zeta = fabsl(re) / out->w0;
        out->q = re == 0 ? INFINITY : out->w0 / (2 * fabsl(re));
    }
}

int gs_tfn_stability(const gs_tfn *h)
{
    int verdict = GS_STABLE;

    for (int i = 0; i < h->npoles; i++) {
        long double m = cabsl(h->poles[i]), re = creall(h->poles[i]);
        long double tol = h->pole_err[i];
        if (tol < 16 * LDBL_EPSILON)
            tol = 16 * LDBL_EPSILON;
        tol *= m;
        if (re > tol)
            return GS_UNSTABLE;
        if (re >= -tol) {           /* on the imaginary axis */
            if (h->pole_mult[i] > 1)
                return GS_UNSTABLE;
            verdict = GS_MARGINAL;
        }
    }
    return verdict;
}

static int cmp_pairs(const void *pa, const void *pb)
{
    const gs_pz_pair *a = pa, *b = pb;
    if (a->rel_dist != b->rel_dist)
        return a->rel_dist < b->rel_dist ? -1 : 1;
    if (a->pole != b->pole)
        return a->pole < b->pole ? -1 : 1;
    return a->zero < b->zero ? -1 : a->zero > b->zero;
}

static long double rel_dist(ldc p, ldc z)
{
    long double m = fmaxl(cabsl(p), cabsl(z));
    return m == 0 ? 0 : cabsl(p - z) / m;
}

int gs_pz_cancellations(gs_pz_pair *pairs, int max, const gs_tfn *h,
                        long double rel_tol)
{
    size_t n = 0, cap = (size_t)h->npoles * (size_t)h->nzeros;
    gs_pz_pair *all = gs_malloc((cap ? cap : 1) * sizeof *all);
    char *pu = gs_calloc((size_t)h->npoles + 1, 1);
    char *zu = gs_calloc((size_t)h->nzeros + 1, 1);
    int found = 0;

    for (int i = 0; i < h->npoles; i++)
        for (int j = 0; j < h->nzeros; j++) {
            long double d = rel_dist(h->poles[i], h->zeros[j]);
            if (d <= rel_tol)
                all[n++] = (gs_pz_pair){i, j, d};
        }
    qsort(all, n, sizeof *all, cmp_pairs);
    for (size_t k = 0; k < n; k++) {
        if (pu[all[k].pole] || zu[all[k].zero])
            continue;
        pu[all[k].pole] = zu[all[k].zero] = 1;
        if (found < max)
            pairs[found] = all[k];
        found++;
    }
    gs_free(zu);
    gs_free(pu);
    gs_free(all);
    return found;
}
