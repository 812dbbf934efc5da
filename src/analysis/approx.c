/* approx.c - short symbolic forms with a measured error. See LICENSE.
 *
 * Simplification after generation (Fernandez, Rodriguez-Vazquez,
 * Huertas, "Interactive AC modeling and characterization of analog
 * circuits via symbolic analysis", Analog Integrated Circuits and Signal
 * Processing 1, 1991; Wambacq, Gielen, Sansen, "Symbolic network analysis
 * methods for practical analog integrated circuits: a survey", IEEE TCAS
 * II 45(10), 1998): the terms of each coefficient of s are ranked by
 * magnitude at the nominal point and cut at a relative size eps; eps runs
 * down a fixed ladder and the first rung whose measured error meets the
 * tolerance is taken.  Because the ladder is fixed, a tighter tolerance
 * can only take a later rung, whose error is within the tighter
 * tolerance: tightening never gives a larger error.  The last rung keeps
 * every term, which is the exact H.
 */
#include "analysis/approx.h"

#include "analysis/derive.h"
#include "base/mem.h"
#include "numeric/roots.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define RUNGS 64                /* eps = 10^(-(i+1)/4), i < RUNGS, then 0 */
#define SEP_MIN 4.0L            /* separation needed for an estimate */
#define MAX_CORNER_SYMS 6       /* up to 2^6 corners; else seeded points */
#define SEEDED_POINTS 32
#define MAX_COND 12
#define FACTOR_MAX_TERMS 8      /* terms of a factor's form in s, at most */

static const long double PI_L = 3.141592653589793238462643383279502884L;

/* ---- terms table ---------------------------------------------------- */

void gs_approx_terms_init(gs_approx_terms *t)
{
    memset(t, 0, sizeof *t);
}

static void graph_coefs(long double **cn, int *dn, long double **cd,
                        int *dd, const long double *vals, void *arg);

void gs_approx_terms_clear(gs_approx_terms *t)
{
    int w, k;
    size_t i;
    if (t->coefs == graph_coefs)
        gs_free(t->coefs_arg);     /* the graph producer's, owned */
    for (w = 0; w < 2; w++) {
        for (k = 0; t->c[w] && k < t->ncoef[w]; k++) {
            for (i = 0; i < t->c[w][k].nterms; i++)
                gs_poly_clear(&t->c[w][k].terms[i]);
            gs_free(t->c[w][k].terms);
            gs_free(t->c[w][k].mag);
        }
        gs_free(t->c[w]);
    }
    gs_approx_terms_init(t);
}

typedef struct ranked {
    long double mag;
    size_t idx;
} ranked;

static int cmp_ranked(const void *a, const void *b)
{
    const ranked *x = a, *y = b;
    if (x->mag != y->mag)
        return x->mag > y->mag ? -1 : 1;
    return x->idx < y->idx ? -1 : x->idx > y->idx;   /* canonical order */
}

static void fill_coeff(gs_approx_coeff *c, const gs_poly *p,
                       const long double *vals, const gs_polyctx *ctx)
{
    size_t i, n = p->length;
    ranked *r = gs_calloc(n ? n : 1, sizeof *r);
    unsigned *e = gs_calloc((size_t)ctx->nvars + 1, sizeof *e);
    for (i = 0; i < n; i++) {
        gs_poly t;
        gs_poly_init(&t);
        gs_poly_get_term_exps(e, p, i, ctx);
        gs_poly_set_term(&t, &p->coeffs[i], e, ctx);
        r[i].mag = fabsl(gs_poly_eval_ld(&t, vals, ctx));
        r[i].idx = i;
        gs_poly_clear(&t);
    }
    qsort(r, n, sizeof *r, cmp_ranked);
    c->nterms = n;
    c->terms = gs_calloc(n ? n : 1, sizeof *c->terms);
    c->mag = gs_calloc(n ? n : 1, sizeof *c->mag);
    c->rest = 0;
    for (i = 0; i < n; i++) {
        gs_poly_init(&c->terms[i]);
        gs_poly_get_term_exps(e, p, r[i].idx, ctx);
        gs_poly_set_term(&c->terms[i], &p->coeffs[r[i].idx], e, ctx);
        c->mag[i] = r[i].mag;
    }
    gs_free(e);
    gs_free(r);
}

void gs_approx_terms_from_tf(gs_approx_terms *t, const gs_tf *tf,
                             const long double *vals)
{
    const gs_poly *pw[2];
    int w, k;
    pw[0] = &tf->num;
    pw[1] = &tf->den;
    gs_approx_terms_init(t);
    for (w = 0; w < 2; w++) {
        long deg = gs_poly_degree(pw[w], tf->s_var, tf->ctx);
        size_t n = deg < 0 ? 1 : (size_t)deg + 1;
        gs_poly *co = gs_calloc(n, sizeof *co);
        for (k = 0; k < (int)n; k++)
            gs_poly_init(&co[k]);
        if (deg >= 0)
            gs_poly_coeffs_var(co, n, pw[w], tf->s_var, tf->ctx);
        t->ncoef[w] = (int)n;
        t->c[w] = gs_calloc(n, sizeof *t->c[w]);
        for (k = 0; k < (int)n; k++) {
            fill_coeff(&t->c[w][k], &co[k], vals, tf->ctx);
            gs_poly_clear(&co[k]);
        }
        gs_free(co);
    }
    t->complete = 1;
    t->path = "exact expansion";
}

/* ---- terms from the graph of minors ---------------------------------- */

typedef struct graph_arg {
    const gs_mgraph *g;
    int s_var, low;             /* low: the power of s common to N and D */
} graph_arg;

static void graph_coefs(long double **cn, int *dn, long double **cd,
                        int *dd, const long double *vals, void *arg)
{
    const graph_arg *a = arg;
    int k;
    gs_mgraph_coeffs_ld(cn, dn, cd, dd, a->g, a->s_var, vals);
    for (k = a->low; k <= *dn; k++)
        (*cn)[k - a->low] = (*cn)[k];
    for (k = a->low; k <= *dd; k++)
        (*cd)[k - a->low] = (*cd)[k];
    *dn = *dn >= a->low ? *dn - a->low : -1;
    *dd = *dd >= a->low ? *dd - a->low : -1;
}

/* Coefficient c from the dominant terms of s^power of root, each term's
   integer coefficient multiplied by mul and its s taken off. */
static int fill_from_graph(gs_approx_coeff *c, const gs_mgraph *g,
                           size_t root, int s_var, int power,
                           const long double *vals, long double gen_tol,
                           size_t max_terms, const gs_int *mul,
                           int *overflow, int *budget)
{
    const gs_polyctx *ctx = g->ctx;
    gs_mgraph_terms mt;
    unsigned *e = gs_calloc((size_t)ctx->nvars + 1, sizeof *e);
    long double m = fabsl(gs_int_get_ld(mul));
    gs_int cf;
    size_t i;
    int complete;
    gs_mgraph_dominant(&mt, g, root, s_var, power, vals, gen_tol, max_terms);
    if (mt.overflow && !*overflow)
        *overflow = mt.overflow;
    *budget |= mt.budget;
    gs_int_init(&cf);
    c->nterms = mt.count;
    c->terms = gs_calloc(mt.count ? mt.count : 1, sizeof *c->terms);
    c->mag = gs_calloc(mt.count ? mt.count : 1, sizeof *c->mag);
    for (i = 0; i < mt.count; i++) {
        gs_poly_get_term_exps(e, &mt.term[i], 0, ctx);
        e[s_var] = 0;
        gs_int_mul(&cf, &mt.term[i].coeffs[0], mul);
        gs_poly_init(&c->terms[i]);
        gs_poly_set_term(&c->terms[i], &cf, e, ctx);
        c->mag[i] = fabsl(mt.value[i]) * m;
    }
    /* the remainder is known exactly as a number, not as a sum of
       magnitudes: |rest| stands for the bound (docs/approx.md) */
    c->rest = mt.complete ? 0 : fabsl(mt.rest) * m;
    complete = mt.complete;
    gs_int_clear(&cf);
    gs_mgraph_terms_clear(&mt);
    gs_free(e);
    return complete;
}

void gs_approx_terms_from_graph(gs_approx_terms *t, const gs_mgraph *g,
                                int s_var, const long double *vals,
                                long double gen_tol,
                                long double *const share[2],
                                size_t max_terms)
{
    graph_arg *a = gs_calloc(1, sizeof *a);
    long double *cn, *cd;
    int dn, dd, w, k, low = 0, complete = 1;
    gs_int mul[2];
    gs_approx_terms_init(t);
    gs_mgraph_coeffs_ld(&cn, &dn, &cd, &dd, g, s_var, vals);
    while (low <= dn && low <= dd && cn[low] == 0 && cd[low] == 0)
        low++;
    a->g = g;
    a->s_var = s_var;
    a->low = low;
    gs_int_init(&mul[0]);
    gs_int_init(&mul[1]);
    gs_int_set(&mul[0], &g->scale.num);
    gs_int_set(&mul[1], &g->scale.den);
    for (w = 0; w < 2; w++) {
        int deg = (w ? dd : dn) - low;
        size_t root = w ? g->root_d : g->root_n;
        int n = deg < 0 ? 1 : deg + 1;
        t->ncoef[w] = n;
        t->c[w] = gs_calloc((size_t)n, sizeof *t->c[w]);
        for (k = 0; k <= deg; k++) {
            long double sh = share && share[w] ? share[w][k] : 1, tk;
            tk = sh > 0 ? gen_tol / sh : 1;
            complete &= fill_from_graph(&t->c[w][k], g, root, s_var,
                                        k + low, vals, tk < 1 ? tk : 1,
                                        max_terms, &mul[w], &t->overflow,
                                        &t->budget);
        }
        if (deg < 0) {
            t->c[w][0].terms = gs_calloc(1, sizeof *t->c[w][0].terms);
            t->c[w][0].mag = gs_calloc(1, sizeof *t->c[w][0].mag);
        }
    }
    gs_int_clear(&mul[0]);
    gs_int_clear(&mul[1]);
    gs_free(cn);
    gs_free(cd);
    t->complete = complete;
    t->path = "graph of minors";
    t->coefs = graph_coefs;
    t->coefs_arg = a;
}

/* ---- options and result --------------------------------------------- */

void gs_approx_opts_default(gs_approx_opts *o)
{
    o->tol_db = 0.1L;
    o->tol_deg = 1.0L;
    o->f_lo = o->f_hi = 0;
    o->spread = 0.2L;
    o->per_decade = 60;
}

void gs_approx_result_init(gs_approx_result *r)
{
    memset(r, 0, sizeof *r);
    gs_poly_init(&r->dcn);
    gs_poly_init(&r->dcd);
}

void gs_approx_result_clear(gs_approx_result *r)
{
    size_t i;
    if (r->ctx) {
        gs_tf_clear(&r->h);
    } else {
        /* a run that stopped before its form (an error): only the
           labels that gs_approx_run set after it are held */
        gs_free(r->h.name);
        gs_free(r->h.description);
    }
    gs_poly_clear(&r->dcn);
    gs_poly_clear(&r->dcd);
    for (i = 0; i < r->nroots; i++) {
        gs_poly_clear(&r->roots[i].wn);
        gs_poly_clear(&r->roots[i].wd);
        gs_poly_clear(&r->roots[i].a0);
        gs_poly_clear(&r->roots[i].a1);
        gs_poly_clear(&r->roots[i].a2);
    }
    gs_free(r->roots);
    for (i = 0; i < r->ncond; i++) {
        gs_free(r->cond[i].lhs);
        gs_free(r->cond[i].rhs);
        gs_poly_clear(&r->cond[i].pl);
        gs_poly_clear(&r->cond[i].pr);
    }
    gs_free(r->cond);
    memset(r, 0, sizeof *r);
    gs_poly_init(&r->dcn);
    gs_poly_init(&r->dcd);
}

/* ---- sampling ------------------------------------------------------- */

/* The working state of one run: sample points (nominal first, then the
   spread box), the frequency grid, every term's value at every point as
   prefix sums, and the reference H. */
typedef struct work {
    const gs_approx_terms *t;
    const gs_polyctx *ctx;
    int np, ng;
    long double *pts;           /* np * nvars values */
    long double *w;             /* ng angular frequencies */
    long double *cum[2];        /* per coefficient block: prefix sums */
    size_t *off[2];             /* offset of coefficient k's block */
    long double complex *ref;   /* np * ng reference values */
    int bad_ref;
    long double *ex[2];         /* np * ncoef exact coefficients at each
                                   point (t->coefs), else NULL */
} work;

static uint64_t lcg(uint64_t *st)
{
    /* Knuth, TAOCP vol. 2, 3.3.4: MMIX multiplier */
    *st = *st * 6364136223846793005ULL + 1442695040888963407ULL;
    return *st >> 33;
}

static void make_points(work *wk, gs_approx_result *r,
                        const long double *vals, const unsigned char *used,
                        int s_var, long double spread)
{
    int nv = wk->ctx->nvars, v, ns = 0, p, corners;
    int *sym = gs_calloc((size_t)nv + 1, sizeof *sym);
    uint64_t st = 20260101;
    for (v = 0; v < nv; v++)
        if (used[v] && v != s_var)
            sym[ns++] = v;
    corners = ns <= MAX_CORNER_SYMS;
    wk->np = 1 + (spread > 0 && ns > 0
                  ? (corners ? 1 << ns : SEEDED_POINTS) : 0);
    r->nspread = wk->np - 1;
    r->spread_corners = corners;
    wk->pts = gs_calloc((size_t)wk->np * (size_t)(nv ? nv : 1),
                        sizeof *wk->pts);
    for (p = 0; p < wk->np; p++) {
        long double *x = wk->pts + (size_t)p * (size_t)nv;
        int i;
        memcpy(x, vals, (size_t)nv * sizeof *x);
        if (p == 0)
            continue;
        for (i = 0; i < ns; i++) {
            int up = corners ? ((p - 1) >> i) & 1 : (int)(lcg(&st) & 1);
            x[sym[i]] = vals[sym[i]] * (up ? 1 + spread : 1 - spread);
        }
        /* terms from the graph hold 1/R: it follows R */
        if (wk->t->coefs)
            gs_mgraph_fill_recips(x, wk->ctx->syms, nv);
    }
    gs_free(sym);
}

static void make_cum(work *wk)
{
    int w, k, p, nv = wk->ctx->nvars;
    for (w = 0; w < 2; w++) {
        size_t total = 0;
        wk->off[w] = gs_calloc((size_t)wk->t->ncoef[w] + 1,
                               sizeof *wk->off[w]);
        for (k = 0; k < wk->t->ncoef[w]; k++) {
            wk->off[w][k] = total;
            total += wk->t->c[w][k].nterms * (size_t)wk->np;
        }
        wk->off[w][k] = total;
        wk->cum[w] = gs_calloc(total ? total : 1, sizeof *wk->cum[w]);
        for (k = 0; k < wk->t->ncoef[w]; k++) {
            const gs_approx_coeff *c = &wk->t->c[w][k];
            size_t i;
            for (i = 0; i < c->nterms; i++)
                for (p = 0; p < wk->np; p++) {
                    long double v = gs_poly_eval_ld(&c->terms[i],
                        wk->pts + (size_t)p * (size_t)nv, wk->ctx);
                    size_t at = wk->off[w][k] + i * (size_t)wk->np
                                + (size_t)p;
                    wk->cum[w][at] = v + (i ? wk->cum[w][at - (size_t)wk->np] : 0);
                }
        }
    }
}

/* Coefficient k of N (w = 0) or D (w = 1) at point p keeping m terms. */
static long double coef(const work *wk, int w, int k, size_t m, int p)
{
    if (m == 0)
        return 0;
    return wk->cum[w][wk->off[w][k] + (m - 1) * (size_t)wk->np
                      + (size_t)p];
}

/* The exact coefficient k of N or D at point p: from the producer when
   the table is not every term, else the sum of every listed term. */
static long double exact_coef(const work *wk, int w, int k, int p)
{
    if (wk->ex[w])
        return wk->ex[w][(size_t)p * (size_t)wk->t->ncoef[w] + (size_t)k];
    return coef(wk, w, k, wk->t->c[w][k].nterms, p);
}

static void make_exact(work *wk)
{
    int w, p, k;
    if (!wk->t->coefs)
        return;
    for (w = 0; w < 2; w++)
        wk->ex[w] = gs_calloc((size_t)wk->np * (size_t)wk->t->ncoef[w] + 1,
                              sizeof *wk->ex[w]);
    for (p = 0; p < wk->np; p++) {
        long double *c[2];
        int d[2];
        wk->t->coefs(&c[0], &d[0], &c[1], &d[1],
                     wk->pts + (size_t)p * (size_t)wk->ctx->nvars,
                     wk->t->coefs_arg);
        for (w = 0; w < 2; w++) {
            for (k = 0; k <= d[w] && k < wk->t->ncoef[w]; k++)
                wk->ex[w][(size_t)p * (size_t)wk->t->ncoef[w] + (size_t)k] =
                    c[w][k];
            gs_free(c[w]);
        }
    }
}

/* The exact H at point p, from the exact coefficients. */
static long double complex exact_h(const work *wk, int p, long double omega)
{
    long double complex s = gs_cmplxl(0, omega), nv = 0, dv = 0;
    int k;
    for (k = wk->t->ncoef[0] - 1; k >= 0; k--)
        nv = nv * s + exact_coef(wk, 0, k, p);
    for (k = wk->t->ncoef[1] - 1; k >= 0; k--)
        dv = dv * s + exact_coef(wk, 1, k, p);
    return nv / dv;
}

/* keep[w][k]: terms kept of each coefficient (0 drops the power). */
static long double complex eval_h(const work *wk, size_t *const keep[2],
                                  int p, long double omega)
{
    long double complex s = gs_cmplxl(0, omega), nv = 0, dv = 0;
    int k;
    for (k = wk->t->ncoef[0] - 1; k >= 0; k--)
        nv = nv * s + coef(wk, 0, k, keep[0][k], p);
    for (k = wk->t->ncoef[1] - 1; k >= 0; k--)
        dv = dv * s + coef(wk, 1, k, keep[1][k], p);
    return nv / dv;
}

static void errors_of(long double *db, long double *deg,
                      long double complex ha, long double complex h)
{
    long double complex q;
    if (ha == h) {          /* the same sums: exactly no error */
        *db = *deg = 0;
        return;
    }
    q = ha / h;
    if (!isfinite(creall(q)) || !isfinite(cimagl(q)) || q == 0) {
        *db = *deg = INFINITY;
        return;
    }
    *db = fabsl(20 * log10l(cabsl(q)));
    *deg = fabsl(cargl(q)) * 180 / PI_L;
}

typedef struct errs {
    long double db, deg, sdb, sdeg;
} errs;

/* Measure keep against the reference; stop early once the tolerance is
   exceeded when stop is set (the candidate is rejected then). */
static int measure(errs *e, const work *wk, size_t *const keep[2],
                   const gs_approx_opts *o, int stop)
{
    int p, g;
    memset(e, 0, sizeof *e);
    for (p = 0; p < wk->np; p++)
        for (g = 0; g < wk->ng; g++) {
            long double db, deg;
            long double complex ha = eval_h(wk, keep, p, wk->w[g]);
            errors_of(&db, &deg, ha,
                      wk->ref[(size_t)p * (size_t)wk->ng + (size_t)g]);
            if (p == 0) {
                if (db > e->db) e->db = db;
                if (deg > e->deg) e->deg = deg;
            } else {
                if (db > e->sdb) e->sdb = db;
                if (deg > e->sdeg) e->sdeg = deg;
            }
            if (!(db <= o->tol_db && deg <= o->tol_deg) && stop)
                return 0;
        }
    return e->db <= o->tol_db && e->deg <= o->tol_deg
        && e->sdb <= o->tol_db && e->sdeg <= o->tol_deg;
}

/* The band: given, or from the roots at the nominal point (docs/approx.md):
   from a thirtieth of the smallest root to ten times the last frequency
   where |H| >= 1 when H has gain, else thirty times the largest root. */
static void pick_band(long double *flo, long double *fhi, const work *wk,
                      const long double complex *rt,
                      int nrt, const gs_approx_opts *o)
{
    long double wmin = INFINITY, wmax = 0, lo, hi, f, unity = 0;
    int i;
    for (i = 0; i < nrt; i++) {
        long double m = cabsl(rt[i]);
        if (m > 0 && isfinite(m)) {
            if (m < wmin) wmin = m;
            if (m > wmax) wmax = m;
        }
    }
    if (o->f_lo > 0 && o->f_hi > o->f_lo) {
        *flo = o->f_lo;
        *fhi = o->f_hi;
        return;
    }
    if (wmax == 0) {
        *flo = 1;
        *fhi = 1e6L;
        return;
    }
    lo = wmin / (2 * PI_L) / 30;
    hi = wmax / (2 * PI_L) * 30;
    for (f = lo; f <= hi * 30; f *= 1.0471285480508996L)   /* 50/decade */
        if (cabsl(exact_h(wk, 0, 2 * PI_L * f)) >= 1)
            unity = f;
    if (unity > 0 && unity < hi * 30)
        hi = 10 * unity;
    if (hi < 10 * lo)
        hi = 10 * lo;
    *flo = o->f_lo > 0 ? o->f_lo : lo;
    *fhi = o->f_hi > 0 ? o->f_hi : hi;
    if (*fhi <= *flo)
        *fhi = 10 * *flo;
}

/* ---- the rungs ------------------------------------------------------ */

/* Terms kept per coefficient for a relative cut eps (at least one term of
   each nonzero coefficient), before powers are dropped. */
static void cut(size_t *keep, const gs_approx_coeff *c, int n,
                long double eps)
{
    int k;
    for (k = 0; k < n; k++) {
        long double total = c[k].rest, tail = c[k].rest;
        size_t m, i;
        for (i = 0; i < c[k].nterms; i++)
            total += c[k].mag[i];
        m = c[k].nterms;
        while (m > 1 && tail + c[k].mag[m - 1] <= eps * total) {
            tail += c[k].mag[m - 1];
            m--;
        }
        keep[k] = m;
    }
}

/* Drop the powers whose largest share of the polynomial over the band,
   |a_k| w^k / max_j |a_j| w^j at the nominal point, stays below eps. */
static void drop_powers(size_t *keep, const work *wk, int w, long double eps)
{
    int k, g, n = wk->t->ncoef[w];
    for (k = 0; k < n; k++) {
        long double share = 0;
        if (keep[k] == 0)
            continue;
        for (g = 0; g < wk->ng; g += 4) {
            long double big = 0, mine = 0;
            int j;
            for (j = 0; j < n; j++) {
                long double v = fabsl(exact_coef(wk, w, j, 0))
                                * powl(wk->w[g], j);
                if (v > big) big = v;
                if (j == k) mine = v;
            }
            if (big > 0 && mine / big > share)
                share = mine / big;
        }
        if (share <= eps)
            keep[k] = 0;
    }
}

/* ---- the simplified H, conditions ----------------------------------- */

static void build_poly(gs_poly *r, const gs_approx_coeff *c, int n,
                       const size_t *keep, int s_var, const gs_polyctx *ctx)
{
    gs_poly sk, t;
    int k;
    size_t i;
    gs_poly_init(&sk);
    gs_poly_init(&t);
    gs_poly_zero(r);
    for (k = 0; k < n; k++) {
        gs_poly_set_var(&sk, s_var, (unsigned)k, ctx);
        for (i = 0; i < keep[k]; i++) {
            gs_poly_mul(&t, &c[k].terms[i], &sk, ctx);
            gs_poly_add(r, r, &t, ctx);
        }
    }
    gs_poly_clear(&sk);
    gs_poly_clear(&t);
}

static void sum_terms(gs_poly *r, const gs_approx_coeff *c, size_t m,
                      const gs_polyctx *ctx)
{
    size_t i;
    gs_poly_zero(r);
    for (i = 0; i < m; i++)
        gs_poly_add(r, r, &c->terms[i], ctx);
}

static int cmp_cond(const void *a, const void *b)
{
    const gs_approx_cond *x = a, *y = b;
    int c;
    if (x->value != y->value)
        return x->value < y->value ? -1 : 1;
    c = strcmp(x->lhs, y->lhs);
    return c ? c : strcmp(x->rhs, y->rhs);
}

static void conditions(gs_approx_result *r, const gs_approx_terms *t,
                       size_t *const keep[2], const gs_polyctx *ctx)
{
    size_t cap = 16, n = 0, i, j;
    gs_approx_cond *cd = gs_calloc(cap, sizeof *cd);
    int w, k;
    for (w = 0; w < 2; w++)
        for (k = 0; k < t->ncoef[w]; k++) {
            const gs_approx_coeff *c = &t->c[w][k];
            if (keep[w][k] == 0)
                continue;
            for (i = keep[w][k]; i < c->nterms; i++) {
                gs_approx_cond x;
                int dup = 0;
                gs_poly_init(&x.pl);
                gs_poly_init(&x.pr);
                gs_poly_set(&x.pl, &c->terms[0], ctx);
                gs_poly_set(&x.pr, &c->terms[i], ctx);
                gs_reduce_ratio(&x.pl, &x.pr, ctx->syms, ctx, 0, NULL);
                if (gs_poly_sgn(&x.pl) < 0)
                    gs_poly_neg(&x.pl, &x.pl, ctx);
                for (j = 0; j < n && !dup; j++)
                    dup = gs_poly_equal(&cd[j].pl, &x.pl, ctx)
                          && gs_poly_equal(&cd[j].pr, &x.pr, ctx);
                if (dup) {
                    gs_poly_clear(&x.pl);
                    gs_poly_clear(&x.pr);
                    continue;
                }
                x.value = c->mag[0] / c->mag[i];
                x.lhs = gs_poly_get_str(&x.pl, ctx);
                x.rhs = gs_poly_get_str(&x.pr, ctx);
                if (n == cap)
                    cd = gs_reallocarray(cd, cap *= 2, sizeof *cd);
                cd[n++] = x;
            }
        }
    qsort(cd, n, sizeof *cd, cmp_cond);
    r->ncond_total = n;
    for (i = MAX_COND; i < n; i++) {
        gs_free(cd[i].lhs);
        gs_free(cd[i].rhs);
        gs_poly_clear(&cd[i].pl);
        gs_poly_clear(&cd[i].pr);
    }
    r->ncond = n < MAX_COND ? n : MAX_COND;
    r->cond = cd;
}

/* ---- low-frequency gain --------------------------------------------- */

static int lowest(const gs_approx_terms *t, int w)
{
    int k;
    for (k = 0; k < t->ncoef[w]; k++)
        if (t->c[w][k].nterms)
            return k;
    return -1;
}

static void dc_gain(gs_approx_result *r, const work *wk,
                    const gs_approx_opts *o)
{
    const gs_approx_terms *t = wk->t;
    int kn = lowest(t, 0), kd = lowest(t, 1), i, p;
    const gs_approx_coeff *cn, *cd;
    size_t mn = 0, md = 0;
    if (kn < 0 || kd < 0) {
        gs_poly_zero(&r->dcn);
        gs_poly_set_si(&r->dcd, 1, wk->ctx);
        return;
    }
    cn = &t->c[0][kn];
    cd = &t->c[1][kd];
    for (i = 0; i <= RUNGS; i++) {
        long double eps = i < RUNGS ? powl(10, -(i + 1) / 4.0L) : 0, worst = 0;
        cut(&mn, cn, 1, eps);
        cut(&md, cd, 1, eps);
        for (p = 0; p < wk->np; p++) {
            long double g = coef(wk, 0, kn, mn, p) / coef(wk, 1, kd, md, p);
            long double x = exact_coef(wk, 0, kn, p)
                            / exact_coef(wk, 1, kd, p);
            long double e = g / x > 0 ? fabsl(20 * log10l(g / x)) : INFINITY;
            if (g == x)
                e = 0;
            if (e > worst)
                worst = e;
        }
        if (worst <= o->tol_db)
            break;
    }
    sum_terms(&r->dcn, cn, mn, wk->ctx);
    sum_terms(&r->dcd, cd, md, wk->ctx);
    gs_reduce_ratio(&r->dcn, &r->dcd, wk->ctx->syms, wk->ctx, 1, NULL);
    r->dc_order = kn - kd;
    r->dc_value = coef(wk, 0, kn, mn, 0) / coef(wk, 1, kd, md, 0);
    r->dc_exact = exact_coef(wk, 0, kn, 0) / exact_coef(wk, 1, kd, 0);
    r->dc_rel_error = r->dc_exact != 0
        ? fabsl((r->dc_value - r->dc_exact) / r->dc_exact) : 0;
}

/* ---- roots and their estimates -------------------------------------- */

/* A factor of the exact N or D of degree 1 or 2 in s: its coefficients
   and its root at the nominal point (for degree 2 the one with positive
   imaginary part; only complex pairs are kept). */
typedef struct sfactor {
    gs_poly c[3];
    int deg;
    long double complex root;
    int used;
} sfactor;

/* The factors of w's exact polynomial of degree 1 or 2 in s, found by the
   multilinear split of the design-oriented forms (approx_form.c).  Their
   roots are roots of the exact polynomial, so an estimate read from them
   is exact, however close the other roots are.  Only for a complete
   table: a factor of the listed terms alone is not one of the exact
   polynomial. */
static size_t s_factors(sfactor **out, const work *wk, int w, int s_var,
                        const long double *vals)
{
    const gs_approx_terms *t = wk->t;
    const gs_polyctx *ctx = wk->ctx;
    size_t *all = gs_calloc((size_t)t->ncoef[w] + 1, sizeof *all);
    size_t nf, i, n = 0;
    gs_poly p, *f = NULL;
    int k;
    *out = NULL;
    if (!t->complete || t->ref) {
        gs_free(all);
        return 0;
    }
    for (k = 0; k < t->ncoef[w]; k++)
        all[k] = t->c[w][k].nterms;
    gs_poly_init(&p);
    build_poly(&p, t->c[w], t->ncoef[w], all, s_var, ctx);
    nf = gs_approx_factors(&f, &p, ctx);
    *out = gs_calloc(nf ? nf : 1, sizeof **out);
    for (i = 0; i < nf; i++) {
        long deg = gs_poly_degree(&f[i], s_var, ctx);
        sfactor *x = &(*out)[n];
        long double v[3], disc;
        if (deg == 1 || deg == 2) {
            for (k = 0; k < 3; k++)
                gs_poly_init(&x->c[k]);
            gs_poly_coeffs_var(x->c, (size_t)deg + 1, &f[i], s_var, ctx);
            for (k = 0; k <= deg; k++)
                v[k] = gs_poly_eval_ld(&x->c[k], vals, ctx);
            x->deg = (int)deg;
            x->used = 0;
            disc = deg == 2 ? v[1] * v[1] - 4 * v[0] * v[2] : 0;
            if (deg == 1 && v[1] != 0) {
                x->root = -v[0] / v[1];
                n++;
            } else if (deg == 2 && v[2] != 0 && disc < 0) {
                x->root = gs_cmplxl(-v[1] / (2 * v[2]),
                                    sqrtl(-disc) / (2 * fabsl(v[2])));
                n++;
            } else {
                for (k = 0; k < 3; k++)
                    gs_poly_clear(&x->c[k]);
            }
        }
        gs_poly_clear(&f[i]);
    }
    gs_free(f);
    gs_free(all);
    gs_poly_clear(&p);
    return n;
}

/* Roots r->roots[from ..] that are roots of a factor in s take the
   factor's exact form when it is short (FACTOR_MAX_TERMS: a long exact
   form is no form for a design review) and no longer than their estimate
   (or they have none); conjugates follow their pair. */
static void use_factors(gs_approx_result *r, size_t from, sfactor *f,
                        size_t nf, const gs_polyctx *ctx)
{
    size_t i, k;
    for (i = from; i < r->nroots; i++) {
        gs_approx_root *x = &r->roots[i];
        long double m = cabsl(x->exact);
        size_t len, flen;
        if (x->at_origin)
            continue;
        if (x->pair_of >= 0) {
            const gs_approx_root *y = &r->roots[x->pair_of];
            x->value = conjl(y->value);
            x->rel_error = y->rel_error;
            x->factor = y->factor;
            continue;
        }
        len = x->est == GS_APPROX_EST_REAL ? x->wn.length + x->wd.length
              : x->est == GS_APPROX_EST_PAIR
                ? x->a0.length + x->a1.length + x->a2.length : SIZE_MAX;
        for (k = 0; k < nf; k++) {
            int cplx = cimagl(x->exact) != 0;
            if (f[k].used || (f[k].deg == 2) != cplx
                || !(cabsl(f[k].root - x->exact) <= 1e-9L * m))
                continue;
            flen = f[k].c[0].length + f[k].c[1].length
                   + (f[k].deg == 2 ? f[k].c[2].length : 0);
            if (flen > len || flen > FACTOR_MAX_TERMS)
                continue;
            f[k].used = 1;
            x->factor = 1;
            if (f[k].deg == 1) {
                x->est = GS_APPROX_EST_REAL;
                gs_poly_set(&x->wn, &f[k].c[0], ctx);
                gs_poly_set(&x->wd, &f[k].c[1], ctx);
                gs_reduce_ratio(&x->wn, &x->wd, ctx->syms, ctx, 1, NULL);
            } else {
                x->est = GS_APPROX_EST_PAIR;
                gs_poly_set(&x->a0, &f[k].c[0], ctx);
                gs_poly_set(&x->a1, &f[k].c[1], ctx);
                gs_poly_set(&x->a2, &f[k].c[2], ctx);
            }
            x->value = f[k].root;
            x->rel_error = cabsl(x->value - x->exact) / m;
            break;
        }
    }
}

/* Roots of w's exact polynomial at the nominal point, appended to r. */
static void roots_of(gs_approx_result *r, const work *wk, int w,
                     const size_t *shortk, const long double *vals)
{
    const gs_approx_terms *t = wk->t;
    const gs_polyctx *ctx = wk->ctx;
    int n = t->ncoef[w], deg = n - 1, nz = 0, i, nr;
    long double *a = gs_calloc((size_t)n, sizeof *a);
    long double complex *rt = gs_calloc((size_t)n, sizeof *rt);
    gs_roots_info info;
    for (i = 0; i < n; i++)
        a[i] = exact_coef(wk, w, i, 0);
    while (deg > 0 && a[deg] == 0)
        deg--;
    if (deg < 1 || gs_roots(rt, NULL, a, deg, &info) == GS_EINVAL) {
        gs_free(a);
        gs_free(rt);
        return;
    }
    nr = info.nroots;
    nz = info.nzero;
    r->roots = gs_reallocarray(r->roots, r->nroots + (size_t)nr,
                               sizeof *r->roots);
    for (i = 0; i < nr; i++) {
        gs_approx_root *x = &r->roots[r->nroots + (size_t)i];
        long double lo = INFINITY, hi = INFINITY, m = cabsl(rt[i]);
        int cplx = cimagl(rt[i]) != 0, lowk = i, top = i + (cplx ? 2 : 1);
        memset(x, 0, sizeof *x);
        gs_poly_init(&x->wn);
        gs_poly_init(&x->wd);
        gs_poly_init(&x->a0);
        gs_poly_init(&x->a1);
        gs_poly_init(&x->a2);
        x->is_zero = w == 0;
        x->exact = rt[i];
        x->pair_of = -1;
        x->separation = INFINITY;
        if (i < nz) {
            x->at_origin = 1;
            x->value = 0;
            continue;
        }
        if (cplx && cimagl(rt[i]) < 0) {
            x->pair_of = (int)r->nroots + i - 1;
            x->value = conjl(r->roots[r->nroots + (size_t)i - 1].value);
            x->rel_error = r->roots[r->nroots + (size_t)i - 1].rel_error;
            x->separation = r->roots[r->nroots + (size_t)i - 1].separation;
            continue;
        }
        if (i > nz)
            lo = m / cabsl(rt[i - 1]);
        if (top < nr)
            hi = cabsl(rt[top]) / m;
        x->separation = lo < hi ? lo : hi;
        if (x->separation < SEP_MIN || top > deg
            || t->c[w][top].nterms == 0 || t->c[w][lowk].nterms == 0)
            continue;
        if (!cplx) {
            long double vn, vd;
            x->est = GS_APPROX_EST_REAL;
            sum_terms(&x->wn, &t->c[w][lowk], shortk[lowk], ctx);
            sum_terms(&x->wd, &t->c[w][top], shortk[top], ctx);
            vn = coef(wk, w, lowk, shortk[lowk], 0);
            vd = coef(wk, w, top, shortk[top], 0);
            gs_reduce_ratio(&x->wn, &x->wd, ctx->syms, ctx, 1, NULL);
            x->value = -vn / vd;
        } else {
            long double v0, v1, v2, disc;
            if (t->c[w][lowk + 1].nterms == 0)
                continue;
            x->est = GS_APPROX_EST_PAIR;
            sum_terms(&x->a0, &t->c[w][lowk], shortk[lowk], ctx);
            sum_terms(&x->a1, &t->c[w][lowk + 1], shortk[lowk + 1], ctx);
            sum_terms(&x->a2, &t->c[w][top], shortk[top], ctx);
            v0 = coef(wk, w, lowk, shortk[lowk], 0);
            v1 = coef(wk, w, lowk + 1, shortk[lowk + 1], 0);
            v2 = coef(wk, w, top, shortk[top], 0);
            disc = v1 * v1 - 4 * v0 * v2;
            if (disc < 0)
                x->value = gs_cmplxl(-v1 / (2 * v2),
                                     sqrtl(-disc) / (2 * fabsl(v2)));
            else
                x->value = (-v1 + (v1 > 0 ? -1 : 1) * sqrtl(disc))
                           / (2 * v2);
        }
        x->rel_error = cabsl(x->value - x->exact) / m;
    }
    (void)vals;
    r->nroots += (size_t)nr;
    gs_free(a);
    gs_free(rt);
}

/* ---- the run -------------------------------------------------------- */

static int same_keep(size_t *const a[2], size_t *const b[2],
                     const gs_approx_terms *t)
{
    int w;
    for (w = 0; w < 2; w++)
        if (memcmp(a[w], b[w], (size_t)t->ncoef[w] * sizeof *a[w]))
            return 0;
    return 1;
}

int gs_approx_run_terms(gs_approx_result *r, const gs_approx_terms *t,
                        const gs_polyctx *ctx, int s_var,
                        const long double *vals, const unsigned char *used,
                        const gs_approx_opts *o, gs_diag *d)
{
    work wk;
    size_t *full[2], *keep[2], *prev[2], *best[2], *shortk[2];
    long double complex *rt;
    long double best_err = INFINITY;
    int w, i, g, p, nrt = 0, have_prev = 0, rc = GS_OK;
    errs e, be;
    gs_poly num, den;
    long double decades;

    memset(&wk, 0, sizeof wk);
    memset(&be, 0, sizeof be);
    wk.t = t;
    wk.ctx = ctx;
    r->ctx = ctx;
    r->s_var = s_var;
    r->path = t->path;
    gs_tf_init(&r->h, ctx, s_var);
    make_points(&wk, r, vals, used, s_var, o->spread);
    make_cum(&wk);
    make_exact(&wk);
    for (w = 0; w < 2; w++) {
        size_t n = (size_t)t->ncoef[w];
        full[w] = gs_calloc(n, sizeof *full[w]);
        keep[w] = gs_calloc(n, sizeof *keep[w]);
        prev[w] = gs_calloc(n, sizeof *prev[w]);
        best[w] = gs_calloc(n, sizeof *best[w]);
        shortk[w] = gs_calloc(n, sizeof *shortk[w]);
        for (i = 0; i < (int)n; i++) {
            full[w][i] = t->c[w][i].nterms;
            r->terms_exact += t->c[w][i].nterms;
        }
    }
    /* reference roots at the nominal point, for the band */
    rt = gs_calloc((size_t)(t->ncoef[0] + t->ncoef[1]) + 1, sizeof *rt);
    for (w = 0; w < 2; w++) {
        int n = t->ncoef[w], deg = n - 1;
        long double *a = gs_calloc((size_t)n, sizeof *a);
        gs_roots_info info;
        for (i = 0; i < n; i++)
            a[i] = exact_coef(&wk, w, i, 0);
        while (deg > 0 && a[deg] == 0)
            deg--;
        if (deg >= 1 && gs_roots(rt + nrt, NULL, a, deg, &info) != GS_EINVAL)
            nrt += info.nroots;
        gs_free(a);
    }
    for (p = 0; p < wk.np; p++) {
        long double d0 = 0;
        for (i = 0; i < t->ncoef[1]; i++)
            d0 += fabsl(exact_coef(&wk, 1, i, p));
        if (!(d0 > 0) || !isfinite(d0)) {
            gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL, "the denominator is "
                        "zero or not finite at %s",
                        p ? "a point of the spread box" : "the nominal "
                        "values");
            rc = GS_EINVAL;
            goto out;
        }
    }
    wk.ng = 1;
    pick_band(&r->f_lo, &r->f_hi, &wk, rt, nrt, o);
    decades = log10l(r->f_hi / r->f_lo);
    /* the slack keeps a whole number of decades from gaining a point
       through the last bit of log10l, which differs between builds */
    wk.ng = (int)ceill(decades * (o->per_decade < 50 ? 50 : o->per_decade)
                       - 1e-6L) + 1;
    r->npoints = wk.ng;
    wk.w = gs_calloc((size_t)wk.ng, sizeof *wk.w);
    for (g = 0; g < wk.ng; g++)
        wk.w[g] = 2 * PI_L * r->f_lo
                  * powl(10, decades * g / (long double)(wk.ng - 1));
    wk.ref = gs_calloc((size_t)wk.np * (size_t)wk.ng, sizeof *wk.ref);
    for (p = 0; p < wk.np; p++)
        for (g = 0; g < wk.ng; g++) {
            long double complex h;
            if (t->coefs) {
                h = exact_h(&wk, p, wk.w[g]);
            } else if (t->ref) {
                if (t->ref(&h, gs_cmplxl(0, wk.w[g]), wk.pts + (size_t)p
                           * (size_t)ctx->nvars, t->ref_arg) != GS_OK)
                    h = NAN;
            } else {
                h = eval_h(&wk, full, p, wk.w[g]);
            }
            wk.ref[(size_t)p * (size_t)wk.ng + (size_t)g] = h;
        }

    /* the ladder: the first rung that meets the tolerance */
    r->met = 0;
    for (i = 0; i <= RUNGS; i++) {
        long double eps = i < RUNGS ? powl(10, -(i + 1) / 4.0L) : 0, worst;
        int ok;
        for (w = 0; w < 2; w++) {
            cut(keep[w], t->c[w], t->ncoef[w], eps);
            drop_powers(keep[w], &wk, w, eps);
        }
        if (have_prev && same_keep(keep, prev, t))
            continue;
        have_prev = 1;
        for (w = 0; w < 2; w++)
            memcpy(prev[w], keep[w], (size_t)t->ncoef[w] * sizeof *keep[w]);
        ok = measure(&e, &wk, keep, o, 0);
        if (i == RUNGS && t->complete && !t->ref && !t->coefs)
            ok = 1;             /* every term: the exact H itself */
        worst = e.db / (o->tol_db > 0 ? o->tol_db : 1e-30L);
        if (e.deg / (o->tol_deg > 0 ? o->tol_deg : 1e-30L) > worst)
            worst = e.deg / (o->tol_deg > 0 ? o->tol_deg : 1e-30L);
        if (ok || worst < best_err) {
            best_err = worst;
            be = e;
            r->eps = eps;
            for (w = 0; w < 2; w++)
                memcpy(best[w], keep[w],
                       (size_t)t->ncoef[w] * sizeof *keep[w]);
        }
        if (ok) {
            r->met = 1;
            break;
        }
    }
    r->err_db = be.db;
    r->err_deg = be.deg;
    r->spread_db = be.sdb;
    r->spread_deg = be.sdeg;

    gs_poly_init(&num);
    gs_poly_init(&den);
    build_poly(&num, t->c[0], t->ncoef[0], best[0], s_var, ctx);
    build_poly(&den, t->c[1], t->ncoef[1], best[1], s_var, ctx);
    gs_reduce_ratio(&num, &den, ctx->syms, ctx, 1, NULL);
    gs_poly_swap(&r->h.num, &num);
    gs_poly_swap(&r->h.den, &den);
    gs_poly_clear(&num);
    gs_poly_clear(&den);
    r->terms_kept = r->h.num.length + r->h.den.length;
    conditions(r, t, best, ctx);
    dc_gain(r, &wk, o);
    for (w = 0; w < 2; w++)
        cut(shortk[w], t->c[w], t->ncoef[w], r->eps);
    for (w = 1; w >= 0; w--) {     /* poles first, then zeros */
        size_t from = r->nroots, nf, k;
        sfactor *sf;
        roots_of(r, &wk, w, shortk[w], vals);
        nf = s_factors(&sf, &wk, w, s_var, vals);
        use_factors(r, from, sf, nf, ctx);
        for (k = 0; k < nf; k++) {
            gs_poly_clear(&sf[k].c[0]);
            gs_poly_clear(&sf[k].c[1]);
            gs_poly_clear(&sf[k].c[2]);
        }
        gs_free(sf);
    }
out:
    for (w = 0; w < 2; w++) {
        gs_free(full[w]);
        gs_free(keep[w]);
        gs_free(prev[w]);
        gs_free(best[w]);
        gs_free(shortk[w]);
        gs_free(wk.cum[w]);
        gs_free(wk.off[w]);
        gs_free(wk.ex[w]);
    }
    gs_free(rt);
    gs_free(wk.pts);
    gs_free(wk.w);
    gs_free(wk.ref);
    return rc;
}

/* The graph path (docs/approx.md).  A first run on one term per
   coefficient finds the band; each power's largest share of its
   polynomial over the band, from the exact coefficients, then sets how
   far its terms are generated: to gen_tol / share of the coefficient,
   gen_tol a quarter of the relative error the magnitude tolerance
   allows, at most GRAPH_MAX_TERMS a coefficient.  When the tolerance is
   not met with those terms and no coefficient reached the cap, once more
   with gen_tol / 100. */
#define GRAPH_MAX_TERMS 2000
#define GRAPH_MIN_TOL 1e-12L

/* share[k] = max over the band of |a_k| w^k / max_j |a_j| w^j. */
static long double *shares(const long double *a, int deg, long double flo,
                           long double fhi)
{
    long double *sh = gs_calloc((size_t)(deg >= 0 ? deg + 1 : 1),
                                sizeof *sh);
    int n = (int)ceill(log10l(fhi / flo) * 50) + 1, g, k;
    for (g = 0; g < n && deg >= 0; g++) {
        long double w = 2 * PI_L * flo
                        * powl(fhi / flo, g / (long double)(n > 1 ? n - 1 : 1));
        long double big = 0, v;
        for (k = 0; k <= deg; k++)
            if ((v = fabsl(a[k]) * powl(w, k)) > big)
                big = v;
        for (k = 0; k <= deg && big > 0; k++)
            if ((v = fabsl(a[k]) * powl(w, k) / big) > sh[k])
                sh[k] = v;
    }
    return sh;
}

/* 1 when a coefficient stopped at GRAPH_MAX_TERMS: a finer gen_tol would
   only list the others further, at the cost of another search. */
static int capped(const gs_approx_terms *t)
{
    int w, k;
    for (w = 0; w < 2; w++)
        for (k = 0; k < t->ncoef[w]; k++)
            if (t->c[w][k].nterms >= GRAPH_MAX_TERMS)
                return 1;
    return 0;
}

/* A term of the graph whose power of a symbol no polynomial holds:
   GS_ERANGE with the symbol named, as the expansion reports it. */
static int graph_overflow(const gs_approx_terms *t, const gs_job *j,
                          gs_diag *d)
{
    gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                "lower the powers in the element values, or bind the "
                "symbol to a number",
                "exponent overflow in the dominant terms of the graph of "
                "minors: the power of '%s' would exceed %d",
                gs_symtab_name(j->ctx->syms, t->overflow - 1),
                GS_POLY_MAX_EXP);
    return GS_ERANGE;
}

static int run_graph(gs_approx_result *r, const gs_job *j, size_t i,
                     const unsigned char *used, const gs_approx_opts *o,
                     gs_diag *d)
{
    const gs_mgraph *g = j->graph[i];
    int nv = j->ctx->nvars, rc, round, s_var = j->tf[i].s_var;
    long double *vals = gs_calloc((size_t)nv + 1, sizeof *vals);
    long double *share[2] = {NULL, NULL}, gen_tol;
    gs_approx_terms t;
    memcpy(vals, j->vals, (size_t)nv * sizeof *vals);
    gs_mgraph_fill_recips(vals, j->c->syms, nv);
    /* the band, from a table of one term per coefficient */
    gs_approx_terms_from_graph(&t, g, s_var, vals, 1, NULL, 1);
    rc = t.overflow ? graph_overflow(&t, j, d)
                    : gs_approx_run_terms(r, &t, j->ctx, s_var, vals, used,
                                          o, d);
    if (rc == GS_OK && !t.complete) {
        long double *c[2];
        int deg[2], w;
        t.coefs(&c[0], &deg[0], &c[1], &deg[1], vals, t.coefs_arg);
        for (w = 0; w < 2; w++) {
            share[w] = shares(c[w], deg[w], r->f_lo, r->f_hi);
            gs_free(c[w]);
        }
        gen_tol = (powl(10, o->tol_db / 20) - 1) / 4;
        if (gen_tol < GRAPH_MIN_TOL)
            gen_tol = GRAPH_MIN_TOL;
        for (round = 0; round < 2; round++) {
            gs_approx_terms_clear(&t);
            gs_approx_result_clear(r);
            gs_approx_terms_from_graph(&t, g, s_var, vals, gen_tol, share,
                                       GRAPH_MAX_TERMS);
            rc = t.overflow ? graph_overflow(&t, j, d)
                            : gs_approx_run_terms(r, &t, j->ctx, s_var, vals,
                                                  used, o, d);
            r->gen_tol = gen_tol;
            r->search_bounded = t.budget;
            if (rc != GS_OK || r->met || t.complete || capped(&t)
                || t.budget)
                break;
            gen_tol /= 100;
        }
    }
    gs_approx_terms_clear(&t);
    gs_free(share[0]);
    gs_free(share[1]);
    gs_free(vals);
    return rc;
}

int gs_approx_run(gs_approx_result *r, const gs_job *j, size_t i,
                  const gs_approx_opts *o, gs_diag *d)
{
    gs_approx_terms t;
    unsigned char *used = gs_job_used_symbols(j);
    int rc;
    if (j->graph && j->graph[i]) {
        rc = run_graph(r, j, i, used, o, d);
        gs_approx_terms_init(&t);
    } else {
        gs_approx_terms_from_tf(&t, &j->tf[i], j->vals);
        rc = gs_approx_run_terms(r, &t, j->ctx, j->tf[i].s_var, j->vals,
                                 used, o, d);
    }
    gs_tf_set_name(&r->h, j->tf[i].name);
    gs_tf_set_description(&r->h, j->tf[i].description);
    r->h.kind = j->tf[i].kind;
    gs_approx_terms_clear(&t);
    gs_free(used);
    return rc;
}
