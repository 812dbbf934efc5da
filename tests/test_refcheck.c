/* test_refcheck.c - the verdicts of `check` (analysis/refcheck.c) and its
 * exact reference (numeric/numexact.c).  See LICENSE.
 *
 * The reference is outside the symbolic path: the circuit's MNA equations
 * (C. W. Ho, A. E. Ruehli and P. A. Brennan, "The modified nodal approach
 * to network analysis", IEEE Trans. Circuits Syst. 22 (1975)) solved
 * exactly by Cramer's rule through fraction-free elimination.  A correct
 * result must never be a mismatch, at any values; a wrong one must be.
 */
#include "analysis/refcheck.h"
#include "numeric/numexact.h"
#include "numeric/numsolve.h"
#include "base/rng.h"
#include "check.h"
#include "testjob.h"
#include "testlib.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static const char *const textbook[] = {
    "examples/sallen_key.gsc", "examples/inverting_amp.gsc",
    "examples/cs_degen.gsc", "examples/source_follower.gsc",
    "examples/cascode.gsc", "examples/bjt_ce_degen.gsc",
    "examples/miller_opamp.gsc", "examples/diff_pair.gsc",
    "examples/cs_biased.gsc",
};

static int load(gs_job *j, const char *path)
{
    return test_job_load(j, path);
}

/* Verdicts of output i over 13 log-spaced points, 10 mHz to 10 GHz. */
static void sweep(size_t *count, const gs_job *j, size_t i)
{
    gs_refcheck r;
    gs_refcheck_point p;
    int k;
    memset(count, 0, 4 * sizeof *count);
    gs_refcheck_init(&r, j, i);
    for (k = 0; k <= 12; k++) {
        long double f = 1e-2L * powl(10, (long double)k);
        if (gs_refcheck_at(&p, &r, f, 1e-9L, NULL) != GS_OK)
            count[3]++;
        else
            count[p.verdict]++;
    }
    gs_refcheck_clear(&r);
}

/* Each bound value scaled by 10^u, u uniform in [-3, 3): six decades,
   log-uniform, around the file's nominal values. */
static void scatter(gs_job *j, const long double *nominal, gs_rng *rng)
{
    int n = gs_symtab_count(j->c->syms), v;
    for (v = 0; v < n; v++)
        if (j->set[v] && v != j->c->s_sym)
            j->vals[v] = nominal[v] * powl(10, 6 * test_unit(rng) - 3);
}

static void test_random_values(void)
{
    size_t f, i, draws = 0, agree = 0, inconclusive = 0;
    for (f = 0; f < sizeof textbook / sizeof *textbook; f++) {
        gs_job j;
        gs_rng rng;
        long double *nominal;
        int n, draw;
        uint64_t seed = 0x5eed0000u + f;
        gs_job_init(&j);
        if (load(&j, textbook[f]) != GS_OK) {
            CHECK_MSG(0, "%s does not load", textbook[f]);
            gs_job_clear(&j);
            continue;
        }
        n = gs_symtab_count(j.c->syms);
        nominal = malloc((size_t)n * sizeof *nominal);
        memcpy(nominal, j.vals, (size_t)n * sizeof *nominal);
        gs_rng_seed(&rng, seed);
        for (draw = 0; draw < 15; draw++) {
            scatter(&j, nominal, &rng);
            for (i = 0; i < j.ntf; i++) {
                size_t c[4];
                sweep(c, &j, i);
                CHECK_MSG(c[GS_RC_MISMATCH] == 0 && c[3] == 0,
                          "%s output %s, seed %#llx draw %d: %zu mismatches,"
                          " %zu failed solves", textbook[f], j.tf[i].name,
                          (unsigned long long)seed, draw,
                          c[GS_RC_MISMATCH], c[3]);
                agree += c[GS_RC_AGREE];
                inconclusive += c[GS_RC_INCONCLUSIVE];
                draws++;
            }
        }
        free(nominal);
        gs_job_clear(&j);
    }
    /* most points must be conclusive, or the test would prove nothing */
    CHECK_MSG(agree > 10 * inconclusive, "%zu agree, %zu inconclusive",
              agree, inconclusive);
    printf("refcheck: %zu random draws, %zu points agree, %zu "
           "inconclusive\n", draws, agree, inconclusive);
}

/* The negative control: the dominant term of the numerator (largest
   magnitude at the file's values among the lowest power of s) doubled.
   check must call it a mismatch, or the checks above could not fail. */
static void test_wrong_result(void)
{
    size_t f;
    for (f = 0; f < sizeof textbook / sizeof *textbook; f++) {
        gs_job j;
        gs_poly *num;
        size_t t, best = 0, c[4];
        long double best_mag = -1;
        unsigned low = ~0u;
        int nv, v;
        unsigned *ex;
        gs_job_init(&j);
        if (load(&j, textbook[f]) != GS_OK || (j.graph && j.graph[0])) {
            gs_job_clear(&j);
            continue;
        }
        num = &j.tf[0].num;
        nv = j.ctx->nvars;
        ex = malloc(((size_t)nv + 1) * sizeof *ex);
        for (t = 0; t < num->length; t++) {
            gs_poly_get_term_exps(ex, num, t, j.ctx);
            if (ex[j.c->s_sym] < low) {
                low = ex[j.c->s_sym];
                best_mag = -1;
            }
            if (ex[j.c->s_sym] == low) {
                long double m = fabsl(gs_int_get_ld(&num->coeffs[t]));
                for (v = 0; v < nv; v++)
                    if (v != j.c->s_sym)
                        m *= powl(fabsl(j.vals[v]), (long double)ex[v]);
                if (m > best_mag) {
                    best_mag = m;
                    best = t;
                }
            }
        }
        gs_int_add(&num->coeffs[best], &num->coeffs[best],
                   &num->coeffs[best]);
        sweep(c, &j, 0);
        CHECK_MSG(c[GS_RC_MISMATCH] > 0, "%s: a doubled term of %s's "
                  "numerator passed check", textbook[f], j.tf[0].name);
        free(ex);
        gs_job_clear(&j);
    }
}

/* The exact reference on a divider with a known closed form, H =
   R2 / (R1 + R2) (Ohm's law), at values a long double holds exactly, and
   the same at a pole: R2 = -R1 makes the equations singular. */
static void test_exact_divider(void)
{
    static const char text[] =
        "vsource vin in gnd\nresistor R1 in out\nresistor R2 out gnd\n"
        "value R1 = 1k\nvalue R2 = 3k\ntransfer H = v(out)/vin\n";
    gs_job j;
    gs_diag d;
    gs_derive_opts o;
    long double complex h;
    int r1, r2;
    gs_job_init(&j);
    gs_diag_init(&d);
    gs_derive_opts_default(&o);
    CHECK(gs_job_load_string(&j, "divider.gsc", text, &d) == GS_OK);
    CHECK(gs_job_derive(&j, NULL, &o, &d) == GS_OK);
    CHECK(gs_job_bind(&j, NULL, 0, &d) == GS_OK);
    r1 = gs_symtab_find(j.c->syms, "R1");
    r2 = gs_symtab_find(j.c->syms, "R2");
    CHECK(gs_numsolve_exact(&h, j.c, 0, j.vals, 1e3L * I, NULL) == GS_OK);
    CHECK_MSG(creall(h) == 0.75L && cimagl(h) == 0, "%Lg%+Lgj",
              creall(h), cimagl(h));
    j.vals[r2] = -j.vals[r1];
    CHECK(gs_numsolve_exact(&h, j.c, 0, j.vals, 1e3L * I, NULL)
          == GS_ESINGULAR);
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

/* The long double solve's bound against the exact solution: wherever it
   gives a finite bound, the exact value (numexact.c, a different method
   in exact arithmetic) must lie within it.  Over the textbook circuits at
   random values, and the widely scaled Sallen-Key filters. */
static void test_bound_holds(void)
{
    static const char *const more[] = {
        "tests/cli/chk_sk_scaled.gsc", "tests/cli/chk_sk_scaled_gain.gsc",
        "tests/cli/chk_bridge_near.gsc",
    };
    size_t f, i, nf = sizeof textbook / sizeof *textbook, finite = 0;
    size_t total = 0;
    long double worst = 0;
    for (f = 0; f < nf + 3; f++) {
        const char *path = f < nf ? textbook[f] : more[f - nf];
        gs_job j;
        gs_rng rng;
        long double *nominal;
        int n, draw, k;
        uint64_t seed = 0xb0d0000u + f;
        gs_job_init(&j);
        if (load(&j, path) != GS_OK) {
            CHECK_MSG(0, "%s does not load", path);
            gs_job_clear(&j);
            continue;
        }
        n = gs_symtab_count(j.c->syms);
        nominal = malloc((size_t)n * sizeof *nominal);
        memcpy(nominal, j.vals, (size_t)n * sizeof *nominal);
        gs_rng_seed(&rng, seed);
        for (draw = 0; draw < 10; draw++) {
            if (draw > 0)       /* the file's own values first */
                scatter(&j, nominal, &rng);
            for (i = 0; i < j.ntf; i++)
                for (k = 0; k <= 12; k++) {
                    size_t o = j.out_index[i];
                    long double w = 2 * acosl(-1) * 1e-2L
                                    * powl(10, (long double)k), b;
                    long double complex s = w * I, hf, hx;
                    if (gs_numsolve_bounded(&hf, &b, j.c, o, j.vals, s)
                            != GS_OK
                        || gs_numsolve_exact(&hx, j.c, o, j.vals, s, NULL)
                            != GS_OK)
                        continue;
                    total++;
                    if (!isfinite(b))
                        continue;
                    finite++;
                    if (cabsl(hf - hx) > 0 && b > 0
                        && cabsl(hf - hx) / b > worst)
                        worst = cabsl(hf - hx) / b;
                    CHECK_MSG(cabsl(hf - hx) <= b, "%s %s seed %#llx draw "
                              "%d at %Lg rad/s: error %Lg beyond the bound "
                              "%Lg", path, j.tf[i].name,
                              (unsigned long long)seed, draw, w,
                              cabsl(hf - hx), b);
                }
        }
        free(nominal);
        gs_job_clear(&j);
    }
    CHECK_MSG(finite * 10 > total * 9, "%zu of %zu bounds finite", finite,
              total);
    printf("refcheck: %zu of %zu long double solves bounded; the largest "
           "error is %.3Lg of its bound\n", finite, total, worst);
}

/* The exact reference at the point that made the long double solve cry
   wolf: the widely scaled Sallen-Key low-pass at 10 GHz against the
   textbook form H = K / (s^2 R1 R2 C1 C2 + s (R1 C2 + R2 C2
   + (1 - K) R1 C1) + 1) (Sallen and Key, IRE Trans. Circuit Theory 2
   (1955); K = 1 for the follower, 1 + R4/R3 with the divider), which has
   no cancellation there and so is good to a few units of rounding. */
static void test_exact_sallen_key(void)
{
    static const char *const files[] = {
        "tests/cli/chk_sk_scaled.gsc", "tests/cli/chk_sk_scaled_gain.gsc",
    };
    size_t f;
    for (f = 0; f < 2; f++) {
        gs_job j;
        long double complex h, book, s;
        long double r1, r2, c1, c2, k = 1, w = 2 * acosl(-1) * 1e10L;
        int r3;
        gs_job_init(&j);
        if (load(&j, files[f]) != GS_OK) {
            CHECK_MSG(0, "%s does not load", files[f]);
            gs_job_clear(&j);
            continue;
        }
        r1 = j.vals[gs_symtab_find(j.c->syms, "R1")];
        r2 = j.vals[gs_symtab_find(j.c->syms, "R2")];
        c1 = j.vals[gs_symtab_find(j.c->syms, "C1")];
        c2 = j.vals[gs_symtab_find(j.c->syms, "C2")];
        r3 = gs_symtab_find(j.c->syms, "R3");
        if (r3 >= 0)
            k = 1 + j.vals[gs_symtab_find(j.c->syms, "R4")] / j.vals[r3];
        s = w * I;
        book = k / (s * s * r1 * r2 * c1 * c2
                    + s * (r1 * c2 + r2 * c2 + (1 - k) * r1 * c1) + 1);
        CHECK(gs_numsolve_exact(&h, j.c, 0, j.vals, s, NULL) == GS_OK);
        CHECK_MSG(cabsl(h - book) <= 1e-16L * cabsl(book), "%s: %Lg%+Lgj "
                  "against the book's %Lg%+Lgj", files[f], creall(h),
                  cimagl(h), creall(book), cimagl(book));
        gs_job_clear(&j);
    }
}

int main(void)
{
    test_exact_sallen_key();
    test_bound_holds();
    test_exact_divider();
    test_random_values();
    test_wrong_result();
    return check_report("refcheck");
}
