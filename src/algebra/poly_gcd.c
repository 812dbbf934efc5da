/* poly_gcd.c - multivariate polynomial gcd over Z: the method, its
 * driver and the entry point.  See LICENSE.
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
 * 2. Degree bounds, which double as a coprimality certificate
 *    (poly_gcd_eval.c).  Every bound zero means g = 1.
 *
 * 3. Otherwise a candidate comes from Zippel's sparse modular method
 *    (poly_gcd_zippel.c), with main variable x and gamma = gcd(lc_x a,
 *    lc_x b), a gcd in fewer variables computed here recursively.
 *
 * 4. Certification: the candidate C (G with its content removed, and its
 *    content in x removed if need be) is accepted only if it divides both
 *    operands exactly.  Then gcd(a, b) = C gcd(a/C, b/C) for any such
 *    common divisor, so a candidate need not even be the whole gcd: the
 *    cofactors go round again, and are normally certified coprime by
 *    step 2.  Probabilistic choices thus affect only the running time.
 *
 * 5. If the modular method keeps failing, the subresultant remainder
 *    sequence decides (poly_gcd_prs.c).
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
#include "algebra/poly_gcd_impl.h"

#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"

/* ---- packed exponents ------------------------------------------------ */

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
    gs_pgcd_nonzero(gam, &la, &lb, ctx, rng);
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
    r = gs_pgcd_modular_divisor(&c, &qa, &qb, a, b, &gam, x, bd, ctx, rng);
    if (r == R_OK) {
        gs_pgcd_nonzero(g, &qa, &qb, ctx, rng);
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
    gs_free(rec);
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
        gs_free(ymask);
        return 0;
    }
    gs_poly_init(&ca);
    gs_poly_init(&cb);
    gs_poly_init(&h);
    gs_poly_init(&q);
    smallest_coeff(&ca, a, ymask, ctx);
    smallest_coeff(&cb, b, ymask, ctx);
    gs_pgcd_nonzero(&h, &ca, &cb, ctx, rng);
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
    gs_free(ymask);
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
    gs_pgcd_tab_init(&ta, a, ctx);
    gs_pgcd_tab_init(&tb, b, ctx);
    gs_pgcd_pts_init(&pt, &ta, &tb, n);
    if (gs_pgcd_degree_bounds(bd, &ta, &tb, &pt, rng) == 0) {
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
        gs_pgcd_prs(g, a, b, ctx);
    gs_pgcd_tab_clear(&ta);
    gs_pgcd_tab_clear(&tb);
    gs_pgcd_pts_clear(&pt);
    gs_free(bd);
}

/* gcd of nonzero a and b, primitive with positive leading coefficient;
   g may alias a or b. */
/* a with its integer and monomial content taken out: a itself when both
   are trivial (derive.c has taken them out already, and a copy of a
   large determinant cost 5 % of a derivation), else a reduced copy in
   *buf.  mono gets a's monomial content. */
static const gs_poly *reduced(gs_poly *buf, uint64_t *mono, const gs_poly *a,
                              const gs_polyctx *ctx)
{
    gs_int c;
    int unit;
    gs_int_init(&c);
    gs_poly_content(&c, a);
    unit = gs_int_cmp_si(&c, 1) == 0 || gs_int_cmp_si(&c, -1) == 0;
    gs_int_clear(&c);
    gs_poly_monomial_content(mono, a, ctx);
    if (unit && mono_is_one(mono, ctx->nwords))
        return a;           /* the sign does not matter to a gcd */
    gs_poly_primitive(buf, a, ctx);
    gs_poly_div_monomial(buf, buf, mono, ctx);
    return buf;
}

void gs_pgcd_nonzero(gs_poly *g, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx, gs_rng *rng)
{
    size_t nw = (size_t)ctx->nwords;
    uint64_t *ma = gs_malloc(3 * nw * sizeof *ma), *mb = ma + nw;
    uint64_t *mg = mb + nw;
    const gs_poly *pa, *pb;
    gs_poly A, B;
    gs_poly_init(&A);
    gs_poly_init(&B);
    pa = reduced(&A, ma, a, ctx);
    pb = reduced(&B, mb, b, ctx);
    mono_min(mg, ma, mb, ctx->nwords);
    if (gs_poly_is_const(pa, ctx) || gs_poly_is_const(pb, ctx))
        gs_poly_set_si(g, 1, ctx);
    else if (gs_poly_equal(pa, pb, ctx))
        gs_poly_set(g, pa, ctx);
    else
        gcd_core(g, pa, pb, ctx, rng);
    if (!mono_is_one(mg, ctx->nwords))
        gs_poly_mul_monomial(g, g, mg, ctx);
    if (gs_poly_sgn(g) < 0)
        gs_poly_neg(g, g, ctx);
    gs_poly_clear(&A);
    gs_poly_clear(&B);
    gs_free(ma);
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
    gs_free(ma);
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
        gs_pgcd_nonzero(&t, a, b, ctx, &rng);
    }
    gs_poly_swap(g, &t);
    gs_poly_clear(&t);
    return GS_OK;
}
