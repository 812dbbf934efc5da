/* bench_fateman.c - Fateman's sparse multiplication benchmark. See LICENSE.
 *
 * f = (1 + x + y + z + t)^n, p = f (f + 1) (R. Fateman, "Comparing the
 * speed of programs for sparse polynomial multiplication", SIGSAM
 * Bulletin 37(1), 2003).  p has every monomial of total degree <= 2n in
 * 4 variables, C(2n + 4, 4) of them (stars and bars): 135751 for n = 20.
 * n = 20 is the published size; at n = 30 the coefficients of f still
 * fit 64 bits but the sums of their products pass 128 bits.
 *
 * usage: bench_fateman [N ...]   (default: 20 30)
 * Prints "bench fateman terms=T seconds=S peak_kib=K" for n = 20 and
 * "bench fateman-nN ..." for other n, S the median of three timings of
 * the product alone, K the peak of the process so far; exits 1 if a
 * check fails.
 */
#include "algebra/poly.h"
#include "algebra/sym.h"

#include <stdio.h>
#include <stdlib.h>
#include <sys/resource.h>
#include <time.h>
#include "benchlib.h"

/* n! */
static void factorial(gs_int *r, unsigned n)
{
    unsigned k;
    gs_int_set_si(r, 1);
    for (k = 2; k <= n; k++)
        gs_int_mul_si(r, r, (int64_t)k);
}

/* Multinomial theorem: the coefficient of x^a y^b z^c t^d in
   (1 + x + y + z + t)^d2 is d2! / (a! b! c! d! (d2-a-b-c-d)!). */
static void multinomial(gs_int *r, const unsigned *e, unsigned d2)
{
    gs_int f;
    unsigned k, rest = d2;
    gs_int_init(&f);
    factorial(r, d2);
    for (k = 0; k < 4; k++) {
        factorial(&f, e[k]);
        gs_int_divexact(r, r, &f);
        rest -= e[k];
    }
    factorial(&f, rest);
    gs_int_divexact(r, r, &f);
    gs_int_clear(&f);
}

/* the coefficient of the monomial e in p, 0 if absent */
static void coeff_of(gs_int *r, const gs_poly *p, const unsigned *e,
                     const gs_polyctx *ctx)
{
    size_t i;
    unsigned got[4];
    gs_int_set_si(r, 0);
    for (i = 0; i < p->length; i++) {
        gs_poly_get_term_exps(got, p, i, ctx);
        if (got[0] == e[0] && got[1] == e[1] && got[2] == e[2]
            && got[3] == e[3]) {
            gs_int_set(r, &p->coeffs[i]);
            return;
        }
    }
}

static int sorted_desc(const gs_poly *p, const gs_polyctx *ctx)
{
    size_t i, w, nw = (size_t)ctx->nwords;
    for (i = 1; i < p->length; i++) {
        const uint64_t *x = p->exps + (i - 1) * nw, *y = x + nw;
        for (w = 0; w < nw && x[w] == y[w]; w++)
            ;
        if (w == nw || x[w] < y[w])
            return 0;
    }
    return 1;
}

/* C(2n + 4, 4), stars and bars */
static size_t term_count(unsigned n)
{
    size_t m = 2 * (size_t)n;
    return (m + 4) * (m + 3) * (m + 2) * (m + 1) / 24;
}

/* p at x = sx, y = z = t = 1 (sx = +-1) against f = (sx + 4)^n there:
   p = f (f + 1), 5^n (5^n + 1) or 3^n (3^n + 1).  Every coefficient
   enters, so one wrong coefficient anywhere shows. */
static int check_sum(const gs_poly *p, unsigned n, int sx,
                     const gs_polyctx *ctx)
{
    gs_int want, sum, one;
    unsigned e[4];
    size_t i;
    int ok;
    gs_int_init(&want);
    gs_int_init(&sum);
    gs_int_init(&one);
    gs_int_set_si(&want, sx + 4);
    gs_int_pow_ui(&want, &want, n);
    gs_int_set_si(&one, 1);
    gs_int_add(&one, &want, &one);
    gs_int_mul(&want, &want, &one);
    for (i = 0; i < p->length; i++) {
        gs_poly_get_term_exps(e, p, i, ctx);
        if (sx < 0 && (e[0] & 1))
            gs_int_sub(&sum, &sum, &p->coeffs[i]);
        else
            gs_int_add(&sum, &sum, &p->coeffs[i]);
    }
    ok = gs_int_equal(&want, &sum);
    if (!ok)
        fprintf(stderr, "bench_fateman: sum of coefficients at x = %d\n",
                sx);
    gs_int_clear(&want);
    gs_int_clear(&sum);
    gs_int_clear(&one);
    return ok;
}

static int check(const gs_poly *p, unsigned n, const gs_polyctx *ctx)
{
    /* degree 7n/4 > n, so only f^2 contributes; then x^2n and the
       constant term (1 from f^2 plus 1 from f) */
    const unsigned mono[3][4] = {
        { n / 2, n / 2, n / 2, n - n / 2 - n / 4 }, { 2 * n, 0, 0, 0 },
        { 0, 0, 0, 0 }
    };
    gs_int want, got;
    int ok = p->length == term_count(n) && sorted_desc(p, ctx)
             && check_sum(p, n, 1, ctx) && check_sum(p, n, -1, ctx), k;
    gs_int_init(&want);
    gs_int_init(&got);
    for (k = 0; k < 3; k++) {
        if (k == 0)
            multinomial(&want, mono[0], 2 * n);
        else
            gs_int_set_si(&want, k == 1 ? 1 : 2);
        coeff_of(&got, p, mono[k], ctx);
        if (!gs_int_equal(&want, &got)) {
            char *a = gs_int_get_str(&want), *b = gs_int_get_str(&got);
            fprintf(stderr, "bench_fateman: coefficient %d: want %s got %s\n",
                    k, a, b);
            free(a);
            free(b);
            ok = 0;
        }
    }
    gs_int_clear(&want);
    gs_int_clear(&got);
    return ok;
}

/* Times f (f + 1) for f = (1 + x + y + z + t)^n and prints its line. */
static int run(unsigned n, const gs_polyctx *ctx)
{
    gs_poly f, g, p;
    double t[3], tmp;
    struct rusage ru;
    char name[32];
    int k, ok;
    gs_poly_init(&f);
    gs_poly_init(&g);
    gs_poly_init(&p);
    gs_poly_set_str(&f, "1 + x + y + z + t", ctx);
    gs_poly_pow_ui(&f, &f, n, ctx);
    gs_poly_set_si(&g, 1, ctx);
    gs_poly_add(&g, &f, &g, ctx);
    for (k = 0; k < 3; k++) {
        double t0 = bench_now();
        gs_poly_mul(&p, &f, &g, ctx);
        t[k] = bench_now() - t0;
        if (k < 2)
            gs_poly_zero(&p);
    }
    if (t[0] > t[1]) { tmp = t[0]; t[0] = t[1]; t[1] = tmp; }
    if (t[1] > t[2]) { tmp = t[1]; t[1] = t[2]; t[2] = tmp; }
    if (t[0] > t[1]) { tmp = t[0]; t[0] = t[1]; t[1] = tmp; }
    ok = check(&p, n, ctx);
    getrusage(RUSAGE_SELF, &ru);
    if (n == 20)
        snprintf(name, sizeof name, "fateman");
    else
        snprintf(name, sizeof name, "fateman-n%u", n);
    printf("bench %s terms=%zu seconds=%.3f peak_kib=%ld\n", name, p.length,
           t[1], (long)ru.ru_maxrss);
    fflush(stdout);
    gs_poly_clear(&f);
    gs_poly_clear(&g);
    gs_poly_clear(&p);
    return ok;
}

int main(int argc, char **argv)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    int k, ok = 1;
    gs_symtab_intern(st, "x");
    gs_symtab_intern(st, "y");
    gs_symtab_intern(st, "z");
    gs_symtab_intern(st, "t");
    ctx = gs_polyctx_new(st, 4);
    if (argc < 2) {
        ok &= run(20, ctx);
        ok &= run(30, ctx);
    }
    for (k = 1; k < argc; k++) {
        long n = strtol(argv[k], NULL, 10);
        if (n < 4 || n > 1000) {
            fprintf(stderr, "bench_fateman: n must be 4 .. 1000\n");
            return 2;
        }
        ok &= run((unsigned)n, ctx);
    }
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
    return ok ? 0 : 1;
}
