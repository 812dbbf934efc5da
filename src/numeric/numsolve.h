/* numsolve.h - an independent numeric solve of a circuit at one s.
 * See LICENSE.
 *
 * The check on the symbolic path: the same circuit stamped again, here
 * with numbers (long double complex) instead of polynomials, and solved by
 * LU factorisation with partial pivoting.  It shares no code with mna.c or
 * elim.c on purpose, so that a mistake in one shows up as a disagreement.
 */
#ifndef GS_NUMSOLVE_H
#define GS_NUMSOLVE_H

#include <complex.h>

#include "circuit/circuit.h"
#include "base/diag.h"

/* H(s) of output `out` of c with the symbol values vals (every symbol the
   circuit uses must be bound).  GS_OK, or GS_ESINGULAR when the numeric
   matrix is singular at s (with a message in d). */
int gs_numsolve(long double complex *h, const gs_circuit *c, size_t out,
                const long double *vals, long double complex s, gs_diag *d);

#endif
