/* numexact.h - the exact reference value of a circuit's output at one s.
 * See LICENSE.
 *
 * A floating-point solve of the MNA cannot tell a wrong formula from its
 * own lost digits when the values span many decades (a millohm resistor
 * beside a farad capacitor at 10 GHz).  Every long double is a dyadic
 * rational, so the point where `check` compares (the bound values and
 * s = j*omega, each taken as the exact rational its long double is) is a
 * rational point, and there the MNA can be solved without error: the
 * equations are stamped in Gaussian rationals and the output read off
 * two determinants of one fraction-free (Bareiss) elimination over the
 * Gaussian integers.  The only error left is the final rounding to long
 * double.  Like numsolve.c this stamps the circuit model again and shares
 * no code with the symbolic path.
 */
#ifndef GS_NUMEXACT_H
#define GS_NUMEXACT_H

#include <complex.h>

#include "circuit/circuit.h"
#include "base/diag.h"

/* What went wrong, for a caller that words its own message. */
typedef struct gs_numexact_why {
    int zero_sym;       /* a symbol whose value 0 made an element's
                           admittance infinite (1/R with R = 0), or -1 */
    int zero_elem;      /* that element, or -1 */
} gs_numexact_why;

/* H(s) of output `out` of c, with vals and s taken exactly.  *h gets the
   exact value rounded to long double.  GS_OK; GS_ESINGULAR when the
   equations have no unique solution at that point (the determinant is
   exactly zero); GS_EDIVZERO when a value is zero where an element needs
   its reciprocal (why says which); GS_ERANGE when a value or s is not
   finite; GS_EINEXACT when the output is a figure with a power that is
   not an integer, which has no exact value. why may be NULL. */
int gs_numsolve_exact(long double complex *h, const gs_circuit *c,
                      size_t out, const long double *vals,
                      long double complex s, gs_numexact_why *why);

#endif
