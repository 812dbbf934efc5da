/* test_step.c - tests of step and impulse responses and their metrics.
 * See LICENSE. */
#include <complex.h>
#include <float.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "gainsmith.h"
#include "numeric/roots.h"
#include "numeric/step.h"

#define PI_L 3.141592653589793238462643383279502884L

static long double rel(long double got, long double want)
{
    return fabsl(got - want) / fabsl(want);
}

/* Build H = n/d and its step expansion; returns the init status */
static int setup(gs_tfn *h, gs_step *s, const long double *n, int nd,
                 const long double *d, int dd)
{
    int rc = gs_tfn_init(h, n, nd, d, dd);
    CHECK_MSG(rc == GS_OK, "gs_tfn_init %d", rc);
    return gs_step_init(s, h);
}

static void done(gs_tfn *h, gs_step *s)
{
    gs_step_clear(s);
    gs_tfn_clear(h);
}

/* First-order RC, H = 1/(1 + sRC): y = 1 - e^(-t/RC), impulse e^(-t/RC)/RC;
   10-90 % rise time RC ln 9 and 1 % settling time RC ln 100 (any circuits
   text; both follow from e^(-t/RC)). */
static void test_first_order(void)
{
    long double RC = 4.7e-6L;
    const long double num[1] = {1}, den[2] = {1, RC};
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    CHECK(setup(&h, &s, num, 0, den, 1) == GS_OK);
    for (int k = 0; k <= 20; k++) {
        long double t = RC * k / 4;
        CHECK(fabsl(gs_step_eval(&s, t) - (1 - expl(-t / RC))) < 1e-18L);
        CHECK(rel(gs_step_impulse(&s, t), expl(-t / RC) / RC) < 1e-17L);
    }
    CHECK(gs_step_measure(&m, &s) == GS_OK);
    CHECK(m.has_final && m.final_value == 1);
    CHECK(m.has_rise && rel(m.rise_time, RC * logl(9)) < 1e-15L);
    CHECK(rel(m.t10, RC * logl(10.0L / 9)) < 1e-15L);
    CHECK(m.has_overshoot && m.overshoot_pct == 0 && m.peak_time == 0);
    CHECK_MSG(m.has_settling && rel(m.settling_time, RC * logl(100)) < 1e-15L,
              "%Lg vs %Lg", m.settling_time, RC * logl(100));
    CHECK(s.direct == 0 && s.stability == GS_STABLE);
    done(&h, &s);
}

/* Closed form of the underdamped second-order step response,
   y = K (1 - e^(-z w t) (cos(wd t) + z/sqrt(1-z^2) sin(wd t))),
   wd = w sqrt(1 - z^2) (K. Ogata, "Modern Control Engineering", ch. 5). */
static long double second_order(long double K, long double z, long double w,
                                long double t)
{
    long double r = sqrtl(1 - z * z), wd = w * r;
    return K * (1 - expl(-z * w * t) * (cosl(wd * t) + z / r * sinl(wd * t)));
}

/* Settling time of that closed form: its extrema lie at t_k = k pi/wd
   (where y' = K w/sqrt(1-z^2) e^(-z w t) sin(wd t) vanishes), so the band
   is last left between the last extremum outside it and the next one;
   bisection there. */
static long double second_order_settling(long double K, long double z,
                                         long double w)
{
    long double wd = w * sqrtl(1 - z * z);
    int last = 0;
    for (int k = 1; k < 100000000; k++) {
        long double y = second_order(K, z, w, k * PI_L / wd) / K;
        if (fabsl(y - 1) > 0.01L)
            last = k;
        if (expl(-z * w * k * PI_L / wd) / sqrtl(1 - z * z) < 0.001L)
            break;
    }
    long double a = last * PI_L / wd, b = (last + 1) * PI_L / wd;
    for (int i = 0; i < 100; i++) {
        long double mid = (a + b) / 2;
        if (fabsl(second_order(K, z, w, mid) / K - 1) > 0.01L)
            a = mid;
        else
            b = mid;
    }
    return (a + b) / 2;
}

/* H = K w^2 / (s^2 + 2 z w s + w^2): overshoot exp(-pi z / sqrt(1 - z^2)),
   peak time pi / wd, final value K = H(0) (Ogata, ch. 5).  K < 0 checks
   that the metrics are taken relative to the final value. */
static void test_second_order(void)
{
    const long double zetas[4] = {0.1L, 0.3L, 0.5L, 0.7L};
    for (int i = 0; i < 4; i++) {
        long double z = zetas[i], w = 2 * PI_L * 1e6L, K = i % 2 ? -3 : 2;
        const long double num[1] = {K * w * w}, den[3] = {w * w, 2 * z * w, 1};
        gs_tfn h;
        gs_step s;
        gs_step_metrics m;
        CHECK(setup(&h, &s, num, 0, den, 2) == GS_OK);
        for (int k = 0; k < 50; k++) {
            long double t = k * 0.1L / w;
            CHECK(fabsl(gs_step_eval(&s, t) - second_order(K, z, w, t))
                  < 1e-15L * fabsl(K));
        }
        CHECK(gs_step_measure(&m, &s) == GS_OK);
        CHECK(m.has_final && rel(m.final_value, K) < 1e-18L);
        long double os = 100 * expl(-PI_L * z / sqrtl(1 - z * z));
        CHECK_MSG(rel(m.overshoot_pct, os) < 1e-12L,
                  "zeta %Lg: %.15Lg vs %.15Lg", z, m.overshoot_pct, os);
        CHECK(rel(m.peak_time, PI_L / (w * sqrtl(1 - z * z))) < 1e-15L);
        long double ts = second_order_settling(K, z, w);
        CHECK_MSG(rel(m.settling_time, ts) < 1e-9L, "zeta %Lg: %Lg vs %Lg", z,
                  m.settling_time, ts);
        CHECK(m.has_rise && m.t90 > m.t10 && m.t10 > 0);
        CHECK(fabsl(gs_step_eval(&s, m.t10) / K - 0.1L) < 1e-15L);
        done(&h, &s);
    }
}

/* Repeated poles: 1/(s+1)^2 -> y = 1 - e^-t (1 + t); 1/(s+1)^3 -> y =
   1 - e^-t (1 + t + t^2/2) (tables of Laplace transforms, e.g. Abramowitz
   & Stegun 29.3).  Poles 1e-8 apart are merged; the exact response of
   1/((s+a)(s+b)), 1 - e^-at (1 - a expm1(-dt)/d) with d = b - a, is then
   still matched. */
static void test_repeated(void)
{
    const long double one[1] = {1};
    const long double d2[3] = {1, 2, 1}, d3[4] = {1, 3, 3, 1};
    gs_tfn h;
    gs_step s;
    CHECK(setup(&h, &s, one, 0, d2, 2) == GS_OK);
    CHECK(s.nterms == 2);
    for (int k = 0; k <= 40; k++) {
        long double t = k * 0.25L;
        CHECK(fabsl(gs_step_eval(&s, t) - (1 - expl(-t) * (1 + t))) < 1e-15L);
        CHECK(fabsl(gs_step_impulse(&s, t) - t * expl(-t)) < 1e-15L);
    }
    done(&h, &s);
    CHECK(setup(&h, &s, one, 0, d3, 3) == GS_OK);
    for (int k = 0; k <= 40; k++) {
        long double t = k * 0.25L, want = 1 - expl(-t) * (1 + t + t * t / 2);
        CHECK_MSG(fabsl(gs_step_eval(&s, t) - want) < 1e-12L, "t %Lg: %Lg",
                  t, gs_step_eval(&s, t) - want);
    }
    done(&h, &s);
    /* (s+1)^4: its roots spread by eps^(1/4) ~ 2e-5, so only the root
       finder's cluster analysis can merge them; y = 1 - e^-t (1 + t +
       t^2/2 + t^3/6) (same tables) */
    const long double d4[5] = {1, 4, 6, 4, 1};
    CHECK(setup(&h, &s, one, 0, d4, 4) == GS_OK);
    CHECK(s.nterms == 2);
    for (int k = 0; k <= 40; k++) {
        long double t = k * 0.25L;
        long double want = 1 - expl(-t) * (1 + t + t * t / 2
                                            + t * t * t / 6);
        CHECK_MSG(fabsl(gs_step_eval(&s, t) - want) < 1e-9L, "t %Lg: %Lg",
                  t, gs_step_eval(&s, t) - want);
    }
    done(&h, &s);
    long double a = 1, b = 1 + 1e-8L, dd = b - a;
    const long double num[1] = {a * b}, den[3] = {a * b, a + b, 1};
    CHECK(setup(&h, &s, num, 0, den, 2) == GS_OK);
    CHECK(s.nterms == 2);               /* the merged pair and s = 0 */
    for (int k = 0; k <= 40; k++) {
        long double t = k * 0.25L;
        long double want = 1 - expl(-a * t) * (1 - a * expm1l(-dd * t) / dd);
        CHECK(fabsl(gs_step_eval(&s, t) - want) < 1e-14L);
    }
    done(&h, &s);
}

/* Direct feedthrough: H = (s + 2)/(s + 1) -> y = 2 - e^-t, y(0+) = H(inf)
   = 1 (initial value theorem). */
static void test_feedthrough(void)
{
    const long double num[2] = {2, 1}, den[2] = {1, 1};
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    CHECK(setup(&h, &s, num, 1, den, 1) == GS_OK);
    CHECK(s.direct == 1);
    CHECK(fabsl(gs_step_eval(&s, 0) - 1) < 1e-18L);
    CHECK(fabsl(gs_step_eval(&s, 2) - (2 - expl(-2))) < 1e-18L);
    CHECK(fabsl(gs_step_impulse(&s, 2) - expl(-2)) < 1e-18L);
    CHECK(gs_step_measure(&m, &s) == GS_OK && m.final_value == 2);
    CHECK(m.t10 == 0 && m.has_rise);            /* starts at 50 % */
    CHECK(rel(m.t90, logl(5)) < 1e-15L);        /* 2 - e^-t = 1.8 */
    done(&h, &s);
    const long double hp[2] = {0, 1};           /* s/(s+1): improper? no */
    const long double imp_n[3] = {0, 0, 1};     /* s^2/(s+1): improper */
    CHECK(setup(&h, &s, imp_n, 2, den, 1) == GS_ERANGE);
    done(&h, &s);
    CHECK(setup(&h, &s, hp, 1, den, 1) == GS_OK);
    CHECK(gs_step_measure(&m, &s) == GS_OK);
    CHECK(m.has_final && m.final_value == 0 && !m.has_rise);
    CHECK(fabsl(gs_step_eval(&s, 1) - expl(-1)) < 1e-18L);
    done(&h, &s);
}

/* 1/s gives the ramp y = t; 1/(s - 1) gives e^t - 1; neither settles. */
static void test_unbounded(void)
{
    const long double one[1] = {1}, integ[2] = {0, 1}, unst[2] = {-1, 1};
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    CHECK(setup(&h, &s, one, 0, integ, 1) == GS_OK);
    CHECK(fabsl(gs_step_eval(&s, 3) - 3) < 1e-18L);
    CHECK(gs_step_measure(&m, &s) == GS_OK && !m.has_final);
    CHECK(gs_step_span(&s) > 0);
    done(&h, &s);
    CHECK(setup(&h, &s, one, 0, unst, 1) == GS_OK);
    CHECK(fabsl(gs_step_eval(&s, 2) - expm1l(2)) < 1e-17L);
    CHECK(s.stability == GS_UNSTABLE);
    CHECK(gs_step_measure(&m, &s) == GS_OK && !m.has_final);
    done(&h, &s);
}

/* Poles at 1 and 1e9 rad/s: y = 1 - (b e^-at - a e^-bt)/(b - a), a = 1,
   b = 1e9 (partial fractions); rise time within 1e-8 of ln 9 + the
   fast pole's small lag. */
static void test_wide(void)
{
    long double a = 1, b = 1e9L;
    const long double num[1] = {a * b}, den[3] = {a * b, a + b, 1};
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    CHECK(setup(&h, &s, num, 0, den, 2) == GS_OK);
    for (int k = -12; k <= 1; k++) {
        long double t = powl(10, k);
        long double want = 1 - (b * expl(-a * t) - a * expl(-b * t)) / (b - a);
        CHECK_MSG(fabsl(gs_step_eval(&s, t) - want) < 1e-17L, "t %Lg", t);
    }
    CHECK(gs_step_measure(&m, &s) == GS_OK);
    CHECK(fabsl(m.rise_time - logl(9)) < 1e-8L);
    CHECK(rel(m.settling_time, logl(100)) < 1e-8L);
    done(&h, &s);
}

/* A lightly damped pair, zeta = 5e-4: overshoot exp(-pi z/sqrt(1-z^2))
   (Ogata, ch. 5), which takes many periods to settle. */
static void test_high_q(void)
{
    long double z = 5e-4L;
    const long double num[1] = {1}, den[3] = {1, 2 * z, 1};
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    CHECK(setup(&h, &s, num, 0, den, 2) == GS_OK);
    CHECK(gs_step_measure(&m, &s) == GS_OK);
    long double os = 100 * expl(-PI_L * z / sqrtl(1 - z * z));
    CHECK(rel(m.overshoot_pct, os) < 1e-12L);
    CHECK(rel(m.settling_time, second_order_settling(1, z, 1)) < 1e-9L);
    done(&h, &s);
}

static uint64_t next_rand(uint64_t *s)     /* splitmix64 */
{
    uint64_t z = (*s += 0x9E3779B97F4A7C15ULL);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
}

static long double uniform(uint64_t *s)
{
    return (long double)(next_rand(s) >> 11) / 9007199254740992.0L;
}

/* x' = A x + B u in controllable canonical form of N/D (D monic), y = C x
   + direct u, by classical Runge-Kutta with u = 1 (the definition of the
   transfer function as an ODE; Ogata ch. 2).  Order n <= 4. */
static long double rk4_step_response(const long double *nn, int nd,
                                     const long double *d, int n,
                                     long double t_end, int steps)
{
    long double x[4] = {0}, h = t_end / steps, b[5] = {0};
    for (int k = 0; k <= nd; k++)
        b[k] = nn[k] / d[n];
    long double dir = nd == n ? b[n] : 0;
    for (int st = 0; st < steps; st++) {
        long double k[4][4], xt[4];
        for (int stage = 0; stage < 4; stage++) {
            static const long double c[4] = {0, 0.5L, 0.5L, 1};
            for (int i = 0; i < n; i++)
                xt[i] = x[i] + (stage ? c[stage] * h * k[stage - 1][i] : 0);
            for (int i = 0; i + 1 < n; i++)
                k[stage][i] = xt[i + 1];
            k[stage][n - 1] = 1;
            for (int i = 0; i < n; i++)
                k[stage][n - 1] -= d[i] / d[n] * xt[i];
        }
        for (int i = 0; i < n; i++)
            x[i] += h / 6 * (k[0][i] + 2 * k[1][i] + 2 * k[2][i] + k[3][i]);
    }
    long double y = dir;
    for (int i = 0; i < n; i++)
        y += (b[i] - dir * d[i] / d[n]) * x[i];
    return y;
}

/* Random stable H of order 1..4: partial fractions agree with an
   independent Runge-Kutta solution of the same ODE. */
static void test_random_vs_ode(void)
{
    uint64_t seed = 777;
    for (int trial = 0; trial < 30; trial++) {
        uint64_t s0 = seed + (uint64_t)trial;
        int n = 1 + (int)(next_rand(&s0) % 4), nd = (int)(next_rand(&s0) % 
                                                         (unsigned)(n + 1));
        long double complex r[4];
        long double d[5] = {1}, num[5];
        for (int k = 0; k < n; k++) {           /* stable poles */
            if (k + 1 < n && uniform(&s0) < 0.5L) {
                r[k] = -0.2L - uniform(&s0) + 3 * uniform(&s0) * I;
                r[k + 1] = conjl(r[k]);
                k++;
            } else {
                r[k] = -0.2L - 2 * uniform(&s0);
            }
        }
        long double complex c[5] = {1};
        for (int m = 0; m < n; m++) {
            c[m + 1] = 0;
            for (int k = m + 1; k > 0; k--)
                c[k] = c[k - 1] - r[m] * c[k];
            c[0] = -r[m] * c[0];
        }
        for (int k = 0; k <= n; k++)
            d[k] = creall(c[k]);
        for (int k = 0; k <= nd; k++)
            num[k] = uniform(&s0) - 0.5L;
        gs_tfn h;
        gs_step st;
        CHECK(setup(&h, &st, num, nd, d, n) == GS_OK);
        long double t = 1 + 4 * uniform(&s0);
        long double want = rk4_step_response(num, nd, d, n, t, 20000);
        CHECK_MSG(fabsl(gs_step_eval(&st, t) - want) < 1e-9L,
                  "seed %llu trial %d n %d: %.15Lg vs %.15Lg",
                  (unsigned long long)seed, trial, n, gs_step_eval(&st, t),
                  want);
        done(&h, &st);
    }
}

/* CSV header and layout; the sampled table. */
static void test_csv(void)
{
    const long double num[1] = {1}, den[2] = {1, 1};
    gs_tfn h;
    gs_step s;
    char line[200];
    long double t[5], y[5];
    FILE *f = tmpfile();
    CHECK(setup(&h, &s, num, 0, den, 1) == GS_OK);
    CHECK(f != NULL && gs_step_write_csv(f, &s, 4, 5) == GS_OK);
    rewind(f);
    CHECK(fgets(line, sizeof line, f) != NULL);
    CHECK(strcmp(line, "time_s,step,impulse_per_s\n") == 0);
    CHECK(fgets(line, sizeof line, f) != NULL && strcmp(line, "0,0,1\n") == 0);
    int rows = 1;
    while (fgets(line, sizeof line, f) != NULL)
        rows++;
    CHECK(rows == 5);
    fclose(f);
    CHECK(gs_step_table(t, y, NULL, 5, &s, 4) == GS_OK);
    CHECK(t[4] == 4 && fabsl(y[2] - (1 - expl(-2))) < 1e-18L);
    CHECK(gs_step_table(t, y, NULL, 1, &s, 4) == GS_EINVAL);
    long double span = gs_step_span(&s);
    CHECK(span > 6.9L && span < 7.7L);          /* e^-t = 1e-3 at 6.9 */
    done(&h, &s);
}

int main(void)
{
    test_first_order();
    test_second_order();
    test_repeated();
    test_feedthrough();
    test_unbounded();
    test_wide();
    test_high_q();
    test_random_vs_ode();
    test_csv();
    return check_report("step");
}
