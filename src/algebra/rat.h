/* rat.h - exact rationals. See LICENSE.
 *
 * A gs_rat is a value: num/den always in lowest terms with den > 0 (zero is
 * 0/1), so equality is structural.  Outputs may alias inputs.  The caller
 * owns the struct (init once, clear once).
 */
#ifndef GS_RAT_H
#define GS_RAT_H

#include "algebra/int.h"

typedef struct gs_rat {
    gs_int num;
    gs_int den;     /* > 0 */
} gs_rat;

void gs_rat_init(gs_rat *r);                 /* r = 0 */
void gs_rat_clear(gs_rat *r);
void gs_rat_set(gs_rat *r, const gs_rat *a);
void gs_rat_set_int(gs_rat *r, const gs_int *a);
/* r = n/d, reduced. Returns GS_EDIVZERO (r unchanged) when d = 0. */
int gs_rat_set_si(gs_rat *r, int64_t n, int64_t d);
int gs_rat_set_int_int(gs_rat *r, const gs_int *n, const gs_int *d);

/* Exact decimal with optional sign, fraction, exponent and one SI prefix
   letter: "42", "-0.5", "4.7k" (= 4700), "2.2n" (= 11/5000000000),
   "1e-3", "1.5E+2", "10u" or "10µ" (micro), "3M" (mega), "3m" (milli).
   Prefixes: f p n u µ m k M G T.  Parses the longest prefix of s that is a
   number and sets *end just past it (end may be NULL, in which case the
   whole string must be a number).  Returns GS_OK or GS_ESYNTAX (r
   unchanged).  No unit letters are consumed past the prefix. */
int gs_rat_parse(gs_rat *r, const char *s, const char **end);
/* The longest number text (sign, digits, point, exponent and prefix) the
   circuit language and the options accept; gs_rat_parse refuses longer
   ones with GS_ESYNTAX, so that parsing stays fast. */
#define GS_RAT_PARSE_MAX_CHARS 1000
/* "3", "-3/4": a new string the caller frees. */
char *gs_rat_get_str(const gs_rat *a);
double gs_rat_get_d(const gs_rat *a);
long double gs_rat_get_ld(const gs_rat *a);  /* correct even when num and
                                                den overflow a long double */

int gs_rat_sgn(const gs_rat *a);
int gs_rat_is_zero(const gs_rat *a);
int gs_rat_is_int(const gs_rat *a);
int gs_rat_cmp(const gs_rat *a, const gs_rat *b);
int gs_rat_equal(const gs_rat *a, const gs_rat *b);

void gs_rat_neg(gs_rat *r, const gs_rat *a);
void gs_rat_add(gs_rat *r, const gs_rat *a, const gs_rat *b);
void gs_rat_sub(gs_rat *r, const gs_rat *a, const gs_rat *b);
void gs_rat_mul(gs_rat *r, const gs_rat *a, const gs_rat *b);
int gs_rat_div(gs_rat *r, const gs_rat *a, const gs_rat *b); /* GS_EDIVZERO */
int gs_rat_inv(gs_rat *r, const gs_rat *a);                  /* GS_EDIVZERO */
void gs_rat_pow_si(gs_rat *r, const gs_rat *a, long e);  /* a != 0 if e<0 */

#endif
