/* test_approx.c - short forms and their measured errors. See LICENSE. */
#include "check.h"
#include "testjob.h"
#include "analysis/approx.h"
#include "analysis/job.h"
#include "analysis/mgraph.h"
#include "analysis/mna.h"
#include "algebra/poly.h"
#include "algebra/sym.h"
#include "numeric/numsolve.h"
#include "numeric/roots.h"
#include "testlib.h"

#include <complex.h>
#include <math.h>
#include <stdio.h>
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
    return test_job_load(j, path);
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

/* ---- honest errors on random circuits ------------------------------- */

/* The symbols the random networks share: six, so that approx samples its
   spread box at every corner (docs/approx.md) and a point inside the box
   is a point the printed spread error speaks for. */
static const char *const rand_syms[] = {"Ra", "Rb", "Ca", "Cb", "ga", "gb"};

/* A seeded random R/C/gm network: vin drives node 1 through a resistor,
   nodes 2..n hang on a random resistor tree (every node keeps a DC path),
   2-4 capacitors and 1-2 transconductors join random nodes; each element's
   value is a small multiple of one of the six shared symbols, whose
   values are drawn log-uniformly.  The output is the last node. */
static char *random_rcg(gs_rng *st)
{
    static const int mult[] = {1, 2, 3, 5, 10};
    static const char *const scale[] = {"k", "p", "u"};
    char *text = calloc(4096, 1);
    int n = 3 + (int)test_below(st, 4), k, e = 0, nc, ng;
    char *p = text;
    p += sprintf(p, "vsource vin in gnd\n");
    p += sprintf(p, "resistor X%d in 1 = %d*Ra\n", e++,
                 mult[test_below(st, 5)]);
    for (k = 2; k <= n; k++)
        p += sprintf(p, "resistor X%d %d %u = %d*%s\n", e++, k,
                     test_below(st, (unsigned)k), mult[test_below(st, 5)],
                     rand_syms[test_below(st, 2)]);
    nc = 2 + (int)test_below(st, 3);
    for (k = 0; k < nc; k++) {
        unsigned a = 1 + test_below(st, (unsigned)n);
        unsigned b = test_below(st, (unsigned)n + 1);
        if (b == a)
            b = 0;
        p += sprintf(p, "capacitor X%d %u %u = %d*%s\n", e++, a, b,
                     mult[test_below(st, 5)], rand_syms[2 + test_below(st, 2)]);
    }
    ng = 1 + (int)test_below(st, 2);
    for (k = 0; k < ng; k++) {
        unsigned o = 1 + test_below(st, (unsigned)n);
        unsigned c = 1 + test_below(st, (unsigned)n);
        p += sprintf(p, "vccs X%d %u 0 %u 0 = %d*%s\n", e++, o, c,
                     mult[test_below(st, 5)], rand_syms[4 + test_below(st, 2)]);
    }
    for (k = 0; k < 6; k++)     /* 1 .. 100 of k, p or u, log-uniform */
        p += sprintf(p, "value %s = %.4Lg%s\n", rand_syms[k],
                     powl(100, test_unit(st)), scale[k / 2]);
    sprintf(p, "transfer H = v(%d) / vin\n", n);
    return text;
}

/* The error of r's simplified H against the numeric solve of the circuit
   (src/numeric/numsolve.c, an LU solve of the circuit stamped again, which
   shares no code with the symbolic path) at f Hz, with the symbols at
   vals.  0 when the solve fails. */
static int err_at(long double *db, long double *deg, const gs_job *j,
                  size_t out, const gs_approx_result *r,
                  const long double *vals, long double f)
{
    int nv = j->ctx->nvars, v, rc;
    long double complex *cv = calloc((size_t)nv, sizeof *cv), hn, ha, q;
    long double complex s = 2 * 3.14159265358979323846L * f * I;
    gs_diag d;
    gs_diag_init(&d);
    rc = gs_numsolve(&hn, j->c, j->out_index[out], vals, s, &d);
    gs_diag_clear(&d);
    for (v = 0; v < nv; v++)
        cv[v] = vals[v];
    cv[j->tf[out].s_var] = s;
    ha = gs_poly_eval_lc(&r->h.num, cv, j->ctx)
         / gs_poly_eval_lc(&r->h.den, cv, j->ctx);
    free(cv);
    if (rc != GS_OK)
        return 0;
    q = ha / hn;
    *db = fabsl(20 * log10l(cabsl(q)));
    *deg = fabsl(cargl(q)) * 180 / 3.14159265358979323846L;
    return 1;
}

/* One sweep at vals over r's band on a grid `dense` times as dense as r's
   (every dense-th point is one of r's): the largest errors on r's own
   points, on the dense grid, and the grid's resolution, the largest
   change of the error between two neighbouring points of r's grid. */
typedef struct sweep {
    long double db, deg;            /* on r's points */
    long double ddb, ddeg;          /* on the dense grid */
    long double rdb, rdeg;          /* resolution */
    int ok;
} sweep;

static sweep sweep_at(const gs_job *j, size_t out,
                      const gs_approx_result *r, const long double *vals,
                      int dense)
{
    sweep w;
    int n = dense * (r->npoints - 1) + 1, g;
    long double pdb = 0, pdeg = 0;
    memset(&w, 0, sizeof w);
    w.ok = 1;
    for (g = 0; g < n && w.ok; g++) {
        long double f = r->f_lo * powl(r->f_hi / r->f_lo,
                                       g / (long double)(n - 1));
        long double db = 0, deg = 0;
        w.ok = err_at(&db, &deg, j, out, r, vals, f);
        if (db > w.ddb) w.ddb = db;
        if (deg > w.ddeg) w.ddeg = deg;
        if (g % dense)
            continue;
        if (db > w.db) w.db = db;
        if (deg > w.deg) w.deg = deg;
        if (g && fabsl(db - pdb) > w.rdb) w.rdb = fabsl(db - pdb);
        if (g && fabsl(deg - pdeg) > w.rdeg) w.rdeg = fabsl(deg - pdeg);
        pdb = db;
        pdeg = deg;
    }
    return w;
}

/* pt = the nominal values with symbol sym[i] at its upper end of the box
   when bit i of c is set, else at its lower end */
static void corner(long double *pt, const gs_job *j, const int *sym, int ns,
                   int c, long double spread)
{
    int i;
    memcpy(pt, j->vals, (size_t)j->ctx->nvars * sizeof *pt);
    for (i = 0; i < ns; i++)
        pt[sym[i]] *= (c >> i) & 1 ? 1 + spread : 1 - spread;
}

/* same number up to rounding in the last digits of long double sums */
static int agree(long double a, long double b)
{
    return fabsl(a - b) <= 1e-7L * (1 + fabsl(b));
}

/* Every claimed root checked against the roots of the exact polynomial
   found here (numeric/roots.c, the finder `poles` uses), and every
   estimate's number recomputed from its own symbolic form. */
static void check_roots(const gs_approx_result *r, const gs_job *j,
                        size_t out, const char *what)
{
    size_t i;
    for (i = 0; i < r->nroots; i++) {
        const gs_approx_root *x = &r->roots[i];
        const gs_poly *p = x->is_zero ? &j->tf[out].num : &j->tf[out].den;
        int deg, k, best = -1;
        long double *a = gs_job_coeffs(j, p, &deg);
        long double complex *rt = calloc((size_t)(deg > 0 ? deg : 1),
                                         sizeof *rt), est;
        long double bestd = INFINITY, rel;
        gs_roots_info info;
        if (x->at_origin || x->pair_of >= 0 || deg < 1) {
            free(a);
            free(rt);
            continue;
        }
        gs_roots(rt, NULL, a, deg, &info);
        for (k = 0; k < info.nroots; k++)
            if (cabsl(rt[k] - x->exact) < bestd) {
                bestd = cabsl(rt[k] - x->exact);
                best = k;
            }
        CHECK_MSG(best >= 0 && bestd <= 1e-9L * cabsl(rt[best]),
                  "%s: root %zu exact %Lg not a root", what, i,
                  creall(x->exact));
        if (best >= 0 && x->est != GS_APPROX_EST_NONE) {
            if (x->est == GS_APPROX_EST_REAL) {
                est = -gs_poly_eval_ld(&x->wn, j->vals, j->ctx)
                      / gs_poly_eval_ld(&x->wd, j->vals, j->ctx);
            } else {        /* the root of a2 s^2 + a1 s + a0 */
                long double a0 = gs_poly_eval_ld(&x->a0, j->vals, j->ctx);
                long double a1 = gs_poly_eval_ld(&x->a1, j->vals, j->ctx);
                long double a2 = gs_poly_eval_ld(&x->a2, j->vals, j->ctx);
                est = (-a1 + csqrtl(a1 * a1 - 4 * a0 * a2)) / (2 * a2);
                if (cabsl(conjl(est) - x->value) < cabsl(est - x->value))
                    est = conjl(est);
                if (cabsl((-a1 - csqrtl(a1 * a1 - 4 * a0 * a2)) / (2 * a2)
                          - x->value) < cabsl(est - x->value))
                    est = (-a1 - csqrtl(a1 * a1 - 4 * a0 * a2)) / (2 * a2);
            }
            CHECK_MSG(cabsl(est - x->value) <= 1e-9L * cabsl(est),
                      "%s: root %zu printed %Lg, its form gives %Lg", what,
                      i, creall(x->value), creall(est));
            rel = cabsl(x->value - rt[best]) / cabsl(rt[best]);
            CHECK_MSG(fabsl(rel - x->rel_error) <= 1e-9L * (rel + 1e-9L),
                      "%s: root %zu error %Lg, recomputed %Lg", what, i,
                      x->rel_error, rel);
        }
        free(a);
        free(rt);
    }
}

/* Run approx on output `out` of j under o and recompute what it prints
   (a math fact: a maximum taken on a grid can be exceeded between its
   points only by about the error's change over one grid step, the grid's
   own resolution).  When the box is sampled at its corners, its corners
   and points inside it drawn from st are checked too.  0 when approx
   cannot run (D zero at a point of the box). */
static int honest(const gs_job *j, size_t out, const gs_approx_opts *o,
                  const char *what, gs_rng *st)
{
    gs_approx_result r;
    gs_diag d;
    unsigned char *used;
    long double *pt, bound;
    int rc, nv = j->ctx->nvars, v, ns = 0, c, sym[8];
    sweep w;
    gs_diag_init(&d);
    gs_approx_result_init(&r);
    rc = gs_approx_run(&r, j, out, o, &d);
    gs_diag_clear(&d);
    if (rc != GS_OK) {
        gs_approx_result_clear(&r);
        return 0;
    }
    /* the nominal point: the same figure on approx's own grid, and not
       exceeded beyond the resolution on the dense one */
    w = sweep_at(j, out, &r, j->vals, 4);
    CHECK_MSG(w.ok && agree(w.db, r.err_db) && agree(w.deg, r.err_deg),
              "%s: printed %Lg dB %Lg deg, recomputed %Lg dB %Lg deg",
              what, r.err_db, r.err_deg, w.db, w.deg);
    CHECK_MSG(w.ddb <= r.err_db + w.rdb + 1e-9L
              && w.ddeg <= r.err_deg + w.rdeg + 1e-9L,
              "%s: dense grid %Lg dB %Lg deg over printed %Lg dB %Lg deg",
              what, w.ddb, w.ddeg, r.err_db, r.err_deg);
    used = gs_job_used_symbols(j);
    for (v = 0; v < nv; v++)
        if (used[v] && v != j->tf[out].s_var && ns < 8)
            sym[ns++] = v;
    pt = calloc((size_t)(nv > 0 ? nv : 1), sizeof *pt);
    if (r.nspread > 0 && r.spread_corners) {
        long double cdb = 0, cdeg = 0;
        int worst = 0;
        /* every corner on approx's own grid, the worst one dense */
        for (c = 0; c < (1 << ns); c++) {
            corner(pt, j, sym, ns, c, o->spread);
            w = sweep_at(j, out, &r, pt, 1);
            CHECK(w.ok);
            if (w.db > cdb || w.deg > cdeg)
                worst = c;
            if (w.db > cdb) cdb = w.db;
            if (w.deg > cdeg) cdeg = w.deg;
        }
        CHECK_MSG(agree(cdb, r.spread_db) && agree(cdeg, r.spread_deg),
                  "%s: spread printed %Lg dB %Lg deg, recomputed %Lg dB "
                  "%Lg deg", what, r.spread_db, r.spread_deg, cdb, cdeg);
        corner(pt, j, sym, ns, worst, o->spread);
        w = sweep_at(j, out, &r, pt, 4);
        CHECK_MSG(w.ok && w.ddb <= r.spread_db + w.rdb + 1e-9L
                  && w.ddeg <= r.spread_deg + w.rdeg + 1e-9L,
                  "%s: the worst corner's dense grid %Lg dB %Lg deg over "
                  "the printed spread error", what, w.ddb, w.ddeg);
        for (c = 0; c < 4; c++) {
            int i;
            memcpy(pt, j->vals, (size_t)nv * sizeof *pt);
            for (i = 0; i < ns; i++)
                pt[sym[i]] *= 1 + o->spread * (2 * test_unit(st) - 1);
            w = sweep_at(j, out, &r, pt, 4);
            bound = r.spread_db > r.err_db ? r.spread_db : r.err_db;
            CHECK_MSG(w.ok && w.ddb <= bound + w.rdb + 1e-9L,
                      "%s: inside the box %Lg dB over printed %Lg dB", what,
                      w.ddb, bound);
            bound = r.spread_deg > r.err_deg ? r.spread_deg : r.err_deg;
            CHECK_MSG(w.ok && w.ddeg <= bound + w.rdeg + 1e-9L,
                      "%s: inside the box %Lg deg over printed %Lg deg",
                      what, w.ddeg, bound);
        }
    }
    /* the DC figure recomputed from the numeric solve at s = 0 */
    if (r.dc_order == 0) {
        long double complex h0;
        gs_diag_init(&d);
        if (gs_numsolve(&h0, j->c, j->out_index[out], j->vals, 0, &d)
            == GS_OK)
            CHECK_MSG(agree(r.dc_exact, creall(h0))
                      && agree(r.dc_value,
                               gs_poly_eval_ld(&r.dcn, j->vals, j->ctx)
                               / gs_poly_eval_ld(&r.dcd, j->vals, j->ctx)),
                      "%s: dc %Lg exact %Lg, solve %Lg", what, r.dc_value,
                      r.dc_exact, creall(h0));
        gs_diag_clear(&d);
    }
    check_roots(&r, j, out, what);
    free(pt);
    free(used);
    gs_approx_result_clear(&r);
    return 1;
}

/* The honest-errors test on 50 seeded random circuits, over a ladder of
   tolerances. */
static void test_random_honest(void)
{
    static const long double tols[] = {3, 1, 0.3L, 0.1L};
    unsigned seed = 424242u;
    gs_rng st;
    int round, done = 0;
    gs_rng_seed(&st, seed);
    for (round = 0; round < 400 && done < 50; round++) {
        char *text = random_rcg(&st), what[64];
        int failed_before = check_failed_;
        gs_job j;
        gs_diag d;
        gs_derive_opts dopt;
        gs_approx_opts o;
        int rc;
        gs_job_init(&j);
        gs_diag_init(&d);
        gs_derive_opts_default(&dopt);
        rc = gs_job_load_string(&j, "rand.gsc", text, &d);
        if (rc == GS_OK)
            rc = gs_job_derive(&j, NULL, &dopt, &d);
        if (rc == GS_OK)
            rc = gs_job_bind(&j, NULL, 0, &d);
        gs_diag_clear(&d);
        if (rc == GS_OK && j.ntf == 1 && !gs_poly_is_zero(&j.tf[0].num)
            && gs_poly_degree(&j.tf[0].den, j.tf[0].s_var, j.ctx) >= 1) {
            gs_approx_opts_default(&o);
            o.tol_db = tols[done % 4];
            o.tol_deg = 10 * tols[done % 4];
            snprintf(what, sizeof what, "seed %u round %d", seed, round);
            if (honest(&j, 0, &o, what, &st)) {
                gs_approx_result r;
                done++;
                /* six symbols: the box is sampled at its corners */
                gs_approx_result_init(&r);
                gs_diag_init(&d);
                CHECK(gs_approx_run(&r, &j, 0, &o, &d) == GS_OK
                      && r.spread_corners);
                gs_diag_clear(&d);
                gs_approx_result_clear(&r);
            }
        }
        if (check_failed_ > failed_before)
            fprintf(stderr, "the circuit of seed %u round %d:\n%s", seed,
                    round, text);
        gs_job_clear(&j);
        free(text);
    }
    CHECK_MSG(done == 50, "only %d random circuits ran", done);
}

/* The same on every example circuit, each output, at the default
   tolerance, and at a loose one for the Miller op-amp, where most terms
   go. */
static void test_examples_honest(void)
{
    static const char *const files[] = {"bjt_ce_degen", "cascode",
        "cs_biased", "cs_degen", "diff_pair", "inverting_amp",
        "miller_opamp", "sallen_key", "source_follower"};
    gs_rng st;
    size_t f, i;
    int t;
    gs_rng_seed(&st, 777);
    for (f = 0; f < sizeof files / sizeof files[0]; f++) {
        char path[64], what[192];
        gs_job j;
        snprintf(path, sizeof path, "examples/%s.gsc", files[f]);
        gs_job_init(&j);
        CHECK_MSG(load(&j, path) == GS_OK, "%s", path);
        for (i = 0; i < j.ntf; i++)
            for (t = 0; t < (strstr(path, "miller") ? 2 : 1); t++) {
                gs_approx_opts o;
                gs_approx_opts_default(&o);
                if (t) {
                    o.tol_db = 1;
                    o.tol_deg = 10;
                }
                snprintf(what, sizeof what, "%s output %zu tol %Lg", path,
                         i, o.tol_db);
                CHECK_MSG(honest(&j, i, &o, what, &st), "%s", what);
            }
        gs_job_clear(&j);
    }
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
    CHECK(gs_mgraph_build(g, &m, GS_MGRAPH_ORDER_GREEDY, 0, j.ctx) == GS_OK);
    gs_mna_clear(&m);
    /* derive sized j.graph with one empty slot per output */
    CHECK(j.graph != NULL && j.graph[0] == NULL);
    if (j.graph == NULL || j.graph[0] != NULL) {
        gs_mgraph_clear(g);
        free(g);
        gs_approx_result_clear(&re);
        gs_diag_clear(&d);
        gs_job_clear(&j);
        return;
    }
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
    test_random_honest();
    test_examples_honest();
    test_graph_same("examples/miller_opamp.gsc");
    test_graph_same("examples/cascode.gsc");
    test_graph_same("examples/cs_degen.gsc");
    test_graph_large();
    return check_report("test_approx");
}
