/* approx.h - short symbolic forms of a transfer function, with a measured
 * error.  See LICENSE; docs/approx.md describes the methods and sources.
 *
 * Three published methods, all applied at the nominal values of the
 * symbols:
 *  - simplification after generation: per power of s, the smallest terms
 *    of N and D are dropped while the error, measured against the exact
 *    H on a log frequency grid and over a box of parameter spreads, stays
 *    within a tolerance (Fernandez, Rodriguez-Vazquez, Huertas 1991;
 *    Wambacq, Gielen, Sansen 1998);
 *  - dominant-root estimates from the coefficients of D(s) = sum a_k s^k
 *    when the roots are widely separated: p_k ~ -a_(k-1)/a_k, and
 *    w0^2 ~ a_(k-1)/a_(k+1), Q ~ sqrt(a_(k-1) a_(k+1))/a_k for a complex
 *    pair (Gray, Hurst, Lewis, Meyer, ch. 9; Sansen 2006, ch. 1);
 *  - design-oriented forms (Middlebrook 1991): factors pulled out,
 *    parallel combinations par(a, b) = a*b/(a + b), and the normalised
 *    K (1 + s/wz ...)/(1 + s/wp ...).
 *
 * The input is a table of terms (gs_approx_terms): for N and D and each
 * power of s, the terms largest first at the nominal point, with a bound
 * on the magnitude of the terms that are not listed.  Today the table is
 * filled from the exact expansion (gs_approx_terms_from_tf, every term
 * present, bound 0) or, when the expansion is over its budget, from the
 * dominant terms of the graph of minors (gs_approx_terms_from_graph),
 * which also gives the exact numeric coefficients of N and D at every
 * sample point, the reference for the errors.
 */
#ifndef GS_APPROX_H
#define GS_APPROX_H

#include <complex.h>
#include <stddef.h>

#include "algebra/poly.h"
#include "analysis/job.h"
#include "analysis/mgraph.h"
#include "analysis/tf.h"
#include "base/diag.h"

/* ---- The terms interface ------------------------------------------- */

/* One coefficient of s^k: its terms (monomials free of s with their
   integer coefficients, one term each), ordered by decreasing magnitude
   at the nominal point (ties in canonical monomial order), and a bound
   on the sum of |value| of the terms left out. */
typedef struct gs_approx_coeff {
    size_t nterms;
    gs_poly *terms;         /* nterms one-term polynomials, owned */
    long double *mag;       /* |value| of each at the nominal point */
    long double rest;       /* sum of |omitted terms| <= rest; 0: none */
} gs_approx_coeff;

/* A reference for the error: H(s) at the values vals (one per symbol of
   the context, s excluded), written to *h.  GS_OK or an error code. */
typedef int (*gs_approx_ref_fn)(long double complex *h,
                                long double complex s,
                                const long double *vals, void *arg);

/* The exact numeric coefficients of N and D at vals (one per variable of
   the context): new arrays cn[0 .. *dn], cd[0 .. *dd], ascending powers,
   the caller frees them.  Their ratio is the exact H. */
typedef void (*gs_approx_coefs_fn)(long double **cn, int *dn,
                                   long double **cd, int *dd,
                                   const long double *vals, void *arg);

typedef struct gs_approx_terms {
    int ncoef[2];           /* [0] N, [1] D: powers 0 .. ncoef - 1 */
    gs_approx_coeff *c[2];  /* c[0][k] of N, c[1][k] of D */
    int complete;           /* 1 when every term is listed (rest all 0) */
    const char *path;       /* which producer filled it, for --stats */
    gs_approx_ref_fn ref;   /* NULL: the listed terms are the reference
                               (only when complete) */
    void *ref_arg;
    gs_approx_coefs_fn coefs;   /* NULL: the listed terms are exact; else
                                   the exact coefficients (and from them
                                   the reference H, ahead of ref) */
    void *coefs_arg;
    int overflow;           /* 0; or 1 + a symbol whose power in a term of
                               the graph passes GS_POLY_MAX_EXP (that
                               coefficient's terms are missing) */
    int budget;             /* 1: a search of the graph stopped at its
                               memory bound (mgraph.h), so a smaller
                               tolerance would find no more terms */
} gs_approx_terms;

void gs_approx_terms_init(gs_approx_terms *t);
void gs_approx_terms_clear(gs_approx_terms *t);
/* Fill t from the exact N and D of tf, ordered at the values vals (one per
   symbol of tf->ctx).  Every term is listed; path "exact expansion". */
void gs_approx_terms_from_tf(gs_approx_terms *t, const gs_tf *tf,
                             const long double *vals);

/* Fill t from the graph of minors g (mgraph.h) at vals (one per variable
   of g's context, reciprocal symbols included, gs_mgraph_fill_recips):
   per power k of s of N and D the dominant terms, best first, until the
   remainder is within gen_tol / share[w][k] of the coefficient (share:
   its largest share of the polynomial over the band, NULL for 1; a
   power that matters little needs fewer terms) or max_terms (0: no
   limit) are kept; coefs gives the exact coefficients from one pass over
   g.  H = scale N / D is kept by multiplying N's terms by scale's
   numerator and D's by its denominator; a power of s common to N and D
   is divided out.  Path "graph of minors".  g must outlive t. */
void gs_approx_terms_from_graph(gs_approx_terms *t, const gs_mgraph *g,
                                int s_var, const long double *vals,
                                long double gen_tol,
                                long double *const share[2],
                                size_t max_terms);

/* ---- Options and result -------------------------------------------- */

typedef struct gs_approx_opts {
    long double tol_db;     /* largest magnitude error allowed, dB */
    long double tol_deg;    /* largest phase error allowed, degrees */
    long double f_lo, f_hi; /* band in Hz; 0 and 0 for automatic */
    long double spread;     /* each symbol varied by +-spread (0.2 = 20 %) */
    int per_decade;         /* grid density, at least 50 */
} gs_approx_opts;

/* tol 0.1 dB / 1 degree, automatic band, spread 0.2, 60 points a decade */
void gs_approx_opts_default(gs_approx_opts *o);

enum { GS_APPROX_EST_NONE, GS_APPROX_EST_REAL, GS_APPROX_EST_PAIR };

/* One pole or zero of the exact H, with its estimate. */
typedef struct gs_approx_root {
    int is_zero;            /* 0 pole, 1 zero */
    int est;                /* GS_APPROX_EST_* */
    int at_origin;          /* exact root 0 */
    /* EST_REAL: root ~ -wn/wd; EST_PAIR: a2 s^2 + a1 s + a0 with
       w0 = sqrt(a0/a2), Q = sqrt(a0 a2)/a1 (printed for the root with
       positive imaginary part; its conjugate refers back with est NONE
       and pair_of set). */
    gs_poly wn, wd;
    gs_poly a0, a1, a2;
    int pair_of;            /* index of the root carrying the pair, or -1 */
    long double complex value;  /* the estimate at the nominal point */
    long double complex exact;  /* the root of the exact polynomial */
    long double rel_error;      /* |value - exact| / |exact| */
    long double separation;     /* to the neighbouring roots, >= 1 */
    int factor;             /* 1: the estimate is the root of a factor of
                               the exact N or D of degree 1 (a pair: 2) in
                               s, so it is exact, whatever the separation */
} gs_approx_root;

/* "gm6*r6 >> 1": a monomial ratio that must be large. */
typedef struct gs_approx_cond {
    char *lhs, *rhs;        /* owned texts of the two sides */
    gs_poly pl, pr;         /* the sides as polynomials (one term each) */
    long double value;      /* lhs / rhs at the nominal point */
} gs_approx_cond;

typedef struct gs_approx_result {
    gs_tf h;                /* the simplified H in lowest terms */
    int met;                /* 1 when the errors are within tolerance */
    long double err_db, err_deg;        /* at the nominal point */
    long double spread_db, spread_deg;  /* worst over the spread box */
    long double f_lo, f_hi;             /* band used, Hz */
    int npoints, nspread;               /* grid points, spread points */
    int spread_corners;                 /* 1: every corner of the box */
    long double eps;        /* the relative size below which terms went */
    size_t terms_exact, terms_kept;
    const char *path;       /* from the terms table */
    long double gen_tol;    /* graph path: each coefficient's terms were
                               generated to this remainder; 0 exact */
    int search_bounded;     /* graph path: a search stopped at its memory
                               bound (gs_approx_terms.budget) */
    /* low-frequency gain ~ (dcn/dcd) s^dc_order */
    gs_poly dcn, dcd;
    int dc_order;
    long double dc_value, dc_exact, dc_rel_error;
    size_t nroots;
    gs_approx_root *roots;  /* poles first, then zeros, by magnitude */
    size_t ncond;
    gs_approx_cond *cond;   /* smallest value first, at most 12 */
    size_t ncond_total;     /* distinct conditions before that cut */
    int s_var;
    const gs_polyctx *ctx;  /* borrowed */
} gs_approx_result;

void gs_approx_result_init(gs_approx_result *r);
void gs_approx_result_clear(gs_approx_result *r);

/* Simplify the exact H described by t (in context ctx, Laplace variable
   s_var; vals the nominal values, used[v] the symbols to spread) under o.
   GS_OK with r->met telling whether the tolerance was met (the best form
   reached is in r either way); GS_EINVAL (message in d) when the values
   make D zero or not finite. */
int gs_approx_run_terms(gs_approx_result *r, const gs_approx_terms *t,
                        const gs_polyctx *ctx, int s_var,
                        const long double *vals, const unsigned char *used,
                        const gs_approx_opts *o, gs_diag *d);

/* The whole of it for output i of a bound job: the terms table from the
   exact expansion, then gs_approx_run_terms. */
int gs_approx_run(gs_approx_result *r, const gs_job *j, size_t i,
                  const gs_approx_opts *o, gs_diag *d);

/* ---- Design-oriented forms ----------------------------------------- */

enum { GS_FORM_TEXT, GS_FORM_PRETTY, GS_FORM_LATEX };

/* num/den written shortest: integer and monomial contents pulled out,
   each polynomial split into multilinear factors (a factor linear in x
   is found from gcd(coefficient of x, the rest), recursively), and a
   denominator factor a + b whose product a*b divides the numerator
   written as a parallel combination: par(a, b) in text (par(a, b) =
   a*b/(a + b)), a||b in pretty, a \parallel b in LaTeX.  A new string. */
char *gs_approx_form(const gs_poly *num, const gs_poly *den, int style,
                     const gs_polyctx *ctx);

/* The factors of p that the forms above find: p's integer and monomial
   contents removed, the rest split into multilinear factors as there.
   *f is a new array of that many initialised polynomials (NULL for none);
   the caller clears them and frees it. */
size_t gs_approx_factors(gs_poly **f, const gs_poly *p,
                         const gs_polyctx *ctx);

#endif
