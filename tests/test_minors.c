/* test_minors.c - determinants by expansion in minors.  See LICENSE.
 *
 * Checked against closed forms: the Vandermonde determinant, Vieta's
 * formula for the solution of a Vandermonde system, and Chebyshev
 * polynomials of the second kind as tridiagonal determinants (standard
 * linear-algebra facts; e.g. Horn and Johnson, Matrix Analysis, 0.9.11,
 * and Mason and Handscomb, Chebyshev Polynomials, 1.2, from memory).
 * Random sparse matrices are also compared with elimination (elim.c),
 * and the refusals and budgets are checked.  Kirchhoff's theorem through
 * this module is in test_elim.c.
 */
#include "check.h"
#include "testlib.h"
#include "analysis/elim.h"
#include "analysis/minors.h"

#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static gs_rng rng_state;

static unsigned rnd(unsigned n)
{
    return test_below(&rng_state, n);
}

/* A bordered matrix of size n with every entry zero; c0 = 0, scale 1. */
static void mna_new(gs_mna *m, int n)
{
    size_t cells = (size_t)(n + 1) * (size_t)(n + 1), k;
    memset(m, 0, sizeof *m);
    m->n = n;
    m->m = malloc(cells * sizeof *m->m);
    for (k = 0; k < cells; k++)
        gs_poly_init(&m->m[k]);
    m->unknown_name = calloc((size_t)n + 1, sizeof *m->unknown_name);
    for (k = 0; k < (size_t)n; k++) {
        m->unknown_name[k] = malloc(24);
        snprintf(m->unknown_name[k], 24, "x%zu", k);
    }
    gs_poly_init(&m->c0);
    gs_rat_init(&m->scale);
    gs_rat_set_si(&m->scale, 1, 1);
    m->nnode_unknowns = n;
}

static void set(gs_mna *m, int i, int j, const char *text,
                const gs_polyctx *ctx)
{
    int rc = gs_poly_set_str(GS_MNA_AT(m, i, j), text, ctx);
    CHECK_MSG(rc == GS_OK, "entry (%d, %d) = %s", i, j, text);
}

static gs_polyctx *context(gs_symtab *st, int nvars, const char *prefix)
{
    char name[16];
    int v;
    for (v = 0; v < nvars; v++) {
        snprintf(name, sizeof name, "%s%d", prefix, v + 1);
        gs_symtab_intern(st, name);
    }
    return gs_polyctx_new(st, nvars);
}

static int minors(gs_poly *da, gs_poly *dm, const gs_mna *m,
                  const gs_polyctx *ctx)
{
    gs_minors_opts o;
    gs_diag d;
    int rc;
    gs_minors_opts_default(&o);
    o.max_products = 0;
    gs_diag_init(&d);
    rc = gs_minors_bordered(da, dm, m, ctx, &o, NULL, &d);
    gs_diag_clear(&d);
    return rc;
}

/* Does a = +-b, with the sign given by *sign when it is nonzero (set
   otherwise)? */
static int equal_up_to(int *sign, const gs_poly *a, const gs_poly *b,
                       const gs_polyctx *ctx)
{
    gs_poly nb;
    int ok;
    gs_poly_init(&nb);
    gs_poly_neg(&nb, b, ctx);
    if (*sign == 0)
        *sign = gs_poly_equal(a, b, ctx) ? 1 : -1;
    ok = gs_poly_equal(a, *sign > 0 ? b : &nb, ctx);
    gs_poly_clear(&nb);
    return ok;
}

/* V = [x_i^j], i, j < n: det V = prod_{i<j} (x_j - x_i).  With b_i = x_i^n
   and c = e_{n-1}, the solution's last unknown is x_1 + ... + x_n (Vieta:
   t^n - sum a_j t^j = prod (t - x_i)), so det M = -(sum x_i) det V. */
static void test_vandermonde(void)
{
    int n;
    for (n = 1; n <= 7; n++) {
        gs_symtab *st = gs_symtab_new();
        gs_polyctx *ctx = context(st, n, "x");
        gs_mna m;
        gs_poly da, dm, want, f, sum, t;
        char text[32];
        int i, j, sign = 0;

        mna_new(&m, n);
        for (i = 0; i < n; i++) {
            for (j = 0; j <= n; j++) {
                snprintf(text, sizeof text, "x%d^%d", i + 1, j);
                set(&m, i, j, text, ctx);
            }
        }
        gs_poly_set_si(GS_MNA_AT(&m, n, n - 1), 1, ctx);
        gs_poly_init(&da);
        gs_poly_init(&dm);
        gs_poly_init(&want);
        gs_poly_init(&f);
        gs_poly_init(&sum);
        gs_poly_init(&t);
        gs_poly_set_si(&want, 1, ctx);
        for (i = 0; i < n; i++) {
            gs_poly_set_var(&t, i, 1, ctx);
            gs_poly_add(&sum, &sum, &t, ctx);
            for (j = i + 1; j < n; j++) {
                snprintf(text, sizeof text, "x%d - x%d", j + 1, i + 1);
                gs_poly_set_str(&f, text, ctx);
                gs_poly_mul(&want, &want, &f, ctx);
            }
        }
        CHECK_MSG(minors(&da, &dm, &m, ctx) == GS_OK, "n = %d", n);
        CHECK_MSG(equal_up_to(&sign, &da, &want, ctx), "det V, n = %d", n);
        gs_poly_mul(&want, &want, &sum, ctx);
        gs_poly_neg(&want, &want, ctx);
        CHECK_MSG(equal_up_to(&sign, &dm, &want, ctx), "det M, n = %d", n);
        gs_poly_clear(&da);
        gs_poly_clear(&dm);
        gs_poly_clear(&want);
        gs_poly_clear(&f);
        gs_poly_clear(&sum);
        gs_poly_clear(&t);
        gs_mna_clear(&m);
        gs_polyctx_free(ctx);
        gs_symtab_free(st);
    }
}

/* A row with one entry: Laplace expansion along it (Horn and Johnson,
   Matrix Analysis, 0.3.1, from memory) gives det = (-1)^(r0+j0) a
   minor(r0, j0).  Here a = -3 y^2 is put at (r0, j0) of an otherwise
   Vandermonde system in x1..x4 (b_i = x_i^4, the border picking the
   unknown of the last Vandermonde column), the other rows' entries in
   column j0 being x_i + 1.  The lone row forces x_j0 = 0, so the picked
   unknown is still x1 + ... + x4 (Vieta): det M = -(sum x_i) det A, and
   det A = +-(-3 y^2) prod_{i<j} (x_j - x_i).  The ratio fixes the signs
   of the sets that end up holding the expansion of that lone row. */
static void test_lone_row(void)
{
    const int nv = 4, n = nv + 1;
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx = context(st, nv, "x");
    int y = gs_symtab_intern(st, "y"), r0, j0;
    gs_polyctx_free(ctx);
    ctx = gs_polyctx_new(st, nv + 1);
    for (r0 = 0; r0 < n; r0++)
        for (j0 = 0; j0 < n; j0++) {
            gs_mna m;
            gs_poly da, dm, want, f, sum;
            char text[32];
            int i, j, sign = 0, last = j0 == n - 1 ? n - 2 : n - 1;

            mna_new(&m, n);
            for (i = 0; i < n; i++) {
                int vi = i < r0 ? i : i - 1;    /* the Vandermonde row */
                for (j = 0; j <= n; j++) {
                    int pj = j < j0 ? j : j - 1;    /* its power */
                    if (i == r0) {
                        if (j == j0)
                            set(&m, i, j, "-3*y^2", ctx);
                        continue;
                    }
                    if (j == j0)
                        snprintf(text, sizeof text, "x%d + 1", vi + 1);
                    else if (j == n)
                        snprintf(text, sizeof text, "x%d^%d", vi + 1, nv);
                    else
                        snprintf(text, sizeof text, "x%d^%d", vi + 1, pj);
                    set(&m, i, j, text, ctx);
                }
            }
            gs_poly_set_si(GS_MNA_AT(&m, n, last), 1, ctx);
            gs_poly_init(&da);
            gs_poly_init(&dm);
            gs_poly_init(&want);
            gs_poly_init(&f);
            gs_poly_init(&sum);
            gs_poly_set_var(&want, y, 2, ctx);
            gs_poly_mul_si(&want, &want, -3, ctx);
            for (i = 0; i < nv; i++) {
                gs_poly_set_var(&f, i, 1, ctx);
                gs_poly_add(&sum, &sum, &f, ctx);
                for (j = i + 1; j < nv; j++) {
                    snprintf(text, sizeof text, "x%d - x%d", j + 1, i + 1);
                    gs_poly_set_str(&f, text, ctx);
                    gs_poly_mul(&want, &want, &f, ctx);
                }
            }
            CHECK_MSG(minors(&da, &dm, &m, ctx) == GS_OK
                      && equal_up_to(&sign, &da, &want, ctx),
                      "lone entry at (%d, %d): det A", r0, j0);
            gs_poly_mul(&want, &want, &sum, ctx);
            gs_poly_neg(&want, &want, ctx);
            CHECK_MSG(equal_up_to(&sign, &dm, &want, ctx),
                      "lone entry at (%d, %d): det M", r0, j0);
            gs_poly_clear(&da);
            gs_poly_clear(&dm);
            gs_poly_clear(&want);
            gs_poly_clear(&f);
            gs_poly_clear(&sum);
            gs_mna_clear(&m);
        }
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* The same past one word of columns, where the graph of minors holds
   the expansion: the tridiagonal matrix T of test_chebyshev with n = 70
   (det T_n = x det T_(n-1) - det T_(n-2), T_0 = 1, T_1 = x: the
   continuant recurrence, Muir, A Treatise on the Theory of
   Determinants, from memory), with a lone entry -3 y^2 put in, b = e_1
   and the border picking the last unknown of T.  By Cramer's rule that
   unknown is (-1)^(n+1) / det T (its minor is triangular with ones on
   the diagonal), so det A = +-(-3 y^2) det T and
   det M = -(that unknown) det A = +-(-1)^n (-3 y^2), one sign for both. */
static void test_lone_row_wide(void)
{
    static const int at[] = {0, 1, 35, 69, 70};
    const int nt = 70, n = nt + 1;
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    gs_poly t0, t1, t2, x, a;
    int y, i, ri, ji;

    gs_symtab_intern(st, "x");
    y = gs_symtab_intern(st, "y");
    ctx = gs_polyctx_new(st, 2);
    gs_poly_init(&t0);
    gs_poly_init(&t1);
    gs_poly_init(&t2);
    gs_poly_init(&x);
    gs_poly_init(&a);
    gs_poly_set_var(&x, 0, 1, ctx);
    gs_poly_set_si(&t0, 1, ctx);
    gs_poly_set(&t1, &x, ctx);
    for (i = 2; i <= nt; i++) {
        gs_poly_mul(&t2, &x, &t1, ctx);
        gs_poly_sub(&t2, &t2, &t0, ctx);
        gs_poly_swap(&t0, &t1);
        gs_poly_swap(&t1, &t2);
    }
    /* t1 = det T_70 */
    gs_poly_set_var(&a, y, 2, ctx);
    gs_poly_mul_si(&a, &a, -3, ctx);
    for (ri = 0; ri < 5; ri++)
        for (ji = 0; ji < 5; ji++) {
            int r0 = at[ri], j0 = at[ji], sign = 0;
            gs_mna m;
            gs_poly da, dm, want;

            mna_new(&m, n);
            for (i = 0; i < nt; i++) {
                int r = i < r0 ? i : i + 1, c = i < j0 ? i : i + 1;
                int cn = i + 1 < j0 ? i + 1 : i + 2;    /* column of i+1 */
                gs_poly_set(GS_MNA_AT(&m, r, c), &x, ctx);
                if (i + 1 < nt) {
                    int rn = i + 1 < r0 ? i + 1 : i + 2;
                    gs_poly_set_si(GS_MNA_AT(&m, r, cn), 1, ctx);
                    gs_poly_set_si(GS_MNA_AT(&m, rn, c), 1, ctx);
                }
            }
            gs_poly_set(GS_MNA_AT(&m, r0, j0), &a, ctx);
            gs_poly_set_si(GS_MNA_AT(&m, r0 == 0 ? 1 : 0, n), 1, ctx);
            gs_poly_set_si(GS_MNA_AT(&m, n, j0 == n - 1 ? n - 2 : n - 1), 1,
                           ctx);
            gs_poly_init(&da);
            gs_poly_init(&dm);
            gs_poly_init(&want);
            gs_poly_mul(&want, &a, &t1, ctx);
            CHECK_MSG(minors(&da, &dm, &m, ctx) == GS_OK
                      && equal_up_to(&sign, &da, &want, ctx),
                      "wide, lone entry at (%d, %d): det A", r0, j0);
            gs_poly_set(&want, &a, ctx);    /* the unknown is -1 / det T */
            CHECK_MSG(equal_up_to(&sign, &dm, &want, ctx),
                      "wide, lone entry at (%d, %d): det M", r0, j0);
            gs_poly_clear(&da);
            gs_poly_clear(&dm);
            gs_poly_clear(&want);
            gs_mna_clear(&m);
        }
    gs_poly_clear(&t0);
    gs_poly_clear(&t1);
    gs_poly_clear(&t2);
    gs_poly_clear(&x);
    gs_poly_clear(&a);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* The n x n tridiagonal matrix with x on the diagonal and 1 beside it has
   determinant U_n(x/2) = sum_k (-1)^k C(n-k, k) x^(n-2k). */
static void test_chebyshev(void)
{
    int n;
    for (n = 1; n <= 40; n++) {
        gs_symtab *st = gs_symtab_new();
        gs_polyctx *ctx = context(st, 1, "x");
        gs_mna m;
        gs_poly da, dm, want, t;
        gs_int c;
        int i, k, sign = 0;

        mna_new(&m, n);
        for (i = 0; i < n; i++) {
            gs_poly_set_var(GS_MNA_AT(&m, i, i), 0, 1, ctx);
            if (i + 1 < n) {
                gs_poly_set_si(GS_MNA_AT(&m, i, i + 1), 1, ctx);
                gs_poly_set_si(GS_MNA_AT(&m, i + 1, i), 1, ctx);
            }
        }
        gs_poly_init(&da);
        gs_poly_init(&dm);
        gs_poly_init(&want);
        gs_poly_init(&t);
        gs_int_init(&c);
        for (k = 0; 2 * k <= n; k++) {
            /* C(n-k, k) by the product formula, exactly */
            int q;
            gs_int_set_si(&c, 1);
            for (q = 1; q <= k; q++) {
                gs_int f;
                gs_int_init(&f);
                gs_int_set_si(&f, n - k - q + 1);
                gs_int_mul(&c, &c, &f);
                gs_int_set_si(&f, q);
                gs_int_divexact(&c, &c, &f);
                gs_int_clear(&f);
            }
            if (k & 1)
                gs_int_neg(&c, &c);
            gs_poly_set_var(&t, 0, (unsigned)(n - 2 * k), ctx);
            gs_poly_mul_int(&t, &t, &c, ctx);
            gs_poly_add(&want, &want, &t, ctx);
        }
        CHECK_MSG(minors(&da, &dm, &m, ctx) == GS_OK
                  && equal_up_to(&sign, &da, &want, ctx), "U_%d", n);
        CHECK_MSG(gs_poly_is_zero(&dm), "U_%d: border is zero", n);
        gs_int_clear(&c);
        gs_poly_clear(&da);
        gs_poly_clear(&dm);
        gs_poly_clear(&want);
        gs_poly_clear(&t);
        gs_mna_clear(&m);
        gs_polyctx_free(ctx);
        gs_symtab_free(st);
    }
}

/* A random entry: 1-3 terms, small coefficients, degree <= 2 in 5
   variables. */
static void random_entry(gs_poly *e, const gs_polyctx *ctx)
{
    unsigned terms = 1 + rnd(3), t;
    unsigned ex[5];
    gs_int c;
    gs_int_init(&c);
    gs_poly_zero(e);
    for (t = 0; t < terms; t++) {
        int v;
        for (v = 0; v < 5; v++)
            ex[v] = rnd(4) == 0 ? rnd(3) : 0;
        gs_int_set_si(&c, (int64_t)rnd(7) - 3);
        gs_poly_push_term(e, &c, ex, ctx);
    }
    gs_poly_canonicalise(e, ctx);
    gs_int_clear(&c);
}

static void random_matrix(gs_mna *m, int n, unsigned density,
                          const gs_polyctx *ctx)
{
    int i, j;
    mna_new(m, n);
    for (i = 0; i <= n; i++)
        for (j = 0; j <= n; j++)
            if ((i < n || j < n) && (i == j || rnd(100) < density))
                random_entry(GS_MNA_AT(m, i, j), ctx);
}

/* The expansion of m (stats in *ms, may be NULL) and the elimination of
   a copy agree up to their common sign, singular both or neither; what
   names the case.  Returns the terms of det A (0 when singular). */
static size_t agree_with_elimination(const gs_mna *m, gs_minors_stats *ms,
                                     const gs_polyctx *ctx, const char *what)
{
    gs_mna copy;
    gs_poly da, dm, ea, em;
    gs_elim_opts eo;
    gs_minors_opts o;
    gs_diag d;
    size_t k, cells = (size_t)(m->n + 1) * (size_t)(m->n + 1), terms;
    int sign = 0, rm, re;

    mna_new(&copy, m->n);
    for (k = 0; k < cells; k++)
        gs_poly_set(&copy.m[k], &m->m[k], ctx);
    gs_poly_init(&da);
    gs_poly_init(&dm);
    gs_poly_init(&ea);
    gs_poly_init(&em);
    gs_diag_init(&d);
    gs_elim_opts_default(&eo);
    gs_minors_opts_default(&o);
    o.max_products = 0;
    rm = gs_minors_bordered(&da, &dm, m, ctx, &o, ms, &d);
    re = gs_elim_bordered(&ea, &em, &copy, ctx, &eo, NULL, &d);
    if (re == GS_ESINGULAR)
        CHECK_MSG(rm == GS_ESINGULAR, "%s: singular", what);
    else
        CHECK_MSG(rm == GS_OK && re == GS_OK
                  && equal_up_to(&sign, &da, &ea, ctx)
                  && equal_up_to(&sign, &dm, &em, ctx), "%s", what);
    terms = re == GS_OK ? ea.length : 0;
    gs_diag_clear(&d);
    gs_poly_clear(&da);
    gs_poly_clear(&dm);
    gs_poly_clear(&ea);
    gs_poly_clear(&em);
    gs_mna_clear(&copy);
    return terms;
}

/* Expansion and elimination agree, up to their common sign. */
static void test_against_elimination(void)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx = context(st, 5, "y");
    int round;
    for (round = 0; round < 300; round++) {
        int n = 1 + (int)(round % 10);
        /* dense and large together would make elimination, the
           reference here, take minutes */
        unsigned density = 10 + 10 * (unsigned)(round % (n <= 6 ? 7 : 3));
        char what[48];
        gs_mna m;

        gs_rng_seed(&rng_state, 5000 + (unsigned long long)round);
        random_matrix(&m, n, density, ctx);
        snprintf(what, sizeof what, "seed %d, n = %d", round, n);
        agree_with_elimination(&m, NULL, ctx, what);
        gs_mna_clear(&m);
    }
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* A tridiagonal matrix of n unknowns with a sparse border: diagonal
   entries a + b y1, the others integers, so that the determinants stay
   polynomials of degree at most n in one symbol. */
static void banded_matrix(gs_mna *m, int n, const gs_polyctx *ctx)
{
    int i, j;
    char text[48];
    mna_new(m, n);
    for (i = 0; i < n; i++)
        for (j = i > 0 ? i - 1 : 0; j <= i + 1 && j < n; j++) {
            if (i == j)
                snprintf(text, sizeof text, "%d*y1 + %d", 1 + (int)rnd(3),
                         1 + (int)rnd(5));
            else
                snprintf(text, sizeof text, "%d", (int)rnd(7) - 3);
            set(m, i, j, text, ctx);
        }
    /* a border as a circuit's: the input in two rows, the output read
       from two unknowns */
    for (j = 0; j < 2; j++) {
        snprintf(text, sizeof text, "%d*y1 + 1", 1 + (int)rnd(3));
        set(m, (int)rnd((unsigned)n), n, text, ctx);
        snprintf(text, sizeof text, "%d", 1 + (int)rnd(3));
        set(m, n, (int)rnd((unsigned)n), text, ctx);
    }
}

/* Past one word of columns the expansion runs on the graph of minors:
   it agrees with elimination up to the common sign, and its budgets
   stop it with the level named. */
static void test_wide(void)
{
    static const int sizes[] = {64, 71, 100};
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx = context(st, 5, "y");
    size_t t;
    for (t = 0; t < sizeof sizes / sizeof *sizes; t++) {
        int n = sizes[t];
        gs_mna m;
        gs_poly da, dm;
        gs_minors_opts o;
        gs_minors_stats ms;
        gs_diag d;
        char what[32];
        size_t terms;

        gs_rng_seed(&rng_state, 9100 + (unsigned long long)n);
        banded_matrix(&m, n, ctx);
        snprintf(what, sizeof what, "banded, n = %d", n);
        terms = agree_with_elimination(&m, &ms, ctx, what);
        CHECK_MSG(terms > 2 && ms.minors > (size_t)n, "%s: %zu terms, "
                  "%zu minors", what, terms, ms.minors);
        /* a budget of 2 terms a minor: the graph's expansion stops with
           the message of the level expansion */
        gs_poly_init(&da);
        gs_poly_init(&dm);
        gs_diag_init(&d);
        gs_minors_opts_default(&o);
        o.max_terms = 2;
        CHECK_MSG(gs_minors_bordered(&da, &dm, &m, ctx, &o, &ms, &d)
                  == GS_EBUDGET, "%s", what);
        CHECK(d.n == 1 && strstr(d.v[0].message, "expansion level"));
        gs_diag_clear(&d);
        gs_poly_clear(&da);
        gs_poly_clear(&dm);
        gs_mna_clear(&m);
    }
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* Refusals: too many unknowns, too many products; budgets; singular. */
static void test_limits(void)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx = context(st, 5, "y");
    gs_minors_opts o;
    gs_minors_stats ms;
    gs_mna m;
    gs_poly da, dm;
    gs_diag d;
    int i, j;

    gs_poly_init(&da);
    gs_poly_init(&dm);
    gs_diag_init(&d);
    gs_minors_opts_default(&o);

    /* 64 unknowns, one more than a column mask holds: the graph of
       minors takes them; det of diag(3, ..., 3) = 3^64, of 102 bits
       (64 log2 3 = 101.4) */
    mna_new(&m, GS_MINORS_MAX_UNKNOWNS + 1);
    for (i = 0; i < m.n; i++)
        gs_poly_set_si(GS_MNA_AT(&m, i, i), 3, ctx);
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, &ms, &d) == GS_OK);
    CHECK_MSG(d.n == 0 && ms.minors >= 65 && ms.products >= 64,
              "%zu minors, %zu products", ms.minors, ms.products);
    CHECK(da.length == 1 && gs_int_bits(&da.coeffs[0]) == 102);
    if (da.length == 1) {
        char *text = gs_int_get_str(&da.coeffs[0]);
        /* 3^64 by hand (or any bignum calculator) */
        CHECK_MSG(strcmp(text, "3433683820292512484657849089281") == 0
                  || strcmp(text, "-3433683820292512484657849089281") == 0,
                  "det %s", text);
        free(text);
    }
    gs_mna_clear(&m);

    /* 63 unknowns on a diagonal: accepted, det = 2^63 */
    mna_new(&m, GS_MINORS_MAX_UNKNOWNS);
    for (i = 0; i < m.n; i++)
        gs_poly_set_si(GS_MNA_AT(&m, i, i), 2, ctx);
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, &ms, &d) == GS_OK);
    CHECK(da.length == 1 && gs_int_bits(&da.coeffs[0]) == 64);
    gs_mna_clear(&m);

    /* a dense 8 x 8 needs more than 100 products */
    mna_new(&m, 8);
    for (i = 0; i <= 8; i++)
        for (j = 0; j <= 8; j++)
            if (i < 8 || j < 8)
                gs_poly_set_var(GS_MNA_AT(&m, i, j), (i + 2 * j) % 5,
                                1 + (unsigned)(i * j % 3), ctx);
    o.max_products = 100;
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, NULL, &d) == GS_ERANGE);
    CHECK(d.n == 0);
    o.max_products = 0;
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, &ms, &d) == GS_OK);
    CHECK(ms.products > 100 && ms.minors > 0);
    /* a budget no single minor passes, while the many minors of the
       middle levels, kept at once, do: the memory bound stops it */
    o.max_terms = ms.max_minor_terms;
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, &ms, &d) == GS_EBUDGET);
    CHECK(d.nerrors == 1
          && strstr(d.v[0].message, "minors kept at once") != NULL);
    CHECK(ms.max_minor_terms <= o.max_terms);
    o.max_terms = 0;
    gs_diag_clear(&d);
    gs_diag_init(&d);
    gs_mna_clear(&m);

    /* term budget: the Vandermonde-like 4 x 4 of sums grows */
    mna_new(&m, 4);
    for (i = 0; i < 4; i++)
        for (j = 0; j <= 4; j++) {
            char text[32];
            snprintf(text, sizeof text, "y%d + y%d", 1 + i, 1 + (i + j) % 5);
            set(&m, i, j, text, ctx);
        }
    gs_poly_set_si(GS_MNA_AT(&m, 4, 0), 1, ctx);
    o.max_terms = 3;
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, &ms, &d)
          == GS_EBUDGET);
    CHECK(d.nerrors == 1 && strstr(d.v[0].message, "budget 3") != NULL);
    CHECK(ms.max_minor_terms > 3);
    o.max_terms = 0;
    gs_mna_clear(&m);

    /* singular: a zero row (pruned by structure), two equal rows */
    mna_new(&m, 3);
    set(&m, 0, 0, "y1", ctx);
    set(&m, 0, 1, "y2", ctx);
    set(&m, 2, 2, "y3", ctx);
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, NULL, &d)
          == GS_ESINGULAR);
    set(&m, 1, 0, "y1", ctx);
    set(&m, 1, 1, "y2", ctx);
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, NULL, &d)
          == GS_ESINGULAR);
    CHECK(d.nerrors == 1);      /* only the budget message above */
    gs_mna_clear(&m);

    gs_diag_clear(&d);
    gs_poly_clear(&da);
    gs_poly_clear(&dm);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

/* A dense 8 x 8, every entry one term (elimination works in place, so
   each run takes a new one). */
static void dense8(gs_mna *m, const gs_polyctx *ctx)
{
    int i, j;
    mna_new(m, 8);
    for (i = 0; i <= 8; i++)
        for (j = 0; j <= 8; j++)
            if (i < 8 || j < 8)
                gs_poly_set_var(GS_MNA_AT(m, i, j), (i + 2 * j) % 5,
                                1 + (unsigned)(i * j % 3), ctx);
}

/* The budgets beyond terms, on one dense 8 x 8 (every entry one term):
   memory and work stop the expansion and the elimination with their own
   messages, and budgets that do not bind give the same determinants. */
static void test_more_budgets(void)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx = context(st, 5, "y");
    gs_minors_opts o;
    gs_elim_opts eo;
    gs_mna m;
    gs_poly da, dm, ra, rm;
    gs_diag d;
    int i;

    gs_poly_init(&da);
    gs_poly_init(&dm);
    gs_poly_init(&ra);
    gs_poly_init(&rm);
    gs_diag_init(&d);
    dense8(&m, ctx);
    gs_minors_opts_default(&o);
    o.max_products = 0;
    CHECK(gs_minors_bordered(&ra, &rm, &m, ctx, &o, NULL, &d) == GS_OK);

    o.max_bytes = 4096;
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, NULL, &d) == GS_EBUDGET);
    CHECK(d.nerrors == 1 && strstr(d.v[0].message, "memory budget") != NULL);
    gs_diag_clear(&d);
    o.max_bytes = (size_t)1 << 30;
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, NULL, &d) == GS_OK);
    CHECK(gs_poly_equal(&da, &ra, ctx) && gs_poly_equal(&dm, &rm, ctx));
    o.max_bytes = 0;
    /* a term budget of 1: the first product's work (1000 pairs) passes
       the work bound only on a larger matrix, so here the terms stop it */
    o.max_terms = 1;
    CHECK(gs_minors_bordered(&da, &dm, &m, ctx, &o, NULL, &d) == GS_EBUDGET);
    gs_diag_clear(&d);
    o.max_terms = 0;

    gs_elim_opts_default(&eo);
    eo.max_bytes = 2048;
    gs_mna_clear(&m);
    dense8(&m, ctx);
    CHECK(gs_elim_bordered(&da, &dm, &m, ctx, &eo, NULL, &d) == GS_EBUDGET);
    CHECK(d.nerrors == 1 && strstr(d.v[0].message, "memory budget") != NULL);
    gs_diag_clear(&d);
    eo.max_bytes = (size_t)1 << 30;
    gs_mna_clear(&m);
    dense8(&m, ctx);
    CHECK(gs_elim_bordered(&da, &dm, &m, ctx, &eo, NULL, &d) == GS_OK);
    /* elimination and expansion agree up to the sign convention of the
       bordered determinant (test_against_elimination fixes it) */
    CHECK(da.length == ra.length && dm.length == rm.length);
    eo.max_bytes = 0;
    /* a budget of 4 terms: the products outgrow 8 x 4 before their
       division, or the work bound (4000 pairs) is met first */
    eo.max_terms = 4;
    gs_mna_clear(&m);
    dense8(&m, ctx);
    i = gs_elim_bordered(&da, &dm, &m, ctx, &eo, NULL, &d);
    CHECK_MSG(i == GS_EBUDGET, "rc %d, det terms %zu and %zu", i, ra.length,
              rm.length);
    CHECK(d.nerrors == 1
          && (strstr(d.v[0].message, "before its exact division") != NULL
              || strstr(d.v[0].message, "work budget") != NULL
              || strstr(d.v[0].message, "an entry reached") != NULL));
    gs_diag_clear(&d);

    gs_mna_clear(&m);
    gs_poly_clear(&da);
    gs_poly_clear(&dm);
    gs_poly_clear(&ra);
    gs_poly_clear(&rm);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
}

int main(void)
{
    test_wide();
    test_vandermonde();
    test_chebyshev();
    test_lone_row();
    test_lone_row_wide();
    test_against_elimination();
    test_limits();
    test_more_budgets();
    return check_report("minors");
}
