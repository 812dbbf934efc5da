/* test_poly.c - unit tests of the sparse polynomial module. See LICENSE. */
#include "check.h"
#include "testlib.h"
#include "gainsmith.h"
#include "algebra/poly.h"
#include "algebra/sym.h"

#include <complex.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Two contexts: four symbols (one exponent word) and eleven (three
   words, with a reciprocal symbol), so word boundaries get exercised. */
typedef struct env {
    gs_symtab *st;
    gs_polyctx *c4, *c11;
} env;

static void env_init(env *e)
{
    static const char *const names[] = {
        "x", "y", "z", "t", "u", "v", "w", "s", "gm", "R"
    };
    size_t i;
    e->st = gs_symtab_new();
    for (i = 0; i < sizeof names / sizeof names[0]; i++)
        gs_symtab_intern(e->st, names[i]);
    gs_symtab_recip(e->st, gs_symtab_find(e->st, "R"));     /* id 10 */
    e->c4 = gs_polyctx_new(e->st, 4);
    e->c11 = gs_polyctx_new(e->st, 11);
}

static void env_clear(env *e)
{
    gs_polyctx_free(e->c4);
    gs_polyctx_free(e->c11);
    gs_symtab_free(e->st);
}

/* the shared seeded generator (testlib.h) */
typedef gs_rng rng;

static uint64_t rnext(rng *r)
{
    return gs_rng_next(r);
}

static unsigned rbelow(rng *r, unsigned n)
{
    return (unsigned)(rnext(r) % n);
}

/* a random integer of about `bits` bits, either sign */
static void rand_int(gs_int *c, rng *r, unsigned bits)
{
    gs_int chunk;
    unsigned b = 0;
    gs_int_init(&chunk);
    gs_int_set_si(c, 0);
    while (b < bits) {
        unsigned k = bits - b < 62 ? bits - b : 62;
        gs_int_mul_2exp(c, c, k);
        gs_int_set_si(&chunk, (int64_t)(rnext(r) >> (64 - k)));
        gs_int_add(c, c, &chunk);
        b += k;
    }
    if (gs_int_is_zero(c))
        gs_int_set_si(c, 1);
    if (rnext(r) & 1)
        gs_int_neg(c, c);
    gs_int_clear(&chunk);
}

/* n random terms in the first nv variables, exponents <= maxe */
static void rand_poly(gs_poly *p, rng *r, unsigned n, int nv, unsigned maxe,
                      unsigned bits, const gs_polyctx *ctx)
{
    unsigned e[16], k;
    int v;
    gs_int c;
    gs_int_init(&c);
    gs_poly_zero(p);
    for (k = 0; k < n; k++) {
        memset(e, 0, sizeof e);
        for (v = 0; v < nv; v++)
            if (rnext(r) & 1)
                e[v] = rbelow(r, maxe + 1);
        rand_int(&c, r, 1 + rbelow(r, bits));
        gs_poly_push_term(p, &c, e, ctx);
    }
    gs_poly_canonicalise(p, ctx);
    if (gs_poly_is_zero(p))     /* every term cancelled: rare */
        gs_poly_set_si(p, 1, ctx);
    gs_int_clear(&c);
}

/* canonical form: strictly decreasing monomials, nonzero coefficients,
   fields past nvars and guard bits clear */
static int canonical(const gs_poly *p, const gs_polyctx *ctx)
{
    size_t i, w, nw = (size_t)ctx->nwords;
    for (i = 0; i < p->length; i++) {
        const uint64_t *e = p->exps + i * nw;
        int v;
        if (gs_int_is_zero(&p->coeffs[i]))
            return 0;
        for (w = 0; w < nw; w++)
            if (e[w] & UINT64_C(0x8000800080008000))
                return 0;
        for (v = ctx->nvars; v < ctx->nwords * 4; v++)
            if ((e[v / 4] >> (48 - 16 * (v % 4))) & 0xFFFF)
                return 0;
        if (i > 0) {
            const uint64_t *d = e - nw;
            for (w = 0; w < nw && d[w] == e[w]; w++)
                ;
            if (w == nw || d[w] < e[w])
                return 0;
        }
    }
    return 1;
}

/* A polynomial's storage is sized for its context's exponent words, so
   moving one to another context starts from a fresh value. */
static void renew(gs_poly *p)
{
    gs_poly_clear(p);
    gs_poly_init(p);
}

static void parse(gs_poly *p, const char *s, const gs_polyctx *ctx)
{
    int rc = gs_poly_set_str(p, s, ctx);
    CHECK_MSG(rc == GS_OK, "parsing \"%s\": %d", s, rc);
}

/* a equals the polynomial written s */
static int equal_str(const gs_poly *a, const char *s, const gs_polyctx *ctx)
{
    gs_poly b;
    int eq;
    gs_poly_init(&b);
    parse(&b, s, ctx);
    eq = gs_poly_equal(a, &b, ctx);
    if (!eq) {
        char *t = gs_poly_get_str(a, ctx);
        fprintf(stderr, "  got      %s\n  expected %s\n", t, s);
        free(t);
    }
    gs_poly_clear(&b);
    return eq;
}

static void print_case(const char *what, uint64_t seed, const gs_poly *a,
                       const gs_poly *b, const gs_polyctx *ctx)
{
    char *sa = gs_poly_get_str(a, ctx), *sb = gs_poly_get_str(b, ctx);
    fprintf(stderr, "%s: seed %llu\n  a = %s\n  b = %s\n", what,
            (unsigned long long)seed, sa, sb);
    free(sa);
    free(sb);
}

/* Printing in the canonical order and reading back. */
static void test_text(const env *e)
{
    gs_poly p;
    char *s;
    gs_poly_init(&p);
    parse(&p, "1 - 2*z + 3*y*x^2", e->c4);
    s = gs_poly_get_str(&p, e->c4);
    CHECK_MSG(strcmp(s, "3*x^2*y - 2*z + 1") == 0, "%s", s);
    free(s);
    parse(&p, "-x", e->c4);
    s = gs_poly_get_str(&p, e->c4);
    CHECK_MSG(strcmp(s, "-x") == 0, "%s", s);
    free(s);
    parse(&p, "x - x", e->c4);
    s = gs_poly_get_str(&p, e->c4);
    CHECK_MSG(strcmp(s, "0") == 0, "%s", s);
    free(s);
    /* a lone 0 and a sum that starts with one, into a fresh polynomial
       (no storage yet) */
    renew(&p);
    parse(&p, "0", e->c4);
    CHECK(gs_poly_is_zero(&p));
    renew(&p);
    parse(&p, "0 + x - 0", e->c4);
    s = gs_poly_get_str(&p, e->c4);
    CHECK_MSG(strcmp(s, "x") == 0, "%s", s);
    free(s);
    renew(&p);
    parse(&p, "gm*(1/R)^2 - (1/R)*s**3 - 12345678901234567890123", e->c11);
    s = gs_poly_get_str(&p, e->c11);
    CHECK_MSG(strcmp(s, "-s^3*(1/R) + gm*(1/R)^2 - 12345678901234567890123")
              == 0, "%s", s);
    free(s);
    renew(&p);
    parse(&p, "-(x + -y)^2 * (2)", e->c4);
    CHECK(equal_str(&p, "-2*x^2 + 4*x*y - 2*y^2", e->c4));
    CHECK(gs_poly_set_str(&p, "x +", e->c4) == GS_ESYNTAX);
    CHECK(gs_poly_set_str(&p, "3x", e->c4) == GS_ESYNTAX);
    CHECK(gs_poly_set_str(&p, "(x", e->c4) == GS_ESYNTAX);
    CHECK(gs_poly_set_str(&p, "x/y", e->c4) == GS_ESYNTAX);
    CHECK(gs_poly_set_str(&p, "", e->c4) == GS_ESYNTAX);
    CHECK(gs_poly_set_str(&p, "q + 1", e->c4) == GS_EINVAL);
    CHECK(gs_poly_set_str(&p, "u", e->c4) == GS_EINVAL);  /* not in c4 */
    CHECK(gs_poly_set_str(&p, "x^40000", e->c4) == GS_ERANGE);
    CHECK(gs_poly_set_str(&p, "x^20000*x^20000", e->c4) == GS_ERANGE);
    CHECK(gs_poly_set_str(&p, "(x^200)^200", e->c4) == GS_ERANGE);
    CHECK(equal_str(&p, "-2*x^2 + 4*x*y - 2*y^2", e->c4));  /* unchanged */
    gs_poly_clear(&p);
}

/* Binomial theorem; the expected C(n, k) come from Pascal's rule
   C(n, k) = C(n-1, k-1) + C(n-1, k), computed by additions only. */
static void test_binomial(const env *e)
{
    enum { N = 40 };
    gs_int pascal[N + 1], c;
    gs_poly xy, p, q;
    unsigned n, k;
    gs_poly_init(&xy);
    gs_poly_init(&p);
    gs_poly_init(&q);
    gs_int_init(&c);
    for (k = 0; k <= N; k++)
        gs_int_init(&pascal[k]);
    gs_int_set_si(&pascal[0], 1);
    parse(&xy, "x + y", e->c4);
    gs_poly_set_si(&q, 1, e->c4);
    for (n = 0; n <= N; n++) {
        if (n > 0)
            for (k = n; k > 0; k--)
                gs_int_add(&pascal[k], &pascal[k], &pascal[k - 1]);
        gs_poly_pow_ui(&p, &xy, n, e->c4);
        CHECK(p.length == n + 1 && canonical(&p, e->c4));
        for (k = 0; k <= n && k < p.length; k++) {
            CHECK_MSG(gs_poly_term_exp(&p, k, 0, e->c4) == n - k
                      && gs_poly_term_exp(&p, k, 1, e->c4) == k
                      && gs_int_equal(&p.coeffs[k], &pascal[k]),
                      "n=%u k=%u", n, k);
        }
        CHECK_MSG(gs_poly_equal(&p, &q, e->c4), "(x+y)^%u by pow", n);
        gs_poly_mul(&q, &q, &xy, e->c4);
    }
    /* (2^70 x - 3)^5 by the binomial path against repeated products */
    parse(&xy, "1180591620717411303424*x - 3", e->c4);
    gs_poly_pow_ui(&p, &xy, 5, e->c4);
    gs_poly_mul(&q, &xy, &xy, e->c4);
    gs_poly_mul(&q, &q, &q, e->c4);
    gs_poly_mul(&q, &q, &xy, e->c4);
    CHECK(gs_poly_equal(&p, &q, e->c4));
    for (k = 0; k <= N; k++)
        gs_int_clear(&pascal[k]);
    gs_int_clear(&c);
    gs_poly_clear(&xy);
    gs_poly_clear(&p);
    gs_poly_clear(&q);
}

static void test_small_identities(const env *e)
{
    gs_poly a, b, p, q;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&p);
    gs_poly_init(&q);
    /* difference of squares */
    parse(&a, "1 + x", e->c4);
    parse(&b, "1 - x", e->c4);
    gs_poly_mul(&p, &a, &b, e->c4);
    CHECK(equal_str(&p, "1 - x^2", e->c4));
    CHECK(gs_poly_divexact(&q, &p, &a, e->c4) == GS_OK);
    CHECK(gs_poly_equal(&q, &b, e->c4));
    /* x^3 - 1 = (x - 1)(x^2 + x + 1), cyclotomic factors */
    parse(&a, "x^3 - 1", e->c4);
    parse(&b, "x - 1", e->c4);
    CHECK(gs_poly_divexact(&q, &a, &b, e->c4) == GS_OK);
    CHECK(equal_str(&q, "x^2 + x + 1", e->c4));
    /* x^2 - y^2 = (x - y)(x + y), in the 11-variable context */
    {
        gs_poly a1, b1, q1;
        gs_poly_init(&a1);
        gs_poly_init(&b1);
        gs_poly_init(&q1);
        parse(&a1, "u^2 - (1/R)^2", e->c11);
        parse(&b1, "u - (1/R)", e->c11);
        CHECK(gs_poly_divexact(&q1, &a1, &b1, e->c11) == GS_OK);
        CHECK(equal_str(&q1, "u + (1/R)", e->c11));
        gs_poly_clear(&a1);
        gs_poly_clear(&b1);
        gs_poly_clear(&q1);
    }
    /* remainders: x^2 + 1 = (x + 1)(x - 1) + 2; 2x / 4 */
    parse(&a, "x^2 + 1", e->c4);
    parse(&b, "x + 1", e->c4);
    parse(&q, "7", e->c4);
    CHECK(gs_poly_divexact(&q, &a, &b, e->c4) == GS_EINEXACT);
    CHECK(gs_poly_is_zero(&q));
    parse(&a, "2*x*y", e->c4);
    parse(&b, "4*y", e->c4);
    CHECK(gs_poly_divexact(&q, &a, &b, e->c4) == GS_EINEXACT);
    parse(&b, "x*z", e->c4);
    CHECK(gs_poly_divexact(&q, &a, &b, e->c4) == GS_EINEXACT);
    gs_poly_zero(&b);
    CHECK(gs_poly_divexact(&q, &a, &b, e->c4) == GS_EDIVZERO);
    CHECK(gs_poly_divexact(&q, &b, &a, e->c4) == GS_OK && q.length == 0);
    /* a dividend whose partial remainders reach below its own lowest
       term within a dense block; sympy's div gives the remainder
       -2z - 6, so the division is inexact whichever method */
    {
        int m;
        parse(&a, "x^3*y*z - x^2*y*z^2 - 3*x^2*y*z + x*y^2*z - x*y*z^2 - 2*x"
              " - y^2*z^2 - 3*y^2*z + y*z^3 + 3*y*z^2", e->c4);
        parse(&b, "x - z - 3", e->c4);
        for (m = 0; m <= 2; m++)
            CHECK(gs_poly_divexact_method(&q, &a, &b, m, e->c4)
                  == GS_EINEXACT);
        parse(&p, "2*z + 6", e->c4);        /* a + 2z + 6 is exact */
        gs_poly_add(&a, &a, &p, e->c4);
        for (m = 0; m <= 2; m++)
            CHECK(gs_poly_divexact_method(&q, &a, &b, m, e->c4) == GS_OK
                  && equal_str(&q, "x^2*y*z + y^2*z - y*z^2 - 2", e->c4));
    }
    /* y / (x + y) in lex order with x > y: the first remainder term */
    parse(&a, "y", e->c4);
    parse(&b, "x + y", e->c4);
    CHECK(gs_poly_divexact(&q, &a, &b, e->c4) == GS_EINEXACT);
    /* scalar exact division */
    {
        gs_int c;
        gs_int_init(&c);
        parse(&a, "6*x - 4*y + 2", e->c4);
        gs_int_set_si(&c, -2);
        CHECK(gs_poly_divexact_int(&q, &a, &c, e->c4) == GS_OK);
        CHECK(equal_str(&q, "-3*x + 2*y - 1", e->c4));
        gs_int_set_si(&c, 4);
        CHECK(gs_poly_divexact_int(&q, &a, &c, e->c4) == GS_EINEXACT);
        CHECK(gs_poly_is_zero(&q));
        gs_int_set_si(&c, 0);
        CHECK(gs_poly_divexact_int(&q, &a, &c, e->c4) == GS_EDIVZERO);
        /* in place: by -2, by 1, by -1, and by 4, which leaves a
           remainder and zeroes the polynomial */
        gs_int_set_si(&c, -2);
        CHECK(gs_poly_divexact_int(&a, &a, &c, e->c4) == GS_OK
              && equal_str(&a, "-3*x + 2*y - 1", e->c4));
        gs_int_set_si(&c, 1);
        CHECK(gs_poly_divexact_int(&a, &a, &c, e->c4) == GS_OK
              && equal_str(&a, "-3*x + 2*y - 1", e->c4));
        gs_int_set_si(&c, -1);
        CHECK(gs_poly_divexact_int(&a, &a, &c, e->c4) == GS_OK
              && equal_str(&a, "3*x - 2*y + 1", e->c4));
        gs_int_set_si(&c, 4);
        CHECK(gs_poly_divexact_int(&a, &a, &c, e->c4) == GS_EINEXACT
              && gs_poly_is_zero(&a));
        gs_int_clear(&c);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&p);
    gs_poly_clear(&q);
}

/* Content is the gcd of the coefficients with the leading sign. */
static void test_content(const env *e)
{
    gs_poly a, r;
    gs_int c;
    uint64_t mono[3];
    gs_poly_init(&a);
    gs_poly_init(&r);
    gs_int_init(&c);
    parse(&a, "-6*x + 4*y^2 - 10", e->c4);
    gs_poly_content(&c, &a);
    CHECK(gs_int_cmp_si(&c, -2) == 0);
    gs_poly_primitive(&r, &a, e->c4);
    CHECK(equal_str(&r, "3*x - 2*y^2 + 5", e->c4));
    gs_poly_primitive(&a, &a, e->c4);
    CHECK(equal_str(&a, "3*x - 2*y^2 + 5", e->c4));
    gs_poly_zero(&a);
    gs_poly_content(&c, &a);
    CHECK(gs_int_is_zero(&c));
    renew(&a);
    renew(&r);
    parse(&a, "x^2*y*z*gm + x*y^3*w*gm^2", e->c11);
    gs_poly_monomial_content(mono, &a, e->c11);
    CHECK(gs_poly_div_monomial(&r, &a, mono, e->c11) == GS_OK);
    CHECK(equal_str(&r, "x*z + y^2*w*gm", e->c11));
    gs_poly_mul_monomial(&r, &r, mono, e->c11);
    CHECK(gs_poly_equal(&r, &a, e->c11));
    parse(&r, "x*y*gm^2", e->c11);
    CHECK(gs_poly_div_monomial(&r, &a, r.exps, e->c11) == GS_EINEXACT);
    CHECK(gs_poly_is_zero(&r));
    gs_int_clear(&c);
    gs_poly_clear(&a);
    gs_poly_clear(&r);
}

static void test_degrees(const env *e)
{
    gs_poly a, r;
    unsigned char used[11];
    unsigned degs[11];
    gs_poly_init(&a);
    gs_poly_init(&r);
    parse(&a, "x^2*y + 3*x^2 + x*z^4 + 5*s^7*(1/R)", e->c11);
    CHECK(gs_poly_degree(&a, 0, e->c11) == 2);
    CHECK(gs_poly_degree(&a, 2, e->c11) == 4);
    CHECK(gs_poly_degree(&a, 7, e->c11) == 7);
    CHECK(gs_poly_lowdegree(&a, 0, e->c11) == 0);
    CHECK(gs_poly_degree(&a, 3, e->c11) == 0);
    CHECK(gs_poly_total_degree(&a, e->c11) == 8);
    gs_poly_degrees(degs, &a, e->c11);
    CHECK(degs[0] == 2 && degs[1] == 1 && degs[2] == 4 && degs[7] == 7
          && degs[10] == 1 && degs[9] == 0);
    gs_poly_used_vars(used, &a, e->c11);
    CHECK(used[0] && used[1] && used[2] && !used[3] && used[7] && used[10]
          && !used[9]);
    gs_poly_coeff_var(&r, &a, 0, 2, e->c11);   /* collect in x */
    CHECK(equal_str(&r, "y + 3", e->c11));
    gs_poly_coeff_var(&r, &a, 0, 0, e->c11);
    CHECK(equal_str(&r, "5*s^7*(1/R)", e->c11));
    gs_poly_coeff_var(&a, &a, 2, 4, e->c11);   /* aliased */
    CHECK(equal_str(&a, "x", e->c11));
    gs_poly_zero(&a);
    CHECK(gs_poly_degree(&a, 0, e->c11) == -1);
    CHECK(gs_poly_lowdegree(&a, 0, e->c11) == -1);
    CHECK(gs_poly_total_degree(&a, e->c11) == -1);
    CHECK(gs_poly_sgn(&a) == 0);
    renew(&a);
    parse(&a, "-x + 1", e->c4);
    CHECK(gs_poly_sgn(&a) < 0);
    CHECK(!gs_poly_is_const(&a, e->c4));
    parse(&a, "1", e->c4);
    CHECK(gs_poly_is_one(&a, e->c4) && gs_poly_is_const(&a, e->c4));
    gs_poly_clear(&a);
    gs_poly_clear(&r);
}

/* d/dx x^n = n x^(n-1), d/dx c = 0; the rest comes in the random loop. */
static void test_derivative(const env *e)
{
    gs_poly a, r;
    gs_poly_init(&a);
    gs_poly_init(&r);
    parse(&a, "x^5*y + 7*x*z - 3*y^2 + 11", e->c4);
    gs_poly_derivative(&r, &a, 0, e->c4);
    CHECK(equal_str(&r, "5*x^4*y + 7*z", e->c4));
    gs_poly_derivative(&a, &a, 1, e->c4);
    CHECK(equal_str(&a, "x^5 - 6*y", e->c4));
    gs_poly_derivative(&r, &r, 3, e->c4);
    CHECK(gs_poly_is_zero(&r));
    gs_poly_clear(&a);
    gs_poly_clear(&r);
}

static void test_subst(const env *e)
{
    gs_poly a, b, r;
    gs_rat v;
    gs_int scale;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&r);
    gs_rat_init(&v);
    gs_int_init(&scale);
    /* (x + 1)^2 at x = y - 1 is y^2 */
    parse(&a, "x^2 + 2*x + 1", e->c4);
    parse(&b, "y - 1", e->c4);
    gs_poly_subst(&r, &a, 0, &b, e->c4);
    CHECK(equal_str(&r, "y^2", e->c4));
    gs_poly_subst(&a, &a, 0, &b, e->c4);
    CHECK(equal_str(&a, "y^2", e->c4));
    /* x^2 y + x + 1 at x = 1/2: (y + 2 + 4) / 4 */
    parse(&a, "x^2*y + x + 1", e->c4);
    gs_rat_set_si(&v, 1, 2);
    gs_poly_subst_rat(&r, &scale, &a, 0, &v, e->c4);
    CHECK(gs_int_cmp_si(&scale, 4) == 0);
    CHECK(equal_str(&r, "y + 6", e->c4));
    /* at x = -3: 9y - 2 with scale 1 */
    gs_rat_set_si(&v, -3, 1);
    gs_poly_subst_rat(&a, &scale, &a, 0, &v, e->c4);
    CHECK(gs_int_is_one(&scale));
    CHECK(equal_str(&a, "9*y - 2", e->c4));
    gs_rat_set_si(&v, 5, 7);
    gs_poly_subst_rat(&a, &scale, &a, 0, &v, e->c4);   /* free of x */
    CHECK(gs_int_is_one(&scale) && equal_str(&a, "9*y - 2", e->c4));
    gs_poly_zero(&a);
    gs_poly_subst_rat(&r, &scale, &a, 0, &v, e->c4);
    CHECK(gs_int_is_one(&scale) && gs_poly_is_zero(&r));
    gs_int_clear(&scale);
    gs_rat_clear(&v);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&r);
}

/* lim (3s^2 y + s)/(2s^2 + 1) = 3y/2 at infinity and 0 at zero;
   s^2/s is unbounded at infinity. */
static void test_limit(const env *e)
{
    gs_poly n, d, rn, rd;
    int s = 7;
    gs_poly_init(&n);
    gs_poly_init(&d);
    gs_poly_init(&rn);
    gs_poly_init(&rd);
    parse(&n, "3*s^2*y + s", e->c11);
    parse(&d, "2*s^2 + 1", e->c11);
    CHECK(gs_poly_limit_ratio(&rn, &rd, &n, &d, s, 1, e->c11) == GS_OK);
    CHECK(equal_str(&rn, "3*y", e->c11) && equal_str(&rd, "2", e->c11));
    CHECK(gs_poly_limit_ratio(&rn, &rd, &n, &d, s, 0, e->c11) == GS_OK);
    CHECK(gs_poly_is_zero(&rn) && gs_poly_is_one(&rd, e->c11));
    CHECK(gs_poly_limit_ratio(&rn, &rd, &d, &n, s, 0, e->c11) == GS_ERANGE);
    parse(&n, "s^2", e->c11);
    parse(&d, "s*(1/R) + gm", e->c11);
    CHECK(gs_poly_limit_ratio(&rn, &rd, &n, &d, s, 1, e->c11) == GS_ERANGE);
    CHECK(gs_poly_limit_ratio(&rn, &rd, &d, &n, s, 1, e->c11) == GS_OK);
    CHECK(gs_poly_is_zero(&rn));
    /* R -> infinity is (1/R) -> 0: (gm + s (1/R)) / (1/R + 2) -> gm / 2 */
    parse(&n, "gm + s*(1/R)", e->c11);
    parse(&d, "(1/R) + 2", e->c11);
    CHECK(gs_poly_limit_ratio(&rn, &rd, &n, &d, 10, 0, e->c11) == GS_OK);
    CHECK(equal_str(&rn, "gm", e->c11) && equal_str(&rd, "2", e->c11));
    gs_poly_zero(&d);
    CHECK(gs_poly_limit_ratio(&rn, &rd, &n, &d, s, 1, e->c11)
          == GS_EDIVZERO);
    gs_poly_clear(&n);
    gs_poly_clear(&d);
    gs_poly_clear(&rn);
    gs_poly_clear(&rd);
}

static void test_eval(const env *e)
{
    gs_poly a;
    double vd[4] = { 1.5, 2.5, 0, 0 };
    long double vl[4] = { 0.5L, -2, 3, 1 };
    double complex vc[4] = { I, 0, 0, 0 };
    long double complex vlc[4] = { 1 + I, 0, 0, 0 };
    gs_poly_init(&a);
    parse(&a, "(x + y)^2", e->c4);        /* 4^2 */
    CHECK(gs_poly_eval_d(&a, vd, e->c4) == 16.0);
    parse(&a, "8*x^3*y*z^2 - t + 2", e->c4);   /* 8/8 (-2) 9 - 1 + 2 */
    CHECK(gs_poly_eval_ld(&a, vl, e->c4) == -17.0L);
    parse(&a, "x^2 + 1", e->c4);           /* i^2 + 1 */
    CHECK(gs_poly_eval_c(&a, vc, e->c4) == 0);
    parse(&a, "x^4 + 4", e->c4);           /* (1+i)^4 = -4 */
    CHECK(gs_poly_eval_lc(&a, vlc, e->c4) == 0);
    gs_poly_zero(&a);
    CHECK(gs_poly_eval_d(&a, vd, e->c4) == 0.0);
    gs_poly_clear(&a);
}

/* push_term in any order with repeats and zeros, then canonicalise */
static void test_build(const env *e)
{
    gs_poly a, b;
    gs_int c;
    unsigned e1[4] = { 1, 0, 0, 0 }, e2[4] = { 0, 2, 0, 1 }, e0[4] = { 0 };
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_int_init(&c);
    gs_int_set_si(&c, 3);
    gs_poly_push_term(&a, &c, e2, e->c4);
    gs_poly_push_term(&a, &c, e1, e->c4);
    gs_int_set_si(&c, -3);
    gs_poly_push_term(&a, &c, e2, e->c4);
    gs_int_set_si(&c, 0);
    gs_poly_push_term(&a, &c, e0, e->c4);
    gs_int_set_si(&c, 5);
    gs_poly_push_term(&a, &c, e0, e->c4);
    gs_poly_push_term(&a, &c, e1, e->c4);
    gs_poly_canonicalise(&a, e->c4);
    CHECK(canonical(&a, e->c4) && equal_str(&a, "8*x + 5", e->c4));
    gs_poly_set_term(&b, &c, e2, e->c4);
    CHECK(equal_str(&b, "5*y^2*t", e->c4));
    gs_poly_set_var(&b, 3, 4, e->c4);
    CHECK(equal_str(&b, "t^4", e->c4));
    gs_poly_set_int(&b, &c, e->c4);
    CHECK(equal_str(&b, "5", e->c4));
    gs_poly_set_int(&b, &b.coeffs[0], e->c4);      /* aliased */
    CHECK(equal_str(&b, "5", e->c4));
    gs_poly_swap(&a, &b);
    CHECK(equal_str(&a, "5", e->c4) && equal_str(&b, "8*x + 5", e->c4));
    gs_poly_mul_int(&b, &b, &b.coeffs[0], e->c4);   /* aliased scalar */
    CHECK(equal_str(&b, "64*x + 40", e->c4));
    gs_poly_mul_si(&b, &b, -1, e->c4);
    CHECK(equal_str(&b, "-64*x - 40", e->c4));
    gs_int_clear(&c);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
}

/* Stars and bars: (1+x+y+z+t)^k has C(k+4, 4) terms; multinomial
   theorem for the coefficients.  f (f + 1) for f = (1+x+y+z+t)^6 has
   every monomial of degree <= 12, C(16, 4) = 1820 of them. */
static void test_fateman_small(const env *e)
{
    gs_poly f, g, p, q;
    unsigned k;
    unsigned long want = 1;
    gs_poly_init(&f);
    gs_poly_init(&g);
    gs_poly_init(&p);
    gs_poly_init(&q);
    parse(&g, "1 + x + y + z + t", e->c4);
    gs_poly_set_si(&f, 1, e->c4);
    for (k = 1; k <= 12; k++) {
        gs_poly_mul(&f, &f, &g, e->c4);
        want = want * (k + 4) / k;          /* C(k+4, 4) */
        CHECK_MSG(f.length == want, "k=%u: %zu terms", k, f.length);
    }
    gs_poly_pow_ui(&f, &g, 6, e->c4);
    CHECK(f.length == 210);
    /* the coefficient of x y^2 z^3 is 6!/(1! 2! 3! 0!) = 60 */
    gs_poly_coeff_var(&p, &f, 0, 1, e->c4);
    gs_poly_coeff_var(&p, &p, 1, 2, e->c4);
    gs_poly_coeff_var(&p, &p, 2, 3, e->c4);
    CHECK(equal_str(&p, "60", e->c4));
    gs_poly_set_si(&g, 1, e->c4);
    gs_poly_add(&g, &g, &f, e->c4);
    gs_poly_mul_method(&p, &f, &g, GS_POLY_MUL_HEAP, e->c4);
    CHECK(p.length == 1820 && canonical(&p, e->c4));
    gs_poly_mul_method(&q, &f, &g, GS_POLY_MUL_DENSE, e->c4);
    CHECK(gs_poly_equal(&p, &q, e->c4));
    gs_poly_mul_method(&q, &f, &g, GS_POLY_MUL_DENSE | GS_POLY_MUL_BIGACC,
                       e->c4);
    CHECK(gs_poly_equal(&p, &q, e->c4));
    gs_poly_mul(&q, &f, &g, e->c4);
    CHECK(gs_poly_equal(&p, &q, e->c4));
    CHECK(gs_poly_divexact(&q, &p, &f, e->c4) == GS_OK);
    CHECK(gs_poly_equal(&q, &g, e->c4));
    CHECK(gs_poly_divexact(&q, &p, &g, e->c4) == GS_OK);
    CHECK(gs_poly_equal(&q, &f, e->c4));
    gs_poly_clear(&f);
    gs_poly_clear(&g);
    gs_poly_clear(&p);
    gs_poly_clear(&q);
}

/* Coefficients past 64 bits and near the 128-bit accumulator bound:
   every method agrees with the multi-precision one, and (2^64 x + 1)^2
   is 2^128 x^2 + 2^65 x + 1. */
static void test_big_coeffs(const env *e)
{
    gs_poly a, b, p, q;
    rng r = { 99 };
    unsigned bits[4] = { 20, 61, 63, 200 }, k;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&p);
    gs_poly_init(&q);
    parse(&a, "18446744073709551616*x + 1", e->c4);
    gs_poly_mul(&p, &a, &a, e->c4);
    CHECK(equal_str(&p, "340282366920938463463374607431768211456*x^2"
                    " + 36893488147419103232*x + 1", e->c4));
    /* q = c (x + y), b = c (x + y + z), c = 2^62 - 1: a = q b fits the
       128-bit accumulator but q's coefficients times b's overflow the
       bound with three terms of b, so the division starts over with
       multi-precision coefficients */
    parse(&a, "4611686018427387903*x + 4611686018427387903*y", e->c4);
    parse(&b, "4611686018427387903*(x + y + z)", e->c4);
    gs_poly_mul(&p, &a, &b, e->c4);
    for (k = 0; k < 3; k++)
        CHECK(gs_poly_divexact_method(&q, &p, &b, (int)k, e->c4) == GS_OK
              && gs_poly_equal(&q, &a, e->c4));
    for (k = 0; k < 4; k++) {
        int m;
        rand_poly(&a, &r, 300, 4, 5, bits[k], e->c4);
        rand_poly(&b, &r, 300, 4, 5, bits[k], e->c4);
        gs_poly_mul_method(&p, &a, &b, GS_POLY_MUL_HEAP | GS_POLY_MUL_BIGACC,
                           e->c4);
        for (m = 0; m < 3; m++) {
            gs_poly_mul_method(&q, &a, &b, m, e->c4);
            CHECK_MSG(gs_poly_equal(&p, &q, e->c4), "bits %u method %d",
                      bits[k], m);
            gs_poly_mul_method(&q, &a, &b, m | GS_POLY_MUL_MIDACC, e->c4);
            CHECK_MSG(gs_poly_equal(&p, &q, e->c4), "bits %u method %d mid",
                      bits[k], m);
        }
        for (m = 0; m < 3; m++)
            CHECK_MSG(gs_poly_divexact_method(&q, &p, &b, m, e->c4) == GS_OK
                      && gs_poly_equal(&q, &a, e->c4), "bits %u method %d",
                      bits[k], m);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&p);
    gs_poly_clear(&q);
}

/* r = c * sum_{i<n} s^i x^i, s = -1 when alt, else 1 */
static void geometric(gs_poly *r, const gs_int *c, unsigned n, int alt,
                      const gs_polyctx *ctx)
{
    unsigned e[4] = { 0, 0, 0, 0 };
    gs_int m;
    gs_int_init(&m);
    gs_poly_zero(r);
    for (e[0] = 0; e[0] < n; e[0]++) {
        if (alt && (e[0] & 1))
            gs_int_neg(&m, c);
        else
            gs_int_set(&m, c);
        gs_poly_push_term(r, &m, e, ctx);
    }
    gs_poly_canonicalise(r, ctx);
    gs_int_clear(&m);
}

/* Sums past 128 bits in the three-word accumulator (poly_mul.c).  For
   a = c sum_{i<n} sa^i x^i and b = d sum_{j<n} sb^j x^j (sa, sb = +-1)
   the coefficient of x^k in a b is c d times the sum of sa^i sb^j over
   the pairs i + j = k with 0 <= i, j < n, j from max(0, k-n+1) to
   min(k, n-1) (the Cauchy product of two finite geometric sums); with
   sa = sb = 1 that is c d min(k + 1, 2n - 1 - k), the number of pairs.
   The expected product is built from that count, term by term, and every
   method must agree with it and with multi-precision accumulation. */
static void check_geometric(const gs_int *c, const gs_int *d, unsigned n,
                            int alta, int altb, const gs_polyctx *ctx)
{
    static const int methods[] = {
        GS_POLY_MUL_AUTO, GS_POLY_MUL_HEAP, GS_POLY_MUL_DENSE,
        GS_POLY_MUL_DENSE | GS_POLY_MUL_MIDACC,
        GS_POLY_MUL_DENSE | GS_POLY_MUL_BIGACC
    };
    gs_poly a, b, p, want;
    gs_int cd, w;
    unsigned e[4] = { 0, 0, 0, 0 }, k, m;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&p);
    gs_poly_init(&want);
    gs_int_init(&cd);
    gs_int_init(&w);
    geometric(&a, c, n, alta, ctx);
    geometric(&b, d, n, altb, ctx);
    gs_int_mul(&cd, c, d);
    for (k = 0; k <= 2 * n - 2; k++) {
        int64_t sum = 0;
        unsigned j = k >= n ? k - n + 1 : 0;
        for (; j <= k && j < n; j++) {
            int sa = alta && ((k - j) & 1) ? -1 : 1;
            int sb = altb && (j & 1) ? -1 : 1;
            sum += sa * sb;
        }
        gs_int_mul_si(&w, &cd, sum);
        e[0] = k;
        gs_poly_push_term(&want, &w, e, ctx);
    }
    gs_poly_canonicalise(&want, ctx);
    for (m = 0; m < sizeof methods / sizeof methods[0]; m++) {
        gs_poly_mul_method(&p, &a, &b, methods[m], ctx);
        CHECK_MSG(canonical(&p, ctx) && gs_poly_equal(&p, &want, ctx),
                  "n %u alt %d%d method %d", n, alta, altb, methods[m]);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&p);
    gs_poly_clear(&want);
    gs_int_clear(&cd);
    gs_int_clear(&w);
}

static void test_mid_acc(const env *e)
{
    gs_poly a, b, p;
    gs_int c, d, w;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&p);
    gs_int_init(&c);
    gs_int_init(&d);
    gs_int_init(&w);
    /* c = 2^62: the coefficient of x^(n-1) is n 2^124, exactly 2^127
       (the edge of a signed 128-bit word) for n = 8 and 2^128 (low word
       0, high word 1) for n = 16; with d = -c, -2^127 and -2^128 */
    gs_int_set_si(&c, (int64_t)1 << 62);
    gs_int_neg(&d, &c);
    geometric(&a, &c, 16, 0, e->c4);
    gs_poly_mul(&p, &a, &a, e->c4);
    gs_poly_coeff_var(&b, &p, 0, 15, e->c4);
    gs_int_set_si(&w, 1);
    gs_int_mul_2exp(&w, &w, 128);                   /* 2^128 */
    CHECK(b.length == 1 && gs_int_equal(&b.coeffs[0], &w));
    geometric(&b, &d, 16, 0, e->c4);
    gs_poly_mul(&p, &a, &b, e->c4);
    gs_poly_coeff_var(&b, &p, 0, 15, e->c4);
    gs_int_neg(&w, &w);                             /* -2^128 */
    CHECK(b.length == 1 && gs_int_equal(&b.coeffs[0], &w));
    check_geometric(&c, &c, 8, 0, 0, e->c4);
    check_geometric(&c, &d, 8, 0, 0, e->c4);
    check_geometric(&c, &c, 16, 0, 0, e->c4);
    check_geometric(&c, &d, 16, 0, 0, e->c4);
    /* c = d = 2^63 - 1, n = 1024: sums up to 1024 c^2 ~ 2^136, signs
       alternating with k when both alternate; with one alternating the
       partial sums swing by c^2 ~ 2^126 and end at 0 or +-c d */
    gs_int_set_si(&c, INT64_MAX);
    gs_int_set_si(&d, -INT64_MAX);
    check_geometric(&c, &c, 1024, 1, 1, e->c4);
    check_geometric(&c, &d, 1024, 0, 0, e->c4);
    check_geometric(&c, &d, 1024, 0, 1, e->c4);
    check_geometric(&d, &d, 300, 1, 0, e->c4);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&p);
    gs_int_clear(&c);
    gs_int_clear(&d);
    gs_int_clear(&w);
}

/* A random pair for the loops: shape varies with the seed. */
static void rand_pair(gs_poly *a, gs_poly *b, rng *r, const gs_polyctx *ctx)
{
    unsigned na = 1 + rbelow(r, 30), nb = 1 + rbelow(r, 30);
    unsigned maxe = 1 + rbelow(r, 6), bits = 1 + rbelow(r, 100);
    int nv = 1 + (int)rbelow(r, (unsigned)ctx->nvars);
    if (rbelow(r, 4) == 0)
        bits = 1 + rbelow(r, 8);
    rand_poly(a, r, na, nv, maxe, bits, ctx);
    rand_poly(b, r, nb, nv, maxe, bits, ctx);
}

static void loop_ring(const gs_polyctx *ctx, uint64_t seed0, int n)
{
    gs_poly a, b, c, s, t, u;
    int k;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&c);
    gs_poly_init(&s);
    gs_poly_init(&t);
    gs_poly_init(&u);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int ok = 1, m;
        rand_pair(&a, &b, &r, ctx);
        rand_poly(&c, &r, 1 + rbelow(&r, 10), ctx->nvars, 3, 40, ctx);
        gs_poly_add(&s, &a, &b, ctx);                 /* (a+b)-b = a */
        gs_poly_sub(&t, &s, &b, ctx);
        ok &= canonical(&s, ctx) && gs_poly_equal(&t, &a, ctx);
        gs_poly_add(&t, &b, &a, ctx);                 /* a+b = b+a */
        ok &= gs_poly_equal(&t, &s, ctx);
        gs_poly_mul(&s, &a, &b, ctx);                 /* ab = ba */
        gs_poly_mul(&t, &b, &a, ctx);
        ok &= canonical(&s, ctx) && gs_poly_equal(&s, &t, ctx);
        ok &= gs_poly_hash(&s, ctx) == gs_poly_hash(&t, ctx);
        for (m = 1; m <= 2; m++) {                    /* every method */
            gs_poly_mul_method(&t, &a, &b, m, ctx);
            ok &= gs_poly_equal(&s, &t, ctx);
            gs_poly_mul_method(&t, &a, &b, m | GS_POLY_MUL_BIGACC, ctx);
            ok &= gs_poly_equal(&s, &t, ctx);
            gs_poly_mul_method(&t, &a, &b, m | GS_POLY_MUL_MIDACC, ctx);
            ok &= gs_poly_equal(&s, &t, ctx);
        }
        gs_poly_add(&t, &b, &c, ctx);                 /* a(b+c) = ab+ac */
        gs_poly_mul(&t, &a, &t, ctx);
        gs_poly_mul(&u, &a, &c, ctx);
        gs_poly_add(&u, &s, &u, ctx);
        ok &= gs_poly_equal(&t, &u, ctx);
        gs_poly_mul(&t, &s, &c, ctx);                 /* (ab)c = a(bc) */
        gs_poly_mul(&u, &b, &c, ctx);
        gs_poly_mul(&u, &a, &u, ctx);
        ok &= gs_poly_equal(&t, &u, ctx);
        CHECK_MSG(ok, "ring laws");
        if (!ok)
            print_case("ring laws", seed, &a, &b, ctx);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&c);
    gs_poly_clear(&s);
    gs_poly_clear(&t);
    gs_poly_clear(&u);
}

/* Outputs aliasing inputs give the same as separate outputs. */
static void loop_alias(const gs_polyctx *ctx, uint64_t seed0, int n)
{
    gs_poly a, b, x, y;
    int k;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&x);
    gs_poly_init(&y);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int ok = 1;
        rand_pair(&a, &b, &r, ctx);
        gs_poly_mul(&y, &a, &b, ctx);
        gs_poly_set(&x, &a, ctx);
        gs_poly_mul(&x, &x, &b, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_set(&x, &b, ctx);
        gs_poly_mul(&x, &a, &x, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_mul(&y, &a, &a, ctx);                 /* a*a aliased */
        gs_poly_set(&x, &a, ctx);
        gs_poly_mul(&x, &x, &x, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_pow_ui(&x, &x, 1, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_set(&x, &a, ctx);
        gs_poly_pow_ui(&x, &x, 2, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_add(&y, &a, &a, ctx);                 /* a+a = 2a */
        gs_poly_set(&x, &a, ctx);
        gs_poly_add(&x, &x, &x, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_mul_si(&y, &a, 2, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_sub(&x, &x, &x, ctx);                 /* a-a = 0 */
        ok &= gs_poly_is_zero(&x);
        gs_poly_sub(&y, &a, &b, ctx);
        gs_poly_set(&x, &b, ctx);
        gs_poly_sub(&x, &a, &x, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_neg(&x, &x, ctx);
        gs_poly_sub(&y, &b, &a, ctx);
        ok &= gs_poly_equal(&x, &y, ctx);
        gs_poly_mul(&x, &a, &b, ctx);                 /* (ab)/b in place */
        ok &= gs_poly_divexact(&x, &x, &b, ctx) == GS_OK;
        ok &= gs_poly_equal(&x, &a, ctx);
        gs_poly_mul(&x, &a, &b, ctx);
        gs_poly_set(&y, &b, ctx);
        ok &= gs_poly_divexact(&y, &x, &y, ctx) == GS_OK;
        ok &= gs_poly_equal(&y, &a, ctx);
        CHECK_MSG(ok, "aliasing");
        if (!ok)
            print_case("aliasing", seed, &a, &b, ctx);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&x);
    gs_poly_clear(&y);
}

/* (ab)/b = a; ab + c is not divisible by a nonconstant b for a nonzero
   constant c; ab/(2b) is not integral when the content of a is odd;
   a random quotient is either exact (and then checks) or reported so. */
static void loop_division(const gs_polyctx *ctx, uint64_t seed0, int n)
{
    gs_poly a, b, p, q, one;
    gs_int c;
    int k;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&p);
    gs_poly_init(&q);
    gs_poly_init(&one);
    gs_int_init(&c);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int ok = 1, rc, m;
        rand_pair(&a, &b, &r, ctx);
        gs_poly_mul(&p, &a, &b, ctx);
        ok &= gs_poly_divexact(&q, &p, &b, ctx) == GS_OK;
        ok &= canonical(&q, ctx) && gs_poly_equal(&q, &a, ctx);
        for (m = 1; m <= 2; m++) {                    /* every method */
            ok &= gs_poly_divexact_method(&q, &p, &b, m, ctx) == GS_OK;
            ok &= gs_poly_equal(&q, &a, ctx);
            ok &= gs_poly_divexact_method(&q, &p, &b, m | GS_POLY_MUL_BIGACC,
                                          ctx) == GS_OK;
            ok &= gs_poly_equal(&q, &a, ctx);
        }
        ok &= gs_poly_divexact(&q, &p, &a, ctx) == GS_OK;
        ok &= gs_poly_equal(&q, &b, ctx);
        if (!gs_poly_is_const(&b, ctx)) {
            rand_int(&c, &r, 1 + rbelow(&r, 90));
            gs_poly_set_int(&one, &c, ctx);
            gs_poly_add(&one, &p, &one, ctx);
            for (m = 0; m <= 2; m++) {
                ok &= gs_poly_divexact_method(&q, &one, &b, m, ctx)
                    == GS_EINEXACT;
                ok &= gs_poly_is_zero(&q);
            }
        }
        gs_poly_content(&c, &a);
        if (gs_int_mod_ui(&c, 2) == 1) {
            gs_poly_mul_si(&q, &b, 2, ctx);
            ok &= gs_poly_divexact(&q, &p, &q, ctx) == GS_EINEXACT;
        }
        for (m = 0; m <= 2; m++) {       /* a / b, usually inexact */
            rc = gs_poly_divexact_method(&q, &a, &b, m, ctx);
            if (rc == GS_OK) {
                gs_poly_mul(&q, &q, &b, ctx);
                ok &= gs_poly_equal(&q, &a, ctx);
            } else {
                ok &= rc == GS_EINEXACT && gs_poly_is_zero(&q);
            }
        }
        gs_poly_mul(&q, &a, &b, ctx);   /* ab + a tail: inexact */
        gs_poly_add(&q, &q, &one, ctx);
        gs_poly_add(&one, &q, &b, ctx);
        rc = gs_poly_divexact_method(&q, &one, &b, GS_POLY_MUL_DENSE, ctx);
        if (rc == GS_OK) {
            gs_poly_mul(&q, &q, &b, ctx);
            ok &= gs_poly_equal(&q, &one, ctx);
        } else {
            ok &= rc == GS_EINEXACT && gs_poly_is_zero(&q);
        }
        CHECK_MSG(ok, "division");
        if (!ok)
            print_case("division", seed, &a, &b, ctx);
    }
    gs_int_clear(&c);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&p);
    gs_poly_clear(&q);
    gs_poly_clear(&one);
}

/* product rule, coefficients in a variable add back up to the
   polynomial, content times primitive part, powers, text round trip,
   canonicalise of a shuffled copy and its hash */
static void loop_misc(const gs_polyctx *ctx, uint64_t seed0, int n)
{
    gs_poly a, b, s, t, u, xk;
    gs_int c;
    int k;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&s);
    gs_poly_init(&t);
    gs_poly_init(&u);
    gs_poly_init(&xk);
    gs_int_init(&c);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int ok = 1, v = (int)rbelow(&r, (unsigned)ctx->nvars);
        long d, j;
        char *str;
        size_t i;
        unsigned ex[16];
        rand_pair(&a, &b, &r, ctx);
        gs_poly_mul(&s, &a, &b, ctx);                 /* (ab)' */
        gs_poly_derivative(&s, &s, v, ctx);
        gs_poly_derivative(&t, &a, v, ctx);
        gs_poly_mul(&t, &t, &b, ctx);
        gs_poly_derivative(&u, &b, v, ctx);
        gs_poly_mul(&u, &a, &u, ctx);
        gs_poly_add(&t, &t, &u, ctx);
        ok &= canonical(&s, ctx) && gs_poly_equal(&s, &t, ctx);
        d = gs_poly_degree(&a, v, ctx);               /* collect in v */
        gs_poly_zero(&s);
        for (j = 0; j <= d; j++) {
            gs_poly_coeff_var(&t, &a, v, (unsigned)j, ctx);
            gs_poly_set_var(&xk, v, (unsigned)j, ctx);
            gs_poly_mul(&t, &t, &xk, ctx);
            gs_poly_add(&s, &s, &t, ctx);
        }
        ok &= gs_poly_equal(&s, &a, ctx);
        gs_poly_content(&c, &a);                      /* content */
        gs_poly_primitive(&t, &a, ctx);
        ok &= gs_poly_sgn(&t) > 0;
        gs_poly_mul_int(&t, &t, &c, ctx);
        ok &= gs_poly_equal(&t, &a, ctx);
        if (gs_poly_total_degree(&b, ctx) <= 6) {     /* b^3 = b b b */
            gs_poly_pow_ui(&s, &b, 3, ctx);
            gs_poly_mul(&t, &b, &b, ctx);
            gs_poly_mul(&t, &t, &b, ctx);
            ok &= gs_poly_equal(&s, &t, ctx);
        }
        str = gs_poly_get_str(&a, ctx);               /* text */
        ok &= gs_poly_set_str(&s, str, ctx) == GS_OK;
        ok &= gs_poly_equal(&s, &a, ctx);
        free(str);
        gs_poly_zero(&s);                             /* shuffled */
        for (i = a.length; i-- > 0;) {
            gs_poly_get_term_exps(ex, &a, i, ctx);
            gs_poly_push_term(&s, &a.coeffs[i], ex, ctx);
        }
        gs_poly_canonicalise(&s, ctx);
        ok &= gs_poly_equal(&s, &a, ctx);
        ok &= gs_poly_hash(&s, ctx) == gs_poly_hash(&a, ctx);
        CHECK_MSG(ok, "misc");
        if (!ok)
            print_case("misc", seed, &a, &b, ctx);
    }
    gs_int_clear(&c);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&s);
    gs_poly_clear(&t);
    gs_poly_clear(&u);
    gs_poly_clear(&xk);
}

/* Substitute then evaluate equals evaluate at the substituted value.
   Small integers at small points keep every partial sum an integer below
   2^50, exact in long double (64-bit significand), so equality is exact:
   |b| <= 4 * 2^5 * 2^3, and a term of a is at most 2^7 |b|^3 2^6. */
static void loop_subst_eval(const gs_polyctx *ctx, uint64_t seed0, int n)
{
    gs_poly a, b, s;
    gs_rat q;
    gs_int scale;
    long double vals[16], ev;
    int k, v;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&s);
    gs_rat_init(&q);
    gs_int_init(&scale);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int ok = 1, x = (int)rbelow(&r, (unsigned)ctx->nvars);
        long num = (long)rbelow(&r, 7) - 3, den = 1 + (long)rbelow(&r, 3);
        rand_poly(&a, &r, 1 + rbelow(&r, 12), ctx->nvars, 3, 7, ctx);
        rand_poly(&b, &r, 1 + rbelow(&r, 4), ctx->nvars, 1, 5, ctx);
        for (v = 0; v < ctx->nvars; v++)        /* |values| <= 2 in three
                                                   variables, else <= 1 */
            vals[v] = v < 3 ? (long double)((int)rbelow(&r, 5) - 2)
                            : (long double)((int)rbelow(&r, 3) - 1);
        gs_poly_subst(&s, &a, x, &b, ctx);
        ok &= canonical(&s, ctx);
        ev = gs_poly_eval_ld(&s, vals, ctx);
        vals[x] = gs_poly_eval_ld(&b, vals, ctx);
        ok &= ev == gs_poly_eval_ld(&a, vals, ctx);
        /* x = num/den: eval(r) / scale = a(num/den); den^deg is exact */
        gs_rat_set_si(&q, num, den);
        gs_poly_subst_rat(&s, &scale, &a, x, &q, ctx);
        ok &= canonical(&s, ctx) && gs_poly_degree(&s, x, ctx) <= 0;
        ev = gs_poly_eval_ld(&s, vals, ctx);
        vals[x] = (long double)num / (long double)den;
        ok &= fabsl(ev / gs_int_get_ld(&scale)
                    - gs_poly_eval_ld(&a, vals, ctx))
            <= 1e-12L * (1 + fabsl(ev));
        CHECK_MSG(ok, "subst/eval");
        if (!ok)
            print_case("subst/eval", seed, &a, &b, ctx);
    }
    gs_int_clear(&scale);
    gs_rat_clear(&q);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&s);
}

/* gs_poly_sum_of_products against products and sums one at a time
   (ring axioms: the same value however it is bracketed). */
static void loop_sum_of_products(const gs_polyctx *ctx, uint64_t seed0, int n)
{
    gs_poly a[5], b[5], want, t, got;
    const gs_poly *pa[5], *pb[5];
    int neg[5], k, i;
    for (i = 0; i < 5; i++) {
        gs_poly_init(&a[i]);
        gs_poly_init(&b[i]);
        pa[i] = &a[i];
        pb[i] = &b[i];
    }
    gs_poly_init(&want);
    gs_poly_init(&t);
    gs_poly_init(&got);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int np = (int)rbelow(&r, 6);
        gs_poly_zero(&want);
        for (i = 0; i < np; i++) {
            rand_poly(&a[i], &r, 1 + rbelow(&r, 3), ctx->nvars, 2, 70, ctx);
            rand_poly(&b[i], &r, 1 + rbelow(&r, 30), ctx->nvars, 3, 70,
                      ctx);
            if (rbelow(&r, 5) == 0)
                gs_poly_zero(&b[i]);
            if (i == 1 && rbelow(&r, 2)) {  /* a chance to cancel a0 b0 */
                gs_poly_set(&a[1], &a[0], ctx);
                gs_poly_set(&b[1], &b[0], ctx);
            }
            neg[i] = (int)rbelow(&r, 2);
            gs_poly_mul(&t, &a[i], &b[i], ctx);
            if (neg[i])
                gs_poly_sub(&want, &want, &t, ctx);
            else
                gs_poly_add(&want, &want, &t, ctx);
        }
        gs_poly_sum_of_products(&got, pa, pb, neg, (size_t)np, ctx);
        CHECK_MSG(gs_poly_equal(&got, &want, ctx) && canonical(&got, ctx),
                  "sum of products: seed %llu", (unsigned long long)seed);
    }
    for (i = 0; i < 5; i++) {
        gs_poly_clear(&a[i]);
        gs_poly_clear(&b[i]);
    }
    gs_poly_clear(&want);
    gs_poly_clear(&t);
    gs_poly_clear(&got);
}

/* gs_poly_coeffs_var splits a by powers of x in one pass: each part
   equals gs_poly_coeff_var's, and sum_k out[k] x^k gives a back. */
static void loop_coeffs_var(const gs_polyctx *ctx, uint64_t seed0, int n)
{
    gs_poly a, out[5], one, back, xk;
    int k, i;
    gs_poly_init(&a);
    gs_poly_init(&one);
    gs_poly_init(&back);
    gs_poly_init(&xk);
    for (i = 0; i < 5; i++)
        gs_poly_init(&out[i]);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int x = (int)rbelow(&r, (unsigned)ctx->nvars), ok = 1;
        rand_poly(&a, &r, 1 + rbelow(&r, 20), ctx->nvars, 4, 9, ctx);
        gs_poly_coeffs_var(out, 5, &a, x, ctx);
        gs_poly_zero(&back);
        for (i = 0; i < 5; i++) {
            gs_poly_coeff_var(&one, &a, x, (unsigned)i, ctx);
            ok &= gs_poly_equal(&one, &out[i], ctx)
                  && canonical(&out[i], ctx)
                  && gs_poly_degree(&out[i], x, ctx) <= 0;
            gs_poly_set_var(&xk, x, (unsigned)i, ctx);
            gs_poly_mul(&xk, &xk, &out[i], ctx);
            gs_poly_add(&back, &back, &xk, ctx);
        }
        ok &= gs_poly_equal(&back, &a, ctx);
        CHECK_MSG(ok, "coeffs_var: seed %llu", (unsigned long long)seed);
    }
    for (i = 0; i < 5; i++)
        gs_poly_clear(&out[i]);
    gs_poly_clear(&a);
    gs_poly_clear(&one);
    gs_poly_clear(&back);
    gs_poly_clear(&xk);
}

/* gs_poly_flip_vars is multiplication by x_to^top after x_v = 1/x_to:
   flip(a)(vals) = vals[to]^top * a(vals with x_v = 1/vals[to]), checked at
   values where every power is exact.  gs_poly_remap renames variables
   v -> 2v - (v > 0) of the 11-symbol context (increasing) and must keep
   values and canonical form. */
static void loop_flip_remap(const env *e, uint64_t seed0, int n)
{
    const gs_polyctx *c4 = e->c4, *c11 = e->c11;
    gs_poly a, f, m;
    long double vals[16], vals11[16];
    unsigned top[16], degs[16];
    int to[16], k, v;
    gs_poly_init(&a);
    gs_poly_init(&f);
    gs_poly_init(&m);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int ok = 1, x = (int)rbelow(&r, 4), y = (x + 1 + (int)rbelow(&r, 3)) % 4;
        long double want;
        rand_poly(&a, &r, 1 + rbelow(&r, 12), 4, 3, 7, c4);
        /* y must not occur in a: it receives x's flipped exponents */
        gs_poly_subst(&f, &a, y, &m, c4);       /* m = 0: drops y */
        gs_poly_swap(&a, &f);
        if (gs_poly_is_zero(&a))
            gs_poly_set_si(&a, 1, c4);
        gs_poly_degrees(degs, &a, c4);
        memset(top, 0, sizeof top);
        memset(to, 0, sizeof to);
        top[x] = degs[x];
        to[x] = y;
        for (v = 0; v < 4; v++)
            vals[v] = (long double)(1 << rbelow(&r, 3))
                      * (rnext(&r) & 1 ? -1 : 1);
        gs_poly_flip_vars(&f, &a, to, top, NULL, c4);
        ok &= canonical(&f, c4) && gs_poly_degree(&f, x, c4) <= 0;
        want = gs_poly_eval_ld(&f, vals, c4);
        vals[x] = 1 / vals[y];
        ok &= want == powl(vals[y], (long double)top[x])
                      * gs_poly_eval_ld(&a, vals, c4);
        gs_poly_clear(&m);
        gs_poly_init(&m);
        gs_poly_remap(&m, &a, (const int[]){0, 1, 3, 5}, c4, c11);
        memset(vals11, 0, sizeof vals11);
        vals11[0] = vals[0];
        vals11[1] = vals[1];
        vals11[3] = vals[2];
        vals11[5] = vals[3];
        ok &= canonical(&m, c11) && m.length == a.length
              && gs_poly_eval_ld(&m, vals11, c11)
                 == gs_poly_eval_ld(&a, vals, c4);
        gs_poly_clear(&m);
        gs_poly_init(&m);
        CHECK_MSG(ok, "flip/remap: seed %llu", (unsigned long long)seed);
    }
    gs_poly_zero(&a);                   /* zero maps to zero */
    gs_poly_remap(&m, &a, (const int[]){0, 1, 3, 5}, c4, c11);
    CHECK(gs_poly_is_zero(&m));
    /* remap_take on (1 + x + y + z + t)^45, C(49, 4) = 211876 terms (the
       count of monomials of degree <= 45 in four variables), enough to
       give its storage back in pieces: the same as remap, a left zero */
    parse(&f, "1 + x + y + z + t", c4);
    gs_poly_set_si(&a, 1, c4);
    for (k = 0; k < 45; k++)
        gs_poly_mul(&a, &a, &f, c4);
    CHECK(a.length == 211876);
    gs_poly_remap(&m, &a, (const int[]){0, 1, 3, 5}, c4, c11);
    gs_poly_remap_take(&f, &a, (const int[]){0, 1, 3, 5}, c4, c11);
    CHECK(gs_poly_is_zero(&a) && gs_poly_equal(&f, &m, c11));
    gs_poly_remap_take(&f, &a, (const int[]){0, 1, 3, 5}, c4, c11);
    CHECK(gs_poly_is_zero(&f));
    gs_poly_clear(&a);
    gs_poly_clear(&f);
    gs_poly_clear(&m);
}

/* Terms in any order, with repeats and zero coefficients: up to 4000
   terms in the 11 variables.  With exponents below 4 (2 bits each, 22
   in all, and 12 of index) the keys fit a word and a polynomial of 1024
   terms or more takes the packed radix sort; exponents up to 2000 (11
   bits each) never fit, and take the comparison sort.  Both must give
   the same result as the comparison sort (merge sort: Knuth, TAOCP
   vol. 3, sec. 5.2.4, from memory) and canonical() (written here, apart
   from the library) must hold.  gs_poly_degree_bounds against the
   degrees on the same polynomials. */
static void loop_packed_sort(const env *e, uint64_t seed0, int n)
{
    const gs_polyctx *ctx = e->c11;
    gs_poly p, q;
    unsigned ex[16], deg[16], bound[16];
    gs_int c;
    int k, v;
    gs_poly_init(&p);
    gs_poly_init(&q);
    gs_int_init(&c);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        unsigned nt = k % 4 == 0 ? 1 + rbelow(&r, 1100) : 900 + rbelow(&r, 3100);
        /* k % 5 == 3: 54 to 60 bits of monomial, 10 to 12 of index, so
           the index goes beside the keys (the split plan) */
        unsigned maxe = k % 5 == 4 ? 2000 : k % 5 == 3 ? 63
                        : 1 + rbelow(&r, 3), t;
        int nv = maxe == 63 ? 9 + (int)rbelow(&r, 2)
                 : 1 + (int)rbelow(&r, 11), ok;
        gs_poly_zero(&p);
        gs_poly_zero(&q);
        for (t = 0; t < nt; t++) {
            memset(ex, 0, sizeof ex);
            for (v = 0; v < nv; v++)
                if (rnext(&r) & 1)
                    ex[v] = rbelow(&r, maxe + 1);
            if (rbelow(&r, 8) == 0)
                gs_int_set_si(&c, 0);
            else
                rand_int(&c, &r, 1 + rbelow(&r, 90));
            gs_poly_push_term(&p, &c, ex, ctx);
            gs_poly_push_term(&q, &c, ex, ctx);
            if (rbelow(&r, 6) == 0) {          /* a repeat, maybe cancelling */
                if (rnext(&r) & 1)
                    gs_int_neg(&c, &c);
                gs_poly_push_term(&p, &c, ex, ctx);
                gs_poly_push_term(&q, &c, ex, ctx);
            }
        }
        gs_poly_canonicalise(&p, ctx);
        gs_poly_canonicalise_compare(&q, ctx);
        ok = canonical(&p, ctx) && gs_poly_equal(&p, &q, ctx);
        /* the OR of numbers up to d is at least their largest and has
           no more bits than d: d <= bound < 2d (and 0 for d = 0) */
        gs_poly_degrees(deg, &p, ctx);
        gs_poly_degree_bounds(bound, &p, ctx);
        for (v = 0; v < 11; v++)
            ok &= bound[v] >= deg[v] && (deg[v] == 0 ? bound[v] == 0
                                                     : bound[v] < 2 * deg[v]);
        CHECK_MSG(ok, "packed sort: seed %llu", (unsigned long long)seed);
    }
    gs_int_clear(&c);
    gs_poly_clear(&p);
    gs_poly_clear(&q);
}

/* gs_poly_flip_vars on large polynomials with random flipped sets, some
   targets occurring in a (so that flipped terms meet and add up), top
   at least the degree: against the definition done term by term here
   and sorted by the comparison sort alone.  Most cases fit the packed
   keys, some only with the index apart; top up to 1500 in several
   variables does not. */
static void loop_flip_packed(const env *e, uint64_t seed0, int n)
{
    const gs_polyctx *ctx = e->c11;
    gs_poly a, f, want;
    unsigned degs[16], top[16], ex[16];
    int to[16], flipped[16], k, v;
    gs_poly_init(&a);
    gs_poly_init(&f);
    gs_poly_init(&want);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        /* k % 6 == 3: the last variable alone flipped into the first,
           6 bits for each of nine, 7 for that one, 12 or so of index:
           the index goes beside the keys (the split plan of poly.c) */
        unsigned maxe = k % 6 == 5 ? 700 : k % 6 == 3 ? 40 : 1 + rbelow(&r, 3);
        size_t i;
        int nf = 0, nkept = 0, kept[16], ok;
        rand_poly(&a, &r, 600 + rbelow(&r, 3000), 11, maxe,
                  1 + rbelow(&r, 70), ctx);
        gs_poly_degrees(degs, &a, ctx);
        for (v = 0; v < 11; v++) {
            flipped[v] = k % 6 == 3 ? v == 10 : v > 0 && rbelow(&r, 3) == 0;
            nf += flipped[v];
            if (!flipped[v])
                kept[nkept++] = v;
        }
        memset(top, 0, sizeof top);
        memset(to, 0, sizeof to);
        for (v = 0; v < 11; v++)
            if (flipped[v]) {       /* into a variable that is not flipped */
                to[v] = k % 6 == 3 ? 0 : kept[rbelow(&r, (unsigned)nkept)];
                top[v] = degs[v] + rbelow(&r, 2);
                if (top[v] == 0)
                    top[v] = 1;
            }
        gs_poly_zero(&want);
        for (i = 0; i < a.length; i++) {
            gs_poly_get_term_exps(ex, &a, i, ctx);
            for (v = 0; v < 11; v++)
                if (flipped[v]) {
                    ex[to[v]] += top[v] - ex[v];
                    ex[v] = 0;
                }
            gs_poly_push_term(&want, &a.coeffs[i], ex, ctx);
        }
        gs_poly_canonicalise_compare(&want, ctx);
        gs_poly_flip_vars(&f, &a, to, top, degs, ctx);
        ok = canonical(&f, ctx) && gs_poly_equal(&f, &want, ctx);
        gs_poly_flip_vars(&a, &a, to, top, NULL, ctx);      /* aliased */
        ok &= gs_poly_equal(&a, &want, ctx);
        CHECK_MSG(ok, "flip, packed: seed %llu (%d flipped)",
                  (unsigned long long)seed, nf);
    }
    /* x^n f(1/x) is the reciprocal polynomial (a fact of algebra): for
       f = (1 + x + z + t)^20, of C(23, 3) = 1771 terms (stars and bars),
       flipping x into y with top 20 gives (y + 1 + y z + y t)^20. */
    renew(&a);
    renew(&f);
    renew(&want);
    parse(&a, "1 + x + z + t", e->c4);
    gs_poly_pow_ui(&a, &a, 20, e->c4);
    CHECK(a.length == 1771);
    memset(top, 0, sizeof top);
    memset(to, 0, sizeof to);
    to[0] = 1;
    top[0] = 20;
    gs_poly_flip_vars(&f, &a, to, top, NULL, e->c4);
    parse(&want, "y + 1 + y*z + y*t", e->c4);
    gs_poly_pow_ui(&want, &want, 20, e->c4);
    CHECK(canonical(&f, e->c4) && gs_poly_equal(&f, &want, e->c4));
    gs_poly_clear(&a);
    gs_poly_clear(&f);
    gs_poly_clear(&want);
}

/* gs_poly_remap and gs_poly_remap_take with random strictly increasing
   maps of the 4 variables into the 11, against the renaming done term
   by term here: the monomials are the same, renamed, in the same order
   (an increasing renaming keeps the lexicographic order). */
static void loop_remap_maps(const env *e, uint64_t seed0, int n)
{
    gs_poly a, m, t, want;
    unsigned ex[16], ey[16];
    int map[4], k, v;
    gs_poly_init(&a);
    gs_poly_init(&m);
    gs_poly_init(&t);
    gs_poly_init(&want);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        size_t i;
        int at = 0, ok;
        for (v = 0; v < 4; v++) {       /* increasing, room left for the rest */
            map[v] = at + (int)rbelow(&r, (unsigned)(11 - at - (3 - v)));
            at = map[v] + 1;
        }
        rand_poly(&a, &r, 1 + rbelow(&r, 60), 4, 1 + rbelow(&r, 40), 30,
                  e->c4);
        gs_poly_zero(&want);
        for (i = 0; i < a.length; i++) {
            gs_poly_get_term_exps(ex, &a, i, e->c4);
            memset(ey, 0, sizeof ey);
            for (v = 0; v < 4; v++)
                ey[map[v]] = ex[v];
            gs_poly_push_term(&want, &a.coeffs[i], ey, e->c11);
        }
        gs_poly_canonicalise_compare(&want, e->c11);
        renew(&m);
        renew(&t);
        gs_poly_remap(&m, &a, map, e->c4, e->c11);
        ok = canonical(&m, e->c11) && gs_poly_equal(&m, &want, e->c11);
        gs_poly_remap_take(&t, &a, map, e->c4, e->c11);
        ok &= gs_poly_is_zero(&a) && gs_poly_equal(&t, &want, e->c11);
        CHECK_MSG(ok, "remap maps: seed %llu", (unsigned long long)seed);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&m);
    gs_poly_clear(&t);
    gs_poly_clear(&want);
}

/* gs_poly_remap_flip_take against its definition done term by term:
   random increasing maps of the 4 variables into the 11, some of their
   images flipped into other variables of the 11 (which may be images
   too, so that exponents add up), top at least the degree.  Sizes from
   a few terms (the two-step path) to over 1024 (the keys), exponents up
   to 3 (the keys fit a word, index and all) and up to 2000 (they do
   not: the two-step path again). */
static void loop_remap_flip(const env *e, uint64_t seed0, int n)
{
    gs_poly a, t, want;
    unsigned ex[16], ey[16], degs[16], top[16];
    int map[4], to[16], flipped[16], k, v;
    gs_poly_init(&a);
    gs_poly_init(&t);
    gs_poly_init(&want);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        unsigned maxe = k % 7 == 6 ? 2000 : 1 + rbelow(&r, 3);
        unsigned nt = k % 3 == 0 ? 1 + rbelow(&r, 200)
                                 : 1100 + rbelow(&r, 2500);
        size_t i;
        int at = 0, ok, d;
        memset(top, 0, sizeof top);
        memset(to, 0, sizeof to);
        memset(flipped, 0, sizeof flipped);
        for (v = 0; v < 4; v++) {
            map[v] = at + (int)rbelow(&r, (unsigned)(11 - at - (3 - v)));
            at = map[v] + 1;
        }
        rand_poly(&a, &r, nt, 4, maxe, 40, e->c4);
        gs_poly_degrees(degs, &a, e->c4);
        for (v = 0; v < 4; v++)
            flipped[map[v]] = rbelow(&r, 2) == 0;
        for (v = 0; v < 4; v++) {
            d = map[v];
            if (!flipped[d])
                continue;
            do                          /* never into a flipped one */
                to[d] = (int)rbelow(&r, 11);
            while (to[d] == d || flipped[to[d]]);
            top[d] = degs[v] + rbelow(&r, 3);
            if (top[d] == 0)
                top[d] = 1;
        }
        gs_poly_zero(&want);
        for (i = 0; i < a.length; i++) {
            gs_poly_get_term_exps(ex, &a, i, e->c4);
            memset(ey, 0, sizeof ey);
            for (v = 0; v < 4; v++) {
                d = map[v];
                if (flipped[d])
                    ey[to[d]] += top[d] - ex[v];
                else
                    ey[d] += ex[v];
            }
            gs_poly_push_term(&want, &a.coeffs[i], ey, e->c11);
        }
        gs_poly_canonicalise_compare(&want, e->c11);
        renew(&t);
        gs_poly_remap_flip_take(&t, &a, map, to, top, e->c4, e->c11);
        ok = gs_poly_is_zero(&a) && canonical(&t, e->c11)
             && gs_poly_equal(&t, &want, e->c11);
        CHECK_MSG(ok, "remap and flip: seed %llu", (unsigned long long)seed);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&t);
    gs_poly_clear(&want);
}

/* gs_poly_group_by_var against gs_poly_coeffs_var, which copies the
   coefficient of each power out: power k's run holds, in order, exactly
   the terms of that coefficient (times x_var^k), on random polynomials
   with each variable as var in turn. */
static void loop_group_by_var(const env *e, uint64_t seed0, int n)
{
    const gs_polyctx *ctx = e->c11;
    gs_poly a, c[64];
    unsigned ex[16], ey[16];
    int k, var, j;
    gs_poly_init(&a);
    for (j = 0; j < 64; j++)
        gs_poly_init(&c[j]);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        int ok = 1;
        rand_poly(&a, &r, 1 + rbelow(&r, 400), 11, 1 + rbelow(&r, 12), 20,
                  ctx);
        for (var = 0; var < 11 && ok; var++) {
            size_t *idx, *ends, np, p, i;
            np = gs_poly_group_by_var(&idx, &ends, &a, var, ctx);
            ok = np == (size_t)gs_poly_degree(&a, var, ctx) + 1 && np <= 64
                 && ends[np - 1] == a.length;
            if (ok)
                gs_poly_coeffs_var(c, np, &a, var, ctx);
            for (p = 0; p < np && ok; p++) {
                size_t lo = p ? ends[p - 1] : 0;
                ok = ends[p] - lo == c[p].length;
                for (i = 0; i < c[p].length && ok; i++) {
                    gs_poly_get_term_exps(ex, &a, idx[lo + i], ctx);
                    gs_poly_get_term_exps(ey, &c[p], i, ctx);
                    ok = ex[var] == p;
                    ex[var] = 0;
                    ok = ok && memcmp(ex, ey, 11 * sizeof *ex) == 0
                         && gs_int_cmp(&a.coeffs[idx[lo + i]],
                                       &c[p].coeffs[i]) == 0;
                }
            }
            free(idx);
            free(ends);
        }
        CHECK_MSG(ok, "group by var: seed %llu", (unsigned long long)seed);
    }
    gs_poly_clear(&a);
    for (j = 0; j < 64; j++)
        gs_poly_clear(&c[j]);
}

/* Dense shapes that pick the block method by themselves, and sparse
   ones in many variables that pick the heap: all methods agree. */
static void loop_shapes(const env *e, uint64_t seed0, int n)
{
    gs_poly a, b, p, q;
    int k;
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&p);
    gs_poly_init(&q);
    for (k = 0; k < n; k++) {
        uint64_t seed = seed0 + (uint64_t)k;
        rng r = { seed };
        const gs_polyctx *ctx = k % 2 ? e->c11 : e->c4;
        int ok = 1, m;
        renew(&a);
        renew(&b);
        renew(&p);
        renew(&q);
        unsigned nt = 50 + rbelow(&r, 300);
        rand_poly(&a, &r, nt, 1 + (int)rbelow(&r, 4), 3 + rbelow(&r, 12),
                  1 + rbelow(&r, 70), ctx);
        rand_poly(&b, &r, nt, 1 + (int)rbelow(&r, 4), 3 + rbelow(&r, 12),
                  1 + rbelow(&r, 70), ctx);
        gs_poly_mul_method(&p, &a, &b, GS_POLY_MUL_HEAP | GS_POLY_MUL_BIGACC,
                           ctx);
        ok &= canonical(&p, ctx);
        for (m = 0; m <= 2; m++) {
            gs_poly_mul_method(&q, &a, &b, m, ctx);
            ok &= gs_poly_equal(&p, &q, ctx);
        }
        for (m = 0; m <= 2; m++) {
            ok &= gs_poly_divexact_method(&q, &p, &a, m, ctx) == GS_OK
                && gs_poly_equal(&q, &b, ctx);
            ok &= gs_poly_divexact_method(&q, &p, &a, m | GS_POLY_MUL_BIGACC,
                                          ctx) == GS_OK
                && gs_poly_equal(&q, &b, ctx);
        }
        gs_poly_set_si(&q, 1, ctx);                  /* ab + 1 */
        gs_poly_add(&p, &p, &q, ctx);
        if (!gs_poly_is_const(&a, ctx))
            for (m = 0; m <= 2; m++)
                ok &= gs_poly_divexact_method(&q, &p, &a, m, ctx)
                    == GS_EINEXACT && gs_poly_is_zero(&q);
        CHECK_MSG(ok, "shapes");
        if (!ok)
            print_case("shapes", seed, &a, &b, ctx);
    }
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&p);
    gs_poly_clear(&q);
}

/* gs_poly_term_factors lists what gs_poly_get_term_exps unpacks, less
   the zeros and the variable skipped: known terms, then random sparse
   terms over 39 variables (ten words, the last one part full, whole zero
   words common) with exponents up to GS_POLY_MAX_EXP, each variable
   skipped in turn, against the unpacked exponents. */
static void test_term_factors(const env *e, uint64_t seed)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    gs_poly p;
    gs_int c;
    unsigned exps[39], got_e[40];
    int vars[40], nv = 39, v, n, k, ok = 1;
    size_t t;
    rng r = { seed };
    gs_poly_init(&p);
    /* x*gm*(1/R)^2 in c11: x is variable 0, gm 8, 1/R 10 (env_init) */
    parse(&p, "gm*(1/R)^2*x", e->c11);
    n = gs_poly_term_factors(vars, got_e, &p, 0, -1, e->c11);
    CHECK(n == 3 && vars[0] == 0 && vars[1] == 8 && vars[2] == 10
          && got_e[0] == 1 && got_e[1] == 1 && got_e[2] == 2);
    parse(&p, "7", e->c11);
    CHECK(gs_poly_term_factors(vars, got_e, &p, 0, -1, e->c11) == 0);
    parse(&p, "gm*(1/R)^2*x", e->c11);      /* less gm: x*(1/R)^2 */
    n = gs_poly_term_factors(vars, got_e, &p, 0, 8, e->c11);
    CHECK(n == 2 && vars[0] == 0 && vars[1] == 10 && got_e[0] == 1
          && got_e[1] == 2);
    renew(&p);
    for (v = 0; v < nv; v++) {
        char name[16];
        snprintf(name, sizeof name, "q%d", v);
        gs_symtab_intern(st, name);
    }
    ctx = gs_polyctx_new(st, nv);
    gs_int_init(&c);
    for (k = 0; k < 400; k++) {
        for (v = 0; v < nv; v++) {
            unsigned roll = rbelow(&r, 16);
            exps[v] = roll == 0 ? GS_POLY_MAX_EXP - rbelow(&r, 3)
                      : roll < 3 ? 1 + rbelow(&r, 9) : 0;
        }
        gs_int_set_si(&c, 1 + (int64_t)rbelow(&r, 5));
        gs_poly_push_term(&p, &c, exps, ctx);
    }
    gs_poly_canonicalise(&p, ctx);
    for (t = 0; t < p.length; t++) {
        int j = 0, skip = (int)t % (nv + 1) - 1;   /* -1: none */
        gs_poly_get_term_exps(exps, &p, t, ctx);
        if (skip >= 0)
            exps[skip] = 0;
        n = gs_poly_term_factors(vars, got_e, &p, t, skip, ctx);
        for (v = 0; v < nv; v++) {
            if (exps[v] == 0)
                continue;
            ok &= j < n && vars[j] == v && got_e[j] == exps[v];
            j++;
        }
        ok &= j == n;
    }
    CHECK_MSG(ok && p.length > 300, "term factors, seed %llu",
              (unsigned long long)seed);
    gs_int_clear(&c);
    gs_poly_clear(&p);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* The capped product: (1+x+y+z)^3 * (1+x+y+z)^3 has C(6+3, 3) = 84
   terms (the monomials of degree <= 6 in three variables, a counting
   fact).  Under a cap of 84 or more it is the full product; under 83 it
   is refused, and r is left zero. */
static void test_mul_cap(const env *e)
{
    gs_poly a, r, full;
    gs_poly_init(&a);
    gs_poly_init(&r);
    gs_poly_init(&full);
    CHECK(gs_poly_set_str(&a, "1 + x + y + z", e->c4) == GS_OK);
    gs_poly_pow_ui(&a, &a, 3, e->c4);
    gs_poly_mul(&full, &a, &a, e->c4);
    CHECK(full.length == 84);
    CHECK(gs_poly_mul_cap(&r, &a, &a, 84, e->c4) == GS_OK);
    CHECK(gs_poly_equal(&r, &full, e->c4));
    CHECK(gs_poly_mul_cap(&r, &a, &a, 0, e->c4) == GS_OK);
    CHECK(gs_poly_equal(&r, &full, e->c4));
    CHECK(gs_poly_mul_cap(&r, &a, &a, 83, e->c4) == GS_EBUDGET);
    CHECK(gs_poly_is_zero(&r));
    CHECK(gs_poly_storage(&full, e->c4)
          >= full.length * (sizeof(gs_int) + 8));
    gs_poly_clear(&a);
    gs_poly_clear(&r);
    gs_poly_clear(&full);
}

int main(int argc, char **argv)
{
    env e;
    uint64_t seed = argc > 1 ? strtoull(argv[1], NULL, 10) : 20261201;
    env_init(&e);
    test_text(&e);
    test_term_factors(&e, seed + 15000);
    test_mul_cap(&e);
    test_binomial(&e);
    test_small_identities(&e);
    test_content(&e);
    test_degrees(&e);
    test_derivative(&e);
    test_subst(&e);
    test_limit(&e);
    test_eval(&e);
    test_build(&e);
    test_fateman_small(&e);
    test_big_coeffs(&e);
    test_mid_acc(&e);
    loop_ring(e.c4, seed, 150);
    loop_ring(e.c11, seed + 1000, 150);
    loop_alias(e.c4, seed + 2000, 100);
    loop_alias(e.c11, seed + 3000, 100);
    loop_division(e.c4, seed + 4000, 200);
    loop_division(e.c11, seed + 5000, 200);
    loop_misc(e.c4, seed + 6000, 100);
    loop_misc(e.c11, seed + 7000, 100);
    loop_subst_eval(e.c4, seed + 8000, 200);
    loop_subst_eval(e.c11, seed + 9000, 200);
    loop_shapes(&e, seed + 10000, 40);
    loop_flip_remap(&e, seed + 11000, 300);
    loop_packed_sort(&e, seed + 15000, 120);
    loop_remap_maps(&e, seed + 17000, 200);
    loop_remap_flip(&e, seed + 17500, 120);
    loop_group_by_var(&e, seed + 17800, 60);
    loop_flip_packed(&e, seed + 16000, 80);
    loop_sum_of_products(e.c4, seed + 12000, 300);
    loop_coeffs_var(e.c11, seed + 14000, 200);
    loop_sum_of_products(e.c11, seed + 13000, 300);
    env_clear(&e);
    return check_report("poly");
}
