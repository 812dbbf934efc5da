/* poly_gcd.c - multivariate polynomial gcd over Z. See LICENSE.
 *
 * Method.  The inputs are circuit determinants: sparse, tens of symbols,
 * mostly of degree one in each, and usually coprime.  So the work is laid
 * out to make the coprime answer cheap and every answer certain:
 *
 * 1. Integer content and monomial content are split off (gcd of the
 *    monomial contents is their componentwise minimum).  The result is
 *    primitive, as poly.h asks: the gcd of the integer contents is left
 *    to the caller, who keeps rational contents apart anyway.
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
 * 3. Otherwise a candidate comes from Zippel's sparse modular method
 *    (Zippel 1979, "Probabilistic algorithms for sparse polynomials",
 *    EUROSAM '79, LNCS 72; and Zippel, "Effective Polynomial Computation",
 *    Kluwer 1993, ch. 17), chosen over Brown's dense method (Brown 1971,
 *    J. ACM 18) because dense interpolation costs prod (deg_i + 1) images,
 *    2^20 for a multilinear gcd in 20 symbols, while sparse interpolation
 *    costs about terms x symbols x degree.  The leading coefficient
 *    problem is handled as in Brown's method: with a main variable x and
 *    gamma = gcd(lc_x a, lc_x b) (a gcd in fewer variables, computed
 *    recursively), G = (gamma / lc_x g) g has lc_x G = gamma, so each image
 *    is gamma(point) times the monic gcd of the univariate images, with no
 *    unknown scale.  The first extra variable is interpolated densely,
 *    each further one by Zippel's assumption that the support found so far
 *    persists, solving transposed Vandermonde systems and checking one
 *    spare equation per system.  More primes follow on the known support,
 *    combined by Chinese remaindering until the integers stop changing.
 *
 * 4. Certification: the candidate C (G with its content removed, and its
 *    content in x removed if need be) is accepted only if it divides both
 *    operands exactly.  Then gcd(a, b) = C gcd(a/C, b/C) for any such
 *    common divisor, so a candidate need not even be the whole gcd: the
 *    cofactors go round again, and are normally certified coprime by
 *    step 2.  Probabilistic choices thus affect only the running time.
 *
 * 5. If the modular method keeps failing, the subresultant remainder
 *    sequence (Knuth, TAOCP vol. 2, 4.6.1, algorithm C; Collins 1967,
 *    J. ACM 14; Brown and Traub 1971, J. ACM 18), with contents taken
 *    recursively, decides: slow in many variables but unconditionally
 *    correct.
 *
 * Cost.  The coprime case is one pass over the terms of both operands and
 * a univariate gcd per shared variable.  Otherwise each image is a pass
 * over both operands (at the powers zeta^t of Zippel's points, one
 * product per term, each term's value being the previous one times a
 * fixed ratio), and Zippel's method needs about sum_k deg_k (T_k + 1)
 * images, T_k the largest number of terms of G sharing a degree in x.
 *
 * The random choices come from a generator seeded by the operands' hashes,
 * so the same inputs take the same path.
 */
#include "algebra/poly.h"

#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"
#include "algebra/nmod.h"

enum { R_OK, R_UNLUCKY, R_LOWER, R_BADSKEL, R_FAIL };

/* Tries per unlucky evaluation, restarts of the modular method and
   primes per restart: generous, since each failure is rare. */
#define MAX_TRIES 24
#define MAX_RESTARTS 4
#define MAX_PRIMES 64

static void gcd_nonzero(gs_poly *g, const gs_poly *a, const gs_poly *b,
                        const gs_polyctx *ctx, gs_rng *rng);

/* ---- packed exponents ------------------------------------------------ */

/* field f (0 = the top) of word w */
static unsigned field_get(uint64_t w, int f)
{
    return (unsigned)((w >> gs_poly_field_shift(f)) & GS_POLY_FIELD_MASK);
}

/* componentwise minimum of two packed exponent vectors */
static void mono_min(uint64_t *r, const uint64_t *a, const uint64_t *b,
                     int nwords)
{
    int w;
    for (w = 0; w < nwords; w++)
        r[w] = gs_poly_fields_min(a[w], b[w]);
}

static int mono_is_one(const uint64_t *e, int nwords)
{
    int w;
    for (w = 0; w < nwords; w++)
        if (e[w] != 0)
            return 0;
    return 1;
}

/* ---- term tables: a polynomial ready for evaluation mod p ------------ */

/* Each term as a list of (variable, exponent) factors, its coefficient
   reduced mod the current prime, and its exponent in the main variable. */
typedef struct {
    size_t n;           /* terms */
    size_t *off;        /* factors of term i: off[i] .. off[i+1]-1 */
    int *var;
    unsigned *exp;
    unsigned *xd;       /* exponent of the main variable (0: none chosen) */
    uint64_t *cm;       /* coefficients modulo the current prime */
    unsigned *deg;      /* degree in each variable */
    size_t *nlead;      /* number of terms reaching that degree */
    long xdeg;          /* degree in the main variable */
    const gs_poly *src;
} tab;

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

static void tab_init(tab *t, const gs_poly *a, const gs_polyctx *ctx)
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

static void tab_clear(tab *t)
{
    free(t->off);
    free(t->var);
    free(t->exp);
    free(t->xd);
    free(t->cm);
    free(t->deg);
    free(t->nlead);
}

/* Record each term's exponent in x (x < 0: no main variable). */
static void tab_set_main(tab *t, int x)
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

static void tab_reduce(tab *t, uint64_t p)
{
    size_t i;
    for (i = 0; i < t->n; i++)
        t->cm[i] = gs_int_mod_ui(&t->src->coeffs[i], p);
}

/* ---- evaluation points with their power tables ----------------------- */

typedef struct {
    int nvars;
    unsigned *maxe;     /* largest exponent of each variable */
    size_t *base;       /* variable v's powers start at pw + base[v] */
    uint64_t *val;      /* value of each variable */
    uint64_t *pw;       /* pw[base[v] + e] = val[v]^e */
    uint64_t *pwinv;    /* val[v]^-e, filled by pts_fill_inv */
} pts;

static void pts_init(pts *pt, const tab *ta, const tab *tb, int nvars)
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

static void pts_clear(pts *pt)
{
    free(pt->maxe);
    free(pt->base);
    free(pt->val);
    free(pt->pw);
    free(pt->pwinv);
}

static void pow_row(uint64_t *row, uint64_t v, unsigned maxe, uint64_t p)
{
    unsigned e;
    row[0] = 1;
    for (e = 1; e <= maxe; e++)
        row[e] = gs_nmod_mul(row[e - 1], v, p);
}

static void pts_fill(pts *pt, uint64_t p)
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

static void pts_randomise(pts *pt, gs_rng *rng, uint64_t p)
{
    int v;
    for (v = 0; v < pt->nvars; v++)
        pt->val[v] = gs_nmod_random_nonzero(rng, p);
}

/* value of term i at the point, main variable excluded by its value 1 */
static uint64_t term_value(const tab *t, size_t i, const pts *pt,
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
static void tab_eval(gs_nmod_poly *r, const tab *t, const pts *pt,
                     uint64_t p)
{
    size_t i;
    gs_nmod_poly_zero_len(r, t->xdeg + 1);
    for (i = 0; i < t->n; i++) {
        uint64_t v = term_value(t, i, pt, p);
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
        uint64_t c = term_value(t, i, pt, p);
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
    tab_reduce(ta, p);
    tab_reduce(tb, p);
    pts_randomise(pt, rng, p);
    pts_fill(pt, p);
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
    free(ia);
    free(ib);
}

/* bd[v] >= deg_v gcd(a, b) for every variable; returns how many are
   positive.  Variables in only one operand get 0 (the gcd divides the
   other, which is free of them). */
static int degree_bounds(long *bd, tab *ta, tab *tb, pts *pt, gs_rng *rng)
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
    free(want);
    return pos;
}

/* ---- sparse polynomials mod p in (x, y_0 .. y_{m-1}) ------------------ */

/* Terms grouped by their exponent in x, groups in decreasing order. */
typedef struct {
    size_t n, alloc;
    int w;              /* exponents per term: x first, then the y's */
    unsigned *ex;
    uint64_t *c;
} spoly;

static void sp_init(spoly *s, int w)
{
    s->n = s->alloc = 0;
    s->w = w;
    s->ex = NULL;
    s->c = NULL;
}

static void sp_clear(spoly *s)
{
    free(s->ex);
    free(s->c);
    sp_init(s, s->w);
}

static void sp_push(spoly *s, const unsigned *ex, uint64_t c)
{
    if (s->n == s->alloc) {
        s->alloc = s->alloc ? 2 * s->alloc : 16;
        s->ex = gs_reallocarray(s->ex, s->alloc * (size_t)s->w,
                                sizeof *s->ex);
        s->c = gs_reallocarray(s->c, s->alloc, sizeof *s->c);
    }
    memcpy(s->ex + s->n * (size_t)s->w, ex, (size_t)s->w * sizeof *ex);
    s->c[s->n++] = c;
}

/* start[0..ng] bound the groups of equal x-degree; returns ng */
static size_t sp_groups(size_t *start, const spoly *s)
{
    size_t i, ng = 0;
    for (i = 0; i < s->n; i++)
        if (i == 0 || s->ex[i * (size_t)s->w] != s->ex[(i - 1) * (size_t)s->w])
            start[ng++] = i;
    start[ng] = s->n;
    return ng;
}

/* ---- step 3: Zippel's sparse modular gcd ------------------------------ */

typedef struct {
    const gs_polyctx *ctx;
    gs_rng *rng;
    uint64_t p;
    int x;              /* main variable */
    long dx;            /* degree of the gcd in x (an upper bound) */
    int m;              /* variables to interpolate */
    int *y;             /* their ids */
    long *dy;           /* degree bounds of G in each */
    unsigned char *isy; /* per variable: x or one of the y */
    tab ta, tb, tg;     /* a, b and gamma */
    pts pt;
    gs_nmod_poly ax, bx, gx;
} zctx;

static void zctx_init(zctx *z, const gs_poly *a, const gs_poly *b,
                      const gs_poly *gam, int x, const long *bd,
                      const gs_polyctx *ctx, gs_rng *rng)
{
    int v, n = ctx->nvars;
    size_t nv = (size_t)(n > 0 ? n : 1);
    z->ctx = ctx;
    z->rng = rng;
    z->p = 0;
    z->x = x;
    z->dx = bd[x];
    z->y = gs_malloc(nv * sizeof *z->y);
    z->dy = gs_malloc(nv * sizeof *z->dy);
    z->isy = gs_calloc(nv, 1);
    tab_init(&z->ta, a, ctx);
    tab_init(&z->tb, b, ctx);
    tab_init(&z->tg, gam, ctx);
    tab_set_main(&z->ta, x);
    tab_set_main(&z->tb, x);
    tab_set_main(&z->tg, -1);
    z->m = 0;
    for (v = 0; v < n; v++) {
        long d = v == x ? 0 : bd[v] + (long)z->tg.deg[v];
        if (d > 0) {
            z->y[z->m] = v;
            z->dy[z->m++] = d;
        }
        z->isy[v] = v == x || d > 0;
    }
    pts_init(&z->pt, &z->ta, &z->tb, n);
    gs_nmod_poly_init(&z->ax);
    gs_nmod_poly_init(&z->bx);
    gs_nmod_poly_init(&z->gx);
}

static void zctx_clear(zctx *z)
{
    free(z->y);
    free(z->dy);
    free(z->isy);
    tab_clear(&z->ta);
    tab_clear(&z->tb);
    tab_clear(&z->tg);
    pts_clear(&z->pt);
    gs_nmod_poly_clear(&z->ax);
    gs_nmod_poly_clear(&z->bx);
    gs_nmod_poly_clear(&z->gx);
}

/* A new prime, with the variables outside (x, y) at new values: G is free
   of them, so only their luck matters. */
static void zctx_new_prime(zctx *z)
{
    z->p = gs_nmod_random_prime(z->rng);
    tab_reduce(&z->ta, z->p);
    tab_reduce(&z->tb, z->p);
    tab_reduce(&z->tg, z->p);
    pts_randomise(&z->pt, z->rng, z->p);
    z->pt.val[z->x] = 1;
}

static void zctx_refresh_fixed(zctx *z)
{
    int v;
    for (v = 0; v < z->pt.nvars; v++)
        if (!z->isy[v])
            z->pt.val[v] = gs_nmod_random_nonzero(z->rng, z->p);
}

/* h = the image of G from the images of a, b and gamma in z->ax, z->bx,
   z->gx: gamma(point) times the monic gcd.  R_UNLUCKY when gamma vanishes
   or the degree is too high; R_LOWER when it is lower than dx, which then
   becomes the bound (rigorous: gamma(point) != 0 keeps the degree of g's
   image). */
static int zimage_finish(gs_nmod_poly *h, zctx *z)
{
    uint64_t gam = gs_nmod_poly_get(&z->gx, 0);
    long d;
    if (gam == 0 || z->ax.len == 0 || z->bx.len == 0)
        return R_UNLUCKY;
    gs_nmod_poly_gcd(h, &z->ax, &z->bx, z->p);
    d = gs_nmod_poly_degree(h);
    if (d > z->dx)
        return R_UNLUCKY;
    if (d < z->dx) {
        z->dx = d;
        return R_LOWER;
    }
    gs_nmod_poly_scale(h, h, gam, z->p);
    return R_OK;
}

/* the image of G at the current point */
static int zimage(gs_nmod_poly *h, zctx *z)
{
    pts_fill(&z->pt, z->p);
    tab_eval(&z->gx, &z->tg, &z->pt, z->p);
    tab_eval(&z->ax, &z->ta, &z->pt, z->p);
    tab_eval(&z->bx, &z->tb, &z->pt, z->p);
    return zimage_finish(h, z);
}

static int in_list(const uint64_t *xs, long n, uint64_t v)
{
    long i;
    for (i = 0; i < n; i++)
        if (xs[i] == v)
            return 1;
    return 0;
}

/* Images at n distinct random values of variable `var` (the others as
   they are); xs and H receive them.  With var < 0 the fixed variables
   are varied instead, for the case with nothing to interpolate. */
static int dense_images(uint64_t *xs, gs_nmod_poly *H, long n, int var,
                        zctx *z)
{
    long got = 0;
    int tries = 0, r;
    while (got < n) {
        uint64_t beta = gs_nmod_random_nonzero(z->rng, z->p);
        if (tries++ > MAX_TRIES + 2 * n)
            return R_FAIL;
        if (var >= 0 && in_list(xs, got, beta))
            continue;
        if (var >= 0)
            z->pt.val[var] = beta;
        else
            zctx_refresh_fixed(z);
        r = zimage(&H[got], z);
        if (r == R_LOWER)
            return r;
        if (r == R_OK)
            xs[got++] = beta;
    }
    return R_OK;
}

/* The first stage: G(x, y_0, alpha_1, ...) by dense interpolation in y_0
   from dy[0] + 1 images (one image when there is nothing to
   interpolate). */
static int zip_first(spoly *G, zctx *z)
{
    long n = z->m > 0 ? z->dy[0] + 1 : 1, i, e, k;
    uint64_t *xs = gs_malloc((size_t)n * sizeof *xs);
    uint64_t *ys = gs_malloc((size_t)n * sizeof *ys);
    gs_nmod_poly *H = gs_malloc((size_t)n * sizeof *H), q;
    unsigned *row = gs_calloc((size_t)G->w, sizeof *row);
    int r;
    gs_nmod_poly_init(&q);
    for (i = 0; i < n; i++)
        gs_nmod_poly_init(&H[i]);
    r = dense_images(xs, H, n, z->m > 0 ? z->y[0] : -1, z);
    for (e = z->dx; r == R_OK && e >= 0; e--) {
        for (i = 0; i < n; i++)
            ys[i] = gs_nmod_poly_get(&H[i], e);
        gs_nmod_poly_interpolate(&q, xs, ys, n, z->p);
        row[0] = (unsigned)e;
        for (k = gs_nmod_poly_degree(&q); k >= 0; k--) {
            if (q.c[k] == 0)
                continue;
            if (z->m > 0)
                row[1] = (unsigned)k;
            sp_push(G, row, q.c[k]);
        }
    }
    for (i = 0; i < n; i++)
        gs_nmod_poly_clear(&H[i]);
    gs_nmod_poly_clear(&q);
    free(H);
    free(xs);
    free(ys);
    free(row);
    return r;
}

static int distinct_in_groups(const uint64_t *v, const size_t *start,
                              size_t ng)
{
    size_t g, i, j;
    for (g = 0; g < ng; g++)
        for (i = start[g]; i < start[g + 1]; i++)
            for (j = start[g]; j < i; j++)
                if (v[i] == v[j])
                    return 0;
    return 1;
}

/* Every x-degree without a group must be zero in all images. */
static int absent_degrees_zero(const spoly *G, const size_t *start,
                               size_t ng, const gs_nmod_poly *H, long nt)
{
    long t, e;
    size_t g = 0;
    for (e = H[0].len - 1; e >= 0; e--) {
        while (g < ng && (long)G->ex[start[g] * (size_t)G->w] > e)
            g++;
        if (g < ng && (long)G->ex[start[g] * (size_t)G->w] == e)
            continue;
        for (t = 0; t < nt; t++)
            if (gs_nmod_poly_get(&H[t], e) != 0)
                return 0;
    }
    return 1;
}

/* Group g's coefficients from the images H[t] = sum_j c_j v_j^(t+1) x^e:
   a transposed Vandermonde system in the first L images, then a check of
   the remaining ones.  R_BADSKEL when the check fails: the support
   assumed is not the true one. */
static int solve_group(uint64_t *c, const uint64_t *v, size_t L, long e,
                       const gs_nmod_poly *H, long nt, uint64_t p,
                       uint64_t *w)
{
    long t;
    size_t j;
    for (t = 0; t < (long)L; t++)
        w[t] = gs_nmod_poly_get(&H[t], e);
    if (gs_nmod_vandermonde_solve(c, v, w, (long)L, p) != 0)
        return R_BADSKEL;
    for (j = 0; j < L; j++)          /* the system was in c_j v_j */
        c[j] = gs_nmod_mul(c[j], gs_nmod_inv(v[j], p), p);
    for (t = (long)L; t < nt; t++) {
        uint64_t s = 0;
        for (j = 0; j < L; j++)
            s = gs_nmod_add(s, gs_nmod_mul(c[j],
                    gs_nmod_pow(v[j], (uint64_t)t + 1, p), p), p);
        if (s != gs_nmod_poly_get(&H[t], e))
            return R_BADSKEL;
    }
    return R_OK;
}

static int solve_groups(uint64_t *c, const spoly *G, const size_t *start,
                        size_t ng, const uint64_t *v, const gs_nmod_poly *H,
                        long nt, uint64_t p)
{
    uint64_t *w = gs_malloc((size_t)nt * sizeof *w);
    size_t g;
    int r = absent_degrees_zero(G, start, ng, H, nt) ? R_OK : R_BADSKEL;
    for (g = 0; g < ng && r == R_OK; g++) {
        size_t s = start[g];
        r = solve_group(c + s, v + s, start[g + 1] - s,
                        (long)G->ex[s * (size_t)G->w], H, nt, p, w);
    }
    free(w);
    return r;
}

/* Monomial values v_j = prod_l zeta_l^(e_jl) over the first nz y's. */
static void monomial_values(uint64_t *v, const spoly *G, const uint64_t *zeta,
                            int nz, uint64_t p)
{
    size_t j;
    int l;
    for (j = 0; j < G->n; j++) {
        const unsigned *ex = G->ex + j * (size_t)G->w;
        v[j] = 1;
        for (l = 0; l < nz; l++)
            if (ex[l + 1] != 0)
                v[j] = gs_nmod_mul(v[j], gs_nmod_pow(zeta[l], ex[l + 1], p),
                                   p);
    }
}

/* A run of images at y_l = zeta_l^t: a term's value at step t is its
   value at step t - 1 times its monomial in the zeta's, so each image
   costs one product per term instead of one per factor. */
typedef struct {
    uint64_t *cur;      /* value of each term at the last step */
    uint64_t *rat;      /* its monomial at zeta */
    uint64_t *pre;      /* rat prepared for gs_nmod_mul_shoup */
} run;

/* monomial of term i at the point, without the coefficient */
static uint64_t term_monomial(const tab *t, size_t i, const pts *pt,
                              uint64_t p)
{
    uint64_t v = 1;
    size_t k;
    for (k = t->off[i]; k < t->off[i + 1]; k++)
        v = gs_nmod_mul(v, pt->pw[pt->base[t->var[k]] + t->exp[k]], p);
    return v;
}

/* cur = values with the zeta variables at 1, rat = monomials at zeta
   with everything else at 1; pt.val is left as it was */
static void runs_init(run *rs, tab **ts, int nts, const uint64_t *zeta,
                      int nz, zctx *z)
{
    int nv = z->pt.nvars, l, k;
    uint64_t *save = gs_malloc((size_t)(nv > 0 ? nv : 1) * sizeof *save);
    size_t i;
    memcpy(save, z->pt.val, (size_t)nv * sizeof *save);
    for (l = 0; l < nz; l++)
        z->pt.val[z->y[l]] = 1;
    pts_fill(&z->pt, z->p);
    for (k = 0; k < nts; k++) {
        rs[k].cur = gs_malloc((ts[k]->n + 1) * sizeof *rs[k].cur);
        rs[k].rat = gs_malloc((ts[k]->n + 1) * sizeof *rs[k].rat);
        rs[k].pre = gs_malloc((ts[k]->n + 1) * sizeof *rs[k].pre);
        for (i = 0; i < ts[k]->n; i++)
            rs[k].cur[i] = term_value(ts[k], i, &z->pt, z->p);
    }
    for (l = 0; l < nv; l++)
        z->pt.val[l] = 1;
    for (l = 0; l < nz; l++)
        z->pt.val[z->y[l]] = zeta[l];
    pts_fill(&z->pt, z->p);
    for (k = 0; k < nts; k++)
        for (i = 0; i < ts[k]->n; i++) {
            rs[k].rat[i] = term_monomial(ts[k], i, &z->pt, z->p);
            rs[k].pre[i] = gs_nmod_shoup_pre(rs[k].rat[i], z->p);
        }
    memcpy(z->pt.val, save, (size_t)nv * sizeof *save);
    free(save);
}

static void run_step(gs_nmod_poly *r, run *rs, const tab *t, uint64_t p)
{
    size_t i;
    gs_nmod_poly_zero_len(r, t->xdeg + 1);
    for (i = 0; i < t->n; i++) {
        rs->cur[i] = gs_nmod_mul_shoup(rs->cur[i], rs->rat[i], rs->pre[i], p);
        r->c[t->xd[i]] = gs_nmod_add(r->c[t->xd[i]], rs->cur[i], p);
    }
    gs_nmod_poly_normalise(r);
}

/* Images at y_l = zeta_l^t (l < nz) for t = 1 .. nt. */
static int power_images(gs_nmod_poly *H, long nt, const uint64_t *zeta,
                        int nz, zctx *z)
{
    tab *ts[3];
    run rs[3];
    long t;
    int k, r = R_OK;
    ts[0] = &z->tg;
    ts[1] = &z->ta;
    ts[2] = &z->tb;
    runs_init(rs, ts, 3, zeta, nz, z);
    for (t = 0; t < nt && r == R_OK; t++) {
        run_step(&z->gx, &rs[0], ts[0], z->p);
        run_step(&z->ax, &rs[1], ts[1], z->p);
        run_step(&z->bx, &rs[2], ts[2], z->p);
        r = zimage_finish(&H[t], z);
    }
    for (k = 0; k < 3; k++) {
        free(rs[k].cur);
        free(rs[k].rat);
        free(rs[k].pre);
    }
    return r;
}

/* The coefficients c of G's support at the current values of y_nz ...:
   Zippel's sparse interpolation over y_0 .. y_{nz-1} at the powers of a
   random point, so that each x-degree group is a Vandermonde system. */
static int zip_solve_at(uint64_t *c, const spoly *G, zctx *z, int nz)
{
    size_t *start = gs_malloc((G->n + 1) * sizeof *start), ng, g, T = 0;
    uint64_t *zeta = gs_malloc((size_t)(nz > 0 ? nz : 1) * sizeof *zeta);
    uint64_t *v = gs_malloc((G->n + 1) * sizeof *v);
    gs_nmod_poly *H;
    long nt, t;
    int l, tries, r = R_FAIL;
    ng = sp_groups(start, G);
    for (g = 0; g < ng; g++)
        if (start[g + 1] - start[g] > T)
            T = start[g + 1] - start[g];
    nt = (long)T + 1;               /* one spare image to check with */
    H = gs_malloc((size_t)nt * sizeof *H);
    for (t = 0; t < nt; t++)
        gs_nmod_poly_init(&H[t]);
    for (tries = 0; tries < MAX_TRIES; tries++) {
        for (l = 0; l < nz; l++)
            zeta[l] = gs_nmod_random_nonzero(z->rng, z->p);
        monomial_values(v, G, zeta, nz, z->p);
        if (!distinct_in_groups(v, start, ng))
            continue;
        zctx_refresh_fixed(z);
        r = power_images(H, nt, zeta, nz, z);
        if (r == R_UNLUCKY)
            continue;
        if (r == R_OK)
            r = solve_groups(c, G, start, ng, v, H, nt, z->p);
        break;
    }
    if (r == R_UNLUCKY)
        r = R_FAIL;
    for (t = 0; t < nt; t++)
        gs_nmod_poly_clear(&H[t]);
    free(H);
    free(start);
    free(zeta);
    free(v);
    return r;
}

/* New support: each term's coefficient interpolated densely in y_k. */
static void extend_support(spoly *G, const uint64_t *bx, const uint64_t *cv,
                           long nb, int k, uint64_t p)
{
    spoly N;
    gs_nmod_poly q;
    uint64_t *ys = gs_malloc((size_t)nb * sizeof *ys);
    unsigned *row = gs_malloc((size_t)G->w * sizeof *row);
    size_t j;
    long i, e;
    sp_init(&N, G->w);
    gs_nmod_poly_init(&q);
    for (j = 0; j < G->n; j++) {
        for (i = 0; i < nb; i++)
            ys[i] = cv[(size_t)i * G->n + j];
        gs_nmod_poly_interpolate(&q, bx, ys, nb, p);
        memcpy(row, G->ex + j * (size_t)G->w, (size_t)G->w * sizeof *row);
        for (e = gs_nmod_poly_degree(&q); e >= 0; e--) {
            if (q.c[e] == 0)
                continue;
            row[k + 1] = (unsigned)e;
            sp_push(&N, row, q.c[e]);
        }
    }
    sp_clear(G);
    *G = N;
    gs_nmod_poly_clear(&q);
    free(ys);
    free(row);
}

/* Stage k >= 1: from G(x, y_0..y_{k-1}, alpha_k, ...) to G(x, y_0..y_k,
   alpha_{k+1}, ...), assuming the support in y_0..y_{k-1} persists
   (Zippel's probabilistic step; a wrong guess is caught by the spare
   equations or by the final division). */
static int zip_extend(spoly *G, zctx *z, int k)
{
    long nb = z->dy[k] + 1, i;
    size_t n = G->n, j;
    uint64_t *bx = gs_malloc((size_t)nb * sizeof *bx);
    uint64_t *cv = gs_malloc((size_t)nb * n * sizeof *cv);
    uint64_t alpha = z->pt.val[z->y[k]];
    int r = R_OK;
    bx[0] = alpha;
    for (j = 0; j < n; j++)
        cv[j] = G->c[j];
    for (i = 1; i < nb && r == R_OK; i++) {
        do
            bx[i] = gs_nmod_random_nonzero(z->rng, z->p);
        while (in_list(bx, i, bx[i]));
        z->pt.val[z->y[k]] = bx[i];
        r = zip_solve_at(cv + (size_t)i * n, G, z, k);
    }
    z->pt.val[z->y[k]] = alpha;
    if (r == R_OK)
        extend_support(G, bx, cv, nb, k, z->p);
    free(bx);
    free(cv);
    return r;
}

/* G mod a new prime, from scratch. */
static int zip_modp(spoly *G, zctx *z)
{
    int k, r;
    sp_clear(G);
    zctx_new_prime(z);
    r = zip_first(G, z);
    for (k = 1; k < z->m && r == R_OK; k++)
        r = zip_extend(G, z, k);
    return r;
}

/* ---- lifting over Z and certification --------------------------------- */

/* Garner's step: X (mod M, symmetric) and r (mod p) into X mod M p.
   Returns whether X changed. */
static int crt_step(gs_int *X, const gs_int *M, uint64_t r, uint64_t p,
                    uint64_t minv, gs_int *tmp)
{
    uint64_t xr = gs_int_mod_ui(X, p), k;
    if (xr == r)
        return 0;
    k = gs_nmod_mul(gs_nmod_sub(r, xr, p), minv, p);
    gs_int_set_ui(tmp, k);
    gs_int_addmul(X, M, tmp);       /* X in (-M/2, M p - M/2] */
    gs_int_mul_2exp(tmp, X, 1);
    gs_int_set_ui(tmp + 1, p);
    gs_int_mul(tmp + 1, tmp + 1, M);  /* M p */
    if (gs_int_cmp(tmp, tmp + 1) > 0)
        gs_int_sub(X, X, tmp + 1);
    return 1;
}

/* Combine residues c (one per term of the support) into X, M *= p. */
static int crt_all(gs_int *X, gs_int *M, const uint64_t *c, size_t n,
                   uint64_t p)
{
    gs_int tmp[2];
    uint64_t minv = gs_nmod_inv(gs_int_mod_ui(M, p), p);
    size_t j;
    int changed = 0;
    gs_int_init(&tmp[0]);
    gs_int_init(&tmp[1]);
    for (j = 0; j < n; j++)
        changed |= crt_step(&X[j], M, c[j], p, minv, tmp);
    gs_int_set_ui(&tmp[0], p);
    gs_int_mul(M, M, &tmp[0]);
    gs_int_clear(&tmp[0]);
    gs_int_clear(&tmp[1]);
    return changed;
}

/* symmetric residues of the first prime; returns whether all are small */
static int crt_first(gs_int *X, const uint64_t *c, size_t n, uint64_t p)
{
    size_t j;
    int small = 1;
    for (j = 0; j < n; j++) {
        int64_t v = c[j] > p / 2 ? (int64_t)c[j] - (int64_t)p : (int64_t)c[j];
        gs_int_set_si(&X[j], v);
        small &= v > -65536 && v < 65536;
    }
    return small;
}

static void sp_to_poly(gs_poly *r, const spoly *G, const gs_int *X,
                       const zctx *z)
{
    const gs_polyctx *ctx = z->ctx;
    unsigned *e = gs_calloc((size_t)(ctx->nvars > 0 ? ctx->nvars : 1),
                            sizeof *e);
    size_t j;
    int l;
    gs_poly_zero(r);
    for (j = 0; j < G->n; j++) {
        const unsigned *ex = G->ex + j * (size_t)G->w;
        e[z->x] = ex[0];
        for (l = 0; l < z->m; l++)
            e[z->y[l]] = ex[l + 1];
        gs_poly_push_term(r, &X[j], e, ctx);
    }
    gs_poly_canonicalise(r, ctx);
    free(e);
}

/* A cheap necessary condition for c | a: degrees, then c(x, point) |
   a(x, point) mod a fresh prime (skipped if c vanishes there). */
static int maybe_divides(tab *tc, tab *ta, zctx *z)
{
    gs_nmod_poly r;
    int v, ok = 1;
    for (v = 0; v < z->pt.nvars; v++)
        if (tc->deg[v] > ta->deg[v])
            return 0;
    tab_reduce(tc, z->p);
    tab_reduce(ta, z->p);
    tab_eval(&z->gx, tc, &z->pt, z->p);
    tab_eval(&z->ax, ta, &z->pt, z->p);
    if (z->gx.len > 0) {
        gs_nmod_poly_init(&r);
        gs_nmod_poly_divrem(NULL, &r, &z->ax, &z->gx, z->p);
        ok = r.len == 0;
        gs_nmod_poly_clear(&r);
    }
    return ok;
}

/* c | a and c | b exactly?  Then qa = a / c and qb = b / c. */
static int divides_both(gs_poly *qa, gs_poly *qb, const gs_poly *c,
                        const gs_poly *a, const gs_poly *b, zctx *z)
{
    tab tc;
    int ok;
    tab_init(&tc, c, z->ctx);
    tab_set_main(&tc, z->x);
    z->p = gs_nmod_random_prime(z->rng);
    pts_randomise(&z->pt, z->rng, z->p);
    z->pt.val[z->x] = 1;
    pts_fill(&z->pt, z->p);
    ok = maybe_divides(&tc, &z->ta, z) && maybe_divides(&tc, &z->tb, z);
    tab_clear(&tc);
    ok = ok && gs_poly_divexact(qa, a, c, z->ctx) == GS_OK
         && gs_poly_divexact(qb, b, c, z->ctx) == GS_OK;
    return ok;
}

/* r = the gcd of a's coefficients in x (a primitive polynomial) */
static void content_in(gs_poly *r, const gs_poly *a, int x,
                       const gs_polyctx *ctx, gs_rng *rng)
{
    gs_poly t;
    long k;
    gs_poly_init(&t);
    gs_poly_zero(r);
    for (k = gs_poly_degree(a, x, ctx); k >= 0; k--) {
        gs_poly_coeff_var(&t, a, x, (unsigned)k, ctx);
        if (gs_poly_is_zero(&t))
            continue;
        if (gs_poly_is_zero(r))
            gs_poly_primitive(r, &t, ctx);
        else
            gcd_nonzero(r, r, &t, ctx, rng);
        if (gs_poly_is_const(r, ctx))
            break;
    }
    gs_poly_clear(&t);
}

/* The candidate from G: without monomial and integer content, and if it
   does not divide, without its content in x either (G carries the extra
   factor gamma / lc_x g then). */
static int certify(gs_poly *c, gs_poly *qa, gs_poly *qb, const gs_poly *G,
                   const gs_poly *a, const gs_poly *b, zctx *z)
{
    uint64_t *mono = gs_malloc((size_t)z->ctx->nwords * sizeof *mono);
    gs_poly k;
    int ok = 0;
    gs_poly_init(&k);
    gs_poly_monomial_content(mono, G, z->ctx);
    gs_poly_div_monomial(c, G, mono, z->ctx);
    gs_poly_primitive(c, c, z->ctx);
    if (!gs_poly_is_const(c, z->ctx))
        ok = divides_both(qa, qb, c, a, b, z);
    if (!ok && !gs_poly_is_const(c, z->ctx)) {
        content_in(&k, c, z->x, z->ctx, z->rng);
        if (!gs_poly_is_const(&k, z->ctx)
            && gs_poly_divexact(c, c, &k, z->ctx) == GS_OK) {
            gs_poly_primitive(c, c, z->ctx);
            ok = !gs_poly_is_const(c, z->ctx)
                 && divides_both(qa, qb, c, a, b, z);
        }
    }
    gs_poly_clear(&k);
    free(mono);
    return ok ? R_OK : R_BADSKEL;
}

/* From G mod one prime to a certified divisor: more primes on the same
   support until the integers are stable (trying at once when the first
   prime already gives small integers), then certify. */
static int lift(gs_poly *c, gs_poly *qa, gs_poly *qb, const spoly *G,
                const gs_poly *a, const gs_poly *b, zctx *z)
{
    gs_int *X = gs_malloc((G->n + 1) * sizeof *X), M;
    uint64_t *res = gs_malloc((G->n + 1) * sizeof *res);
    gs_poly P;
    size_t j;
    int k, r = R_FAIL, ready;
    gs_int_init(&M);
    gs_poly_init(&P);
    for (j = 0; j < G->n; j++)
        gs_int_init(&X[j]);
    ready = crt_first(X, G->c, G->n, z->p);
    gs_int_set_ui(&M, z->p);
    for (k = 0; k < MAX_PRIMES; k++) {
        if (ready) {
            sp_to_poly(&P, G, X, z);
            r = certify(c, qa, qb, &P, a, b, z);
            if (r == R_OK || k > 0)
                break;
        }
        zctx_new_prime(z);
        r = zip_solve_at(res, G, z, z->m);
        if (r == R_LOWER || r == R_BADSKEL)
            break;
        ready = r == R_OK && !crt_all(X, &M, res, G->n, z->p);
        r = R_FAIL;
    }
    for (j = 0; j < G->n; j++)
        gs_int_clear(&X[j]);
    gs_int_clear(&M);
    gs_poly_clear(&P);
    free(X);
    free(res);
    return r;
}

/* A certified nonconstant common divisor c of a and b with cofactors, by
   the modular method with main variable x.  R_LOWER when the bound in x
   dropped (bd[x] updated). */
static int modular_divisor(gs_poly *c, gs_poly *qa, gs_poly *qb,
                           const gs_poly *a, const gs_poly *b,
                           const gs_poly *gam, int x, long *bd,
                           const gs_polyctx *ctx, gs_rng *rng)
{
    zctx z;
    spoly G;
    int restart, r = R_FAIL;
    zctx_init(&z, a, b, gam, x, bd, ctx, rng);
    sp_init(&G, z.m + 1);
    for (restart = 0; restart < MAX_RESTARTS; restart++) {
        r = zip_modp(&G, &z);
        if (r == R_OK)
            r = lift(c, qa, qb, &G, a, b, &z);
        if (r == R_LOWER) {
            bd[x] = z.dx;
            if (z.dx == 0)
                break;
        }
        if (r == R_OK)
            break;
    }
    sp_clear(&G);
    zctx_clear(&z);
    return r == R_OK || r == R_LOWER ? r : R_FAIL;
}

/* ---- step 5: subresultant remainder sequence -------------------------- */

static void prs_gcd(gs_poly *g, const gs_poly *a, const gs_poly *b,
                    const gs_polyctx *ctx);

/* The variable to eliminate: one in both operands, of the lowest degree
   (the fewest remainders); else any used one; -1 when both are
   constants. */
static int prs_var(const gs_poly *a, const gs_poly *b, const gs_polyctx *ctx)
{
    int v, best = -1, any = -1;
    long bd = 0;
    for (v = 0; v < ctx->nvars; v++) {
        long da = gs_poly_degree(a, v, ctx), db = gs_poly_degree(b, v, ctx);
        long d = da > db ? da : db;
        if (d > 0 && any < 0)
            any = v;
        if (da > 0 && db > 0 && (best < 0 || d < bd)) {
            best = v;
            bd = d;
        }
    }
    return best >= 0 ? best : any;
}

/* content in x by the remainder-sequence gcd itself */
static void prs_content(gs_poly *r, const gs_poly *a, int x,
                        const gs_polyctx *ctx)
{
    gs_poly t;
    long k;
    gs_poly_init(&t);
    gs_poly_zero(r);
    for (k = gs_poly_degree(a, x, ctx); k >= 0; k--) {
        gs_poly_coeff_var(&t, a, x, (unsigned)k, ctx);
        if (gs_poly_is_zero(&t))
            continue;
        if (gs_poly_is_zero(r))
            gs_poly_primitive(r, &t, ctx);
        else
            prs_gcd(r, r, &t, ctx);
        if (gs_poly_is_const(r, ctx))
            break;
    }
    gs_poly_clear(&t);
}

/* r = a / (its content in x), made primitive over Z */
static void prs_primitive(gs_poly *r, const gs_poly *a, int x,
                          const gs_polyctx *ctx)
{
    gs_poly c;
    gs_poly_init(&c);
    prs_content(&c, a, x, ctx);
    gs_poly_divexact(r, a, &c, ctx);
    gs_poly_primitive(r, r, ctx);
    gs_poly_clear(&c);
}

/* Pseudo-remainder: lc(b)^(da - db + 1) a = q b + r with deg r < db in x
   (Knuth, TAOCP vol. 2, 4.6.1, algorithm R). */
static void prem(gs_poly *r, const gs_poly *a, const gs_poly *b, int x,
                 const gs_polyctx *ctx)
{
    long db = gs_poly_degree(b, x, ctx), dr;
    long left = gs_poly_degree(a, x, ctx) - db + 1;
    gs_poly lb, lr, t;
    gs_poly_init(&lb);
    gs_poly_init(&lr);
    gs_poly_init(&t);
    gs_poly_coeff_var(&lb, b, x, (unsigned)db, ctx);
    gs_poly_set(r, a, ctx);
    while ((dr = gs_poly_degree(r, x, ctx)) >= db) {
        gs_poly_coeff_var(&lr, r, x, (unsigned)dr, ctx);
        gs_poly_set_var(&t, x, (unsigned)(dr - db), ctx);
        gs_poly_mul(&lr, &lr, &t, ctx);
        gs_poly_mul(&lr, &lr, b, ctx);
        gs_poly_mul(r, r, &lb, ctx);
        gs_poly_sub(r, r, &lr, ctx);
        left--;
    }
    if (left > 0 && !gs_poly_is_zero(r)) {  /* steps where a term was 0 */
        gs_poly_pow_ui(&t, &lb, (unsigned long)left, ctx);
        gs_poly_mul(r, r, &t, ctx);
    }
    gs_poly_clear(&lb);
    gs_poly_clear(&lr);
    gs_poly_clear(&t);
}

/* h = h^(1 - delta) g^delta, exact (Knuth's step C3) */
static void next_h(gs_poly *h, const gs_poly *g, long delta,
                   const gs_polyctx *ctx)
{
    gs_poly t;
    if (delta == 0)
        return;
    if (delta == 1) {
        gs_poly_set(h, g, ctx);
        return;
    }
    gs_poly_init(&t);
    gs_poly_pow_ui(&t, g, (unsigned long)delta, ctx);
    gs_poly_pow_ui(h, h, (unsigned long)(delta - 1), ctx);
    gs_poly_divexact(h, &t, h, ctx);
    gs_poly_clear(&t);
}

/* gcd of primitive u, v of positive degree in x, up to its content in
   the other variables: the subresultant remainder sequence (Knuth,
   TAOCP vol. 2, 4.6.1, algorithm C; Brown and Traub 1971, J. ACM 18),
   whose divisions by g h^delta are exact and keep the coefficients from
   growing exponentially without any gcd of contents on the way. */
static void prs_loop(gs_poly *d, gs_poly *u, gs_poly *v, int x,
                     const gs_polyctx *ctx)
{
    gs_poly r, g, h, t;
    gs_poly_init(&r);
    gs_poly_init(&g);
    gs_poly_init(&h);
    gs_poly_init(&t);
    gs_poly_set_si(&g, 1, ctx);
    gs_poly_set_si(&h, 1, ctx);
    if (gs_poly_degree(u, x, ctx) < gs_poly_degree(v, x, ctx))
        gs_poly_swap(u, v);
    for (;;) {
        long delta = gs_poly_degree(u, x, ctx) - gs_poly_degree(v, x, ctx);
        prem(&r, u, v, x, ctx);
        if (gs_poly_is_zero(&r)) {
            gs_poly_set(d, v, ctx);
            break;
        }
        if (gs_poly_degree(&r, x, ctx) == 0) {
            gs_poly_set_si(d, 1, ctx);
            break;
        }
        gs_poly_swap(u, v);                 /* u = v */
        gs_poly_pow_ui(&t, &h, (unsigned long)delta, ctx);
        gs_poly_mul(&t, &t, &g, ctx);
        gs_poly_divexact(v, &r, &t, ctx);   /* v = r / (g h^delta) */
        gs_poly_coeff_var(&g, u, x, (unsigned)gs_poly_degree(u, x, ctx),
                          ctx);
        next_h(&h, &g, delta, ctx);
    }
    gs_poly_clear(&r);
    gs_poly_clear(&g);
    gs_poly_clear(&h);
    gs_poly_clear(&t);
}

/* Recursively in the variables: gcd = gcd(contents in x) times the
   primitive part of the last nonzero subresultant remainder. */
static void prs_gcd(gs_poly *g, const gs_poly *a, const gs_poly *b,
                    const gs_polyctx *ctx)
{
    int x = prs_var(a, b, ctx);
    gs_poly ca, cb, pa, pb, d;
    if (x < 0) {
        gs_poly_set_si(g, 1, ctx);
        return;
    }
    gs_poly_init(&ca);
    gs_poly_init(&cb);
    gs_poly_init(&pa);
    gs_poly_init(&pb);
    gs_poly_init(&d);
    prs_content(&ca, a, x, ctx);
    prs_content(&cb, b, x, ctx);
    gs_poly_divexact(&pa, a, &ca, ctx);
    gs_poly_divexact(&pb, b, &cb, ctx);
    prs_gcd(&d, &ca, &cb, ctx);
    gs_poly_swap(g, &d);
    if (gs_poly_degree(&pa, x, ctx) > 0 && gs_poly_degree(&pb, x, ctx) > 0) {
        gs_poly_primitive(&pa, &pa, ctx);
        gs_poly_primitive(&pb, &pb, ctx);
        prs_loop(&d, &pa, &pb, x, ctx);
        prs_primitive(&d, &d, x, ctx);
        gs_poly_mul(g, g, &d, ctx);
    }
    gs_poly_primitive(g, g, ctx);
    gs_poly_clear(&ca);
    gs_poly_clear(&cb);
    gs_poly_clear(&pa);
    gs_poly_clear(&pb);
    gs_poly_clear(&d);
}

/* ---- the driver ------------------------------------------------------- */

/* Main variable: the one whose leading coefficients have fewest terms, so
   that gamma is cheap and likely to equal lc_x g; ties to the higher
   bound (fewer terms per x-degree to interpolate). */
static int choose_main(const long *bd, const tab *ta, const tab *tb, int n)
{
    int v, best = -1;
    double bs = 0;
    for (v = 0; v < n; v++) {
        double s;
        if (bd[v] <= 0)
            continue;
        s = (double)ta->nlead[v] * (double)tb->nlead[v];
        if (best < 0 || s < bs || (s == bs && bd[v] > bd[best])) {
            best = v;
            bs = s;
        }
    }
    return best;
}

/* gamma = gcd(lc_x a, lc_x b) over Z, integer content included */
static void lead_gcd(gs_poly *gam, const gs_poly *a, const gs_poly *b,
                     int x, const gs_polyctx *ctx, gs_rng *rng)
{
    gs_poly la, lb;
    gs_int ca, cb;
    gs_poly_init(&la);
    gs_poly_init(&lb);
    gs_int_init(&ca);
    gs_int_init(&cb);
    gs_poly_coeff_var(&la, a, x, (unsigned)gs_poly_degree(a, x, ctx), ctx);
    gs_poly_coeff_var(&lb, b, x, (unsigned)gs_poly_degree(b, x, ctx), ctx);
    gs_poly_content(&ca, &la);
    gs_poly_content(&cb, &lb);
    gs_int_gcd(&ca, &ca, &cb);
    gcd_nonzero(gam, &la, &lb, ctx, rng);
    gs_poly_mul_int(gam, gam, &ca, ctx);
    gs_poly_clear(&la);
    gs_poly_clear(&lb);
    gs_int_clear(&ca);
    gs_int_clear(&cb);
}

/* Does one operand look like the gcd (bounds equal to its degrees), and
   divide the other?  Then g = that operand. */
static int one_divides(gs_poly *g, const gs_poly *a, const gs_poly *b,
                       const tab *tb, const long *bd, const gs_polyctx *ctx)
{
    gs_poly q;
    int v, ok = 1;
    for (v = 0; v < ctx->nvars && ok; v++)
        ok = bd[v] == (long)tb->deg[v];
    if (!ok)
        return 0;
    gs_poly_init(&q);
    ok = gs_poly_divexact(&q, a, b, ctx) == GS_OK;
    if (ok)
        gs_poly_set(g, b, ctx);
    gs_poly_clear(&q);
    return ok;
}

/* One try of the modular method with main variable x: g = c gcd(a/c, b/c)
   for the certified divisor c it finds. */
static int modular_try(gs_poly *g, const gs_poly *a, const gs_poly *b,
                       int x, long *bd, const gs_polyctx *ctx, gs_rng *rng)
{
    gs_poly gam, c, qa, qb;
    int r;
    gs_poly_init(&gam);
    gs_poly_init(&c);
    gs_poly_init(&qa);
    gs_poly_init(&qb);
    lead_gcd(&gam, a, b, x, ctx, rng);
    r = modular_divisor(&c, &qa, &qb, a, b, &gam, x, bd, ctx, rng);
    if (r == R_OK) {
        gcd_nonzero(g, &qa, &qb, ctx, rng);
        gs_poly_mul(g, g, &c, ctx);
    }
    gs_poly_clear(&gam);
    gs_poly_clear(&c);
    gs_poly_clear(&qa);
    gs_poly_clear(&qb);
    return r;
}

/* ---- gcds that leave most variables out ------------------------------ */

/* Sorting terms by their exponents on the fields of a mask: each record
   is { nwords, masked exponent words ..., term index }, so that the
   comparison needs no state outside the records. */
static int cmp_records(const void *p, const void *q)
{
    const uint64_t *x = p, *y = q;
    size_t w, nw = (size_t)x[0];
    for (w = 1; w <= nw + 1; w++)       /* the index last: a stable sort */
        if (x[w] != y[w])
            return (w <= nw) == (x[w] > y[w]) ? -1 : 1;
    return 0;
}

/* The coefficient of a with the fewest terms, a taken as a polynomial in
   the variables of ymask; written as a polynomial in the other variables
   (its terms keep a's order, so it is canonical). */
static void smallest_coeff(gs_poly *r, const gs_poly *a,
                           const uint64_t *ymask, const gs_polyctx *ctx)
{
    size_t n = a->length, nw = (size_t)ctx->nwords, rs = nw + 2;
    size_t i, g, w, best = 0, best_len = SIZE_MAX;
    uint64_t *rec = gs_malloc((n + 1) * rs * sizeof *rec);
    for (i = 0; i < n; i++) {
        rec[i * rs] = nw;
        for (w = 0; w < nw; w++)
            rec[i * rs + 1 + w] = a->exps[i * nw + w] & ymask[w];
        rec[i * rs + 1 + nw] = i;
    }
    qsort(rec, n, rs * sizeof *rec, cmp_records);
    for (g = 0; g < n; g = i) {
        for (i = g + 1; i < n; i++)
            if (memcmp(rec + i * rs + 1, rec + g * rs + 1, nw * 8) != 0)
                break;
        if (i - g < best_len) {
            best_len = i - g;
            best = g;
        }
    }
    gs_poly_zero(r);
    gs_poly_fit(r, best_len, ctx);
    for (i = 0; i < best_len; i++) {
        size_t t = (size_t)rec[(best + i) * rs + 1 + nw];
        for (w = 0; w < nw; w++)
            r->exps[i * nw + w] = a->exps[t * nw + w] & ~ymask[w];
        gs_int_init(&r->coeffs[i]);
        gs_int_set(&r->coeffs[i], &a->coeffs[t]);
    }
    r->length = best_len;
    free(rec);
}

/* When the degree bounds leave out variables that a or b contain, the
   gcd g lies in the remaining variables X, so it divides every
   coefficient of a and of b taken as polynomials in the others: the gcd
   of one small coefficient of each is a multiple h of g, and if h divides
   a and b it is g.  Circuit determinants often share a factor of a few
   terms in a few symbols, which this finds from two small gcds and two
   exact divisions.  Returns 1 with g set, or 0 to go the general way. */
static int gcd_by_support(gs_poly *g, const gs_poly *a, const gs_poly *b,
                          const long *bd, const tab *ta, const tab *tb,
                          const gs_polyctx *ctx, gs_rng *rng)
{
    size_t nw = (size_t)ctx->nwords;
    uint64_t *ymask = gs_calloc(nw, sizeof *ymask);
    gs_poly ca, cb, h, q;
    int v, any = 0, ok = 0;
    for (v = 0; v < ctx->nvars; v++)
        if (bd[v] <= 0 && (ta->deg[v] > 0 || tb->deg[v] > 0)) {
            ymask[v / GS_POLY_VARS_PER_WORD] |=
                (uint64_t)GS_POLY_FIELD_MASK << gs_poly_field_shift(v);
            any = 1;
        }
    if (!any) {
        free(ymask);
        return 0;
    }
    gs_poly_init(&ca);
    gs_poly_init(&cb);
    gs_poly_init(&h);
    gs_poly_init(&q);
    smallest_coeff(&ca, a, ymask, ctx);
    smallest_coeff(&cb, b, ymask, ctx);
    gcd_nonzero(&h, &ca, &cb, ctx, rng);
    if (gs_poly_is_const(&h, ctx)) {
        gs_poly_set_si(g, 1, ctx);
        ok = 1;
    } else if (gs_poly_divexact(&q, a, &h, ctx) == GS_OK
               && gs_poly_divexact(&q, b, &h, ctx) == GS_OK) {
        gs_poly_swap(g, &h);
        ok = 1;
    }
    gs_poly_clear(&ca);
    gs_poly_clear(&cb);
    gs_poly_clear(&h);
    gs_poly_clear(&q);
    free(ymask);
    return ok;
}

/* a, b primitive, positive, free of monomial content, not constant. */
static void gcd_core(gs_poly *g, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx, gs_rng *rng)
{
    int n = ctx->nvars, x, tries, done = 0;
    long *bd = gs_malloc((size_t)(n > 0 ? n : 1) * sizeof *bd);
    tab ta, tb;
    pts pt;
    tab_init(&ta, a, ctx);
    tab_init(&tb, b, ctx);
    pts_init(&pt, &ta, &tb, n);
    if (degree_bounds(bd, &ta, &tb, &pt, rng) == 0) {
        gs_poly_set_si(g, 1, ctx);
        done = 1;
    }
    if (!done)
        done = gcd_by_support(g, a, b, bd, &ta, &tb, ctx, rng)
               || one_divides(g, a, b, &tb, bd, ctx)
               || one_divides(g, b, a, &ta, bd, ctx);
    for (tries = 0; !done && tries < MAX_RESTARTS; tries++) {
        x = choose_main(bd, &ta, &tb, n);
        if (x < 0) {            /* every bound fell to zero */
            gs_poly_set_si(g, 1, ctx);
            done = 1;
        } else {
            done = modular_try(g, a, b, x, bd, ctx, rng) == R_OK;
        }
    }
    if (!done)
        prs_gcd(g, a, b, ctx);
    tab_clear(&ta);
    tab_clear(&tb);
    pts_clear(&pt);
    free(bd);
}

/* gcd of nonzero a and b, primitive with positive leading coefficient;
   g may alias a or b. */
static void gcd_nonzero(gs_poly *g, const gs_poly *a, const gs_poly *b,
                        const gs_polyctx *ctx, gs_rng *rng)
{
    size_t nw = (size_t)ctx->nwords;
    uint64_t *ma = gs_malloc(3 * nw * sizeof *ma), *mb = ma + nw;
    uint64_t *mg = mb + nw;
    gs_poly A, B;
    gs_poly_init(&A);
    gs_poly_init(&B);
    gs_poly_primitive(&A, a, ctx);
    gs_poly_primitive(&B, b, ctx);
    gs_poly_monomial_content(ma, &A, ctx);
    gs_poly_monomial_content(mb, &B, ctx);
    mono_min(mg, ma, mb, ctx->nwords);
    gs_poly_div_monomial(&A, &A, ma, ctx);
    gs_poly_div_monomial(&B, &B, mb, ctx);
    if (gs_poly_is_const(&A, ctx) || gs_poly_is_const(&B, ctx))
        gs_poly_set_si(g, 1, ctx);
    else if (gs_poly_equal(&A, &B, ctx))
        gs_poly_swap(g, &A);
    else
        gcd_core(g, &A, &B, ctx, rng);
    if (!mono_is_one(mg, ctx->nwords))
        gs_poly_mul_monomial(g, g, mg, ctx);
    if (gs_poly_sgn(g) < 0)
        gs_poly_neg(g, g, ctx);
    gs_poly_clear(&A);
    gs_poly_clear(&B);
    free(ma);
}

/* One of a, b is a single term: the (primitive) gcd is the common
   monomial content, found without copying the other (transfer functions
   often have a one-term numerator). */
static void gcd_with_term(gs_poly *g, const gs_poly *a, const gs_poly *b,
                          const gs_polyctx *ctx)
{
    size_t nw = (size_t)ctx->nwords;
    uint64_t *ma = gs_malloc(2 * nw * sizeof *ma), *mb = ma + nw;
    gs_poly_monomial_content(ma, a, ctx);
    gs_poly_monomial_content(mb, b, ctx);
    mono_min(ma, ma, mb, ctx->nwords);
    gs_poly_set_si(g, 1, ctx);
    gs_poly_mul_monomial(g, g, ma, ctx);
    free(ma);
}

int gs_poly_gcd(gs_poly *g, const gs_poly *a, const gs_poly *b,
                const gs_polyctx *ctx)
{
    gs_poly t;
    gs_rng rng;
    gs_poly_init(&t);
    if (gs_poly_is_zero(a) && gs_poly_is_zero(b)) {
        gs_poly_zero(&t);
    } else if (gs_poly_is_zero(a)) {
        gs_poly_primitive(&t, b, ctx);
    } else if (gs_poly_is_zero(b)) {
        gs_poly_primitive(&t, a, ctx);
    } else if (a->length == 1 || b->length == 1) {
        gcd_with_term(&t, a, b, ctx);
    } else {
        gs_rng_seed(&rng, gs_poly_hash(a, ctx) * 0x9E3779B97F4A7C15u
                          ^ gs_poly_hash(b, ctx));
        gcd_nonzero(&t, a, b, ctx, &rng);
    }
    gs_poly_swap(g, &t);
    gs_poly_clear(&t);
    return GS_OK;
}
