/* poly_gcd_prs.c - the subresultant remainder sequence, the fallback
 * of the multivariate gcd: step 5 of the method in poly_gcd.c.
 * See LICENSE.
 *
 * 5. If the modular method keeps failing, the subresultant remainder
 *    sequence (Knuth, TAOCP vol. 2, 4.6.1, algorithm C; Collins 1967,
 *    J. ACM 14; Brown and Traub 1971, J. ACM 18), with contents taken
 *    recursively, decides: slow in many variables but unconditionally
 *    correct.
 */
#include "algebra/poly_gcd_impl.h"

/* ---- step 5: subresultant remainder sequence -------------------------- */

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

/* r = the gcd of a's coefficients in x (a primitive polynomial): by the
   modular method with rng, by the remainder-sequence gcd itself with rng
   NULL (the fallback never calls back into the method that failed). */
void gs_pgcd_content_in(gs_poly *r, const gs_poly *a, int x,
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
        else if (rng != NULL)
            gs_pgcd_nonzero(r, r, &t, ctx, rng);
        else
            gs_pgcd_prs(r, r, &t, ctx);
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
    gs_pgcd_content_in(&c, a, x, ctx, NULL);
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
void gs_pgcd_prs(gs_poly *g, const gs_poly *a, const gs_poly *b,
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
    gs_pgcd_content_in(&ca, a, x, ctx, NULL);
    gs_pgcd_content_in(&cb, b, x, ctx, NULL);
    gs_poly_divexact(&pa, a, &ca, ctx);
    gs_poly_divexact(&pb, b, &cb, ctx);
    gs_pgcd_prs(&d, &ca, &cb, ctx);
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
