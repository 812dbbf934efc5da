/* noise_approx.c - short forms of a noise analysis (noise_approx.h).
 * See LICENSE.
 */
#include "analysis/noise_approx.h"
#include "base/mem.h"
#include "numeric/spectrum.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

void gs_noise_short_init(gs_noise_short *s)
{
    memset(s, 0, sizeof *s);
    gs_approx_result_init(&s->target);
}

void gs_noise_short_clear(gs_noise_short *s)
{
    size_t k;
    for (k = 0; s->h && k < s->nsrc; k++)
        gs_approx_result_clear(&s->h[k]);
    gs_free(s->h);
    gs_free(s->kept);
    gs_free(s->max_share);
    gs_approx_result_clear(&s->target);
    gs_noise_short_init(s);
}

size_t gs_noise_tf_index(const gs_job *j, size_t out)
{
    size_t i;
    for (i = 0; i < j->ntf; i++)
        if (j->out_index[i] == out)
            break;
    return i;
}

/* The short transfers as numeric coefficients, one noise term each (the
   densities of nn), and the target's own with white 1. */
typedef struct short_terms {
    gs_noise_term *t;           /* nsrc + 1: the sources, then the target */
    long double **coef;         /* 2 (nsrc + 1) arrays */
} short_terms;

static void terms_make(short_terms *st, const gs_noise_short *s,
                       const gs_noise_num *nn, const gs_job *j, size_t i)
{
    size_t k, n = s->nsrc;
    st->t = gs_calloc(n + 1, sizeof *st->t);
    st->coef = gs_calloc(2 * (n + 1), sizeof *st->coef);
    for (k = 0; k <= n; k++) {
        const gs_approx_result *r = k < n ? &s->h[k] : &s->target;
        gs_noise_term *t = &st->t[k];
        st->coef[2 * k] = gs_job_coeffs(j, &r->h.num, &t->dn);
        st->coef[2 * k + 1] = gs_job_coeffs(j, &r->h.den, &t->dd);
        t->num = st->coef[2 * k];
        t->den = st->coef[2 * k + 1];
        t->white = k < n ? nn->term[i * nn->nsrc + k].white : 1;
        t->flicker = k < n ? nn->term[i * nn->nsrc + k].flicker : 0;
    }
}

static void terms_clear(short_terms *st, size_t nsrc)
{
    size_t k;
    for (k = 0; k < 2 * (nsrc + 1); k++)
        gs_free(st->coef[k]);
    gs_free(st->coef);
    gs_free(st->t);
}

/* The grid of the band: npoints frequencies, log spaced, ends included. */
static long double grid_f(const gs_noise_short *s, int p)
{
    long double a = log10l(s->f_lo), b = log10l(s->f_hi);
    if (p == s->npoints - 1)
        return s->f_hi;
    return powl(10, a + (b - a) * (long double)p
                          / (long double)(s->npoints - 1));
}

/* Each source's share of S_out at every grid point (share[p * nsrc + k])
   and its largest. */
static long double *shares(gs_noise_short *s, const gs_noise_num *nn,
                           size_t i)
{
    size_t n = s->nsrc, k;
    long double *share = gs_calloc((size_t)s->npoints * n, sizeof *share);
    int p;
    for (p = 0; p < s->npoints; p++) {
        long double *sh = &share[(size_t)p * n];
        long double tot = gs_noise_out_psd(nn, i, grid_f(s, p), sh);
        for (k = 0; k < n; k++) {
            sh[k] = tot > 0 ? sh[k] / tot : 0;
            if (sh[k] > s->max_share[k])
                s->max_share[k] = sh[k];
        }
    }
    return share;
}

/* Leave out sources, smallest largest-share first, while the parts left
   out stay within `budget` of S_out at every grid point. */
static void drop_small(gs_noise_short *s, const long double *share,
                       long double budget)
{
    size_t n = s->nsrc, k, m, *order = gs_malloc(n * sizeof *order);
    long double *out = gs_calloc((size_t)s->npoints, sizeof *out);
    for (k = 0; k < n; k++) {
        order[k] = k;
        s->kept[k] = 1;
    }
    for (k = 1; k < n; k++)         /* insertion sort, stable */
        for (m = k; m > 0 && s->max_share[order[m]]
                             < s->max_share[order[m - 1]]; m--) {
            size_t t = order[m];
            order[m] = order[m - 1];
            order[m - 1] = t;
        }
    for (k = 0; k + 1 < n; k++) {   /* one source always stays */
        size_t src = order[k];
        long double worst = 0;
        int p;
        for (p = 0; p < s->npoints; p++) {
            long double v = out[p] + share[(size_t)p * n + src];
            worst = v > worst ? v : worst;
        }
        if (worst > budget)
            break;
        for (p = 0; p < s->npoints; p++)
            out[p] += share[(size_t)p * n + src];
        s->kept[src] = 0;
        s->dropped_share = worst;
    }
    gs_free(order);
    gs_free(out);
}

static long double db_ratio(long double a, long double b)
{
    if (a == b)
        return 0;
    if (!(a > 0 && b > 0))
        return INFINITY;
    return fabsl(10 * log10l(a / b));
}

/* The measured errors of the short S_out and S_in on the grid. */
static void measure(gs_noise_short *s, const gs_noise_num *nn,
                    const gs_job *j, size_t i)
{
    short_terms st;
    size_t k;
    int p;
    terms_make(&st, s, nn, j, i);
    s->err_out_db = s->err_in_db = 0;
    for (p = 0; p < s->npoints; p++) {
        long double f = grid_f(s, p), sum = 0, e, exact;
        for (k = 0; k < s->nsrc; k++)
            if (s->kept[k])
                sum += gs_spectrum_term(&st.t[k], f);
        exact = gs_noise_out_psd(nn, i, f, NULL);
        e = db_ratio(sum, exact);
        s->err_out_db = e > s->err_out_db ? e : s->err_out_db;
        e = db_ratio(sum / gs_spectrum_term(&st.t[s->nsrc], f),
                     gs_noise_in_psd(nn, i, f));
        s->err_in_db = e > s->err_in_db ? e : s->err_in_db;
    }
    s->met = s->err_out_db <= s->tol_db && s->err_in_db <= s->tol_db;
    terms_clear(&st, s->nsrc);
}

int gs_noise_short_make(gs_noise_short *s, const gs_noise *n,
                        const gs_noise_num *nn, const gs_job *j, size_t i,
                        const gs_approx_opts *o, gs_diag *d)
{
    const gs_noise_target *t = &n->target[i];
    gs_approx_opts third = *o;
    long double *share;
    size_t k;
    int rc;

    gs_noise_short_clear(s);
    s->nsrc = n->nsrc;
    s->tol_db = o->tol_db;
    s->h = gs_calloc(n->nsrc, sizeof *s->h);
    s->kept = gs_calloc(n->nsrc, 1);
    s->max_share = gs_calloc(n->nsrc, sizeof *s->max_share);
    for (k = 0; k < n->nsrc; k++)
        gs_approx_result_init(&s->h[k]);
    third.tol_db = o->tol_db / 3;
    third.tol_deg = 360;        /* |H|^2 only: no phase to keep */
    rc = gs_approx_run(&s->target, j, gs_noise_tf_index(j, t->out), &third,
                       d);
    if (rc != GS_OK)
        return rc;
    /* one band for every transfer: the target's */
    third.f_lo = s->f_lo = s->target.f_lo;
    third.f_hi = s->f_hi = s->target.f_hi;
    s->npoints = s->target.npoints > 2 ? s->target.npoints : 2;
    for (k = 0; k < n->nsrc && rc == GS_OK; k++)
        rc = gs_approx_run(&s->h[k], j, gs_noise_tf_index(j, t->first + k),
                           &third, d);
    if (rc != GS_OK)
        return rc;
    share = shares(s, nn, i);
    drop_small(s, share, 1 - powl(10, -third.tol_db / 10));
    gs_free(share);
    measure(s, nn, j, i);
    return GS_OK;
}
