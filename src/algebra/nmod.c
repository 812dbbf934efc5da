/* nmod.c - arithmetic modulo word-size primes, dense polynomials mod p.
 * See LICENSE.
 */
#include "algebra/nmod.h"

#include <stdlib.h>
#include <string.h>

#include "base/mem.h"

uint64_t gs_nmod_pow(uint64_t a, uint64_t e, uint64_t p)
{
    uint64_t r = 1 % p;
    a %= p;
    while (e) {
        if (e & 1)
            r = gs_nmod_mul(r, a, p);
        a = gs_nmod_mul(a, a, p);
        e >>= 1;
    }
    return r;
}

uint64_t gs_nmod_inv(uint64_t a, uint64_t p)
{
    /* extended Euclid on (p, a), tracking only the coefficient of a */
    int64_t t0 = 0, t1 = 1;
    uint64_t r0 = p, r1 = a % p;
    while (r1 != 0) {
        uint64_t q = r0 / r1, r2 = r0 - q * r1;
        int64_t t2 = t0 - (int64_t)q * t1;
        r0 = r1;
        r1 = r2;
        t0 = t1;
        t1 = t2;
    }
    if (r0 != 1)
        return 0;
    return t0 < 0 ? (uint64_t)(t0 + (int64_t)p) : (uint64_t)t0;
}

/* one strong-pseudoprime test of odd n > 2 to base b (Miller 1976,
   Rabin 1980) */
static int strong_probable_prime(uint64_t n, uint64_t b)
{
    uint64_t d = n - 1, x;
    int s = 0;
    if (b % n == 0)
        return 1;
    while ((d & 1) == 0) {
        d >>= 1;
        s++;
    }
    x = gs_nmod_pow(b, d, n);
    if (x == 1 || x == n - 1)
        return 1;
    while (--s > 0) {
        x = gs_nmod_mul(x, x, n);
        if (x == n - 1)
            return 1;
    }
    return 0;
}

int gs_nmod_is_prime(uint64_t n)
{
    /* bases 2, 7, 61 decide every n < 4759123141 (Jaeschke 1993, "On
       strong pseudoprimes to several bases", Math. Comp. 61) */
    static const uint64_t bases[3] = {2, 7, 61};
    int i;
    if (n < 2)
        return 0;
    if (n < 4)
        return 1;
    if ((n & 1) == 0)
        return 0;
    for (i = 0; i < 3; i++)
        if (!strong_probable_prime(n, bases[i]))
            return 0;
    return 1;
}

uint64_t gs_nmod_random_prime(gs_rng *r)
{
    /* primes near 2^31 are about 1 in 22 numbers (prime number theorem),
       so a few dozen tests on average */
    for (;;) {
        uint64_t n = (UINT64_C(1) << 31) + gs_rng_below(r, UINT64_C(1) << 31);
        n |= 1;
        if (gs_nmod_is_prime(n))
            return n;
    }
}

uint64_t gs_nmod_random_nonzero(gs_rng *r, uint64_t p)
{
    return 1 + gs_rng_below(r, p - 1);
}

void gs_nmod_poly_init(gs_nmod_poly *a)
{
    a->c = NULL;
    a->len = 0;
    a->alloc = 0;
}

void gs_nmod_poly_clear(gs_nmod_poly *a)
{
    gs_free(a->c);
    gs_nmod_poly_init(a);
}

static void gs_nmod_poly_swap(gs_nmod_poly *a, gs_nmod_poly *b)
{
    gs_nmod_poly t = *a;
    *a = *b;
    *b = t;
}

/* room for n coefficients; the value is unchanged */
static void gs_nmod_poly_fit(gs_nmod_poly *a, long n)
{
    if (n > a->alloc) {
        long m = a->alloc * 2 > n ? a->alloc * 2 : n;
        a->c = gs_reallocarray(a->c, (size_t)m, sizeof *a->c);
        a->alloc = m;
    }
}

static void gs_nmod_poly_set(gs_nmod_poly *r, const gs_nmod_poly *a)
{
    if (r == a)
        return;
    gs_nmod_poly_fit(r, a->len);
    if (a->len > 0)
        memcpy(r->c, a->c, (size_t)a->len * sizeof *a->c);
    r->len = a->len;
}

void gs_nmod_poly_zero(gs_nmod_poly *a)
{
    a->len = 0;
}

void gs_nmod_poly_zero_len(gs_nmod_poly *a, long n)
{
    gs_nmod_poly_fit(a, n);
    if (n > 0)
        memset(a->c, 0, (size_t)n * sizeof *a->c);
    a->len = n;
}

void gs_nmod_poly_normalise(gs_nmod_poly *a)
{
    while (a->len > 0 && a->c[a->len - 1] == 0)
        a->len--;
}

uint64_t gs_nmod_poly_get(const gs_nmod_poly *a, long i)
{
    return i >= 0 && i < a->len ? a->c[i] : 0;
}

void gs_nmod_poly_set_coeff(gs_nmod_poly *a, long i, uint64_t v, uint64_t p)
{
    v %= p;
    if (i >= a->len) {
        long k;
        if (v == 0)
            return;
        gs_nmod_poly_fit(a, i + 1);
        for (k = a->len; k < i; k++)
            a->c[k] = 0;
        a->len = i + 1;
    }
    a->c[i] = v;
    gs_nmod_poly_normalise(a);
}

int gs_nmod_poly_equal(const gs_nmod_poly *a, const gs_nmod_poly *b)
{
    return a->len == b->len
           && (a->len == 0
               || memcmp(a->c, b->c, (size_t)a->len * sizeof *a->c) == 0);
}

uint64_t gs_nmod_poly_eval(const gs_nmod_poly *a, uint64_t z, uint64_t p)
{
    uint64_t v = 0;
    long i;
    for (i = a->len - 1; i >= 0; i--)      /* Horner */
        v = gs_nmod_add(gs_nmod_mul(v, z, p), a->c[i], p);
    return v;
}

void gs_nmod_poly_scale(gs_nmod_poly *r, const gs_nmod_poly *a, uint64_t s,
                        uint64_t p)
{
    long i;
    s %= p;
    if (s == 0) {
        r->len = 0;
        return;
    }
    gs_nmod_poly_set(r, a);
    for (i = 0; i < r->len; i++)
        r->c[i] = gs_nmod_mul(r->c[i], s, p);
}

void gs_nmod_poly_mul(gs_nmod_poly *r, const gs_nmod_poly *a,
                      const gs_nmod_poly *b, uint64_t p)
{
    gs_nmod_poly t;
    long i, j;
    if (a->len == 0 || b->len == 0) {
        r->len = 0;
        return;
    }
    gs_nmod_poly_init(&t);
    gs_nmod_poly_zero_len(&t, a->len + b->len - 1);
    for (i = 0; i < a->len; i++)
        for (j = 0; j < b->len; j++)
            t.c[i + j] = gs_nmod_add(t.c[i + j],
                                     gs_nmod_mul(a->c[i], b->c[j], p), p);
    gs_nmod_poly_normalise(&t);
    gs_nmod_poly_set(r, &t);
    gs_nmod_poly_clear(&t);
}

void gs_nmod_poly_divrem(gs_nmod_poly *q, gs_nmod_poly *r,
                         const gs_nmod_poly *a, const gs_nmod_poly *b,
                         uint64_t p)
{
    long db = b->len - 1, i, j;
    uint64_t inv = gs_nmod_inv(b->c[db], p);
    gs_nmod_poly_set(r, a);
    if (q != NULL)
        gs_nmod_poly_zero_len(q, a->len > db ? a->len - db : 0);
    /* schoolbook long division, top coefficient first */
    for (i = r->len - 1; i >= db; i--) {
        uint64_t f = gs_nmod_mul(r->c[i], inv, p);
        if (q != NULL)
            q->c[i - db] = f;
        if (f == 0)
            continue;
        for (j = 0; j <= db; j++)
            r->c[i - db + j] = gs_nmod_sub(r->c[i - db + j],
                                           gs_nmod_mul(f, b->c[j], p), p);
    }
    if (r->len > db)
        r->len = db;
    gs_nmod_poly_normalise(r);
    if (q != NULL)
        gs_nmod_poly_normalise(q);
}

/* r = a scaled to leading coefficient 1 (zero stays zero) */
static void gs_nmod_poly_make_monic(gs_nmod_poly *r, const gs_nmod_poly *a,
                                    uint64_t p)
{
    if (a->len == 0) {
        r->len = 0;
        return;
    }
    gs_nmod_poly_scale(r, a, gs_nmod_inv(a->c[a->len - 1], p), p);
}

void gs_nmod_poly_gcd(gs_nmod_poly *g, const gs_nmod_poly *a,
                      const gs_nmod_poly *b, uint64_t p)
{
    gs_nmod_poly r0, r1, r2;
    gs_nmod_poly_init(&r0);
    gs_nmod_poly_init(&r1);
    gs_nmod_poly_init(&r2);
    gs_nmod_poly_set(&r0, a);
    gs_nmod_poly_set(&r1, b);
    while (r1.len > 0) {        /* Euclid: (r0, r1) <- (r1, r0 mod r1) */
        gs_nmod_poly_divrem(NULL, &r2, &r0, &r1, p);
        gs_nmod_poly_swap(&r0, &r1);
        gs_nmod_poly_swap(&r1, &r2);
    }
    gs_nmod_poly_make_monic(g, &r0, p);
    gs_nmod_poly_clear(&r0);
    gs_nmod_poly_clear(&r1);
    gs_nmod_poly_clear(&r2);
}

void gs_nmod_poly_interpolate(gs_nmod_poly *r, const uint64_t *xs,
                              const uint64_t *ys, long n, uint64_t p)
{
    uint64_t *d = gs_malloc((size_t)(n > 0 ? n : 1) * sizeof *d);
    long i, j;
    if (n > 0)
        memcpy(d, ys, (size_t)n * sizeof *d);
    /* divided differences: d[i] = f[x0..xi] (Newton's form) */
    for (j = 1; j < n; j++)
        for (i = n - 1; i >= j; i--) {
            uint64_t num = gs_nmod_sub(d[i], d[i - 1], p);
            uint64_t den = gs_nmod_sub(xs[i], xs[i - j], p);
            d[i] = gs_nmod_mul(num, gs_nmod_inv(den, p), p);
        }
    /* expand d[0] + (z-x0)(d[1] + (z-x1)(d[2] + ...)) from the inside */
    gs_nmod_poly_zero_len(r, n);
    for (i = n - 1; i >= 0; i--) {
        /* r = r * (z - xs[i]) + d[i] */
        for (j = n - 1; j > 0; j--)
            r->c[j] = gs_nmod_sub(r->c[j - 1], gs_nmod_mul(r->c[j], xs[i], p),
                                  p);
        r->c[0] = gs_nmod_add(gs_nmod_neg(gs_nmod_mul(r->c[0], xs[i], p), p),
                              d[i], p);
    }
    gs_nmod_poly_normalise(r);
    gs_free(d);
}

int gs_nmod_vandermonde_solve(uint64_t *c, const uint64_t *v,
                              const uint64_t *w, long n, uint64_t p)
{
    /* M(z) = prod (z - v[j]); c[j] = (sum_t q_t w[t]) / q(v[j]) with
       q = M / (z - v[j]), since q vanishes at every other node. */
    uint64_t *m = gs_malloc((size_t)(n + 1) * sizeof *m);
    uint64_t *q = gs_malloc((size_t)(n > 0 ? n : 1) * sizeof *q);
    long i, j, t;
    int rc = 0;
    m[0] = 1;
    for (i = 0; i < n; i++) {       /* m = m * (z - v[i]) */
        m[i + 1] = m[i];
        for (j = i; j > 0; j--)
            m[j] = gs_nmod_sub(m[j - 1], gs_nmod_mul(m[j], v[i], p), p);
        m[0] = gs_nmod_neg(gs_nmod_mul(m[0], v[i], p), p);
    }
    for (j = 0; j < n && rc == 0; j++) {
        uint64_t s = 0, den = 0;
        q[n - 1] = 1;               /* synthetic division by z - v[j] */
        for (t = n - 1; t > 0; t--)
            q[t - 1] = gs_nmod_add(m[t], gs_nmod_mul(v[j], q[t], p), p);
        for (t = n - 1; t >= 0; t--) {
            s = gs_nmod_add(s, gs_nmod_mul(q[t], w[t], p), p);
            den = gs_nmod_add(gs_nmod_mul(den, v[j], p), q[t], p);
        }
        if (den == 0)
            rc = -1;
        else
            c[j] = gs_nmod_mul(s, gs_nmod_inv(den, p), p);
    }
    gs_free(m);
    gs_free(q);
    return rc;
}
