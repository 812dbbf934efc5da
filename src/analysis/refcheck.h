/* refcheck.h - a derived output against the exact reference, point by
 * point: the verdicts of `gainsmith check`.
 * See LICENSE.
 *
 * At each frequency the derived expression is evaluated the way every
 * command evaluates it (its coefficients in long double, then Horner's
 * rule in s), with a running bound on that evaluation's rounding error,
 * and compared with the exact value of the circuit's equations at the same
 * rational point (numeric/numexact.h).  A point agrees when the relative
 * difference is within the tolerance; it is inconclusive when it is not,
 * but the rounding bound accounts for the difference (long double cannot
 * resolve the value there); otherwise it is a mismatch: a wrong formula.
 */
#ifndef GS_REFCHECK_H
#define GS_REFCHECK_H

#include "analysis/job.h"
#include "numeric/numexact.h"

typedef enum gs_refcheck_verdict {
    GS_RC_AGREE, GS_RC_INCONCLUSIVE, GS_RC_MISMATCH
} gs_refcheck_verdict;

/* One output, ready to be compared at any frequency. */
typedef struct gs_refcheck {
    const gs_job *j;
    size_t i;               /* tf[i] */
    long double *cn, *cd;   /* coefficients in powers of s */
    long double *en, *ed;   /* bounds on their rounding errors */
    int dn, dd;
    int bounded;            /* 0 when the coefficients come from a graph
                               of minors, whose rounding is not bounded */
} gs_refcheck;

typedef struct gs_refcheck_point {
    long double f;          /* Hz */
    long double complex h;  /* the expression, evaluated */
    long double complex ref;/* the reference */
    long double err;        /* |h - ref| / |ref| (over 1 when ref = 0) */
    long double bound;      /* the same scale: what rounding accounts for */
    int exact;              /* 1: ref is exact (else the long double solve
                               of numsolve.c, with no bound) */
    gs_refcheck_verdict verdict;
} gs_refcheck_point;

void gs_refcheck_init(gs_refcheck *r, const gs_job *j, size_t i);
void gs_refcheck_clear(gs_refcheck *r);

/* Compare at f Hz with tolerance tol.  GS_OK with *p filled, or the
   reference's failure (GS_ESINGULAR, GS_EDIVZERO, GS_ERANGE; why says
   more when not NULL). */
int gs_refcheck_at(gs_refcheck_point *p, const gs_refcheck *r,
                   long double f, long double tol, gs_numexact_why *why);

/* Symbols that a circuit element uses but that have no value and occur in
   no derived output (they cancel out, like a resistor across an ideal
   voltage source): each gets a generic positive value in j->vals, drawn
   from a fixed seed, so that the equations can be solved numerically.
   Returns how many; syms (when not NULL) gets their ids, a new array the
   caller frees. */
size_t gs_refcheck_generic_values(gs_job *j, int **syms);

#endif
