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
 * relative to the coefficient, the time; peak_kib: the process's peak
 * resident set (getrusage).
 */
#include "analysis/job.h"
#include "analysis/mgraph.h"
#include "analysis/mna.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <time.h>

static double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
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
    double dom_seconds, dom_rest;
    size_t dom_terms;

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
            double ts = now();
            gs_mgraph_build(&g, &m, (gs_mgraph_order)k, j.ctx);
            printf(" %s=%zu/%zu/%.4fs", names[k], g.nnodes, g.nedges,
                   now() - ts);
            gs_mgraph_clear(&g);
        }
        printf("\n");
        gs_mna_clear(&m);
        gs_diag_clear(&d);
        gs_job_clear(&j);
        return 0;
    }
    t0 = now();
    memset(&m, 0, sizeof m);
    if (gs_mna_build(&m, j.c, 0, j.ctx, &d) != GS_OK
        || gs_mgraph_build(&g, &m, GS_MGRAPH_ORDER_GREEDY, j.ctx) != GS_OK)
        return 1;
    t1 = now();
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
    t2 = now();
    /* the dominant terms of D's s^1 coefficient to 1 %, at most 10000 */
    {
        gs_mgraph_terms dt;
        double td = now();
        gs_mgraph_dominant(&dt, &g, g.root_d, j.c->s_sym, 1, lv, 0.01L,
                           10000);
        dom_seconds = now() - td;
        dom_terms = dt.count;
        dom_rest = dt.total != 0 ? (double)fabsl(dt.rest / dt.total) : 0;
        gs_mgraph_terms_clear(&dt);
    }
    gs_int_init(&pc);
    gs_mgraph_count_paths(&pc, &g, g.root_d);
    paths = gs_int_get_str(&pc);
    getrusage(RUSAGE_SELF, &ru);
    printf("bench engine-%.*s graph_nodes=%zu graph_edges=%zu "
           "build_seconds=%.4f bode_1k_seconds=%.4f paths_D=%s "
           "dominant_D1_terms=%zu dominant_D1_rest=%.2g "
           "dominant_D1_seconds=%.4f peak_kib=%ld%s\n",
           (int)(dot ? dot - base : (long)strlen(base)),
           base, g.nnodes, g.nedges, t1 - t0, t2 - t1, paths, dom_terms,
           dom_rest, dom_seconds, ru.ru_maxrss,
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
