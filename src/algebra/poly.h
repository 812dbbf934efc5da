/* poly.h - sparse multivariate polynomials with integer coefficients.
 * See LICENSE.
 *
 * Coefficients are in Z (gs_int).  Rational-coefficient polynomials are
 * represented by the caller as an integer polynomial and a separate
 * rational content: circuit transfer functions are ratios N/D, and every
 * denominator can be cleared from both, so Z[x1..xn] is all the symbolic
 * path needs, and it keeps the inner loops free of fraction reduction.
 *
 * Variables are the symbols 0 .. nvars-1 of a gs_symtab, fixed when the
 * context is made.  An exponent vector is packed into `nwords` 64-bit words,
 * four 16-bit fields per word, variable 0 in the most significant field of
 * word 0; exponents are at most GS_POLY_MAX_EXP.  Comparing the words as
 * unsigned integers, most significant first, is the lexicographic order
 * with variable 0 highest; that is the canonical monomial order.
 *
 * Canonical form (kept by every function): terms sorted in strictly
 * decreasing monomial order, no zero coefficients, no repeated monomials.
 * So equality is structural and printing is deterministic.
 *
 * Ownership: the caller owns each gs_poly struct (gs_poly_init once,
 * gs_poly_clear once); the polynomial owns its arrays.  A gs_polyctx is
 * made with gs_polyctx_new and freed with gs_polyctx_free; it borrows the
 * symbol table, which must outlive it.  A polynomial's storage is sized
 * for its context's exponent words, so a polynomial belongs to one
 * context (clear it before using it with another).  Unless a comment says
 * otherwise, an output may alias any input.
 */
#ifndef GS_POLY_H
#define GS_POLY_H

#include <complex.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>

#include "algebra/int.h"
#include "algebra/rat.h"
#include "algebra/sym.h"

#define GS_POLY_FIELD_BITS 16
#define GS_POLY_VARS_PER_WORD 4
#define GS_POLY_MAX_EXP 0x7FFF   /* top bit of each field is a guard bit */

/* The packed-exponent fields, in one place.  Variable v is the field
   v % GS_POLY_VARS_PER_WORD of word v / GS_POLY_VARS_PER_WORD, the first
   variable in the top bits so that comparing words compares exponents
   lexicographically. */
#define GS_POLY_FIELD_MASK ((UINT64_C(1) << GS_POLY_FIELD_BITS) - 1)
/* The top bit of every field.  Exponents are at most GS_POLY_MAX_EXP, so
   a sum of two never carries into the next field, and
   ((x | GUARD) - y) & GUARD has a field's guard bit set exactly where
   x >= y in that field: the usual SIMD-within-a-register trick. */
#define GS_POLY_GUARD                                                   \
    (UINT64_C(0x0001000100010001) << (GS_POLY_FIELD_BITS - 1))

/* The bit position of variable var's field in its word. */
static inline int gs_poly_field_shift(int var)
{
    return GS_POLY_FIELD_BITS
           * (GS_POLY_VARS_PER_WORD - 1 - var % GS_POLY_VARS_PER_WORD);
}

/* The exponent of var in the packed vector e. */
static inline unsigned gs_poly_exp_get(const uint64_t *e, int var)
{
    return (unsigned)((e[var / GS_POLY_VARS_PER_WORD]
                       >> gs_poly_field_shift(var)) & GS_POLY_FIELD_MASK);
}

/* All ones in each field where x >= y in that field, zero elsewhere. */
static inline uint64_t gs_poly_fields_ge(uint64_t x, uint64_t y)
{
    return ((((x | GS_POLY_GUARD) - y) & GS_POLY_GUARD)
            >> (GS_POLY_FIELD_BITS - 1)) * GS_POLY_FIELD_MASK;
}

/* Nonzero when x <= y in every field of the word. */
static inline int gs_poly_fields_le(uint64_t x, uint64_t y)
{
    return (((y | GS_POLY_GUARD) - x) & GS_POLY_GUARD) == GS_POLY_GUARD;
}

/* Per-field minimum and maximum of two words. */
static inline uint64_t gs_poly_fields_min(uint64_t x, uint64_t y)
{
    uint64_t m = gs_poly_fields_ge(x, y);
    return (y & m) | (x & ~m);
}

static inline uint64_t gs_poly_fields_max(uint64_t x, uint64_t y)
{
    uint64_t m = gs_poly_fields_ge(x, y);
    return (x & m) | (y & ~m);
}

typedef struct gs_polyctx {
    const gs_symtab *syms;  /* borrowed: names for printing */
    int nvars;
    int nwords;             /* (nvars + 3) / 4, at least 1 */
} gs_polyctx;

typedef struct gs_poly {
    gs_int *coeffs;     /* length nonzero coefficients */
    uint64_t *exps;     /* length * nwords words; term i at exps + i*nwords */
    size_t length;
    size_t alloc;       /* terms allocated */
} gs_poly;

/* A context for the first nvars symbols of st (nvars >= 0). */
gs_polyctx *gs_polyctx_new(const gs_symtab *st, int nvars);
void gs_polyctx_free(gs_polyctx *ctx);       /* NULL is fine */

void gs_poly_init(gs_poly *p);               /* p = 0 */
void gs_poly_clear(gs_poly *p);
void gs_poly_swap(gs_poly *a, gs_poly *b);   /* O(1) */
void gs_poly_set(gs_poly *r, const gs_poly *a, const gs_polyctx *ctx);
void gs_poly_zero(gs_poly *r);
void gs_poly_set_si(gs_poly *r, int64_t c, const gs_polyctx *ctx);
void gs_poly_set_int(gs_poly *r, const gs_int *c, const gs_polyctx *ctx);
/* r = x_var ^ e */
void gs_poly_set_var(gs_poly *r, int var, unsigned e, const gs_polyctx *ctx);
/* r = c * prod x_i^exps[i] (exps has nvars entries, unpacked) */
void gs_poly_set_term(gs_poly *r, const gs_int *c, const unsigned *exps,
                      const gs_polyctx *ctx);

/* Building a polynomial term by term: push terms in any order (zero
   coefficients and repeats allowed), then gs_poly_canonicalise sorts,
   combines and drops zeros.  Between the two, r is not canonical. */
void gs_poly_push_term(gs_poly *r, const gs_int *c, const unsigned *exps,
                       const gs_polyctx *ctx);
void gs_poly_canonicalise(gs_poly *r, const gs_polyctx *ctx);
/* The same by comparisons of the exponent words alone, whatever the
   size: the reference that gs_poly_canonicalise's linear-time sort of
   packed keys (large polynomials, small exponents) is tested against. */
void gs_poly_canonicalise_compare(gs_poly *r, const gs_polyctx *ctx);
/* Reserve room for n terms; the value of r is unchanged. */
void gs_poly_fit(gs_poly *r, size_t n, const gs_polyctx *ctx);
/* Give back the room past r's terms when it is over a quarter of them
   (a result grown by doubling holds up to twice what it needs). */
void gs_poly_shrink(gs_poly *r, const gs_polyctx *ctx);
/* degs[v] = degree of a in variable v for v < nvars (all 0 for a = 0). */
void gs_poly_degrees(unsigned *degs, const gs_poly *a, const gs_polyctx *ctx);
/* bounds[v] >= the degree in v with the same number of bits (the OR of
   the exponents, so below twice the degree): for checks that need only
   the size, at one OR a word instead of gs_poly_degrees' field maxima. */
void gs_poly_degree_bounds(unsigned *bounds, const gs_poly *a,
                           const gs_polyctx *ctx);

/* r = a with variable v replaced by a monomial in variable to[v] for
   every v with top[v] > 0: x_v^k becomes x_to[v]^(top[v] - k), multiplied
   into what x_to[v] had (to[v] != v, k <= top[v]).  For clearing a
   reciprocal symbol r = 1/B: multiplying by B^e turns r^k into B^(e-k).
   to and top have nvars entries; degs is a's gs_poly_degrees when the
   caller has them (NULL: found here). */
void gs_poly_flip_vars(gs_poly *r, const gs_poly *a, const int *to,
                       const unsigned *top, const unsigned *degs,
                       const gs_polyctx *ctx);
/* r (in context to) = a (in context from) with variable v of from renamed
   map[v] of to; map must be strictly increasing, so that the term order
   is kept.  r must not alias a. */
void gs_poly_remap(gs_poly *r, const gs_poly *a, const int *map,
                   const gs_polyctx *from, const gs_polyctx *to);
/* The same, taking a's terms (a is left zero).  Into a context of as
   many words or more, a's storage becomes r's, grown in place; into a
   narrower one the terms move from the last, and a's storage is given
   back a sixteenth at a time.  Either way the two copies of a large
   polynomial are never resident at once. */
void gs_poly_remap_take(gs_poly *r, gs_poly *a, const int *map,
                        const gs_polyctx *from, const gs_polyctx *to);
/* gs_poly_remap_take into dst, then gs_poly_flip_vars there with to and
   top (indexed by dst's variables), in one pass: a's storage is resized
   in place and written once, from the sorted keys.  r must not alias a;
   a is left zero. */
void gs_poly_remap_flip_take(gs_poly *r, gs_poly *a, const int *map,
                             const int *to, const unsigned *top,
                             const gs_polyctx *from, const gs_polyctx *dst);

/* a's terms grouped by their power of var (a nonzero, 0 <= var <
   nvars), stably: *idx gets the a->length term indices, power 0's first,
   each power's in a's order (which is the order of that coefficient
   once var is dropped), and *ends the end of each power's run in idx
   (power k runs from k ? ends[k - 1] : 0 to ends[k]).  Both are new
   arrays (gs_free); returns the number of powers, the degree + 1.  For
   printers, which write a coefficient of s^k at a time without copying
   it out. */
size_t gs_poly_group_by_var(size_t **idx, size_t **ends, const gs_poly *a,
                            int var, const gs_polyctx *ctx);

/* Unpack term i's exponents into exps[0 .. nvars-1]. */
void gs_poly_get_term_exps(unsigned *exps, const gs_poly *a, size_t i,
                           const gs_polyctx *ctx);
unsigned gs_poly_term_exp(const gs_poly *a, size_t i, int var,
                          const gs_polyctx *ctx);

int gs_poly_is_zero(const gs_poly *a);
/* Bytes a's storage holds: the terms allocated (exponent words and
   coefficient headers) and the limbs of its large coefficients.  O(length);
   what the memory budgets of the determinant methods count. */
size_t gs_poly_storage(const gs_poly *a, const gs_polyctx *ctx);
int gs_poly_is_one(const gs_poly *a, const gs_polyctx *ctx);
int gs_poly_is_const(const gs_poly *a, const gs_polyctx *ctx);
int gs_poly_equal(const gs_poly *a, const gs_poly *b, const gs_polyctx *ctx);
/* equal polynomials hash equal; a sample of at most 64 terms is read */
uint64_t gs_poly_hash(const gs_poly *a, const gs_polyctx *ctx);
/* sign of the leading coefficient (0 for the zero polynomial) */
int gs_poly_sgn(const gs_poly *a);

void gs_poly_neg(gs_poly *r, const gs_poly *a, const gs_polyctx *ctx);
void gs_poly_add(gs_poly *r, const gs_poly *a, const gs_poly *b,
                 const gs_polyctx *ctx);
void gs_poly_sub(gs_poly *r, const gs_poly *a, const gs_poly *b,
                 const gs_polyctx *ctx);
/* Precondition for mul and pow: no exponent of the result exceeds
   GS_POLY_MAX_EXP (checked by assert; callers bound degrees first). */
void gs_poly_mul(gs_poly *r, const gs_poly *a, const gs_poly *b,
                 const gs_polyctx *ctx);
void gs_poly_pow_ui(gs_poly *r, const gs_poly *a, unsigned long e,
                    const gs_polyctx *ctx);
void gs_poly_mul_int(gs_poly *r, const gs_poly *a, const gs_int *c,
                     const gs_polyctx *ctx);
void gs_poly_mul_si(gs_poly *r, const gs_poly *a, int64_t c,
                    const gs_polyctx *ctx);
/* r = sum over k < n of (neg[k] ? -1 : 1) a[k] b[k], as one merge of all
   the term products (each term of a[k] times b[k] is a sorted stream), so
   that no partial product or partial sum is ever stored: meant for a few
   small a[k] (matrix entries) times large b[k] (minors).  neg may be NULL.
   r must not alias any input.  Same precondition on exponents as mul. */
void gs_poly_sum_of_products(gs_poly *r, const gs_poly *const *a,
                             const gs_poly *const *b, const int *neg,
                             size_t n, const gs_polyctx *ctx);
/* r = a * b, unless the product holds more than cap terms (cap 0: no
   limit): then r = 0 and GS_EBUDGET, found as the terms are made, so the
   work and memory stop near cap.  Same precondition as mul. */
int gs_poly_mul_cap(gs_poly *r, const gs_poly *a, const gs_poly *b,
                    size_t cap, const gs_polyctx *ctx);
/* 1 when every exponent of a*b fits in GS_POLY_MAX_EXP; otherwise 0, with
   the first variable that would overflow in *var.  Callers that multiply
   polynomials built from user input check this before gs_poly_mul, whose
   packed exponent fields have no room for a carry. */
int gs_poly_mul_fits(int *var, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx);

/* gs_poly_mul with the method forced, for tests and benchmarks.
   GS_POLY_MUL_AUTO is what gs_poly_mul does: it picks by shape.
   GS_POLY_MUL_HEAP merges term products with a heap; GS_POLY_MUL_DENSE
   accumulates blocks of terms in dense arrays (poly_mul.c).  Or-ing in
   GS_POLY_MUL_BIGACC forces multi-precision accumulation even when the
   coefficients would allow a 128-bit accumulator; GS_POLY_MUL_MIDACC
   takes the three-word (192-bit) accumulator whenever it is safe, even
   where 128 bits would do (products only; divisions ignore it).  Same
   result always. */
enum {
    GS_POLY_MUL_AUTO = 0,
    GS_POLY_MUL_HEAP = 1,
    GS_POLY_MUL_DENSE = 2,
    GS_POLY_MUL_BIGACC = 8,
    GS_POLY_MUL_MIDACC = 16
};
void gs_poly_mul_method(gs_poly *r, const gs_poly *a, const gs_poly *b,
                        int method, const gs_polyctx *ctx);
/* r = a * x^exps (packed, nwords words) */
void gs_poly_mul_monomial(gs_poly *r, const gs_poly *a, const uint64_t *exps,
                          const gs_polyctx *ctx);

/* Exact division q = a / b.  GS_OK when b divides a in Z[x]; GS_EINEXACT
   when it does not (q is then zero); GS_EDIVZERO when b = 0. */
int gs_poly_divexact(gs_poly *q, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx);
/* gs_poly_divexact with the method forced, for tests and benchmarks: the
   GS_POLY_MUL_* values above (heap of terms, dense blocks, multi-precision
   accumulation).  Same result always. */
int gs_poly_divexact_method(gs_poly *q, const gs_poly *a, const gs_poly *b,
                            int method, const gs_polyctx *ctx);
/* q = a / c for an integer c that divides every coefficient: GS_OK,
   GS_EINEXACT or GS_EDIVZERO (q zero on failure). */
int gs_poly_divexact_int(gs_poly *q, const gs_poly *a, const gs_int *c,
                         const gs_polyctx *ctx);
/* r = a / x^exps; GS_EINEXACT when some term has a smaller exponent */
int gs_poly_div_monomial(gs_poly *r, const gs_poly *a, const uint64_t *exps,
                         const gs_polyctx *ctx);

/* Content: c = gcd of the coefficients, with the sign of the leading
   coefficient (0 for the zero polynomial).  Primitive part r = a / c, so
   r has positive leading coefficient and content 1. */
void gs_poly_content(gs_int *c, const gs_poly *a);
void gs_poly_primitive(gs_poly *r, const gs_poly *a, const gs_polyctx *ctx);
/* The monomial gcd of all terms (componentwise minimum of exponents),
   packed into exps (nwords words); all zero for the zero polynomial. */
void gs_poly_monomial_content(uint64_t *exps, const gs_poly *a,
                              const gs_polyctx *ctx);

/* Degree of a in variable var: -1 for the zero polynomial.  lowdegree is
   the smallest exponent of var over all terms (-1 for zero). */
long gs_poly_degree(const gs_poly *a, int var, const gs_polyctx *ctx);
long gs_poly_lowdegree(const gs_poly *a, int var, const gs_polyctx *ctx);
long gs_poly_total_degree(const gs_poly *a, const gs_polyctx *ctx);
/* Variables that occur in a: used[i] = 1 or 0 for i < nvars. */
void gs_poly_used_vars(unsigned char *used, const gs_poly *a,
                       const gs_polyctx *ctx);

/* r = the coefficient of x_var^k in a, a polynomial free of x_var
   (collecting in s). */
void gs_poly_coeff_var(gs_poly *r, const gs_poly *a, int var, unsigned k,
                       const gs_polyctx *ctx);
/* All coefficients of a in x_var at once: out[k] (k = 0 .. n-1) = the
   coefficient of x_var^k, free of x_var, in one pass over a; n must
   exceed a's degree in x_var.  out[] are initialised polynomials, none
   aliasing a. */
void gs_poly_coeffs_var(gs_poly *out, size_t n, const gs_poly *a, int var,
                        const gs_polyctx *ctx);
/* r = d a / d x_var */
void gs_poly_derivative(gs_poly *r, const gs_poly *a, int var,
                        const gs_polyctx *ctx);
/* poly_subst.c: r = a with x_var replaced by the polynomial b.  r must
   not alias b. */
void gs_poly_subst(gs_poly *r, const gs_poly *a, int var, const gs_poly *b,
                   const gs_polyctx *ctx);
/* x_var replaced by the rational v = p/q: r = scale * a(v) where
   scale = q^degree(a, var), so that r stays integral. */
void gs_poly_subst_rat(gs_poly *r, gs_int *scale, const gs_poly *a, int var,
                       const gs_rat *v, const gs_polyctx *ctx);

/* Limit of the ratio n/d as x_var -> infinity (to_inf = 1) or -> 0
   (to_inf = 0).  On GS_OK the limit is rn/rd, both free of x_var, with rd
   nonzero.  GS_ERANGE when the limit is infinite; GS_EDIVZERO when d = 0.
   Only the leading (to infinity) or trailing (to zero) coefficients in
   x_var matter: the limit is taken symbol by symbol, so other symbols are
   treated as nonzero parameters. */
int gs_poly_limit_ratio(gs_poly *rn, gs_poly *rd, const gs_poly *n,
                        const gs_poly *d, int var, int to_inf,
                        const gs_polyctx *ctx);

/* Evaluation with vals[i] the value of variable i (nvars entries).
   Horner-free term sum, each monomial by repeated multiplication; the
   coefficients are rounded to the working precision. */
double gs_poly_eval_d(const gs_poly *a, const double *vals,
                      const gs_polyctx *ctx);
long double gs_poly_eval_ld(const gs_poly *a, const long double *vals,
                            const gs_polyctx *ctx);
double complex gs_poly_eval_c(const gs_poly *a, const double complex *vals,
                              const gs_polyctx *ctx);
long double complex gs_poly_eval_lc(const gs_poly *a,
                                    const long double complex *vals,
                                    const gs_polyctx *ctx);

/* Plain text in the canonical order, e.g. "3*x^2*y - 2*z + 1", "-x", "0":
   a syntax that a general-purpose CAS (sympy's sympify) reads back.  A
   reciprocal symbol prints as "(1/R)".  A new string the caller frees. */
char *gs_poly_get_str(const gs_poly *a, const gs_polyctx *ctx);
void gs_poly_print(FILE *out, const gs_poly *a, const gs_polyctx *ctx);
/* poly_print.c: the factors of term i but the one of variable skip (-1:
   none), variables increasing: x_vars[j]^exps[j] for j < the count
   returned, every exponent nonzero (vars and exps have room for nvars +
   1: one entry past the count is scratch).  The packed words are read
   directly and a zero word is skipped whole, so the cost follows the
   factors a term has rather than the variables of the context: for
   printers, whose terms in a large result hold a few of many symbols
   (and which print a coefficient of s^k as the terms without s). */
int gs_poly_term_factors(int *vars, unsigned *exps, const gs_poly *a,
                         size_t i, int skip, const gs_polyctx *ctx);
/* Parse the syntax gs_poly_get_str prints (integers, symbol names of the
   context, + - * ^ and parentheses with integer powers) for tests and
   tools.  Unknown names are GS_EINVAL; malformed text GS_ESYNTAX. */
int gs_poly_set_str(gs_poly *r, const char *s, const gs_polyctx *ctx);

/* Multivariate gcd over Z (see poly_gcd.c for the method).  g is
   normalised: primitive with positive leading coefficient; gcd(0, 0) = 0,
   gcd(a, 0) = primitive part of a with positive sign.  Returns GS_OK. */
int gs_poly_gcd(gs_poly *g, const gs_poly *a, const gs_poly *b,
                const gs_polyctx *ctx);

#endif
