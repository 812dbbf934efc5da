/* test_sqfree.c - squarefree factorisation in one variable. See LICENSE.
 *
 * The expected degrees are facts of algebra: p = prod a_k^k with the a_k
 * squarefree and coprime has, for each k, deg a_k roots of multiplicity
 * exactly k; (x - a)^k has one root of multiplicity k; distinct linear
 * factors are coprime.
 */
#include <string.h>

#include "check.h"
#include "gainsmith.h"
#include "algebra/poly.h"
#include "algebra/sqfree.h"
#include "algebra/sym.h"

static gs_symtab *st;
static gs_polyctx *ctx;
static int s_var;

/* The degrees for the polynomial written as text; rc returned. */
static int degrees(long *deg, int maxm, const char *text)
{
    gs_poly p;
    int rc;
    gs_poly_init(&p);
    CHECK(gs_poly_set_str(&p, text, ctx) == GS_OK);
    rc = gs_poly_sqfree_degrees(deg, maxm, &p, s_var, 0, ctx);
    gs_poly_clear(&p);
    return rc;
}

int main(void)
{
    long d[8];
    st = gs_symtab_new();
    s_var = gs_symtab_intern(st, "s");
    gs_symtab_intern(st, "gm");
    gs_symtab_intern(st, "C");
    gs_symtab_intern(st, "R");
    ctx = gs_polyctx_new(st, gs_symtab_count(st));

    /* (C s - gm)^6: one root of multiplicity 6 */
    CHECK(degrees(d, 7, "(C*s - gm)^6") == GS_OK);
    CHECK(d[6] == 1 && d[1] == 0 && d[2] == 0 && d[5] == 0);
    /* (R C s + 1) (s + gm)^2 (s - 1)^3 s: multiplicities 1, 1, 2, 3 */
    CHECK(degrees(d, 7, "(R*C*s + 1)*(s + gm)^2*(s - 1)^3*s") == GS_OK);
    CHECK(d[1] == 2 && d[2] == 1 && d[3] == 1 && d[4] == 0);
    /* a factor free of s changes nothing: R^4 (s + 1) */
    CHECK(degrees(d, 7, "R^4*(s + 1)") == GS_OK);
    CHECK(d[1] == 1 && d[2] == 0 && d[4] == 0);
    /* squarefree: (s + R)(s + C) has two simple roots, though R = C
       would make them one (a numeric coincidence, not a factor) */
    CHECK(degrees(d, 7, "(s + R)*(s + C)") == GS_OK);
    CHECK(d[1] == 2 && d[2] == 0);
    /* a multiplicity past maxmult is counted at maxmult */
    CHECK(degrees(d, 3, "(s + 1)^5") == GS_OK);
    CHECK(d[3] == 1 && d[1] == 0);
    /* free of s: nothing to factor */
    CHECK(degrees(d, 3, "R*C") == GS_EINVAL);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
    return check_report("sqfree");
}
