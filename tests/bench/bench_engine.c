/* bench_engine.c - the graph of minors on one circuit.  See LICENSE.
 *
 * usage: bench_engine FILE.gsc [--orders]   (no argument: nothing, for
 * the generic loop of run_bench.sh, which runs it once per circuit)
 * --orders prints instead the graph sizes under each row order:
 *   bench engine-order-NAME greedy=NODES/EDGES/SECONDS natural=... sparse=...
 * Prints: bench engine-NAME graph_nodes=N graph_edges=E build_seconds=B
 *         bode_1k_seconds=T paths_D=P dominant_D1_terms=K
 *         dominant_D1_rest=R dominant_D1_seconds=S peak_kib=K
 * build_seconds: MNA and graph (both orientations tried); bode_1k_seconds:
 * the coefficients in s from one pass over the graph, then 1000
 * log-spaced points from 1 Hz to 10 GHz by Horner's rule, as bode does;
 * paths_D: the terms of D before equal monomials combine;
 * dominant_D1_*: the best-first terms of the coefficient of s^1 in D to
 * a remainder of 1 % (at most 10000 terms): how many, the remainder left
 * relative to the coefficient, the time; approx_*: `approx` on the
 * graph path (the output held as its graph, as over the budget) at the
 * default 0.1 dB / 1 degree and 20 % spread, over the three decades up
 * to the dominant pole (the smallest |pole|): the time (graph,
 * terms, simplification), the worst measured magnitude error (nominal
 * or spread box), the terms kept, met=1 when the tolerance was met;
 * peak_kib: the process's peak resident set (getrusage).
 */
#include "analysis/approx.h"
#include "analysis/job.h"
#include "analysis/mgraph.h"
#include "analysis/mna.h"
#include "numeric/roots.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <time.h>
#include "benchlib.h"

/* approx on the graph path: the job derives with a budget of one term,
   so every output is held as its graph, as over the real budget. */
static void bench_approx(const char *path, double *seconds, double *err_db,
                         size_t *kept, int *met)
{
    gs_job j;
    gs_diag d;
    gs_derive_opts o;
    gs_approx_opts ao;
    gs_approx_result r;
    double t0 = bench_now();
    *seconds = *err_db = -1;
    *kept = 0;
    *met = 0;
    gs_job_init(&j);
    gs_diag_init(&d);
    gs_derive_opts_default(&o);
    o.elim.max_terms = 1;
    j.graph_ok = 1;
    if (gs_job_load(&j, path, &d) == GS_OK
        && gs_job_derive(&j, NULL, &o, &d) == GS_OK
        && gs_job_bind(&j, NULL, 0, &d) == GS_OK && j.graph
        && j.graph[0]) {
        long double *cn, *cd, *lv, pmin = INFINITY;
        long double complex *rt;
        int dn, dd, k, nv = j.ctx->nvars;
        gs_roots_info info;
        lv = calloc((size_t)nv + 1, sizeof *lv);
        memcpy(lv, j.vals, (size_t)nv * sizeof *lv);
        gs_mgraph_fill_recips(lv, j.c->syms, nv);
        gs_mgraph_coeffs_ld(&cn, &dn, &cd, &dd, j.graph[0], j.c->s_sym,
                            lv);
        rt = calloc((size_t)dd + 2, sizeof *rt);
        if (dd >= 1 && gs_roots(rt, NULL, cd, dd, &info) != GS_EINVAL)
            for (k = 0; k < info.nroots; k++)
                if (cabsl(rt[k]) > 0 && cabsl(rt[k]) < pmin)
                    pmin = cabsl(rt[k]);
        gs_approx_opts_default(&ao);
        if (isfinite((double)pmin)) {
            ao.f_lo = pmin / (2 * acosl(-1)) / 1000;
            ao.f_hi = pmin / (2 * acosl(-1));
        }
        gs_approx_result_init(&r);
        if (gs_approx_run(&r, &j, 0, &ao, &d) == GS_OK) {
            *seconds = bench_now() - t0;
            *err_db = (double)(r.err_db > r.spread_db ? r.err_db
                                                      : r.spread_db);
            *kept = r.terms_kept;
            *met = r.met;
        }
        gs_approx_result_clear(&r);
        free(cn);
        free(cd);
        free(rt);
        free(lv);
    }
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

int main(int argc, char **argv)
{
    gs_job j;
    gs_diag d;
    gs_mna m;
    gs_mgraph g;
    gs_int pc;
    struct rusage ru;
    double t0, t1, t2;
    long double complex *vals, num, den, sink = 0;
    long double *lv;
    const char *base, *dot;
    char *paths;
    int k, v, nv;
    double dom_seconds, dom_rest, ap_seconds, ap_err;
    size_t dom_terms, ap_kept;
    int ap_met;

    if (argc < 2)
        return 0;
    gs_job_init(&j);
    gs_diag_init(&d);
    if (gs_job_load(&j, argv[1], &d) != GS_OK
        || gs_job_bind(&j, NULL, 0, &d) != GS_OK) {
        gs_diag_print(stderr, &d);
        return 1;
    }
    base = strrchr(argv[1], '/');
    base = base ? base + 1 : argv[1];
    dot = strrchr(base, '.');
    if (argc > 2 && strcmp(argv[2], "--orders") == 0) {
        static const char *const names[] = {"greedy", "natural", "sparse"};
        memset(&m, 0, sizeof m);
        if (gs_mna_build(&m, j.c, 0, j.ctx, &d) != GS_OK)
            return 1;
        printf("bench engine-order-%.*s",
               (int)(dot ? dot - base : (long)strlen(base)), base);
        for (k = 0; k < 3; k++) {
            double ts = bench_now();
            gs_mgraph_build(&g, &m, (gs_mgraph_order)k, 0, j.ctx);
            printf(" %s=%zu/%zu/%.4fs", names[k], g.nnodes, g.nedges,
                   bench_now() - ts);
            gs_mgraph_clear(&g);
        }
        printf("\n");
        gs_mna_clear(&m);
        gs_diag_clear(&d);
        gs_job_clear(&j);
        return 0;
    }
    t0 = bench_now();
    memset(&m, 0, sizeof m);
    if (gs_mna_build(&m, j.c, 0, j.ctx, &d) != GS_OK
        || gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, 0, j.ctx) != GS_OK)
        return 1;
    t1 = bench_now();
    nv = j.ctx->nvars;
    lv = calloc((size_t)nv + 1, sizeof *lv);
    vals = calloc((size_t)nv + 1, sizeof *vals);
    memcpy(lv, j.vals, (size_t)nv * sizeof *lv);
    gs_mgraph_fill_recips(lv, j.c->syms, nv);
    for (v = 0; v < nv; v++)
        vals[v] = lv[v];
    /* as bode does: the numeric coefficients in s from one pass over the
       graph, then Horner's rule at each point */
    {
        long double *cn, *cd;
        int dn, dd, i;
        gs_mgraph_coeffs_ld(&cn, &dn, &cd, &dd, &g, j.c->s_sym, lv);
        for (k = 0; k < 1000; k++) {
            long double f = powl(10, 10.0L * k / 999);
            long double complex s = 2 * acosl(-1) * f * I, hn = 0, hd = 0;
            for (i = dn; i >= 0; i--)
                hn = hn * s + cn[i];
            for (i = dd; i >= 0; i--)
                hd = hd * s + cd[i];
            sink += hn / hd;
        }
        free(cn);
        free(cd);
    }
    (void)num;
    (void)den;
    t2 = bench_now();
    /* the dominant terms of D's s^1 coefficient to 1 %, at most 10000 */
    {
        gs_mgraph_terms dt;
        double td = bench_now();
        gs_mgraph_dominant(&dt, &g, g.root_d, j.c->s_sym, 1, lv, 0.01L,
                           10000);
        dom_seconds = bench_now() - td;
        dom_terms = dt.count;
        dom_rest = dt.total != 0 ? (double)fabsl(dt.rest / dt.total) : 0;
        gs_mgraph_terms_clear(&dt);
    }
    bench_approx(argv[1], &ap_seconds, &ap_err, &ap_kept, &ap_met);
    gs_int_init(&pc);
    gs_mgraph_count_paths(&pc, &g, g.root_d);
    paths = gs_int_get_str(&pc);
    getrusage(RUSAGE_SELF, &ru);
    printf("bench engine-%.*s graph_nodes=%zu graph_edges=%zu "
           "build_seconds=%.4f bode_1k_seconds=%.4f paths_D=%s "
           "dominant_D1_terms=%zu dominant_D1_rest=%.2g "
           "dominant_D1_seconds=%.4f approx_seconds=%.3f "
           "approx_err_db=%.3g approx_terms=%zu approx_met=%d "
           "peak_kib=%ld%s\n",
           (int)(dot ? dot - base : (long)strlen(base)),
           base, g.nnodes, g.nedges, t1 - t0, t2 - t1, paths, dom_terms,
           dom_rest, dom_seconds, ap_seconds, ap_err, ap_kept, ap_met,
           ru.ru_maxrss,
           isfinite((double)creall(sink)) ? "" : " nonfinite=1");
    free(paths);
    gs_int_clear(&pc);
    free(lv);
    free(vals);
    gs_mgraph_clear(&g);
    gs_mna_clear(&m);
    gs_diag_clear(&d);
    gs_job_clear(&j);
    return 0;
}
