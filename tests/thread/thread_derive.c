/* thread_derive.c - several threads derive at once, and several read one
 * result at once, through the public interface; built and run under
 * ThreadSanitizer by `make check-thread`.  See LICENSE.
 *
 * The results are compared with the ones derived before any thread
 * starts, so that a race that corrupts a result fails here even where
 * the sanitizer is not used.
 */
#include "check.h"
#include "gainsmith.h"
#include "testapi.h"

#include <pthread.h>
#include <stdlib.h>
#include <string.h>

#define NTHREADS 4
#define ROUNDS 6

static const char *const files[] = {
    "examples/inverting_amp.gsc", "examples/sallen_key.gsc",
    "examples/cs_degen.gsc", "examples/cascode.gsc",
    "examples/bjt_ce_degen.gsc", "examples/source_follower.gsc",
};
#define NFILES (sizeof files / sizeof files[0])

static const char rc_text[] =
    "vsource   vin  in   gnd\n"
    "resistor  R    in   out\n"
    "capacitor C    out  gnd\n"
    "value     R = 1k\n"
    "value     C = 1u\n"
    "transfer  H = v(out) / vin\n";

/* The text of every output of a file, joined by newlines; NULL on an
   error. */
static char *derive_all(const char *path, gs_method method)
{
    gs_result *r = NULL;
    gs_options o;
    char *all;
    gs_options_init(&o);
    o.method = method;
    if (gs_derive_file_opts(&r, path, &o, NULL) != GS_OK)
        return NULL;
    all = test_result_texts(r);
    gs_result_free(r);
    return all;
}

static char *expected[NFILES];
static const gs_result *shared;

typedef struct job {
    int id;
    int bad;            /* mismatches seen by this thread */
} job;

static void *derive_thread(void *arg)
{
    job *jb = arg;
    int k;
    for (k = 0; k < ROUNDS; k++) {
        size_t f = (size_t)(jb->id + k) % NFILES;
        /* alternate the methods: both must give the same text */
        char *t = derive_all(files[f], k % 2 ? GS_METHOD_BAREISS
                                             : GS_METHOD_AUTO);
        if (t == NULL || strcmp(t, expected[f]) != 0)
            jb->bad++;
        free(t);
    }
    return NULL;
}

/* Readers of one result: accessors and evaluation, all at once. */
static void *read_thread(void *arg)
{
    job *jb = arg;
    int k;
    for (k = 0; k < 200; k++) {
        double re = 0, im = 0;
        const gs_polynomial *d = gs_result_poly(shared, 0, GS_DENOMINATOR);
        char *t = gs_result_text(shared, 0);
        /* H(j 1000) = 1/(1 + j) = 0.5 - 0.5j for R C = 1 ms (math fact) */
        if (gs_result_eval(&re, &im, shared, 0, 0, 1000, NULL, NULL, 0,
                           NULL) != GS_OK
            || re < 0.4999999 || re > 0.5000001 || im > -0.4999999
            || im < -0.5000001)
            jb->bad++;
        if (d == NULL || d->degree != 1 || t == NULL
            || strcmp(t, "H = (1)/(R*C*s + 1)") != 0)
            jb->bad++;
        free(t);
    }
    return NULL;
}

static void run(void *(*fn)(void *), const char *what)
{
    pthread_t th[NTHREADS];
    job jobs[NTHREADS];
    int i, started = 0;
    for (i = 0; i < NTHREADS; i++) {
        jobs[i].id = i;
        jobs[i].bad = 0;
        if (pthread_create(&th[i], NULL, fn, &jobs[i]) == 0)
            started++;
    }
    CHECK_MSG(started == NTHREADS, "%s: %d threads started", what, started);
    for (i = 0; i < started; i++) {
        pthread_join(th[i], NULL);
        CHECK_MSG(jobs[i].bad == 0, "%s: thread %d saw %d wrong results",
                  what, i, jobs[i].bad);
    }
}

int main(void)
{
    size_t f;
    gs_result *r = NULL;
    for (f = 0; f < NFILES; f++) {
        expected[f] = derive_all(files[f], GS_METHOD_AUTO);
        CHECK_MSG(expected[f] != NULL, "%s", files[f]);
        if (expected[f] == NULL)
            return check_report("thread");
    }
    run(derive_thread, "derive");
    CHECK(gs_derive_string(&r, rc_text, NULL, NULL, NULL) == GS_OK);
    shared = r;
    run(read_thread, "read");
    gs_result_free(r);
    for (f = 0; f < NFILES; f++)
        free(expected[f]);
    return check_report("thread");
}
