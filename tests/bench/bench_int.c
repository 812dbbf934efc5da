/* bench_int.c - timings of the arbitrary-precision integers. See LICENSE.
 *
 * Prints one line per kernel, "bench int_KERNEL key=value ... seconds=S":
 * addmul on machine-word values (the polynomial hot path) and into a
 * multi-limb accumulator, then multiplication, division, gcd and decimal
 * printing of operands of n limbs.  S is the best of three timings.
 * Operands come from a fixed-seed generator, so runs compare.
 */
#include "algebra/int.h"

#include <stdio.h>
#include <stdlib.h>
#include <time.h>
#include "benchlib.h"

static uint64_t rng = 0x9e3779b97f4a7c15u;

/* xorshift64 (Marsaglia, J. Stat. Soft. 8(14), 2003) */
static uint64_t rnd(void)
{
    rng ^= rng << 13;
    rng ^= rng >> 7;
    rng ^= rng << 17;
    return rng;
}

static void random_limbs(gs_int *r, int n)
{
    int i;
    gs_int_set_si(r, 1);
    for (i = 0; i < n; i++) {
        gs_int_mul_2exp(r, r, 32);
        gs_int_add_si(r, r, (int64_t)(rnd() >> 32));
    }
}

typedef struct {
    gs_int a, b, c, d;
    long reps;
    int n;
} job;

static void run_addmul_small(job *j)
{
    long i;
    gs_int_set_si(&j->c, 0);
    for (i = 0; i < j->reps; i++) {
        gs_int_set_si(&j->a, (int64_t)(i & 1023) - 512);
        gs_int_addmul(&j->c, &j->a, &j->b);
        gs_int_submul(&j->c, &j->b, &j->a);
    }
}

static void run_addmul_big(job *j)
{
    long i;
    gs_int_set_si(&j->c, 1);
    gs_int_mul_2exp(&j->c, &j->c, 90);
    gs_int_set_si(&j->b, (int64_t)1 << 45);
    for (i = 0; i < j->reps; i++) {
        gs_int_set_si(&j->a, (int64_t)(i & 1023) << 40);
        gs_int_addmul(&j->c, &j->a, &j->b);
    }
}

static void run_mul(job *j)
{
    long i;
    for (i = 0; i < j->reps; i++)
        gs_int_mul(&j->c, &j->a, &j->b);
}

static void run_div(job *j)
{
    long i;
    for (i = 0; i < j->reps; i++)
        gs_int_tdiv_qr(&j->c, &j->d, &j->a, &j->b);
}

static void run_gcd(job *j)
{
    long i;
    for (i = 0; i < j->reps; i++)
        gs_int_gcd(&j->c, &j->a, &j->b);
}

static void run_str(job *j)
{
    long i;
    for (i = 0; i < j->reps; i++)
        free(gs_int_get_str(&j->a));
}

static double best_of_3(void (*f)(job *), job *j)
{
    double best = 1e30;
    int k;
    for (k = 0; k < 3; k++) {
        double t = bench_now();
        f(j);
        t = bench_now() - t;
        if (t < best)
            best = t;
    }
    return best;
}

static void report(const char *name, void (*f)(job *), job *j)
{
    double s = best_of_3(f, j);
    printf("bench int_%s limbs=%d reps=%ld ns_per_op=%.1f seconds=%.6f\n",
           name, j->n, j->reps, 1e9 * s / (double)j->reps, s);
}

int main(void)
{
    static const int sizes[] = {2, 10, 30, 100, 300, 1000};
    job j;
    size_t k;
    gs_int_init(&j.a);
    gs_int_init(&j.b);
    gs_int_init(&j.c);
    gs_int_init(&j.d);
    j.n = 0;
    j.reps = 20000000;
    gs_int_set_si(&j.b, 12345);
    report("addmul_small", run_addmul_small, &j);
    j.n = 3;
    report("addmul_into_big", run_addmul_big, &j);
    for (k = 0; k < sizeof sizes / sizeof sizes[0]; k++) {
        j.n = sizes[k];
        j.reps = 20000000L / ((long)j.n * j.n) + 1;
        random_limbs(&j.a, j.n);
        random_limbs(&j.b, j.n);
        report("mul", run_mul, &j);
        random_limbs(&j.a, 2 * j.n);
        report("div_2n_by_n", run_div, &j);
        random_limbs(&j.a, j.n);
        random_limbs(&j.c, j.n / 2 + 1);        /* a common factor */
        gs_int_mul(&j.a, &j.a, &j.c);
        gs_int_mul(&j.b, &j.b, &j.c);
        j.reps = j.reps / 10 + 1;
        report("gcd", run_gcd, &j);
        report("get_str", run_str, &j);
    }
    gs_int_clear(&j.a);
    gs_int_clear(&j.b);
    gs_int_clear(&j.c);
    gs_int_clear(&j.d);
    return 0;
}
