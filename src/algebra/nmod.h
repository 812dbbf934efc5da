/* nmod.h - arithmetic modulo word-size primes, dense polynomials mod p.
 * See LICENSE.
 *
 * The modular machinery behind the multivariate gcd (poly_gcd.c): residues
 * modulo a prime p < 2^32, so that a product of two residues fits in a
 * uint64_t and plain C11 suffices (the seeded random generator that
 * travels in arguments is base/rng.h); dense univariate polynomials over
 * Z/pZ with Euclid's gcd, Newton interpolation and a transposed
 * Vandermonde solver.
 *
 * Residues are uint64_t values in [0, p).  A gs_nmod_poly is a value:
 * init once, clear once; its coefficients are owned by it.  Unless a
 * comment says otherwise an output may alias an input.
 */
#ifndef GS_NMOD_H
#define GS_NMOD_H

#include <stddef.h>
#include <stdint.h>

#include "base/rng.h"

/* Moduli are below 2^32 so that (p-1)^2 < 2^64. */
#define GS_NMOD_MAX_BITS 32

static inline uint64_t gs_nmod_add(uint64_t a, uint64_t b, uint64_t p)
{
    uint64_t s = a + b;
    return s >= p ? s - p : s;
}

static inline uint64_t gs_nmod_sub(uint64_t a, uint64_t b, uint64_t p)
{
    return a >= b ? a - b : a + p - b;
}

static inline uint64_t gs_nmod_neg(uint64_t a, uint64_t p)
{
    return a == 0 ? 0 : p - a;
}

static inline uint64_t gs_nmod_mul(uint64_t a, uint64_t b, uint64_t p)
{
    return a * b % p;
}

/* Multiplication by a fixed w with the precomputed w' = floor(w 2^32 / p):
   q = floor(t w' / 2^32) is within one of floor(t w / p), so t w - q p
   lies in [0, 2p) and no division is needed (Shoup's method, as analysed
   in Harvey, "Faster arithmetic for number-theoretic transforms",
   J. Symb. Comput. 60, 2014).  Needs t, w < p < 2^32. */
static inline uint64_t gs_nmod_shoup_pre(uint64_t w, uint64_t p)
{
    return (w << 32) / p;
}

static inline uint64_t gs_nmod_mul_shoup(uint64_t t, uint64_t w,
                                         uint64_t wpre, uint64_t p)
{
    uint64_t q = (t * wpre) >> 32;
    uint64_t r = t * w - q * p;     /* exact: the true value is < 2p */
    return r >= p ? r - p : r;
}

uint64_t gs_nmod_pow(uint64_t a, uint64_t e, uint64_t p);
/* inverse of a modulo p; a must be nonzero mod p and p prime (0 returned
   otherwise) */
uint64_t gs_nmod_inv(uint64_t a, uint64_t p);
/* deterministic primality for n < 2^32 */
int gs_nmod_is_prime(uint64_t n);
/* a prime drawn at random from [2^31, 2^32) */
uint64_t gs_nmod_random_prime(gs_rng *r);
/* a residue drawn at random from [1, p) */
uint64_t gs_nmod_random_nonzero(gs_rng *r, uint64_t p);

/* Dense polynomial c[0] + c[1] z + ... + c[len-1] z^(len-1) over Z/pZ;
   c[len-1] != 0, len == 0 for the zero polynomial. */
typedef struct gs_nmod_poly {
    uint64_t *c;
    long len;
    long alloc;
} gs_nmod_poly;

void gs_nmod_poly_init(gs_nmod_poly *a);
void gs_nmod_poly_clear(gs_nmod_poly *a);
void gs_nmod_poly_zero(gs_nmod_poly *a);
/* set len = n with all n coefficients zero (for filling in place; call
   gs_nmod_poly_normalise afterwards) */
void gs_nmod_poly_zero_len(gs_nmod_poly *a, long n);
/* drop leading zero coefficients */
void gs_nmod_poly_normalise(gs_nmod_poly *a);
/* degree, -1 for zero */
static inline long gs_nmod_poly_degree(const gs_nmod_poly *a)
{
    return a->len - 1;
}
/* coefficient of z^i (0 past the end) */
uint64_t gs_nmod_poly_get(const gs_nmod_poly *a, long i);
void gs_nmod_poly_set_coeff(gs_nmod_poly *a, long i, uint64_t v,
                            uint64_t p);
int gs_nmod_poly_equal(const gs_nmod_poly *a, const gs_nmod_poly *b);
uint64_t gs_nmod_poly_eval(const gs_nmod_poly *a, uint64_t z, uint64_t p);
void gs_nmod_poly_scale(gs_nmod_poly *r, const gs_nmod_poly *a, uint64_t s,
                        uint64_t p);
void gs_nmod_poly_mul(gs_nmod_poly *r, const gs_nmod_poly *a,
                      const gs_nmod_poly *b, uint64_t p);
/* a = q b + r with deg r < deg b; b nonzero; q may be NULL.  q and r
   must be distinct from each other and from b. */
void gs_nmod_poly_divrem(gs_nmod_poly *q, gs_nmod_poly *r,
                         const gs_nmod_poly *a, const gs_nmod_poly *b,
                         uint64_t p);
/* monic gcd by Euclid's algorithm; gcd(0, 0) = 0 */
void gs_nmod_poly_gcd(gs_nmod_poly *g, const gs_nmod_poly *a,
                      const gs_nmod_poly *b, uint64_t p);

/* r = the polynomial of degree < n through (xs[i], ys[i]); the xs must be
   distinct.  Newton's divided differences.  r must not alias. */
void gs_nmod_poly_interpolate(gs_nmod_poly *r, const uint64_t *xs,
                              const uint64_t *ys, long n, uint64_t p);

/* Solve the transposed Vandermonde system sum_j c[j] v[j]^t = w[t] for
   t = 0 .. n-1 in O(n^2) (Zippel 1990, "Interpolating polynomials from
   their values", J. Symb. Comput. 9).  Returns 0 on success, -1 when two
   v[j] coincide (c is then unspecified).  c must not alias v or w. */
int gs_nmod_vandermonde_solve(uint64_t *c, const uint64_t *v,
                              const uint64_t *w, long n, uint64_t p);

#endif
