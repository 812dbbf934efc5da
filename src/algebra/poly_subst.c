/* poly_subst.c - substitution of a polynomial or a rational number for
 * one variable.  See LICENSE.
 *
 * Apart from poly.c because it multiplies: poly.c is storage and sums,
 * below the multiplier in poly_mul.c.
 */
#include "algebra/poly.h"

#include "base/mem.h"

#include <assert.h>
#include <stdlib.h>

/* The coefficients c_0 .. c_n of a in x_var (n = its degree, -1 for 0). */
static gs_poly *split_var(long *n, const gs_poly *a, int var,
                          const gs_polyctx *ctx)
{
    long d = gs_poly_degree(a, var, ctx), k;
    gs_poly *c = gs_malloc((size_t)(d + 1 > 0 ? d + 1 : 1) * sizeof *c);
    for (k = 0; k <= d; k++)
        gs_poly_init(&c[k]);
    if (d >= 0)
        gs_poly_coeffs_var(c, (size_t)d + 1, a, var, ctx);
    *n = d;
    return c;
}

static void free_split(gs_poly *c, long n)
{
    long k;
    for (k = 0; k <= n; k++)
        gs_poly_clear(&c[k]);
    gs_free(c);
}

/* Horner's rule in x_var: r = (..(c_n b + c_{n-1}) b + ..) b + c_0. */
void gs_poly_subst(gs_poly *r, const gs_poly *a, int var, const gs_poly *b,
                   const gs_polyctx *ctx)
{
    long n, k;
    gs_poly *c, t;
    assert(r != b);
    if (gs_poly_degree(a, var, ctx) <= 0) {
        gs_poly_set(r, a, ctx);
        return;
    }
    c = split_var(&n, a, var, ctx);
    gs_poly_init(&t);
    gs_poly_swap(&t, &c[n]);
    for (k = n - 1; k >= 0; k--) {
        gs_poly_mul(&t, &t, b, ctx);
        gs_poly_add(&t, &t, &c[k], ctx);
    }
    gs_poly_swap(r, &t);
    gs_poly_clear(&t);
    free_split(c, n);
}

/* r = sum c_k p^k q^(n-k) by Horner's rule: r_n = c_n,
   r_k = r_{k+1} p + c_k q^(n-k); scale = q^n. */
void gs_poly_subst_rat(gs_poly *r, gs_int *scale, const gs_poly *a, int var,
                       const gs_rat *v, const gs_polyctx *ctx)
{
    long n, k;
    gs_poly *c, t, u;
    gs_int qk;
    c = split_var(&n, a, var, ctx);
    gs_poly_init(&t);
    gs_poly_init(&u);
    gs_int_init(&qk);
    gs_int_set_si(&qk, 1);
    if (n >= 0)
        gs_poly_swap(&t, &c[n]);
    for (k = n - 1; k >= 0; k--) {
        gs_int_mul(&qk, &qk, &v->den);
        gs_poly_mul_int(&t, &t, &v->num, ctx);
        gs_poly_mul_int(&u, &c[k], &qk, ctx);
        gs_poly_add(&t, &t, &u, ctx);
    }
    gs_poly_swap(r, &t);
    gs_int_swap(scale, &qk);
    gs_int_clear(&qk);
    gs_poly_clear(&u);
    gs_poly_clear(&t);
    free_split(c, n);
}
