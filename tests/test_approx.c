/* test_approx.c - short forms and their measured errors. See LICENSE. */
#include "check.h"
#include "analysis/approx.h"
#include "analysis/job.h"
#include "analysis/mgraph.h"
#include "analysis/mna.h"
#include "algebra/poly.h"
#include "algebra/sym.h"
#include "numeric/numsolve.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static char *form_of(const char *n, const char *d, int style)
{
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    gs_poly pn, pd;
    char *s;
    const char *names[] = {"gm1", "r1", "r3", "a", "b", "c", "e"};
    size_t i;
    for (i = 0; i < sizeof names / sizeof names[0]; i++)
        gs_symtab_intern(st, names[i]);
    ctx = gs_polyctx_new(st, gs_symtab_count(st));
    gs_poly_init(&pn);
    gs_poly_init(&pd);
    gs_poly_set_str(&pn, n, ctx);
    gs_poly_set_str(&pd, d, ctx);
    s = gs_approx_form(&pn, &pd, style, ctx);
    gs_poly_clear(&pn);
    gs_poly_clear(&pd);
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
    return s;
}

static void test_forms(void)
{
    char *s;
    /* par(a, b) = a*b/(a + b): the definition in docs/approx.md */
    s = form_of("gm1*r1*r3", "r1 + r3", GS_FORM_TEXT);
    CHECK_MSG(strcmp(s, "gm1*par(r1, r3)") == 0, "got %s", s);
    free(s);
    s = form_of("-gm1*r1*r3", "r1 + r3", GS_FORM_PRETTY);
    CHECK_MSG(strcmp(s, "-gm1*(r1||r3)") == 0, "got %s", s);
    free(s);
    s = form_of("gm1*r1*r3", "r1 + r3", GS_FORM_LATEX);
    CHECK_MSG(strstr(s, "\\parallel") != NULL, "got %s", s);
    free(s);
    /* (a + b)(c + e) expanded factors back (a product of two multilinear
       polynomials in disjoint symbols: a math fact) */
    s = form_of("a*c + a*e + b*c + b*e", "1", GS_FORM_TEXT);
    CHECK_MSG(strstr(s, "(a + b)") && strstr(s, "(c + e)"), "got %s", s);
    free(s);
    /* a sum with no product in the numerator stays a sum */
    s = form_of("r1", "r1 + r3", GS_FORM_TEXT);
    CHECK_MSG(strstr(s, "par") == NULL, "got %s", s);
    free(s);
}

static int load(gs_job *j, const char *path)
{
    gs_diag d;
    gs_derive_opts o;
    int rc;
    gs_diag_init(&d);
    gs_derive_opts_default(&o);
    rc = gs_job_load(j, path, &d);
    if (rc == GS_OK)
        rc = gs_job_derive(j, NULL, &o, &d);
    if (rc == GS_OK)
        rc = gs_job_bind(j, NULL, 0, &d);
    gs_diag_print(stderr, &d);
    gs_diag_clear(&d);
    return rc;
}

/* The nominal error of r recomputed on a grid three times as dense,
   straight from the polynomials. */
static long double recompute_db(const gs_approx_result *r, const gs_job *j)
{
    int nv = j->ctx->nvars, v, g, n = 3 * r->npoints;
    long double complex *cv = calloc((size_t)nv, sizeof *cv);
    long double worst = 0;
    for (v = 0; v < nv; v++)
        cv[v] = j->vals[v];
    for (g = 0; g < n; g++) {
        long double f = r->f_lo * powl(r->f_hi / r->f_lo,
                                       g / (long double)(n - 1));
        long double complex ha, he;
        cv[j->tf[0].s_var] = 2 * 3.14159265358979323846L * f * I;
        ha = gs_poly_eval_lc(&r->h.num, cv, j->ctx)
             / gs_poly_eval_lc(&r->h.den, cv, j->ctx);
        he = gs_poly_eval_lc(&j->tf[0].num, cv, j->ctx)
             / gs_poly_eval_lc(&j->tf[0].den, cv, j->ctx);
        if (fabsl(20 * log10l(cabsl(ha / he))) > worst)
            worst = fabsl(20 * log10l(cabsl(ha / he)));
    }
    free(cv);
    return worst;
}

static void test_miller(void)
{
    static const long double tols[] = {3, 1, 0.3L, 0.1L, 0.03L, 0.01L, 0};
    gs_job j;
    size_t t, i;
    long double prev = INFINITY;
    gs_job_init(&j);
    CHECK(load(&j, "examples/miller_opamp.gsc") == GS_OK);
    for (t = 0; j.ntf == 1 && t < sizeof tols / sizeof tols[0]; t++) {
        gs_approx_opts o;
        gs_approx_result r;
        gs_diag d;
        long double e, re;
        gs_approx_opts_default(&o);
        o.tol_db = tols[t];
        o.tol_deg = 10 * tols[t];
        gs_diag_init(&d);
        gs_approx_result_init(&r);
        CHECK(gs_approx_run(&r, &j, 0, &o, &d) == GS_OK);
        CHECK(r.met);
        e = r.err_db > r.spread_db ? r.err_db : r.spread_db;
        CHECK_MSG(e <= tols[t], "tol %Lg error %Lg", tols[t], e);
        /* tightening never gives a larger error (docs/approx.md) */
        CHECK_MSG(e <= prev, "tol %Lg: %Lg after %Lg", tols[t], e, prev);
        prev = e;
        /* the printed error is not exceeded on a denser grid beyond the
           grid's resolution (5 % of the figure, 1e-9 dB) */
        re = recompute_db(&r, &j);
        CHECK_MSG(re <= r.err_db * 1.05L + 1e-9L, "recomputed %Lg printed "
                  "%Lg", re, r.err_db);
        if (tols[t] == 0)
            CHECK(gs_poly_equal(&r.h.num, &j.tf[0].num, j.ctx)
                  && gs_poly_equal(&r.h.den, &j.tf[0].den, j.ctx));
        /* every claimed root error recomputed from the numbers */
        for (i = 0; i < r.nroots; i++)
            if (r.roots[i].est != GS_APPROX_EST_NONE)
                CHECK(fabsl(cabsl(r.roots[i].value - r.roots[i].exact)
                            / cabsl(r.roots[i].exact)
                            - r.roots[i].rel_error) <= 1e-12L);
        gs_approx_result_clear(&r);
        gs_diag_clear(&d);
    }
    gs_job_clear(&j);
}

/* The worst |dB| and |degrees| of r's short form against the independent
   numeric solve of the circuit (numsolve.c: its own stamps, LU) on a grid
   three times as dense as r's, at the nominal values. */
static void error_vs_numsolve(long double *db, long double *deg,
                              const gs_approx_result *r, const gs_job *j)
{
    int nv = j->ctx->nvars, v, g, n = 3 * r->npoints;
    long double complex *cv = calloc((size_t)nv + 1, sizeof *cv);
    gs_diag d;
    gs_diag_init(&d);
    *db = *deg = 0;
    for (v = 0; v < nv; v++)
        cv[v] = j->vals[v];
    for (g = 0; g < n; g++) {
        long double f = r->f_lo * powl(r->f_hi / r->f_lo,
                                       g / (long double)(n - 1));
        long double complex s = 2 * 3.14159265358979323846L * f * I, ha, he;
        cv[j->tf[0].s_var] = s;
        ha = gs_poly_eval_lc(&r->h.num, cv, j->ctx)
             / gs_poly_eval_lc(&r->h.den, cv, j->ctx);
        CHECK(gs_numsolve(&he, j->c, j->out_index[0], j->vals, s, &d)
              == GS_OK);
        if (fabsl(20 * log10l(cabsl(ha / he))) > *db)
            *db = fabsl(20 * log10l(cabsl(ha / he)));
        if (fabsl(cargl(ha / he)) * 180 / 3.14159265358979323846L > *deg)
            *deg = fabsl(cargl(ha / he)) * 180 / 3.14159265358979323846L;
    }
    gs_diag_clear(&d);
    free(cv);
}

/* The graph path on circuits that expand: the same short form as the
   exact path, or one whose measured error is within the tolerance; the
   exact numbers (DC gain, roots) the same; and its error recomputed
   against the numeric solve. */
static void test_graph_same(const char *path)
{
    gs_job j;
    gs_approx_opts o;
    gs_approx_result re, rg;
    gs_diag d;
    gs_mna m;
    gs_mgraph *g = malloc(sizeof *g);
    long double db, deg;
    size_t i;
    gs_job_init(&j);
    CHECK_MSG(load(&j, path) == GS_OK && j.ntf >= 1, "%s", path);
    gs_approx_opts_default(&o);
    gs_diag_init(&d);
    gs_approx_result_init(&re);
    gs_approx_result_init(&rg);
    CHECK(gs_approx_run(&re, &j, 0, &o, &d) == GS_OK);
    CHECK(strcmp(re.path, "exact expansion") == 0);
    /* hand output 0 its graph, as derive does over the budget */
    memset(&m, 0, sizeof m);
    CHECK(gs_mna_build(&m, j.c, j.out_index[0], j.ctx, &d) == GS_OK);
    CHECK(gs_mgraph_build(g, &m, GS_MGRAPH_ORDER_GREEDY, j.ctx) == GS_OK);
    gs_mna_clear(&m);
    j.graph = calloc(j.ntf, sizeof *j.graph);
    j.graph[0] = g;
    CHECK(gs_approx_run(&rg, &j, 0, &o, &d) == GS_OK);
    CHECK(strcmp(rg.path, "graph of minors") == 0);
    CHECK_MSG((gs_poly_equal(&rg.h.num, &re.h.num, j.ctx)
               && gs_poly_equal(&rg.h.den, &re.h.den, j.ctx))
              || (rg.met && rg.err_db <= o.tol_db && rg.spread_db <= o.tol_db
                  && rg.err_deg <= o.tol_deg && rg.spread_deg <= o.tol_deg),
              "%s: graph path %Lg dB, %Lg deg", path, rg.err_db, rg.err_deg);
    CHECK_MSG(re.met == rg.met, "%s: met %d, graph %d", path, re.met,
              rg.met);
    CHECK_MSG(fabsl(rg.dc_exact - re.dc_exact)
              <= 1e-9L * fabsl(re.dc_exact), "%s: dc %Lg, graph %Lg", path,
              re.dc_exact, rg.dc_exact);
    CHECK(rg.nroots == re.nroots);
    for (i = 0; i < rg.nroots && i < re.nroots; i++)
        CHECK_MSG(cabsl(rg.roots[i].exact - re.roots[i].exact)
                  <= 1e-9L * cabsl(re.roots[i].exact), "%s root %zu", path,
                  i);
    error_vs_numsolve(&db, &deg, &rg, &j);
    CHECK_MSG(db <= rg.err_db * 1.05L + 1e-9L && db <= o.tol_db,
              "%s: %Lg dB against the numeric solve, printed %Lg", path, db,
              rg.err_db);
    gs_approx_result_clear(&re);
    gs_approx_result_clear(&rg);
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

/* A chain of 10 common-source stages (tests/cli/approx_graph_chain.gsc):
   about 5e7 terms in D, over the budget, so the job keeps the graph and
   approx runs on its dominant terms.  The form meets 0.5 dB / 5 degrees,
   checked against the numeric solve; the leading s term of D is the
   sum of the open-circuit time constants with the Miller-multiplied
   cgd terms ro(i-1) gm(i) ro(i) cgd(i) (Gray, Hurst, Lewis, Meyer,
   ch. 7, from memory), so the symbol cgd5 appears in the short form. */
static void test_graph_large(void)
{
    gs_job j;
    gs_approx_opts o;
    gs_approx_result r;
    gs_derive_opts dopt;
    gs_diag d;
    long double db, deg;
    char *den;
    gs_job_init(&j);
    gs_diag_init(&d);
    gs_derive_opts_default(&dopt);
    CHECK(gs_job_load(&j, "tests/cli/approx_graph_chain.gsc", &d) == GS_OK);
    j.graph_ok = 1;
    CHECK(gs_job_derive(&j, NULL, &dopt, &d) == GS_OK);
    CHECK(gs_job_bind(&j, NULL, 0, &d) == GS_OK);
    CHECK(j.ntf == 1 && j.graph && j.graph[0]);
    if (!(j.ntf == 1 && j.graph && j.graph[0])) {
        gs_diag_print(stderr, &d);
        gs_diag_clear(&d);
        gs_job_clear(&j);
        return;
    }
    gs_approx_opts_default(&o);
    o.tol_db = 0.5L;
    o.tol_deg = 5;
    o.f_lo = 1e3L;
    o.f_hi = 1e7L;
    gs_approx_result_init(&r);
    CHECK(gs_approx_run(&r, &j, 0, &o, &d) == GS_OK);
    CHECK(r.met && strcmp(r.path, "graph of minors") == 0);
    error_vs_numsolve(&db, &deg, &r, &j);
    CHECK_MSG(db <= o.tol_db && deg <= o.tol_deg, "%Lg dB, %Lg deg", db,
              deg);
    CHECK_MSG(db <= r.err_db * 1.05L + 1e-9L, "%Lg dB, printed %Lg", db,
              r.err_db);
    den = gs_poly_get_str(&r.h.den, j.ctx);
    CHECK_MSG(strstr(den, "ro4*gm5*ro5*cgd5") != NULL, "den %s", den);
    free(den);
    gs_approx_result_clear(&r);
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

int main(void)
{
    test_forms();
    test_miller();
    test_graph_same("examples/miller_opamp.gsc");
    test_graph_same("examples/cascode.gsc");
    test_graph_same("examples/cs_degen.gsc");
    test_graph_large();
    return check_report("test_approx");
}
