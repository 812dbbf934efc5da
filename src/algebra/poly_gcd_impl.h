/* poly_gcd_impl.h - internal to the gcd module (poly_gcd.c,
 * poly_gcd_eval.c, poly_gcd_zippel.c, poly_gcd_prs.c): what those files
 * share and nothing else includes.  See LICENSE.
 *
 * A term table is a polynomial laid out for evaluation mod p, and an
 * evaluation point carries power tables of its values
 * (poly_gcd_eval.c); the degree bounds, Zippel's method and the driver
 * all work on them.  The functions carry the prefix gs_pgcd_ because
 * they are external symbols of the library now.
 */
#ifndef GS_POLY_GCD_IMPL_H
#define GS_POLY_GCD_IMPL_H

#include <stddef.h>
#include <stdint.h>

#include "base/rng.h"
#include "algebra/nmod.h"
#include "algebra/poly.h"

/* what a step of the modular method reports */
enum { R_OK, R_UNLUCKY, R_LOWER, R_BADSKEL, R_FAIL };

/* Tries per unlucky evaluation, restarts of the modular method and
   primes per restart: generous, since each failure is rare. */
#define MAX_TRIES 24
#define MAX_RESTARTS 4
#define MAX_PRIMES 64

/* Each term as a list of (variable, exponent) factors, its coefficient
   reduced mod the current prime, and its exponent in the main variable. */
typedef struct {
    size_t n;           /* terms */
    size_t *off;        /* factors of term i: off[i] .. off[i+1]-1 */
    int *var;
    unsigned *exp;
    unsigned *xd;       /* exponent of the main variable (0: none chosen) */
    uint64_t *cm;       /* coefficients modulo the current prime */
    unsigned *deg;      /* degree in each variable */
    size_t *nlead;      /* number of terms reaching that degree */
    long xdeg;          /* degree in the main variable */
    const gs_poly *src;
} tab;

typedef struct {
    int nvars;
    unsigned *maxe;     /* largest exponent of each variable */
    size_t *base;       /* variable v's powers start at pw + base[v] */
    uint64_t *val;      /* value of each variable */
    uint64_t *pw;       /* pw[base[v] + e] = val[v]^e */
    uint64_t *pwinv;    /* val[v]^-e, filled by pts_fill_inv */
} pts;

/* ---- poly_gcd_eval.c: term tables, points, degree bounds -------------- */

void gs_pgcd_tab_init(tab *t, const gs_poly *a, const gs_polyctx *ctx);
void gs_pgcd_tab_clear(tab *t);
void gs_pgcd_tab_set_main(tab *t, int x);
void gs_pgcd_tab_reduce(tab *t, uint64_t p);
void gs_pgcd_tab_eval(gs_nmod_poly *r, const tab *t, const pts *pt,
                      uint64_t p);
void gs_pgcd_pts_init(pts *pt, const tab *ta, const tab *tb, int nvars);
void gs_pgcd_pts_clear(pts *pt);
void gs_pgcd_pts_fill(pts *pt, uint64_t p);
void gs_pgcd_pts_randomise(pts *pt, gs_rng *rng, uint64_t p);
uint64_t gs_pgcd_term_value(const tab *t, size_t i, const pts *pt,
                            uint64_t p);
int gs_pgcd_degree_bounds(long *bd, tab *ta, tab *tb, pts *pt, gs_rng *rng);

/* ---- poly_gcd_zippel.c: the modular method ---------------------------- */

int gs_pgcd_modular_divisor(gs_poly *c, gs_poly *qa, gs_poly *qb,
                            const gs_poly *a, const gs_poly *b,
                            const gs_poly *gam, int x, long *bd,
                            const gs_polyctx *ctx, gs_rng *rng);

/* ---- poly_gcd_prs.c: the subresultant remainder sequence -------------- */

void gs_pgcd_prs(gs_poly *g, const gs_poly *a, const gs_poly *b,
                 const gs_polyctx *ctx);
/* the content in x, by the modular gcd (rng) or the sequence (rng NULL) */
void gs_pgcd_content_in(gs_poly *r, const gs_poly *a, int x,
                        const gs_polyctx *ctx, gs_rng *rng);

/* ---- poly_gcd.c: the gcd of nonzero operands, for the recursion ------- */

void gs_pgcd_nonzero(gs_poly *g, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx, gs_rng *rng);

#endif
