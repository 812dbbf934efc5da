/* test_freq.c - tests of frequency response, bandwidth and margins.
 * See LICENSE. */
#include <complex.h>
#include <float.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "testlib.h"
#include "numeric/freq.h"
#include "gainsmith.h"
#include "numeric/roots.h"

#define PI_L 3.141592653589793238462643383279502884L

static long double rel(long double got, long double want)
{
    return fabsl(got - want) / fabsl(want);
}

static void tf(gs_tfn *h, const long double *n, int nd, const long double *d,
               int dd)
{
    int rc = gs_tfn_init(h, n, nd, d, dd);
    CHECK_MSG(rc == GS_OK, "gs_tfn_init: %d", rc);
}

/* First-order RC low-pass H = 1/(1 + sRC): -3 dB at f = 1/(2 pi RC), where
   the phase is -45 degrees, and group delay tau(w) = RC / (1 + (wRC)^2)
   (any circuits text; the delay is -d/dw of -atan(wRC)). */
static void test_rc_lowpass(void)
{
    long double R = 1e3L, C = 159e-9L, RC = R * C, fc = 1 / (2 * PI_L * RC);
    const long double num[1] = {1}, den[2] = {1, RC};
    long double bw, mag, ph, gd;
    gs_tfn h;
    tf(&h, num, 0, den, 1);
    CHECK(gs_freq_bandwidth(&bw, &h) == GS_OK);
    CHECK_MSG(rel(bw, fc) < 1e-16L, "bw %.20Lg fc %.20Lg", bw, fc);
    gs_freq_eval(&mag, &ph, &gd, &h, fc);
    CHECK(fabsl(mag + 10 * log10l(2)) < 1e-15L);
    CHECK_MSG(fabsl(ph + 45) < 1e-15L, "phase %.20Lg", ph);
    CHECK(rel(gd, RC / 2) < 1e-16L);
    for (int k = -3; k <= 3; k++) {
        long double f = fc * powl(10, k), w = 2 * PI_L * f;
        gs_freq_eval(&mag, &ph, &gd, &h, f);
        CHECK(rel(gd, RC / (1 + w * RC * w * RC)) < 1e-15L);
        CHECK(fabsl(ph + atanl(w * RC) * 180 / PI_L) < 1e-14L);
        CHECK(fabsl(mag + 10 * log10l(1 + w * RC * w * RC)) < 1e-14L);
    }
    gs_tfn_clear(&h);
}

/* Sallen-Key unity-gain low-pass, H = 1 / (R1 R2 C1 C2 s^2 + C2 (R1 + R2) s
   + 1): w0 = 1/sqrt(R1 R2 C1 C2), Q = sqrt(R1 R2 C1 C2) / (C2 (R1 + R2))
   (R. P. Sallen & E. L. Key, IRE Trans. Circuit Theory CT-2 (1955); as in
   any active-filter text).  A second-order low-pass has |H(j w0)| = Q and
   phase -90 degrees there. */
static void test_sallen_key(void)
{
    long double R1 = 10e3L, R2 = 22e3L, C1 = 10e-9L, C2 = 1e-9L;
    long double p = R1 * R2 * C1 * C2, w0 = 1 / sqrtl(p);
    long double Q = sqrtl(p) / (C2 * (R1 + R2));
    const long double num[1] = {1}, den[3] = {1, C2 * (R1 + R2), p};
    gs_tfn h;
    gs_pz_info pi;
    long double mag, ph;
    tf(&h, num, 0, den, 2);
    gs_pz_describe(&pi, h.poles[0]);
    CHECK(rel(pi.w0, w0) < 1e-17L);
    CHECK(rel(pi.q, Q) < 1e-16L);
    gs_freq_eval(&mag, &ph, NULL, &h, w0 / (2 * PI_L));
    CHECK(fabsl(mag - 20 * log10l(Q)) < 1e-14L);
    CHECK(fabsl(ph + 90) < 1e-14L);
    gs_tfn_clear(&h);
}

/* Series RLC, output across R: H = sRC / (LC s^2 + RC s + 1) peaks at 0 dB
   at w0 = 1/sqrt(LC); its -3 dB points w1, w2 satisfy w2 - w1 = R/L and
   w1 w2 = w0^2 (Nilsson & Riedel, "Electric Circuits", ch. 14). */
static void test_rlc_bandpass(void)
{
    long double R = 50, L = 10e-6L, C = 1e-9L;
    const long double num[2] = {0, R * C}, den[3] = {1, R * C, L * C};
    long double f[4], w0 = 1 / sqrtl(L * C), mag;
    int cnt;
    gs_tfn h;
    tf(&h, num, 1, den, 2);
    gs_freq_eval(&mag, NULL, NULL, &h, w0 / (2 * PI_L));
    CHECK(fabsl(mag) < 1e-15L);
    CHECK(gs_freq_crossings(f, 4, &cnt, &h, -10 * log10l(2)) == GS_OK);
    CHECK(cnt == 2);
    if (cnt != 2)
        f[0] = f[1] = NAN;
    long double w1 = 2 * PI_L * f[0], w2 = 2 * PI_L * f[1];
    CHECK_MSG(rel(w2 - w1, R / L) < 1e-15L, "%Lg vs %Lg", w2 - w1, R / L);
    CHECK(rel(w1 * w2, w0 * w0) < 1e-15L);
    long double bw;
    CHECK(gs_freq_bandwidth(&bw, &h) == GS_ERANGE);     /* H(0) = 0 */
    gs_tfn_clear(&h);
}

/* Phase conventions: the low-frequency asymptote K s^k starts at 90 k
   degrees, -180 more for K < 0; an all-pass (1 - s)/(1 + s) has |H| = 1,
   phase -2 atan w and delay 2/(1 + w^2) (math). */
static void test_phase_start(void)
{
    const long double inv[1] = {-10}, lp[2] = {1, 1};
    const long double integ_d[2] = {0, 1}, one[1] = {1};
    const long double ap_n[2] = {1, -1};
    long double mag, ph, gd;
    gs_tfn h;
    tf(&h, inv, 0, lp, 1);                  /* -10 / (1 + s) */
    gs_freq_eval(&mag, &ph, NULL, &h, 1e-9L);
    CHECK(fabsl(ph + 180) < 1e-6L && fabsl(mag - 20) < 1e-12L);
    gs_freq_eval(NULL, &ph, NULL, &h, 1e9L);
    CHECK(fabsl(ph + 270) < 1e-6L);
    gs_tfn_clear(&h);
    tf(&h, one, 0, integ_d, 1);             /* 1/s */
    for (int k = -6; k <= 6; k++) {
        gs_freq_eval(&mag, &ph, &gd, &h, powl(10, k));
        CHECK(ph == -90 && gd == 0);
        CHECK(fabsl(mag + 20 * log10l(2 * PI_L * powl(10, k))) < 1e-14L);
    }
    gs_tfn_clear(&h);
    tf(&h, integ_d, 1, lp, 1);              /* s/(1 + s) */
    gs_freq_eval(NULL, &ph, NULL, &h, 1e-9L);
    CHECK(fabsl(ph - 90) < 1e-6L);
    gs_tfn_clear(&h);
    tf(&h, ap_n, 1, lp, 1);                 /* (1 - s)/(1 + s) */
    for (int k = -3; k <= 3; k++) {
        long double w = powl(10, k);
        gs_freq_eval(&mag, &ph, &gd, &h, w / (2 * PI_L));
        CHECK(fabsl(mag) < 1e-15L);
        CHECK(fabsl(ph + 2 * atanl(w) * 180 / PI_L) < 1e-13L);
        CHECK(rel(gd, 2 / (1 + w * w)) < 1e-15L);
    }
    gs_tfn_clear(&h);
}

/* Unwrapping must not depend on the sweep density: an 8th-order
   Butterworth (coefficients by the handbook recurrence, see test_roots)
   ends near -720 degrees, and a pair with Q = 10^4 sampled 5 per decade
   still ends at -180 with a phase that only falls. */
static void test_unwrap(void)
{
    long double a[9], g = PI_L / 16;
    const long double one[1] = {1};
    gs_tfn h;
    gs_sweep sw;
    a[0] = 1;
    for (int k = 1; k <= 8; k++)
        a[k] = a[k - 1] * cosl((k - 1) * g) / sinl(k * g);
    tf(&h, one, 0, a, 8);
    gs_sweep_init(&sw);
    CHECK(gs_sweep_log(&sw, &h, 1e-6L, 1e3L, 10) == GS_OK);
    CHECK(fabsl(sw.phase_deg[0]) < 0.1L);
    CHECK(fabsl(sw.phase_deg[sw.n - 1] + 720) < 1);
    for (size_t i = 1; i < sw.n; i++)
        CHECK(sw.phase_deg[i] < sw.phase_deg[i - 1]);
    gs_tfn_clear(&h);
    const long double hq[3] = {1, 1e-4L, 1};        /* Q = 10^4 at 1 rad/s */
    tf(&h, one, 0, hq, 2);
    CHECK(gs_sweep_log(&sw, &h, 1e-3L, 1e3L, 31) == GS_OK);
    for (size_t i = 1; i < sw.n; i++)
        CHECK(sw.phase_deg[i] <= sw.phase_deg[i - 1]);
    CHECK(fabsl(sw.phase_deg[sw.n - 1] + 180) < 0.01L);
    gs_tfn_clear(&h);
    gs_sweep_clear(&sw);
}

/* L = sqrt 2 / (s (s + 1)): |L(j1)| = 1, so the gain crossover is 1 rad/s
   and PM = 90 - atan 1 = 45 degrees; no phase crossover.  L = 1 / (s (s +
   1)(s + 2)): the phase is -180 where w^2 = 2, |L| = 1/6 there, GM =
   20 log10 6 = 15.563 dB (Ogata, "Modern Control Engineering", relative
   stability examples); its gain crossover is found here by bisection. */
static void test_margins(void)
{
    const long double n1[1] = {sqrtl(2)}, d1[3] = {0, 1, 1};
    const long double n2[1] = {1}, d2[4] = {0, 2, 3, 1};
    gs_margins m;
    gs_tfn h;
    tf(&h, n1, 0, d1, 2);
    CHECK(gs_freq_margins(&m, &h) == GS_OK);
    CHECK(m.has_pm && m.ncross == 1 && !m.has_gm);
    CHECK(rel(m.pm_hz, 1 / (2 * PI_L)) < 1e-16L);
    CHECK(fabsl(m.pm_deg - 45) < 1e-14L);
    gs_tfn_clear(&h);
    tf(&h, n2, 0, d2, 3);
    CHECK(gs_freq_margins(&m, &h) == GS_OK);
    CHECK(m.has_gm && m.has_pm);
    CHECK(rel(m.gm_hz, sqrtl(2) / (2 * PI_L)) < 1e-16L);
    CHECK(fabsl(m.gm_db - 20 * log10l(6)) < 1e-14L);
    long double lo = 0.1L, hi = 1;      /* w^2 (1 + w^2)(4 + w^2) = 1 */
    for (int i = 0; i < 200; i++) {
        long double mid = (lo + hi) / 2, w2 = mid * mid;
        if (w2 * (1 + w2) * (4 + w2) > 1)
            hi = mid;
        else
            lo = mid;
    }
    long double pm = 90 - (atanl(lo) + atanl(lo / 2)) * 180 / PI_L;
    CHECK(rel(m.pm_hz * 2 * PI_L, lo) < 1e-16L);
    CHECK(fabsl(m.pm_deg - pm) < 1e-13L);
    gs_tfn_clear(&h);
}

/* A0 / (1 + s/wp) crosses 0 dB at wp sqrt(A0^2 - 1); w_u / s at w_u. */
static void test_unity(void)
{
    long double A0 = 1e5L, wp = 2 * PI_L * 10, f;
    const long double n1[1] = {A0}, d1[2] = {1, 1 / wp};
    const long double n2[1] = {2e6L}, d2[2] = {0, 1};
    gs_tfn h;
    tf(&h, n1, 0, d1, 1);
    CHECK(gs_freq_unity_gain(&f, &h) == GS_OK);
    CHECK(rel(2 * PI_L * f, wp * sqrtl(A0 * A0 - 1)) < 1e-16L);
    gs_tfn_clear(&h);
    tf(&h, n2, 0, d2, 1);
    CHECK(gs_freq_unity_gain(&f, &h) == GS_OK);
    CHECK(rel(2 * PI_L * f, 2e6L) < 1e-17L);
    gs_tfn_clear(&h);
    const long double small[1] = {0.5L};
    tf(&h, small, 0, d1, 1);
    CHECK(gs_freq_unity_gain(&f, &h) == GS_ERANGE);
    gs_tfn_clear(&h);
    /* an all-pass (a - s)/(a + s) sits at 0 dB: no crossing, not noise */
    const long double ap_n[2] = {0.3L, -1}, ap_d[2] = {0.3L, 1};
    int cnt;
    tf(&h, ap_n, 1, ap_d, 1);
    CHECK(gs_freq_unity_gain(&f, &h) == GS_ERANGE);
    CHECK(gs_freq_crossings(&f, 1, &cnt, &h, 0) == GS_OK && cnt == 0);
    gs_tfn_clear(&h);
}

/* Poles at 1 mHz and 10 GHz in one transfer: the magnitude is the sum of
   the two first-order terms, -10 log10(1 + (f/fk)^2), at every frequency
   (math). */
static void test_wide_range(void)
{
    long double w1 = 2 * PI_L * 1e-3L, w2 = 2 * PI_L * 1e10L, mag, ph, bw;
    const long double one[1] = {1};
    const long double den[3] = {1, 1 / w1 + 1 / w2, 1 / (w1 * w2)};
    gs_tfn h;
    tf(&h, one, 0, den, 2);
    for (int k = -6; k <= 13; k++) {
        long double f = powl(10, k), x1 = f / 1e-3L, x2 = f / 1e10L;
        long double want = -10 * log10l(1 + x1 * x1) - 10 * log10l(1 + x2 * x2);
        gs_freq_eval(&mag, &ph, NULL, &h, f);
        CHECK_MSG(fabsl(mag - want) < 1e-12L * (1 + fabsl(want)),
                  "f %Lg: %.20Lg vs %.20Lg", f, mag, want);
        long double wph = -(atanl(x1) + atanl(x2)) * 180 / PI_L;
        CHECK(fabsl(ph - wph) < 1e-12L);
    }
    CHECK(gs_freq_bandwidth(&bw, &h) == GS_OK);
    CHECK(rel(bw, 1e-3L) < 1e-12L);
    gs_tfn_clear(&h);
}


/* Random H: the magnitude agrees with |N/D| by plain complex evaluation,
   the phase with its argument modulo 360, and the group delay with a
   central difference of the unwrapped phase. */
static void test_random(void)
{
    uint64_t seed = 424242;
    for (int trial = 0; trial < 100; trial++) {
        gs_rng s;
        gs_rng_seed(&s, seed + (uint64_t)trial);
        long double n[7], d[7];
        int nd = (int)(gs_rng_next(&s) % 5), dd = 1 + (int)(gs_rng_next(&s) % 6);
        for (int k = 0; k <= nd; k++)
            n[k] = (test_unit(&s) - 0.3L) * powl(10, 2 - k);
        for (int k = 0; k <= dd; k++)
            d[k] = (0.1L + test_unit(&s)) * powl(10, 1 - k);
        gs_tfn h;
        tf(&h, n, nd, d, dd);
        long double f = powl(10, -3 + 5 * test_unit(&s)), w = 2 * PI_L * f;
        long double mag, ph, gd, p1, p2;
        long double complex H = gs_tfn_eval(&h, w * I);
        gs_freq_eval(&mag, &ph, &gd, &h, f);
        CHECK_MSG(fabsl(mag - 20 * log10l(cabsl(H))) < 1e-10L,
                  "seed %llu trial %d", (unsigned long long)seed, trial);
        long double dp = remainderl(ph - cargl(H) * 180 / PI_L, 360);
        CHECK_MSG(fabsl(dp) < 1e-9L, "seed %llu trial %d: %Lg vs %Lg",
                  (unsigned long long)seed, trial, ph, cargl(H) * 180 / PI_L);
        long double e = 1e-6L;
        gs_freq_eval(NULL, &p1, NULL, &h, f * (1 - e));
        gs_freq_eval(NULL, &p2, NULL, &h, f * (1 + e));
        long double fd = -(p2 - p1) * PI_L / 180 / (2 * w * e);
        CHECK_MSG(fabsl(fd - gd) < 1e-6L * (fabsl(gd) + 1 / w),
                  "seed %llu trial %d: delay %Lg vs %Lg",
                  (unsigned long long)seed, trial, gd, fd);
        gs_tfn_clear(&h);
    }
}

/* Sweep grids: point counts, both ends included, bad ranges refused. */
static void test_sweep_grid(void)
{
    const long double num[1] = {1}, den[2] = {1, 1e-3L};
    gs_tfn h;
    gs_sweep sw;
    tf(&h, num, 0, den, 1);
    gs_sweep_init(&sw);
    CHECK(gs_sweep_points(1, 1e6L, 10) == 61);
    CHECK(gs_sweep_points(1, 2, 10) == 5);
    CHECK(gs_sweep_points(0, 2, 10) == 0);
    CHECK(gs_sweep_log(&sw, &h, 1, 1e6L, 61) == GS_OK);
    CHECK(sw.n == 61 && sw.freq[0] == 1 && sw.freq[60] == 1e6L);
    CHECK(rel(sw.freq[10], 10) < 1e-17L);
    CHECK(gs_sweep_log(&sw, &h, 0, 1e6L, 61) == GS_EINVAL);
    CHECK(gs_sweep_log(&sw, &h, 10, 1, 61) == GS_EINVAL);
    CHECK(gs_sweep_log(&sw, &h, 1, 1e6L, 61) == GS_OK);
    long double at[2] = {0, 1e3L};
    CHECK(gs_sweep_at(&sw, &h, at, 2) == GS_OK && sw.mag_db[0] == 0);
    gs_sweep_clear(&sw);
    gs_tfn_clear(&h);
}

/* N = 0 is a valid answer: -inf dB everywhere, nothing crosses. */
static void test_zero_gain(void)
{
    const long double z[1] = {0}, den[2] = {1, 1};
    long double mag, ph, gd, f;
    int cnt;
    gs_tfn h;
    tf(&h, z, 0, den, 1);
    gs_freq_eval(&mag, &ph, &gd, &h, 1);
    CHECK(mag == -INFINITY && ph == 0 && gd == 0);
    CHECK(gs_freq_crossings(&f, 1, &cnt, &h, 0) == GS_OK && cnt == 0);
    CHECK(gs_freq_bandwidth(&f, &h) == GS_ERANGE);
    gs_tfn_clear(&h);
}

int main(void)
{
    test_rc_lowpass();
    test_sallen_key();
    test_rlc_bandpass();
    test_phase_start();
    test_unwrap();
    test_margins();
    test_unity();
    test_wide_range();
    test_random();
    test_sweep_grid();
    test_zero_gain();
    return check_report("freq");
}
