/* rat.c - exact rationals over gs_int. See LICENSE.
 *
 * Every result is computed into temporaries and swapped into place, so
 * outputs may alias inputs.  Sums and products reduce with the gcd tricks
 * of Henrici (Knuth, TAOCP vol. 2, 4.5.1), which keep the operands of each
 * gcd small and leave the result in lowest terms without a final gcd of
 * the full numerator and denominator.
 */
#include "algebra/rat.h"

#include <float.h>
#include <limits.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"
#include "base/si.h"

/* Largest decimal exponent gs_rat_parse accepts, after the prefix and the
   fraction digits are folded in: far past any physical quantity, small
   enough that 10^e stays cheap (common practice for bounded parsers). */
#define PARSE_EXP_MAX 10000L

void gs_rat_init(gs_rat *r)
{
    gs_int_init(&r->num);
    gs_int_init(&r->den);
    gs_int_set_si(&r->den, 1);
}

void gs_rat_clear(gs_rat *r)
{
    gs_int_clear(&r->num);
    gs_int_clear(&r->den);
}

void gs_rat_set(gs_rat *r, const gs_rat *a)
{
    gs_int_set(&r->num, &a->num);
    gs_int_set(&r->den, &a->den);
}

void gs_rat_set_int(gs_rat *r, const gs_int *a)
{
    gs_int_set(&r->num, a);
    gs_int_set_si(&r->den, 1);
}

/* r = n/d with d != 0 into lowest terms, positive denominator */
static void canonicalize(gs_rat *r)
{
    gs_int g;
    if (gs_int_sgn(&r->den) < 0) {
        gs_int_neg(&r->num, &r->num);
        gs_int_neg(&r->den, &r->den);
    }
    if (gs_int_is_one(&r->den))
        return;
    if (gs_int_is_zero(&r->num)) {
        gs_int_set_si(&r->den, 1);
        return;
    }
    gs_int_init(&g);
    gs_int_gcd(&g, &r->num, &r->den);
    if (!gs_int_is_one(&g)) {
        gs_int_divexact(&r->num, &r->num, &g);
        gs_int_divexact(&r->den, &r->den, &g);
    }
    gs_int_clear(&g);
}

int gs_rat_set_int_int(gs_rat *r, const gs_int *n, const gs_int *d)
{
    gs_rat t;
    if (gs_int_is_zero(d))
        return GS_EDIVZERO;
    gs_rat_init(&t);
    gs_int_set(&t.num, n);
    gs_int_set(&t.den, d);
    canonicalize(&t);
    gs_int_swap(&r->num, &t.num);
    gs_int_swap(&r->den, &t.den);
    gs_rat_clear(&t);
    return GS_OK;
}

int gs_rat_set_si(gs_rat *r, int64_t n, int64_t d)
{
    gs_int a, b;
    int rc;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_set_si(&a, n);
    gs_int_set_si(&b, d);
    rc = gs_rat_set_int_int(r, &a, &b);
    gs_int_clear(&a);
    gs_int_clear(&b);
    return rc;
}

/* ---- parsing and printing ----------------------------------------------- */

static size_t digits(const char *p)
{
    return strspn(p, "0123456789");
}

/* An exponent "e-12" at p: its length (0 if there is none) and value;
   *big is set when its magnitude passes PARSE_EXP_MAX. */
static size_t exponent(const char *p, long *e, int *big)
{
    const char *q = p + 1;
    int neg = 0;
    size_t n, i;
    *e = 0;
    if (*p != 'e' && *p != 'E')
        return 0;
    if (*q == '+' || *q == '-')
        neg = *q++ == '-';
    n = digits(q);
    if (n == 0)
        return 0;
    for (i = 0; i < n; i++) {
        *e = *e * 10 + (q[i] - '0');
        if (*e > PARSE_EXP_MAX) {
            *big = 1;
            *e = PARSE_EXP_MAX;
        }
    }
    if (neg)
        *e = -*e;
    return (size_t)(q + n - p);
}

/* r = (-1)^neg * digits * 10^e, reduced */
static void set_decimal(gs_rat *r, const char *dig, int neg, long e)
{
    gs_rat t;
    gs_int p;
    gs_rat_init(&t);
    gs_int_init(&p);
    gs_int_set_str(&t.num, dig);
    if (neg)
        gs_int_neg(&t.num, &t.num);
    gs_int_set_si(&p, 10);
    gs_int_pow_ui(&p, &p, (unsigned long)(e < 0 ? -e : e));
    if (e >= 0)
        gs_int_mul(&t.num, &t.num, &p);
    else
        gs_int_swap(&t.den, &p);
    canonicalize(&t);
    gs_int_swap(&r->num, &t.num);
    gs_int_swap(&r->den, &t.den);
    gs_int_clear(&p);
    gs_rat_clear(&t);
}

/* Grammar: [+-] (D+ [. D+] | . D+) [(e|E) [+-] D+] [prefix].  A '.' must
   be followed by a digit ("1." is the number 1 followed by '.', ".5" is
   one half); an 'e' not followed by digits is not part of the number.
   Exponents past PARSE_EXP_MAX are a syntax error. */
int gs_rat_parse(gs_rat *r, const char *s, const char **end)
{
    const char *p = s, *ip, *fp = "";
    size_t il, fl = 0, n;
    long e;
    int pe = 0;
    int neg = 0, big = 0;
    char *dig;
    if (*p == '+' || *p == '-')
        neg = *p++ == '-';
    ip = p;
    il = digits(p);
    p += il;
    if (*p == '.' && p[1] >= '0' && p[1] <= '9') {
        fp = p + 1;
        fl = digits(fp);
        p = fp + fl;
    }
    if (il + fl == 0 || il + fl > GS_RAT_PARSE_MAX_CHARS)
        return GS_ESYNTAX;
    p += exponent(p, &e, &big);
    p += gs_si_prefix_scan(p, &pe);
    if ((end == NULL && *p != '\0') || big)
        return GS_ESYNTAX;
    e += pe - (long)fl;
    if (e > PARSE_EXP_MAX || e < -PARSE_EXP_MAX - (long)fl)
        return GS_ESYNTAX;
    n = il + fl;
    dig = gs_malloc(n + 1);
    memcpy(dig, ip, il);
    memcpy(dig + il, fp, fl);
    dig[n] = '\0';
    set_decimal(r, dig, neg, e);
    gs_free(dig);
    if (end != NULL)
        *end = p;
    return GS_OK;
}

char *gs_rat_get_str(const gs_rat *a)
{
    char *n, *d, *s;
    n = gs_int_get_str(&a->num);
    if (gs_int_is_one(&a->den))
        return n;
    d = gs_int_get_str(&a->den);
    s = gs_asprintf("%s/%s", n, d);
    gs_free(n);
    gs_free(d);
    return s;
}

/* |a| correctly rounded to prec bits: an integer-valued s with
   |a| ~ s 2^e.  The quotient is taken with at least prec + 2 bits and
   the remainder becomes the sticky bit, so there is one rounding only. */
static long double rat_round(long *e, const gs_rat *a, unsigned prec)
{
    gs_int n, d, q, rem;
    long nb = (long)gs_int_bits(&a->num), db = (long)gs_int_bits(&a->den);
    long k = (long)prec + 2 - (nb - db), sh;
    long double x;
    gs_int_init(&n);
    gs_int_init(&d);
    gs_int_init(&q);
    gs_int_init(&rem);
    gs_int_abs(&n, &a->num);
    gs_int_set(&d, &a->den);
    if (k > 0)
        gs_int_mul_2exp(&n, &n, (unsigned long)k);
    else if (k < 0)
        gs_int_mul_2exp(&d, &d, (unsigned long)-k);
    gs_int_tdiv_qr(&q, &rem, &n, &d);
    x = gs_int_round_2exp(&sh, &q, prec, !gs_int_is_zero(&rem));
    *e = sh - k;
    gs_int_clear(&n);
    gs_int_clear(&d);
    gs_int_clear(&q);
    gs_int_clear(&rem);
    return x;
}

static int clamp_int(long e)
{
    return e > INT_MAX ? INT_MAX : e < INT_MIN ? INT_MIN : (int)e;
}

/* Results in the subnormal range are rounded twice (to prec bits, then
   by ldexp), which can be one unit off there. */
double gs_rat_get_d(const gs_rat *a)
{
    long e;
    double x;
    if (gs_int_is_zero(&a->num))
        return 0;
    if (gs_int_bits(&a->num) <= DBL_MANT_DIG
        && gs_int_bits(&a->den) <= DBL_MANT_DIG)   /* exact operands */
        return gs_int_get_d(&a->num) / gs_int_get_d(&a->den);
    x = (double)rat_round(&e, a, DBL_MANT_DIG);    /* exact: prec bits */
    x = ldexp(x, clamp_int(e));
    return gs_int_sgn(&a->num) < 0 ? -x : x;
}

long double gs_rat_get_ld(const gs_rat *a)
{
    long e;
    long double x;
    if (gs_int_is_zero(&a->num))
        return 0;
    if (gs_int_bits(&a->num) <= LDBL_MANT_DIG
        && gs_int_bits(&a->den) <= LDBL_MANT_DIG)
        return gs_int_get_ld(&a->num) / gs_int_get_ld(&a->den);
    x = rat_round(&e, a, LDBL_MANT_DIG);
    x = ldexpl(x, clamp_int(e));
    return gs_int_sgn(&a->num) < 0 ? -x : x;
}

/* ---- predicates --------------------------------------------------------- */

int gs_rat_sgn(const gs_rat *a)
{
    return gs_int_sgn(&a->num);
}

int gs_rat_is_zero(const gs_rat *a)
{
    return gs_int_is_zero(&a->num);
}

int gs_rat_is_int(const gs_rat *a)
{
    return gs_int_is_one(&a->den);
}

int gs_rat_cmp(const gs_rat *a, const gs_rat *b)
{
    gs_int x, y;
    int sa = gs_rat_sgn(a), sb = gs_rat_sgn(b), c;
    if (sa != sb)
        return sa < sb ? -1 : 1;
    if (gs_int_equal(&a->den, &b->den))
        return gs_int_cmp(&a->num, &b->num);
    gs_int_init(&x);
    gs_int_init(&y);
    gs_int_mul(&x, &a->num, &b->den);           /* dens are positive */
    gs_int_mul(&y, &b->num, &a->den);
    c = gs_int_cmp(&x, &y);
    gs_int_clear(&x);
    gs_int_clear(&y);
    return c;
}

int gs_rat_equal(const gs_rat *a, const gs_rat *b)
{
    return gs_int_equal(&a->num, &b->num) && gs_int_equal(&a->den, &b->den);
}

/* ---- arithmetic --------------------------------------------------------- */

void gs_rat_neg(gs_rat *r, const gs_rat *a)
{
    gs_int_neg(&r->num, &a->num);
    gs_int_set(&r->den, &a->den);
}

static void take(gs_rat *r, gs_int *num, gs_int *den)
{
    gs_int_swap(&r->num, num);
    gs_int_swap(&r->den, den);
}

/* u/u' +- v/v' (Knuth, TAOCP vol. 2, 4.5.1): with d1 = gcd(u', v') and
   t = u (v'/d1) +- v (u'/d1), d2 = gcd(t, d1), the sum in lowest terms is
   (t/d2) / ((u'/d1) (v'/d2)). */
static void addsub(gs_rat *r, const gs_rat *a, const gs_rat *b, int sub)
{
    gs_int d1, t, x, y;
    void (*op)(gs_int *, const gs_int *, const gs_int *) =
        sub ? gs_int_submul : gs_int_addmul;
    if (gs_int_is_one(&a->den) && gs_int_is_one(&b->den)) {
        (sub ? gs_int_sub : gs_int_add)(&r->num, &a->num, &b->num);
        gs_int_set_si(&r->den, 1);
        return;
    }
    gs_int_init(&d1);
    gs_int_init(&t);
    gs_int_init(&x);
    gs_int_init(&y);
    gs_int_gcd(&d1, &a->den, &b->den);
    gs_int_divexact(&x, &a->den, &d1);          /* u'/d1 */
    gs_int_divexact(&y, &b->den, &d1);          /* v'/d1 */
    gs_int_mul(&t, &a->num, &y);
    op(&t, &b->num, &x);
    if (gs_int_is_zero(&t)) {
        gs_int_set_si(&x, 1);
    } else if (gs_int_is_one(&d1)) {
        gs_int_mul(&x, &x, &b->den);            /* u' v' */
    } else {
        gs_int_gcd(&d1, &t, &d1);               /* d2 */
        gs_int_divexact(&t, &t, &d1);
        gs_int_divexact(&y, &b->den, &d1);
        gs_int_mul(&x, &x, &y);
    }
    take(r, &t, &x);
    gs_int_clear(&d1);
    gs_int_clear(&t);
    gs_int_clear(&x);
    gs_int_clear(&y);
}

void gs_rat_add(gs_rat *r, const gs_rat *a, const gs_rat *b)
{
    addsub(r, a, b, 0);
}

void gs_rat_sub(gs_rat *r, const gs_rat *a, const gs_rat *b)
{
    addsub(r, a, b, 1);
}

/* r = (u/u') (v/v') from reduced inputs: with d1 = gcd(u, v') and
   d2 = gcd(v, u'), the product (u/d1)(v/d2) / ((u'/d2)(v'/d1)) is in
   lowest terms (Knuth, TAOCP vol. 2, 4.5.1).  Shared by mul and div. */
static void mul_parts(gs_rat *r, const gs_int *u, const gs_int *u1,
                      const gs_int *v, const gs_int *v1)
{
    gs_int d1, d2, n, d, t;
    gs_int_init(&d1);
    gs_int_init(&d2);
    gs_int_init(&n);
    gs_int_init(&d);
    gs_int_init(&t);
    gs_int_gcd(&d1, u, v1);
    gs_int_gcd(&d2, v, u1);
    gs_int_divexact(&n, u, &d1);
    gs_int_divexact(&t, v, &d2);
    gs_int_mul(&n, &n, &t);
    gs_int_divexact(&d, u1, &d2);
    gs_int_divexact(&t, v1, &d1);
    gs_int_mul(&d, &d, &t);
    if (gs_int_sgn(&d) < 0) {
        gs_int_neg(&n, &n);
        gs_int_neg(&d, &d);
    }
    take(r, &n, &d);
    gs_int_clear(&d1);
    gs_int_clear(&d2);
    gs_int_clear(&n);
    gs_int_clear(&d);
    gs_int_clear(&t);
}

void gs_rat_mul(gs_rat *r, const gs_rat *a, const gs_rat *b)
{
    if (gs_int_is_zero(&a->num) || gs_int_is_zero(&b->num)) {
        gs_int_set_si(&r->num, 0);
        gs_int_set_si(&r->den, 1);
        return;
    }
    if (gs_int_is_one(&a->den) && gs_int_is_one(&b->den)) {
        gs_int_mul(&r->num, &a->num, &b->num);
        gs_int_set_si(&r->den, 1);
        return;
    }
    mul_parts(r, &a->num, &a->den, &b->num, &b->den);
}

int gs_rat_div(gs_rat *r, const gs_rat *a, const gs_rat *b)
{
    if (gs_int_is_zero(&b->num))
        return GS_EDIVZERO;
    if (gs_int_is_zero(&a->num)) {
        gs_int_set_si(&r->num, 0);
        gs_int_set_si(&r->den, 1);
        return GS_OK;
    }
    mul_parts(r, &a->num, &a->den, &b->den, &b->num);
    return GS_OK;
}

int gs_rat_inv(gs_rat *r, const gs_rat *a)
{
    gs_int n, d;
    if (gs_int_is_zero(&a->num))
        return GS_EDIVZERO;
    gs_int_init(&n);
    gs_int_init(&d);
    gs_int_set(&n, &a->den);
    gs_int_set(&d, &a->num);
    if (gs_int_sgn(&d) < 0) {
        gs_int_neg(&n, &n);
        gs_int_neg(&d, &d);
    }
    take(r, &n, &d);
    gs_int_clear(&n);
    gs_int_clear(&d);
    return GS_OK;
}

/* Powers of a reduced fraction stay reduced.  For e < 0 and a = 0 (a
   precondition breach) r is left unchanged. */
void gs_rat_pow_si(gs_rat *r, const gs_rat *a, long e)
{
    unsigned long m;
    gs_rat t;
    if (e < 0 && gs_int_is_zero(&a->num))
        return;
    m = e < 0 ? (unsigned long)-(e + 1) + 1 : (unsigned long)e;
    gs_rat_init(&t);
    if (e < 0)
        gs_rat_inv(&t, a);
    else
        gs_rat_set(&t, a);
    gs_int_pow_ui(&t.num, &t.num, m);
    gs_int_pow_ui(&t.den, &t.den, m);
    take(r, &t.num, &t.den);
    gs_rat_clear(&t);
}
