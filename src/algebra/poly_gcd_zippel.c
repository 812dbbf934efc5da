/* poly_gcd_zippel.c - the modular method of the multivariate gcd:
 * Zippel's sparse interpolation mod p, lifting over Z and certification,
 * steps 3 and 4 of the method in poly_gcd.c.  See LICENSE.
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
 * 4. Certification: the candidate is accepted only if it divides both
 *    operands exactly, so probabilistic choices affect only the running
 *    time.
 */
#include "algebra/poly_gcd_impl.h"

#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"

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
    gs_free(s->ex);
    gs_free(s->c);
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
    gs_pgcd_tab_init(&z->ta, a, ctx);
    gs_pgcd_tab_init(&z->tb, b, ctx);
    gs_pgcd_tab_init(&z->tg, gam, ctx);
    gs_pgcd_tab_set_main(&z->ta, x);
    gs_pgcd_tab_set_main(&z->tb, x);
    gs_pgcd_tab_set_main(&z->tg, -1);
    z->m = 0;
    for (v = 0; v < n; v++) {
        long d = v == x ? 0 : bd[v] + (long)z->tg.deg[v];
        if (d > 0) {
            z->y[z->m] = v;
            z->dy[z->m++] = d;
        }
        z->isy[v] = v == x || d > 0;
    }
    gs_pgcd_pts_init(&z->pt, &z->ta, &z->tb, n);
    gs_nmod_poly_init(&z->ax);
    gs_nmod_poly_init(&z->bx);
    gs_nmod_poly_init(&z->gx);
}

static void zctx_clear(zctx *z)
{
    gs_free(z->y);
    gs_free(z->dy);
    gs_free(z->isy);
    gs_pgcd_tab_clear(&z->ta);
    gs_pgcd_tab_clear(&z->tb);
    gs_pgcd_tab_clear(&z->tg);
    gs_pgcd_pts_clear(&z->pt);
    gs_nmod_poly_clear(&z->ax);
    gs_nmod_poly_clear(&z->bx);
    gs_nmod_poly_clear(&z->gx);
}

/* A new prime, with the variables outside (x, y) at new values: G is free
   of them, so only their luck matters. */
static void zctx_new_prime(zctx *z)
{
    z->p = gs_nmod_random_prime(z->rng);
    gs_pgcd_tab_reduce(&z->ta, z->p);
    gs_pgcd_tab_reduce(&z->tb, z->p);
    gs_pgcd_tab_reduce(&z->tg, z->p);
    gs_pgcd_pts_randomise(&z->pt, z->rng, z->p);
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
    gs_pgcd_pts_fill(&z->pt, z->p);
    gs_pgcd_tab_eval(&z->gx, &z->tg, &z->pt, z->p);
    gs_pgcd_tab_eval(&z->ax, &z->ta, &z->pt, z->p);
    gs_pgcd_tab_eval(&z->bx, &z->tb, &z->pt, z->p);
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
    gs_free(H);
    gs_free(xs);
    gs_free(ys);
    gs_free(row);
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
    gs_free(w);
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
    gs_pgcd_pts_fill(&z->pt, z->p);
    for (k = 0; k < nts; k++) {
        rs[k].cur = gs_malloc((ts[k]->n + 1) * sizeof *rs[k].cur);
        rs[k].rat = gs_malloc((ts[k]->n + 1) * sizeof *rs[k].rat);
        rs[k].pre = gs_malloc((ts[k]->n + 1) * sizeof *rs[k].pre);
        for (i = 0; i < ts[k]->n; i++)
            rs[k].cur[i] = gs_pgcd_term_value(ts[k], i, &z->pt, z->p);
    }
    for (l = 0; l < nv; l++)
        z->pt.val[l] = 1;
    for (l = 0; l < nz; l++)
        z->pt.val[z->y[l]] = zeta[l];
    gs_pgcd_pts_fill(&z->pt, z->p);
    for (k = 0; k < nts; k++)
        for (i = 0; i < ts[k]->n; i++) {
            rs[k].rat[i] = term_monomial(ts[k], i, &z->pt, z->p);
            rs[k].pre[i] = gs_nmod_shoup_pre(rs[k].rat[i], z->p);
        }
    memcpy(z->pt.val, save, (size_t)nv * sizeof *save);
    gs_free(save);
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
        gs_free(rs[k].cur);
        gs_free(rs[k].rat);
        gs_free(rs[k].pre);
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
    gs_free(H);
    gs_free(start);
    gs_free(zeta);
    gs_free(v);
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
    gs_free(ys);
    gs_free(row);
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
    gs_free(bx);
    gs_free(cv);
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
    gs_free(e);
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
    gs_pgcd_tab_reduce(tc, z->p);
    gs_pgcd_tab_reduce(ta, z->p);
    gs_pgcd_tab_eval(&z->gx, tc, &z->pt, z->p);
    gs_pgcd_tab_eval(&z->ax, ta, &z->pt, z->p);
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
    gs_pgcd_tab_init(&tc, c, z->ctx);
    gs_pgcd_tab_set_main(&tc, z->x);
    z->p = gs_nmod_random_prime(z->rng);
    gs_pgcd_pts_randomise(&z->pt, z->rng, z->p);
    z->pt.val[z->x] = 1;
    gs_pgcd_pts_fill(&z->pt, z->p);
    ok = maybe_divides(&tc, &z->ta, z) && maybe_divides(&tc, &z->tb, z);
    gs_pgcd_tab_clear(&tc);
    ok = ok && gs_poly_divexact(qa, a, c, z->ctx) == GS_OK
         && gs_poly_divexact(qb, b, c, z->ctx) == GS_OK;
    return ok;
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
        gs_pgcd_content_in(&k, c, z->x, z->ctx, z->rng);
        if (!gs_poly_is_const(&k, z->ctx)
            && gs_poly_divexact(c, c, &k, z->ctx) == GS_OK) {
            gs_poly_primitive(c, c, z->ctx);
            ok = !gs_poly_is_const(c, z->ctx)
                 && divides_both(qa, qb, c, a, b, z);
        }
    }
    gs_poly_clear(&k);
    gs_free(mono);
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
    gs_free(X);
    gs_free(res);
    return r;
}

/* A certified nonconstant common divisor c of a and b with cofactors, by
   the modular method with main variable x.  R_LOWER when the bound in x
   dropped (bd[x] updated). */
int gs_pgcd_modular_divisor(gs_poly *c, gs_poly *qa, gs_poly *qb,
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
