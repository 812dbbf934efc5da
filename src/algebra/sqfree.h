/* sqfree.h - squarefree factorisation in one variable. See LICENSE.
 *
 * p = prod_k a_k^k with the a_k squarefree and pairwise coprime in the
 * variable x (Yun 1976), over Z[x, other symbols]: the exact
 * multiplicities of p's roots in x, whatever values the other symbols
 * take (generically).  The poles command uses it to confirm that a
 * cluster of numeric roots is one multiple root of the exact polynomial.
 */
#ifndef GS_SQFREE_H
#define GS_SQFREE_H

#include <stddef.h>

#include "algebra/poly.h"

/* deg[k] (k = 1 .. maxmult) gets the degree in x of a_k, the product of
   the factors of p of multiplicity exactly k (0 when there is none;
   deg[0] is unused and set to 0).  A factor of multiplicity above
   maxmult is counted in deg[maxmult].  Gives up (returns GS_EBUDGET,
   deg all 0) when an intermediate polynomial passes max_terms terms;
   GS_EINVAL when p is free of x or zero; else GS_OK. */
int gs_poly_sqfree_degrees(long *deg, int maxmult, const gs_poly *p, int x,
                           size_t max_terms, const gs_polyctx *ctx);

#endif
