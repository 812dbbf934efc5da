/* poly_gcd_eval.c - term tables, evaluation points and degree bounds
 * for the multivariate gcd: step 2 of the method in poly_gcd.c.
 * See LICENSE.
 *
 * 2. Degree bounds, which double as a coprimality certificate.  Take a
 *    prime p and a random point alpha.  For each variable x in both
 *    operands, a_x(z) = a(alpha with x = z) mod p.  If lc_x(a)(alpha) != 0
 *    mod p, then lc_x(g)(alpha) != 0 too (it divides), so the image of
 *    g = gcd(a, b) keeps its degree in x and divides gcd(a_x, b_x):
 *    deg_x g <= deg gcd(a_x, b_x), rigorously.  All the a_x come out of a
 *    single pass over the terms.  Every bound zero means g = 1.  An unlucky
 *    point only loosens a bound; it never gives a wrong one.
 *
 * A term table holds a polynomial as lists of (variable, exponent)
 * factors with its coefficients mod the current prime; a point holds
 * the powers of its values, so a term's value is one product a factor.
 */
#include "algebra/poly_gcd_impl.h"

#include <stdlib.h>

#include "base/mem.h"

/* ---- packed exponents ------------------------------------------------ */

/* field f (0 = the top) of word w */
static unsigned field_get(uint64_t w, int f)
{
    return (unsigned)((w >> gs_poly_field_shift(f)) & GS_POLY_FIELD_MASK);
}

/* ---- term tables: a polynomial ready for evaluation mod p ------------ */

static size_t count_factors(const uint64_t *e, int nwords)
{
    size_t k = 0;
    int w, f;
    for (w = 0; w < nwords; w++)
        for (f = 0; e[w] != 0 && f < GS_POLY_VARS_PER_WORD; f++)
            k += field_get(e[w], f) != 0;
    return k;
}

static void tab_fill_factors(tab *t, const gs_polyctx *ctx)
{
    const gs_poly *a = t->src;
    int nw = ctx->nwords, w, f;
    size_t i, k = 0;
    for (i = 0; i < t->n; i++) {
        const uint64_t *e = a->exps + i * (size_t)nw;
        t->off[i] = k;
        for (w = 0; w < nw; w++)
            for (f = 0; e[w] != 0 && f < GS_POLY_VARS_PER_WORD; f++) {
                unsigned x = field_get(e[w], f);
                int v = w * GS_POLY_VARS_PER_WORD + f;
                if (x == 0)
                    continue;
                t->var[k] = v;
                t->exp[k++] = x;
                if (x > t->deg[v]) {
                    t->deg[v] = x;
                    t->nlead[v] = 0;
                }
                t->nlead[v] += x == t->deg[v];
            }
    }
    t->off[t->n] = k;
}

void gs_pgcd_tab_init(tab *t, const gs_poly *a, const gs_polyctx *ctx)
{
    size_t i, nf = 0;
    size_t nv = (size_t)(ctx->nvars > 0 ? ctx->nvars : 1);
    for (i = 0; i < a->length; i++)
        nf += count_factors(a->exps + i * (size_t)ctx->nwords, ctx->nwords);
    t->n = a->length;
    t->src = a;
    t->off = gs_malloc((t->n + 1) * sizeof *t->off);
    t->var = gs_malloc((nf + 1) * sizeof *t->var);
    t->exp = gs_malloc((nf + 1) * sizeof *t->exp);
    t->xd = gs_calloc(t->n + 1, sizeof *t->xd);
    t->cm = gs_malloc((t->n + 1) * sizeof *t->cm);
    t->deg = gs_calloc(nv, sizeof *t->deg);
    t->nlead = gs_calloc(nv, sizeof *t->nlead);
    t->xdeg = 0;
    tab_fill_factors(t, ctx);
}

void gs_pgcd_tab_clear(tab *t)
{
    gs_free(t->off);
    gs_free(t->var);
    gs_free(t->exp);
    gs_free(t->xd);
    gs_free(t->cm);
    gs_free(t->deg);
    gs_free(t->nlead);
}

/* Record each term's exponent in x (x < 0: no main variable). */
void gs_pgcd_tab_set_main(tab *t, int x)
{
    size_t i, k;
    t->xdeg = 0;
    for (i = 0; i < t->n; i++) {
        t->xd[i] = 0;
        for (k = t->off[i]; x >= 0 && k < t->off[i + 1]; k++)
            if (t->var[k] == x)
                t->xd[i] = t->exp[k];
        if ((long)t->xd[i] > t->xdeg)
            t->xdeg = (long)t->xd[i];
    }
}

void gs_pgcd_tab_reduce(tab *t, uint64_t p)
{
    size_t i;
    for (i = 0; i < t->n; i++)
        t->cm[i] = gs_int_mod_ui(&t->src->coeffs[i], p);
}

/* ---- evaluation points with their power tables ----------------------- */

void gs_pgcd_pts_init(pts *pt, const tab *ta, const tab *tb, int nvars)
{
    size_t nv = (size_t)(nvars > 0 ? nvars : 1), tot = 0;
    int v;
    pt->nvars = nvars;
    pt->maxe = gs_calloc(nv, sizeof *pt->maxe);
    pt->base = gs_calloc(nv, sizeof *pt->base);
    pt->val = gs_calloc(nv, sizeof *pt->val);
    for (v = 0; v < nvars; v++) {
        unsigned e = ta->deg[v] > tb->deg[v] ? ta->deg[v] : tb->deg[v];
        pt->maxe[v] = e;
        pt->base[v] = tot;
        tot += e + 1;
    }
    pt->pw = gs_malloc((tot + 1) * sizeof *pt->pw);
    pt->pwinv = gs_malloc((tot + 1) * sizeof *pt->pwinv);
}

void gs_pgcd_pts_clear(pts *pt)
{
    gs_free(pt->maxe);
    gs_free(pt->base);
    gs_free(pt->val);
    gs_free(pt->pw);
    gs_free(pt->pwinv);
}

static void pow_row(uint64_t *row, uint64_t v, unsigned maxe, uint64_t p)
{
    unsigned e;
    row[0] = 1;
    for (e = 1; e <= maxe; e++)
        row[e] = gs_nmod_mul(row[e - 1], v, p);
}

void gs_pgcd_pts_fill(pts *pt, uint64_t p)
{
    int v;
    for (v = 0; v < pt->nvars; v++)
        pow_row(pt->pw + pt->base[v], pt->val[v], pt->maxe[v], p);
}

static void pts_fill_inv(pts *pt, uint64_t p)
{
    int v;
    for (v = 0; v < pt->nvars; v++)
        pow_row(pt->pwinv + pt->base[v], gs_nmod_inv(pt->val[v], p),
                pt->maxe[v], p);
}

void gs_pgcd_pts_randomise(pts *pt, gs_rng *rng, uint64_t p)
{
    int v;
    for (v = 0; v < pt->nvars; v++)
        pt->val[v] = gs_nmod_random_nonzero(rng, p);
}

/* value of term i at the point, main variable excluded by its value 1 */
uint64_t gs_pgcd_term_value(const tab *t, size_t i, const pts *pt,
                            uint64_t p)
{
    uint64_t v = t->cm[i];
    size_t k;
    for (k = t->off[i]; k < t->off[i + 1] && v != 0; k++)
        v = gs_nmod_mul(v, pt->pw[pt->base[t->var[k]] + t->exp[k]], p);
    return v;
}

/* r(z) = the polynomial at the point with the main variable left free
   (its value in pt must be 1) */
void gs_pgcd_tab_eval(gs_nmod_poly *r, const tab *t, const pts *pt,
                      uint64_t p)
{
    size_t i;
    gs_nmod_poly_zero_len(r, t->xdeg + 1);
    for (i = 0; i < t->n; i++) {
        uint64_t v = gs_pgcd_term_value(t, i, pt, p);
        r->c[t->xd[i]] = gs_nmod_add(r->c[t->xd[i]], v, p);
    }
    gs_nmod_poly_normalise(r);
}

/* ---- step 2: degree bounds ------------------------------------------- */

/* img[v](z) = the polynomial at the point with x_v = z, for every v with
   want[v], all from one pass: a term worth c at the point contributes
   c val_v^-e z^e to img[v] (and nothing at z^0), and the rest of the
   polynomial is the total minus those terms.  Needs nonzero values. */
static void tab_eval_each(gs_nmod_poly *img, const tab *t, const pts *pt,
                          const unsigned char *want, uint64_t p)
{
    uint64_t total = 0;
    size_t i, k;
    int v;
    for (v = 0; v < pt->nvars; v++)
        if (want[v])
            gs_nmod_poly_zero_len(&img[v], (long)t->deg[v] + 1);
    for (i = 0; i < t->n; i++) {
        uint64_t c = gs_pgcd_term_value(t, i, pt, p);
        total = gs_nmod_add(total, c, p);
        for (k = t->off[i]; k < t->off[i + 1]; k++) {
            uint64_t *z;
            v = t->var[k];
            if (!want[v])
                continue;
            z = img[v].c;
            z[t->exp[k]] = gs_nmod_add(z[t->exp[k]],
                gs_nmod_mul(c, pt->pwinv[pt->base[v] + t->exp[k]], p), p);
            z[0] = gs_nmod_sub(z[0], c, p);
        }
    }
    for (v = 0; v < pt->nvars; v++)
        if (want[v]) {
            img[v].c[0] = gs_nmod_add(img[v].c[0], total, p);
            gs_nmod_poly_normalise(&img[v]);
        }
}

/* One round of bounds at a random point for the variables still wanted;
   a variable is settled when one operand keeps its degree there. */
static void bounds_round(long *bd, unsigned char *want, tab *ta, tab *tb,
                         pts *pt, gs_rng *rng)
{
    int v, n = pt->nvars;
    uint64_t p = gs_nmod_random_prime(rng);
    gs_nmod_poly *ia = gs_malloc((size_t)n * sizeof *ia);
    gs_nmod_poly *ib = gs_malloc((size_t)n * sizeof *ib);
    gs_nmod_poly g;
    gs_nmod_poly_init(&g);
    for (v = 0; v < n; v++) {
        gs_nmod_poly_init(&ia[v]);
        gs_nmod_poly_init(&ib[v]);
    }
    gs_pgcd_tab_reduce(ta, p);
    gs_pgcd_tab_reduce(tb, p);
    gs_pgcd_pts_randomise(pt, rng, p);
    gs_pgcd_pts_fill(pt, p);
    pts_fill_inv(pt, p);
    tab_eval_each(ia, ta, pt, want, p);
    tab_eval_each(ib, tb, pt, want, p);
    for (v = 0; v < n; v++) {
        if (!want[v] || (gs_nmod_poly_degree(&ia[v]) != (long)ta->deg[v]
                         && gs_nmod_poly_degree(&ib[v]) != (long)tb->deg[v]))
            continue;
        gs_nmod_poly_gcd(&g, &ia[v], &ib[v], p);
        bd[v] = gs_nmod_poly_degree(&g);
        want[v] = 0;
    }
    for (v = 0; v < n; v++) {
        gs_nmod_poly_clear(&ia[v]);
        gs_nmod_poly_clear(&ib[v]);
    }
    gs_nmod_poly_clear(&g);
    gs_free(ia);
    gs_free(ib);
}

/* bd[v] >= deg_v gcd(a, b) for every variable; returns how many are
   positive.  Variables in only one operand get 0 (the gcd divides the
   other, which is free of them). */
int gs_pgcd_degree_bounds(long *bd, tab *ta, tab *tb, pts *pt, gs_rng *rng)
{
    int v, n = pt->nvars, round, left = 0, pos = 0;
    unsigned char *want = gs_calloc((size_t)(n > 0 ? n : 1), 1);
    for (v = 0; v < n; v++) {
        bd[v] = 0;
        want[v] = ta->deg[v] > 0 && tb->deg[v] > 0;
        left += want[v];
    }
    for (round = 0; round < 3 && left > 0; round++) {
        bounds_round(bd, want, ta, tb, pt, rng);
        for (left = 0, v = 0; v < n; v++)
            left += want[v];
    }
    for (v = 0; v < n; v++) {
        if (want[v])            /* never settled: the trivial bound */
            bd[v] = ta->deg[v] < tb->deg[v] ? ta->deg[v] : tb->deg[v];
        pos += bd[v] > 0;
    }
    gs_free(want);
    return pos;
}
