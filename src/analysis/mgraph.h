/* mgraph.h - determinants held implicitly: the graph of shared minors.
 * See LICENSE.
 *
 * The expansion in minors of minors.h, kept unexpanded.  Every minor the
 * expansion reaches is a node, kept once by its set of columns; an edge
 * from a minor to a smaller one carries the matrix entry (a polynomial in
 * the symbols and s) and the sign of that cofactor.  The determinant is
 * the sum over all paths from its root to the empty minor of the products
 * of the entries along the path: a determinant decision diagram (Shi and
 * Tan, "Canonical symbolic analysis of large analog circuits with
 * determinant decision diagrams", IEEE TCAD 19(1), 2000), built layer by
 * layer by hashing minors (G. Shi, "A simple implementation of
 * determinant decision diagram", ICCAD 2010).  Column sets are masks of
 * as many 64-bit words as the matrix needs, so any size is accepted.
 *
 * The graph has three roots: D = det A, M = det M and N = c0 det A -
 * det M, so that H = scale * N / D (mna.h).  Numbers come from one pass
 * over the graph, children before parents; terms come out best-first
 * (mgraph_terms.c) without expanding.  The graph owns copies of the
 * entries and borrows the context.
 */
#ifndef GS_MGRAPH_H
#define GS_MGRAPH_H

#include <complex.h>
#include <stddef.h>
#include <stdint.h>

#include "analysis/mna.h"
#include "algebra/int.h"
#include "algebra/poly.h"
#include "algebra/rat.h"
#include "base/diag.h"

/* Row orders the builder can use (docs/engine.md has the measurements). */
typedef enum gs_mgraph_order {
    GS_MGRAPH_ORDER_GREEDY,   /* the row leaving the fewest next minors */
    GS_MGRAPH_ORDER_NATURAL,  /* rows as the MNA numbers them */
    GS_MGRAPH_ORDER_SPARSE    /* the row with the fewest live entries */
} gs_mgraph_order;

typedef struct gs_mgraph {
    const gs_polyctx *ctx;  /* borrowed */
    int n;                  /* unknowns */
    int transposed;         /* 1: expanded along the columns of A */
    size_t nnodes;          /* children have smaller ids; node 0 is the
                               empty minor (value 1) */
    size_t nedges;
    size_t *first;          /* edges of node v: first[v] .. first[v+1]-1 */
    uint32_t *child;
    uint32_t *entry;        /* index into entries */
    unsigned char *neg;     /* 1: the edge subtracts */
    int *level;             /* rows left to expand below the node */
    gs_poly *entries;       /* (n+1)^2 cells of the view, then c0 */
    size_t nentries;
    size_t root_d, root_m, root_n;  /* SIZE_MAX when the root is zero */
    gs_rat scale;           /* H = scale * N / D */
} gs_mgraph;

/* Build the graph of m (which is not kept) with the given row order,
   trying both orientations and keeping the one with fewer edges.  The
   column sets held while it is built may take max_bytes (0: no limit):
   a circuit's graph has hundreds to thousands of nodes, but a dense
   matrix has exponentially many minors.  Returns GS_OK, GS_ESINGULAR
   when det A is zero by structure, or GS_EBUDGET when both orientations
   outgrow max_bytes; g is to be cleared in every case. */
int gs_mgraph_build(gs_mgraph *g, const gs_mna *m, gs_mgraph_order order,
                    size_t max_bytes, const gs_polyctx *ctx);
/* The error for a graph refused by its budget of max_bytes. */
void gs_mgraph_refused(gs_diag *d, size_t max_bytes);
void gs_mgraph_clear(gs_mgraph *g);

/* The number of paths from `root` to the empty minor, counting an edge
   as many times as its entry has terms: the number of terms of the full
   expansion before equal monomials are combined (exactly the term count
   where nothing cancels).  0 for a zero root. */
void gs_mgraph_count_paths(gs_int *r, const gs_mgraph *g, size_t root);

/* N and D at one point, vals[v] the value of every variable of the
   context (reciprocal symbols included), in one pass. */
void gs_mgraph_eval_lc(long double complex *num, long double complex *den,
                       const gs_mgraph *g, const long double complex *vals);
/* The same exactly, at rational values. */
void gs_mgraph_eval_rat(gs_rat *num, gs_rat *den, const gs_mgraph *g,
                        const gs_rat *vals);
/* The numeric coefficients of N and D in powers of the variable s_var,
   the other variables at vals: new arrays (ascending powers) the caller
   frees, degrees in *dn, *dd (-1 for zero).  Each node carries its
   polynomial in s through the pass.  s_var = -1: no variable split off
   (one coefficient, the value). */
void gs_mgraph_coeffs_ld(long double **cn, int *dn, long double **cd,
                         int *dd, const gs_mgraph *g, int s_var,
                         const long double *vals);

/* The same for every node, unscaled: node v's coefficients are
   c[off[v] .. off[v+1]-1], ascending (both arrays new, caller frees). */
long double *gs_mgraph_node_coeffs(size_t **off, const gs_mgraph *g,
                                   int s_var, const long double *vals);

/* The full expansion of one root, without budgets (tests; derive past
   63 unknowns expands both roots under its budgets, minors.c).
   Returns GS_OK, or GS_EBUDGET when a node outgrows max_terms (0 for no
   limit). */
int gs_mgraph_expand(gs_poly *r, const gs_mgraph *g, size_t root,
                     size_t max_terms);

/* vals for every variable of st's first nvars symbols from the values of
   the ordinary ones: a reciprocal 1/R gets 1 / vals[R].  In place. */
void gs_mgraph_fill_recips(long double *vals, const gs_symtab *st,
                           int nvars);

/* Dominant terms of one power of s of a root, best first (mgraph_terms.c).
   The terms are paths of the graph taken in decreasing magnitude at the
   values vals (a best-first search whose bound at every node is the
   exact largest completion, as in the k-shortest-path generation of Tan
   and Shi, "Efficient approximation of symbolic expressions for analog
   behavioral modeling and analysis", IEEE TCAD 23(4), 2004); paths with
   the same monomial are merged to their exact coefficient, and paths that
   take a variable of gs_mgraph_linear_vars twice are never taken (they
   cancel exactly). */
typedef struct gs_mgraph_terms {
    int power;              /* of s */
    size_t count;
    gs_poly *term;          /* count single-term polynomials (exact, each
                               monomial once; zero sums dropped), in
                               decreasing |value|; equal values by their
                               exponent vectors, compared variable by
                               variable in the context's order, the
                               larger exponent first */
    long double *value;     /* each term's value at vals */
    long double total;      /* the coefficient of s^power of the root at
                               vals (before scale), from the numeric pass */
    long double rest;       /* total - sum of the kept values */
    int complete;           /* 1: every path was taken (rest is rounding) */
    int overflow;           /* 0; or 1 + a symbol whose power in a term
                               passes GS_POLY_MAX_EXP: the search stopped
                               there and count is 0 */
    int budget;             /* 1: the search's states passed
                               GS_MGRAPH_SEARCH_BYTES and it stopped; the
                               terms kept are the ones whose coefficients
                               were final by then (rest as always) */
} gs_mgraph_terms;

/* The memory of one dominant-term search's states: paths that cancel
   numerically but not by the rules below (equal values of different
   symbols, a symbol shared by two elements) can make the frontier grow
   without bound.  128 MiB holds 1.3 million states with 192 degree-one
   variables, three times what the largest bench case takes (458,466,
   rc_ladder_50). */
#define GS_MGRAPH_SEARCH_BYTES ((size_t)128 << 20)

/* lin[v] = 1 (v < nvars) when the root's polynomial has degree at most 1
   in variable v by the rank-one rule of mgraph_terms.c: every entry of
   the root's matrix is of degree <= 1 in v and the matrix of v's
   coefficients has rank <= 1 (for N, c0 is also free of v).  The
   dominant-term search drops every path that takes such a v twice. */
void gs_mgraph_linear_vars(unsigned char *lin, const gs_mgraph *g,
                           size_t root);

/* Terms of s^power in `root` until |rest| <= tol * |total| (or all
   of them), at most max_terms (0: no limit) kept, with tol >= 0.  The
   coefficients are exact: a monomial is only kept once no path still to
   come can add to it.  t is overwritten (gs_mgraph_terms_clear first if
   reused). */
void gs_mgraph_dominant(gs_mgraph_terms *t, const gs_mgraph *g, size_t root,
                        int s_var, int power, const long double *vals,
                        long double tol, size_t max_terms);
/* The same with the states' memory bounded by max_bytes instead of
   GS_MGRAPH_SEARCH_BYTES (for tests). */
void gs_mgraph_dominant_within(gs_mgraph_terms *t, const gs_mgraph *g,
                               size_t root, int s_var, int power,
                               const long double *vals, long double tol,
                               size_t max_terms, size_t max_bytes);
void gs_mgraph_terms_clear(gs_mgraph_terms *t);

#endif
