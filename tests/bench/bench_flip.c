/* bench_flip.c - clearing the conductances 1/R of a large determinant.
 * See LICENSE.
 *
 * The polynomial is the node determinant of an RC ladder of n sections
 * in the variables the derivation has at that point: s, R1, C1, ...,
 * Rn, Cn, then the conductances G1 = 1/R1, ..., Gn = 1/Rn, the order in
 * which a circuit file interns them.  n is 14 (514,229 terms, 172 MB in
 * all) unless the first argument says otherwise; 16 gives the 3,524,578
 * terms of docs/engine.md and takes 1.2 GB to build.  The admittance
 * matrix is tridiagonal (diagonal Gk + Gk+1 + s Ck, the last Gn + s Cn;
 * off the diagonal -Gk+1), so its determinant is a continuant, made from
 * the far end: f_k = a_k f_k+1 - Gk+1^2 f_k+2.  It has F(2n+1) terms
 * (Fibonacci; by the matrix-tree theorem, as tests/bench/README.md
 * notes for the ladders' denominators), which is checked.
 *
 * Timed, each the median of RUNS: gs_poly_flip_vars from G to R (the
 * step that clears the reciprocals) and back, against the same flip of
 * the exponents followed by the comparison sort alone
 * (gs_poly_canonicalise_compare).  The two must give the same
 * polynomial (its hash) and flipping back must give the determinant
 * again.  Prints
 *   bench flip-rcN terms=T packed_seconds=P compare_seconds=C check=ok
 * P and C the time of one flip (the mean of the two directions).
 */
#include "algebra/poly.h"
#include "algebra/sym.h"

#include <stdio.h>
#include <stdlib.h>
#include <time.h>
#include "benchlib.h"

#define RUNS 3
#define MAXN 30

/* variable ids in the order described above */
static int var_s(void) { return 0; }
static int var_r(int k) { return 2 * k - 1; }
static int var_c(int k) { return 2 * k; }
static int var_g(int k, int n) { return 2 * n + k; }

static void ladder_det(gs_poly *f, int n, const gs_polyctx *ctx)
{
    gs_poly prev, a, t, g2;
    int k;
    gs_poly_init(&prev);
    gs_poly_init(&a);
    gs_poly_init(&t);
    gs_poly_init(&g2);
    gs_poly_set_si(&prev, 1, ctx);                  /* f_-1 = 1 */
    gs_poly_set_si(f, 1, ctx);                      /* f_0 = 1 */
    for (k = n; k >= 1; k--) {                      /* from the far end */
        gs_poly_set_var(&a, var_g(k, n), 1, ctx);
        if (k < n) {
            gs_poly_set_var(&t, var_g(k + 1, n), 1, ctx);
            gs_poly_add(&a, &a, &t, ctx);
        }
        gs_poly_set_var(&t, var_s(), 1, ctx);
        gs_poly_set_var(&g2, var_c(k), 1, ctx);
        gs_poly_mul(&t, &t, &g2, ctx);
        gs_poly_add(&a, &a, &t, ctx);
        gs_poly_mul(&a, &a, f, ctx);
        if (k < n) {
            gs_poly_set_var(&g2, var_g(k + 1, n), 2, ctx);
            gs_poly_mul(&t, &g2, &prev, ctx);
            gs_poly_sub(&a, &a, &t, ctx);
        }
        gs_poly_swap(&prev, f);
        gs_poly_swap(f, &a);
    }
    gs_poly_clear(&prev);
    gs_poly_clear(&a);
    gs_poly_clear(&t);
    gs_poly_clear(&g2);
}

static void put_field(uint64_t *e, int var, unsigned x)
{
    int w = var / GS_POLY_VARS_PER_WORD, sh = gs_poly_field_shift(var);
    e[w] = (e[w] & ~((uint64_t)GS_POLY_FIELD_MASK << sh)) | (uint64_t)x << sh;
}

/* the flip of gs_poly_flip_vars done here, sorted by comparisons */
static void flip_compare(gs_poly *p, const int *to, const unsigned *top,
                         const gs_polyctx *ctx)
{
    size_t i;
    int v;
    for (i = 0; i < p->length; i++) {
        uint64_t *e = p->exps + i * (size_t)ctx->nwords;
        for (v = 0; v < ctx->nvars; v++)
            if (top[v] > 0) {
                unsigned k = gs_poly_exp_get(e, v);
                put_field(e, v, 0);
                put_field(e, to[v], gs_poly_exp_get(e, to[v]) + top[v] - k);
            }
    }
    gs_poly_canonicalise_compare(p, ctx);
}

static unsigned long fib(int k)
{
    unsigned long a = 0, b = 1, t;
    while (k-- > 0) {
        t = a + b;
        a = b;
        b = t;
    }
    return a;
}

int main(int argc, char **argv)
{
    int n = argc > 1 ? atoi(argv[1]) : 14, k, run, ok = 1;
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    gs_poly d;
    int fwd[3 * MAXN + 1], back[3 * MAXN + 1];
    unsigned tf[3 * MAXN + 1], tb[3 * MAXN + 1];
    double tp[RUNS], tc[RUNS], t0;
    uint64_t h0, h1 = 0;
    char name[16];

    if (n < 1 || n > MAXN) {
        fprintf(stderr, "bench_flip: sections 1..%d\n", MAXN);
        return 2;
    }
    gs_symtab_intern(st, "s");
    for (k = 1; k <= n; k++) {
        snprintf(name, sizeof name, "R%d", k);
        gs_symtab_intern(st, name);
        snprintf(name, sizeof name, "C%d", k);
        gs_symtab_intern(st, name);
    }
    for (k = 1; k <= n; k++)
        gs_symtab_recip(st, var_r(k));
    ctx = gs_polyctx_new(st, gs_symtab_count(st));
    gs_poly_init(&d);
    ladder_det(&d, n, ctx);
    ok &= d.length == fib(2 * n + 1);
    for (k = 0; k < ctx->nvars; k++) {
        tf[k] = tb[k] = 0;
        fwd[k] = back[k] = 0;
    }
    for (k = 1; k <= n; k++) {
        fwd[var_g(k, n)] = var_r(k);
        back[var_r(k)] = var_g(k, n);
    }
    gs_poly_degrees(tf, &d, ctx);
    for (k = 0; k < ctx->nvars; k++)
        if (k < 2 * n + 1)
            tf[k] = 0;
    for (k = 1; k <= n; k++)
        tb[var_r(k)] = tf[var_g(k, n)];
    h0 = gs_poly_hash(&d, ctx);
    for (run = 0; run < RUNS; run++) {
        t0 = bench_now();
        flip_compare(&d, fwd, tf, ctx);
        tc[run] = bench_now() - t0;
        h1 = gs_poly_hash(&d, ctx);
        t0 = bench_now();
        flip_compare(&d, back, tb, ctx);
        tc[run] = (tc[run] + bench_now() - t0) / 2;
        ok &= gs_poly_hash(&d, ctx) == h0;
        t0 = bench_now();
        gs_poly_flip_vars(&d, &d, fwd, tf, NULL, ctx);
        tp[run] = bench_now() - t0;
        ok &= gs_poly_hash(&d, ctx) == h1;
        t0 = bench_now();
        gs_poly_flip_vars(&d, &d, back, tb, NULL, ctx);
        tp[run] = (tp[run] + bench_now() - t0) / 2;
        ok &= gs_poly_hash(&d, ctx) == h0;
    }
    qsort(tp, RUNS, sizeof *tp, bench_cmp_double);
    qsort(tc, RUNS, sizeof *tc, bench_cmp_double);
    printf("bench flip-rc%d terms=%zu packed_seconds=%.4f "
           "compare_seconds=%.4f check=%s\n", n, d.length, tp[RUNS / 2],
           tc[RUNS / 2], ok ? "ok" : "FAILED");
    gs_poly_clear(&d);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
    return ok ? 0 : 1;
}
