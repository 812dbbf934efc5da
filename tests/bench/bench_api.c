/* bench_api.c - the cost of the public interface over the engine.
 * See LICENSE.
 *
 * For each circuit, the median of 5 runs of
 *   - the engine alone: gs_job_load + gs_job_derive (what `derive` does),
 *   - gs_derive_file, which also binds the file's numbers once,
 *   - the first gs_result_poly of N and D of every output, which builds
 *     the structural views,
 * and one line
 *   bench api-NAME terms=T engine_seconds=E api_seconds=A overhead=A/E
 *       views_seconds=V
 * where T counts the terms of N and D as the views hand them out.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "analysis/job.h"
#include "gainsmith.h"
#include "benchlib.h"

#define RUNS 5

static double engine_once(const char *path)
{
    gs_job j;
    gs_diag d;
    gs_derive_opts o;
    double t0 = bench_now(), t;
    gs_diag_init(&d);
    gs_job_init(&j);
    gs_derive_opts_default(&o);
    if (gs_job_load(&j, path, &d) != GS_OK
        || gs_job_derive(&j, NULL, &o, &d) != GS_OK)
        fprintf(stderr, "bench_api: %s: derivation failed\n", path);
    t = bench_now() - t0;
    gs_job_clear(&j);
    gs_diag_clear(&d);
    return t;
}

static double api_once(const char *path, size_t *terms, double *tv)
{
    gs_result *r = NULL;
    double t0 = bench_now(), t, t1;
    size_t i, c;
    int part;
    if (gs_derive_file(&r, path, NULL, NULL) != GS_OK)
        fprintf(stderr, "bench_api: %s: derivation failed\n", path);
    t = bench_now() - t0;
    t1 = bench_now();
    *terms = 0;
    for (i = 0; i < gs_result_count(r); i++)
        for (part = GS_NUMERATOR; part <= GS_DENOMINATOR; part++) {
            const gs_polynomial *p = gs_result_poly(r, i, part);
            for (c = 0; p && c < p->ncoeffs; c++)
                *terms += p->coeffs[c].nterms;
        }
    *tv = bench_now() - t1;
    gs_result_free(r);
    return t;
}

int main(void)
{
    static const char *const names[] = {"rc_ladder_10", "rc_ladder_12",
                                        "miller_ota_rz", "cascode_caps"};
    size_t k;
    for (k = 0; k < sizeof names / sizeof names[0]; k++) {
        char path[256];
        double e[RUNS], a[RUNS], v[RUNS], em, am;
        size_t terms = 0;
        int run;
        snprintf(path, sizeof path, "tests/bench/%s.gsc", names[k]);
        for (run = 0; run < RUNS; run++) {
            e[run] = engine_once(path);
            a[run] = api_once(path, &terms, &v[run]);
        }
        em = bench_median(e, RUNS);
        am = bench_median(a, RUNS);
        printf("bench api-%s terms=%zu engine_seconds=%.6f "
               "api_seconds=%.6f overhead=%.3f views_seconds=%.6f\n",
               names[k], terms, em, am, em > 0 ? am / em : 0.0,
               bench_median(v, RUNS));
    }
    return 0;
}
