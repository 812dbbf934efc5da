/* test_rat.c - unit tests of the exact rationals. See LICENSE.
 *
 * Known values carry their source in a comment.  The property loops use a
 * seeded generator (the seed may be given as argv[1]); a failure prints
 * the seed, the case number and the operands.
 */
#include <float.h>
#include <inttypes.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "testlib.h"
#include "gainsmith.h"
#include "base/mem.h"
#include "algebra/rat.h"

static uint64_t seed = 20240602u;
static gs_rng rng_state;

static uint64_t rnd(void)
{
    return gs_rng_next(&rng_state);
}

static int is(const gs_rat *a, const char *s)
{
    char *t = gs_rat_get_str(a);
    int ok = strcmp(t, s) == 0;
    if (!ok)
        fprintf(stderr, "  got %s, want %s\n", t, s);
    free(t);
    return ok;
}

static void dump(const char *name, const gs_rat *a)
{
    char *t = gs_rat_get_str(a);
    fprintf(stderr, "  %s = %s\n", name, t);
    free(t);
}

/* lowest terms, positive denominator (rat.h) */
static int canonical(const gs_rat *a)
{
    gs_int g;
    int ok;
    gs_int_init(&g);
    gs_int_gcd(&g, &a->num, &a->den);
    ok = gs_int_sgn(&a->den) > 0 && gs_int_is_one(&g);
    gs_int_clear(&g);
    return ok;
}

/* ---- parsing ------------------------------------------------------------ */

/* Decimal notation with SI prefixes: BIPM, The International System of
   Units, 9th ed. (2019), table 7 (f 10^-15 ... T 10^12; micro is the
   Greek mu, written U+00B5 MICRO SIGN or U+03BC in text). */
static void test_parse_values(void)
{
    static const char *const c[][2] = {
        {"42", "42"},
        {"-0.5", "-1/2"},
        {"4.7k", "4700"},
        {"2.2n", "11/5000000000"},
        {"1e-3", "1/1000"},
        {"1.5E+2", "150"},
        {"10u", "1/100000"},
        {"10\xc2\xb5", "1/100000"},             /* U+00B5 MICRO SIGN */
        {"10\xce\xbc", "1/100000"},             /* U+03BC GREEK MU */
        {"3M", "3000000"},
        {"3m", "3/1000"},
        {"1f", "1/1000000000000000"},
        {"22p", "11/500000000000"},
        {"1G", "1000000000"},
        {"2.5T", "2500000000000"},
        {"+7", "7"},
        {".5", "1/2"},
        {"-.25", "-1/4"},
        {"0.000", "0"},
        {"-0", "0"},
        {"007", "7"},
        {"1e3k", "1000000"},
        {"12.5e-1m", "1/800"},
        {"100E0", "100"},
        {"0.1", "1/10"},
        {"3.14159", "314159/100000"},
        {"123456789012345678901234567890.5",
         "246913578024691357802469135781/2"},
    };
    gs_rat r;
    size_t i;
    gs_rat_init(&r);
    for (i = 0; i < sizeof c / sizeof c[0]; i++) {
        int rc = gs_rat_parse(&r, c[i][0], NULL);
        CHECK_MSG(rc == GS_OK && is(&r, c[i][1]) && canonical(&r), "\"%s\"",
                  c[i][0]);
    }
    gs_rat_clear(&r);
}

/* With an end pointer, the longest number at the start is taken and no
   unit letter past the prefix. */
static void test_parse_end(void)
{
    static const char *const c[][3] = {
        {"4.7kOhm", "4700", "Ohm"},
        {"10uF", "1/100000", "F"},
        {"1.", "1", "."},
        {"1.k", "1", ".k"},
        {"1e", "1", "e"},
        {"2.5e+", "5/2", "e+"},
        {"1kk", "1000", "k"},
        {"3 x", "3", " x"},
        {"5F", "5", "F"},
        {"-1.5mA", "-3/2000", "A"},
        {"7)", "7", ")"},
    };
    gs_rat r;
    size_t i;
    gs_rat_init(&r);
    for (i = 0; i < sizeof c / sizeof c[0]; i++) {
        const char *end = NULL;
        int rc = gs_rat_parse(&r, c[i][0], &end);
        CHECK_MSG(rc == GS_OK && is(&r, c[i][1]) && end != NULL
                  && strcmp(end, c[i][2]) == 0, "\"%s\"", c[i][0]);
    }
    gs_rat_clear(&r);
}

/* Malformed text is GS_ESYNTAX and leaves r alone.  Decisions: "1." and
   "1e" are not whole numbers (a '.' or 'e' must be followed by digits),
   ".5" is; exponents past 10^10000 are refused. */
static void test_parse_errors(void)
{
    static const char *const bad[] = {
        "", "1.", ".", "-", "+", "1e", "1e+", "e5", "k", "1kk", "--1",
        "+-1", "1k5", " 1", "1 ", "0x1", "1.2.3", "1e99999", "1e-10001",
        "1,5", "\xc2\xb5", "1\xc2", "1e3.5", "inf", "nan", "1/2",
    };
    static const char *const bad_prefix[] = {"", "k", "--1", ".", "-.e1",
                                             "\xc2\xb5"};
    gs_rat r;
    size_t i;
    gs_rat_init(&r);
    gs_rat_set_si(&r, 17, 3);
    for (i = 0; i < sizeof bad / sizeof bad[0]; i++)
        CHECK_MSG(gs_rat_parse(&r, bad[i], NULL) == GS_ESYNTAX
                  && is(&r, "17/3"), "\"%s\"", bad[i]);
    for (i = 0; i < sizeof bad_prefix / sizeof bad_prefix[0]; i++) {
        const char *end = NULL;
        CHECK_MSG(gs_rat_parse(&r, bad_prefix[i], &end) == GS_ESYNTAX
                  && is(&r, "17/3"), "\"%s\" with end", bad_prefix[i]);
    }
    /* the largest accepted exponents */
    CHECK(gs_rat_parse(&r, "1e10000", NULL) == GS_OK
          && gs_int_bits(&r.num) == 33220);     /* floor(10^4 log2 10)+1 */
    CHECK(gs_rat_parse(&r, "1e-10000", NULL) == GS_OK
          && gs_int_is_one(&r.num));
    gs_rat_clear(&r);
}

/* ---- arithmetic --------------------------------------------------------- */

static void set(gs_rat *r, const char *s)
{
    CHECK_MSG(gs_rat_parse(r, s, NULL) == GS_OK, "\"%s\"", s);
}

/* Fraction arithmetic (elementary); each result in lowest terms. */
static void test_arith_values(void)
{
    gs_rat a, b, c;
    gs_rat_init(&a);
    gs_rat_init(&b);
    gs_rat_init(&c);

    gs_rat_set_si(&a, 1, 2);
    gs_rat_set_si(&b, 1, 3);
    gs_rat_add(&c, &a, &b);
    CHECK(is(&c, "5/6"));                       /* 1/2 + 1/3 */
    gs_rat_sub(&c, &a, &b);
    CHECK(is(&c, "1/6"));
    gs_rat_set_si(&a, 1, 6);
    gs_rat_add(&c, &a, &b);
    CHECK(is(&c, "1/2"));                       /* 1/6 + 1/3, gcd 3 */
    gs_rat_set_si(&a, 5, 12);
    gs_rat_set_si(&b, 1, 12);
    gs_rat_add(&c, &a, &b);
    CHECK(is(&c, "1/2"));                       /* 5/12 + 1/12 */
    gs_rat_sub(&c, &a, &a);
    CHECK(is(&c, "0") && canonical(&c));
    gs_rat_set_si(&a, 7, 10);
    gs_rat_set_si(&b, -7, 10);
    gs_rat_add(&c, &a, &b);
    CHECK(is(&c, "0") && canonical(&c));
    gs_rat_set_si(&a, 3, 4);
    gs_rat_set_si(&b, 2, 3);
    gs_rat_mul(&c, &a, &b);
    CHECK(is(&c, "1/2"));
    gs_rat_set_si(&a, 1, 2);
    gs_rat_set_si(&b, 1, 4);
    CHECK(gs_rat_div(&c, &a, &b) == GS_OK && is(&c, "2"));
    gs_rat_set_si(&a, -1, 2);
    gs_rat_set_si(&b, -1, 3);
    CHECK(gs_rat_div(&c, &a, &b) == GS_OK && is(&c, "3/2"));
    gs_rat_set_si(&b, 2, -3);
    CHECK(gs_rat_div(&c, &a, &b) == GS_OK && is(&c, "3/4"));
    gs_rat_set_si(&a, 3, 1);
    gs_rat_set_si(&b, 5, 1);
    gs_rat_add(&c, &a, &b);
    CHECK(is(&c, "8") && gs_rat_is_int(&c));
    gs_rat_mul(&c, &a, &b);
    CHECK(is(&c, "15"));

    /* the parallel of two 4.7k resistors is exactly 2.35k */
    set(&a, "4.7k");
    gs_rat_inv(&a, &a);
    gs_rat_add(&a, &a, &a);
    gs_rat_inv(&a, &a);
    set(&b, "2.35k");
    CHECK(gs_rat_equal(&a, &b) && is(&a, "2350"));

    gs_rat_clear(&a);
    gs_rat_clear(&b);
    gs_rat_clear(&c);
}

static void test_special_cases(void)
{
    gs_rat a, b, c;
    gs_rat_init(&a);
    gs_rat_init(&b);
    gs_rat_init(&c);
    CHECK(is(&a, "0") && canonical(&a));        /* init is 0/1 */
    CHECK(gs_rat_set_si(&a, 6, -4) == GS_OK && is(&a, "-3/2"));
    CHECK(gs_rat_set_si(&a, 0, -5) == GS_OK && is(&a, "0") && canonical(&a));
    CHECK(gs_rat_set_si(&a, INT64_MIN, INT64_MIN) == GS_OK && is(&a, "1"));
    CHECK(gs_rat_set_si(&a, 1, INT64_MIN) == GS_OK
          && is(&a, "-1/9223372036854775808"));
    CHECK(gs_rat_set_si(&a, 5, 7) == GS_OK);
    CHECK(gs_rat_set_si(&a, 1, 0) == GS_EDIVZERO && is(&a, "5/7"));
    CHECK(gs_rat_set_int_int(&a, &b.num, &b.num) == GS_EDIVZERO);
    CHECK(gs_rat_set_int_int(&a, &a.den, &a.num) == GS_OK && is(&a, "7/5"));

    /* division by zero: GS_EDIVZERO, r unchanged */
    gs_rat_set_si(&c, 9, 4);
    CHECK(gs_rat_div(&c, &a, &b) == GS_EDIVZERO && is(&c, "9/4"));
    CHECK(gs_rat_inv(&c, &b) == GS_EDIVZERO && is(&c, "9/4"));
    CHECK(gs_rat_div(&c, &b, &a) == GS_OK && is(&c, "0") && canonical(&c));
    gs_rat_set_si(&a, -2, 3);
    CHECK(gs_rat_inv(&c, &a) == GS_OK && is(&c, "-3/2"));

    /* powers: (2/3)^-3 = 27/8, (-2/3)^3 = -8/27, x^0 = 1 */
    gs_rat_set_si(&a, 2, 3);
    gs_rat_pow_si(&c, &a, -3);
    CHECK(is(&c, "27/8"));
    gs_rat_set_si(&a, -2, 3);
    gs_rat_pow_si(&c, &a, 3);
    CHECK(is(&c, "-8/27"));
    gs_rat_pow_si(&c, &a, -2);
    CHECK(is(&c, "9/4"));
    gs_rat_pow_si(&a, &a, 0);
    CHECK(is(&a, "1"));
    gs_rat_pow_si(&c, &b, 0);
    CHECK(is(&c, "1"));
    gs_rat_pow_si(&c, &b, -1);                  /* precondition breach */
    CHECK(is(&c, "1"));

    /* comparison */
    gs_rat_set_si(&a, 1, 3);
    gs_rat_set_si(&b, 1, 2);
    CHECK(gs_rat_cmp(&a, &b) < 0 && gs_rat_cmp(&b, &a) > 0);
    gs_rat_set_si(&b, -1, 2);
    CHECK(gs_rat_cmp(&b, &a) < 0 && gs_rat_sgn(&b) < 0);
    gs_rat_set_si(&a, 2, 4);
    gs_rat_set_si(&b, 1, 2);
    CHECK(gs_rat_cmp(&a, &b) == 0 && gs_rat_equal(&a, &b));
    gs_rat_neg(&a, &a);
    CHECK(is(&a, "-1/2") && !gs_rat_is_int(&a) && !gs_rat_is_zero(&a));
    gs_rat_clear(&a);
    gs_rat_clear(&b);
    gs_rat_clear(&c);
}

/* ---- conversion to floating point --------------------------------------- */

static int long_double_works(void)
{
    volatile long double one = 1, eps = LDBL_EPSILON;
    return one + eps != one;
}

/* r = 3 (2^p + 1) + extra over 3 2^p: 1 + 2^-p (a tie between 1 and
   1 + 2^(1-p)) plus extra/(3 2^p) */
static void near_tie(gs_rat *r, unsigned p, int extra)
{
    gs_int n, d;
    gs_int_init(&n);
    gs_int_init(&d);
    gs_int_set_si(&d, 3);
    gs_int_mul_2exp(&d, &d, p);
    gs_int_add_si(&n, &d, 3 + extra);
    gs_rat_set_int_int(r, &n, &d);
    gs_int_clear(&n);
    gs_int_clear(&d);
}

/* IEEE 754-2008, 4.3.1: round to nearest, ties to even.  Expected values
   of the huge ratios from sympy 1.14, float(Rational(n, d)). */
static void test_get_d(void)
{
    gs_rat a;
    gs_int n, d;
    gs_rat_init(&a);
    gs_int_init(&n);
    gs_int_init(&d);

    gs_rat_set_si(&a, 1, 3);
    CHECK(gs_rat_get_d(&a) == 1.0 / 3.0);
    gs_rat_set_si(&a, -22, 7);
    CHECK(gs_rat_get_d(&a) == -22.0 / 7.0);
    near_tie(&a, DBL_MANT_DIG, 0);              /* exact tie: even */
    CHECK(gs_rat_get_d(&a) == 1.0);
    near_tie(&a, DBL_MANT_DIG, 1);              /* just above the tie */
    CHECK(gs_rat_get_d(&a) == 1.0 + DBL_EPSILON);
    near_tie(&a, DBL_MANT_DIG, -1);             /* just below */
    CHECK(gs_rat_get_d(&a) == 1.0);

    /* (3^1000 + 1) / (5 2^1500 + 7): both far past DBL_MAX */
    gs_int_set_si(&n, 3);
    gs_int_pow_ui(&n, &n, 1000);
    gs_int_add_si(&n, &n, 1);
    gs_int_set_si(&d, 5);
    gs_int_mul_2exp(&d, &d, 1500);
    gs_int_add_si(&d, &d, 7);
    gs_rat_set_int_int(&a, &n, &d);
    CHECK(gs_rat_get_d(&a) == 0x1.8f17340f75ee1p+82);
    /* -7^500 / 11^480 */
    gs_int_set_si(&n, 7);
    gs_int_pow_ui(&n, &n, 500);
    gs_int_neg(&n, &n);
    gs_int_set_si(&d, 11);
    gs_int_pow_ui(&d, &d, 480);
    gs_rat_set_int_int(&a, &n, &d);
    CHECK(gs_rat_get_d(&a) == -0x1.1c1b10a8e66fep-257);
    /* (10^400 + 1) / (3 10^399) rounds like 10/3 */
    gs_int_set_si(&n, 10);
    gs_int_pow_ui(&n, &n, 399);
    gs_int_mul_si(&d, &n, 3);
    gs_int_mul_si(&n, &n, 10);
    gs_int_add_si(&n, &n, 1);
    gs_rat_set_int_int(&a, &n, &d);
    CHECK(gs_rat_get_d(&a) == 0x1.aaaaaaaaaaaabp+1);

    if (long_double_works()) {
        near_tie(&a, LDBL_MANT_DIG, 0);
        CHECK(gs_rat_get_ld(&a) == 1.0L);
        near_tie(&a, LDBL_MANT_DIG, 1);
        CHECK(gs_rat_get_ld(&a) == 1.0L + LDBL_EPSILON);
        /* (10^6000 + 1) / (3 10^5999): both past LDBL_MAX (~1.19e4932
           for the x87 format), ratio 10/3 */
        gs_int_set_si(&n, 10);
        gs_int_pow_ui(&n, &n, 5999);
        gs_int_mul_si(&d, &n, 3);
        gs_int_mul_si(&n, &n, 10);
        gs_int_add_si(&n, &n, 1);
        gs_rat_set_int_int(&a, &n, &d);
        CHECK(gs_rat_get_ld(&a) == 10.0L / 3.0L);
        gs_rat_neg(&a, &a);
        CHECK(gs_rat_get_ld(&a) == -10.0L / 3.0L);
        gs_rat_set_si(&a, 2, 3);
        CHECK(gs_rat_get_ld(&a) == 2.0L / 3.0L);
    } else {
        printf("rat: long double arithmetic is not carried out at full "
               "precision here; skipping the long double checks\n");
    }
    gs_rat_clear(&a);
    gs_int_clear(&n);
    gs_int_clear(&d);
}

/* ---- properties --------------------------------------------------------- */

static void random_int(gs_int *r, int maxlimbs)
{
    int n = (int)(rnd() % (uint64_t)(maxlimbs + 1)), i;
    gs_int_set_si(r, 0);
    for (i = 0; i < n; i++) {
        gs_int_mul_2exp(r, r, 32);
        gs_int_add_si(r, r, (int64_t)(rnd() >> 32));
    }
    if (rnd() & 1)
        gs_int_neg(r, r);
}

/* small values most of the time, the way circuit values are */
static void random_rat(gs_rat *r, int maxlimbs)
{
    gs_int n, d;
    gs_int_init(&n);
    gs_int_init(&d);
    if (rnd() % 3 == 0) {
        gs_int_set_si(&n, (int64_t)(rnd() % 41) - 20);
        gs_int_set_si(&d, (int64_t)(rnd() % 12) + 1);
    } else {
        random_int(&n, maxlimbs);
        do
            random_int(&d, maxlimbs);
        while (gs_int_is_zero(&d));
    }
    gs_rat_set_int_int(r, &n, &d);
    gs_int_clear(&n);
    gs_int_clear(&d);
}

#define FAIL3(cond)                                                        \
    do {                                                                   \
        int ok_ = (cond);                                                  \
        CHECK_MSG(ok_, "(seed %" PRIu64 ", case %d)", seed, it);           \
        if (!ok_) {                                                        \
            dump("a", &a);                                                 \
            dump("b", &b);                                                 \
            dump("c", &c);                                                 \
        }                                                                  \
    } while (0)

/* Field laws (additive inverse, division undoes multiplication,
   distributivity), lowest terms after every operation, and aliasing. */
static void test_field_properties(void)
{
    gs_rat a, b, c, x, y, z;
    int it;
    gs_rat_init(&a);
    gs_rat_init(&b);
    gs_rat_init(&c);
    gs_rat_init(&x);
    gs_rat_init(&y);
    gs_rat_init(&z);
    for (it = 0; it < 3000; it++) {
        random_rat(&a, it < 1500 ? 2 : 8);
        random_rat(&b, it < 1500 ? 2 : 8);
        random_rat(&c, 3);
        gs_rat_add(&x, &a, &b);                 /* (a + b) - b = a */
        gs_rat_sub(&y, &x, &b);
        FAIL3(gs_rat_equal(&y, &a) && canonical(&x) && canonical(&y));
        gs_rat_mul(&x, &a, &b);                 /* (a b) / b = a */
        if (!gs_rat_is_zero(&b)) {
            FAIL3(gs_rat_div(&y, &x, &b) == GS_OK && gs_rat_equal(&y, &a)
                  && canonical(&x) && canonical(&y));
        }
        gs_rat_add(&y, &b, &c);                 /* a (b + c) = ab + ac */
        gs_rat_mul(&y, &a, &y);
        gs_rat_mul(&z, &a, &c);
        gs_rat_add(&z, &x, &z);
        FAIL3(gs_rat_equal(&y, &z) && canonical(&z));
        gs_rat_sub(&x, &a, &b);                 /* cmp = sgn(a - b) */
        FAIL3(gs_rat_cmp(&a, &b) == gs_rat_sgn(&x));
        gs_rat_set(&x, &a);                     /* aliasing */
        gs_rat_add(&x, &x, &x);
        gs_rat_add(&y, &a, &a);
        FAIL3(gs_rat_equal(&x, &y));
        gs_rat_set(&x, &a);
        gs_rat_mul(&x, &x, &b);
        gs_rat_mul(&y, &a, &b);
        FAIL3(gs_rat_equal(&x, &y));
        gs_rat_set(&x, &b);
        gs_rat_sub(&x, &a, &x);
        gs_rat_sub(&y, &a, &b);
        FAIL3(gs_rat_equal(&x, &y));
        if (!gs_rat_is_zero(&b)) {
            gs_rat_set(&x, &b);
            gs_rat_div(&x, &a, &x);
            gs_rat_div(&y, &a, &b);
            FAIL3(gs_rat_equal(&x, &y));
            gs_rat_set(&x, &b);
            gs_rat_div(&x, &x, &x);
            FAIL3(is(&x, "1"));
        }
        gs_rat_set(&x, &a);
        gs_rat_mul(&x, &x, &x);
        gs_rat_pow_si(&y, &a, 2);
        FAIL3(gs_rat_equal(&x, &y) && canonical(&y));
    }
    gs_rat_clear(&a);
    gs_rat_clear(&b);
    gs_rat_clear(&c);
    gs_rat_clear(&x);
    gs_rat_clear(&y);
    gs_rat_clear(&z);
}

/* get_str and parse are inverse on integers and on k/10^j decimals. */
static void test_text_properties(void)
{
    gs_rat a, b, c;
    int it;
    gs_rat_init(&a);
    gs_rat_init(&b);
    gs_rat_init(&c);
    for (it = 0; it < 1000; it++) {
        char *s, *t;
        random_rat(&a, 4);
        s = gs_int_get_str(&a.num);
        gs_rat_set_si(&b, 1, 3);
        FAIL3(gs_rat_parse(&b, s, NULL) == GS_OK
              && gs_int_equal(&b.num, &a.num) && gs_rat_is_int(&b));
        /* "N" followed by "e-j" is N / 10^j */
        t = gs_asprintf("%se-%d", s, it % 30);
        FAIL3(gs_rat_parse(&b, t, NULL) == GS_OK);
        gs_rat_set_si(&c, 10, 1);
        gs_rat_pow_si(&c, &c, -(it % 30));
        gs_rat_set_int(&a, &a.num);
        gs_rat_mul(&c, &c, &a);
        FAIL3(gs_rat_equal(&b, &c));
        free(s);
        free(t);
    }
    gs_rat_clear(&a);
    gs_rat_clear(&b);
    gs_rat_clear(&c);
}

int main(int argc, char **argv)
{
    if (argc > 1)
        seed = strtoull(argv[1], NULL, 10);
    gs_rng_seed(&rng_state, seed);
    test_parse_values();
    test_parse_end();
    test_parse_errors();
    test_arith_values();
    test_special_cases();
    test_get_d();
    test_field_properties();
    test_text_properties();
    return check_report("rat");
}
