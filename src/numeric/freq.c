/* freq.c - frequency response, bandwidth and margins. See LICENSE.
 *
 * N(jw) and D(jw) are evaluated by Horner's rule split into even and odd
 * parts, p(jw) = E(-w^2) + j w O(-w^2), in real long double arithmetic;
 * above w = 1 on the reversed polynomial, p(jw) = (jw)^n r(1/(jw)), so no
 * power of w is ever formed and nothing overflows.  Magnitudes are summed
 * as logarithms.  The phase is the principal argument of N/D, moved by the
 * multiple of 360 degrees that puts it nearest the phase accumulated from
 * the factored form (one arctangent per pole and zero), so unwrapping is
 * exact and does not depend on how densely the sweep samples.
 */
#include "numeric/freq.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"

typedef long double complex ldc;

#define PI_L 3.141592653589793238462643383279502884L
#define LN10_L 2.302585092994045684017991454684364208L

/* p(jv) and p'(jv) for p with coefficients c_k = a[k] (or a[n-k] when
   rev), by the even/odd split; s = jv, s^2 = -v^2. */
static void eval_jv(ldc *val, ldc *der, const long double *a, int n, int rev,
                    long double v)
{
    long double x = -v * v, e = 0, o = 0, de = 0, dod = 0;

    for (int k = n; k >= 0; k--) {
        long double c = a[rev ? n - k : k];
        if (k % 2 == 0) {
            e = e * x + c;                      /* sum c_k x^(k/2) */
            if (k > 0)
                dod = dod * x + k * c;          /* k c_k x^((k-2)/2) */
        } else {
            o = o * x + c;                      /* c_k x^((k-1)/2) */
            de = de * x + k * c;
        }
    }
    *val = gs_cmplxl(e, v * o);
    *der = gs_cmplxl(de, v * dod);
}

/* p(jw) = m (jw)^k with k = 0 (w <= 1) or k = n (w > 1), and p'/p */
typedef struct jw_val {
    ldc m, dlog;
    int k;
} jw_val;

static jw_val eval_jw(const long double *a, int n, long double w)
{
    jw_val r;
    ldc d;

    if (w <= 1) {
        eval_jv(&r.m, &d, a, n, 0, w);
        r.k = 0;
        r.dlog = d / r.m;
        return r;
    }
    /* p(s) = s^n r(u), u = 1/s = j(-1/w); p'/p = u (n - u r'(u)/r(u)) */
    long double v = -1 / w;
    ldc u = gs_cmplxl(0, v);
    eval_jv(&r.m, &d, a, n, 1, v);
    r.k = n;
    r.dlog = u * ((long double)n - u * d / r.m);
    return r;
}

/* atan2(y, x) within 1e-5 (Abramowitz & Stegun 4.4.47 on [0, 1], and the
   octant identities), with atan2(+0, x < 0) = pi.  The factored phase
   only picks the multiple of 2 pi, so this is plenty, even summed over
   thousands of roots, and much cheaper than atan2l. */
static long double rough_atan2(long double y, long double x)
{
    long double ax = fabsl(x), ay = fabsl(y);
    if (ax == 0 && ay == 0)
        return 0;
    double t = (double)(ax >= ay ? ay / ax : ax / ay), t2 = t * t;
    double a = t * (0.9998660 + t2 * (-0.3302995 + t2 * (0.1801410
               + t2 * (-0.0851330 + t2 * 0.0208351))));
    if (ay > ax)
        a = 1.57079632679489661923 - a;
    if (x < 0)
        a = 3.14159265358979323846 - a;
    return y < 0 ? -a : a;
}

/* Change of arg(jw - z) from w = 0+ to w, continuous in w: for Re z <= 0
   it is atan2(w - b, x) - atan2(-b, x) with b = Im z, x = -Re z >= 0; in
   the right half plane the angle turns the other way.  Both angles lie in
   [-pi/2, pi/2], so the difference is one arctangent,
   atan2(x w, x^2 - b (w - b)), which also turns by exactly pi when a root
   on the axis (x = 0) is crossed. */
static long double turn(ldc z, long double w)
{
    long double a = creall(z), b = cimagl(z), x = fabsl(a);
    long double t = rough_atan2(x * w, x * x - b * (w - b));
    return a > 0 ? -t : t;
}

/* The unwrapped phase (radians) from the factored form */
static long double factored_phase(const gs_tfn *h, long double w)
{
    long double ph = h->origin * (PI_L / 2) - (h->lf_gain < 0 ? PI_L : 0);

    for (int i = 0; i < h->nzeros; i++)
        if (h->zeros[i] != 0)
            ph += turn(h->zeros[i], w);
    for (int i = 0; i < h->npoles; i++)
        if (h->poles[i] != 0)
            ph -= turn(h->poles[i], w);
    return ph;
}

/* |z|^2; the mantissas here are far from overflow */
static long double norm2(ldc z)
{
    return creall(z) * creall(z) + cimagl(z) * cimagl(z);
}

/* The values the solvers need at w: ln|H|, phase (rad), N'/N - D'/D */
typedef struct resp {
    long double lnmag, phase;
    ldc dlog;
} resp;

static resp response(const gs_tfn *h, long double w)
{
    resp r = {-INFINITY, 0, 0};

    if (h->num_deg < 0)
        return r;
    jw_val n = eval_jw(h->num, h->num_deg, w);
    jw_val d = eval_jw(h->den, h->den_deg, w);
    int k = n.k - d.k;
    long double nn = norm2(n.m), dd = norm2(d.m), q = nn / dd;
    ldc nd = n.m * conjl(d.m);      /* arg N - arg D in one arctangent */
    if (isfinite(q) && q > 0 && isfinite(creall(nd)) && isfinite(cimagl(nd))
        && nd != 0) {
        r.lnmag = logl(q) / 2;
        r.phase = cargl(nd);
    } else {                        /* the ratio left the exponent range */
        r.lnmag = (logl(nn) - logl(dd)) / 2;
        r.phase = cargl(n.m) - cargl(d.m);
    }
    if (k != 0)
        r.lnmag += k * logl(w);
    long double p = r.phase + k * (PI_L / 2);
    long double want = factored_phase(h, w);
    r.phase = p + 2 * PI_L * roundl((want - p) / (2 * PI_L));
    r.dlog = n.dlog - d.dlog;
    return r;
}

void gs_freq_eval(long double *mag_db, long double *phase_deg,
                  long double *delay_s, const gs_tfn *h, long double f_hz)
{
    resp r = response(h, 2 * PI_L * f_hz);

    if (mag_db != NULL)
        *mag_db = r.lnmag * (20 / LN10_L);
    if (phase_deg != NULL)
        *phase_deg = r.phase * (180 / PI_L);
    if (delay_s != NULL)
        *delay_s = h->num_deg < 0 ? 0 : -creall(r.dlog);
}

void gs_sweep_init(gs_sweep *sw)
{
    memset(sw, 0, sizeof *sw);
}

void gs_sweep_clear(gs_sweep *sw)
{
    gs_free(sw->freq);
    gs_free(sw->mag_db);
    gs_free(sw->phase_deg);
    gs_free(sw->delay_s);
    gs_sweep_init(sw);
}

static void sweep_alloc(gs_sweep *sw, size_t n)
{
    gs_sweep_clear(sw);
    sw->n = n;
    sw->freq = gs_reallocarray(NULL, n, sizeof *sw->freq);
    sw->mag_db = gs_reallocarray(NULL, n, sizeof *sw->mag_db);
    sw->phase_deg = gs_reallocarray(NULL, n, sizeof *sw->phase_deg);
    sw->delay_s = gs_reallocarray(NULL, n, sizeof *sw->delay_s);
}

static void sweep_fill(gs_sweep *sw, const gs_tfn *h)
{
    for (size_t i = 0; i < sw->n; i++)
        gs_freq_eval(&sw->mag_db[i], &sw->phase_deg[i], &sw->delay_s[i], h,
                     sw->freq[i]);
}

int gs_sweep_log(gs_sweep *sw, const gs_tfn *h, long double f_from,
                 long double f_to, size_t points)
{
    if (!(f_from > 0) || !isfinite(f_to) || points == 0
        || (points == 1 && f_from != f_to)
        || (points > 1 && !(f_to > f_from)))
        return GS_EINVAL;
    sweep_alloc(sw, points);
    long double l0 = logl(f_from), step = 0;
    if (points > 1)
        step = (logl(f_to) - l0) / (long double)(points - 1);
    for (size_t i = 0; i < points; i++)
        sw->freq[i] = expl(l0 + step * (long double)i);
    sw->freq[0] = f_from;
    sw->freq[points - 1] = f_to;
    sweep_fill(sw, h);
    return GS_OK;
}

size_t gs_sweep_points(long double f_from, long double f_to,
                       long double per_decade)
{
    if (!(f_from > 0) || !(f_to > f_from) || !isfinite(f_to)
        || !(per_decade > 0) || !isfinite(per_decade))
        return 0;
    long double n = ceill(log10l(f_to / f_from) * per_decade - 1e-9L);
    if (n > 1e9L)
        return 0;
    return (size_t)n + 1;
}

int gs_sweep_at(gs_sweep *sw, const gs_tfn *h, const long double *freq,
                size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (!(freq[i] >= 0) || !isfinite(freq[i]))
            return GS_EINVAL;
    sweep_alloc(sw, n);
    if (n > 0)
        memcpy(sw->freq, freq, n * sizeof *freq);
    sweep_fill(sw, h);
    return GS_OK;
}

/* --- Crossings -----------------------------------------------------------

   |p(jw)|^2 = p(jw) p(-jw) = sum_m c_m w^(2m) with
   c_m = (-1)^m sum_{i+k=2m} (-1)^k a_i a_k, and
   Im[N(jw) conj D(jw)] = w sum_m e_m w^(2m) with
   e_m = (-1)^m sum_{i+k=2m+1} (-1)^k a_i b_k: polynomials in x = w^2
   whose positive real roots are where |H| or arg H can cross a level. */

/* r[m] += scale * (-1)^m sum_{i+k=2m+odd} (-1)^k a_i b_k, m = 0..rn, and
   size[m] += the magnitudes of those terms */
static void cross_terms(long double *r, long double *size, int rn,
                        const long double *a, int na, const long double *b,
                        int nb, int odd, long double scale)
{
    for (int i = 0; i <= na; i++)
        for (int k = 0; k <= nb; k++) {
            int t = i + k - odd;
            if (t < 0 || t % 2 != 0 || t / 2 > rn)
                continue;
            long double v = a[i] * b[k] * scale;
            r[t / 2] += ((t / 2 + k) % 2 == 0) ? v : -v;
            size[t / 2] += fabsl(v);
        }
}

/* Coefficients that cancelled to rounding level are zero: for an
   all-pass |N|^2 - |D|^2 vanishes identically, and its noise must not
   pass for crossings. */
static void drop_noise(long double *r, const long double *size, int rn)
{
    for (int m = 0; m <= rn; m++)
        if (fabsl(r[m]) <= 16 * (long double)rn * LDBL_EPSILON * size[m])
            r[m] = 0;
}

/* Positive real roots x of r[0..n], as w = sqrt(x), ascending; returns
   the count, or -1 if the root search failed. */
static int positive_roots(long double *w, const long double *r, int n)
{
    ldc *z = gs_malloc((size_t)(n > 0 ? n : 1) * sizeof *z);
    gs_roots_info info;
    int cnt = 0, top = n;

    while (top >= 0 && r[top] == 0)
        top--;
    if (top <= 0) {
        gs_free(z);
        return 0;
    }
    int rc = gs_roots(z, NULL, r, top, &info);
    for (int i = 0; i < info.nroots; i++)
        if (creall(z[i]) > 0 && fabsl(cimagl(z[i])) <= 1e-6L * cabsl(z[i]))
            w[cnt++] = sqrtl(creall(z[i]));
    gs_free(z);
    return rc == GS_OK ? cnt : -1;
}

enum { BY_MAG, BY_PHASE };

/* g(w) = ln|H| - target or phase - target, and dg/dw */
static long double g_of(long double *dg, const gs_tfn *h, long double w,
                        int by, long double target)
{
    resp r = response(h, w);
    if (by == BY_MAG) {
        *dg = -cimagl(r.dlog);      /* d ln|H| / dw = Re(j dlog) */
        return r.lnmag - target;
    }
    *dg = creall(r.dlog);           /* d arg H / dw = Im(j dlog) */
    return r.phase - target;
}

/* Newton's method on g from w, steps kept within a factor of 2; returns
   the refined w, or 0 if g is not within tol of zero there. */
static long double refine(const gs_tfn *h, long double w, int by,
                          long double target, long double tol)
{
    long double dg, g = g_of(&dg, h, w, by, target);

    for (int it = 0; it < 40 && g != 0; it++) {
        if (!(dg != 0) || !isfinite(dg))
            break;
        long double nw = w - g / dg;
        nw = fminl(fmaxl(nw, w / 2), 2 * w);
        long double ng = g_of(&dg, h, nw, by, target);
        if (!(fabsl(ng) < fabsl(g)))
            break;
        int done = fabsl(nw - w) <= 4 * LDBL_EPSILON * w;
        w = nw;
        g = ng;
        if (done)
            break;
    }
    return fabsl(g) <= tol ? w : 0;
}

static int cmp_ld(const void *pa, const void *pb)
{
    long double a = *(const long double *)pa, b = *(const long double *)pb;
    return a < b ? -1 : a > b;
}

/* Sort w[0..n) and drop zeros and near-duplicates; returns the new n */
static int sort_unique(long double *w, int n)
{
    int k = 0;
    qsort(w, (size_t)n, sizeof *w, cmp_ld);
    for (int i = 0; i < n; i++)
        if (w[i] > 0 && (k == 0 || w[i] - w[k - 1] > 1e-12L * w[i]))
            w[k++] = w[i];
    return k;
}

/* Angular frequencies where ln|H| = lnlev, ascending, into w (room for
   max(deg N, deg D)); returns the count or -1. */
static int mag_crossings(long double *w, const gs_tfn *h, long double lnlev)
{
    int n = h->num_deg > h->den_deg ? h->num_deg : h->den_deg, cnt, k = 0;
    long double *r = gs_calloc((size_t)n + 1, sizeof *r);
    long double *size = gs_calloc((size_t)n + 1, sizeof *size);
    long double lev2 = expl(2 * lnlev);

    cross_terms(r, size, n, h->num, h->num_deg, h->num, h->num_deg, 0, 1);
    cross_terms(r, size, n, h->den, h->den_deg, h->den, h->den_deg, 0,
                -lev2);
    drop_noise(r, size, n);
    cnt = positive_roots(w, r, n);
    gs_free(size);
    gs_free(r);
    for (int i = 0; i < cnt; i++) {
        long double x = refine(h, w[i], BY_MAG, lnlev, 1e-9L);
        if (x > 0)
            w[k++] = x;
    }
    return cnt < 0 ? -1 : sort_unique(w, k);
}

int gs_freq_crossings(long double *f_hz, int max, int *count,
                      const gs_tfn *h, long double level_db)
{
    if (!isfinite(level_db) || max < 0 || (max > 0 && f_hz == NULL))
        return GS_EINVAL;
    *count = 0;
    if (h->num_deg < 0)
        return GS_OK;
    int n = h->num_deg > h->den_deg ? h->num_deg : h->den_deg;
    long double *w = gs_malloc(((size_t)n + 1) * sizeof *w);
    int cnt = mag_crossings(w, h, level_db * (LN10_L / 20));
    for (int i = 0; i < cnt && i < max; i++)
        f_hz[i] = w[i] / (2 * PI_L);
    gs_free(w);
    if (cnt < 0)
        return GS_ERANGE;
    *count = cnt;
    return GS_OK;
}

int gs_freq_bandwidth(long double *f_hz, const gs_tfn *h)
{
    long double h0 = gs_tfn_dc_gain(h), f[1];
    int cnt, rc;

    if (h0 == 0 || !isfinite(h0))
        return GS_ERANGE;
    /* half power: 20 log10(|H0| / sqrt 2) */
    rc = gs_freq_crossings(f, 1, &cnt, h, 20 * log10l(fabsl(h0))
                                              - 10 * log10l(2));
    if (rc != GS_OK)
        return rc;
    if (cnt == 0)
        return GS_ERANGE;
    *f_hz = f[0];
    return GS_OK;
}

/* Gain crossovers (|H| = 1) as angular frequencies, into a fresh array */
static int unity_crossings(long double **w, const gs_tfn *h)
{
    int n = h->num_deg > h->den_deg ? h->num_deg : h->den_deg;
    *w = gs_malloc(((size_t)n + 1) * sizeof **w);
    if (h->num_deg < 0)
        return 0;
    return mag_crossings(*w, h, 0);
}

int gs_freq_unity_gain(long double *f_hz, const gs_tfn *h)
{
    long double *w, dg;
    int cnt = unity_crossings(&w, h), rc = GS_ERANGE;

    for (int i = 0; i < cnt; i++) {
        g_of(&dg, h, w[i], BY_MAG, 0);
        if (dg < 0) {
            *f_hz = w[i] / (2 * PI_L);
            rc = GS_OK;
            break;
        }
    }
    gs_free(w);
    return rc;
}

/* Lowest w where the unwrapped phase is exactly -pi; 0 if none, -1 if
   the root search failed. */
static long double phase_crossover(const gs_tfn *h)
{
    int n = h->num_deg + h->den_deg, cnt;
    long double *r = gs_calloc((size_t)n + 1, sizeof *r);
    long double *size = gs_calloc((size_t)n + 1, sizeof *size);
    long double *w = gs_malloc(((size_t)n + 1) * sizeof *w), best = 0;

    cross_terms(r, size, n, h->num, h->num_deg, h->den, h->den_deg, 1, 1);
    drop_noise(r, size, n);
    gs_free(size);
    cnt = positive_roots(w, r, n);
    for (int i = 0; i < cnt; i++) {
        resp q = response(h, w[i]);
        if (fabsl(q.phase + PI_L) > 0.01L)  /* H real, but not at -180 */
            continue;
        long double x = refine(h, w[i], BY_PHASE, -PI_L, 1e-12L);
        if (x > 0 && (best == 0 || x < best))
            best = x;
    }
    gs_free(w);
    gs_free(r);
    return cnt < 0 ? -1 : best;
}

int gs_freq_margins(gs_margins *m, const gs_tfn *loop)
{
    long double *w;
    int cnt = unity_crossings(&w, loop);

    memset(m, 0, sizeof *m);
    for (int i = 0; i < cnt; i++) {
        long double pm = 180 + response(loop, w[i]).phase * (180 / PI_L);
        if (!m->has_pm || pm < m->pm_deg) {
            m->has_pm = 1;
            m->pm_deg = pm;
            m->pm_hz = w[i] / (2 * PI_L);
        }
    }
    m->ncross = cnt > 0 ? cnt : 0;
    gs_free(w);
    long double wp = loop->num_deg < 0 ? 0 : phase_crossover(loop);
    if (wp > 0) {
        m->has_gm = 1;
        m->gm_hz = wp / (2 * PI_L);
        m->gm_db = -response(loop, wp).lnmag * (20 / LN10_L);
    }
    return cnt < 0 || wp < 0 ? GS_ERANGE : GS_OK;
}
