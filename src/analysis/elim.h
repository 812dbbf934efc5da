/* elim.h - fraction-free elimination of a bordered MNA matrix.
 * See LICENSE.
 *
 * Bareiss's one-step fraction-free elimination (Bareiss 1968, Math. Comp.
 * 22, 565-578): after step k every remaining entry is a (k+1)-minor of
 * the matrix, and each step divides exactly by the previous pivot, so the
 * entries stay polynomials.  Circuit matrices are sparse, and a row that
 * the pivot column does not touch would only be multiplied by the new
 * pivot and divided by the old one; instead each row remembers the step
 * it was last brought up to date, and its true entries are its stored ones
 * times det_k / det_last.  Touching such a row later folds the scale into
 * the one update it needs:
 *
 *     new_ij = (p_k * S_ij - S_ic * T_rj) / det_last(i)
 *
 * (derived from Bareiss's update with T = S * det_{k-1} / det_last), so
 * untouched rows cost nothing and a tridiagonal ladder needs no division
 * by a large polynomial at all.
 */
#ifndef GS_ELIM_H
#define GS_ELIM_H

#include <stdio.h>

#include "base/diag.h"
#include "analysis/mna.h"
#include "algebra/poly.h"

typedef enum gs_pivot_rule {
    GS_PIVOT_MINWORK,    /* least estimated work of the step's products,
                            one-term pivots weighted 4 times lighter */
    GS_PIVOT_MARKOWITZ,  /* least fill (r-1)(c-1), then fewest terms */
    GS_PIVOT_MINTERMS,   /* fewest terms in the pivot, then least fill */
    GS_PIVOT_NATURAL     /* first nonzero in the first remaining column */
} gs_pivot_rule;

/* A step's product ad - bc is divided exactly by the previous pivot: it
   may hold more terms than the entry it gives, but not more than this
   many times the budget per entry. */
#define GS_ELIM_PRODUCT_FACTOR 8

/* The term budget N bounds the work too: the products of a derivation may
   multiply at most GS_WORK_PER_TERM * N pairs of terms in all, each pair
   counted once per 64-bit word of its exponents (so that terms holding
   many symbols weigh more).  The expansion in minors uses the same rule. */
#define GS_WORK_PER_TERM 1000

typedef struct gs_elim_opts {
    size_t max_terms;        /* budget per entry, and GS_ELIM_PRODUCT_FACTOR
                                times it for a product before its exact
                                division; 0 = unlimited */
    size_t max_bytes;        /* storage of all live entries and the
                                product at hand (gs_poly_storage);
                                0 = unlimited */
    gs_pivot_rule pivot;
    FILE *progress;          /* step counter written here, or NULL */
} gs_elim_opts;

typedef struct gs_elim_stats {
    int steps;
    size_t max_entry_terms;  /* largest entry seen */
    size_t big_divisions;    /* exact divisions by a non-constant pivot */
} gs_elim_stats;

/* Defaults: no budget, GS_PIVOT_MINWORK, no progress. */
void gs_elim_opts_default(gs_elim_opts *o);

/* Eliminate m in place (its entries are consumed).  On GS_OK, det_a is
   det A and det_m is det M up to one common sign, so that
   H = scale * (c0 det_a - det_m) / det_a (mna.h).  GS_ESINGULAR when A is
   singular; GS_EBUDGET when an entry outgrew o->max_terms; each with a
   message in d.  stats may be NULL. */
int gs_elim_bordered(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                     const gs_polyctx *ctx, const gs_elim_opts *o,
                     gs_elim_stats *stats, gs_diag *d);

#endif
