/* int.h - arbitrary-precision signed integers. See LICENSE.
 *
 * A gs_int is a value: the caller owns the struct, init it once and clear
 * it once.  Values that fit in a signed 64-bit word (|v| <= INT64_MAX) are
 * kept inline with no heap memory at all; only larger ones own a limb
 * array.  Every output argument may alias any input argument.
 *
 * Representation (read only by int.c and by hot loops that test
 * gs_int_is_small): when `size == 0` the value is `v`; otherwise the
 * magnitude is the `abs(size)` little-endian 32-bit limbs at `d` (no leading
 * zero limb, and always larger than INT64_MAX) and the sign is the sign of
 * size.  Canonical form is enforced: a value that fits in `v` is never
 * stored in limbs.
 */
#ifndef GS_INT_H
#define GS_INT_H

#include <stddef.h>
#include <stdint.h>

#include "gainsmith.h"

typedef struct gs_int {
    int32_t size;       /* 0: small, value in v; else +-limb count */
    int32_t alloc;      /* limbs allocated at d (0 when none) */
    union {
        int64_t v;
        uint32_t *d;
    } u;
} gs_int;

#define gs_int_is_small(a) ((a)->size == 0)

void gs_int_init(gs_int *a);                 /* a = 0 */
void gs_int_clear(gs_int *a);                /* frees limbs, if any */
void gs_int_set(gs_int *r, const gs_int *a);
void gs_int_set_si(gs_int *r, int64_t v);
void gs_int_set_ui(gs_int *r, uint64_t v);
void gs_int_swap(gs_int *a, gs_int *b);      /* O(1) */

/* Decimal text, optional leading '-' or '+', digits only, no spaces.
   Returns GS_OK or GS_ESYNTAX (r unchanged then). */
int gs_int_set_str(gs_int *r, const char *s);
/* Decimal text ("-123"); a new string the caller must gs_free(). */
char *gs_int_get_str(const gs_int *a);

int gs_int_fits_si(const gs_int *a);         /* fits in int64_t? */
int64_t gs_int_get_si(const gs_int *a);      /* precondition: fits_si */
/* Nearest double / long double (round to nearest even on the leading
   bits); +-HUGE_VAL past the range. */
double gs_int_get_d(const gs_int *a);
long double gs_int_get_ld(const gs_int *a);
/* a = m * 2^e with 0.5 <= |m| < 1 (m = 0, e = 0 for zero): for ratios of
   huge integers that overflow a double on their own. */
long double gs_int_get_ld_2exp(long *e, const gs_int *a);
/* |a| rounded to prec <= LDBL_MANT_DIG bits (nearest, ties to even) as an
   integer-valued long double s with |a| ~ s * 2^e, *e >= 0.  sticky != 0
   says the true value is a little above |a| (by less than one unit; then
   |a| must have more than prec bits), as for a truncated quotient with a
   nonzero remainder: the tool for correctly rounded ratios. */
long double gs_int_round_2exp(long *e, const gs_int *a, unsigned prec,
                              int sticky);

int gs_int_sgn(const gs_int *a);             /* -1, 0, +1 */
int gs_int_is_zero(const gs_int *a);
int gs_int_is_one(const gs_int *a);
int gs_int_cmp(const gs_int *a, const gs_int *b);     /* <0, 0, >0 */
int gs_int_cmpabs(const gs_int *a, const gs_int *b);
int gs_int_cmp_si(const gs_int *a, int64_t b);
int gs_int_equal(const gs_int *a, const gs_int *b);
size_t gs_int_bits(const gs_int *a);         /* bits of |a|; 0 for 0 */
uint64_t gs_int_hash(const gs_int *a);       /* equal values, equal hash */

void gs_int_neg(gs_int *r, const gs_int *a);
void gs_int_abs(gs_int *r, const gs_int *a);
void gs_int_add(gs_int *r, const gs_int *a, const gs_int *b);
void gs_int_sub(gs_int *r, const gs_int *a, const gs_int *b);
void gs_int_mul(gs_int *r, const gs_int *a, const gs_int *b);
void gs_int_add_si(gs_int *r, const gs_int *a, int64_t b);
void gs_int_mul_si(gs_int *r, const gs_int *a, int64_t b);
void gs_int_addmul(gs_int *r, const gs_int *a, const gs_int *b); /* r += a*b */
void gs_int_submul(gs_int *r, const gs_int *a, const gs_int *b); /* r -= a*b */
void gs_int_mul_2exp(gs_int *r, const gs_int *a, unsigned long e);
void gs_int_pow_ui(gs_int *r, const gs_int *a, unsigned long e); /* 0^0 = 1 */

/* Division.  b must be nonzero: these return GS_EDIVZERO (outputs
   unchanged) when it is not, GS_OK otherwise.  q and r must be distinct
   objects; either may be NULL when not wanted.
   tdiv: truncating, q = trunc(a/b), r = a - q*b has the sign of a.
   fdiv: flooring,   q = floor(a/b), r has the sign of b.
   Both satisfy a = q*b + r with |r| < |b| (Knuth, TAOCP vol. 2, 4.3.1,
   algorithm D for the multi-limb case). */
int gs_int_tdiv_qr(gs_int *q, gs_int *r, const gs_int *a, const gs_int *b);
int gs_int_fdiv_qr(gs_int *q, gs_int *r, const gs_int *a, const gs_int *b);
/* q = a / b when b divides a: GS_OK; GS_EINEXACT (q unchanged) when it does
   not; GS_EDIVZERO when b = 0. */
int gs_int_divexact(gs_int *q, const gs_int *a, const gs_int *b);
/* a mod m for 0 < m < 2^63, result in [0, m). */
uint64_t gs_int_mod_ui(const gs_int *a, uint64_t m);

void gs_int_gcd(gs_int *r, const gs_int *a, const gs_int *b); /* >= 0 */
void gs_int_lcm(gs_int *r, const gs_int *a, const gs_int *b); /* >= 0 */

#endif
