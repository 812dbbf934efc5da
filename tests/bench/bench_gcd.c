/* bench_gcd.c - multivariate gcd on sparse, circuit-like inputs. See LICENSE.
 *
 * The problems, all from fixed seeds (x0, x1, ... are the variables):
 *
 *   coprime-ml24   a = F1 F2 F3 F4 and b = F5 F6 F7 F8, each F an
 *                  irreducible multilinear factor over its own block of 6
 *                  of 24 variables, the blocks of b shifted by 3 against
 *                  those of a: two large multilinear polynomials in the
 *                  same 24 variables, coprime (distinct irreducibles).
 *   coprime-ml32   the same with 4 blocks of 8 of 32 variables each side
 *                  (factors of 8 and of 6 more terms respectively).
 *   common-f12     a = f g, b = f h with f, g, h random sparse
 *                  multilinear polynomials of 8 terms in 12 variables.
 *   common-f20     the same with 12 terms in 20 variables.
 *   linear-f30     a = f l1, b = f l2 with f random sparse in 30
 *                  variables (25 terms, degree <= 2 in each), l1, l2
 *                  linear forms: gcd = f.
 *   shared-ml16    a = F1 F2 F3, b = F1 F2 F4, irreducible multilinear
 *                  factors over overlapping sets of 16 variables:
 *                  gcd = F1 F2.
 *
 * Each prints "bench gcd-NAME terms_a=A terms_b=B terms_gcd=G seconds=S",
 * S the median of 5 timings of gs_poly_gcd alone.  With "--dump FILE" it
 * also writes the inputs and the gcd found, one term a line ("c e0 e1
 * ..."), for tests/bench/gcd_sympy.py to compute the same gcds.
 */
#include "algebra/nmod.h"
#include "algebra/poly.h"
#include "algebra/sym.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>
#include "benchlib.h"

#define RUNS 5
#define MAXV 32

static void add_term(gs_poly *r, int64_t c, const unsigned *ex,
                     const gs_polyctx *ctx)
{
    gs_int k;
    gs_int_init(&k);
    gs_int_set_si(&k, c);
    gs_poly_push_term(r, &k, ex, ctx);
    gs_int_clear(&k);
}

static int64_t rand_coeff(gs_rng *rng, int cmax)
{
    int64_t c = 1 + (int64_t)gs_rng_below(rng, (uint64_t)cmax);
    return gs_rng_below(rng, 2) ? c : -c;
}

/* nt random terms over variables lo .. hi-1, each present with
   probability 1/3, exponents up to dmax */
static void rand_poly(gs_poly *r, gs_rng *rng, int lo, int hi, int nt,
                      unsigned dmax, const gs_polyctx *ctx)
{
    unsigned ex[MAXV];
    int i, v;
    gs_poly_zero(r);
    for (i = 0; i < nt; i++) {
        memset(ex, 0, sizeof ex);
        for (v = lo; v < hi; v++)
            if (gs_rng_below(rng, 3) == 0)
                ex[v] = 1 + (unsigned)gs_rng_below(rng, dmax);
        add_term(r, rand_coeff(rng, 9), ex, ctx);
    }
    gs_poly_canonicalise(r, ctx);
}

/* c x_lo m + b over variables lo .. hi-1 (wrapping mod n): m a product
   of one other variable, b multilinear in the rest with constant term 1;
   gcd(c m, b) = 1, so irreducible */
static void rand_factor(gs_poly *r, gs_rng *rng, int lo, int len, int n,
                        int nt, const gs_polyctx *ctx)
{
    unsigned ex[MAXV] = {0};
    int i, k;
    gs_poly_zero(r);
    ex[lo % n] = 1;
    ex[(lo + 1) % n] = 1;
    add_term(r, rand_coeff(rng, 5), ex, ctx);
    memset(ex, 0, sizeof ex);
    add_term(r, 1, ex, ctx);
    for (i = 0; i < nt; i++) {
        int used = 0;
        memset(ex, 0, sizeof ex);
        for (k = 1; k < len; k++)
            if (gs_rng_below(rng, 3) == 0) {
                ex[(lo + k) % n] = 1;
                used = 1;
            }
        if (used)
            add_term(r, rand_coeff(rng, 9), ex, ctx);
    }
    gs_poly_canonicalise(r, ctx);
}

static void dump_poly(FILE *f, const char *tag, const gs_poly *a,
                      const gs_polyctx *ctx)
{
    unsigned ex[MAXV];
    size_t i;
    int v;
    fprintf(f, "%s %zu\n", tag, a->length);
    for (i = 0; i < a->length; i++) {
        char *c = gs_int_get_str(&a->coeffs[i]);
        gs_poly_get_term_exps(ex, a, i, ctx);
        fputs(c, f);
        for (v = 0; v < ctx->nvars; v++)
            fprintf(f, " %u", ex[v]);
        fputc('\n', f);
        free(c);
    }
}

/* time gs_poly_gcd, print the line, dump if asked */
static void run(const char *name, const gs_poly *a, const gs_poly *b,
                const gs_polyctx *ctx, FILE *dump)
{
    double t[RUNS];
    gs_poly g;
    int k;
    gs_poly_init(&g);
    for (k = 0; k < RUNS; k++) {
        double t0 = bench_now();
        gs_poly_gcd(&g, a, b, ctx);
        t[k] = bench_now() - t0;
    }
    qsort(t, RUNS, sizeof *t, bench_cmp_double);
    printf("bench gcd-%s terms_a=%zu terms_b=%zu terms_gcd=%zu seconds=%.6f\n",
           name, a->length, b->length, g.length, t[RUNS / 2]);
    fflush(stdout);
    if (dump != NULL) {
        fprintf(dump, "case %s %d\n", name, ctx->nvars);
        dump_poly(dump, "a", a, ctx);
        dump_poly(dump, "b", b, ctx);
        dump_poly(dump, "g", &g, ctx);
    }
    gs_poly_clear(&g);
}

/* coprime-mlN: blocks of len variables, b's shifted by len / 2 */
static void case_coprime(const char *name, int n, int len, int nt,
                         uint64_t seed, const gs_polyctx *ctx, FILE *dump)
{
    gs_rng rng;
    gs_poly a, b, f;
    int k;
    gs_rng_seed(&rng, seed);
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_init(&f);
    gs_poly_set_si(&a, 1, ctx);
    gs_poly_set_si(&b, 1, ctx);
    for (k = 0; k < n; k += len) {
        rand_factor(&f, &rng, k, len, n, nt, ctx);
        gs_poly_mul(&a, &a, &f, ctx);
        rand_factor(&f, &rng, k + len / 2, len, n, nt, ctx);
        gs_poly_mul(&b, &b, &f, ctx);
    }
    run(name, &a, &b, ctx, dump);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
    gs_poly_clear(&f);
}

/* common-fN: f g and f h, all random sparse over n variables */
static void case_common(const char *name, int n, int nt, unsigned dmax,
                        uint64_t seed, const gs_polyctx *ctx, FILE *dump)
{
    gs_rng rng;
    gs_poly f, g, h, a, b;
    gs_rng_seed(&rng, seed);
    gs_poly_init(&f);
    gs_poly_init(&g);
    gs_poly_init(&h);
    gs_poly_init(&a);
    gs_poly_init(&b);
    rand_poly(&f, &rng, 0, n, nt, dmax, ctx);
    rand_poly(&g, &rng, 0, n, nt, 1, ctx);
    rand_poly(&h, &rng, 0, n, nt, 1, ctx);
    gs_poly_mul(&a, &f, &g, ctx);
    gs_poly_mul(&b, &f, &h, ctx);
    run(name, &a, &b, ctx, dump);
    gs_poly_clear(&f);
    gs_poly_clear(&g);
    gs_poly_clear(&h);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
}

/* linear-f30: f l1 and f l2 */
static void case_linear(const char *name, int n, uint64_t seed,
                        const gs_polyctx *ctx, FILE *dump)
{
    gs_rng rng;
    gs_poly f, l, a, b;
    unsigned ex[MAXV] = {0};
    int k;
    gs_rng_seed(&rng, seed);
    gs_poly_init(&f);
    gs_poly_init(&l);
    gs_poly_init(&a);
    gs_poly_init(&b);
    rand_poly(&f, &rng, 0, n, 25, 2, ctx);
    for (k = 0; k < 2; k++) {           /* 1 + x_k + 2 x_(k+7) - x_(k+19) */
        gs_poly_zero(&l);
        add_term(&l, 1, ex, ctx);
        ex[k] = 1;
        add_term(&l, 1, ex, ctx);
        ex[k] = 0;
        ex[k + 7] = 1;
        add_term(&l, 2, ex, ctx);
        ex[k + 7] = 0;
        ex[k + 19] = 1;
        add_term(&l, -1, ex, ctx);
        ex[k + 19] = 0;
        gs_poly_canonicalise(&l, ctx);
        gs_poly_mul(k == 0 ? &a : &b, &f, &l, ctx);
    }
    run(name, &a, &b, ctx, dump);
    gs_poly_clear(&f);
    gs_poly_clear(&l);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
}

/* shared-ml16: F1 F2 F3 and F1 F2 F4 over overlapping variable sets */
static void case_shared(const char *name, uint64_t seed,
                        const gs_polyctx *ctx, FILE *dump)
{
    gs_rng rng;
    gs_poly F[4], a, b;
    int k;
    gs_rng_seed(&rng, seed);
    for (k = 0; k < 4; k++) {
        gs_poly_init(&F[k]);
        rand_factor(&F[k], &rng, 4 * k, 8, 16, 10, ctx);
    }
    gs_poly_init(&a);
    gs_poly_init(&b);
    gs_poly_mul(&a, &F[0], &F[1], ctx);
    gs_poly_mul(&b, &a, &F[3], ctx);
    gs_poly_mul(&a, &a, &F[2], ctx);
    run(name, &a, &b, ctx, dump);
    for (k = 0; k < 4; k++)
        gs_poly_clear(&F[k]);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
}

int main(int argc, char **argv)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *c12, *c16, *c20, *c24, *c30, *c32;
    FILE *dump = NULL;
    char name[16];
    int i;
    if (argc == 3 && strcmp(argv[1], "--dump") == 0) {
        dump = fopen(argv[2], "w");
        if (dump == NULL) {
            perror(argv[2]);
            return 1;
        }
    }
    for (i = 0; i < MAXV; i++) {
        snprintf(name, sizeof name, "x%d", i);
        gs_symtab_intern(st, name);
    }
    c12 = gs_polyctx_new(st, 12);
    c16 = gs_polyctx_new(st, 16);
    c20 = gs_polyctx_new(st, 20);
    c24 = gs_polyctx_new(st, 24);
    c30 = gs_polyctx_new(st, 30);
    c32 = gs_polyctx_new(st, 32);
    case_coprime("coprime-ml24", 24, 6, 8, 101, c24, dump);
    case_coprime("coprime-ml32", 32, 8, 6, 102, c32, dump);
    case_common("common-f12", 12, 8, 1, 103, c12, dump);
    case_common("common-f20", 20, 12, 1, 104, c20, dump);
    case_linear("linear-f30", 30, 105, c30, dump);
    case_shared("shared-ml16", 106, c16, dump);
    if (dump != NULL)
        fclose(dump);
    gs_polyctx_free(c12);
    gs_polyctx_free(c16);
    gs_polyctx_free(c20);
    gs_polyctx_free(c24);
    gs_polyctx_free(c30);
    gs_polyctx_free(c32);
    gs_symtab_free(st);
    return 0;
}
