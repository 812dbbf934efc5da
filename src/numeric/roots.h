/* roots.h - polynomial roots; poles and zeros of a rational function.
 * See LICENSE.
 *
 * Polynomials here are numeric: arrays of long double coefficients, index =
 * power of the variable (a[0] + a[1] s + ... + a[n] s^n).  The root finder
 * is the Aberth-Ehrlich simultaneous iteration with initial approximations
 * from the Newton polygon (Bini 1996), followed by Newton-Aberth polishing
 * on the original coefficients evaluated in double-word arithmetic, so a
 * single polynomial may hold roots spread over many decades: accuracy is
 * relative, per root.  docs/analysis.md describes the method and its limits.
 *
 * No function here allocates memory that the caller must free, except
 * gs_tfn_init, whose object is released by gs_tfn_clear.
 */
#ifndef GS_ROOTS_H
#define GS_ROOTS_H

#include <complex.h>

/* re + j im without the arithmetic of re + im * I, which turns an
   infinite part into NaNs (C11 7.3.9.3, CMPLXL where the library has it;
   else the array layout of C11 6.2.5p13). */
static inline long double complex gs_cmplxl(long double re, long double im)
{
#ifdef CMPLXL
    return CMPLXL(re, im);
#else
    long double complex z = re;
    ((long double *)&z)[1] = im;
    return z;
#endif
}

/* What gs_roots did.  All fields are outputs. */
typedef struct gs_roots_info {
    int nroots;         /* roots written: the degree after leading zero
                           coefficients are trimmed */
    int nzero;          /* of those, roots exactly 0 (trailing zeros) */
    int iterations;     /* Aberth sweeps until every root met the
                           stopping rule */
    int polish_steps;   /* accepted polishing corrections, all roots */
    int converged;      /* 1 if every root met the stopping rule */
    int scale_exp;      /* the iteration ran on s = 2^scale_exp z */
    long double max_residual;   /* largest of the residuals */
} gs_roots_info;

/* The roots of a[0] + a[1] s + ... + a[degree] s^degree.
 *
 * roots must have room for `degree` values; residuals (may be NULL) too.
 * info may be NULL; info->nroots tells how many roots were written, which
 * is `degree` less the number of leading zero coefficients.  Roots are
 * sorted by magnitude, then by imaginary part (upper first), then by real
 * part; complex roots come in exact conjugate pairs and real roots have an
 * imaginary part of exactly 0.  Trailing zero coefficients give roots that
 * are exactly 0.
 *
 * residuals[i] = |p(r_i)| / sum |a_k| |r_i|^k, with p evaluated in
 * double-word arithmetic: the relative backward error of r_i, about 1e-19
 * for a well-computed root.
 *
 * Returns GS_OK; GS_EINVAL if degree < 0, a coefficient is not finite or
 * all are zero; GS_ERANGE if the iteration did not converge, in which case
 * the best approximations found are still written.  Never allocates memory
 * the caller must free. */
int gs_roots(long double complex *roots, long double *residuals,
             const long double *a, int degree, gs_roots_info *info);

/* Cluster analysis of roots found by gs_roots (nroots of them, in its
 * order).  Each root gets an inclusion disk: a disk about it that holds a
 * root of every polynomial whose coefficients differ from a[] by at most
 * 8 units in the last place (Neumaier 2003; Bini & Fiorentino 2000).  Disks
 * that overlap form a cluster, and a cluster of m disks holds m roots:
 * mult[i] = m is the estimated multiplicity of the root r_i belongs to.
 * relerr[i] (may be NULL) is the disk's radius divided by |r_i|: a bound on
 * the root's relative error, which grows like eps^(1/m) in a cluster of m.
 * Roots exactly 0 get the count of zero roots and relerr 0.
 * Returns GS_OK, or GS_EINVAL on bad arguments. */
int gs_roots_mult(int *mult, long double *relerr,
                  const long double complex *roots, int nroots,
                  const long double *a, int degree);

/* p(z) = a[0] + ... + a[degree] z^degree by Horner's rule in long double
   complex; 0 when degree < 0. */
long double complex gs_roots_horner(const long double *a, int degree,
                                    long double complex z);

/* --- Poles and zeros of H(s) = N(s) / D(s) --------------------------- */

/* A numeric transfer function with its poles and zeros.  The object owns
 * every array; the fields are read-only for the caller. */
typedef struct gs_tfn {
    long double *num, *den;     /* coefficients, index = power of s, leading
                                   zeros trimmed, common powers of s
                                   cancelled */
    int num_deg, den_deg;       /* num_deg = -1 when N = 0 */
    long double complex *zeros, *poles;     /* sorted as gs_roots does */
    int nzeros, npoles;
    int *zero_mult, *pole_mult;             /* gs_roots_mult */
    long double *zero_err, *pole_err;       /* relative error bounds */
    long double *zero_res, *pole_res;       /* residuals */
    int origin;             /* H(s) ~ lf_gain * s^origin as s -> 0 */
    long double lf_gain;
} gs_tfn;

/* Set up H = N/D from num[0..num_deg] and den[0..den_deg] (copied) and find
 * its poles and zeros.  Common factors s^k of N and D are cancelled exactly;
 * other common factors are not looked for (see gs_pz_cancellations).
 * Returns GS_OK; GS_EINVAL if D is zero or a coefficient is not finite;
 * GS_ERANGE if a root search did not converge (the roots are then the best
 * found).  h must be passed to gs_tfn_clear whatever the result. */
int gs_tfn_init(gs_tfn *h, const long double *num, int num_deg,
                const long double *den, int den_deg);
void gs_tfn_clear(gs_tfn *h);

/* H(s), by Horner's rule; an infinity or NaN at a pole. */
long double complex gs_tfn_eval(const gs_tfn *h, long double complex s);

/* H(0): 0 when H has a zero at s = 0, an infinity signed like lf_gain
   when it has a pole there. */
long double gs_tfn_dc_gain(const gs_tfn *h);

/* Natural frequency, Q and damping of one pole or zero. */
enum { GS_PZ_ORIGIN, GS_PZ_REAL, GS_PZ_COMPLEX };

typedef struct gs_pz_info {
    int kind;           /* GS_PZ_ORIGIN, GS_PZ_REAL or GS_PZ_COMPLEX */
    int rhp;            /* 1 if Re > 0 (right half plane) */
    long double w0;     /* |p|, rad/s */
    long double f0;     /* |p| / 2 pi, Hz */
    long double q;      /* complex: w0 / (2 |Re p|), infinite on the axis;
                           NAN for real roots and the origin */
    long double zeta;   /* 1 / (2 Q); NAN where q is */
} gs_pz_info;

/* Describe p.  A root with zero imaginary part is GS_PZ_REAL.
   (Second-order section s^2 + (w0/Q) s + w0^2: any circuit text, e.g.
   Sedra & Smith, "Microelectronic Circuits", ch. on filters.) */
void gs_pz_describe(gs_pz_info *out, long double complex p);

/* Stability from the poles: */
enum { GS_STABLE, GS_MARGINAL, GS_UNSTABLE };
/* GS_STABLE: every pole has Re < 0.  GS_MARGINAL: none in the right half
   plane, some on the imaginary axis (within the pole's error bound), all of
   those simple.  GS_UNSTABLE otherwise. */
int gs_tfn_stability(const gs_tfn *h);

/* A pole and a zero that nearly cancel. */
typedef struct gs_pz_pair {
    int pole, zero;         /* indices into h->poles and h->zeros */
    long double rel_dist;   /* |p - z| / max(|p|, |z|) */
} gs_pz_pair;

/* Find pole-zero pairs closer than rel_tol (relative distance as above),
 * closest pairs first, each pole and zero used once.  Writes at most max
 * pairs (pairs may be NULL when max is 0) and returns how many were found
 * in all, which may exceed max. */
int gs_pz_cancellations(gs_pz_pair *pairs, int max, const gs_tfn *h,
                        long double rel_tol);

#endif
