/* test_approx.c - short forms and their measured errors. See LICENSE. */
#include "check.h"
#include "analysis/approx.h"
#include "analysis/job.h"
#include "algebra/poly.h"
#include "algebra/sym.h"

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

int main(void)
{
    test_forms();
    test_miller();
    return check_report("test_approx");
}
