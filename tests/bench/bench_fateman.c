/* bench_fateman.c - Fateman's sparse multiplication benchmark. See LICENSE.
 *
 * f = (1 + x + y + z + t)^20, p = f (f + 1) (R. Fateman, "Comparing the
 * speed of programs for sparse polynomial multiplication", SIGSAM
 * Bulletin 37(1), 2003).  p has 135751 terms: every monomial of total
 * degree <= 40 in 4 variables, C(44, 4) of them (stars and bars).
 * Prints "bench fateman terms=N seconds=S peak_kib=K", S the median of
 * three timings of the product alone; exits 1 if a check fails.
 */
#include "algebra/poly.h"
#include "algebra/sym.h"

#include <stdio.h>
#include <stdlib.h>
#include <sys/resource.h>
#include <time.h>

static double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* n! */
static void factorial(gs_int *r, unsigned n)
{
    unsigned k;
    gs_int_set_si(r, 1);
    for (k = 2; k <= n; k++)
        gs_int_mul_si(r, r, (int64_t)k);
}

/* Multinomial theorem: the coefficient of x^a y^b z^c t^d in
   (1 + x + y + z + t)^40 is 40! / (a! b! c! d! (40-a-b-c-d)!). */
static void multinomial(gs_int *r, const unsigned *e)
{
    gs_int f;
    unsigned k, rest = 40;
    gs_int_init(&f);
    factorial(r, 40);
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

static int check(const gs_poly *p, const gs_polyctx *ctx)
{
    /* degree > 20, so only f^2 contributes; then x^40 and the constant
       term (1 from f^2 plus 1 from f) */
    static const unsigned mono[3][4] = {
        { 10, 10, 10, 5 }, { 40, 0, 0, 0 }, { 0, 0, 0, 0 }
    };
    gs_int want, got;
    int ok = p->length == 135751 && sorted_desc(p, ctx), k;
    gs_int_init(&want);
    gs_int_init(&got);
    for (k = 0; k < 3; k++) {
        if (k == 0)
            multinomial(&want, mono[0]);
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

int main(void)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    gs_poly f, g, p;
    double t[3], tmp;
    struct rusage ru;
    int k, ok;
    gs_symtab_intern(st, "x");
    gs_symtab_intern(st, "y");
    gs_symtab_intern(st, "z");
    gs_symtab_intern(st, "t");
    ctx = gs_polyctx_new(st, 4);
    gs_poly_init(&f);
    gs_poly_init(&g);
    gs_poly_init(&p);
    gs_poly_set_str(&f, "1 + x + y + z + t", ctx);
    gs_poly_pow_ui(&f, &f, 20, ctx);
    gs_poly_set_si(&g, 1, ctx);
    gs_poly_add(&g, &f, &g, ctx);
    for (k = 0; k < 3; k++) {
        double t0 = now();
        gs_poly_mul(&p, &f, &g, ctx);
        t[k] = now() - t0;
        if (k < 2)
            gs_poly_zero(&p);
    }
    if (t[0] > t[1]) { tmp = t[0]; t[0] = t[1]; t[1] = tmp; }
    if (t[1] > t[2]) { tmp = t[1]; t[1] = t[2]; t[2] = tmp; }
    if (t[0] > t[1]) { tmp = t[0]; t[0] = t[1]; t[1] = tmp; }
    ok = check(&p, ctx);
    getrusage(RUSAGE_SELF, &ru);
    printf("bench fateman terms=%zu seconds=%.3f peak_kib=%ld\n", p.length,
           t[1], (long)ru.ru_maxrss);
    gs_poly_clear(&f);
    gs_poly_clear(&g);
    gs_poly_clear(&p);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
    return ok ? 0 : 1;
}
