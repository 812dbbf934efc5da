/* derive.h - circuit output -> transfer function in lowest terms.
 * See LICENSE.
 */
#ifndef GS_DERIVE_H
#define GS_DERIVE_H

#include "circuit/circuit.h"
#include "analysis/elim.h"
#include "analysis/minors.h"
#include "analysis/tf.h"

typedef struct gs_limit {
    int sym;        /* symbol id */
    int to_inf;     /* 1: sym -> infinity, 0: sym -> 0 */
} gs_limit;

/* How det A and det M are computed.  Both give the same result; only the
   work differs.  AUTO expands in minors when the plan is small enough
   (minors.h) and eliminates otherwise. */
typedef enum gs_det_method {
    GS_DET_AUTO,
    GS_DET_MINORS,
    GS_DET_BAREISS
} gs_det_method;

typedef struct gs_derive_opts {
    gs_det_method method;
    gs_elim_opts elim;       /* max_terms and progress serve both methods */
    const gs_limit *limits;  /* applied in order, after reduction */
    size_t nlimits;
    int no_gcd;              /* skip the final gcd (for measurements) */
    int terms_given;         /* 1: elim.max_terms was asked for, and the
                                expansion runs however many paths its
                                graph counts; 0: the default budget, and
                                AUTO first refuses a graph counting more
                                than GS_DERIVE_MAX_PATHS paths */
    struct gs_mgraph **graph_out;   /* not NULL: where the graph of minors
                                built by that refusal goes (the caller
                                then owns it, and frees it when the
                                result came anyway), so that the numbers
                                need not build it again */
} gs_derive_opts;

typedef struct gs_derive_stats {
    int unknowns;            /* size of A */
    gs_det_method method;    /* the one that ran: MINORS or BAREISS */
    gs_elim_stats elim;      /* when BAREISS ran */
    gs_minors_stats minors;  /* when MINORS ran */
    size_t gcd_terms;        /* terms of the common factor removed */
    size_t graph_nodes;      /* the graph of minors, when it was built */
    size_t graph_edges;      /* (mgraph.h); 0 otherwise */
    double graph_paths_n;    /* its path counts: the terms N and D would */
    double graph_paths_d;    /* have before equal monomials combine */
    int graph_refused;       /* 1: the graph passed the memory budget */
    int no_limit;            /* 1: GS_ERANGE because a limit of o is
                                infinite (not an exponent overflow) */
} gs_derive_stats;

/* Under AUTO without a term budget, an expansion whose graph has more
   paths than this for N or D is refused (GS_EBUDGET): the numbers come
   from the graph instead, and --max-terms expands anyway. */
#define GS_DERIVE_MAX_PATHS 2000000.0
/* The terms an entry may reach when a refused expansion is tried once
   (derive.c): the estimate counts terms before equal monomials combine
   or cancel. */
#define GS_DERIVE_TRY_TERMS 50000

/* Defaults: AUTO, the budgets GS_DEFAULT_MAX_TERMS and
   GS_DEFAULT_MAX_BYTES (gainsmith.h) not given, no limits. */
void gs_derive_opts_default(gs_derive_opts *o);

/* Derive output `out` of c into tf (initialised by the caller with ctx,
   which must cover c's whole symbol table after gs_mna_intern_symbols).
   tf gets H = num/den in lowest terms, reciprocal symbols cleared, den's
   leading term positive, and its name.  Returns GS_OK, GS_ESINGULAR,
   GS_EBUDGET, GS_EINVAL or GS_ERANGE (a limit is infinite, and then
   stats->no_limit is 1; or an exponent overflows), with a message in d.
   stats may be NULL. */
int gs_derive(gs_tf *tf, const gs_circuit *c, size_t out,
              const gs_polyctx *ctx, const gs_derive_opts *o,
              gs_derive_stats *stats, gs_diag *d);

/* The same for an output that may be a figure (a rational expression in
   other outputs, each derived again; depth counts the nesting), without
   the limits of o and without setting the name: num/den in lowest
   terms.  gs_derive calls it for figures. */
int gs_derive_figure_part(gs_tf *tf, const gs_circuit *c, size_t out,
                          const gs_polyctx *ctx, const gs_derive_opts *o,
                          gs_diag *d, int depth);

/* Put num/den in lowest terms in place: reciprocal symbols cleared,
   common monomial, integer and polynomial factors removed, sign made
   positive on den's leading term.  gcd_terms (may be NULL) gets the size
   of the polynomial factor removed. */
void gs_reduce_ratio(gs_poly *num, gs_poly *den, const gs_symtab *st,
                     const gs_polyctx *ctx, int use_gcd, size_t *gcd_terms);

#endif
