/* test_nomem.c - running out of memory: every allocation of a derivation
 * failed in turn, and the guard of base/mem.h on its own.  See LICENSE.
 *
 * The property checked is the library's contract (include/gainsmith.h):
 * a call that runs out of memory returns GS_ENOMEM (or NULL), frees what
 * it allocated, and leaves what existed before it as it was.  "Nothing
 * leaked" is checked in `make check-sanitize` (and so in CI) by
 * LeakSanitizer after every failed call, and again at exit; the plain
 * build checks the rest (status, messages, no crash, results after).
 */
#include "check.h"
#include "gainsmith.h"
#include "base/mem.h"
#include "testapi.h"

#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#if defined(__has_feature)
#if __has_feature(address_sanitizer)
#define LEAKS_COUNTED 1
#endif
#elif defined(__SANITIZE_ADDRESS__)
#define LEAKS_COUNTED 1
#endif
#ifdef LEAKS_COUNTED
#include <sanitizer/lsan_interface.h>
#endif

/* 1 if some block is unreachable now (LeakSanitizer prints it), in the
   sanitizer build; 0 elsewhere.  The C library's own counts cannot
   stand in for it: glibc keeps freed chunks in per-thread caches that
   it still counts as in use. */
static int leaks_now(void)
{
#ifdef LEAKS_COUNTED
    return __lsan_do_recoverable_leak_check() != 0;
#else
    return 0;
#endif
}

/* Counts the allocations it is asked about and refuses the fail_at-th
   (counting from 1; 0 refuses none). */
typedef struct injector {
    size_t asked;
    size_t fail_at;
} injector;

static int inject(void *arg, size_t bytes)
{
    injector *in = arg;
    (void)bytes;
    in->asked++;
    return in->fail_at != 0 && in->asked == in->fail_at;
}

static int derive_with(gs_result **r, const char *path, const char *text,
                       gs_method method, injector *in, char **messages)
{
    gs_options o;
    gs_options_init(&o);
    o.method = method;
    o.alloc_hook = inject;
    o.alloc_hook_arg = in;
    if (path)
        return gs_derive_file_opts(r, path, &o, messages);
    return gs_derive_string(r, text, "nomem.gsc", &o, messages);
}

/* Fails allocation 1, 2, ... of one derivation until one completes:
   each failed run must say GS_ENOMEM, give no result, give an out of
   memory message and leave the heap as it found it; the run that
   completes must give the same transfer functions as one without the
   hook.  With stride > 1 only every stride-th allocation is failed, and
   every one of the last third (the reduction to lowest terms), to keep
   a larger derivation's sweep short. */
static void fail_allocations(const char *what, const char *path,
                             const char *text, gs_method method,
                             size_t stride)
{
    injector in = {0, 0};
    gs_result *r = NULL;
    char *messages = NULL, *expected, *got;
    size_t k, total, failed_ok = 0, tried = 0;
    int rc = derive_with(&r, path, text, method, &in, &messages);
    CHECK_MSG(rc == GS_OK, "%s: %s", what, messages ? messages : "");
    free(messages);
    if (rc != GS_OK)
        return;
    expected = test_result_texts(r);
    gs_result_free(r);
    total = in.asked;
    /* a derivation allocates at every stage: parse, MNA, minors, gcd */
    CHECK_MSG(total > 200, "%s: only %zu allocations were asked about",
              what, total);
    for (k = 1; k <= total + 1; k++) {
        if (k <= total && k % stride != 0 && 3 * k < 2 * total)
            continue;
        tried += k <= total;
        in.asked = 0;
        in.fail_at = k;
        r = (gs_result *)&in;   /* must be set to NULL */
        messages = NULL;
        rc = derive_with(&r, path, text, method, &in, &messages);
        if (k <= total) {
            int ok = rc == GS_ENOMEM && r == NULL && messages != NULL
                     && strstr(messages, "out of memory") != NULL;
            if (ok)
                failed_ok++;
            else
                CHECK_MSG(ok, "%s: allocation %zu of %zu failed: rc %d",
                          what, k, total, rc);
            free(messages);
            continue;
        }
        /* past the last allocation nothing fails */
        CHECK_MSG(rc == GS_OK && in.asked == total, "%s: rc %d, %zu asked",
                  what, rc, in.asked);
        free(messages);
        if (rc == GS_OK) {
            got = test_result_texts(r);
            CHECK_MSG(strcmp(got, expected) == 0, "%s: %s", what, got);
            free(got);
        }
        gs_result_free(r);
    }
    CHECK_MSG(failed_ok == tried && tried >= total / stride,
              "%s: %zu of %zu failures reported", what, failed_ok, tried);
    /* one look at the end: LeakSanitizer names any block left */
    CHECK_MSG(!leaks_now(), "%s: failed runs left memory behind", what);
    free(expected);
}

/* A second-order low-pass whose derivation goes through s, a gcd and
   several outputs; numbers from a demo. */
static const char lowpass_text[] =
    "vsource   vin  in   gnd\n"
    "resistor  R1   in   mid\n"
    "resistor  R2   mid  out\n"
    "capacitor C1   mid  gnd\n"
    "capacitor C2   out  gnd\n"
    "value     R1 = 1k\n"
    "value     R2 = 2k\n"
    "value     C1 = 10n\n"
    "value     C2 = 4.7n\n"
    "transfer  H = v(out) / vin\n"
    "impedance Zin = in, gnd\n";

static void test_derivations(void)
{
    fail_allocations("cs_biased", "examples/cs_biased.gsc", NULL,
                     GS_METHOD_AUTO, 1);
    fail_allocations("lowpass minors", NULL, lowpass_text,
                     GS_METHOD_MINORS, 1);
    fail_allocations("lowpass bareiss", NULL, lowpass_text,
                     GS_METHOD_BAREISS, 1);
    /* D of 1,597 terms (Fibonacci F(17) for 8 sections): its reciprocals
       are cleared by the radix sort, which smaller ones skip */
    fail_allocations("rc_ladder_8", "tests/bench/rc_ladder_8.gsc", NULL,
                     GS_METHOD_AUTO, 9);
}

/* --- The calls on a result, failed from a guard around them --------- */

typedef struct result_case {
    const gs_result *r;
    int which;          /* 0 text, 1 json, 2 N view, 3 eval */
    int outcome;        /* 1 made, 0 refused, -1 wrong */
} result_case;

static int call_on_result(void *arg)
{
    result_case *c = arg;
    double re = 0, im = 0;
    char *s = NULL, *messages = NULL;
    const gs_polynomial *p;
    int rc;
    switch (c->which) {
    case 0:
        s = gs_result_text(c->r, 0);
        c->outcome = s != NULL;
        break;
    case 1:
        s = gs_result_json(c->r, 0);
        c->outcome = s != NULL;
        break;
    case 2:
        p = gs_result_poly(c->r, 0, GS_NUMERATOR);
        c->outcome = p != NULL;
        break;
    default:
        rc = gs_result_eval(&re, &im, c->r, 0, 0, 1e4, NULL, NULL, 0,
                            &messages);
        c->outcome = rc == GS_OK ? 1 : rc == GS_ENOMEM && messages ? 0 : -1;
        break;
    }
    free(s);
    free(messages);
    return GS_OK;
}

/* The outer guard's hook reaches the inner call: each of its allocations
   failed in turn, on a result fresh each time (a view, once made, is
   kept), gives NULL or GS_ENOMEM, and the result stays usable. */
static void test_result_calls(void)
{
    static const char *const names[] = {"text", "json", "view", "eval"};
    gs_result *r = NULL;
    char *expected;
    int which;
    CHECK(gs_derive_string(&r, lowpass_text, NULL, NULL, NULL) == GS_OK);
    if (r == NULL)
        return;
    expected = gs_result_text(r, 0);
    gs_result_free(r);
    for (which = 0; which < 4; which++) {
        injector in = {0, 0};
        result_case c = {NULL, which, -1};
        size_t k, total, refused = 0;
        CHECK(gs_derive_string(&r, lowpass_text, NULL, NULL, NULL) == GS_OK);
        c.r = r;
        CHECK(gs_mem_run(call_on_result, &c, inject, &in, NULL) == GS_OK);
        CHECK_MSG(c.outcome == 1, "%s", names[which]);
        gs_result_free(r);
        total = in.asked;
        CHECK_MSG(total > 0, "%s asked nothing", names[which]);
        for (k = 1; k <= total; k++) {
            char *again;
            const gs_polynomial *n;
            CHECK(gs_derive_string(&r, lowpass_text, NULL, NULL, NULL)
                  == GS_OK);
            c.r = r;
            in.asked = 0;
            in.fail_at = k;
            c.outcome = -1;
            CHECK(gs_mem_run(call_on_result, &c, inject, &in, NULL)
                  == GS_OK);
            refused += c.outcome == 0;
            /* the failed call left r as it was */
            again = gs_result_text(r, 0);
            n = gs_result_poly(r, 0, GS_NUMERATOR);
            CHECK(again && expected && strcmp(again, expected) == 0);
            CHECK(n != NULL && n->ncoeffs == 1 && n->coeffs[0].power == 0);
            free(again);
            gs_result_free(r);
        }
        CHECK_MSG(refused == total, "%s: %zu of %zu refusals reported",
                  names[which], refused, total);
        CHECK_MSG(!leaks_now(), "%s: failed calls left memory behind",
                  names[which]);
    }
    free(expected);
}

/* --- The guard itself ------------------------------------------------ */

typedef struct scratch {
    void *kept;         /* allocated in the guard, given to the caller */
    int cleanups_run;
    int inner_rc;
} scratch;

static void count_cleanup(void *arg)
{
    ((scratch *)arg)->cleanups_run++;
}

/* Allocates, grows, frees and then fails: the guard must free the rest. */
static int allocate_then_fail(void *arg)
{
    scratch *s = arg;
    char *a = gs_malloc(100), *b = gs_calloc(10, 10), *d = gs_strdup("x");
    size_t i;
    gs_mem_defer(count_cleanup, s);
    for (i = 0; i < 1000; i++)
        a = gs_realloc(a, 100 + i);     /* moves it now and then */
    gs_free(b);
    (void)d;
    /* count * size overflows size_t: exhaustion without asking malloc */
    return gs_reallocarray(NULL, SIZE_MAX / 2, 4) != NULL;
}

static int allocate_and_keep(void *arg)
{
    scratch *s = arg;
    gs_mem_cleanup *c = gs_mem_defer(count_cleanup, s);
    s->kept = gs_malloc(64);
    memset(s->kept, 7, 64);
    gs_mem_undefer(c);
    return 42;
}

/* Inside an outer guard: an inner one that fails and one that keeps. */
static int nested(void *arg)
{
    scratch *s = arg;
    char *outer = gs_malloc(10);
    size_t bytes = 0;
    s->inner_rc = gs_mem_run(allocate_then_fail, s, NULL, NULL, &bytes);
    if (s->inner_rc == GS_ENOMEM && bytes == SIZE_MAX) {
        /* the inner guard's failure is over: allocation works again */
        outer = gs_realloc(outer, 20);
        s->inner_rc = gs_mem_run(allocate_and_keep, s, NULL, NULL, NULL);
    }
    gs_free(outer);
    /* the block kept by the inner guard now belongs to this one, which
       fails: it must be freed with it */
    gs_reallocarray(NULL, SIZE_MAX / 2, 4);
    return GS_OK;
}

static void test_guard(void)
{
    scratch s = {NULL, 0, 0};
    size_t bytes = 0;
    CHECK(gs_mem_run(allocate_then_fail, &s, NULL, NULL, &bytes)
          == GS_ENOMEM);
    CHECK(bytes == SIZE_MAX && s.cleanups_run == 1);
    CHECK(!leaks_now());

    CHECK(gs_mem_run(allocate_and_keep, &s, NULL, NULL, NULL) == 42);
    CHECK(s.kept != NULL && ((unsigned char *)s.kept)[63] == 7);
    CHECK(s.cleanups_run == 1);     /* undeferred: not run */
    gs_free(s.kept);                /* the caller's now; free() would do */
    CHECK(!leaks_now());

    s.kept = NULL;
    s.cleanups_run = 0;
    CHECK(gs_mem_run(nested, &s, NULL, NULL, &bytes) == GS_ENOMEM);
    CHECK(s.inner_rc == 42 && s.cleanups_run == 1);
    CHECK(!leaks_now());
}

int main(void)
{
#ifndef LEAKS_COUNTED
    fputs("nomem: leaks are counted in the sanitizer build only "
          "(make check-sanitize)\n", stderr);
#endif
    test_guard();
    test_result_calls();
    test_derivations();
    return check_report("nomem");
}
