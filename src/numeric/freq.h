/* freq.h - frequency response of a numeric transfer function. See LICENSE.
 *
 * Everything here works on a gs_tfn (roots.h): H(s) = N(s)/D(s) with its
 * poles and zeros already found.  Frequencies in and out are in hertz
 * (f = w / 2 pi); magnitudes in dB (20 log10 |H|); phases in degrees,
 * unwrapped continuously from the low-frequency asymptote; group delay in
 * seconds.
 *
 * Phase convention: as w -> 0, H ~ K s^k, and the phase starts at
 * 90 k degrees, less 180 when K < 0 (an inverting gain starts at -180).
 * From there it is continuous in f: each pole or zero off the imaginary
 * axis turns it smoothly, and one on the axis turns it by 180 degrees at
 * once where it is crossed (a zero forwards, a pole backwards).
 */
#ifndef GS_FREQ_H
#define GS_FREQ_H

#include <stddef.h>
#include <stdio.h>

#include "numeric/roots.h"

/* H at the frequency f_hz (>= 0): magnitude in dB, unwrapped phase in
   degrees and group delay -d(phase)/dw in seconds, the last computed
   exactly as Re[D'/D - N'/N] at s = j w.  Any output pointer may be NULL.
   At a zero on the axis the magnitude is -inf; at a pole, +inf; if N = 0,
   -inf dB with phase and delay 0. */
void gs_freq_eval(long double *mag_db, long double *phase_deg,
                  long double *delay_s, const gs_tfn *h, long double f_hz);

/* A sampled frequency response.  The caller owns the struct (init/clear);
   the struct owns its arrays, each of length n. */
typedef struct gs_sweep {
    size_t n;
    long double *freq;      /* Hz */
    long double *mag_db;
    long double *phase_deg; /* unwrapped */
    long double *delay_s;   /* group delay */
} gs_sweep;

void gs_sweep_init(gs_sweep *sw);
void gs_sweep_clear(gs_sweep *sw);

/* Fill sw with `points` log-spaced frequencies from f_from to f_to Hz,
   both included (0 < f_from < f_to; points >= 2; or f_from == f_to with
   points == 1), and the response at each.  Replaces earlier contents.
   Returns GS_OK or GS_EINVAL. */
int gs_sweep_log(gs_sweep *sw, const gs_tfn *h, long double f_from,
                 long double f_to, size_t points);

/* The number of points for `per_decade` points per decade from f_from to
   f_to, ends included: ceil(decades * per_decade) + 1; 0 on bad input. */
size_t gs_sweep_points(long double f_from, long double f_to,
                       long double per_decade);

/* The response at the n frequencies freq[] (Hz, >= 0, any order). */
int gs_sweep_at(gs_sweep *sw, const gs_tfn *h, const long double *freq,
                size_t n);

/* The -3 dB bandwidth: the lowest frequency at which |H| falls to
   |H(0)| / sqrt 2 (half power, -3.0103 dB).  Returns GS_OK; GS_ERANGE if
   H(0) is zero or infinite, or |H| never falls that far. */
int gs_freq_bandwidth(long double *f_hz, const gs_tfn *h);

/* Every frequency f > 0 where |H(j 2 pi f)| equals level_db, ascending:
   at most max are written to f_hz (may be NULL if max is 0), and *count
   gets the number found.  The candidates are the positive real roots, in
   w^2, of |N(jw)|^2 - L^2 |D(jw)|^2, refined by Newton's method on
   log |H|.  Returns GS_OK, GS_EINVAL, or GS_ERANGE if the root search
   failed. */
int gs_freq_crossings(long double *f_hz, int max, int *count,
                      const gs_tfn *h, long double level_db);

/* Unity-gain frequency: the lowest frequency where |H| crosses 0 dB going
   down.  GS_OK, or GS_ERANGE if there is none. */
int gs_freq_unity_gain(long double *f_hz, const gs_tfn *h);

/* Stability margins of a loop gain L (the loop closes as 1/(1 + L)). */
typedef struct gs_margins {
    int has_pm;             /* 0: |L| never crosses 0 dB */
    long double pm_deg;     /* 180 + phase of L at a gain crossover; with
                               several crossovers, the smallest */
    long double pm_hz;      /* that crossover */
    int ncross;             /* number of gain crossovers */
    int has_gm;             /* 0: the phase never reaches -180 degrees */
    long double gm_db;      /* -20 log10 |L| where the unwrapped phase
                               first reaches -180 degrees */
    long double gm_hz;      /* that frequency */
} gs_margins;

/* Phase and gain margins of a loop gain (K. Ogata, "Modern Control
   Engineering", sec. on relative stability, for the definitions).
   Returns GS_OK, or GS_ERANGE if a root search failed. */
int gs_freq_margins(gs_margins *m, const gs_tfn *loop);

#endif
