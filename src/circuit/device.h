/* device.h - first-order device models: bias points to small-signal
 * values, and model parameters from measured figures. See LICENSE.
 *
 * These are hand-analysis models (docs/devices.md states every equation,
 * its validity and its conventions): the long-channel square-law MOSFET
 * with channel-length modulation, and the forward-active BJT hybrid-pi.
 * Short-channel devices and real parts deviate from them.
 *
 * All figures are long doubles in SI base units.  A PMOS (PNP) is handled
 * with magnitudes |VGS|, |VDS|, |Vth|, |ID| (|VCE|, |IC|, |VA|): the
 * callers take the magnitudes, the functions here see an NMOS (NPN).
 *
 * Functions that check figures return GS_OK, or
 *   GS_ERANGE  a figure is outside the model's physical range (gm <= 0,
 *              gds*VDS >= ID, T <= 0 K, ...): bad input;
 *   GS_EINVAL  the figures are valid but put the device where the model
 *              used does not apply (out of saturation, cut off);
 * with one error message in d at `at` (NULL: no location), naming the
 * figures and saying why.  Outputs are unchanged on error.
 */
#ifndef GS_DEVICE_H
#define GS_DEVICE_H

#include <stddef.h>

#include "circuit/circuit.h"
#include "base/diag.h"
#include "circuit/units.h"

/* Exact SI values (CODATA 2018; exact since the 2019 SI redefinition). */
#define GS_BOLTZMANN          1.380649e-23L     /* k, J/K */
#define GS_ELEMENTARY_CHARGE  1.602176634e-19L  /* q, C   */
#define GS_TEMP_DEFAULT       300.0L            /* K      */
/* Below this VCE a silicon BJT is taken to be saturated: common practice
   (VCE,sat of a small-signal part is about 0.1 V to 0.3 V). */
#define GS_VCE_SAT            0.2L

typedef enum gs_mos_region {
    GS_MOS_CUTOFF,   /* VGS <= Vth                 */
    GS_MOS_TRIODE,   /* VGS > Vth, VDS < Vov       */
    GS_MOS_SAT       /* VGS > Vth, VDS >= Vov      */
} gs_mos_region;

/* A square-law MOSFET at an operating point (magnitudes for a PMOS). */
typedef struct gs_mos_op {
    long double k;        /* K = µCox·W/L, A/V^2 (the 1/2 is in ID)     */
    long double vth;      /* valid when has_vth                         */
    long double lambda;   /* channel-length modulation, 1/V             */
    int has_vth;
    long double vgs;      /* vth + vov, valid when has_vth              */
    long double vds, vov, id;
    gs_mos_region region;
    long double gm, gds;  /* dID/dVGS, dID/dVDS of the model; gds is 0
                             in saturation when lambda = 0 */
} gs_mos_op;

/* Region at overdrive vov = VGS - Vth and vds: cut off when vov <= 0,
   triode when vds < vov, else saturation (the boundaries VGS = Vth and
   VDS = Vov belong to cut-off and saturation). */
gs_mos_region gs_mos_region_of(long double vov, long double vds);

/* ID, gm and gds of the model from op's k, lambda, vov, vds in the
   region op->region says (which the caller may set, e.g. to evaluate a
   point assumed saturated). */
void gs_mos_eval(gs_mos_op *op);

/* Forward model: given K, lambda, the overdrive and VDS, fill op (region,
   ID, gm, gds; has_vth = 0).  A cut-off point is not an error here: it
   has ID = gm = gds = 0.  GS_ERANGE for K <= 0, lambda < 0, VDS < 0. */
int gs_mos_at_vov(gs_mos_op *op, long double k, long double lambda,
                  long double vov, long double vds, const gs_srcpos *at,
                  gs_diag *d);
/* The same from ID > 0: the overdrive that carries id at vds, found in
   saturation, or in triode when the saturation overdrive exceeds vds.
   GS_EINVAL when vds = 0 (no current flows). */
int gs_mos_at_id(gs_mos_op *op, long double k, long double lambda,
                 long double id, long double vds, const gs_srcpos *at,
                 gs_diag *d);
/* K from ID at overdrive vov and vds (in the region they give).
   GS_EINVAL when vov <= 0 (cut off) or the point is in triode at vds = 0. */
int gs_mos_k_from_id(long double *k, long double id, long double vov,
                     long double lambda, long double vds,
                     const gs_srcpos *at, gs_diag *d);

/* Body effect: gmb = gm·gamma/(2·sqrt(2·phi_f + vsb)), phi_f the Fermi
   potential (the formula has 2·phi_f).  GS_ERANGE for gamma < 0 or
   2·phi_f + vsb <= 0. */
int gs_mos_gmb(long double *gmb, long double gm, long double gamma,
               long double phi_f, long double vsb, const gs_srcpos *at,
               gs_diag *d);

/* Extraction at one point in saturation: from ID and gm (Vov = 2·ID/gm),
   and gds (lambda = gds/(ID - gds·VDS)) or lambda (both NULL: lambda = 0),
   find K.  vds may be NULL when lambda comes out 0; it is then not known
   whether the point is saturated, and op->region says GS_MOS_SAT as the
   assumption made.  With vds, a point with VDS < Vov is GS_EINVAL (the
   saturation equations do not hold there).  has_vth = 0 on return. */
int gs_mos_fit_point(gs_mos_op *op, long double id, long double gm,
                     const long double *gds, const long double *lambda,
                     const long double *vds, const gs_srcpos *at,
                     gs_diag *d);
/* Extraction from two saturated points (ID1, VGS1), (ID2, VGS2) at the
   same VDS: K and Vth, lambda given (0 when vds is NULL).  op is point 1.
   GS_ERANGE when the points are equal or ID does not rise with VGS;
   GS_EINVAL when vds puts either point in triode. */
int gs_mos_fit_two(gs_mos_op *op, long double id1, long double vgs1,
                   long double id2, long double vgs2, long double lambda,
                   const long double *vds, const gs_srcpos *at,
                   gs_diag *d);

/* Thermal voltage VT = k·T/q (GS_ERANGE for T <= 0 K). */
int gs_thermal_voltage(long double *vt, long double kelvin,
                       const gs_srcpos *at, gs_diag *d);
/* gm = IC/VT, IC > 0. */
int gs_bjt_gm(long double *gm, long double ic, long double vt,
              const gs_srcpos *at, gs_diag *d);
/* rpi = beta/gm and re = alpha/gm, alpha = beta/(beta + 1); beta > 0.
   re may be NULL. */
int gs_bjt_rpi(long double *rpi, long double *re, long double beta,
               long double gm, const gs_srcpos *at, gs_diag *d);
/* ro = (VA + VCE)/IC, or VA/IC when plain is nonzero. */
int gs_bjt_ro(long double *ro, long double va, long double vce,
              long double ic, int plain, const gs_srcpos *at, gs_diag *d);
/* The inverse: VA = ro·IC - VCE, or ro·IC when plain; GS_ERANGE when VA
   would not be positive. */
int gs_bjt_va(long double *va, long double ro, long double vce,
              long double ic, int plain, const gs_srcpos *at, gs_diag *d);
/* Cpi = gm/(2·pi·fT) - Cmu; GS_ERANGE unless 0 <= Cmu < gm/(2·pi·fT). */
int gs_bjt_cpi(long double *cpi, long double gm, long double ft,
               long double cmu, const gs_srcpos *at, gs_diag *d);
/* Nonzero when vce < GS_VCE_SAT (VCE = 0.2 V is forward active). */
int gs_bjt_saturated(long double vce);

/* Interpret every bias line in turn (DESIGN.md: `bias M1 id=1m
   vds=2 k=2m vth=0.5 lambda=0.04`) and set the numeric values of its
   device's small-signal symbols: the names its device line gives (gm=,
   rds=, gmb=; rpi=, ro=, re=, cpi=, cmu= for a BJT) when they are plain
   symbols, else the default names gm_M1, rds_M1, ...  A part the device
   line drops (rds=inf) or fixes to a number is left alone (the latter
   with a warning); a symbol the table does not hold is skipped.
   vals and set are indexed by symbol id (gs_symtab_count entries, the
   caller's); a value written here overwrites what was there.  origin,
   if not NULL, is indexed the same way: each symbol set gets a new
   string "bias M1" (any old string there is freed); the caller frees
   them.  Errors (unknown keys, bad figures, a missing, conflicting or
   over-determined set of figures, a device cut off) go to d at the bias
   line or the offending value: GS_ESYNTAX, GS_EINVAL or GS_ERANGE, and
   nothing is set.  Warnings (triode, saturated BJT, figures left
   unused) go to d as well; they do not stop the values.  Every line is
   tried, so all errors are reported; returns the first error code or
   GS_OK. */
int gs_device_apply_biases(const gs_circuit *c, long double *vals,
                           unsigned char *set, char **origin, gs_diag *d);

/* One link of the chain from a bias line's figure to a small-signal
   symbol it sets: s = S(part, figure) = d ln|part| / d ln|figure|, the
   other figures of the line held, from the model's own equations
   (docs/devices.md, "Sensitivities to the bias"). */
typedef struct gs_bias_link {
    const char *device;     /* the device's name (borrowed from c) */
    const char *figure;     /* the figure's key: "id", "vds", ... */
    long double value;      /* its value as written (signed) */
    const char *part;       /* "gm", "rds", "gmb", "rpi", "re", "ro", ... */
    int sym;                /* the symbol set */
    long double s;
} gs_bias_link;

/* The links of bias line bias_index: one per numeric figure given and
   part set, in the order of the figure table, then of the parts; figures
   that move no part are left out.  *out is new (free it), *n its length.
   GS_OK; GS_EINVAL when the line has an error (as gs_device_apply_biases
   reports it) or puts a MOSFET in triode, where no links are given. */
int gs_device_bias_links(gs_bias_link **out, size_t *n, const gs_circuit *c,
                         size_t bias_index);

#endif
