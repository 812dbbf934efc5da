/* test_gcd.c - unit tests of the modular arithmetic and of the
 * multivariate gcd. See LICENSE.
 *
 * The expected gcds come from facts of algebra rather than from the code
 * under test: gcd(f g, f h) = f gcd(g, h) in a unique factorisation domain,
 * distinct irreducible factors are coprime, a primitive polynomial of
 * degree one in some variable whose two coefficients are coprime is
 * irreducible (Gauss's lemma; van der Waerden, Algebra I, section 5.4,
 * from memory), and the classical identities for x^n - 1.  The property
 * loops use a seeded generator (seed in argv[1]); failures print the seed,
 * the case and the polynomials in sympy syntax.
 *
 * The file includes the gcd's sources (poly_gcd.c and the three
 * poly_gcd_*.c it drives) itself, to reach the remainder-sequence
 * fallback and the internal pieces directly.
 */
#include <inttypes.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "gainsmith.h"
#include "algebra/nmod.h"
#include "algebra/poly.h"
#include "algebra/sym.h"

#include "algebra/poly_gcd.c"
#include "algebra/poly_gcd_eval.c"
#include "algebra/poly_gcd_prs.c"
#include "algebra/poly_gcd_zippel.c"

static uint64_t seed = 20261201u;

/* ---- helpers ------------------------------------------------------------ */

typedef struct {
    gs_symtab *st;
    gs_polyctx *ctx;
    int n;
} env;

static void env_init(env *e, int n)
{
    char name[16];
    int i;
    e->st = gs_symtab_new();
    for (i = 0; i < n; i++) {
        snprintf(name, sizeof name, "x%d", i);
        gs_symtab_intern(e->st, name);
    }
    e->ctx = gs_polyctx_new(e->st, n);
    e->n = n;
}

static void env_clear(env *e)
{
    gs_polyctx_free(e->ctx);
    gs_symtab_free(e->st);
}

/* sympy syntax, independent of the library's printer */
static void dump(const char *name, const gs_poly *a, const env *e)
{
    unsigned *ex = gs_calloc((size_t)e->n + 1, sizeof *ex);
    size_t i;
    int v;
    fprintf(stderr, "  %s = ", name);
    if (a->length == 0)
        fprintf(stderr, "0");
    for (i = 0; i < a->length; i++) {
        char *c = gs_int_get_str(&a->coeffs[i]);
        fprintf(stderr, "%s(%s)", i ? " + " : "", c);
        free(c);
        gs_poly_get_term_exps(ex, a, i, e->ctx);
        for (v = 0; v < e->n; v++)
            if (ex[v] != 0)
                fprintf(stderr, "*x%d**%u", v, ex[v]);
    }
    fputc('\n', stderr);
    free(ex);
}

static void add_term(gs_poly *r, int64_t c, const unsigned *ex, const env *e)
{
    gs_int k;
    gs_int_init(&k);
    gs_int_set_si(&k, c);
    gs_poly_push_term(r, &k, ex, e->ctx);
    gs_int_clear(&k);
}

/* r = sum of c[i] * x^ex[i*n ...] over nt terms */
static void from_terms(gs_poly *r, const int64_t *c, const unsigned *ex,
                       int nt, const env *e)
{
    int i;
    gs_poly_zero(r);
    for (i = 0; i < nt; i++)
        add_term(r, c[i], ex + (size_t)i * (size_t)e->n, e);
    gs_poly_canonicalise(r, e->ctx);
}

/* univariate in variable v from coefficients c[0..deg] (constant first) */
static void univ(gs_poly *r, int v, const int64_t *c, int deg, const env *e)
{
    unsigned *ex = gs_calloc((size_t)e->n, sizeof *ex);
    int k;
    gs_poly_zero(r);
    for (k = 0; k <= deg; k++) {
        ex[v] = (unsigned)k;
        add_term(r, c[k], ex, e);
    }
    gs_poly_canonicalise(r, e->ctx);
    free(ex);
}

static int64_t rand_coeff(gs_rng *rng, int cmax)
{
    int64_t c = 1 + (int64_t)gs_rng_below(rng, (uint64_t)cmax);
    return gs_rng_below(rng, 2) ? c : -c;
}

/* A random sparse polynomial: nt terms over the variables vars[0..nv-1],
   each variable present in a term with probability 1/3 and with an
   exponent up to dmax. */
static void rand_poly(gs_poly *r, gs_rng *rng, const int *vars, int nv,
                      int nt, unsigned dmax, int cmax, const env *e)
{
    unsigned *ex = gs_calloc((size_t)e->n, sizeof *ex);
    int i, k;
    gs_poly_zero(r);
    for (i = 0; i < nt; i++) {
        memset(ex, 0, (size_t)e->n * sizeof *ex);
        for (k = 0; k < nv; k++)
            if (gs_rng_below(rng, 3) == 0)
                ex[vars[k]] = 1 + (unsigned)gs_rng_below(rng, dmax);
        add_term(r, rand_coeff(rng, cmax), ex, e);
    }
    gs_poly_canonicalise(r, e->ctx);
    free(ex);
}

/* A random polynomial with at least two terms and one variable. */
static void rand_nontrivial(gs_poly *r, gs_rng *rng, const int *vars, int nv,
                            int nt, unsigned dmax, int cmax, const env *e)
{
    if (nt < 2)
        nt = 2;
    do
        rand_poly(r, rng, vars, nv, nt, dmax, cmax, e);
    while (r->length < 2 || gs_poly_is_const(r, e->ctx));
}

/* An irreducible multilinear factor c x_pivot m + b: m a monomial of up to
   two other variables, b multilinear in the others with constant term +-1
   and nt more terms.  gcd(c m, b) = 1, so the factor is irreducible. */
static void rand_irreducible(gs_poly *r, gs_rng *rng, int pivot,
                             const int *vars, int nv, int nt, const env *e)
{
    unsigned *ex = gs_calloc((size_t)e->n, sizeof *ex);
    int k, i, used;
    gs_poly_zero(r);
    ex[pivot] = 1;
    for (i = 0; i < 2; i++)
        ex[vars[gs_rng_below(rng, (uint64_t)nv)]] = 1;
    ex[pivot] = 1;
    add_term(r, rand_coeff(rng, 5), ex, e);
    memset(ex, 0, (size_t)e->n * sizeof *ex);
    add_term(r, gs_rng_below(rng, 2) ? 1 : -1, ex, e);
    for (i = 0; i < nt; i++) {
        memset(ex, 0, (size_t)e->n * sizeof *ex);
        for (used = 0, k = 0; k < nv; k++)
            if (vars[k] != pivot && gs_rng_below(rng, 4) == 0) {
                ex[vars[k]] = 1;
                used = 1;
            }
        if (used)               /* keep the constant term +-1 */
            add_term(r, rand_coeff(rng, 9), ex, e);
    }
    gs_poly_canonicalise(r, e->ctx);
    free(ex);
}

/* A random linear form c0 + sum c_i x_i over a few variables, made
   primitive with positive sign; never constant. */
static void rand_linear(gs_poly *r, gs_rng *rng, const int *vars, int nv,
                        const env *e)
{
    unsigned *ex = gs_calloc((size_t)e->n, sizeof *ex);
    do {
        int k, nt = 1 + (int)gs_rng_below(rng, 4);
        gs_poly_zero(r);
        memset(ex, 0, (size_t)e->n * sizeof *ex);
        add_term(r, rand_coeff(rng, 7), ex, e);
        for (k = 0; k < nt; k++) {
            int v = vars[gs_rng_below(rng, (uint64_t)nv)];
            memset(ex, 0, (size_t)e->n * sizeof *ex);
            ex[v] = 1;
            add_term(r, k == 0 ? 1 : rand_coeff(rng, 7), ex, e);
        }
        gs_poly_canonicalise(r, e->ctx);
        gs_poly_primitive(r, r, e->ctx);
    } while (gs_poly_is_const(r, e->ctx));
    free(ex);
}

/* equal up to sign (the gcd is defined up to a unit) */
static int associates(const gs_poly *a, const gs_poly *b, const env *e)
{
    gs_poly t;
    int ok;
    if (gs_poly_equal(a, b, e->ctx))
        return 1;
    gs_poly_init(&t);
    gs_poly_neg(&t, a, e->ctx);
    ok = gs_poly_equal(&t, b, e->ctx);
    gs_poly_clear(&t);
    return ok;
}

/* normalised as poly.h promises: primitive, positive leading coefficient */
static int normalised(const gs_poly *g)
{
    gs_int c;
    int ok;
    if (gs_poly_is_zero(g))
        return 1;
    gs_int_init(&c);
    gs_poly_content(&c, g);
    ok = gs_poly_sgn(g) > 0 && gs_int_is_one(&c);
    gs_int_clear(&c);
    return ok;
}

static int divides(const gs_poly *d, const gs_poly *a, const env *e)
{
    gs_poly q;
    int ok;
    gs_poly_init(&q);
    ok = gs_poly_divexact(&q, a, d, e->ctx) == GS_OK;
    gs_poly_clear(&q);
    return ok;
}

/* Univariate image of a in variable v mod p, the others at vals. */
static void image_in(gs_nmod_poly *r, const gs_poly *a, int v,
                     const uint64_t *vals, uint64_t p, const env *e)
{
    unsigned *ex = gs_calloc((size_t)e->n, sizeof *ex);
    size_t i;
    int k;
    gs_nmod_poly_zero(r);
    for (i = 0; i < a->length; i++) {
        uint64_t c = gs_int_mod_ui(&a->coeffs[i], p);
        gs_poly_get_term_exps(ex, a, i, e->ctx);
        for (k = 0; k < e->n; k++)
            if (k != v)
                c = gs_nmod_mul(c, gs_nmod_pow(vals[k], ex[k], p), p);
        c = gs_nmod_add(c, gs_nmod_poly_get(r, ex[v]), p);
        gs_nmod_poly_set_coeff(r, ex[v], c, p);
    }
    free(ex);
}

/* A check, separate from the library's code, that a and b are coprime:
   for each shared variable, a point where a keeps its degree and the
   univariate images have a constant gcd (then so has the true gcd).
   Returns 1 when certified, 0 when some variable could not be settled. */
static int certified_coprime(const gs_poly *a, const gs_poly *b,
                             gs_rng *rng, const env *e)
{
    uint64_t *vals = gs_malloc((size_t)e->n * sizeof *vals);
    gs_nmod_poly ia, ib, g;
    int v, k, ok = 1;
    gs_nmod_poly_init(&ia);
    gs_nmod_poly_init(&ib);
    gs_nmod_poly_init(&g);
    for (v = 0; v < e->n && ok; v++) {
        long da = gs_poly_degree(a, v, e->ctx), db = gs_poly_degree(b, v,
                                                                    e->ctx);
        int tries, done = da <= 0 || db <= 0;
        for (tries = 0; !done && tries < 5; tries++) {
            uint64_t p = gs_nmod_random_prime(rng);
            for (k = 0; k < e->n; k++)
                vals[k] = gs_nmod_random_nonzero(rng, p);
            image_in(&ia, a, v, vals, p, e);
            image_in(&ib, b, v, vals, p, e);
            if (gs_nmod_poly_degree(&ia) != da)
                continue;
            gs_nmod_poly_gcd(&g, &ia, &ib, p);
            done = gs_nmod_poly_degree(&g) == 0;
        }
        ok = done;
    }
    gs_nmod_poly_clear(&ia);
    gs_nmod_poly_clear(&ib);
    gs_nmod_poly_clear(&g);
    free(vals);
    return ok;
}

/* g = gcd(a, b) must be associate to want (then also normalised). */
static void check_gcd(const gs_poly *a, const gs_poly *b, const gs_poly *want,
                      const env *e, const char *what, int cs)
{
    gs_poly g;
    int ok;
    gs_poly_init(&g);
    CHECK(gs_poly_gcd(&g, a, b, e->ctx) == GS_OK);
    ok = associates(&g, want, e) && normalised(&g);
    CHECK_MSG(ok, "%s: seed %" PRIu64 " case %d", what, seed, cs);
    if (!ok) {
        dump("a", a, e);
        dump("b", b, e);
        dump("got", &g, e);
        dump("want", want, e);
    }
    gs_poly_clear(&g);
}

/* ---- modular arithmetic ------------------------------------------------- */

static int trial_division_prime(uint64_t n)
{
    uint64_t d;
    if (n < 2)
        return 0;
    for (d = 2; d * d <= n; d++)
        if (n % d == 0)
            return 0;
    return 1;
}

static void test_nmod_primes(void)
{
    gs_rng rng;
    uint64_t n;
    int i;
    /* 2^31 - 1 is prime (Euler 1772); 2^32 - 5 is the largest prime below
       2^32; 2^32 - 1 = 3 * 5 * 17 * 257 * 65537 (Fermat numbers) */
    CHECK(gs_nmod_is_prime(2147483647u));
    CHECK(gs_nmod_is_prime(4294967291u));
    CHECK(!gs_nmod_is_prime(4294967295u));
    /* 2047 = 23 * 89, the smallest strong pseudoprime to base 2, and
       3215031751 = 151 * 751 * 28351, strong to bases 2, 3, 5, 7
       (Pomerance, Selfridge, Wagstaff, Math. Comp. 35, 1980); 561 is the
       smallest Carmichael number */
    CHECK(!gs_nmod_is_prime(2047));
    CHECK(!gs_nmod_is_prime(3215031751u));
    CHECK(!gs_nmod_is_prime(561));
    CHECK(!gs_nmod_is_prime(0) && !gs_nmod_is_prime(1));
    CHECK(gs_nmod_is_prime(2) && gs_nmod_is_prime(3));
    /* against trial division */
    for (n = 0; n < 20000; n++)
        if (gs_nmod_is_prime(n) != trial_division_prime(n)) {
            CHECK_MSG(0, "n = %" PRIu64, n);
            break;
        }
    gs_rng_seed(&rng, seed);
    for (i = 0; i < 200; i++) {
        uint64_t m = (UINT64_C(1) << 31) + gs_rng_below(&rng, 1u << 31);
        CHECK_MSG(gs_nmod_is_prime(m) == trial_division_prime(m),
                  "n = %" PRIu64, m);
    }
    for (i = 0; i < 20; i++) {
        uint64_t p = gs_nmod_random_prime(&rng);
        CHECK(p >= (UINT64_C(1) << 31) && p < (UINT64_C(1) << 32));
        CHECK(trial_division_prime(p));
    }
}

static void test_nmod_arith(void)
{
    gs_rng rng;
    uint64_t p = 4294967291u;
    int i;
    gs_rng_seed(&rng, seed);
    for (i = 0; i < 1000; i++) {
        uint64_t a = gs_nmod_random_nonzero(&rng, p);
        uint64_t b = gs_rng_below(&rng, p);
        /* Fermat's little theorem; a a^-1 = 1; (a + b) - b = a */
        CHECK_MSG(gs_nmod_pow(a, p - 1, p) == 1, "a = %" PRIu64, a);
        CHECK_MSG(gs_nmod_mul(a, gs_nmod_inv(a, p), p) == 1,
                  "a = %" PRIu64, a);
        CHECK(gs_nmod_sub(gs_nmod_add(a, b, p), b, p) == a);
        CHECK(gs_nmod_add(a, gs_nmod_neg(a, p), p) == 0);
    }
    CHECK(gs_nmod_inv(0, p) == 0);
    CHECK(gs_nmod_inv(6, 9) == 0);          /* no inverse: gcd 3 */
    CHECK(gs_nmod_inv(3, 7) == 5);          /* 3 * 5 = 15 = 1 mod 7 */
    CHECK(gs_nmod_pow(2, 10, 1000003) == 1024);
    for (i = 0; i < 1000; i++)
        CHECK(gs_rng_below(&rng, 7) < 7);
}

/* r = prod (z - roots[i]) mod p */
static void from_roots(gs_nmod_poly *r, const uint64_t *roots, int n,
                       uint64_t p)
{
    gs_nmod_poly f;
    int i;
    gs_nmod_poly_init(&f);
    gs_nmod_poly_zero(r);
    gs_nmod_poly_set_coeff(r, 0, 1, p);
    for (i = 0; i < n; i++) {
        gs_nmod_poly_zero(&f);
        gs_nmod_poly_set_coeff(&f, 1, 1, p);
        gs_nmod_poly_set_coeff(&f, 0, gs_nmod_neg(roots[i], p), p);
        gs_nmod_poly_mul(r, r, &f, p);
    }
    gs_nmod_poly_clear(&f);
}

static void test_nmod_poly_gcd(void)
{
    gs_rng rng;
    gs_nmod_poly a, b, g, w, q, r, t;
    uint64_t p = 2147483647u, roots[12];
    int i, k;
    gs_nmod_poly_init(&a);
    gs_nmod_poly_init(&b);
    gs_nmod_poly_init(&g);
    gs_nmod_poly_init(&w);
    gs_nmod_poly_init(&q);
    gs_nmod_poly_init(&r);
    gs_nmod_poly_init(&t);
    gs_rng_seed(&rng, seed);
    /* polynomials split into distinct linear factors: the gcd is the
       product over the shared roots (unique factorisation in F_p[z]) */
    for (i = 0; i < 200; i++) {
        int n = 1 + (int)gs_rng_below(&rng, 12), s = (int)gs_rng_below(&rng,
                                                         (uint64_t)n + 1);
        for (k = 0; k < n; k++)
            roots[k] = gs_rng_below(&rng, p);   /* distinct w.h.p. */
        from_roots(&w, roots, s, p);
        from_roots(&a, roots, n, p);
        from_roots(&b, roots, s, p);
        for (k = 0; k < 3; k++) {
            gs_nmod_poly_zero(&t);
            gs_nmod_poly_set_coeff(&t, 1, 1, p);
            gs_nmod_poly_set_coeff(&t, 0, gs_rng_below(&rng, p), p);
            gs_nmod_poly_mul(&b, &b, &t, p);
        }
        gs_nmod_poly_gcd(&g, &a, &b, p);
        /* b's extra roots avoid a's with probability ~ 1 - 36/p */
        CHECK_MSG(gs_nmod_poly_equal(&g, &w), "seed %" PRIu64 " case %d",
                  seed, i);
        /* division: a = q b + r, deg r < deg b */
        gs_nmod_poly_divrem(&q, &r, &a, &b, p);
        gs_nmod_poly_mul(&t, &q, &b, p);
        for (k = 0; k < r.len; k++)
            gs_nmod_poly_set_coeff(&t, k, gs_nmod_add(gs_nmod_poly_get(&t, k),
                                                      r.c[k], p), p);
        CHECK(gs_nmod_poly_equal(&t, &a));
        CHECK(gs_nmod_poly_degree(&r) < gs_nmod_poly_degree(&b));
    }
    gs_nmod_poly_zero(&a);
    gs_nmod_poly_gcd(&g, &a, &a, p);
    CHECK(g.len == 0);                      /* gcd(0, 0) = 0 */
    gs_nmod_poly_set_coeff(&a, 0, 5, p);
    gs_nmod_poly_gcd(&g, &a, &b, p);        /* a constant: gcd 1 */
    CHECK(g.len == 1 && g.c[0] == 1);
    gs_nmod_poly_clear(&a);
    gs_nmod_poly_clear(&b);
    gs_nmod_poly_clear(&g);
    gs_nmod_poly_clear(&w);
    gs_nmod_poly_clear(&q);
    gs_nmod_poly_clear(&r);
    gs_nmod_poly_clear(&t);
}

static void test_nmod_interp(void)
{
    gs_rng rng;
    gs_nmod_poly f, r;
    uint64_t p = 4294967291u, xs[20], ys[20], v[20], w[20], c[20], d[20];
    int i, n, k, t;
    gs_nmod_poly_init(&f);
    gs_nmod_poly_init(&r);
    gs_rng_seed(&rng, seed);
    for (i = 0; i < 100; i++) {
        n = 1 + (int)gs_rng_below(&rng, 20);
        gs_nmod_poly_zero(&f);
        for (k = 0; k < n; k++)
            gs_nmod_poly_set_coeff(&f, k, gs_rng_below(&rng, p), p);
        for (k = 0; k < n; k++) {
            do
                xs[k] = gs_rng_below(&rng, p);
            while (in_list(xs, k, xs[k]));
            ys[k] = gs_nmod_poly_eval(&f, xs[k], p);
        }
        /* a polynomial of degree < n is fixed by n values (Lagrange) */
        gs_nmod_poly_interpolate(&r, xs, ys, n, p);
        CHECK_MSG(gs_nmod_poly_equal(&r, &f), "seed %" PRIu64 " case %d",
                  seed, i);
        /* transposed Vandermonde: w_t = sum c_j v_j^t */
        for (k = 0; k < n; k++) {
            c[k] = gs_rng_below(&rng, p);
            v[k] = xs[k];
        }
        for (t = 0; t < n; t++) {
            w[t] = 0;
            for (k = 0; k < n; k++)
                w[t] = gs_nmod_add(w[t], gs_nmod_mul(c[k],
                           gs_nmod_pow(v[k], (uint64_t)t, p), p), p);
        }
        CHECK(gs_nmod_vandermonde_solve(d, v, w, n, p) == 0);
        CHECK_MSG(memcmp(c, d, (size_t)n * sizeof *c) == 0,
                  "seed %" PRIu64 " case %d", seed, i);
    }
    v[0] = v[1] = 5;
    w[0] = w[1] = 1;
    CHECK(gs_nmod_vandermonde_solve(d, v, w, 2, p) == -1);
    gs_nmod_poly_clear(&f);
    gs_nmod_poly_clear(&r);
}

/* ---- gcd: fixed cases --------------------------------------------------- */

static void test_gcd_trivial(void)
{
    env e;
    gs_poly a, b, g, w;
    unsigned ex[6] = {0};
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&g);
    gs_poly_init(&w);
    env_init(&e, 3);
    /* gcd(0, 0) = 0 (poly.h) */
    CHECK(gs_poly_gcd(&g, &a, &b, e.ctx) == GS_OK && gs_poly_is_zero(&g));
    /* gcd(-6 x0 - 4, 0) = 3 x0 + 2: primitive part with positive sign */
    ex[0] = 1;
    add_term(&a, -6, ex, &e);
    ex[0] = 0;
    add_term(&a, -4, ex, &e);
    gs_poly_canonicalise(&a, e.ctx);
    {
        int64_t c[2] = {2, 3};
        univ(&w, 0, c, 1, &e);
    }
    check_gcd(&a, &b, &w, &e, "gcd(a, 0)", 0);
    check_gcd(&b, &a, &w, &e, "gcd(0, a)", 0);
    check_gcd(&a, &a, &w, &e, "gcd(a, a)", 0);
    gs_poly_neg(&b, &a, e.ctx);
    check_gcd(&a, &b, &w, &e, "gcd(a, -a)", 0);
    /* constants: the primitive gcd of nonzero constants is 1 */
    gs_poly_set_si(&a, 6, e.ctx);
    gs_poly_set_si(&b, -4, e.ctx);
    gs_poly_set_si(&w, 1, e.ctx);
    check_gcd(&a, &b, &w, &e, "gcd(6, -4)", 0);
    gs_poly_zero(&b);
    check_gcd(&a, &b, &w, &e, "gcd(6, 0)", 0);
    /* monomials: componentwise minimum of the exponents */
    {
        unsigned m[9] = {2, 1, 0, 1, 3, 0, 1, 1, 0};
        int64_t c[3] = {4, 6, 1};
        from_terms(&a, c, m, 1, &e);            /* 4 x0^2 x1 */
        from_terms(&b, c + 1, m + 3, 1, &e);    /* 6 x0 x1^3 */
        from_terms(&w, c + 2, m + 6, 1, &e);    /* x0 x1 */
        check_gcd(&a, &b, &w, &e, "monomials", 0);
    }
    /* a monomial against a polynomial: x0 x1 and x0^2 x2 + x0 x1 x2
       = x0 x2 (x0 + x1) share x0 only */
    {
        unsigned m[12] = {1, 1, 0, 2, 0, 1, 1, 1, 1, 1, 0, 0};
        int64_t c[4] = {1, 1, 1, 1};
        from_terms(&a, c, m, 1, &e);
        from_terms(&b, c, m + 3, 2, &e);
        from_terms(&w, c, m + 9, 1, &e);
        check_gcd(&a, &b, &w, &e, "monomial and polynomial", 0);
    }
    env_clear(&e);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&g);
    gs_poly_clear(&w);
}

/* x^n - 1 in variable v, or x^n - y^n when y >= 0 */
static void xn_minus(gs_poly *r, int v, int y, unsigned n, const env *e)
{
    unsigned *ex = gs_calloc((size_t)e->n, sizeof *ex);
    gs_poly_zero(r);
    ex[v] = n;
    add_term(r, 1, ex, e);
    ex[v] = 0;
    if (y >= 0)
        ex[y] = n;
    add_term(r, -1, ex, e);
    gs_poly_canonicalise(r, e->ctx);
    free(ex);
}

static unsigned ugcd(unsigned a, unsigned b)
{
    while (b) {
        unsigned t = a % b;
        a = b;
        b = t;
    }
    return a;
}

static void test_gcd_univariate(void)
{
    env e;
    gs_poly a, b, w, f;
    unsigned n, m;
    /* Knuth, TAOCP vol. 2, 4.6.1: u = x^8 + x^6 - 3x^4 - 3x^3 + 8x^2 + 2x
       - 5 and v = 3x^6 + 5x^4 - 4x^2 - 9x + 21 are relatively prime (his
       running example for remainder sequences; from memory) */
    int64_t u[9] = {-5, 2, 8, -3, -3, 0, 1, 0, 1};
    int64_t vv[7] = {21, -9, -4, 0, 5, 0, 3};
    int64_t fc[3] = {1, 0, 1};                      /* x^2 + 1 */
    int64_t l1[3] = {-1, 0, 1}, l2[3] = {1, -2, 1}; /* x^2-1, (x-1)^2 */
    int64_t one[1] = {1}, xm1[2] = {-1, 1};
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    gs_poly_init(&f);
    env_init(&e, 2);
    univ(&a, 0, u, 8, &e);
    univ(&b, 0, vv, 6, &e);
    univ(&w, 0, one, 0, &e);
    check_gcd(&a, &b, &w, &e, "Knuth 4.6.1", 0);
    univ(&f, 0, fc, 2, &e);
    gs_poly_mul(&a, &a, &f, e.ctx);
    gs_poly_mul(&b, &b, &f, e.ctx);
    check_gcd(&a, &b, &f, &e, "Knuth 4.6.1 times x^2 + 1", 0);
    /* (x - 1)(x + 1) and (x - 1)^2 */
    univ(&a, 0, l1, 2, &e);
    univ(&b, 0, l2, 2, &e);
    univ(&w, 0, xm1, 1, &e);
    check_gcd(&a, &b, &w, &e, "x^2 - 1, (x - 1)^2", 0);
    /* gcd(x^n - 1, x^m - 1) = x^gcd(n,m) - 1, and homogeneously
       gcd(x^n - y^n, x^m - y^m) = x^g - y^g (classical; e.g. Lidl and
       Niederreiter, Finite Fields, from memory) */
    for (n = 1; n <= 12; n++)
        for (m = 1; m <= 12; m++) {
            xn_minus(&a, 0, -1, n, &e);
            xn_minus(&b, 0, -1, m, &e);
            xn_minus(&w, 0, -1, ugcd(n, m), &e);
            check_gcd(&a, &b, &w, &e, "x^n - 1", (int)(n * 100 + m));
            xn_minus(&a, 1, 0, n, &e);
            xn_minus(&b, 1, 0, m, &e);
            xn_minus(&w, 1, 0, ugcd(n, m), &e);
            check_gcd(&a, &b, &w, &e, "x^n - y^n", (int)(n * 100 + m));
        }
    env_clear(&e);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
    gs_poly_clear(&f);
}

/* ---- gcd: random cases -------------------------------------------------- */

#define NV 30

/* vars[0..*nv-1] = a random subset of 0..n-1 with between lo and hi
   members */
static void rand_subset(int *vars, int *nv, int n, int lo, int hi,
                        gs_rng *rng)
{
    int perm[NV], i;
    for (i = 0; i < n; i++)
        perm[i] = i;
    for (i = n - 1; i > 0; i--) {           /* Fisher-Yates */
        int j = (int)gs_rng_below(rng, (uint64_t)i + 1), t = perm[i];
        perm[i] = perm[j];
        perm[j] = t;
    }
    *nv = lo + (int)gs_rng_below(rng, (uint64_t)(hi - lo + 1));
    for (i = 0; i < *nv; i++)
        vars[i] = perm[i];
}

/* gcd(f l1, f l2) = f for distinct linear forms l1, l2 (irreducible, so
   coprime unless associate). */
static void test_gcd_linear_forms(void)
{
    env e;
    gs_rng rng;
    gs_poly f, l1, l2, a, b, w;
    int vars[NV], nv, i;
    gs_poly_init(&f);
    gs_poly_init(&l1);
    gs_poly_init(&l2);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    env_init(&e, NV);
    gs_rng_seed(&rng, seed);
    for (i = 0; i < 300; i++) {
        rand_subset(vars, &nv, NV, 4, 20, &rng);
        rand_nontrivial(&f, &rng, vars, nv, 2 + (int)gs_rng_below(&rng, 6),
                        i % 3 == 0 ? 2 : 1, 9, &e);
        do {
            rand_linear(&l1, &rng, vars, nv, &e);
            rand_linear(&l2, &rng, vars, nv, &e);
        } while (associates(&l1, &l2, &e));
        gs_poly_mul(&a, &f, &l1, e.ctx);
        gs_poly_mul(&b, &f, &l2, e.ctx);
        gs_poly_primitive(&w, &f, e.ctx);
        check_gcd(&a, &b, &w, &e, "f l1, f l2", i);
    }
    env_clear(&e);
    gs_poly_clear(&f);
    gs_poly_clear(&l1);
    gs_poly_clear(&l2);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
}

/* gcd(f g, f h) = f when g and h live in disjoint sets of variables (a
   common factor would be free of every variable). */
static void test_gcd_disjoint(void)
{
    env e;
    gs_rng rng;
    gs_poly f, g, h, a, b, w;
    int vars[NV], nv, i, k;
    gs_poly_init(&f);
    gs_poly_init(&g);
    gs_poly_init(&h);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    env_init(&e, NV);
    gs_rng_seed(&rng, seed + 1);
    for (i = 0; i < 200; i++) {
        rand_subset(vars, &nv, NV, 10, 30, &rng);
        k = 1 + (int)gs_rng_below(&rng, (uint64_t)nv - 1);
        rand_nontrivial(&f, &rng, vars, nv, 2 + (int)gs_rng_below(&rng, 5),
                        1 + (unsigned)(i % 2), 20, &e);
        rand_nontrivial(&g, &rng, vars, k, 1 + (int)gs_rng_below(&rng, 8),
                        1, 20, &e);
        rand_nontrivial(&h, &rng, vars + k, nv - k,
                        1 + (int)gs_rng_below(&rng, 8), 1, 20, &e);
        gs_poly_mul(&a, &f, &g, e.ctx);
        gs_poly_mul(&b, &f, &h, e.ctx);
        gs_poly_primitive(&w, &f, e.ctx);
        check_gcd(&a, &b, &w, &e, "disjoint cofactors", i);
    }
    env_clear(&e);
    gs_poly_clear(&f);
    gs_poly_clear(&g);
    gs_poly_clear(&h);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
}

/* f, g, h random over overlapping variables: the result must be a
   normalised common divisor, a multiple of f, with cofactors certified
   coprime by evaluation images computed here. */
static void test_gcd_general(void)
{
    env e;
    gs_rng rng;
    gs_poly f, g, h, a, b, r, qa, qb;
    int vars[NV], nv, i, ok;
    gs_poly_init(&f);
    gs_poly_init(&g);
    gs_poly_init(&h);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&r);
    gs_poly_init(&qa);
    gs_poly_init(&qb);
    env_init(&e, NV);
    gs_rng_seed(&rng, seed + 2);
    for (i = 0; i < 200; i++) {
        rand_subset(vars, &nv, NV, 3, 16, &rng);
        rand_nontrivial(&f, &rng, vars, nv, 1 + (int)gs_rng_below(&rng, 6),
                        2, 5, &e);
        rand_nontrivial(&g, &rng, vars, nv, 1 + (int)gs_rng_below(&rng, 6),
                        2, 5, &e);
        rand_nontrivial(&h, &rng, vars, nv, 1 + (int)gs_rng_below(&rng, 6),
                        2, 5, &e);
        gs_poly_mul(&a, &f, &g, e.ctx);
        gs_poly_mul(&b, &f, &h, e.ctx);
        gs_poly_gcd(&r, &a, &b, e.ctx);
        gs_poly_primitive(&f, &f, e.ctx);
        ok = normalised(&r) && divides(&f, &r, &e)
             && gs_poly_divexact(&qa, &a, &r, e.ctx) == GS_OK
             && gs_poly_divexact(&qb, &b, &r, e.ctx) == GS_OK
             && certified_coprime(&qa, &qb, &rng, &e);
        CHECK_MSG(ok, "general: seed %" PRIu64 " case %d", seed, i);
        if (!ok) {
            dump("f", &f, &e);
            dump("g", &g, &e);
            dump("h", &h, &e);
            dump("got", &r, &e);
        }
    }
    env_clear(&e);
    gs_poly_clear(&f);
    gs_poly_clear(&g);
    gs_poly_clear(&h);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&r);
    gs_poly_clear(&qa);
    gs_poly_clear(&qb);
}

/* A pool of pairwise non-associate irreducible multilinear factors; with
   disjoint != 0 each lives in its own block of variables, so that every
   product of distinct factors is multilinear like a circuit determinant. */
#define NF 6
static void factor_pool(gs_poly *F, int nvars, int disjoint, int maxterms,
                        gs_rng *rng, const env *e)
{
    int vars[NV], nv, i, j, again;
    do {
        for (i = 0; i < NF; i++) {
            if (disjoint) {
                int lo = i * nvars / NF, hi = (i + 1) * nvars / NF;
                for (nv = 0; lo + nv < hi; nv++)
                    vars[nv] = lo + nv;
            } else {
                rand_subset(vars, &nv, nvars, 2, nvars < 12 ? nvars : 12,
                            rng);
            }
            rand_irreducible(&F[i], rng, vars[gs_rng_below(rng,
                             (uint64_t)nv)], vars, nv,
                             1 + (int)gs_rng_below(rng,
                                                   (uint64_t)maxterms), e);
        }
        for (again = 0, i = 0; i < NF; i++)
            for (j = 0; j < i; j++)
                again |= associates(&F[i], &F[j], e);
    } while (again);
}

/* a = prod F_i^ea_i, b = prod F_i^eb_i: gcd = prod F_i^min (unique
   factorisation); sometimes times the monomial x0 in both, which the gcd
   keeps, and always times integers 6 and -4, which the primitive gcd
   drops. */
static void pool_case(gs_poly *a, gs_poly *b, gs_poly *w, const gs_poly *F,
                      int maxe, gs_rng *rng, const env *e)
{
    gs_poly x0;
    int i, k;
    gs_poly_init(&x0);
    gs_poly_set_si(a, 6, e->ctx);
    gs_poly_set_si(b, -4, e->ctx);
    gs_poly_set_si(w, 1, e->ctx);
    for (i = 0; i < NF; i++) {
        int ea = (int)gs_rng_below(rng, (uint64_t)maxe + 1);
        int eb = (int)gs_rng_below(rng, (uint64_t)maxe + 1);
        for (k = 0; k < ea; k++)
            gs_poly_mul(a, a, &F[i], e->ctx);
        for (k = 0; k < eb; k++)
            gs_poly_mul(b, b, &F[i], e->ctx);
        for (k = 0; k < (ea < eb ? ea : eb); k++)
            gs_poly_mul(w, w, &F[i], e->ctx);
    }
    if (gs_rng_below(rng, 2)) {
        gs_poly_set_var(&x0, 0, 1, e->ctx);
        gs_poly_mul(a, a, &x0, e->ctx);
        gs_poly_mul(b, b, &x0, e->ctx);
        gs_poly_mul(w, w, &x0, e->ctx);
    }
    gs_poly_primitive(w, w, e->ctx);
    gs_poly_clear(&x0);
}

/* Circuit-like: products of multilinear irreducible factors in 10 to 30
   variables, in disjoint and in overlapping sets of variables. */
static void test_gcd_circuit_like(void)
{
    env e;
    gs_rng rng;
    gs_poly F[NF], a, b, w;
    int i, k;
    for (k = 0; k < NF; k++)
        gs_poly_init(&F[k]);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    env_init(&e, NV);
    gs_rng_seed(&rng, seed + 3);
    for (i = 0; i < 120; i++) {
        int nvars = 12 + (int)gs_rng_below(&rng, NV - 11);
        int disjoint = i % 2 == 0;
        do {                    /* sizes a unit test can afford */
            factor_pool(F, nvars, disjoint, 6, &rng, &e);
            pool_case(&a, &b, &w, F, i % 4 == 1 ? 2 : 1, &rng, &e);
        } while (a.length + b.length > 20000);
        check_gcd(&a, &b, &w, &e, disjoint ? "multilinear, disjoint factors"
                                           : "overlapping factors", i);
    }
    for (k = 0; k < NF; k++)
        gs_poly_clear(&F[k]);
    env_clear(&e);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
}

/* Degree above one in a Laplace-like variable: with s = x0, R = x1,
   C = x2, G = x3, L = x4, the factors 1 + s R C, s C + G and
   s^2 L C + s L G + 1 are irreducible (degree one in R, G and L
   respectively, with coprime coefficients). */
static void test_gcd_laplace(void)
{
    env e;
    gs_poly f1, f2, f3, a, b, w, t;
    unsigned m[5 * 8] = {
        0, 0, 0, 0, 0,   1, 1, 1, 0, 0,           /* 1 + s R C */
        1, 0, 1, 0, 0,   0, 0, 0, 1, 0,           /* s C + G */
        2, 0, 1, 0, 1,   1, 0, 0, 1, 1,   0, 0, 0, 0, 0 /* s^2LC+sLG+1 */
    };
    int64_t c[3] = {1, 1, 1};
    int k;
    gs_poly_init(&f1);
    gs_poly_init(&f2);
    gs_poly_init(&f3);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    gs_poly_init(&t);
    env_init(&e, 5);
    from_terms(&f1, c, m, 2, &e);
    from_terms(&f2, c, m + 10, 2, &e);
    from_terms(&f3, c, m + 20, 3, &e);
    gs_poly_pow_ui(&a, &f1, 3, e.ctx);          /* f1^3 f2 */
    gs_poly_mul(&a, &a, &f2, e.ctx);
    gs_poly_pow_ui(&b, &f1, 2, e.ctx);          /* f1^2 f3 */
    gs_poly_mul(&b, &b, &f3, e.ctx);
    gs_poly_pow_ui(&w, &f1, 2, e.ctx);
    check_gcd(&a, &b, &w, &e, "f1^3 f2, f1^2 f3", 0);
    for (k = 1; k <= 4; k++) {                  /* f1^k f2 f3^2, f3 f2^k */
        gs_poly_pow_ui(&a, &f1, (unsigned long)k, e.ctx);
        gs_poly_mul(&a, &a, &f2, e.ctx);
        gs_poly_pow_ui(&t, &f3, 2, e.ctx);
        gs_poly_mul(&a, &a, &t, e.ctx);
        gs_poly_pow_ui(&b, &f2, (unsigned long)k, e.ctx);
        gs_poly_mul(&b, &b, &f3, e.ctx);
        gs_poly_mul(&w, &f2, &f3, e.ctx);
        check_gcd(&a, &b, &w, &e, "f1^k f2 f3^2, f2^k f3", k);
    }
    env_clear(&e);
    gs_poly_clear(&f1);
    gs_poly_clear(&f2);
    gs_poly_clear(&f3);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
    gs_poly_clear(&t);
}

/* Coefficients far beyond one word: several primes and Chinese
   remaindering are needed to recover f. */
static void test_gcd_big_coeffs(void)
{
    env e;
    gs_rng rng;
    gs_poly f, l1, l2, a, b, w;
    gs_int big;
    int vars[NV], nv, i;
    size_t k;
    gs_poly_init(&f);
    gs_poly_init(&l1);
    gs_poly_init(&l2);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    gs_int_init(&big);
    env_init(&e, 12);
    gs_rng_seed(&rng, seed + 4);
    gs_int_set_str(&big, "1000000000000000000000000000057");
    for (i = 0; i < 40; i++) {
        rand_subset(vars, &nv, 12, 3, 12, &rng);
        rand_nontrivial(&f, &rng, vars, nv, 2 + (int)gs_rng_below(&rng, 4),
                        1, 9, &e);
        for (k = 0; k < f.length; k++)      /* c -> c * big^k + 1 */
            if (k % 2 == 1) {
                gs_int_mul(&f.coeffs[k], &f.coeffs[k], &big);
                gs_int_add_si(&f.coeffs[k], &f.coeffs[k], (int64_t)k);
            }
        do {
            rand_linear(&l1, &rng, vars, nv, &e);
            rand_linear(&l2, &rng, vars, nv, &e);
        } while (associates(&l1, &l2, &e));
        gs_poly_mul(&a, &f, &l1, e.ctx);
        gs_poly_mul(&b, &f, &l2, e.ctx);
        gs_poly_primitive(&w, &f, e.ctx);
        check_gcd(&a, &b, &w, &e, "big coefficients", i);
    }
    env_clear(&e);
    gs_int_clear(&big);
    gs_poly_clear(&f);
    gs_poly_clear(&l1);
    gs_poly_clear(&l2);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
}

/* The subresultant fallback on its own, on small cases with known
   answers (6 variables, factors up to squares); and the rigour of the
   degree bounds: bd[v] >= deg_v gcd always. */
static void test_gcd_fallback_and_bounds(void)
{
    env e;
    gs_rng rng, r2;
    gs_poly F[NF], a, b, w, g, A, B;
    long bd[8];
    int i, k, v;
    for (k = 0; k < NF; k++)
        gs_poly_init(&F[k]);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    gs_poly_init(&g);
    gs_poly_init(&A);
    gs_poly_init(&B);
    env_init(&e, 6);
    gs_rng_seed(&rng, seed + 5);
    gs_rng_seed(&r2, seed + 6);
    for (i = 0; i < 60; i++) {
        factor_pool(F, 6, 0, 3, &rng, &e);
        pool_case(&a, &b, &w, F, i % 3 == 0 ? 2 : 1, &rng, &e);
        gs_pgcd_prs(&g, &a, &b, e.ctx);
        CHECK_MSG(associates(&g, &w, &e) && normalised(&g),
                  "prs: seed %" PRIu64 " case %d", seed, i);
        gs_poly_primitive(&A, &a, e.ctx);
        gs_poly_primitive(&B, &b, e.ctx);
        if (gs_poly_is_const(&A, e.ctx) || gs_poly_is_const(&B, e.ctx))
            continue;
        {
            tab ta, tb;
            pts pt;
            gs_pgcd_tab_init(&ta, &A, e.ctx);
            gs_pgcd_tab_init(&tb, &B, e.ctx);
            gs_pgcd_pts_init(&pt, &ta, &tb, e.n);
            gs_pgcd_degree_bounds(bd, &ta, &tb, &pt, &r2);
            for (v = 0; v < e.n; v++)
                CHECK_MSG(bd[v] >= gs_poly_degree(&w, v, e.ctx),
                          "bounds: seed %" PRIu64 " case %d var %d", seed,
                          i, v);
            gs_pgcd_tab_clear(&ta);
            gs_pgcd_tab_clear(&tb);
            gs_pgcd_pts_clear(&pt);
        }
    }
    for (k = 0; k < NF; k++)
        gs_poly_clear(&F[k]);
    env_clear(&e);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
    gs_poly_clear(&g);
    gs_poly_clear(&A);
    gs_poly_clear(&B);
}

/* The leading coefficient problem: with x = x0, f = x0 x1 + 1 and
   cofactors (x1 + 1) x0 + 2, (x1 + 1) x0 + 3, gamma = gcd of the leading
   coefficients = x1 (x1 + 1) but lc f = x1, so the modular image is
   (x1 + 1) f, which divides neither operand; the content in x0 must go.
   Each factor is of degree one in x0 with coprime coefficients, hence
   irreducible, and the cofactors are coprime (their difference is 1).
   With a second factor x2 x3 - 5 in f, free of x0, the divisor found is
   x0 x1 + 1 alone and the cofactors' gcd supplies the rest. */
static void test_gcd_lead_factor(void)
{
    env e;
    gs_rng rng;
    gs_poly f, f0, u, w, a, b, gam, c, qa, qb, t;
    long bd[4];
    int k, r;
    unsigned m[4 * 6] = {
        1, 1, 0, 0,   0, 0, 0, 0,                 /* x0 x1 + 1 */
        1, 1, 0, 0,   1, 0, 0, 0,   0, 0, 0, 0    /* x0 x1 + x0 + c */
    };
    int64_t cf[2] = {1, 1}, cu[3] = {1, 1, 2}, cw[3] = {1, 1, 3};
    gs_poly_init(&f);
    gs_poly_init(&f0);
    gs_poly_init(&u);
    gs_poly_init(&w);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&gam);
    gs_poly_init(&c);
    gs_poly_init(&qa);
    gs_poly_init(&qb);
    gs_poly_init(&t);
    env_init(&e, 4);
    gs_rng_seed(&rng, seed);
    from_terms(&f, cf, m, 2, &e);
    gs_poly_set(&f0, &f, e.ctx);
    from_terms(&u, cu, m + 8, 3, &e);
    from_terms(&w, cw, m + 8, 3, &e);
    for (k = 0; k < 2; k++) {
        if (k == 1) {           /* again with a factor in x2, x3 */
            unsigned m2[8] = {0, 0, 1, 1, 0, 0, 0, 0};
            int64_t c2[2] = {1, -5};
            from_terms(&t, c2, m2, 2, &e);
            gs_poly_mul(&f, &f, &t, e.ctx);
        }
        gs_poly_mul(&a, &f, &u, e.ctx);
        gs_poly_mul(&b, &f, &w, e.ctx);
        lead_gcd(&gam, &a, &b, 0, e.ctx, &rng);
        CHECK_MSG(gam.length == 2 * (size_t)(k + 1), "gamma: case %d", k);
        for (r = 0; r < 4; r++)
            bd[r] = gs_poly_degree(&f, r, e.ctx);
        r = gs_pgcd_modular_divisor(&c, &qa, &qb, &a, &b, &gam, 0, bd, e.ctx,
                                    &rng);
        CHECK_MSG(r == R_OK && associates(&c, &f0, &e), "case %d", k);
        check_gcd(&a, &b, &f, &e, "leading coefficient problem", k);
    }
    env_clear(&e);
    gs_poly_clear(&f);
    gs_poly_clear(&f0);
    gs_poly_clear(&u);
    gs_poly_clear(&w);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&gam);
    gs_poly_clear(&c);
    gs_poly_clear(&qa);
    gs_poly_clear(&qb);
    gs_poly_clear(&t);
}

/* The output may alias an input; gcd is symmetric. */
static void test_gcd_alias(void)
{
    env e;
    gs_rng rng;
    gs_poly F[NF], a, b, w, c;
    int i, k;
    for (k = 0; k < NF; k++)
        gs_poly_init(&F[k]);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&w);
    gs_poly_init(&c);
    env_init(&e, 10);
    gs_rng_seed(&rng, seed + 7);
    for (i = 0; i < 20; i++) {
        factor_pool(F, 10, i % 2, 6, &rng, &e);
        pool_case(&a, &b, &w, F, 1, &rng, &e);
        check_gcd(&b, &a, &w, &e, "swapped", i);
        gs_poly_set(&c, &a, e.ctx);
        gs_poly_gcd(&c, &c, &b, e.ctx);
        CHECK_MSG(gs_poly_equal(&c, &w, e.ctx), "alias a: case %d", i);
        gs_poly_set(&c, &b, e.ctx);
        gs_poly_gcd(&c, &a, &c, e.ctx);
        CHECK_MSG(gs_poly_equal(&c, &w, e.ctx), "alias b: case %d", i);
    }
    for (k = 0; k < NF; k++)
        gs_poly_clear(&F[k]);
    env_clear(&e);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&w);
    gs_poly_clear(&c);
}

/* The step that looks for the gcd in the variables the degree bounds
   leave: a = g p, b = g q with g = x0 + x1 and p, q in other variables.
   g, p and q are of degree one in some variable with coprime
   coefficients, hence irreducible (Gauss's lemma), and pairwise distinct,
   hence coprime: gcd(a, b) = g. */
static int support_step(gs_poly *g, const char *sa, const char *sb,
                        const env *e)
{
    gs_poly a, b;
    long bd[10];
    tab ta, tb;
    pts pt;
    gs_rng rng;
    int found;
    gs_poly_init(&a);
    gs_poly_init(&b);
    CHECK(gs_poly_set_str(&a, sa, e->ctx) == GS_OK);
    CHECK(gs_poly_set_str(&b, sb, e->ctx) == GS_OK);
    gs_rng_seed(&rng, seed);
    gs_pgcd_tab_init(&ta, &a, e->ctx);
    gs_pgcd_tab_init(&tb, &b, e->ctx);
    gs_pgcd_pts_init(&pt, &ta, &tb, e->n);
    found = gs_pgcd_degree_bounds(bd, &ta, &tb, &pt, &rng) != 0
            && gcd_by_support(g, &a, &b, bd, &ta, &tb, e->ctx, &rng);
    gs_pgcd_tab_clear(&ta);
    gs_pgcd_tab_clear(&tb);
    gs_pgcd_pts_clear(&pt);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    return found;
}

static void test_gcd_small_support(void)
{
    static const char *const cases[][2] = {
        /* found by the support step */
        {"(x0 + x1)*(x2*x3 + x4)*(x9 + 3)",
         "(x0 + x1)*(x5*x6 + x7*x2 + x8)"},
        {"(x0 + x1)*(x2*x3 + 1)", "(x0 + x1)*(x2*x3 + x4)"},
        /* the small coefficients share x0 too: the step must decline */
        {"(x0 + x1)*(x2*x0 + 1)", "(x0 + x1)*(x2*x0 + x1 + 2)"},
    };
    env e;
    gs_poly g, want, a, b;
    size_t i;
    env_init(&e, 10);
    gs_poly_init(&g);
    gs_poly_init(&want);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_set_str(&want, "x0 + x1", e.ctx);
    for (i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        int found = support_step(&g, cases[i][0], cases[i][1], &e);
        CHECK_MSG(found == (i < 2), "case %zu: step taken %d", i, found);
        if (found)
            CHECK_MSG(associates(&g, &want, &e), "case %zu", i);
        gs_poly_set_str(&a, cases[i][0], e.ctx);
        gs_poly_set_str(&b, cases[i][1], e.ctx);
        check_gcd(&a, &b, &want, &e, "small support", (int)i);
    }
    gs_poly_clear(&g);
    gs_poly_clear(&want);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    env_clear(&e);
}

int main(int argc, char **argv)
{
    if (argc > 1)
        seed = strtoull(argv[1], NULL, 10);
    test_nmod_primes();
    test_nmod_arith();
    test_nmod_poly_gcd();
    test_nmod_interp();
    test_gcd_trivial();
    test_gcd_univariate();
    test_gcd_linear_forms();
    test_gcd_disjoint();
    test_gcd_general();
    test_gcd_circuit_like();
    test_gcd_laplace();
    test_gcd_big_coeffs();
    test_gcd_fallback_and_bounds();
    test_gcd_lead_factor();
    test_gcd_alias();
    test_gcd_small_support();
    return check_report("gcd");
}
