/* step.h - step and impulse response by partial fractions. See LICENSE.
 *
 * For H(s) = N(s)/D(s) with deg N <= deg D the unit-step response is the
 * inverse Laplace transform of Y(s) = H(s)/s, expanded in partial
 * fractions over the poles of H and the pole at 0:
 *
 *     y(t) = sum_k sum_{l < m_k} c_{k,l} t^l / l! e^(p_k t),   t > 0,
 *
 * with an m_k-fold pole p_k.  Complex poles come in conjugate pairs and
 * are summed as 2 Re(...), so y is real.  The impulse response is y'(t)
 * for t > 0 plus H(inf) delta(t) when deg N = deg D.  Poles closer than
 * a relative 1e-6, or that the root finder put in one cluster narrower
 * than 1 %, are merged into one repeated pole at their centroid:
 * docs/analysis.md says why.
 */
#ifndef GS_STEP_H
#define GS_STEP_H

#include <complex.h>
#include <stddef.h>
#include <stdio.h>

#include "numeric/roots.h"

/* One pole of Y(s) and its m coefficients: c[l] multiplies
   1/(s - p)^(l+1), i.e. t^l/l! e^(pt) in the time domain. */
typedef struct gs_pf_term {
    long double complex p;
    int mult;
    int pair;               /* 1: p is the upper one of a conjugate pair,
                               and the term stands for both */
    long double complex *c; /* mult coefficients, owned by the gs_step */
} gs_pf_term;

/* The caller owns the struct (gs_step_init / gs_step_clear); it owns its
   arrays.  Fields are read-only. */
typedef struct gs_step {
    int nterms;
    gs_pf_term *terms;
    long double complex *coef;  /* storage behind terms[].c */
    long double direct;     /* H(inf): y(0+), and the weight of delta(t) in
                               the impulse response */
    long double dc_gain;    /* H(0) */
    int stability;          /* GS_STABLE, GS_MARGINAL or GS_UNSTABLE */
    long double t_fast;     /* 1 / largest |p| over nonzero poles */
    long double t_slow;     /* 1 / smallest |p| over nonzero poles */
} gs_step;

/* Expand H(s)/s.  Returns GS_OK; GS_ERANGE when deg N > deg D (the step
   response would hold derivatives of delta(t)).  s must be passed to
   gs_step_clear whatever the result. */
int gs_step_init(gs_step *s, const gs_tfn *h);
void gs_step_clear(gs_step *s);

/* y(t), the unit-step response, for t >= 0 (y(0) is y(0+)). */
long double gs_step_eval(const gs_step *s, long double t);

/* The impulse response y'(t) at t >= 0, without the delta(t) part. */
long double gs_step_impulse(const gs_step *s, long double t);

/* Figures of the step response, relative to its final value. */
typedef struct gs_step_metrics {
    int has_final;              /* 0 unless every pole has Re p < 0 */
    long double final_value;    /* y(inf) = H(0) */
    int has_rise;               /* needs a nonzero final value */
    long double t10, t90;       /* first times y reaches 10 % and 90 % of
                                   the final value */
    long double rise_time;      /* t90 - t10 */
    int has_overshoot;
    long double overshoot_pct;  /* 100 (peak - final) / |final|, >= 0 */
    long double peak_value;     /* the extreme value beyond the final
                                   value, or the final value if none */
    long double peak_time;      /* its time; 0 if there is no overshoot */
    int has_settling;
    long double settling_time;  /* last time |y - final| = 1 % |final| */
} gs_step_metrics;

/* Work out the metrics.  The response is scanned on a grid that is
   logarithmic in t and fine enough for every oscillation still alive,
   and each event is then located by bisection to full precision.
   Returns GS_OK (fields without their has_ flag are 0), or GS_EBUDGET if
   the grid would need more than a few million points (a very lightly
   damped pole far faster than the slowest one). */
int gs_step_measure(gs_step_metrics *m, const gs_step *s);

/* A time span that shows the response: for a stable H, until every
   transient has fallen to 0.1 % of the larger of |H(0)| and the
   transients' own size; otherwise 10 times the slowest time constant. */
long double gs_step_span(const gs_step *s);

/* Sample y and the impulse response at n evenly spaced times from 0 to
   t_end (n >= 2, t_end > 0) into t[], y[] and imp[] (each may be NULL).
   Returns GS_OK or GS_EINVAL. */
int gs_step_table(long double *t, long double *y, long double *imp,
                  size_t n, const gs_step *s, long double t_end);

/* Write n samples from 0 to t_end as CSV with the header
   "time_s,step,impulse_per_s"; %.10Lg numbers.  GS_OK, GS_EINVAL or
   GS_EIO. */
int gs_step_write_csv(FILE *out, const gs_step *s, long double t_end,
                      size_t n);

#endif
