/* minors.h - determinants of a bordered MNA matrix by expansion in minors.
 * See LICENSE.
 *
 * Laplace expansion along one row at a time, each minor computed once and
 * kept by its set of columns (Gentleman and Johnson, "Analysis of
 * algorithms, a case study: determinants of matrices with polynomial
 * entries", ACM TOMS 2(3), 1976, found expansion by minors faster than
 * elimination on sparse symbolic matrices).  Every step multiplies a
 * matrix entry - a few terms, a conductance sum or a gain - by a smaller
 * minor and adds; nothing is ever divided.  Elimination instead divides
 * products of two large entries by a third at every step, which is where
 * it spends its time on networks without a chain structure.
 *
 * Both determinants come out of one expansion.  The rows of [A b] are
 * expanded and the minors kept by column set; det A is the minor without
 * the column b, and det M, expanded along its border row c, is
 *
 *     det M = sum_j (-1)^(n+j) c_j minor(all columns but j).
 *
 * The same holds for M's transpose (columns of A with the border row c,
 * expanded against b); the plan picks the orientation and the row order
 * that need fewer products.  The number of minors grows with how far the
 * rows reach across the matrix, so a plan that would exceed a budget is
 * refused and the caller eliminates instead.
 */
#ifndef GS_MINORS_H
#define GS_MINORS_H

#include <stdio.h>

#include "base/diag.h"
#include "analysis/mna.h"
#include "algebra/poly.h"

/* The largest matrix the level plan takes: a column set is one 64-bit
   mask of the n + 1 columns of [A b].  Past it, the same expansion is
   built as the graph of minors (mgraph.h, masks of any width) and its two
   roots expanded under the same budgets. */
#define GS_MINORS_MAX_UNKNOWNS 63

/* With a term budget N, the minors kept at one time (two levels of the
   expansion) may hold at most this many times N terms in all: the memory
   bound that a budget per minor alone would not give. */
#define GS_MINORS_KEPT_FACTOR 8

typedef struct gs_minors_opts {
    size_t max_terms;     /* budget per minor, and GS_MINORS_KEPT_FACTOR
                             times it for all minors kept; 0 = unlimited */
    size_t max_products;  /* refuse a plan with more entry x minor
                             products; 0 = unlimited */
    size_t max_bytes;     /* storage of the minors kept at once
                             (gs_poly_storage); 0 = unlimited */
    FILE *progress;       /* level counter written here, or NULL */
} gs_minors_opts;

typedef struct gs_minors_stats {
    size_t minors;        /* minors the plan keeps, all levels */
    size_t products;      /* entry x minor products of the plan */
    size_t max_minor_terms;
    int transposed;       /* 1: expanded along the columns of A */
    int exp_overflow;     /* 1: the GS_ERANGE returned is an exponent
                             overflow, with its message in d */
} gs_minors_stats;

/* Defaults: no term budget, at most 200000 products, no progress. */
void gs_minors_opts_default(gs_minors_opts *o);

/* det A and det M of m (unchanged) up to one common sign, so that
   H = scale * (c0 det_a - det_m) / det_a (mna.h).  Returns GS_OK;
   GS_ERANGE, with no message, when the plan (past GS_MINORS_MAX_UNKNOWNS
   unknowns, the graph) needs more than o->max_products products (the
   caller eliminates instead); GS_ESINGULAR, with no message, when
   det A = 0 (elimination can say which unknowns are undetermined);
   GS_EBUDGET, with a message in d, when a minor outgrew o->max_terms or
   the minors kept at once GS_MINORS_KEPT_FACTOR times that; GS_ERANGE
   with a message in d and stats->exp_overflow set when a power of a
   symbol would pass GS_POLY_MAX_EXP (checked before each product, so
   never an assert).  stats may be NULL. */
int gs_minors_bordered(gs_poly *det_a, gs_poly *det_m, const gs_mna *m,
                       const gs_polyctx *ctx, const gs_minors_opts *o,
                       gs_minors_stats *stats, gs_diag *d);

#endif
