/* test_int.c - unit tests of the arbitrary-precision integers. See LICENSE.
 *
 * Known values carry their source in a comment.  The property loops use a
 * seeded generator (the seed may be given as argv[1]); a failure prints
 * the seed, the case number and the operands.
 */
#include <float.h>
#include <inttypes.h>
#include <limits.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "testlib.h"
#include "gainsmith.h"
#include "algebra/int.h"

/* ---- test utilities ----------------------------------------------------- */

static uint64_t seed = 20240601u;
static gs_rng rng_state;

static uint64_t rnd(void)
{
    return gs_rng_next(&rng_state);
}

static void from_str(gs_int *r, const char *s)
{
    int rc = gs_int_set_str(r, s);
    CHECK_MSG(rc == GS_OK, "parsing %s", s);
}

static int is(const gs_int *a, const char *s)
{
    char *t = gs_int_get_str(a);
    int ok = strcmp(t, s) == 0;
    if (!ok)
        fprintf(stderr, "  got %s\n  want %s\n", t, s);
    free(t);
    return ok;
}

static void dump(const char *name, const gs_int *a)
{
    char *t = gs_int_get_str(a);
    fprintf(stderr, "  %s = %s\n", name, t);
    free(t);
}

/* The representation invariants of int.h: the inline form exactly for
   |v| <= INT64_MAX, no leading zero limb otherwise. */
static int canonical(const gs_int *a)
{
    size_t n;
    if (a->size == 0)
        return a->alloc == 0 && a->u.v != INT64_MIN;
    n = (size_t)(a->size < 0 ? -a->size : a->size);
    return a->u.d[n - 1] != 0 && gs_int_bits(a) >= 64
           && (size_t)a->alloc >= n;
}

/* r = sum limbs[i] 2^(32 i), negated if neg, through the public API */
static void from_limbs(gs_int *r, const uint32_t *l, int n, int neg)
{
    gs_int t;
    int i;
    gs_int_init(&t);
    gs_int_set_si(r, 0);
    for (i = n - 1; i >= 0; i--) {
        gs_int_mul_2exp(r, r, 32);
        gs_int_set_ui(&t, l[i]);
        gs_int_add(r, r, &t);
    }
    if (neg)
        gs_int_neg(r, r);
    gs_int_clear(&t);
}

/* A random value of up to maxn limbs, often near a limb boundary: sizes
   0..3 are favoured and limbs are often 0, 1, 2^31 or 2^32 - 1. */
static void random_int(gs_int *r, int maxn)
{
    static const uint32_t special[] = {0, 1, 0x7fffffffu, 0x80000000u,
                                       0xffffffffu, 0xfffffffeu};
    uint32_t l[64];
    int n, i;
    if (rnd() % 4 == 0)
        n = (int)(rnd() % 4);
    else
        n = (int)(rnd() % (uint64_t)(maxn + 1));
    for (i = 0; i < n; i++)
        l[i] = rnd() % 5 == 0 ? special[rnd() % 6] : (uint32_t)rnd();
    from_limbs(r, l, n, (int)(rnd() & 1));
}

/* ---- known values ------------------------------------------------------- */

static void test_small_big_transitions(void)
{
    gs_int a, b, c;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&c);

    /* INT64_MAX + 1 = 2^63 = 9223372036854775808 (two's-complement range,
       C11 7.20.2.1) leaves the inline form, and -1 brings it back */
    gs_int_set_si(&a, INT64_MAX);
    CHECK(gs_int_is_small(&a) && canonical(&a));
    gs_int_add_si(&a, &a, 1);
    CHECK(!gs_int_is_small(&a) && canonical(&a));
    CHECK(is(&a, "9223372036854775808"));
    CHECK(!gs_int_fits_si(&a));
    gs_int_add_si(&a, &a, -1);
    CHECK(gs_int_is_small(&a) && gs_int_get_si(&a) == INT64_MAX);

    /* INT64_MIN = -2^63 fits an int64_t but is stored in limbs */
    gs_int_set_si(&a, INT64_MIN);
    CHECK(!gs_int_is_small(&a) && canonical(&a));
    CHECK(gs_int_fits_si(&a) && gs_int_get_si(&a) == INT64_MIN);
    CHECK(is(&a, "-9223372036854775808"));
    CHECK(gs_int_cmp_si(&a, INT64_MIN) == 0);
    CHECK(gs_int_cmp_si(&a, -INT64_MAX) < 0);
    gs_int_set_si(&b, -INT64_MAX);
    gs_int_add_si(&c, &b, -1);
    CHECK(gs_int_equal(&c, &a) && canonical(&c));
    gs_int_sub(&c, &c, &a);
    CHECK(gs_int_is_small(&c) && gs_int_is_zero(&c));
    gs_int_neg(&c, &a);
    CHECK(is(&c, "9223372036854775808"));
    gs_int_set_si(&b, -1);
    gs_int_mul(&c, &a, &b);                     /* -INT64_MIN */
    CHECK(is(&c, "9223372036854775808"));
    gs_int_mul_si(&c, &b, INT64_MIN);
    CHECK(is(&c, "9223372036854775808"));
    gs_int_add_si(&c, &c, INT64_MIN);
    CHECK(gs_int_is_zero(&c) && canonical(&c));

    /* 2^64 - 1 + 1 = 2^64 = 18446744073709551616 (carry into a third
       limb); 2^32 * 2^32 = 2^64 */
    gs_int_set_ui(&a, UINT64_MAX);
    CHECK(is(&a, "18446744073709551615") && canonical(&a));
    gs_int_add_si(&a, &a, 1);
    CHECK(is(&a, "18446744073709551616") && a.size == 3);
    gs_int_set_si(&b, (int64_t)1 << 32);
    gs_int_mul(&c, &b, &b);
    CHECK(gs_int_equal(&c, &a));
    gs_int_sub(&c, &c, &a);
    CHECK(gs_int_is_zero(&c) && canonical(&c));

    /* (2^32 - 1)^2 = 18446744065119617025 (binomial expansion
       2^64 - 2^33 + 1); (2^64 - 1)^2 = 2^128 - 2^65 + 1 */
    gs_int_set_si(&a, 0xffffffff);
    gs_int_mul(&c, &a, &a);
    CHECK(is(&c, "18446744065119617025"));
    gs_int_set_ui(&a, UINT64_MAX);
    gs_int_mul(&c, &a, &a);
    CHECK(is(&c, "340282366920938463426481119284349108225"));

    /* (2^64)^k = 2^(64k): the product of k factors is a power of two */
    {
        int k;
        gs_int_set_ui(&a, UINT64_MAX);
        gs_int_add_si(&a, &a, 1);
        gs_int_set_si(&c, 1);
        for (k = 1; k <= 12; k++) {
            gs_int_mul(&c, &c, &a);
            gs_int_set_si(&b, 1);
            gs_int_mul_2exp(&b, &b, 64ul * (unsigned long)k);
            CHECK_MSG(gs_int_equal(&b, &c)
                      && gs_int_bits(&c) == 64 * (size_t)k + 1, "k = %d", k);
        }
    }
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&c);
}

/* Borrows and carries across limb boundaries; 2^96 and 2^128 are known
   values (2^96 = 79228162514264337593543950336, 2^128 =
   340282366920938463463374607431768211456). */
static void test_limb_carries(void)
{
    gs_int a, b, c;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&c);
    gs_int_set_si(&a, 1);
    gs_int_mul_2exp(&a, &a, 96);
    CHECK(is(&a, "79228162514264337593543950336"));
    gs_int_add_si(&b, &a, -1);                  /* borrow through 3 limbs */
    CHECK(is(&b, "79228162514264337593543950335") && b.size == 3);
    gs_int_add_si(&b, &b, 1);
    CHECK(gs_int_equal(&a, &b) && b.size == 4);
    gs_int_set_si(&a, 1);
    gs_int_mul_2exp(&a, &a, 128);
    CHECK(is(&a, "340282366920938463463374607431768211456"));
    gs_int_set_si(&b, 1);
    gs_int_mul_2exp(&b, &b, 64);
    gs_int_sub(&b, &a, &b);                     /* 2^128 - 2^64 */
    gs_int_add_si(&c, &a, -1);
    gs_int_sub(&c, &c, &b);                     /* 2^64 - 1: still big */
    CHECK(is(&c, "18446744073709551615") && canonical(&c) && c.size == 2);
    gs_int_add_si(&b, &a, -5);
    gs_int_sub(&c, &a, &b);                     /* shrinks to 5 */
    CHECK(gs_int_is_small(&c) && gs_int_cmp_si(&c, 5) == 0);
    gs_int_sub(&c, &b, &a);
    CHECK(gs_int_is_small(&c) && gs_int_cmp_si(&c, -5) == 0);
    gs_int_mul(&c, &a, &a);                     /* 2^256 */
    CHECK(gs_int_bits(&c) == 257 && c.size == 9);
    CHECK(gs_int_tdiv_qr(&c, NULL, &c, &a) == GS_OK && gs_int_equal(&c, &a));
    /* text at the int64 edge: 19-digit values on either side */
    from_str(&a, "9223372036854775807");
    CHECK(gs_int_is_small(&a) && gs_int_get_si(&a) == INT64_MAX);
    from_str(&a, "9223372036854775808");
    CHECK(!gs_int_is_small(&a) && canonical(&a));
    from_str(&a, "-9223372036854775808");
    CHECK(gs_int_fits_si(&a) && gs_int_get_si(&a) == INT64_MIN);
    from_str(&a, "1000000000000000000");
    CHECK(gs_int_is_small(&a) && gs_int_get_si(&a) == 1000000000000000000);
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&c);
}

static void test_known_values(void)
{
    gs_int a, b;
    unsigned long k;
    char *s;
    size_t len, zeros;
    gs_int_init(&a);
    gs_int_init(&b);

    /* Mersenne prime M127 = 2^127 - 1 (Lucas 1876; known value) */
    gs_int_set_si(&a, 2);
    gs_int_pow_ui(&a, &a, 127);
    gs_int_add_si(&a, &a, -1);
    CHECK(is(&a, "170141183460469231731687303715884105727"));
    gs_int_set_si(&b, 1);
    gs_int_mul_2exp(&b, &b, 127);
    gs_int_add_si(&b, &b, -1);
    CHECK(gs_int_equal(&a, &b) && gs_int_bits(&a) == 127);

    /* 100! has 158 digits and ends in 24 zeros (Legendre: 20 + 4 factors
       of 5); known value, also sympy's factorial(100) */
    gs_int_set_si(&a, 1);
    for (k = 2; k <= 100; k++)
        gs_int_mul_si(&a, &a, (int64_t)k);
    s = gs_int_get_str(&a);
    len = strlen(s);
    for (zeros = 0; zeros < len && s[len - 1 - zeros] == '0'; zeros++)
        ;
    CHECK(len == 158 && zeros == 24);
    CHECK(strcmp(s, "9332621544394415268169923885626670049071596826438162"
                    "1468592963895217599993229915608941463976156518286253"
                    "6979208272237582511852109168640000000000000000000000"
                    "00") == 0);
    from_str(&b, s);
    CHECK(gs_int_equal(&a, &b));
    free(s);
    /* 100!/98! = 9900 */
    gs_int_set_si(&b, 1);
    for (k = 2; k <= 98; k++)
        gs_int_mul_si(&b, &b, (int64_t)k);
    CHECK(gs_int_divexact(&a, &a, &b) == GS_OK && gs_int_cmp_si(&a, 9900) == 0);

    /* 3^40 = 12157665459056928801 (sympy: Integer(3)**40) */
    gs_int_set_si(&a, 3);
    gs_int_pow_ui(&a, &a, 40);
    CHECK(is(&a, "12157665459056928801"));
    gs_int_set_si(&a, -1);
    gs_int_pow_ui(&b, &a, 7);
    CHECK(gs_int_cmp_si(&b, -1) == 0);
    gs_int_set_si(&a, 0);
    gs_int_pow_ui(&b, &a, 0);                   /* 0^0 = 1 by int.h */
    CHECK(gs_int_is_one(&b));
    gs_int_pow_ui(&b, &a, 5);
    CHECK(gs_int_is_zero(&b));
    gs_int_clear(&a);
    gs_int_clear(&b);
}

/* gcd(F_m, F_n) = F_gcd(m,n) (Lucas 1876; Knuth, TAOCP vol. 1, 1.2.8,
   exercise 27); F_300 = 222232244629420445529739893461909967206666939096
   499764990979600 (sympy: fibonacci(300)). */
static void test_fibonacci_gcd(void)
{
    enum { N = 301 };
    gs_int f[N], g;
    int m, n;
    for (n = 0; n < N; n++)
        gs_int_init(&f[n]);
    gs_int_init(&g);
    gs_int_set_si(&f[1], 1);
    for (n = 2; n < N; n++)
        gs_int_add(&f[n], &f[n - 1], &f[n - 2]);
    CHECK(is(&f[300], "222232244629420445529739893461909967206666939096"
                      "499764990979600"));
    for (m = 1; m < N; m += 7) {
        for (n = 1; n < N; n += 11) {
            int a = m, b = n;
            while (b != 0) {
                int t = a % b;
                a = b;
                b = t;
            }
            gs_int_gcd(&g, &f[m], &f[n]);
            CHECK_MSG(gs_int_equal(&g, &f[a]), "m = %d, n = %d", m, n);
        }
    }
    for (n = 0; n < N; n++)
        gs_int_clear(&f[n]);
    gs_int_clear(&g);
}

/* Divisions whose trial quotient qhat needs correcting.  Algorithm D
   (Knuth, TAOCP vol. 2, 4.3.1, from memory) estimates qhat from the top
   two limbs; with 32-bit limbs these operands, built from limbs near
   2^31 and 2^32, make step D3 lower qhat twice, or leave it one too large
   so that step D6 must add back.  Quotients and remainders from sympy
   1.14, divmod(Integer(u), Integer(v)). */
static void test_division_corrections(void)
{
    static const char *const cases[][4] = {
        /* D3 lowers qhat twice */
        {"340282366821903260329767557478840532993",
         "19807040647012828472095539199", "17179869163",
         "396604997604082712556"},
        {"340282366762482138453292676318389862401",
         "19807040647012828464579346431", "17179869160",
         "590295810195496894441"},
        {"340282366802096219719648217160606547967",
         "19807040647012828469948055553", "17179869162",
         "470391973823758991381"},
        /* D6 adds back */
        {"198070406285660843992449810434", "36893488147419103234",
         "5368709119", "36893488145271619588"},
        {"277298568836818669716232994818", "64563604266573365247",
         "4294967295", "64563604262278397953"},
        {"170141183618925556741769234844294840320",
         "79228162514264337586027757567", "2147483649",
         "79228162511958494609026318337"},
    };
    gs_int u, v, q, r, t;
    size_t i;
    gs_int_init(&u);
    gs_int_init(&v);
    gs_int_init(&q);
    gs_int_init(&r);
    gs_int_init(&t);
    for (i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        from_str(&u, cases[i][0]);
        from_str(&v, cases[i][1]);
        CHECK(gs_int_tdiv_qr(&q, &r, &u, &v) == GS_OK);
        CHECK_MSG(is(&q, cases[i][2]) && is(&r, cases[i][3]), "case %zu", i);
        gs_int_neg(&u, &u);                     /* -u = -(q+1) v + (v - r) */
        CHECK(gs_int_fdiv_qr(&q, &r, &u, &v) == GS_OK);
        gs_int_mul(&t, &q, &v);
        gs_int_add(&t, &t, &r);
        CHECK_MSG(gs_int_equal(&t, &u) && gs_int_sgn(&r) >= 0
                  && gs_int_cmpabs(&r, &v) < 0, "case %zu", i);
    }
    gs_int_clear(&u);
    gs_int_clear(&v);
    gs_int_clear(&q);
    gs_int_clear(&r);
    gs_int_clear(&t);
}

/* Signs of truncating and flooring division (C11 6.5.5 for trunc;
   Knuth, TAOCP vol. 1, 1.2.4 for floor and mod). */
static void test_division_signs(void)
{
    static const int64_t c[][6] = {
        /* a, b, tq, tr, fq, fr */
        {7, 2, 3, 1, 3, 1},
        {-7, 2, -3, -1, -4, 1},
        {7, -2, -3, 1, -4, -1},
        {-7, -2, 3, -1, 3, -1},
        {6, 3, 2, 0, 2, 0},
        {-6, 3, -2, 0, -2, 0},
        {0, -5, 0, 0, 0, 0},
        {INT64_MAX, -1, -INT64_MAX, 0, -INT64_MAX, 0},
        {-INT64_MAX, 2, -INT64_MAX / 2, -1, -INT64_MAX / 2 - 1, 1},
    };
    gs_int a, b, q, r;
    size_t i;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&q);
    gs_int_init(&r);
    for (i = 0; i < sizeof c / sizeof c[0]; i++) {
        gs_int_set_si(&a, c[i][0]);
        gs_int_set_si(&b, c[i][1]);
        gs_int_tdiv_qr(&q, &r, &a, &b);
        CHECK_MSG(gs_int_cmp_si(&q, c[i][2]) == 0
                  && gs_int_cmp_si(&r, c[i][3]) == 0, "tdiv case %zu", i);
        gs_int_fdiv_qr(&q, &r, &a, &b);
        CHECK_MSG(gs_int_cmp_si(&q, c[i][4]) == 0
                  && gs_int_cmp_si(&r, c[i][5]) == 0, "fdiv case %zu", i);
    }
    /* mod_ui lands in [0, m) */
    gs_int_set_si(&a, -7);
    CHECK(gs_int_mod_ui(&a, 3) == 2);
    gs_int_set_si(&a, INT64_MIN);
    CHECK(gs_int_mod_ui(&a, 10) == 2);          /* 2^63 = ...808 */
    CHECK(gs_int_mod_ui(&a, (uint64_t)INT64_MAX) == INT64_MAX - 1);
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&q);
    gs_int_clear(&r);
}

static void test_errors(void)
{
    static const char *const bad[] = {"", "-", "+", "--1", "+-1", "12a",
                                      " 1", "1 ", "0x10", "1e3", "1_000"};
    gs_int a, b, q, r;
    size_t i;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&q);
    gs_int_init(&r);
    gs_int_set_si(&a, 42);
    for (i = 0; i < sizeof bad / sizeof bad[0]; i++)
        CHECK_MSG(gs_int_set_str(&a, bad[i]) == GS_ESYNTAX
                  && gs_int_cmp_si(&a, 42) == 0, "\"%s\"", bad[i]);
    from_str(&a, "+000000000000000000000000000000017");
    CHECK(gs_int_cmp_si(&a, 17) == 0 && canonical(&a));
    from_str(&a, "-0");
    CHECK(gs_int_is_zero(&a));

    /* division by zero leaves the outputs alone */
    gs_int_set_si(&a, 5);
    gs_int_set_si(&q, 11);
    gs_int_set_si(&r, 13);
    CHECK(gs_int_tdiv_qr(&q, &r, &a, &b) == GS_EDIVZERO);
    CHECK(gs_int_fdiv_qr(&q, &r, &a, &b) == GS_EDIVZERO);
    CHECK(gs_int_divexact(&q, &a, &b) == GS_EDIVZERO);
    CHECK(gs_int_cmp_si(&q, 11) == 0 && gs_int_cmp_si(&r, 13) == 0);
    gs_int_set_si(&b, 2);
    CHECK(gs_int_divexact(&q, &a, &b) == GS_EINEXACT);
    CHECK(gs_int_cmp_si(&q, 11) == 0);
    from_str(&a, "340282366920938463463374607431768211457");  /* 2^128+1 */
    CHECK(gs_int_divexact(&q, &a, &b) == GS_EINEXACT);
    CHECK(gs_int_cmp_si(&q, 11) == 0);
    CHECK(gs_int_tdiv_qr(&q, NULL, &a, &b) == GS_OK);
    CHECK(is(&q, "170141183460469231731687303715884105728"));
    CHECK(gs_int_tdiv_qr(NULL, &r, &a, &b) == GS_OK && gs_int_is_one(&r));
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&q);
    gs_int_clear(&r);
}

/* Conversions to floating point: IEEE 754-2008, 4.3.1, round to nearest,
   ties to even; overflow gives infinity (7.4). */
static void test_get_d(void)
{
    gs_int a, b;
    long e;
    long double m;
    gs_int_init(&a);
    gs_int_init(&b);

    /* 2^53 + 1 is a tie between 2^53 and 2^53 + 2: even wins */
    gs_int_set_si(&a, ((int64_t)1 << 53) + 1);
    CHECK(gs_int_get_d(&a) == 9007199254740992.0);
    gs_int_set_si(&a, ((int64_t)1 << 53) + 3);
    CHECK(gs_int_get_d(&a) == 9007199254740996.0);
    /* the same ties on a big value: (2^53 + 1) 2^100, (2^53 + 3) 2^100,
       and just above a tie rounds up */
    gs_int_set_si(&a, ((int64_t)1 << 53) + 1);
    gs_int_mul_2exp(&a, &a, 100);
    CHECK(gs_int_get_d(&a) == ldexp(9007199254740992.0, 100));
    gs_int_add_si(&a, &a, 1);
    CHECK(gs_int_get_d(&a) == ldexp(9007199254740994.0, 100));
    gs_int_neg(&a, &a);
    CHECK(gs_int_get_d(&a) == -ldexp(9007199254740994.0, 100));
    gs_int_set_si(&a, ((int64_t)1 << 53) + 3);
    gs_int_mul_2exp(&a, &a, 100);
    CHECK(gs_int_get_d(&a) == ldexp(9007199254740996.0, 100));

    /* DBL_MAX = (2^53 - 1) 2^971; from 2^1024 - 2^970 on, values round to
       infinity */
    gs_int_set_si(&a, 1);
    gs_int_mul_2exp(&a, &a, 1024);
    gs_int_set_si(&b, 1);
    gs_int_mul_2exp(&b, &b, 970);
    gs_int_sub(&a, &a, &b);
    CHECK(gs_int_get_d(&a) == HUGE_VAL);
    gs_int_add_si(&a, &a, -1);
    CHECK(gs_int_get_d(&a) == DBL_MAX);
    gs_int_neg(&a, &a);
    CHECK(gs_int_get_d(&a) == -DBL_MAX);

    /* the 2exp form: 0.5 <= |m| < 1, and it survives far past DBL_MAX */
    gs_int_set_si(&a, 10);
    gs_int_pow_ui(&a, &a, 5000);
    m = gs_int_get_ld_2exp(&e, &a);
    CHECK(m >= 0.5L && m < 1 && (size_t)e == gs_int_bits(&a));
    CHECK(fabsl(log10l(m) + (long double)e * log10l(2) - 5000) < 1e-12L);
    gs_int_set_si(&a, -3);
    m = gs_int_get_ld_2exp(&e, &a);
    CHECK(m == -0.75L && e == 2);
    gs_int_set_si(&a, 0);
    m = gs_int_get_ld_2exp(&e, &a);
    CHECK(m == 0 && e == 0);
    gs_int_set_si(&a, 1);
    gs_int_mul_2exp(&a, &a, 200);
    gs_int_add_si(&a, &a, -1);                  /* rounds up to 2^200 */
    m = gs_int_get_ld_2exp(&e, &a);
    CHECK(m == 0.5L && e == 201);
    gs_int_clear(&a);
    gs_int_clear(&b);
}

/* ---- properties --------------------------------------------------------- */

#define FAIL_AB(cond, a, b)                                                \
    do {                                                                   \
        int ok_ = (cond);                                                  \
        CHECK_MSG(ok_, "(seed %" PRIu64 ", case %d)", seed, it);           \
        if (!ok_) {                                                        \
            dump("a", a);                                                  \
            dump("b", b);                                                  \
        }                                                                  \
    } while (0)

static int check_divisions(const gs_int *a, const gs_int *b, int floor_div)
{
    gs_int q, r, t;
    int ok;
    gs_int_init(&q);
    gs_int_init(&r);
    gs_int_init(&t);
    if (floor_div)
        gs_int_fdiv_qr(&q, &r, a, b);
    else
        gs_int_tdiv_qr(&q, &r, a, b);
    gs_int_mul(&t, &q, b);
    gs_int_add(&t, &t, &r);
    ok = gs_int_equal(&t, a) && gs_int_cmpabs(&r, b) < 0
         && canonical(&q) && canonical(&r);
    if (!gs_int_is_zero(&r))
        ok = ok && gs_int_sgn(&r) == gs_int_sgn(floor_div ? b : a);
    gs_int_clear(&q);
    gs_int_clear(&r);
    gs_int_clear(&t);
    return ok;
}

static void test_ring_properties(void)
{
    gs_int a, b, c, d, e;
    int it;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&c);
    gs_int_init(&d);
    gs_int_init(&e);
    for (it = 0; it < 4000; it++) {
        random_int(&a, it < 2000 ? 4 : 40);
        random_int(&b, it < 2000 ? 4 : 40);
        /* (a + b) - b = a, a - a = 0 */
        gs_int_add(&c, &a, &b);
        gs_int_sub(&d, &c, &b);
        FAIL_AB(gs_int_equal(&d, &a) && canonical(&c) && canonical(&d), &a,
                &b);
        gs_int_sub(&d, &a, &a);
        FAIL_AB(gs_int_is_zero(&d) && canonical(&d), &a, &b);
        /* cmp agrees with the sign of the difference */
        gs_int_sub(&d, &a, &b);
        FAIL_AB(gs_int_cmp(&a, &b) == gs_int_sgn(&d), &a, &b);
        /* (a b) / b = a; a b = b a; addmul and submul */
        gs_int_mul(&c, &a, &b);
        gs_int_mul(&d, &b, &a);
        FAIL_AB(gs_int_equal(&c, &d) && canonical(&c), &a, &b);
        if (!gs_int_is_zero(&b)) {
            FAIL_AB(gs_int_divexact(&d, &c, &b) == GS_OK
                    && gs_int_equal(&d, &a), &a, &b);
            FAIL_AB(check_divisions(&a, &b, 0), &a, &b);
            FAIL_AB(check_divisions(&a, &b, 1), &a, &b);
            FAIL_AB(check_divisions(&c, &b, 1), &a, &b);
        }
        gs_int_set(&d, &a);
        gs_int_addmul(&d, &a, &b);              /* a + a b */
        gs_int_add(&e, &a, &c);
        FAIL_AB(gs_int_equal(&d, &e) && canonical(&d), &a, &b);
        gs_int_submul(&d, &a, &b);
        FAIL_AB(gs_int_equal(&d, &a) && canonical(&d), &a, &b);
        /* mod_ui agrees with flooring division by m, 0 < m < 2^63 */
        {
            uint64_t m = rnd() >> (1 + rnd() % 63);
            gs_int_set_ui(&d, m ? m : 1);
            gs_int_fdiv_qr(NULL, &e, &a, &d);
            FAIL_AB(gs_int_cmp_si(&e, (int64_t)gs_int_mod_ui(&a, m ? m : 1))
                    == 0, &a, &d);
        }
        /* the hash follows equality */
        gs_int_add(&d, &b, &a);
        gs_int_add(&e, &a, &b);
        FAIL_AB(gs_int_hash(&d) == gs_int_hash(&e), &a, &b);
    }
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&c);
    gs_int_clear(&d);
    gs_int_clear(&e);
}

/* gcd(a, b) lcm(a, b) = |a b|; gcd divides both and leaves coprime
   cofactors (Knuth, TAOCP vol. 2, 4.5.2). */
static void test_gcd_properties(void)
{
    gs_int a, b, g, l, t, u;
    int it;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&g);
    gs_int_init(&l);
    gs_int_init(&t);
    gs_int_init(&u);
    for (it = 0; it < 1500; it++) {
        random_int(&a, it < 700 ? 3 : 20);
        random_int(&b, it < 700 ? 3 : 20);
        if (it % 3 == 0) {                      /* a common factor */
            random_int(&t, 6);
            gs_int_mul(&a, &a, &t);
            gs_int_mul(&b, &b, &t);
        }
        gs_int_gcd(&g, &a, &b);
        gs_int_lcm(&l, &a, &b);
        gs_int_mul(&t, &g, &l);
        gs_int_mul(&u, &a, &b);
        gs_int_abs(&u, &u);
        FAIL_AB(gs_int_equal(&t, &u) && gs_int_sgn(&g) >= 0
                && gs_int_sgn(&l) >= 0 && canonical(&g), &a, &b);
        if (gs_int_is_zero(&g))
            continue;
        FAIL_AB(gs_int_divexact(&t, &a, &g) == GS_OK
                && gs_int_divexact(&u, &b, &g) == GS_OK, &a, &b);
        gs_int_gcd(&t, &t, &u);
        FAIL_AB(gs_int_is_one(&t), &a, &b);
    }
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&g);
    gs_int_clear(&l);
    gs_int_clear(&t);
    gs_int_clear(&u);
}

typedef void (*binop)(gs_int *, const gs_int *, const gs_int *);

/* Every output may alias any input (int.h): f(a, a, b), f(b, a, b) and
   f(a, a, a) agree with f on distinct copies. */
static void check_alias(binop f, const char *name, const gs_int *a,
                        const gs_int *b, int it)
{
    gs_int want, x, y, o;
    int ok;
    gs_int_init(&want);
    gs_int_init(&x);
    gs_int_init(&y);
    gs_int_init(&o);
    gs_int_set(&want, a);                       /* f(o = a; o, a, b) */
    gs_int_set(&x, a);
    gs_int_set(&y, b);
    f(&want, &x, &y);
    gs_int_set(&o, a);
    f(&o, &o, b);
    ok = gs_int_equal(&o, &want) && canonical(&o);
    gs_int_set(&want, b);                       /* f(o = b; o, a, b) */
    f(&want, &x, &y);
    gs_int_set(&o, b);
    f(&o, a, &o);
    ok = ok && gs_int_equal(&o, &want) && canonical(&o);
    gs_int_set(&want, a);                       /* f(o = a; o, a, a) */
    f(&want, &x, &x);
    gs_int_set(&o, a);
    f(&o, &o, &o);
    ok = ok && gs_int_equal(&o, &want) && canonical(&o);
    CHECK_MSG(ok, "%s aliasing (seed %" PRIu64 ", case %d)", name, seed, it);
    if (!ok) {
        dump("a", a);
        dump("b", b);
    }
    gs_int_clear(&want);
    gs_int_clear(&x);
    gs_int_clear(&y);
    gs_int_clear(&o);
}

static void alias_neg(gs_int *r, const gs_int *a, const gs_int *b)
{
    (void)b;
    gs_int_neg(r, a);
}

static void alias_abs(gs_int *r, const gs_int *a, const gs_int *b)
{
    (void)b;
    gs_int_abs(r, a);
}

static void alias_tdiv_q(gs_int *r, const gs_int *a, const gs_int *b)
{
    if (gs_int_tdiv_qr(r, NULL, a, b) != GS_OK)
        gs_int_set_si(r, -12345);
}

static void alias_fdiv_r(gs_int *r, const gs_int *a, const gs_int *b)
{
    if (gs_int_fdiv_qr(NULL, r, a, b) != GS_OK)
        gs_int_set_si(r, -12345);
}

static void alias_divexact(gs_int *r, const gs_int *a, const gs_int *b)
{
    int rc = gs_int_divexact(r, a, b);
    if (rc != GS_OK)
        gs_int_set_si(r, -rc);
}

static void alias_mul_si(gs_int *r, const gs_int *a, const gs_int *b)
{
    gs_int_mul_si(r, a, gs_int_fits_si(b) ? gs_int_get_si(b) : 3);
}

static void alias_add_si(gs_int *r, const gs_int *a, const gs_int *b)
{
    gs_int_add_si(r, a, gs_int_fits_si(b) ? gs_int_get_si(b) : -3);
}

static void alias_mul_2exp(gs_int *r, const gs_int *a, const gs_int *b)
{
    gs_int_mul_2exp(r, a, gs_int_bits(b) % 100);
}

static void alias_pow(gs_int *r, const gs_int *a, const gs_int *b)
{
    gs_int_pow_ui(r, a, gs_int_bits(b) % 5);
}

static void alias_set(gs_int *r, const gs_int *a, const gs_int *b)
{
    (void)b;
    gs_int_set(r, a);
}

static void test_aliasing(void)
{
    static const struct {
        binop f;
        const char *name;
    } ops[] = {
        {gs_int_add, "add"},           {gs_int_sub, "sub"},
        {gs_int_mul, "mul"},           {gs_int_addmul, "addmul"},
        {gs_int_submul, "submul"},     {gs_int_gcd, "gcd"},
        {gs_int_lcm, "lcm"},           {alias_neg, "neg"},
        {alias_abs, "abs"},            {alias_tdiv_q, "tdiv q"},
        {alias_fdiv_r, "fdiv r"},      {alias_divexact, "divexact"},
        {alias_mul_si, "mul_si"},      {alias_add_si, "add_si"},
        {alias_mul_2exp, "mul_2exp"},  {alias_pow, "pow_ui"},
        {alias_set, "set"},
    };
    gs_int a, b, q, r, q2, r2;
    int it;
    size_t k;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&q);
    gs_int_init(&r);
    gs_int_init(&q2);
    gs_int_init(&r2);
    for (it = 0; it < 600; it++) {
        random_int(&a, it < 300 ? 3 : 40);
        random_int(&b, it < 300 ? 3 : 40);
        for (k = 0; k < sizeof ops / sizeof ops[0]; k++)
            check_alias(ops[k].f, ops[k].name, &a, &b, it);
        if (gs_int_is_zero(&b))
            continue;
        /* both outputs of a division aliasing the inputs */
        gs_int_fdiv_qr(&q, &r, &a, &b);
        gs_int_set(&q2, &a);
        gs_int_set(&r2, &b);
        gs_int_fdiv_qr(&q2, &r2, &q2, &r2);
        FAIL_AB(gs_int_equal(&q, &q2) && gs_int_equal(&r, &r2), &a, &b);
        gs_int_set(&q2, &a);
        gs_int_set(&r2, &b);
        gs_int_fdiv_qr(&r2, &q2, &q2, &r2);
        FAIL_AB(gs_int_equal(&q, &r2) && gs_int_equal(&r, &q2), &a, &b);
    }
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&q);
    gs_int_clear(&r);
    gs_int_clear(&q2);
    gs_int_clear(&r2);
}

/* Text round trips, and shifts against powers of two. */
static void test_text_and_shifts(void)
{
    gs_int a, b, c;
    int it;
    gs_int_init(&a);
    gs_int_init(&b);
    gs_int_init(&c);
    for (it = 0; it < 2000; it++) {
        char *s;
        unsigned long e = (unsigned long)(rnd() % 200);
        random_int(&a, it < 1000 ? 3 : 40);
        s = gs_int_get_str(&a);
        gs_int_set_si(&b, 7);
        FAIL_AB(gs_int_set_str(&b, s) == GS_OK && gs_int_equal(&a, &b)
                && canonical(&b), &a, &b);
        free(s);
        gs_int_mul_2exp(&b, &a, e);
        gs_int_set_si(&c, 2);
        gs_int_pow_ui(&c, &c, e);
        gs_int_mul(&c, &c, &a);
        FAIL_AB(gs_int_equal(&b, &c) && canonical(&b), &a, &c);
    }
    gs_int_clear(&a);
    gs_int_clear(&b);
    gs_int_clear(&c);
}

/* Some emulators (valgrind among them) compute long double in double
   precision; the long double checks only make sense where 1 + LDBL_EPSILON
   is seen to differ from 1. */
static int long_double_works(void)
{
    volatile long double one = 1, eps = LDBL_EPSILON;
    return one + eps != one;
}

/* Conversions against the C library: glibc's strtod and strtold round
   decimal text correctly (glibc manual, "Parsing of Floats"), so they give
   the exact value rounded to nearest even; and exactly representable
   values m 2^k come back unchanged. */
static void test_float_properties(void)
{
    gs_int a;
    int it, ld_ok = long_double_works();
    gs_int_init(&a);
    if (!ld_ok)
        printf("int: long double arithmetic is not carried out at full "
               "precision here; skipping the long double comparisons\n");
    for (it = 0; it < 2000; it++) {
        char *s;
        int64_t m = (int64_t)(rnd() >> 11);     /* 53 bits */
        int k = (int)(rnd() % 900);
        random_int(&a, it < 1000 ? 3 : 34);
        s = gs_int_get_str(&a);
        CHECK_MSG(gs_int_get_d(&a) == strtod(s, NULL), "%s (seed %" PRIu64
                  ", case %d)", s, seed, it);
        if (ld_ok)
            CHECK_MSG(gs_int_get_ld(&a) == strtold(s, NULL), "%s (seed %"
                      PRIu64 ", case %d)", s, seed, it);
        free(s);
        if (rnd() & 1)
            m = -m;
        gs_int_set_si(&a, m);
        gs_int_mul_2exp(&a, &a, (unsigned long)k);
        CHECK_MSG(gs_int_get_d(&a) == ldexp((double)m, k),
                  "m = %" PRId64 ", k = %d", m, k);
    }
    gs_int_clear(&a);
}

int main(int argc, char **argv)
{
    if (argc > 1)
        seed = strtoull(argv[1], NULL, 10);
    gs_rng_seed(&rng_state, seed);
    test_small_big_transitions();
    test_limb_carries();
    test_known_values();
    test_fibonacci_gcd();
    test_division_corrections();
    test_division_signs();
    test_errors();
    test_get_d();
    test_ring_properties();
    test_gcd_properties();
    test_aliasing();
    test_text_and_shifts();
    test_float_properties();
    return check_report("int");
}
