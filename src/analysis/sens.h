/* sens.h - normalised sensitivities of the figures of a transfer function.
 * See LICENSE.
 *
 * S(Q, x) = (x / Q) dQ/dx for every figure Q of H = N/D and every symbol
 * x other than s, at the bound values.  The derivatives are exact: dN/dx
 * and dD/dx are taken symbolically and only then evaluated in long
 * double.  With S_H(s, x) = x (N_x / N - D_x / D):
 *
 *   DC gain        the low-frequency gain H ~ K s^k:  S = Re S_H of the
 *                  lowest nonzero coefficients, x (n_x / n - d_x / d);
 *   |H|, phase     at s = j w: S(|H|) = Re S_H, x dphi/dx = Im S_H;
 *   root p of D    dp/dx = -D_x(p) / D_s(p) (implicit function theorem;
 *                  for zeros the same with N), S(p) = (x / p) dp/dx;
 *   w0, Q of a     w0 = |p|: S(w0) = Re(conj(p) dp/dx) x / |p|^2;
 *   complex pair   Q = w0 / (-2 Re p): S(Q) = S(w0) - x Re(dp/dx) / Re p;
 *   bandwidth wb   F = ln|H(j wb)|^2 - ln|H(0)|^2 + ln 2 = 0 differentiated
 *                  implicitly: S(wb) = -(Re S_H(j wb) - S_dc)
 *                                       / (wb Re[j (N_s/N - D_s/D)]).
 *   unity-gain    of a loop gain T: |T(j wu)| = 1, so by the same theorem
 *   frequency wu  dwu/dx = -(d ln|T|/dx) / (d ln|T|/dw) and
 *                 S(wu) = -Re S_H(j wu) / (wu Re[j (N_s/N - D_s/D)]);
 *   phase margin  PM = 180 deg + arg T(j wu) moves with x directly and
 *                 through wu: dPM/dx = d arg/dx + (d arg/dw) dwu/dx, so
 *                 x dPM/dx = Im S_H + Im[j (N_s/N - D_s/D)] wu S(wu)
 *                 and S(PM) = x dPM/dx / PM (PM in radians).
 *
 * The caller owns a gs_sens (init / clear); it owns its arrays.
 */
#ifndef GS_SENS_H
#define GS_SENS_H

#include <complex.h>
#include <stddef.h>

#include "analysis/job.h"
#include "analysis/tf.h"
#include "circuit/device.h"

typedef enum gs_sens_kind {
    GS_SENS_DC,         /* low-frequency gain */
    GS_SENS_MAG,        /* |H| at freq */
    GS_SENS_PHASE,      /* phase at freq (radians; S normalised to it) */
    GS_SENS_POLE,       /* a real pole (rad/s) */
    GS_SENS_ZERO,       /* a real zero (rad/s) */
    GS_SENS_W0,         /* natural frequency of a complex pole pair */
    GS_SENS_Q,          /* its quality factor */
    GS_SENS_ZW0,        /* natural frequency of a complex zero pair */
    GS_SENS_ZQ,         /* its quality factor */
    GS_SENS_BW,         /* -3 dB bandwidth (rad/s) */
    GS_SENS_UGF,        /* unity-gain frequency of a loop gain (rad/s) */
    GS_SENS_PM          /* its phase margin (degrees) */
} gs_sens_kind;

/* "dc", "at", "phase", "pole", "zero", "w0", "q", "zero_w0", "zero_q",
   "bandwidth", "ugf", "pm" */
const char *gs_sens_kind_name(gs_sens_kind k);

typedef struct gs_sens_fig {
    gs_sens_kind kind;
    long double freq;           /* Hz, for MAG and PHASE; else 0 */
    long double complex value;  /* the figure; a root for POLE/ZERO/W0/Q
                                   is in root */
    long double complex root;   /* POLE, ZERO, W0, Q: the root itself */
    long double *s;             /* per symbol id (ctx->nvars): S(Q, x);
                                   NAN for s and symbols H lacks */
} gs_sens_fig;

typedef struct gs_sens {
    size_t n;
    gs_sens_fig *fig;
    int nvars;
    unsigned char *used;        /* per symbol: occurs in N or D (not s) */
} gs_sens;

void gs_sens_init(gs_sens *r);
void gs_sens_clear(gs_sens *r);

/* Every figure of tf at the values vals (per symbol id; the entry of s is
   ignored) and at the nat frequencies at[] (Hz).  Figures in the order:
   DC, then |H| and phase at each frequency, real poles, complex pole
   pairs (w0 then Q, upper root only), real zeros, complex zero pairs,
   bandwidth when it exists.  Roots at the origin, multiple roots and
   roots where the derivative vanishes are left out.  Replaces earlier
   contents.  Returns GS_OK; GS_EINVAL if D vanishes at these values;
   GS_ERANGE if a root search did not converge (figures still written). */
int gs_sens_compute(gs_sens *r, const gs_tf *tf, const long double *vals,
                    const long double *at, size_t nat);

/* The same, and with loop nonzero tf taken as a loop gain T: after the
   bandwidth, the unity-gain frequency and the phase margin at the
   crossover of gs_freq_margins (the smallest margin), when |T| crosses
   1 and the margin is not 0. */
int gs_sens_compute_loop(gs_sens *r, const gs_tf *tf,
                         const long double *vals, const long double *at,
                         size_t nat, int loop);

/* Sensitivities to the figures of bias lines, by the chain rule through
   the small-signal values the line sets:

     S(Q, F) = sum over parts p of S(Q, p) S(p, F),

   e.g. S(Q, ID) = S(Q, gm) S(gm, ID) + S(Q, rds) S(rds, ID), with
   S(p, F) from the device model (gs_device_bias_links).  A part whose
   symbol was overridden afterwards (--set) is no longer the model's and
   is left out, as is a part Q does not depend on.

   gs_sens_bias_links gathers the links of every bias line of j whose
   symbols still come from that line: *out new (free it), *n entries;
   entries of one figure are adjacent.  gs_sens_chain is S(Q, F) for the
   n links l[0..n) of one figure. */
void gs_sens_bias_links(gs_bias_link **out, size_t *n, const gs_job *j);
long double gs_sens_chain(const gs_sens *r, const gs_sens_fig *f,
                          const gs_bias_link *l, size_t n);

#endif
