/* step.c - step and impulse response by partial fractions. See LICENSE.
 *
 * Residues of Y(s) = H(s)/s at an m-fold pole p are the Taylor
 * coefficients of G(s) = (s - p)^m Y(s) at p (the usual Heaviside cover-up
 * rule for repeated poles; e.g. Oppenheim & Willsky, "Signals and
 * Systems", sec. 9.5 and appendix): G is the numerator, Taylor-shifted to
 * p by the complete Horner scheme, times the series of
 * (s - q)^(-m_q) = (d + t)^(-m_q), d = p - q, for every other pole q.
 *
 * Merging: two poles a relative distance delta apart, kept apart, give
 * residues of size 1/delta that cancel, losing about eps/delta; merged
 * into a double pole they change y by about delta^2.  The two balance
 * near delta = eps^(1/3), about 5e-7 in long double; MERGE_TOL is 1e-6.
 */
#include "numeric/step.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"

typedef long double complex ldc;

#define PI_L 3.141592653589793238462643383279502884L
#define MERGE_TOL 1e-6L
#define CLUSTER_CAP 1e-2L
#define MAX_POINTS 4000000L     /* grid budget of gs_step_measure */
#define GROW 0.00577L           /* 10^(1/400) - 1: 400 points a decade */
#define OSC_STEPS 32            /* points per period of a live oscillation */
#define LIVE 1e-9L              /* an oscillation is live above this,
                                   relative to the final value */
#define TAIL 1e-5L              /* scan until transients are below this */

/* A merged pole of Y(s): centre, multiplicity, and which half plane of
   the conjugate symmetry it sits in (0: on the real axis). */
typedef struct cluster {
    ldc c;
    int m, half;
} cluster;

static int find(int *parent, int i)
{
    while (parent[i] != i) {
        parent[i] = parent[parent[i]];
        i = parent[i];
    }
    return i;
}

/* Poles merge when close, or when the root finder put them in one
   cluster whose error disks meet; disks wider than CLUSTER_CAP (badly
   conditioned, not repeated) do not count. */
static int close_poles(ldc a, ldc b, long double ra, long double rb)
{
    long double d = cabsl(a - b), m = fmaxl(cabsl(a), cabsl(b));
    return d == 0 || d <= MERGE_TOL * m
           || (d <= ra + rb && ra + rb <= CLUSTER_CAP * m);
}

/* Poles of Y: those of H and one at 0; p and rad get n = npoles + 1 */
static int y_poles(ldc **p, long double **rad, const gs_tfn *h)
{
    int n = h->npoles + 1;
    *p = gs_malloc((size_t)n * sizeof **p);
    *rad = gs_malloc((size_t)n * sizeof **rad);
    for (int i = 0; i < h->npoles; i++) {
        (*p)[i] = h->poles[i];
        (*rad)[i] = h->pole_mult[i] > 1
                    ? h->pole_err[i] * cabsl(h->poles[i]) : 0;
    }
    (*p)[n - 1] = 0;
    (*rad)[n - 1] = 0;
    return n;
}

/* Centre, size and half plane of the group led by r */
static cluster make_cluster(const ldc *p, const int *parent, int n, int r)
{
    cluster c = {0, 0, 0};
    int selfconj = 0;
    for (int i = 0; i < n; i++) {
        if (parent[i] != r)
            continue;
        c.c += p[i];
        c.m++;
        for (int j = 0; j < n; j++)
            if (parent[j] == r && p[j] == conjl(p[i]))
                selfconj = 1;       /* a real member, or both of a pair */
    }
    c.c /= c.m;
    if (selfconj || cimagl(c.c) == 0)
        c.c = creall(c.c);
    else
        c.half = cimagl(c.c) > 0 ? 1 : -1;
    return c;
}

/* Group the poles of Y; returns the number of clusters in *out */
static int group_poles(cluster **out, const gs_tfn *h)
{
    ldc *p;
    long double *rad;
    int n = y_poles(&p, &rad, h), k = 0;
    int *parent = gs_malloc((size_t)n * sizeof *parent);

    for (int i = 0; i < n; i++)
        parent[i] = i;
    for (int i = 0; i < n; i++)
        for (int j = i + 1; j < n; j++)
            if (close_poles(p[i], p[j], rad[i], rad[j]))
                parent[find(parent, i)] = find(parent, j);
    for (int i = 0; i < n; i++)
        parent[i] = find(parent, i);
    *out = gs_malloc((size_t)n * sizeof **out);
    for (int r = 0; r < n; r++)
        if (parent[r] == r)
            (*out)[k++] = make_cluster(p, parent, n, r);
    gs_free(parent);
    gs_free(rad);
    gs_free(p);
    return k;
}

/* First m Taylor coefficients of N at c (complete Horner scheme) */
static void taylor_num(ldc *g, int m, const gs_tfn *h, ldc c)
{
    int n = h->num_deg;
    ldc *b = gs_malloc((size_t)(n + 1) * sizeof *b);
    for (int k = 0; k <= n; k++)
        b[k] = h->num[k];
    for (int r = 0; r < m; r++) {
        for (int k = n - 1; k >= r; k--)
            b[k] += c * b[k + 1];
        g[r] = r <= n ? b[r] : 0;
    }
    gs_free(b);
}

/* g *= series of (d + t)^(-q), truncated to m terms */
static void mul_inverse_power(ldc *g, ldc *tmp, int m, ldc d, int q)
{
    ldc inv = 1 / d, s = 1;
    for (int i = 0; i < q; i++)
        s *= inv;
    for (int r = 0; r < m; r++)
        tmp[r] = 0;
    for (int j = 0; j < m; j++) {   /* s = binom(-q, j) d^(-q-j) */
        for (int r = j; r < m; r++)
            tmp[r] += g[r - j] * s;
        s *= -(long double)(q + j) / (j + 1) * inv;
    }
    memcpy(g, tmp, (size_t)m * sizeof *g);
}

/* c[l], the coefficient of 1/(s - p)^(l+1), for cluster k */
static void residues(ldc *c, const cluster *cl, int ncl, int k,
                     const gs_tfn *h)
{
    int m = cl[k].m;
    ldc *g = gs_malloc((size_t)m * sizeof *g);
    ldc *tmp = gs_malloc((size_t)m * sizeof *tmp);

    taylor_num(g, m, h, cl[k].c);
    for (int r = 0; r < m; r++)
        g[r] /= h->den[h->den_deg];
    for (int j = 0; j < ncl; j++)
        if (j != k)
            mul_inverse_power(g, tmp, m, cl[k].c - cl[j].c, cl[j].m);
    for (int l = 0; l < m; l++)
        c[l] = g[m - 1 - l];
    gs_free(tmp);
    gs_free(g);
}

static void time_scales(gs_step *s, const cluster *cl, int ncl)
{
    long double lo = INFINITY, hi = 0;
    for (int k = 0; k < ncl; k++) {
        long double a = cabsl(cl[k].c);
        if (a > 0) {
            lo = fminl(lo, a);
            hi = fmaxl(hi, a);
        }
    }
    s->t_fast = hi > 0 ? 1 / hi : 1;
    s->t_slow = hi > 0 ? 1 / lo : 1;
}

int gs_step_init(gs_step *s, const gs_tfn *h)
{
    cluster *cl;
    int ncl, total = 0;

    memset(s, 0, sizeof *s);
    if (h->num_deg > h->den_deg)
        return GS_ERANGE;
    ncl = group_poles(&cl, h);
    for (int k = 0; k < ncl; k++)
        total += cl[k].m;
    s->coef = gs_malloc((size_t)total * sizeof *s->coef);
    s->terms = gs_malloc((size_t)ncl * sizeof *s->terms);
    total = 0;
    for (int k = 0; k < ncl; k++) {
        if (cl[k].half < 0)
            continue;               /* its conjugate stands for it */
        gs_pf_term *t = &s->terms[s->nterms++];
        t->p = cl[k].c;
        t->mult = cl[k].m;
        t->pair = cl[k].half > 0;
        t->c = s->coef + total;
        total += cl[k].m;
        residues(t->c, cl, ncl, k, h);
    }
    s->direct = h->num_deg == h->den_deg && h->num_deg >= 0
                ? h->num[h->num_deg] / h->den[h->den_deg] : 0;
    s->dc_gain = gs_tfn_dc_gain(h);
    s->stability = gs_tfn_stability(h);
    time_scales(s, cl, ncl);
    gs_free(cl);
    return GS_OK;
}

void gs_step_clear(gs_step *s)
{
    gs_free(s->terms);
    gs_free(s->coef);
    memset(s, 0, sizeof *s);
}

/* sum_{j} c_{i+j} t^j / j!: the i-th derivative of the term's
   polynomial factor P(t) = sum_l c_l t^l / l! */
static ldc poly_deriv(const gs_pf_term *tm, int i, long double t)
{
    ldc acc = 0;
    for (int l = tm->mult - 1; l >= i; l--)
        acc = tm->c[l] + acc * t / (l - i + 1);
    return acc;
}

/* d^ord/dt^ord of P(t) e^(pt) = e^(pt) sum_i binom(ord,i) p^(ord-i) P^(i) */
static long double term_value(const gs_pf_term *tm, long double t, int ord)
{
    static const int binom[3][3] = {{1, 0, 0}, {1, 1, 0}, {1, 2, 1}};
    ldc sum = 0, pw[3] = {1, tm->p, tm->p * tm->p};
    for (int i = 0; i <= ord; i++)
        sum += binom[ord][i] * pw[ord - i] * poly_deriv(tm, i, t);
    long double re = creall(tm->p) * t, im = cimagl(tm->p) * t;
    ldc e = im == 0 ? expl(re) : expl(re) * gs_cmplxl(cosl(im), sinl(im));
    long double v = creall(sum * e);
    return tm->pair ? 2 * v : v;
}

/* The ord-th derivative of y at t; *size (may be NULL) gets the sum of
   the terms' magnitudes, which bounds the rounding error of the sum. */
static long double eval_size(const gs_step *s, long double t, int ord,
                             long double *size)
{
    long double y = 0, a = 0;
    for (int k = 0; k < s->nterms; k++) {
        long double v = term_value(&s->terms[k], t, ord);
        y += v;
        a += fabsl(v);
    }
    if (size != NULL)
        *size = a;
    return y;
}

static long double eval_ord(const gs_step *s, long double t, int ord)
{
    return eval_size(s, t, ord, NULL);
}

long double gs_step_eval(const gs_step *s, long double t)
{
    return eval_ord(s, t, 0);
}

long double gs_step_impulse(const gs_step *s, long double t)
{
    return eval_ord(s, t, 1);
}

/* Bound on the size of term k at t: w sum |c_l| t^l/l! e^(Re p t) */
static long double term_bound(const gs_pf_term *tm, long double t)
{
    long double acc = 0;
    for (int l = tm->mult - 1; l >= 0; l--)
        acc = cabsl(tm->c[l]) + acc * t / (l + 1);
    return (tm->pair ? 2 : 1) * acc * expl(creall(tm->p) * t);
}

/* The transients' bound: all terms but the one at s = 0 */
static long double transient_bound(const gs_step *s, long double t)
{
    long double b = 0;
    for (int k = 0; k < s->nterms; k++)
        if (s->terms[k].p != 0)
            b += term_bound(&s->terms[k], t);
    return b;
}

/* A time past which the transients stay below tol (stable H only) */
static long double settle_bound(const gs_step *s, long double tol,
                                long double grow)
{
    long double t = s->t_slow;
    for (int k = 0; k < s->nterms; k++)
        if (s->terms[k].p != 0)
            t = fmaxl(t, s->terms[k].mult / -creall(s->terms[k].p));
    for (int i = 0; i < 2000 && transient_bound(s, t) > tol; i++)
        t *= grow;
    return t;
}

long double gs_step_span(const gs_step *s)
{
    if (s->stability != GS_STABLE)
        return 10 * s->t_slow;
    long double scale = fmaxl(fabsl(s->dc_gain), transient_bound(s, 0));
    if (scale == 0)
        return 10 * s->t_slow;
    return settle_bound(s, 1e-3L * scale, 1.1L);
}

int gs_step_table(long double *t, long double *y, long double *imp,
                  size_t n, const gs_step *s, long double t_end)
{
    if (n < 2 || !(t_end > 0) || !isfinite(t_end))
        return GS_EINVAL;
    for (size_t i = 0; i < n; i++) {
        long double ti = t_end * (long double)i / (long double)(n - 1);
        if (t != NULL)
            t[i] = ti;
        if (y != NULL)
            y[i] = gs_step_eval(s, ti);
        if (imp != NULL)
            imp[i] = gs_step_impulse(s, ti);
    }
    return GS_OK;
}

int gs_step_write_csv(FILE *out, const gs_step *s, long double t_end,
                      size_t n)
{
    if (n < 2 || !(t_end > 0) || !isfinite(t_end))
        return GS_EINVAL;
    fputs("time_s,step,impulse_per_s\n", out);
    for (size_t i = 0; i < n; i++) {
        long double t = t_end * (long double)i / (long double)(n - 1);
        fprintf(out, "%.10Lg,%.10Lg,%.10Lg\n", t, gs_step_eval(s, t),
                gs_step_impulse(s, t));
    }
    return ferror(out) ? GS_EIO : GS_OK;
}

/* --- Metrics ------------------------------------------------------------

   The scan samples y on a grid, adds every extremum of y (a sign change
   of y' between grid points, located by bisection), and so knows that y
   is monotone between consecutive samples: a level crossing then lies
   between the two samples that straddle it, and one bisection finds it.
   Only two extrema within one grid step could hide from it, and the grid
   takes OSC_STEPS points a period of the fastest live oscillation. */

enum { F_LEVEL, F_SLOPE, F_BAND };

/* What to bisect on, with y normalised by the final value yf */
static long double fval(const gs_step *s, long double t, int what,
                        long double yf, long double level)
{
    if (what == F_SLOPE)
        return eval_ord(s, t, 1) / yf;
    long double y = eval_ord(s, t, 0) / yf;
    return what == F_LEVEL ? y - level : fabsl(y - 1) - level;
}

/* Bisection for the sign change of fval on [a, b] */
static long double bisect(const gs_step *s, long double a, long double b,
                          int what, long double yf, long double level)
{
    long double fa = fval(s, a, what, yf, level);
    for (int i = 0; i < 200 && b - a > 2 * LDBL_EPSILON * b; i++) {
        long double mid = a + (b - a) / 2, fm = fval(s, mid, what, yf, level);
        if ((fm < 0) == (fa < 0)) {
            a = mid;
            fa = fm;
        } else {
            b = mid;
        }
    }
    return a + (b - a) / 2;
}

/* The grid step at t: logarithmic, and OSC_STEPS a period of every
   oscillation still above LIVE */
static long double grid_step(const gs_step *s, long double t, long double yf)
{
    long double dt = t * GROW;
    for (int k = 0; k < s->nterms; k++) {
        const gs_pf_term *tm = &s->terms[k];
        long double w = fabsl(cimagl(tm->p));
        if (w > 0 && term_bound(tm, t) > LIVE * fabsl(yf))
            dt = fminl(dt, 2 * PI_L / w / OSC_STEPS);
    }
    return dt;
}

/* The scan's state: brackets of the events still to be located */
typedef struct scan {
    long double t0, y0;                     /* the previous sample */
    long double t10a, t10b, t90a, t90b;     /* brackets; a < 0: none yet */
    long double ymax, tmax;                 /* largest sample */
    long double out_a, out_b;               /* last sample out of the 1 %
                                               band, and the next one */
    int out_open;
} scan;

static void scan_point(scan *sc, long double t, long double y)
{
    if (sc->t10a < 0 && sc->y0 < 0.1L && y >= 0.1L) {
        sc->t10a = sc->t0;
        sc->t10b = t;
    }
    if (sc->t90a < 0 && sc->y0 < 0.9L && y >= 0.9L) {
        sc->t90a = sc->t0;
        sc->t90b = t;
    }
    if (y > sc->ymax) {
        sc->ymax = y;
        sc->tmax = t;
    }
    if (sc->out_open) {
        sc->out_b = t;
        sc->out_open = 0;
    }
    if (fabsl(y - 1) > 0.01L) {
        sc->out_a = t;
        sc->out_open = 1;
    }
    sc->t0 = t;
    sc->y0 = y;
}

static void scan_start(scan *sc, long double y)
{
    *sc = (scan){0, y, -1, -1, -1, -1, y, 0, -1, -1, 0};
    if (y >= 0.1L)
        sc->t10a = sc->t10b = 0;
    if (y >= 0.9L)
        sc->t90a = sc->t90b = 0;
    if (fabsl(y - 1) > 0.01L) {
        sc->out_a = 0;
        sc->out_open = 1;
    }
}

/* y'(t) / yf, set to 0 when it is below the rounding error of its sum:
   the sign of such a slope means nothing. */
static long double slope(const gs_step *s, long double t, long double yf)
{
    long double size, d = eval_size(s, t, 1, &size);
    return fabsl(d) <= 64 * LDBL_EPSILON * size ? 0 : d / yf;
}

static int run_scan(scan *sc, const gs_step *s, long double yf,
                    long double t_end)
{
    long double t = 0, d = slope(s, 0, yf);
    long count = 0;

    scan_start(sc, gs_step_eval(s, 0) / yf);
    while (t < t_end) {
        long double nt = t == 0 ? 1e-3L * s->t_fast
                                : t + grid_step(s, t, yf);
        nt = fminl(nt, t_end);
        long double nd = slope(s, nt, yf);
        if ((d < 0 && nd > 0) || (d > 0 && nd < 0)) {
            long double te = bisect(s, t, nt, F_SLOPE, yf, 0);
            scan_point(sc, te, gs_step_eval(s, te) / yf);
        }
        scan_point(sc, nt, gs_step_eval(s, nt) / yf);
        t = nt;
        d = nd;
        if (++count > MAX_POINTS)
            return GS_EBUDGET;
    }
    return GS_OK;
}

static void locate(gs_step_metrics *m, const scan *sc, const gs_step *s,
                   long double yf)
{
    if (sc->t10a >= 0 && sc->t90a >= 0) {
        m->has_rise = 1;
        m->t10 = sc->t10b == 0 ? 0 : bisect(s, sc->t10a, sc->t10b, F_LEVEL,
                                             yf, 0.1L);
        m->t90 = sc->t90b == 0 ? 0 : bisect(s, sc->t90a, sc->t90b, F_LEVEL,
                                             yf, 0.9L);
        m->rise_time = m->t90 - m->t10;
    }
    m->has_overshoot = 1;
    m->peak_value = yf;
    if (sc->ymax > 1) {
        m->peak_time = sc->tmax;
        m->peak_value = gs_step_eval(s, sc->tmax);
        m->overshoot_pct = 100 * (m->peak_value / yf - 1);
    }
    m->has_settling = !sc->out_open;
    if (sc->out_a >= 0 && !sc->out_open)
        m->settling_time = bisect(s, sc->out_a, sc->out_b, F_BAND, yf, 0.01L);
}

int gs_step_measure(gs_step_metrics *m, const gs_step *s)
{
    scan sc;

    memset(m, 0, sizeof *m);
    if (s->stability != GS_STABLE)
        return GS_OK;
    m->has_final = 1;
    m->final_value = s->dc_gain;
    if (s->dc_gain == 0)
        return GS_OK;
    long double t_end = settle_bound(s, TAIL * fabsl(s->dc_gain), 1.5L);
    int rc = run_scan(&sc, s, s->dc_gain, t_end);
    if (rc != GS_OK)
        return rc;
    locate(m, &sc, s, s->dc_gain);
    return GS_OK;
}
