/* sqfree.c - squarefree factorisation in one variable (Yun's algorithm).
 * See LICENSE.
 *
 * D. Y. Y. Yun, "On square-free decomposition algorithms", Proc. ACM
 * SYMSAC 1976, 26-35; in the form of K. O. Geddes, S. R. Czapor and
 * G. Labahn, "Algorithms for Computer Algebra" (1992), algorithm 8.3:
 *   g = gcd(p, p'), c = p/g, d = p'/g - c';
 *   for k = 1, 2, ...: a_k = gcd(c, d), c = c/a_k, d = d/a_k - c'
 *   until c is free of x.
 * Over Z[x, y...] the gcds are taken in the whole ring; a factor free of
 * x that they carry has degree 0 in x and changes no count below.
 */
#include "algebra/sqfree.h"

#include <string.h>

#include "gainsmith.h"

static int too_big(const gs_poly *a, size_t max_terms)
{
    return max_terms != 0 && a->length > max_terms;
}

int gs_poly_sqfree_degrees(long *deg, int maxmult, const gs_poly *p, int x,
                           size_t max_terms, const gs_polyctx *ctx)
{
    gs_poly dp, g, c, d, a, t, dc;
    int k, rc = GS_OK;
    memset(deg, 0, (size_t)(maxmult + 1) * sizeof *deg);
    if (p->length == 0 || gs_poly_degree(p, x, ctx) <= 0)
        return GS_EINVAL;
    gs_poly_init(&dp);
    gs_poly_init(&g);
    gs_poly_init(&c);
    gs_poly_init(&d);
    gs_poly_init(&a);
    gs_poly_init(&t);
    gs_poly_init(&dc);
    gs_poly_derivative(&dp, p, x, ctx);
    gs_poly_gcd(&g, p, &dp, ctx);
    if (gs_poly_divexact(&c, p, &g, ctx) != GS_OK
        || gs_poly_divexact(&t, &dp, &g, ctx) != GS_OK) {
        rc = GS_EINVAL;     /* cannot happen: g divides both */
        goto done;
    }
    gs_poly_derivative(&dc, &c, x, ctx);
    gs_poly_sub(&d, &t, &dc, ctx);
    for (k = 1; gs_poly_degree(&c, x, ctx) > 0; k++) {
        if (too_big(&c, max_terms) || too_big(&d, max_terms)) {
            memset(deg, 0, (size_t)(maxmult + 1) * sizeof *deg);
            rc = GS_EBUDGET;
            goto done;
        }
        gs_poly_gcd(&a, &c, &d, ctx);
        deg[k < maxmult ? k : maxmult] += gs_poly_degree(&a, x, ctx);
        if (gs_poly_divexact(&t, &c, &a, ctx) != GS_OK) {
            rc = GS_EINVAL;
            goto done;
        }
        gs_poly_swap(&c, &t);
        if (gs_poly_divexact(&t, &d, &a, ctx) != GS_OK) {
            rc = GS_EINVAL;
            goto done;
        }
        gs_poly_derivative(&dc, &c, x, ctx);
        gs_poly_sub(&d, &t, &dc, ctx);
    }
done:
    gs_poly_clear(&dp);
    gs_poly_clear(&g);
    gs_poly_clear(&c);
    gs_poly_clear(&d);
    gs_poly_clear(&a);
    gs_poly_clear(&t);
    gs_poly_clear(&dc);
    return rc;
}
