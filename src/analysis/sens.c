/* sens.c - normalised sensitivities from the exact N and D. See LICENSE.
 *
 * The formulas are in sens.h.  The root derivative is the implicit
 * function theorem applied to D(p(x), x) = 0 (any analysis text, e.g.
 * Apostol, "Mathematical Analysis", ch. on implicit functions); the
 * sensitivity notation follows Bode, "Network Analysis and Feedback
 * Amplifier Design" (1945), ch. on sensitivity.
 */
#include "analysis/sens.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "base/mem.h"
#include "gainsmith.h"
#include "numeric/freq.h"
#include "numeric/roots.h"

static const char *const kind_name[] = {
    "dc", "at", "phase", "pole", "zero", "w0", "q", "zero_w0", "zero_q",
    "bandwidth", "ugf", "pm"
};

const char *gs_sens_kind_name(gs_sens_kind k)
{
    return kind_name[k];
}

void gs_sens_init(gs_sens *r)
{
    memset(r, 0, sizeof *r);
}

void gs_sens_clear(gs_sens *r)
{
    size_t i;
    for (i = 0; i < r->n; i++)
        gs_free(r->fig[i].s);
    gs_free(r->fig);
    gs_free(r->used);
    gs_sens_init(r);
}

/* The symbolic derivatives, once per run, and the evaluation point. */
typedef struct work {
    const gs_tf *tf;
    const gs_polyctx *pc;
    int sv, nv;
    const unsigned char *used;
    gs_poly *dn, *dd;           /* per symbol: dN/dx, dD/dx */
    gs_poly ns, ds;             /* dN/ds, dD/ds */
    long double complex *pt;    /* the values, with s in pt[sv] */
    const long double *vals;
} work;

static long double complex at(work *w, const gs_poly *p,
                              long double complex s)
{
    w->pt[w->sv] = s;
    return gs_poly_eval_lc(p, w->pt, w->pc);
}

static gs_sens_fig *add_fig(gs_sens *r, gs_sens_kind kind)
{
    gs_sens_fig *f;
    int v;
    r->fig = gs_realloc(r->fig, (r->n + 1) * sizeof *r->fig);
    f = &r->fig[r->n++];
    memset(f, 0, sizeof *f);
    f->kind = kind;
    f->s = gs_malloc((size_t)(r->nvars ? r->nvars : 1) * sizeof *f->s);
    for (v = 0; v < r->nvars; v++)
        f->s[v] = NAN;
    return f;
}

/* Numeric coefficient k (power of s) of p. */
static long double coeff_at(work *w, const gs_poly *p, unsigned k)
{
    gs_poly c;
    long double v;
    gs_poly_init(&c);
    gs_poly_coeff_var(&c, p, w->sv, k, w->pc);
    w->pt[w->sv] = 0;
    v = creall(gs_poly_eval_lc(&c, w->pt, w->pc));
    gs_poly_clear(&c);
    return v;
}

static unsigned lowest_nonzero(work *w, const gs_poly *p, long deg)
{
    long k;
    for (k = 0; k < deg; k++)
        if (coeff_at(w, p, (unsigned)k) != 0)
            return (unsigned)k;
    return (unsigned)(deg < 0 ? 0 : deg);
}

static void fig_dc(gs_sens *r, work *w)
{
    const gs_tf *tf = w->tf;
    unsigned kn = lowest_nonzero(w, &tf->num, gs_poly_degree(&tf->num,
                                 w->sv, w->pc));
    unsigned kd = lowest_nonzero(w, &tf->den, gs_poly_degree(&tf->den,
                                 w->sv, w->pc));
    long double n = coeff_at(w, &tf->num, kn), d = coeff_at(w, &tf->den, kd);
    gs_sens_fig *f = add_fig(r, GS_SENS_DC);
    int v;
    f->value = n / d;
    for (v = 0; v < w->nv; v++)
        if (w->used[v] && n != 0)
            f->s[v] = w->vals[v] * (coeff_at(w, &w->dn[v], kn) / n
                                    - coeff_at(w, &w->dd[v], kd) / d);
}

/* S_H(s, x) for every x into sh[]. */
static void sh_at(long double complex *sh, work *w, long double complex s)
{
    long double complex n = at(w, &w->tf->num, s), d = at(w, &w->tf->den, s);
    int v;
    for (v = 0; v < w->nv; v++)
        sh[v] = w->used[v] ? w->vals[v] * (at(w, &w->dn[v], s) / n
                                           - at(w, &w->dd[v], s) / d) : 0;
}

static void fig_at(gs_sens *r, work *w, long double hz,
                   long double complex *sh)
{
    long double complex s = gs_cmplxl(0, 2 * acosl(-1) * hz);
    long double complex h = at(w, &w->tf->num, s) / at(w, &w->tf->den, s);
    gs_sens_fig *fm = add_fig(r, GS_SENS_MAG), *fp;
    int v;
    sh_at(sh, w, s);
    fm->freq = hz;
    fm->value = cabsl(h);
    for (v = 0; v < w->nv; v++)
        if (w->used[v])
            fm->s[v] = creall(sh[v]);
    if (cargl(h) == 0)      /* S of a zero phase is undefined */
        return;
    fp = add_fig(r, GS_SENS_PHASE);
    fp->freq = hz;
    fp->value = cargl(h);
    for (v = 0; v < w->nv; v++)
        if (w->used[v])
            fp->s[v] = cimagl(sh[v]) / cargl(h);
}

/* A simple nonzero root p of P (dP/ds = Ps, dP/dx = dx[]). */
static void fig_root(gs_sens *r, work *w, long double complex p, int zero,
                     const gs_poly *ps, const gs_poly *dx)
{
    long double complex dps = at(w, ps, p), dp;
    long double w0 = cabsl(p), sw0;
    int v, cplx = cimagl(p) != 0;
    gs_sens_fig *f, *fq = NULL;
    if (dps == 0 || p == 0)
        return;
    if (!cplx) {
        f = add_fig(r, zero ? GS_SENS_ZERO : GS_SENS_POLE);
        f->value = p;
    } else {
        /* add both first: adding may move the array */
        add_fig(r, zero ? GS_SENS_ZW0 : GS_SENS_W0);
        fq = add_fig(r, zero ? GS_SENS_ZQ : GS_SENS_Q);
        f = fq - 1;
        f->value = w0;
        fq->value = w0 / (-2 * creall(p));
        fq->root = p;
    }
    f->root = p;
    for (v = 0; v < w->nv; v++) {
        if (!w->used[v])
            continue;
        dp = -at(w, &dx[v], p) / dps;
        if (!cplx) {
            f->s[v] = creall(w->vals[v] * dp / p);
            continue;
        }
        sw0 = w->vals[v] * creall(conjl(p) * dp) / (w0 * w0);
        f->s[v] = sw0;
        fq->s[v] = sw0 - w->vals[v] * creall(dp) / creall(p);
    }
}

static void fig_roots(gs_sens *r, work *w, const long double complex *rt,
                      const int *mult, int n, int zero)
{
    int i, pass;
    /* real roots first, then complex pairs by their upper root */
    for (pass = 0; pass < 2; pass++)
        for (i = 0; i < n; i++)
            if (mult[i] == 1 && (pass ? cimagl(rt[i]) > 0
                                      : cimagl(rt[i]) == 0))
                fig_root(r, w, rt[i], zero, zero ? &w->ns : &w->ds,
                         zero ? w->dn : w->dd);
}

static void fig_bw(gs_sens *r, work *w, const gs_tfn *h,
                   long double complex *sh)
{
    long double hz, wb, den;
    long double complex s, n, d;
    gs_sens_fig *f;
    int v;
    if (gs_freq_bandwidth(&hz, h) != GS_OK || h->origin != 0)
        return;
    wb = 2 * acosl(-1) * hz;
    s = gs_cmplxl(0, wb);
    n = at(w, &w->tf->num, s);
    d = at(w, &w->tf->den, s);
    den = wb * creall(gs_cmplxl(0, 1) * (at(w, &w->ns, s) / n
                                         - at(w, &w->ds, s) / d));
    if (den == 0)
        return;
    sh_at(sh, w, s);
    f = add_fig(r, GS_SENS_BW);
    f->value = wb;
    for (v = 0; v < w->nv; v++)
        if (w->used[v])
            f->s[v] = -(creall(sh[v]) - r->fig[0].s[v]) / den;
}

/* d ln T(j w) / dw = j (N_s/N - D_s/D): its real part is d ln|T|/dw,
   its imaginary part d arg T/dw. */
static long double complex dlog_dw(work *w, long double wr)
{
    long double complex s = gs_cmplxl(0, wr);
    return gs_cmplxl(0, 1) * (at(w, &w->ns, s) / at(w, &w->tf->num, s)
                              - at(w, &w->ds, s) / at(w, &w->tf->den, s));
}

/* Unity-gain frequency and phase margin of T (formulas in sens.h).  The
   crossover of gs_freq_margins is polished by Newton's method on
   ln|T(j w)| = 0 with the exact derivative, so the figure and its
   finite differences agree to the last digits. */
static void fig_loop(gs_sens *r, work *w, const gs_tfn *h,
                     long double complex *sh)
{
    const long double pi = acosl(-1);
    gs_margins m;
    long double wu, pm, ph0, ph, g;
    long double complex s, t, dl;
    gs_sens_fig *fu, *fp;
    int v, k;
    if (gs_freq_margins(&m, h) != GS_OK || !m.has_pm)
        return;
    wu = 2 * pi * m.pm_hz;
    s = gs_cmplxl(0, wu);
    ph0 = cargl(at(w, &w->tf->num, s) / at(w, &w->tf->den, s));
    for (k = 0; k < 6; k++) {
        s = gs_cmplxl(0, wu);
        g = logl(cabsl(at(w, &w->tf->num, s) / at(w, &w->tf->den, s)));
        dl = dlog_dw(w, wu);
        if (creall(dl) == 0 || !isfinite(g))
            return;
        wu -= g / creall(dl);
    }
    s = gs_cmplxl(0, wu);
    t = at(w, &w->tf->num, s) / at(w, &w->tf->den, s);
    dl = dlog_dw(w, wu);
    /* the margin of gs_freq_margins (its phase unwrapped from DC), moved
       by the change of the wrapped phase the polishing made */
    ph = cargl(t) - ph0;
    ph -= 2 * pi * floorl((ph + pi) / (2 * pi));
    pm = m.pm_deg * pi / 180 + ph;
    if (creall(dl) == 0 || pm == 0 || !(wu > 0))
        return;
    sh_at(sh, w, s);
    add_fig(r, GS_SENS_UGF);
    fp = add_fig(r, GS_SENS_PM);
    fu = fp - 1;                /* adding may move the array */
    fu->value = wu;
    fp->value = pm * 180 / pi;
    for (v = 0; v < w->nv; v++)
        if (w->used[v]) {
            fu->s[v] = -creall(sh[v]) / (wu * creall(dl));
            fp->s[v] = (cimagl(sh[v]) + cimagl(dl) * wu * fu->s[v]) / pm;
        }
}

static long double *num_coeffs(work *w, const gs_poly *p, int *deg)
{
    long d = gs_poly_degree(p, w->sv, w->pc), k;
    long double *c = gs_malloc((size_t)(d < 0 ? 1 : d + 1) * sizeof *c);
    for (k = 0; k <= d; k++)
        c[k] = coeff_at(w, p, (unsigned)k);
    *deg = (int)d;
    return c;
}

static void work_init(work *w, gs_sens *r, const gs_tf *tf,
                      const long double *vals)
{
    int v;
    unsigned char *u2;
    w->tf = tf;
    w->pc = tf->ctx;
    w->sv = tf->s_var;
    w->nv = tf->ctx->nvars;
    w->vals = vals;
    r->nvars = w->nv;
    r->used = gs_malloc((size_t)(w->nv ? w->nv : 1));
    u2 = gs_malloc((size_t)(w->nv ? w->nv : 1));
    gs_poly_used_vars(r->used, &tf->num, w->pc);
    gs_poly_used_vars(u2, &tf->den, w->pc);
    w->dn = gs_malloc((size_t)(w->nv ? w->nv : 1) * sizeof *w->dn);
    w->dd = gs_malloc((size_t)(w->nv ? w->nv : 1) * sizeof *w->dd);
    w->pt = gs_malloc((size_t)(w->nv ? w->nv : 1) * sizeof *w->pt);
    for (v = 0; v < w->nv; v++) {
        r->used[v] = (unsigned char)((r->used[v] | u2[v]) && v != w->sv);
        w->pt[v] = vals[v];
        gs_poly_init(&w->dn[v]);
        gs_poly_init(&w->dd[v]);
        if (r->used[v]) {
            gs_poly_derivative(&w->dn[v], &tf->num, v, w->pc);
            gs_poly_derivative(&w->dd[v], &tf->den, v, w->pc);
        }
    }
    gs_free(u2);
    w->used = r->used;
    gs_poly_init(&w->ns);
    gs_poly_init(&w->ds);
    gs_poly_derivative(&w->ns, &tf->num, w->sv, w->pc);
    gs_poly_derivative(&w->ds, &tf->den, w->sv, w->pc);
}

static void work_clear(work *w)
{
    int v;
    for (v = 0; v < w->nv; v++) {
        gs_poly_clear(&w->dn[v]);
        gs_poly_clear(&w->dd[v]);
    }
    gs_poly_clear(&w->ns);
    gs_poly_clear(&w->ds);
    gs_free(w->dn);
    gs_free(w->dd);
    gs_free(w->pt);
}

int gs_sens_compute(gs_sens *r, const gs_tf *tf, const long double *vals,
                    const long double *at_hz, size_t nat)
{
    return gs_sens_compute_loop(r, tf, vals, at_hz, nat, 0);
}

int gs_sens_compute_loop(gs_sens *r, const gs_tf *tf,
                         const long double *vals, const long double *at_hz,
                         size_t nat, int loop)
{
    work w;
    gs_tfn h;
    long double *cn, *cd;
    long double complex *sh;
    int dn, dd, rc;
    size_t i;

    gs_sens_clear(r);
    work_init(&w, r, tf, vals);
    cn = num_coeffs(&w, &tf->num, &dn);
    cd = num_coeffs(&w, &tf->den, &dd);
    rc = gs_tfn_init(&h, cn, dn, cd, dd);
    sh = gs_malloc((size_t)(w.nv ? w.nv : 1) * sizeof *sh);
    if (rc != GS_EINVAL) {
        fig_dc(r, &w);
        for (i = 0; i < nat; i++)
            fig_at(r, &w, at_hz[i], sh);
        fig_roots(r, &w, h.poles, h.pole_mult, h.npoles, 0);
        fig_roots(r, &w, h.zeros, h.zero_mult, h.nzeros, 1);
        fig_bw(r, &w, &h, sh);
        if (loop)
            fig_loop(r, &w, &h, sh);
    }
    gs_free(sh);
    gs_tfn_clear(&h);
    gs_free(cn);
    gs_free(cd);
    work_clear(&w);
    return rc;
}

/* Links of one figure kept adjacent: a stable pass per new figure. */
void gs_sens_bias_links(gs_bias_link **out, size_t *n, const gs_job *j)
{
    gs_bias_link *all = NULL, *l;
    size_t nall = 0, b, k, m, nl;
    unsigned char *done;
    *out = NULL;
    *n = 0;
    for (b = 0; b < j->c->nbiases; b++) {
        if (gs_device_bias_links(&l, &nl, j->c, b) != GS_OK)
            continue;
        all = gs_realloc(all, (nall + nl + 1) * sizeof *all);
        for (k = 0; k < nl; k++) {
            const char *o = j->origin ? j->origin[l[k].sym] : NULL;
            /* the value must still be the one this line set */
            if (o && strncmp(o, "bias ", 5) == 0
                && strcmp(o + 5, l[k].device) == 0)
                all[nall++] = l[k];
        }
        gs_free(l);
    }
    done = gs_calloc(nall ? nall : 1, 1);
    *out = gs_malloc((nall ? nall : 1) * sizeof **out);
    for (k = 0; k < nall; k++) {
        if (done[k])
            continue;
        for (m = k; m < nall; m++)
            if (!done[m] && all[m].device == all[k].device
                && strcmp(all[m].figure, all[k].figure) == 0) {
                (*out)[(*n)++] = all[m];
                done[m] = 1;
            }
    }
    gs_free(done);
    gs_free(all);
}

long double gs_sens_chain(const gs_sens *r, const gs_sens_fig *f,
                          const gs_bias_link *l, size_t n)
{
    long double sum = 0;
    size_t k;
    for (k = 0; k < n; k++)
        if (l[k].sym < r->nvars && r->used[l[k].sym]
            && isfinite(f->s[l[k].sym]))
            sum += f->s[l[k].sym] * l[k].s;
    return sum;
}
