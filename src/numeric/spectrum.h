/* spectrum.h - noise densities and their integrals over frequency.
 * See LICENSE.
 *
 * A noise term is a source of density S(f) = white + flicker / f seen
 * through a transfer H(s) = N(s)/D(s) with numeric coefficients: its
 * contribution at the output is |H(j 2 pi f)|^2 S(f) (a linear system
 * driven by stationary noise: A. Papoulis, "Probability, Random Variables
 * and Stochastic Processes", the chapter on linear systems, from memory).
 * Frequencies in hertz; densities one-sided, in unit^2/Hz.
 */
#ifndef GS_SPECTRUM_H
#define GS_SPECTRUM_H

#include <stddef.h>

typedef struct gs_noise_term {
    long double white;          /* A^2/Hz (or V^2/Hz) */
    long double flicker;        /* coefficient of 1/f */
    const long double *num;     /* H's coefficients, ascending in s */
    int dn;                     /* degrees; -1 for a zero polynomial */
    const long double *den;
    int dd;
} gs_noise_term;

/* |N(j 2 pi f)|^2 / |D(j 2 pi f)|^2. */
long double gs_spectrum_gain2(const long double *num, int dn,
                              const long double *den, int dd,
                              long double f);

/* The term's density at the output at f > 0. */
long double gs_spectrum_term(const gs_noise_term *t, long double f);

/* A density as a function of frequency. */
typedef long double (*gs_spectrum_fn)(const void *arg, long double f);

/* The integral of fn over [f1, f2] (0 < f1 < f2), in u = ln f, where
   densities are smooth: adaptive Gauss-Legendre quadrature with 8 nodes
   (Abramowitz and Stegun, "Handbook of Mathematical Functions", 25.4.30)
   on pieces of at most 1/8 decade, each halved until the halves agree
   with the whole to rel relative to the piece's magnitude (or 12 levels
   deep).  Returns the integral. */
long double gs_spectrum_integrate(gs_spectrum_fn fn, const void *arg,
                                  long double f1, long double f2,
                                  long double rel);

#endif
