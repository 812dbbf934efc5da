/* noise.h - the noise sources of a circuit and the transfers from them.
 * See LICENSE.
 *
 * Each noise source is a current in parallel with an element or across a
 * device's terminals, with the published density of its model
 * (docs/noise.md):
 *
 *   resistor R      thermal  4kT/R            (Johnson 1928, Nyquist 1928)
 *   conductance G   thermal  4kTG
 *   mosfet M gm     channel  4kT*nthermal_M*gm  nthermal_M 2/3 unless bound
 *                   flicker  gm^2*kf_M/(cox_M*w_M*l_M*f), when kf_M is
 *                            bound by a value line (the gate-referred
 *                            K/(Cox W L f) of Razavi, "Design of Analog
 *                            CMOS Integrated Circuits", noise chapter,
 *                            from memory, carried to the drain by gm^2)
 *   bjt Q gm        collector shot 2qIC = 2kT*gm   (IC = gm*kT/q)
 *   bjt Q rpi       base shot      2qIB = 2kT/rpi  (IB = IC/beta,
 *                                  beta = gm*rpi)
 *   bjt Q rb        thermal 4kT/rb, as a resistor
 *
 * (Gray, Hurst, Lewis and Meyer, "Analysis and Design of Analog
 * Integrated Circuits", noise chapter, from memory.)  A device's rds,
 * ro and rpi are parts of a model, not resistors, and make no thermal
 * noise of their own.  Setting up adds to the circuit one isource per
 * noise source (its injector, amplitude 1) and, for each transfer to be
 * analysed, one transfer output per source: from the injector to the
 * transfer's output quantity.  Deriving those outputs gives every H_k
 * exactly; the output density is sum |H_k(j w)|^2 S_k.
 */
#ifndef GS_NOISE_H
#define GS_NOISE_H

#include <stddef.h>

#include "base/diag.h"
#include "circuit/circuit.h"
#include "analysis/job.h"
#include "numeric/spectrum.h"

/* Boltzmann's constant and the elementary charge, exact in the SI since
   2019 (CODATA 2018: k = 1.380649e-23 J/K, e = 1.602176634e-19 C). */
#define GS_BOLTZMANN 1.380649e-23L
#define GS_CHARGE 1.602176634e-19L
#define GS_NOISE_DEFAULT_T 300.0L

typedef enum gs_noise_kind {
    GS_NZ_RESISTOR,     /* 4kT/R */
    GS_NZ_CONDUCTANCE,  /* 4kTG */
    GS_NZ_CHANNEL,      /* 4kT gamma gm */
    GS_NZ_FLICKER,      /* gm^2 kf / (cox w l f) */
    GS_NZ_COLLECTOR,    /* 2kT gm */
    GS_NZ_BASE          /* 2kT / rpi */
} gs_noise_kind;

typedef struct gs_noise_src {
    gs_noise_kind kind;
    char *name;         /* "R1", "M1.channel", "Q1.collector" (owned) */
    int elem;           /* the element whose value sets the density */
    int device;         /* its device, or -1 */
    int from, to;       /* the noise current flows from `from` to `to` */
    int injector;       /* the isource added for it */
    char *density;      /* the density as text, "4*k*T/R1" (owned) */
    char *unit;         /* "A^2/Hz" */
} gs_noise_src;

typedef struct gs_noise_target {
    size_t out;         /* the transfer analysed: index in c->outputs */
    size_t first;       /* c->outputs[first + k] is from source k to it */
} gs_noise_target;

typedef struct gs_noise {
    size_t nsrc;
    gs_noise_src *src;
    size_t ntarget;
    gs_noise_target *target;
} gs_noise;

void gs_noise_init(gs_noise *n);
void gs_noise_clear(gs_noise *n);

/* Find the noise sources of c and add their injectors and transfers, for
   every transfer output of c or only the one named `only` (NULL: all).
   The added outputs are named "TRANSFER:SOURCE".  GS_OK, or GS_EINVAL
   when there is nothing to analyse (no transfer, `only` unknown or an
   impedance, no noise source), with a message in d. */
int gs_noise_setup(gs_noise *n, gs_circuit *c, const char *only,
                   gs_diag *d);

/* The temperature in kelvin: the circuit's temperature line evaluated
   with the values (vals, set as gs_circuit_eval_values makes them), or
   300 K without one.  GS_OK, or GS_EINVAL if it is not above 0 K or
   cannot be evaluated (message in d). */
int gs_noise_temperature(long double *t, const gs_circuit *c,
                         const long double *vals, const unsigned char *set,
                         gs_diag *d);

/* The density of source s as white + flicker / f (A^2/Hz; flicker in A^2)
   at temperature t with the values bound.  GS_OK, or GS_EUNBOUND when a
   parameter it needs has no value (message in d). */
int gs_noise_density(long double *white, long double *flicker,
                     const gs_noise_src *s, const gs_circuit *c,
                     const long double *vals, const unsigned char *set,
                     long double t, gs_diag *d);

/* The numbers of a noise analysis, from a job whose outputs were derived
   (every target and every transfer gs_noise_setup added) and bound.  The
   caller owns the struct (gs_noise_num_clear). */
typedef struct gs_noise_num {
    long double t;              /* kelvin */
    size_t nsrc, ntarget;
    gs_noise_term *term;        /* term[i * nsrc + k]: source k, target i */
    gs_noise_term *in;          /* per target: its own transfer, white 1 */
    long double **coef;         /* the coefficient arrays, owned */
    size_t ncoef;
} gs_noise_num;

/* GS_OK, or GS_EUNBOUND / GS_EINVAL with a message in d. */
int gs_noise_num_make(gs_noise_num *nn, const gs_noise *n, const gs_job *j,
                      gs_diag *d);
void gs_noise_num_clear(gs_noise_num *nn);

/* "V" or "A": the unit of the output quantity of output `out` of c, or
   (input set) of its input source. */
const char *gs_noise_unit(const gs_circuit *c, size_t out, int input);

/* The indices 0..n-1 in decreasing order of part[k], equal ones in
   source order: the ranking of the contribution tables (a new array the
   caller frees). */
size_t *gs_noise_ranked(const long double *part, size_t n);

/* The output density of target i at f (unit^2/Hz), and each source's
   part of it in part[k] (part may be NULL). */
long double gs_noise_out_psd(const gs_noise_num *nn, size_t i, long double f,
                             long double *part);
/* The input-referred density: the output density over |H(j 2 pi f)|^2 of
   the target's transfer. */
long double gs_noise_in_psd(const gs_noise_num *nn, size_t i, long double f);

/* Mean squares over [f1, f2]: at the output (*out), input-referred (*in,
   the integral of the input-referred density) and from each source
   (part[k], may be NULL).  Relative accuracy about 1e-12. */
void gs_noise_band(long double *out, long double *in, long double *part,
                   const gs_noise_num *nn, size_t i, long double f1,
                   long double f2);

#endif
