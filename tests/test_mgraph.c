/* test_mgraph.c - the graph of shared minors.  See LICENSE.
 *
 * The graph's expansion equals the expansion in minors (minors.c) term for
 * term, its exact evaluation at random rational points equals the
 * expanded N and D there, on the example and bench circuits; path counts
 * of a tridiagonal matrix of distinct symbols are Fibonacci numbers (its
 * determinant has F(n+1) terms: the recurrence D_n = a D_(n-1) -
 * b c D_(n-2), a standard fact), up to F(101) on 100 unknowns, past the
 * 63 of a one-word column set; the first dominant terms are the largest
 * terms of the full expansion, at random values and, monomial for
 * monomial, at the circuits' own values (an RC ladder, a common-source
 * chain with cgs, cgd and cdb, a two-stage op-amp, the examples).
 */
#include "check.h"
#include "analysis/job.h"
#include "analysis/mgraph.h"
#include "analysis/minors.h"
#include "analysis/mna.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static unsigned long long rng_state = 12345;

static unsigned rnd(unsigned n)
{
    rng_state = rng_state * 6364136223846793005ull + 1442695040888963407ull;
    return (unsigned)(rng_state >> 33) % n;
}

static void eval_rat(gs_rat *r, const gs_poly *a, const gs_rat *vals,
                     const gs_polyctx *ctx)
{
    unsigned *ex = malloc(((size_t)ctx->nvars + 1) * sizeof *ex);
    gs_rat t, p;
    size_t i;
    int v;
    gs_rat_init(&t);
    gs_rat_init(&p);
    gs_rat_set_si(r, 0, 1);
    for (i = 0; i < a->length; i++) {
        gs_rat_set_int(&t, &a->coeffs[i]);
        gs_poly_get_term_exps(ex, a, i, ctx);
        for (v = 0; v < ctx->nvars; v++) {
            gs_rat_pow_si(&p, &vals[v], (long)ex[v]);
            gs_rat_mul(&t, &t, &p);
        }
        gs_rat_add(r, r, &t);
    }
    gs_rat_clear(&t);
    gs_rat_clear(&p);
    free(ex);
}

/* |value| of each term of p at vals (s excluded), sorted decreasing. */
static int cmp_desc(const void *a, const void *b)
{
    long double x = *(const long double *)a, y = *(const long double *)b;
    return x > y ? -1 : x < y;
}

static void check_dominant(const gs_mgraph *g, const gs_poly *det, int s,
                           const long double *vals, const char *path)
{
    gs_poly cf;
    int p;
    gs_poly_init(&cf);
    for (p = 0; p <= 2; p++) {
        gs_mgraph_terms t;
        long double *mag;
        size_t i, k;
        unsigned *ex = malloc(((size_t)g->ctx->nvars + 1) * sizeof *ex);
        gs_poly_coeff_var(&cf, det, s, (unsigned)p, g->ctx);
        mag = malloc((cf.length + 1) * sizeof *mag);
        for (i = 0; i < cf.length; i++) {
            int v;
            unsigned e;
            mag[i] = fabsl(gs_int_get_ld(&cf.coeffs[i]));
            gs_poly_get_term_exps(ex, &cf, i, g->ctx);
            for (v = 0; v < g->ctx->nvars; v++)
                for (e = 0; e < ex[v]; e++)
                    mag[i] *= vals[v];
        }
        qsort(mag, cf.length, sizeof *mag, cmp_desc);
        gs_mgraph_dominant(&t, g, g->root_d, s, p, vals, 0, 0);
        /* with tol 0 every term comes out: the whole coefficient */
        CHECK_MSG(t.count == cf.length, "%s s^%d: %zu terms, expanded %zu",
                  path, p, t.count, cf.length);
        k = t.count < cf.length ? t.count : cf.length;
        for (i = 0; i < k; i++)
            CHECK_MSG(fabsl(fabsl(t.value[i]) - mag[i]) <= 1e-12L * mag[i],
                      "%s s^%d term %zu", path, p, i);
        gs_mgraph_terms_clear(&t);
        /* a loose tolerance keeps a prefix of the same order */
        gs_mgraph_dominant(&t, g, g->root_d, s, p, vals, 0.1L, 0);
        for (i = 0; i < t.count && i < cf.length; i++)
            CHECK_MSG(fabsl(fabsl(t.value[i]) - mag[i]) <= 1e-12L * mag[i],
                      "%s s^%d prefix term %zu", path, p, i);
        CHECK(fabsl(t.rest) <= 0.1L * fabsl(t.total) + 1e-30L);
        gs_mgraph_terms_clear(&t);
        free(mag);
        free(ex);
    }
    gs_poly_clear(&cf);
}

/* One term of an expanded coefficient: its value at vals as the search
   computes it (the product of the values, then the coefficient). */
typedef struct xterm {
    long double value;
    unsigned *exps;
    size_t at;                  /* index in the expanded polynomial */
    int nv;
} xterm;

static int xterm_cmp(const void *pa, const void *pb)
{
    const xterm *a = pa, *b = pb;
    long double va = fabsl(a->value), vb = fabsl(b->value);
    int i;
    if (va != vb)
        return va > vb ? -1 : 1;
    /* the documented tie order: exponent vectors variable by variable,
       the larger exponent first (mgraph.h) */
    for (i = 0; i < a->nv; i++)
        if (a->exps[i] != b->exps[i])
            return a->exps[i] > b->exps[i] ? -1 : 1;
    return 0;
}

/* Every term of t is the expansion's term of its monomial (cf, x: the
   coefficient of s^p, its terms), coefficient and all, in decreasing
   |value|; rest is the total less their sum.  Sets *sum. */
static int terms_exact(const gs_mgraph_terms *t, const gs_poly *cf,
                       const xterm *x, int s, int p, const gs_polyctx *ctx)
{
    int nv = ctx->nvars, ok = 1;
    unsigned *ex = malloc(((size_t)nv + 1) * sizeof *ex);
    long double sum = 0;
    size_t i, m;
    for (i = 0; i < t->count && ok; i++) {
        gs_poly_get_term_exps(ex, &t->term[i], 0, ctx);
        ok = (int)ex[s] == p;
        ex[s] = 0;
        for (m = 0; m < cf->length; m++)
            if (memcmp(ex, x[m].exps, (size_t)nv * sizeof *ex) == 0)
                break;
        ok = ok && m < cf->length
             && gs_int_cmp(&cf->coeffs[x[m].at], &t->term[i].coeffs[0]) == 0
             && (i == 0 || fabsl(t->value[i]) <= fabsl(t->value[i - 1]));
        sum += t->value[i];
    }
    free(ex);
    return ok && fabsl(t->rest - (t->total - sum))
                 <= 1e-9L * (fabsl(t->total) + fabsl(sum)) + 1e-300L;
}

/* A search stopped by its memory budget (16 and 128 KiB of states here)
   keeps only terms whose coefficients were final: terms_exact holds. */
static int budget_stops;

/* Set while a circuit whose elements share symbols is checked: there a
   monomial collects several paths, whose sum can pass a kept term's
   value after that term was kept, so the prefix is exact term by term
   but not always the k largest. */
static int shared_symbols;

static void check_within_budget(const gs_mgraph *g, const gs_poly *cf,
                                const xterm *x, int s, int p,
                                const long double *vals, const char *path)
{
    static const size_t budgets[] = {16384, 131072};
    size_t bi;
    for (bi = 0; bi < sizeof budgets / sizeof budgets[0]; bi++) {
        gs_mgraph_terms t;
        gs_mgraph_dominant_within(&t, g, g->root_d, s, p, vals, 0, 0,
                                  budgets[bi]);
        budget_stops += t.budget && t.count > 0;
        CHECK_MSG(terms_exact(&t, cf, x, s, p, g->ctx)
                  && (t.budget || t.count == cf->length),
                  "%s s^%d within %zu bytes: %zu terms, budget %d", path, p,
                  budgets[bi], t.count, t.budget);
        gs_mgraph_terms_clear(&t);
    }
}

/* At the circuit's own values: the terms generated first are exactly the
   largest terms of the expanded coefficient, monomial and exact
   coefficient, in the same order, for the whole list (tol 0) and for a
   prefix cut by a tolerance.  The expansion (minors.c, checked against
   sympy elsewhere) is the outside reference. */
static void check_nominal_order(const gs_mgraph *g, const gs_poly *det,
                                int s, const long double *vals,
                                const char *path)
{
    const gs_polyctx *ctx = g->ctx;
    int nv = ctx->nvars, p, maxp = (int)gs_poly_degree(det, s, ctx);
    gs_poly cf;
    unsigned *ex = malloc(((size_t)nv + 1) * sizeof *ex);
    gs_poly_init(&cf);
    for (p = 0; p <= maxp; p++) {
        static const long double tols[] = {0, 0.05L, 0.002L};
        xterm *x;
        size_t i, ti;
        gs_poly_coeff_var(&cf, det, s, (unsigned)p, ctx);
        x = malloc((cf.length + 1) * sizeof *x);
        for (i = 0; i < cf.length; i++) {
            long double u = 1;
            int v;
            unsigned e;
            x[i].exps = malloc(((size_t)nv + 1) * sizeof *x[i].exps);
            gs_poly_get_term_exps(x[i].exps, &cf, i, ctx);
            for (v = 0; v < nv; v++)
                for (e = 0; e < x[i].exps[v]; e++)
                    u *= vals[v];
            x[i].value = gs_int_get_ld(&cf.coeffs[i]) * u;
            x[i].at = i;
            x[i].nv = nv;
        }
        qsort(x, cf.length, sizeof *x, xterm_cmp);
        for (ti = 0; ti < sizeof tols / sizeof tols[0]; ti++) {
            gs_mgraph_terms t;
            int ok = 1;
            gs_mgraph_dominant(&t, g, g->root_d, s, p, vals, tols[ti], 0);
            if (ti == 0)
                CHECK_MSG(t.count == cf.length,
                          "%s s^%d: %zu terms generated, %zu expanded",
                          path, p, t.count, cf.length);
            else
                CHECK_MSG(fabsl(t.rest) <= tols[ti] * fabsl(t.total)
                              * (1 + 1e-9L) + 1e-300L,
                          "%s s^%d: rest %Lg of %Lg", path, p, t.rest,
                          t.total);
            if (shared_symbols) {
                CHECK_MSG(terms_exact(&t, &cf, x, s, p, ctx),
                          "%s s^%d tol %Lg: terms not exact", path, p,
                          tols[ti]);
                ok = 0;
            }
            for (i = 0; i < t.count && i < cf.length && ok; i++) {
                gs_int c;
                gs_poly_get_term_exps(ex, &t.term[i], 0, ctx);
                /* the generated term carries s^p, the coefficient not */
                ok = (int)ex[s] == p;
                ex[s] = 0;
                gs_int_init(&c);
                gs_int_set(&c, &cf.coeffs[x[i].at]);
                ok = ok && memcmp(ex, x[i].exps, (size_t)nv * sizeof *ex) == 0
                     && gs_int_cmp(&c, &t.term[i].coeffs[0]) == 0;
                CHECK_MSG(ok, "%s s^%d tol %Lg: term %zu of %zu is not the "
                          "%zu-th largest", path, p, tols[ti], i, t.count,
                          i + 1);
                gs_int_clear(&c);
            }
            gs_mgraph_terms_clear(&t);
        }
        check_within_budget(g, &cf, x, s, p, vals, path);
        for (i = 0; i < cf.length; i++)
            free(x[i].exps);
        free(x);
    }
    gs_poly_clear(&cf);
    free(ex);
}

/* The rank-one rule (mgraph.h) against the expansion: every variable it
   marks has degree <= 1 in the expanded determinant. */
static void check_linear_vars(const gs_mgraph *g, const gs_poly *det,
                              const char *path)
{
    int nv = g->ctx->nvars, v, marked = 0;
    unsigned char *lin = malloc((size_t)nv + 1);
    gs_mgraph_linear_vars(lin, g, g->root_d);
    for (v = 0; v < nv; v++)
        if (lin[v]) {
            marked++;
            CHECK_MSG(gs_poly_degree(det, v, g->ctx) <= 1,
                      "%s: variable %d marked, degree %ld", path, v,
                      gs_poly_degree(det, v, g->ctx));
        }
    CHECK_MSG(marked > 0, "%s: no variable of degree one found", path);
    free(lin);
}

static int nominal_cases;

/* Every symbol of det but s has a value of its own (a circuit with value
   lines for all its elements). */
static int has_values(const gs_job *j, const gs_poly *det)
{
    int v, ok = 1;
    unsigned char *used = malloc((size_t)j->ctx->nvars + 1);
    gs_poly_used_vars(used, det, j->ctx);
    for (v = 0; v < j->ctx->nvars; v++)
        if (used[v] && v != j->c->s_sym
            && !gs_symtab_is_recip(j->c->syms, v) && j->vals[v] == 0)
            ok = 0;
    free(used);
    return ok;
}

static void check_circuit_text(const char *path, const char *text);

static void check_circuit(const char *path)
{
    check_circuit_text(path, NULL);
}

static void check_circuit_text(const char *path, const char *text)
{
    gs_job j;
    gs_diag d;
    gs_mna m;
    gs_mgraph g;
    gs_poly da, dm, ea, em;
    gs_minors_opts mo;
    int rc, trial, nv, flipped = 0;

    gs_job_init(&j);
    gs_diag_init(&d);
    rc = text ? gs_job_load_string(&j, path, text, &d)
              : gs_job_load(&j, path, &d);
    CHECK_MSG(rc == GS_OK, "%s", path);
    if (rc != GS_OK) {
        gs_diag_print(stderr, &d);
        gs_diag_clear(&d);
        gs_job_clear(&j);
        return;
    }
    nv = j.ctx->nvars;
    memset(&m, 0, sizeof m);
    CHECK(gs_mna_build(&m, j.c, 0, j.ctx, &d) == GS_OK);
    CHECK(gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, 0, j.ctx) == GS_OK);
    gs_poly_init(&da);
    gs_poly_init(&dm);
    gs_poly_init(&ea);
    gs_poly_init(&em);
    gs_minors_opts_default(&mo);
    mo.max_products = 0;
    CHECK(gs_minors_bordered(&da, &dm, &m, j.ctx, &mo, NULL, &d) == GS_OK);
    /* one orientation may differ from the other by a common sign */
    CHECK(gs_mgraph_expand(&ea, &g, g.root_d, 0) == GS_OK);
    CHECK(gs_mgraph_expand(&em, &g, g.root_m, 0) == GS_OK);
    if (!gs_poly_equal(&ea, &da, j.ctx)) {
        gs_poly_neg(&ea, &ea, j.ctx);
        gs_poly_neg(&em, &em, j.ctx);
        flipped = 1;
    }
    CHECK_MSG(gs_poly_equal(&ea, &da, j.ctx), "%s det A", path);
    CHECK_MSG(gs_poly_equal(&em, &dm, j.ctx), "%s det M", path);
    {
        gs_int pc;
        gs_int_init(&pc);
        gs_mgraph_count_paths(&pc, &g, g.root_d);
        CHECK(gs_int_cmp_si(&pc, (int64_t)da.length) >= 0);
        gs_int_clear(&pc);
    }
    for (trial = 0; trial < 3; trial++) {
        gs_rat *vals = malloc(((size_t)nv + 1) * sizeof *vals);
        gs_rat gn, gd, xa, xm, xn, c0v, t;
        int v;
        for (v = 0; v < nv; v++) {
            gs_rat_init(&vals[v]);
            gs_rat_set_si(&vals[v], (int64_t)rnd(97) + 1,
                          (int64_t)rnd(89) + 1);
        }
        gs_rat_init(&gn); gs_rat_init(&gd); gs_rat_init(&xa);
        gs_rat_init(&xm); gs_rat_init(&xn); gs_rat_init(&c0v);
        gs_rat_init(&t);
        gs_mgraph_eval_rat(&gn, &gd, &g, vals);
        eval_rat(&xa, &da, vals, j.ctx);
        eval_rat(&xm, &dm, vals, j.ctx);
        eval_rat(&c0v, &m.c0, vals, j.ctx);
        /* N = scale (c0 det A - det M), exactly */
        gs_rat_mul(&xn, &c0v, &xa);
        gs_rat_sub(&xn, &xn, &xm);
        gs_rat_mul(&xn, &xn, &m.scale);
        /* the ratio is sign-free; the pair may share a sign */
        if (!gs_rat_equal(&gd, &xa)) {
            gs_rat_neg(&gd, &gd);
            gs_rat_neg(&gn, &gn);
        }
        CHECK_MSG(gs_rat_equal(&gd, &xa), "%s D at a rational point", path);
        CHECK_MSG(gs_rat_equal(&gn, &xn), "%s N at a rational point", path);
        for (v = 0; v < nv; v++)
            gs_rat_clear(&vals[v]);
        free(vals);
        gs_rat_clear(&gn); gs_rat_clear(&gd); gs_rat_clear(&xa);
        gs_rat_clear(&xm); gs_rat_clear(&xn); gs_rat_clear(&c0v);
        gs_rat_clear(&t);
    }
    {
        long double *lv = malloc(((size_t)nv + 1) * sizeof *lv);
        int v;
        for (v = 0; v < nv; v++)
            lv[v] = 0.5L + (long double)rnd(100000) / 7919.0L;
        check_dominant(&g, &da, j.c->s_sym, lv, path);
        check_linear_vars(&g, &da, path);
        /* at the circuit's own values, when it gives them all */
        if (gs_job_bind(&j, NULL, 0, &d) == GS_OK && has_values(&j, &da)) {
            /* the graph's D: the expansion with the graph's sign */
            if (flipped)
                gs_poly_neg(&da, &da, j.ctx);
            memcpy(lv, j.vals, (size_t)nv * sizeof *lv);
            gs_mgraph_fill_recips(lv, j.c->syms, nv);
            check_nominal_order(&g, &da, j.c->s_sym, lv, path);
            nominal_cases++;
        }
        free(lv);
    }
    gs_poly_clear(&da);
    gs_poly_clear(&dm);
    gs_poly_clear(&ea);
    gs_poly_clear(&em);
    gs_mgraph_clear(&g);
    gs_mna_clear(&m);
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

/* Tridiagonal n x n of distinct symbols, bordered by e_0 and e_(n-1). */
static void check_fibonacci(int n, const char *expect)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    gs_mna m;
    gs_mgraph g;
    gs_int pc;
    char name[32], *got;
    int i, j, nsym = 0;
    size_t cells = (size_t)(n + 1) * (size_t)(n + 1), k;
    for (i = 0; i < n; i++)
        for (j = i - 1; j <= i + 1; j++)
            if (j >= 0 && j < n) {
                snprintf(name, sizeof name, "a%d_%d", i, j);
                gs_symtab_intern(st, name);
                nsym++;
            }
    ctx = gs_polyctx_new(st, nsym);
    memset(&m, 0, sizeof m);
    m.n = n;
    m.m = malloc(cells * sizeof *m.m);
    for (k = 0; k < cells; k++)
        gs_poly_init(&m.m[k]);
    gs_poly_init(&m.c0);
    gs_rat_init(&m.scale);
    gs_rat_set_si(&m.scale, 1, 1);
    nsym = 0;
    for (i = 0; i < n; i++)
        for (j = i - 1; j <= i + 1; j++)
            if (j >= 0 && j < n)
                gs_poly_set_var(GS_MNA_AT(&m, i, j), nsym++, 1, ctx);
    gs_poly_set_si(GS_MNA_AT(&m, 0, n), 1, ctx);
    gs_poly_set_si(GS_MNA_AT(&m, n, n - 1), 1, ctx);
    CHECK(gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, 0, ctx) == GS_OK);
    gs_int_init(&pc);
    gs_mgraph_count_paths(&pc, &g, g.root_d);
    got = gs_int_get_str(&pc);
    CHECK_MSG(strcmp(got, expect) == 0, "n=%d: %s paths, F(n+1) = %s", n,
              got, expect);
    free(got);
    if (n <= 20) {
        gs_poly e;
        gs_poly_init(&e);
        CHECK(gs_mgraph_expand(&e, &g, g.root_d, 0) == GS_OK);
        gs_int_set_ui(&pc, e.length);
        got = gs_int_get_str(&pc);
        CHECK_MSG(strcmp(got, expect) == 0, "n=%d: %s terms", n, got);
        free(got);
        gs_poly_clear(&e);
    }
    gs_int_clear(&pc);
    gs_mgraph_clear(&g);
    for (k = 0; k < cells; k++)
        gs_poly_clear(&m.m[k]);
    free(m.m);
    gs_poly_clear(&m.c0);
    gs_rat_clear(&m.scale);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* Number of spanning trees of a graph on k + 1 vertices (vertex k the
   ground): det of the reduced Laplacian with unit weights (Kirchhoff's
   matrix-tree theorem), by Gaussian elimination in doubles, rounded. */
static long spanning_trees(const int *ea, const int *eb, int ne, int k)
{
    double a[8][8];
    double det = 1;
    int i, j, r;
    memset(a, 0, sizeof a);
    for (i = 0; i < ne; i++) {
        if (ea[i] < k)
            a[ea[i]][ea[i]] += 1;
        if (eb[i] < k)
            a[eb[i]][eb[i]] += 1;
        if (ea[i] < k && eb[i] < k) {
            a[ea[i]][eb[i]] -= 1;
            a[eb[i]][ea[i]] -= 1;
        }
    }
    for (i = 0; i < k; i++) {
        int p = i;
        for (r = i + 1; r < k; r++)
            if (fabs(a[r][i]) > fabs(a[p][i]))
                p = r;
        if (a[p][i] == 0)
            return 0;
        if (p != i) {
            for (j = 0; j < k; j++) {
                double t = a[i][j];
                a[i][j] = a[p][j];
                a[p][j] = t;
            }
            det = -det;
        }
        det *= a[i][i];
        for (r = i + 1; r < k; r++) {
            double f = a[r][i] / a[i][i];
            for (j = i; j < k; j++)
                a[r][j] -= f * a[i][j];
        }
    }
    return lround(det);
}

/* Random resistive networks as reduced Laplacians of conductance symbols:
   det A is the sum over spanning trees of their conductance products, so
   its expansion from the graph has one term per spanning tree, and the
   best-first search with no tolerance yields exactly those terms. */
static void check_matrix_tree(int trial)
{
    int k = 3 + trial % 5, ne = 0, i, ea[32], eb[32];
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    gs_mna m;
    gs_mgraph g;
    gs_poly e;
    gs_mgraph_terms t;
    long double vals[32];
    size_t cells = (size_t)(k + 1) * (size_t)(k + 1), c;
    /* a spanning path to the ground first, so the network is connected */
    for (i = 0; i < k; i++) {
        ea[ne] = i;
        eb[ne++] = i + 1;
    }
    while (ne < k + 1 + (int)rnd((unsigned)k + 2) && ne < 32) {
        int a = (int)rnd((unsigned)k + 1), b = (int)rnd((unsigned)k + 1);
        if (a == b)
            continue;
        ea[ne] = a;
        eb[ne++] = b;
    }
    for (i = 0; i < ne; i++) {
        char name[16];
        snprintf(name, sizeof name, "g%d", i);
        gs_symtab_intern(st, name);
        vals[i] = 1 + (long double)rnd(1000) / 37;
    }
    ctx = gs_polyctx_new(st, ne);
    memset(&m, 0, sizeof m);
    m.n = k;
    m.m = malloc(cells * sizeof *m.m);
    for (c = 0; c < cells; c++)
        gs_poly_init(&m.m[c]);
    gs_poly_init(&m.c0);
    gs_rat_init(&m.scale);
    gs_rat_set_si(&m.scale, 1, 1);
    gs_poly_init(&e);
    for (i = 0; i < ne; i++) {
        int a = ea[i], b = eb[i];
        gs_poly_set_var(&e, i, 1, ctx);
        if (a < k)
            gs_poly_add(GS_MNA_AT(&m, a, a), GS_MNA_AT(&m, a, a), &e, ctx);
        if (b < k)
            gs_poly_add(GS_MNA_AT(&m, b, b), GS_MNA_AT(&m, b, b), &e, ctx);
        if (a < k && b < k) {
            gs_poly_sub(GS_MNA_AT(&m, a, b), GS_MNA_AT(&m, a, b), &e, ctx);
            gs_poly_sub(GS_MNA_AT(&m, b, a), GS_MNA_AT(&m, b, a), &e, ctx);
        }
    }
    gs_poly_set_si(GS_MNA_AT(&m, 0, k), 1, ctx);
    gs_poly_set_si(GS_MNA_AT(&m, k, 0), 1, ctx);
    CHECK(gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, 0, ctx) == GS_OK);
    CHECK(gs_mgraph_expand(&e, &g, g.root_d, 0) == GS_OK);
    CHECK_MSG((long)e.length == spanning_trees(ea, eb, ne, k),
              "trial %d: %zu terms, %ld spanning trees", trial, e.length,
              spanning_trees(ea, eb, ne, k));
    gs_mgraph_dominant(&t, &g, g.root_d, -1, 0, vals, 0, 0);
    CHECK_MSG((long)t.count == spanning_trees(ea, eb, ne, k),
              "trial %d: %zu dominant terms", trial, t.count);
    gs_mgraph_terms_clear(&t);
    gs_poly_clear(&e);
    gs_mgraph_clear(&g);
    for (c = 0; c < cells; c++)
        gs_poly_clear(&m.m[c]);
    free(m.m);
    gs_poly_clear(&m.c0);
    gs_rat_clear(&m.scale);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* A complete graph K_n of resistors, gnd one of its nodes, and the
   impedance at p1. */
static void mesh_text(char *text, size_t cap, int n)
{
    size_t at = 0;
    int a, b, k = 0;
    for (a = 0; a < n; a++)
        for (b = a + 1; b < n; b++) {
            k++;
            if (a == 0)
                at += (size_t)snprintf(text + at, cap - at,
                                       "resistor R%d gnd p%d\n", k, b);
            else
                at += (size_t)snprintf(text + at, cap - at,
                                       "resistor R%d p%d p%d\n", k, a, b);
        }
    snprintf(text + at, cap - at, "impedance Z = p1, gnd\n");
}

/* A complete graph K_7 of resistors (gnd one of its nodes): det A, the
   nodal determinant, has one term per spanning tree, 7^5 = 16807 of them
   (matrix-tree theorem with Cayley's formula n^(n-2); Bollobas, Modern
   Graph Theory, ch. II, from memory).  Its graph of minors is refused
   under a budget far below its size and built without one. */
static void test_dense_budget(void)
{
    char text[4096];
    gs_job j;
    gs_diag d;
    gs_mna m;
    gs_mgraph g;
    gs_poly det;
    mesh_text(text, sizeof text, 7);
    gs_job_init(&j);
    gs_diag_init(&d);
    CHECK(gs_job_load_string(&j, "k7.gsc", text, &d) == GS_OK);
    memset(&m, 0, sizeof m);
    CHECK(gs_mna_build(&m, j.c, 0, j.ctx, &d) == GS_OK);
    CHECK(gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, 4096, j.ctx)
          == GS_EBUDGET);
    gs_mgraph_clear(&g);
    CHECK(gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, 0, j.ctx)
          == GS_OK);
    gs_poly_init(&det);
    CHECK(gs_mgraph_expand(&det, &g, g.root_d, 0) == GS_OK);
    CHECK_MSG(det.length == 16807, "%zu terms", det.length);
    gs_poly_clear(&det);
    gs_mgraph_clear(&g);
    /* a budget the graph fits in builds the same graph */
    CHECK(gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, (size_t)64 << 20,
                          j.ctx) == GS_OK);
    gs_mgraph_clear(&g);
    gs_mna_clear(&m);
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

/* A full mesh of 12 nodes (gnd one of them), whose expansion no budget
   of the default kind holds: the derivation's size gate refuses it and
   hands over the graph it built (gs_derive_opts.graph_out), and that
   graph is the one built from the MNA afresh (the same nodes, edges and
   exact path counts).  A job asked for numbers keeps that graph, without
   building a second. */
static void test_gate_hands_graph(void)
{
    char text[16384];
    gs_job j;
    gs_diag d;
    gs_mna m;
    gs_mgraph fresh, *given = NULL;
    gs_tf tf;
    gs_derive_opts o;
    gs_derive_stats st;
    gs_int p1, p2;
    mesh_text(text, sizeof text, 12);
    gs_job_init(&j);
    gs_diag_init(&d);
    CHECK(gs_job_load_string(&j, "k12.gsc", text, &d) == GS_OK);
    gs_derive_opts_default(&o);
    o.graph_out = &given;
    memset(&st, 0, sizeof st);
    gs_tf_init(&tf, j.ctx, j.c->s_sym);
    CHECK(gs_derive(&tf, j.c, 0, j.ctx, &o, &st, &d) == GS_EBUDGET);
    CHECK(given != NULL && !st.graph_refused);
    memset(&m, 0, sizeof m);
    CHECK(gs_mna_build(&m, j.c, 0, j.ctx, &d) == GS_OK);
    CHECK(gs_mgraph_build(&fresh, &m, GS_MGRAPH_ORDER_GREEDY, 0, j.ctx)
          == GS_OK);
    gs_int_init(&p1);
    gs_int_init(&p2);
    if (given != NULL) {
        CHECK(given->nnodes == fresh.nnodes && given->nedges == fresh.nedges
              && st.graph_nodes == fresh.nnodes && given->ctx == j.ctx);
        gs_mgraph_count_paths(&p1, given, given->root_d);
        gs_mgraph_count_paths(&p2, &fresh, fresh.root_d);
        CHECK(gs_int_cmp(&p1, &p2) == 0 && gs_int_cmp_si(&p1, 2000000) > 0);
        gs_mgraph_count_paths(&p1, given, given->root_n);
        gs_mgraph_count_paths(&p2, &fresh, fresh.root_n);
        CHECK(gs_int_cmp(&p1, &p2) == 0);
        gs_mgraph_clear(given);
        free(given);
    }
    gs_int_clear(&p1);
    gs_int_clear(&p2);
    gs_mgraph_clear(&fresh);
    gs_mna_clear(&m);
    gs_tf_clear(&tf);
    gs_diag_clear(&d);
    gs_diag_init(&d);
    j.graph_ok = 1;
    o.graph_out = NULL;         /* the job asks for it itself */
    CHECK(gs_job_derive(&j, NULL, &o, &d) == GS_OK);
    CHECK(j.ntf == 1 && j.graph != NULL && j.graph[0] != NULL
          && j.graph[0]->nnodes == j.stats[0].graph_nodes);
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

int main(void)
{
    static const char *const files[] = {
        "examples/cascode.gsc", "examples/cs_degen.gsc",
        "examples/sallen_key.gsc", "examples/inverting_amp.gsc",
        "tests/bench/rc_ladder_3.gsc", "tests/bench/rc_ladder_6.gsc",
        "tests/bench/cascode_caps.gsc", "tests/bench/miller_ota.gsc",
        "tests/bench/miller_ota_rz.gsc", "tests/bench/rand_5.gsc",
        "tests/bench/rand_7.gsc", "tests/bench/ladder_RLC_5.gsc",
        "tests/bench/cs_degen.gsc", "tests/bench/engine/cs_chain_6.gsc",
        "tests/bench/engine/miller_two_stage.gsc", NULL
    };
    int i;
    test_dense_budget();
    test_gate_hands_graph();
    for (i = 0; files[i]; i++)
        check_circuit(files[i]);
    shared_symbols = 1;
    check_circuit("tests/bench/engine/miller_matched.gsc");
    shared_symbols = 0;
    {
        /* an RC ladder of 8 sections with distinct values (the engine
           bench's rc_ladder with fewer sections) */
        char text[4096];
        size_t at = 0;
        at += (size_t)snprintf(text + at, sizeof text - at,
                               "vsource vin n0 gnd\n");
        for (i = 1; i <= 8; i++)
            at += (size_t)snprintf(text + at, sizeof text - at,
                                   "resistor R%d n%d n%d\n"
                                   "capacitor C%d n%d gnd\n"
                                   "value R%d = %gk\nvalue C%d = %gp\n",
                                   i, i - 1, i, i, i, i, 1 + 0.13 * i, i,
                                   1 + 0.07 * i);
        snprintf(text + at, sizeof text - at,
                 "transfer H = v(n8) / vin\n");
        check_circuit_text("rc_ladder_8 (in the test)", text);
    }
    /* the circuits with values: examples, the CS chain with cgs, cgd,
       cdb, the two-stage op-amp, the ladder above */
    CHECK_MSG(nominal_cases >= 7, "%d circuits at their values",
              nominal_cases);
    CHECK_MSG(budget_stops >= 5, "%d searches stopped by the budget",
              budget_stops);
    /* Fibonacci numbers F(n+1) (F(1) = F(2) = 1), a math fact; F(101)
       = 573147844013817084101 */
    check_fibonacci(5, "8");
    check_fibonacci(12, "233");
    check_fibonacci(20, "10946");
    check_fibonacci(100, "573147844013817084101");
    for (i = 0; i < 20; i++)
        check_matrix_tree(i);
    return check_report("mgraph");
}
