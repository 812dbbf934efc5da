/* bench_numeric.c - timings of the numeric analyses. See LICENSE.
 *
 * Prints one line per case:
 *   bench bode-NAME points=N seconds=S goal_seconds=0.02 ...
 *       poles and zeros found, then an N-point log sweep (magnitude,
 *       unwrapped phase, group delay), for a Miller-compensated
 *       amplifier's 3-pole, 1-zero loop gain and for a 10-section RC
 *       ladder (degree-10 denominator by the continuant recurrence);
 *   bench poles-NAME degree=D seconds=S max_rel_residual=R [max_rel_err=E]
 *       the root finder on polynomials with known roots;
 *   bench step-NAME seconds=S
 *       partial fractions and the step-response metrics.
 * S is the best of several timings.  The transfer functions are demo
 * values of our own.
 */
#include <complex.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "numeric/freq.h"
#include "gainsmith.h"
#include "numeric/roots.h"
#include "numeric/step.h"
#include "benchlib.h"

#define PI_L 3.141592653589793238462643383279502884L
#define REPS 7

typedef long double complex ldc;

/* Loop gain of a two-stage amplifier: DC gain 1e4, poles at 1 kHz, 20 MHz
   and 200 MHz, a right-half-plane zero at 500 MHz. */
static void miller(long double *num, long double *den)
{
    long double a = 1 / (2 * PI_L * 1e3L), b = 1 / (2 * PI_L * 20e6L);
    long double c = 1 / (2 * PI_L * 200e6L), z = 1 / (2 * PI_L * 500e6L);
    num[0] = 1e4L;
    num[1] = -1e4L * z;
    den[0] = 1;
    den[1] = a + b + c;
    den[2] = a * b + a * c + b * c;
    den[3] = a * b * c;
}

/* V_in / V_out of an n-section RC ladder, R and C per section, by the
   continuant recurrence from the open end: I += sC V, V += R I. */
static void rc_ladder(long double *v, int n, long double R, long double C)
{
    long double i[64] = {0};
    for (int k = 0; k <= n; k++)
        v[k] = k == 0;
    for (int sec = 0; sec < n; sec++) {
        for (int k = n; k > 0; k--)
            i[k] += C * v[k - 1];
        for (int k = 0; k <= n; k++)
            v[k] += R * i[k];
    }
}

static void bench_bode(const char *name, const long double *num, int nd,
                       const long double *den, int dd, long double f0,
                       long double f1)
{
    double best = INFINITY;
    gs_margins m = {0};
    size_t points = 10000;

    for (int r = 0; r < REPS; r++) {
        gs_tfn h;
        gs_sweep sw;
        double t0 = bench_now();
        gs_tfn_init(&h, num, nd, den, dd);
        gs_sweep_init(&sw);
        gs_sweep_log(&sw, &h, f0, f1, points);
        double t1 = bench_now() - t0;
        best = t1 < best ? t1 : best;
        gs_freq_margins(&m, &h);
        gs_sweep_clear(&sw);
        gs_tfn_clear(&h);
    }
    printf("bench bode-%s points=%zu seconds=%.6f goal_seconds=0.02 "
           "goal=%s", name, points, best, best < 0.02 ? "yes" : "no");
    if (m.has_pm)
        printf(" pm_deg=%.3Lf", m.pm_deg);
    printf("\n");
}

/* Time gs_roots on a[0..n]; report the residual and, when want is given,
   the worst relative error against it. */
static void bench_poles(const char *name, const long double *a, int n,
                        const ldc *want)
{
    ldc r[128];
    gs_roots_info info;
    double best = INFINITY;
    for (int k = 0; k < REPS; k++) {
        double t0 = bench_now();
        gs_roots(r, NULL, a, n, &info);
        double t1 = bench_now() - t0;
        best = t1 < best ? t1 : best;
    }
    printf("bench poles-%s degree=%d seconds=%.6f max_rel_residual=%.2Lg",
           name, n, best, info.max_residual);
    if (want != NULL) {
        long double worst = 0;
        for (int i = 0; i < n; i++) {
            long double d = INFINITY;
            for (int j = 0; j < n; j++)
                d = fminl(d, cabsl(r[j] - want[i]) / cabsl(want[i]));
            worst = fmaxl(worst, d);
        }
        printf(" max_rel_err=%.2Lg", worst);
    }
    printf(" sweeps=%d\n", info.iterations);
}

static void from_roots(long double *a, const ldc *r, int n)
{
    ldc c[129];
    c[0] = 1;
    for (int m = 0; m < n; m++) {
        c[m + 1] = 0;
        for (int k = m + 1; k > 0; k--)
            c[k] = c[k - 1] - r[m] * c[k];
        c[0] = -r[m] * c[0];
    }
    for (int k = 0; k <= n; k++)
        a[k] = creall(c[k]);
}

static void bench_step(const char *name, const long double *num, int nd,
                       const long double *den, int dd)
{
    double best = INFINITY;
    gs_step_metrics m = {0};
    for (int r = 0; r < REPS; r++) {
        gs_tfn h;
        gs_step s;
        double t0 = bench_now();
        gs_tfn_init(&h, num, nd, den, dd);
        gs_step_init(&s, &h);
        gs_step_measure(&m, &s);
        double t1 = bench_now() - t0;
        best = t1 < best ? t1 : best;
        gs_step_clear(&s);
        gs_tfn_clear(&h);
    }
    printf("bench step-%s seconds=%.6f settling_s=%.6Lg\n", name, best,
           m.settling_time);
}

static void poles_cases(void)
{
    ldc w[128];
    long double a[129];
    int n = 0;

    for (int k = -3; k <= 10; k++)
        w[n++] = -powl(10, k);
    from_roots(a, w, n);
    bench_poles("decades14", a, n, w);
    n = 0;
    for (int k = -3; k <= 9; k++) {
        long double x = powl(10, k) * sqrtl(0.5L);
        w[n++] = -x + x * I;
        w[n++] = -x - x * I;
    }
    from_roots(a, w, n);
    bench_poles("pairs26", a, n, w);
    for (n = 0; n < 20; n++)
        w[n] = n + 1;
    from_roots(a, w, n);
    bench_poles("wilkinson20", a, n, w);
    for (n = 0; n < 64; n++) {          /* unit circle, degree 64 */
        long double th = PI_L * (2 * n + 65) / 128;
        w[n] = cosl(th) + sinl(th) * I;
    }
    from_roots(a, w, n);
    bench_poles("butterworth64", a, n, NULL);
    rc_ladder(a, 10, 1e3L, 1e-9L);
    bench_poles("rc_ladder_10", a, 10, NULL);
}

int main(void)
{
    long double num[2], den[11];
    const long double one[1] = {1};

    miller(num, den);
    bench_bode("miller", num, 1, den, 3, 1, 1e10L);
    rc_ladder(den, 10, 1e3L, 1e-9L);
    bench_bode("rc_ladder_10", one, 0, den, 10, 1, 1e9L);
    poles_cases();
    miller(num, den);
    bench_step("miller", num, 1, den, 3);
    rc_ladder(den, 10, 1e3L, 1e-9L);
    bench_step("rc_ladder_10", one, 0, den, 10);
    return 0;
}
