/* refcheck.c - a derived output against the exact reference, point by
 * point.  See LICENSE.
 *
 * The bound on evaluating the expression is a running error analysis in
 * the manner of N. J. Higham, "Accuracy and Stability of Numerical
 * Algorithms", 2nd ed., SIAM 2002: a sum of n terms, each a product of m
 * factors, computed in precision u is off by at most gamma(n + m) times
 * the sum of the terms' magnitudes (ch. 3 and 4), with
 * gamma(k) = k u / (1 - k u); Horner's rule for a polynomial of degree d
 * at z is off by at most gamma(2d) sum |a_k| |z|^k (sec. 5.1), which we
 * double for complex products (sec. 3.6).  The constants are taken
 * generously: the bound only has to separate lost digits from a wrong
 * formula, which differ by many orders of magnitude.
 */
#include "analysis/refcheck.h"
#include "base/mem.h"
#include "base/rng.h"
#include "numeric/numsolve.h"
#include "numeric/roots.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define UNIT (LDBL_EPSILON / 2)

static long double gam(long double k)
{
    long double ku = k * UNIT;
    return ku < 0.5L ? ku / (1 - ku) : INFINITY;
}

/* e[k]: a bound on the rounding error of coefficient k of p (of degree
   deg in s) as gs_job_coeffs computes it: each term's integer rounded,
   multiplied by its symbols' values one factor at a time, the terms
   summed in turn. */
static long double *coeff_bounds(const gs_job *j, const gs_poly *p, int deg)
{
    int nv = j->ctx->nvars, sv = j->c->s_sym, v;
    size_t len = (size_t)(deg >= 0 ? deg + 1 : 1), t, k;
    long double *e = gs_calloc(len, sizeof *e);
    long double *mag = gs_calloc(len, sizeof *mag);
    long double *work = gs_calloc(len, sizeof *work);
    unsigned *ex = gs_malloc(((size_t)nv + 1) * sizeof *ex);
    for (t = 0; t < p->length; t++) {
        long double a = fabsl(gs_int_get_ld(&p->coeffs[t])), ops = 2;
        gs_poly_get_term_exps(ex, p, t, j->ctx);
        k = sv >= 0 && sv < nv ? ex[sv] : 0;
        if (k >= len)
            continue;
        for (v = 0; v < nv; v++)
            if (v != sv && ex[v]) {
                a *= powl(fabsl(j->vals[v]), (long double)ex[v]);
                ops += ex[v];
            }
        mag[k] += a;
        work[k] += 1;               /* one more addition */
        if (ops > e[k])
            e[k] = ops;             /* the longest product so far */
    }
    for (k = 0; k < len; k++)       /* doubled: the magnitudes round too */
        e[k] = gam(2 * (work[k] + e[k]) + 4) * mag[k];
    gs_free(mag);
    gs_free(work);
    gs_free(ex);
    return e;
}

void gs_refcheck_init(gs_refcheck *r, const gs_job *j, size_t i)
{
    const gs_tf *tf = &j->tf[i];
    memset(r, 0, sizeof *r);
    r->j = j;
    r->i = i;
    r->cn = gs_job_coeffs(j, &tf->num, &r->dn);
    r->cd = gs_job_coeffs(j, &tf->den, &r->dd);
    r->bounded = !(j->graph && j->graph[i]);
    if (r->bounded) {
        r->en = coeff_bounds(j, &tf->num, r->dn);
        r->ed = coeff_bounds(j, &tf->den, r->dd);
    } else {
        r->en = gs_calloc((size_t)(r->dn >= 0 ? r->dn + 1 : 1),
                          sizeof *r->en);
        r->ed = gs_calloc((size_t)(r->dd >= 0 ? r->dd + 1 : 1),
                          sizeof *r->ed);
    }
}

void gs_refcheck_clear(gs_refcheck *r)
{
    gs_free(r->cn);
    gs_free(r->cd);
    gs_free(r->en);
    gs_free(r->ed);
    memset(r, 0, sizeof *r);
}

/* A bound on |p^(w j) - p(w j)| for p evaluated by Horner's rule from the
   rounded coefficients c (errors at most e). */
static long double horner_bound(const long double *c, const long double *e,
                                int deg, long double w)
{
    long double sum_e = 0, sum_c = 0, wk = 1;
    int k;
    for (k = 0; k <= deg; k++) {
        sum_e += e[k] * wk;
        sum_c += (fabsl(c[k]) + e[k]) * wk;
        wk *= fabsl(w);
    }
    return sum_e * (1 + gam(2 * (long double)deg + 2))
         + gam(4 * (long double)deg + 4) * sum_c;
}

int gs_refcheck_at(gs_refcheck_point *p, const gs_refcheck *r,
                   long double f, long double tol, gs_numexact_why *why)
{
    const gs_job *j = r->j;
    long double w = 2 * acosl(-1) * f, scale, bf, br, en, ed, ad;
    long double complex s = gs_cmplxl(0, w), nh, dh;
    gs_diag d;
    int rc;

    memset(p, 0, sizeof *p);
    p->f = f;
    nh = gs_roots_horner(r->cn, r->dn, s);
    dh = gs_roots_horner(r->cd, r->dd, s);
    p->h = nh / dh;
    en = horner_bound(r->cn, r->en, r->dn, w);
    ed = horner_bound(r->cd, r->ed, r->dd, w);
    ad = cabsl(dh);
    /* N/D - N^/D^ = (dN D^ - N^ dD) / (D D^), |D| >= |D^| - ed */
    bf = ed < ad ? (en + cabsl(p->h) * ed) / (ad - ed) + 8 * UNIT
                       * cabsl(p->h)
                 : INFINITY;
    /* The long double solve bounds its own error; where that bound and
       the difference both sit far inside the tolerance, the point agrees
       without the exact solve, which costs far more. */
    if (gs_numsolve_bounded(&p->ref, &br, j->c, j->out_index[r->i],
                            j->vals, s) == GS_OK
        && cabsl(p->ref) > 0 && br <= 1e-2L * tol * cabsl(p->ref)) {
        p->err = cabsl(p->h - p->ref) / cabsl(p->ref);
        if (p->err <= tol / 2) {
            p->bound = br / cabsl(p->ref);
            p->verdict = GS_RC_AGREE;
            return GS_OK;
        }
    }
    rc = gs_numsolve_exact(&p->ref, j->c, j->out_index[r->i], j->vals, s,
                           why);
    p->exact = rc == GS_OK;
    if (rc == GS_EINEXACT) {        /* a figure with a function in it */
        gs_diag_init(&d);
        rc = gs_numsolve(&p->ref, j->c, j->out_index[r->i], j->vals, s, &d);
        gs_diag_clear(&d);
    }
    if (rc != GS_OK)
        return rc;
    br = p->exact ? 2 * UNIT * cabsl(p->ref) : 0;
    scale = cabsl(p->ref) > 1e-300L ? cabsl(p->ref) : 1;
    p->err = cabsl(p->h - p->ref) / scale;
    p->bound = p->exact ? (bf + br) / scale : 0;
    if (p->err <= tol)
        p->verdict = GS_RC_AGREE;
    else if (p->exact && p->err <= p->bound)
        p->verdict = GS_RC_INCONCLUSIVE;
    else
        p->verdict = GS_RC_MISMATCH;       /* also a NaN difference */
    return GS_OK;
}

size_t gs_refcheck_generic_values(gs_job *j, int **syms)
{
    int n = gs_symtab_count(j->c->syms), i;
    unsigned char *used = gs_job_used_symbols(j);
    unsigned char *seen = gs_calloc((size_t)n + 1, 1);
    int *out = gs_malloc(((size_t)n + 1) * sizeof *out);
    size_t k, count = 0;
    gs_rng rng;
    /* a fixed seed: the same values on every run */
    gs_rng_seed(&rng, 0x67656e6572696355ULL);
    for (k = 0; k < j->c->nelems; k++) {
        const gs_monomial *m = &j->c->elems[k].value;
        for (i = 0; i < m->n; i++) {
            int v = m->sym[i];
            if (v < 0 || v >= n || seen[v] || j->set[v]
                || v == j->c->s_sym || (v < j->ctx->nvars && used[v]))
                continue;
            seen[v] = 1;
            /* 1.00 .. 9.99: a value no circuit relation singles out */
            j->vals[v] = (long double)(100 + gs_rng_below(&rng, 900))
                         / 100;
            out[count++] = v;
        }
    }
    gs_free(used);
    gs_free(seen);
    if (syms)
        *syms = out;
    else
        gs_free(out);
    return count;
}
