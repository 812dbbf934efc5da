/* mna.h - modified nodal analysis: circuit -> bordered polynomial matrix.
 * See LICENSE.
 *
 * For one output of a circuit, gs_mna_build writes the system A x = b
 * (node voltages, then the branch currents of inductors, voltage sources,
 * VCVS, CCVS and op-amp outputs) bordered by the output row c:
 *
 *         [ A    b ]        H = c^T A^-1 b + c0
 *     M = [ c^T  0 ]          = (c0 det A - det M) / det A
 *
 * so that one fraction-free elimination of M, pivoting inside A only,
 * yields det A in its last pivot and det M in the border corner
 * (elim.h).  Entries are polynomials over Z in the circuit's symbols,
 * resistors stamped as reciprocal symbols 1/R (DESIGN.md).  Rational
 * element values are cleared row by row: scaling a row of A scales det A
 * and det M alike, and the border row's scale is kept in `scale`.
 */
#ifndef GS_MNA_H
#define GS_MNA_H

#include "circuit/circuit.h"
#include "base/diag.h"
#include "algebra/poly.h"

typedef struct gs_mna {
    int n;              /* unknowns: size of A; M is (n+1) x (n+1) */
    gs_poly *m;         /* row-major (n+1)^2 entries of M */
    gs_poly c0;         /* direct feed-through of the output */
    gs_rat scale;       /* H = scale * (c0 det A - det M) / det A */
    int nnode_unknowns; /* unknowns 0 .. nnodes-2 are node voltages */
    char **unknown_name;/* "v(out)", "i(L1)": for messages */
} gs_mna;

/* Intern every symbol the stamps of c need (reciprocals of resistor
   values, ...) so that a context can be made before building. */
void gs_mna_intern_symbols(gs_circuit *c);

/* Build M for output `out` of c (an index into c->outputs).  ctx must
   cover every symbol of c's table.  Returns GS_OK or GS_EINVAL (with a
   message in d: e.g. a current-controlled source whose control loops back
   on itself).  On success the caller owns m (gs_mna_clear). */
int gs_mna_build(gs_mna *m, const gs_circuit *c, size_t out,
                 const gs_polyctx *ctx, gs_diag *d);
void gs_mna_clear(gs_mna *m);

/* Entry (i, j) of M, a gs_poly pointer. */
#define GS_MNA_AT(mna, i, j) \
    (&(mna)->m[(size_t)(i) * (size_t)((mna)->n + 1) + (size_t)(j)])

#endif
