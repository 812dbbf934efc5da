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

/* The same for a transfer or an impedance, with a bound on its own error:
   LU with partial pivoting, refined with residuals in twice the working
   precision, for the solution and for the adjoint y (A^T y = c), whose
   entries weigh each equation's error into the output's (first order:
   delta h = y^T (r + delta b - delta A x) + delta c^T x, with the
   stamping's rounding bounded entry by entry).  *bound gets a bound on
   |*h - H| where H is the exact value at vals and s, or INFINITY when the
   solve cannot bound itself (it did not converge).  GS_OK, GS_EINVAL (a
   loop or a figure), GS_ESINGULAR (a zero pivot) or GS_ERANGE (an entry
   is not finite); no message, the caller decides. */
int gs_numsolve_bounded(long double complex *h, long double *bound,
                        const gs_circuit *c, size_t out,
                        const long double *vals, long double complex s);

/* The transfers h[k] from unit currents injected into the circuit to the
   output quantity of transfer `out` (every independent source of the
   circuit set to zero), all from one solve of the transposed system:
   with A x = b and the output c^T x, c^T A^-1 b_k = y^T b_k where
   A^T y = c, the adjoint network of S. W. Director and R. A. Rohrer,
   "The generalized adjoint network and network sensitivities", IEEE
   Trans. Circuit Theory 16 (1969).  Current k flows from node from[k]
   through its injector to node to[k], as an isource from[k] to[k] would.
   GS_OK, GS_EINVAL (out is not a transfer) or GS_ESINGULAR. */
int gs_numsolve_adjoint(long double complex *h, const gs_circuit *c,
                        size_t out, const long double *vals,
                        long double complex s, const int *from,
                        const int *to, size_t n, gs_diag *d);

#endif
