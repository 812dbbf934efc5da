/* device.c - first-order device models and parameter extraction. See LICENSE.
 *
 * Square-law MOSFET and forward-active BJT hybrid-pi; the equations and
 * their sources are in docs/devices.md.  The bias-line reader at the end
 * maps a line's figures onto these models and sets the device's symbols.
 */
#include "circuit/device.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* A figure formatted for a message (units.h). */
static gs_numtext fmt(long double v, gs_quantity q)
{
    return gs_units_text(v, q);
}

#define PI_L 3.141592653589793238462643383279502884L


static void vadd(gs_diag *d, int sev, const gs_srcpos *at, const char *hint,
                 const char *f, va_list ap)
{
    char *msg = gs_vasprintf(f, ap);
    gs_diag_add(d, sev, at ? at->file : NULL, at ? at->line : 0,
                at ? at->col : 0, hint, "%s", msg);
    gs_free(msg);
}

/* Add an error and return code. */
#if defined(__GNUC__)
__attribute__((format(printf, 5, 6)))
#endif
static int fail(gs_diag *d, int code, const gs_srcpos *at, const char *hint,
                const char *f, ...)
{
    va_list ap;
    va_start(ap, f);
    vadd(d, GS_SEV_ERROR, at, hint, f, ap);
    va_end(ap);
    return code;
}

#if defined(__GNUC__)
__attribute__((format(printf, 4, 5)))
#endif
static void warn(gs_diag *d, const gs_srcpos *at, const char *hint,
                 const char *f, ...)
{
    va_list ap;
    va_start(ap, f);
    vadd(d, GS_SEV_WARNING, at, hint, f, ap);
    va_end(ap);
}

static const char pmos_hint[] =
    "a PMOS takes type=pmos (--type=pmos); its voltages and current are "
    "then read as magnitudes";

/* ---- MOSFET: square law with channel-length modulation ---- */

gs_mos_region gs_mos_region_of(long double vov, long double vds)
{
    if (vov <= 0)
        return GS_MOS_CUTOFF;
    if (vds < vov)
        return GS_MOS_TRIODE;
    return GS_MOS_SAT;
}

static int check_model(long double k, long double lambda, long double vds,
                       const gs_srcpos *at, gs_diag *d)
{
    if (!(k > 0) || isinf(k))
        return fail(d, GS_ERANGE, at, NULL, "K must be positive, got %s",
                    fmt(k, GS_Q_KPARAM).s);
    if (!(lambda >= 0) || isinf(lambda))
        return fail(d, GS_ERANGE, at, NULL,
                    "lambda must not be negative, got %s",
                    fmt(lambda, GS_Q_INV_VOLTAGE).s);
    if (!(vds >= 0) || isinf(vds))
        return fail(d, GS_ERANGE, at, pmos_hint,
                    "VDS must not be negative, got %s",
                    fmt(vds, GS_Q_VOLTAGE).s);
    return GS_OK;
}

/* ID, gm, gds of the model in op's region.  Saturation:
     ID = (K/2)·Vov²·(1 + λ·VDS), gm = K·Vov·(1 + λ·VDS),
     gds = λ·(K/2)·Vov² (the exact derivative, not λ·ID);
   triode, with the same (1 + λ·VDS) factor so that ID, gm and gds are
   continuous at VDS = Vov:
     ID = K·(Vov·VDS - VDS²/2)·(1 + λ·VDS), gm = K·VDS·(1 + λ·VDS),
     gds = K·(Vov - VDS)·(1 + λ·VDS) + λ·K·(Vov·VDS - VDS²/2). */
void gs_mos_eval(gs_mos_op *op)
{
    long double f = 1 + op->lambda * op->vds, q;

    switch (op->region) {
    case GS_MOS_SAT:
        op->id = op->k / 2 * op->vov * op->vov * f;
        op->gm = op->k * op->vov * f;
        op->gds = op->lambda * op->k / 2 * op->vov * op->vov;
        break;
    case GS_MOS_TRIODE:
        q = op->vov * op->vds - op->vds * op->vds / 2;
        op->id = op->k * q * f;
        op->gm = op->k * op->vds * f;
        op->gds = op->k * (op->vov - op->vds) * f + op->lambda * op->k * q;
        break;
    default:
        op->id = op->gm = op->gds = 0;
        break;
    }
}

int gs_mos_at_vov(gs_mos_op *op, long double k, long double lambda,
                  long double vov, long double vds, const gs_srcpos *at,
                  gs_diag *d)
{
    int rc = check_model(k, lambda, vds, at, d);

    if (rc != GS_OK)
        return rc;
    if (!isfinite(vov))
        return fail(d, GS_ERANGE, at, NULL, "Vov must be finite, got %s",
                    fmt(vov, GS_Q_VOLTAGE).s);
    memset(op, 0, sizeof *op);
    op->k = k;
    op->lambda = lambda;
    op->vov = vov;
    op->vds = vds;
    op->region = gs_mos_region_of(vov, vds);
    gs_mos_eval(op);
    return GS_OK;
}

static int check_id(long double id, const char *name, const gs_srcpos *at,
                    gs_diag *d)
{
    if (!(id > 0) || isinf(id))
        return fail(d, GS_ERANGE, at, pmos_hint,
                    "%s must be positive, got %s", name,
                    fmt(id, GS_Q_CURRENT).s);
    return GS_OK;
}

int gs_mos_at_id(gs_mos_op *op, long double k, long double lambda,
                 long double id, long double vds, const gs_srcpos *at,
                 gs_diag *d)
{
    long double f, vov;
    int rc = check_model(k, lambda, vds, at, d);

    if (rc != GS_OK || (rc = check_id(id, "ID", at, d)) != GS_OK)
        return rc;
    f = 1 + lambda * vds;
    vov = sqrtl(2 * id / (k * f));
    if (vds < vov) {
        /* too much current for saturation at this VDS: the triode root,
           which is larger than vds (the two laws meet at VDS = Vov) */
        if (vds == 0)
            return fail(d, GS_EINVAL, at, NULL,
                        "at VDS = 0 no drain current flows in this model, "
                        "so ID = %s cannot be reached",
                        fmt(id, GS_Q_CURRENT).s);
        vov = id / (k * vds * f) + vds / 2;
    }
    return gs_mos_at_vov(op, k, lambda, vov, vds, at, d);
}

int gs_mos_k_from_id(long double *k, long double id, long double vov,
                     long double lambda, long double vds,
                     const gs_srcpos *at, gs_diag *d)
{
    long double f;
    int rc = check_model(1, lambda, vds, at, d);

    if (rc != GS_OK || (rc = check_id(id, "ID", at, d)) != GS_OK)
        return rc;
    if (!(vov > 0))
        return fail(d, GS_EINVAL, at, NULL,
                    "ID = %s with VGS - Vth = %s <= 0: in this model the "
                    "device is cut off and carries no current",
                    fmt(id, GS_Q_CURRENT).s, fmt(vov, GS_Q_VOLTAGE).s);
    f = 1 + lambda * vds;
    if (vds >= vov) {
        *k = 2 * id / (vov * vov * f);
    } else if (vds > 0) {
        *k = id / ((vov * vds - vds * vds / 2) * f);
    } else {
        return fail(d, GS_EINVAL, at, NULL,
                    "at VDS = 0 no drain current flows in this model, "
                    "so ID = %s cannot be reached", fmt(id, GS_Q_CURRENT).s);
    }
    return GS_OK;
}

int gs_mos_gmb(long double *gmb, long double gm, long double gamma,
               long double phi_f, long double vsb, const gs_srcpos *at,
               gs_diag *d)
{
    long double s = 2 * phi_f + vsb;

    if (!(gamma >= 0) || isinf(gamma))
        return fail(d, GS_ERANGE, at, NULL,
                    "gamma must not be negative, got %s",
                    fmt(gamma, GS_Q_SQRT_VOLTAGE).s);
    if (!(s > 0) || isinf(s))
        return fail(d, GS_ERANGE, at, NULL,
                    "2*phi + VSB must be positive, got %s",
                    fmt(s, GS_Q_VOLTAGE).s);
    *gmb = gm * gamma / (2 * sqrtl(s));
    return GS_OK;
}

/* lambda for gs_mos_fit_point, from gds or lambda at vds. */
static int fit_lambda(long double *lam, long double id, const long double *gds,
                      const long double *lambda, const long double *vds,
                      const gs_srcpos *at, gs_diag *d)
{
    long double v = vds ? *vds : 0;

    *lam = 0;
    if (gds && lambda)
        return fail(d, GS_ERANGE, at, NULL,
                    "gds and lambda are both given, but one follows from "
                    "the other");
    if (gds && (!(*gds >= 0) || isinf(*gds)))
        return fail(d, GS_ERANGE, at, NULL,
                    "gds must not be negative, got %s",
                    fmt(*gds, GS_Q_CONDUCTANCE).s);
    if (lambda && (!(*lambda >= 0) || isinf(*lambda)))
        return fail(d, GS_ERANGE, at, NULL,
                    "lambda must not be negative, got %s",
                    fmt(*lambda, GS_Q_INV_VOLTAGE).s);
    if (((gds && *gds > 0) || (lambda && *lambda > 0)) && vds == NULL)
        return fail(d, GS_ERANGE, at, NULL,
                    "%s needs VDS: the model has the factor (1 + "
                    "lambda*VDS)", gds ? "gds" : "lambda");
    if (gds) {
        if (*gds * v >= id)
            return fail(d, GS_ERANGE, at,
                        "in this model gds is below ID/VDS; check the "
                        "figures and their units",
                        "gds*VDS = %s is not below ID = %s, so lambda = "
                        "gds/(ID - gds*VDS) would be infinite or negative",
                        fmt(*gds * v, GS_Q_CURRENT).s,
                        fmt(id, GS_Q_CURRENT).s);
        *lam = *gds / (id - *gds * v);
    } else if (lambda) {
        *lam = *lambda;
    }
    return GS_OK;
}

int gs_mos_fit_point(gs_mos_op *op, long double id, long double gm,
                     const long double *gds, const long double *lambda,
                     const long double *vds, const gs_srcpos *at,
                     gs_diag *d)
{
    long double lam, vov, v = vds ? *vds : 0;
    int rc = check_id(id, "ID", at, d);

    if (rc != GS_OK)
        return rc;
    if (!(gm > 0) || isinf(gm))
        return fail(d, GS_ERANGE, at, NULL, "gm must be positive, got %s",
                    fmt(gm, GS_Q_CONDUCTANCE).s);
    if (vds && (rc = check_model(1, 0, v, at, d)) != GS_OK)
        return rc;
    if ((rc = fit_lambda(&lam, id, gds, lambda, vds, at, d)) != GS_OK)
        return rc;
    vov = 2 * id / gm;              /* gm/ID = 2/Vov */
    if (vds && v < vov)
        return fail(d, GS_EINVAL, at,
                    "the saturation equations need VDS >= Vov",
                    "VDS = %s is below Vov = 2*ID/gm = %s: these figures "
                    "put the device in triode, where the square-law "
                    "saturation equations do not hold",
                    fmt(v, GS_Q_VOLTAGE).s, fmt(vov, GS_Q_VOLTAGE).s);
    rc = gs_mos_at_vov(op, 2 * id / (vov * vov * (1 + lam * v)), lam, vov,
                       v, at, d);
    if (rc == GS_OK && vds == NULL) {
        op->region = GS_MOS_SAT;    /* assumed: no VDS to check it */
        gs_mos_eval(op);
    }
    return rc;
}

/* The two points of gs_mos_fit_point must both be saturated at vds. */
static int check_two_sat(const gs_mos_op *op, long double vov2,
                         const gs_srcpos *at, gs_diag *d)
{
    int which = op->vov >= vov2 ? 1 : 2;
    long double vov = which == 1 ? op->vov : vov2;

    if (op->vds >= vov)
        return GS_OK;
    return fail(d, GS_EINVAL, at,
                "the two-point fit needs both points in saturation",
                "at VDS = %s point %d (Vov = %s) is in triode, where the "
                "square-law saturation equations do not hold",
                fmt(op->vds, GS_Q_VOLTAGE).s, which,
                fmt(vov, GS_Q_VOLTAGE).s);
}

int gs_mos_fit_two(gs_mos_op *op, long double id1, long double vgs1,
                   long double id2, long double vgs2, long double lambda,
                   const long double *vds, const gs_srcpos *at,
                   gs_diag *d)
{
    long double a, b, vov1, v = vds ? *vds : 0;
    int rc;

    if ((rc = check_id(id1, "ID1", at, d)) != GS_OK
        || (rc = check_id(id2, "ID2", at, d)) != GS_OK
        || (rc = check_model(1, lambda, v, at, d)) != GS_OK)
        return rc;
    if (lambda > 0 && vds == NULL)
        return fail(d, GS_ERANGE, at, NULL,
                    "lambda needs VDS: the model has the factor (1 + "
                    "lambda*VDS)");
    if (id1 == id2 || (id2 - id1) * (vgs2 - vgs1) <= 0 || !isfinite(vgs1)
        || !isfinite(vgs2))
        return fail(d, GS_ERANGE, at, NULL,
                    "ID goes from %s to %s while VGS goes from %s to %s: "
                    "in the square law ID rises with VGS, so these points "
                    "do not fit it", fmt(id1, GS_Q_CURRENT).s,
                    fmt(id2, GS_Q_CURRENT).s, fmt(vgs1, GS_Q_VOLTAGE).s,
                    fmt(vgs2, GS_Q_VOLTAGE).s);
    /* sqrt(ID) = sqrt(K(1+λVDS)/2)·(VGS - Vth) is linear in VGS */
    a = sqrtl(id1);
    b = sqrtl(id2);
    vov1 = a * (vgs2 - vgs1) / (b - a);
    rc = gs_mos_at_vov(op, 2 * id1 / (vov1 * vov1 * (1 + lambda * v)),
                       lambda, vov1, v, at, d);
    if (rc != GS_OK)
        return rc;
    op->has_vth = 1;
    op->vth = vgs1 - vov1;
    op->vgs = vgs1;
    op->region = GS_MOS_SAT;        /* checked below, or assumed */
    gs_mos_eval(op);
    if (vds)
        return check_two_sat(op, vgs2 - op->vth, at, d);
    return GS_OK;
}

/* ---- BJT: forward-active hybrid-pi ---- */

int gs_thermal_voltage(long double *vt, long double kelvin,
                       const gs_srcpos *at, gs_diag *d)
{
    if (!(kelvin > 0) || isinf(kelvin))
        return fail(d, GS_ERANGE, at, NULL,
                    "the temperature must be above 0 K, got %s",
                    fmt(kelvin, GS_Q_TEMPERATURE).s);
    *vt = GS_BOLTZMANN * kelvin / GS_ELEMENTARY_CHARGE;
    return GS_OK;
}

int gs_bjt_gm(long double *gm, long double ic, long double vt,
              const gs_srcpos *at, gs_diag *d)
{
    if (!(ic > 0) || isinf(ic))
        return fail(d, GS_ERANGE, at,
                    "a PNP takes type=pnp (--type=pnp); its figures are "
                    "then read as magnitudes",
                    "IC must be positive, got %s", fmt(ic, GS_Q_CURRENT).s);
    *gm = ic / vt;
    return GS_OK;
}

int gs_bjt_rpi(long double *rpi, long double *re, long double beta,
               long double gm, const gs_srcpos *at, gs_diag *d)
{
    if (!(beta > 0) || isinf(beta))
        return fail(d, GS_ERANGE, at, NULL,
                    "beta must be positive, got %s",
                    fmt(beta, GS_Q_NUMBER).s);
    if (!(gm > 0) || isinf(gm))
        return fail(d, GS_ERANGE, at, NULL, "gm must be positive, got %s",
                    fmt(gm, GS_Q_CONDUCTANCE).s);
    *rpi = beta / gm;
    if (re)
        *re = beta / (beta + 1) / gm;
    return GS_OK;
}

static int check_early(long double vce, long double ic, int plain,
                       const gs_srcpos *at, gs_diag *d)
{
    if (!(ic > 0) || isinf(ic))
        return fail(d, GS_ERANGE, at, NULL, "IC must be positive, got %s",
                    fmt(ic, GS_Q_CURRENT).s);
    if (!plain && (!(vce >= 0) || isinf(vce)))
        return fail(d, GS_ERANGE, at,
                    "a PNP takes type=pnp (--type=pnp); its figures are "
                    "then read as magnitudes",
                    "VCE must not be negative, got %s",
                    fmt(vce, GS_Q_VOLTAGE).s);
    return GS_OK;
}

int gs_bjt_ro(long double *ro, long double va, long double vce,
              long double ic, int plain, const gs_srcpos *at, gs_diag *d)
{
    int rc = check_early(vce, ic, plain, at, d);

    if (rc != GS_OK)
        return rc;
    if (!(va > 0) || isinf(va))
        return fail(d, GS_ERANGE, at, NULL, "VA must be positive, got %s",
                    fmt(va, GS_Q_VOLTAGE).s);
    *ro = (plain ? va : va + vce) / ic;
    return GS_OK;
}

int gs_bjt_va(long double *va, long double ro, long double vce,
              long double ic, int plain, const gs_srcpos *at, gs_diag *d)
{
    int rc = check_early(vce, ic, plain, at, d);

    if (rc != GS_OK)
        return rc;
    if (!(ro > 0) || isinf(ro))
        return fail(d, GS_ERANGE, at, NULL, "ro must be positive, got %s",
                    fmt(ro, GS_Q_RESISTANCE).s);
    if (!plain && !(ro * ic > vce))
        return fail(d, GS_ERANGE, at,
                    "check the figures, or use the form ro = VA/IC",
                    "ro*IC = %s is not above VCE = %s, so VA = ro*IC - VCE "
                    "would not be positive", fmt(ro * ic, GS_Q_VOLTAGE).s,
                    fmt(vce, GS_Q_VOLTAGE).s);
    *va = plain ? ro * ic : ro * ic - vce;
    return GS_OK;
}

int gs_bjt_cpi(long double *cpi, long double gm, long double ft,
               long double cmu, const gs_srcpos *at, gs_diag *d)
{
    long double ctot;

    if (!(ft > 0) || isinf(ft))
        return fail(d, GS_ERANGE, at, NULL, "fT must be positive, got %s",
                    fmt(ft, GS_Q_FREQUENCY).s);
    if (!(cmu >= 0) || isinf(cmu))
        return fail(d, GS_ERANGE, at, NULL,
                    "Cmu must not be negative, got %s",
                    fmt(cmu, GS_Q_CAPACITANCE).s);
    ctot = gm / (2 * PI_L * ft);    /* Cpi + Cmu = gm/(2·pi·fT) */
    if (!(cmu < ctot))
        return fail(d, GS_ERANGE, at, NULL,
                    "Cmu = %s is not below gm/(2*pi*fT) = %s, so Cpi would "
                    "not be positive", fmt(cmu, GS_Q_CAPACITANCE).s,
                    fmt(ctot, GS_Q_CAPACITANCE).s);
    *cpi = ctot - cmu;
    return GS_OK;
}

int gs_bjt_saturated(long double vce)
{
    return vce < GS_VCE_SAT;
}

/* ---- bias lines ---- */

#define WORD (-1)           /* a figure whose value is a keyword */
#define MAX_FIGURES 12

typedef struct figure_spec {
    const char *key;
    int q;                  /* gs_quantity, or WORD */
    const char *words[2];   /* WORD: the two keywords, read as 0 and 1 */
} figure_spec;

typedef struct figure {
    int given;
    long double v;
    const char *text;
    gs_srcpos at;
} figure;

enum { M_TYPE, M_ID, M_VGS, M_VOV, M_VDS, M_K, M_VTH, M_LAMBDA, M_GAMMA,
       M_PHI, M_VSB, M_COUNT };

static const figure_spec mos_keys[M_COUNT] = {
    {"type", WORD, {"nmos", "pmos"}},
    {"id", GS_Q_CURRENT, {NULL, NULL}},
    {"vgs", GS_Q_VOLTAGE, {NULL, NULL}},
    {"vov", GS_Q_VOLTAGE, {NULL, NULL}},
    {"vds", GS_Q_VOLTAGE, {NULL, NULL}},
    {"k", GS_Q_KPARAM, {NULL, NULL}},
    {"vth", GS_Q_VOLTAGE, {NULL, NULL}},
    {"lambda", GS_Q_INV_VOLTAGE, {NULL, NULL}},
    {"gamma", GS_Q_SQRT_VOLTAGE, {NULL, NULL}},
    {"phi", GS_Q_VOLTAGE, {NULL, NULL}},
    {"vsb", GS_Q_VOLTAGE, {NULL, NULL}},
};

enum { B_TYPE, B_IC, B_VCE, B_BETA, B_VA, B_TEMP, B_FT, B_CMU, B_EARLY,
       B_COUNT };

static const figure_spec bjt_keys[B_COUNT] = {
    {"type", WORD, {"npn", "pnp"}},
    {"ic", GS_Q_CURRENT, {NULL, NULL}},
    {"vce", GS_Q_VOLTAGE, {NULL, NULL}},
    {"beta", GS_Q_NUMBER, {NULL, NULL}},
    {"va", GS_Q_VOLTAGE, {NULL, NULL}},
    {"temp", GS_Q_TEMPERATURE, {NULL, NULL}},
    {"ft", GS_Q_FREQUENCY, {NULL, NULL}},
    {"cmu", GS_Q_CAPACITANCE, {NULL, NULL}},
    {"early", WORD, {"full", "plain"}},
};

static void unknown_key(const figure_spec *spec, size_t n, const char *key,
                        const char *kind, const gs_srcpos *at, gs_diag *d)
{
    const char *cand[MAX_FIGURES + 1];
    const char *near;
    char list[160] = "", *hint;
    size_t i;

    for (i = 0; i < n; i++) {
        cand[i] = spec[i].key;
        strncat(list, i ? ", " : "", sizeof list - strlen(list) - 1);
        strncat(list, spec[i].key, sizeof list - strlen(list) - 1);
    }
    cand[n] = NULL;
    near = gs_closest_word(key, cand);
    hint = near ? gs_asprintf("did you mean '%s'?", near)
                : gs_asprintf("a %s bias takes %s", kind, list);
    fail(d, GS_ESYNTAX, at, hint, "unknown %s bias figure '%s'", kind, key);
    gs_free(hint);
}

static int read_word(figure *f, const figure_spec *s, gs_diag *d)
{
    if (strcmp(f->text, s->words[0]) == 0)
        f->v = 0;
    else if (strcmp(f->text, s->words[1]) == 0)
        f->v = 1;
    else
        return fail(d, GS_ESYNTAX, &f->at, NULL, "%s expects %s or %s, got %s",
                    s->key, s->words[0], s->words[1], f->text);
    return GS_OK;
}

/* Read every pair of bias line b into f (indexed like spec), reporting
   every bad pair. */
static int read_figures(figure *f, const figure_spec *spec, size_t n,
                        const char *kind, const gs_circuit *c,
                        const gs_bias *b, gs_diag *d)
{
    gs_srcpos line = {c->file, b->line, b->col};
    int i, rc = GS_OK, r;
    size_t j;

    memset(f, 0, n * sizeof *f);
    for (i = 0; i < b->nparams; i++) {
        for (j = 0; j < n && strcmp(spec[j].key, b->keys[i]) != 0; j++)
            ;
        if (j == n) {
            unknown_key(spec, n, b->keys[i], kind, &line, d);
            rc = GS_ESYNTAX;
            continue;
        }
        if (f[j].given) {
            rc = fail(d, GS_ESYNTAX, &line, NULL, "%s is given twice",
                      spec[j].key);
            continue;
        }
        f[j].given = 1;
        f[j].text = b->vals[i];
        f[j].at = line;
        if (b->val_col)
            f[j].at.col = b->val_col[i];
        r = spec[j].q == WORD
                ? read_word(&f[j], &spec[j], d)
                : gs_units_parse(&f[j].v, f[j].text, (gs_quantity)spec[j].q,
                                 spec[j].key, &f[j].at, d);
        if (r != GS_OK)
            rc = r;
    }
    return rc;
}

/* A device's small-signal symbol: the name its line gives for `key` when
   that is a plain symbol, else the default key_NAME. */
enum { SYM_NONE = -1, SYM_DROPPED = -2, SYM_FIXED = -3 };

static const char *device_param(const gs_device *dv, const char *key)
{
    int i;
    for (i = 0; i < dv->nparams; i++)
        if (strcmp(dv->keys[i], key) == 0)
            return dv->vals[i];
    return NULL;
}

static int is_plain_symbol(const char *s)
{
    if (!((*s >= 'A' && *s <= 'Z') || (*s >= 'a' && *s <= 'z') || *s == '_'))
        return 0;
    for (s++; *s; s++)
        if (!((*s >= 'A' && *s <= 'Z') || (*s >= 'a' && *s <= 'z')
              || (*s >= '0' && *s <= '9') || *s == '_'))
            return 0;
    return 1;
}

static int device_sym(const gs_circuit *c, const gs_device *dv,
                      const char *key)
{
    const char *v = device_param(dv, key);
    char *name;
    int id;

    if (v && strcmp(v, "inf") == 0)
        return SYM_DROPPED;
    if (v && !is_plain_symbol(v))
        return SYM_FIXED;
    name = v ? gs_strdup(v) : gs_asprintf("%s_%s", key, dv->name);
    id = gs_symtab_find(c->syms, name);
    gs_free(name);
    return id >= 0 ? id : SYM_NONE;
}

/* The values a bias line sets, gathered first so that an error sets
   none of them. */
typedef struct assignment {
    const char *key;
    long double v;
} assignment;

typedef struct assignments {
    assignment a[8];
    int n;
} assignments;

static void put(assignments *as, const char *key, long double v)
{
    as->a[as->n].key = key;
    as->a[as->n].v = v;
    as->n++;
}

static void commit(const assignments *as, const gs_circuit *c,
                   const gs_device *dv, long double *vals,
                   unsigned char *set, char **origin, const gs_srcpos *at,
                   gs_diag *d)
{
    int i, s;

    for (i = 0; i < as->n; i++) {
        s = device_sym(c, dv, as->a[i].key);
        if (s == SYM_FIXED)
            warn(d, at, NULL, "%s's %s is fixed to %s on its device line; "
                 "the bias line leaves it alone", dv->name, as->a[i].key,
                 device_param(dv, as->a[i].key));
        if (s < 0)
            continue;
        vals[s] = as->a[i].v;
        set[s] = 1;
        if (origin) {
            gs_free(origin[s]);
            origin[s] = gs_asprintf("bias %s", dv->name);
        }
    }
}

/* The missing figures of a bias line, said as "a, b and c". */
typedef struct wordlist {
    const char *w[8];
    int n;
} wordlist;

static void words_add(wordlist *l, const char *word)
{
    l->w[l->n++] = word;
}

static void words_join(char *buf, size_t size, const wordlist *l)
{
    int i;

    *buf = '\0';
    for (i = 0; i < l->n; i++) {
        if (i > 0)
            strncat(buf, i == l->n - 1 ? " and " : ", ",
                    size - strlen(buf) - 1);
        strncat(buf, l->w[i], size - strlen(buf) - 1);
    }
}

/* The figures of a mosfet bias must fix the point exactly once: vds,
   lambda (when there is an rds to set), and two of id, k and the
   overdrive (vov, or vgs with vth). */
static int mos_check(const figure *f, int need_lambda, const char *name,
                     const gs_srcpos *at, gs_diag *d)
{
    int id = f[M_ID].given, k = f[M_K].given, ov = f[M_VOV].given
        || (f[M_VGS].given && f[M_VTH].given);
    const char *ovm = f[M_VGS].given ? "vth" : f[M_VTH].given ? "vgs"
                      : "vov (or vgs with vth)";
    char miss[256], tmp[64];
    wordlist l = {{NULL}, 0};
    int i;

    if (f[M_VOV].given && f[M_VGS].given && f[M_VTH].given)
        return fail(d, GS_EINVAL, at, "drop one of them",
                    "bias %s is over-determined: vov, vgs and vth are all "
                    "given, but vov = vgs - vth", name);
    if (id && k && ov)
        return fail(d, GS_EINVAL, at, "drop one of them",
                    "bias %s is over-determined: id, k and %s are all "
                    "given, but any two of them fix the third", name,
                    f[M_VOV].given ? "vov" : "vgs with vth");
    if (!f[M_VDS].given)
        words_add(&l, "vds");
    if (need_lambda && !f[M_LAMBDA].given)
        words_add(&l, "lambda");
    if (id + k + ov == 0) {
        words_add(&l, "two of id, k and vov (or vgs with vth)");
    } else if (id + k + ov == 1) {
        snprintf(tmp, sizeof tmp, "one of %s and %s",
                 ov ? "id" : id ? "k" : "id", ov ? "k" : ovm);
        words_add(&l, tmp);
    }
    if (f[M_GAMMA].given || f[M_PHI].given || f[M_VSB].given)
        for (i = M_GAMMA; i <= M_VSB; i++)
            if (!f[i].given)
                words_add(&l, mos_keys[i].key);
    if (l.n == 0)
        return GS_OK;
    words_join(miss, sizeof miss, &l);
    return fail(d, GS_EINVAL, at,
                need_lambda ? "a mosfet bias takes vds, lambda and two of "
                "id, k and vov (or vgs with vth); rds=inf on the mosfet "
                "line makes lambda optional" : "a mosfet bias takes vds "
                "and two of id, k and vov (or vgs with vth)",
                "bias %s is under-determined: missing %s", name, miss);
}

static long double mag(const figure *f, int pmos)
{
    return pmos ? fabsl(f->v) : f->v;
}

/* The operating point the (checked) figures give. */
static int mos_solve(gs_mos_op *op, const figure *f, const gs_srcpos *at,
                     gs_diag *d)
{
    int pmos = f[M_TYPE].given && f[M_TYPE].v == 1, rc;
    long double lam = f[M_LAMBDA].given ? f[M_LAMBDA].v : 0, k;
    long double vds = mag(&f[M_VDS], pmos), vth = mag(&f[M_VTH], pmos);
    long double vgs = mag(&f[M_VGS], pmos), id = mag(&f[M_ID], pmos);
    long double vov = f[M_VOV].given ? f[M_VOV].v : vgs - vth;

    if (f[M_ID].given && f[M_K].given) {
        rc = gs_mos_at_id(op, f[M_K].v, lam, id, vds, at, d);
    } else if (f[M_K].given) {
        rc = gs_mos_at_vov(op, f[M_K].v, lam, vov, vds, at, d);
    } else {
        rc = gs_mos_k_from_id(&k, id, vov, lam, vds, at, d);
        if (rc == GS_OK)
            rc = gs_mos_at_vov(op, k, lam, vov, vds, at, d);
    }
    if (rc != GS_OK)
        return rc;
    if (f[M_VTH].given || f[M_VGS].given) {
        op->has_vth = 1;
        op->vth = f[M_VTH].given ? vth : vgs - op->vov;
        op->vgs = op->vth + op->vov;
    }
    return GS_OK;
}

static int mos_region_check(const gs_mos_op *op, const char *name,
                            const gs_srcpos *at, gs_diag *d)
{
    if (op->region == GS_MOS_CUTOFF)
        return fail(d, GS_EINVAL, at, NULL,
                    "%s is cut off (VGS - Vth = %s <= 0): it has no "
                    "small-signal gain", name, fmt(op->vov, GS_Q_VOLTAGE).s);
    if (op->region == GS_MOS_TRIODE)
        warn(d, at, NULL, "%s is in triode, not in saturation (VDS = %s < "
             "Vov = %s): the triode small-signal values are used", name,
             fmt(op->vds, GS_Q_VOLTAGE).s, fmt(op->vov, GS_Q_VOLTAGE).s);
    return GS_OK;
}

static int mos_bias(const gs_circuit *c, const gs_bias *b, const figure *f,
                    assignments *as, gs_diag *d)
{
    const gs_device *dv = &c->devices[b->device];
    gs_srcpos at = {c->file, b->line, b->col};
    int rds = device_sym(c, dv, "rds"), pmos = f[M_TYPE].v == 1, rc;
    long double gmb;
    gs_mos_op op;

    if ((rc = mos_check(f, rds >= 0, dv->name, &at, d)) != GS_OK
        || (rc = mos_solve(&op, f, &at, d)) != GS_OK
        || (rc = mos_region_check(&op, dv->name, &at, d)) != GS_OK)
        return rc;
    if (rds >= 0 && !(op.gds > 0))
        return fail(d, GS_EINVAL, &at,
                    "write rds=inf on the mosfet line to drop rds",
                    "lambda = 0 makes rds of %s infinite", dv->name);
    put(as, "gm", op.gm);
    if (op.gds > 0)
        put(as, "rds", 1 / op.gds);
    if (f[M_GAMMA].given) {
        rc = gs_mos_gmb(&gmb, op.gm, f[M_GAMMA].v, f[M_PHI].v,
                        mag(&f[M_VSB], pmos), &at, d);
        if (rc != GS_OK)
            return rc;
        if (device_sym(c, dv, "gmb") < 0 && device_sym(c, dv, "gmb")
            != SYM_FIXED)
            warn(d, &at, NULL, "gamma, phi and vsb are not used: %s has "
                 "no gmb", dv->name);
        put(as, "gmb", gmb);
    }
    return GS_OK;
}

/* BJT bias: ic; vce (unless early=plain); beta for rpi; va for ro; ft
   with cmu for cpi; temp defaults to 300 K. */
static int bjt_check(const figure *f, int need_beta, int need_va,
                     const char *name, const gs_srcpos *at, gs_diag *d)
{
    char miss[128];
    wordlist l = {{NULL}, 0};

    if (!f[B_IC].given)
        words_add(&l, "ic");
    if (!f[B_VCE].given && !(f[B_EARLY].given && f[B_EARLY].v == 1))
        words_add(&l, "vce");
    if (need_beta && !f[B_BETA].given)
        words_add(&l, "beta");
    if (need_va && !f[B_VA].given)
        words_add(&l, "va");
    if (f[B_FT].given && !f[B_CMU].given)
        words_add(&l, "cmu (cmu=0 neglects it)");
    if (l.n == 0)
        return GS_OK;
    words_join(miss, sizeof miss, &l);
    return fail(d, GS_EINVAL, at,
                "a bjt bias takes ic and vce, beta for rpi, va for ro, ft "
                "and cmu for cpi, and temp (300 K unless given); "
                "early=plain takes ro = VA/IC, which needs no vce",
                "bias %s is under-determined: missing %s", name, miss);
}

/* Saturation and the figures a missing part leaves unused. */
static void bjt_warnings(const gs_circuit *c, const gs_device *dv,
                         const figure *f, long double vce,
                         const gs_srcpos *at, gs_diag *d)
{
    if (f[B_VCE].given && gs_bjt_saturated(vce))
        warn(d, at, NULL, "%s is saturated (VCE = %s is below %s): the "
             "forward-active small-signal values do not hold there",
             dv->name, fmt(vce, GS_Q_VOLTAGE).s,
             fmt(GS_VCE_SAT, GS_Q_VOLTAGE).s);
    if (f[B_VA].given && device_sym(c, dv, "ro") < 0
        && device_sym(c, dv, "ro") != SYM_FIXED)
        warn(d, at, NULL, "va is not used: %s has no ro", dv->name);
    if (f[B_FT].given && device_sym(c, dv, "cpi") < 0
        && device_sym(c, dv, "cpi") != SYM_FIXED)
        warn(d, at, NULL, "ft is not used: %s has no cpi", dv->name);
}

static int bjt_bias(const gs_circuit *c, const gs_bias *b, const figure *f,
                    assignments *as, gs_diag *d)
{
    const gs_device *dv = &c->devices[b->device];
    gs_srcpos at = {c->file, b->line, b->col};
    int pnp = f[B_TYPE].v == 1, plain = f[B_EARLY].v == 1, rc;
    int ro_sym = device_sym(c, dv, "ro");
    int need_va = ro_sym >= 0;
    long double ic = mag(&f[B_IC], pnp), vce = mag(&f[B_VCE], pnp);
    long double vt, gm, rpi, re, ro, cpi;

    rc = bjt_check(f, device_sym(c, dv, "rpi") >= 0
                   || device_sym(c, dv, "re") >= 0, need_va, dv->name,
                   &at, d);
    if (rc != GS_OK
        || (rc = gs_thermal_voltage(&vt, f[B_TEMP].given ? f[B_TEMP].v
                                    : GS_TEMP_DEFAULT, &at, d)) != GS_OK
        || (rc = gs_bjt_gm(&gm, ic, vt, &at, d)) != GS_OK
        || (f[B_VCE].given
            && (rc = check_early(vce, ic, 0, &at, d)) != GS_OK))
        return rc;
    put(as, "gm", gm);
    if (f[B_BETA].given) {
        if ((rc = gs_bjt_rpi(&rpi, &re, f[B_BETA].v, gm, &at, d)) != GS_OK)
            return rc;
        put(as, "rpi", rpi);
        put(as, "re", re);
    }
    if (f[B_VA].given && (need_va || ro_sym == SYM_FIXED)) {
        rc = gs_bjt_ro(&ro, mag(&f[B_VA], pnp), vce, ic, plain, &at, d);
        if (rc != GS_OK)
            return rc;
        put(as, "ro", ro);
    }
    if (f[B_FT].given) {
        rc = gs_bjt_cpi(&cpi, gm, f[B_FT].v, f[B_CMU].v, &at, d);
        if (rc != GS_OK)
            return rc;
        put(as, "cpi", cpi);
    }
    if (f[B_CMU].given)
        put(as, "cmu", f[B_CMU].v);
    bjt_warnings(c, dv, f, vce, &at, d);
    return GS_OK;
}

static int gs_device_apply_bias(const gs_circuit *c, size_t bias_index,
                                long double *vals, unsigned char *set,
                                char **origin, gs_diag *d)
{
    const gs_bias *b;
    const gs_device *dv;
    figure f[MAX_FIGURES];
    assignments as;
    gs_srcpos at;
    int rc;

    if (bias_index >= c->nbiases)
        return fail(d, GS_EINVAL, NULL, NULL, "no bias line %zu",
                    bias_index + 1);
    b = &c->biases[bias_index];
    at.file = c->file;
    at.line = b->line;
    at.col = b->col;
    if (b->device < 0 || (size_t)b->device >= c->ndevices)
        return fail(d, GS_EINVAL, &at, NULL, "bias line names no device");
    dv = &c->devices[b->device];
    as.n = 0;
    if (dv->is_bjt)
        rc = read_figures(f, bjt_keys, B_COUNT, "bjt", c, b, d);
    else
        rc = read_figures(f, mos_keys, M_COUNT, "mosfet", c, b, d);
    if (rc == GS_OK)
        rc = dv->is_bjt ? bjt_bias(c, b, f, &as, d)
                        : mos_bias(c, b, f, &as, d);
    if (rc == GS_OK)
        commit(&as, c, dv, vals, set, origin, &at, d);
    return rc;
}

int gs_device_apply_biases(const gs_circuit *c, long double *vals,
                           unsigned char *set, char **origin, gs_diag *d)
{
    size_t i;
    int rc = GS_OK, r;

    for (i = 0; i < c->nbiases; i++) {
        r = gs_device_apply_bias(c, i, vals, set, origin, d);
        if (r != GS_OK && rc == GS_OK)
            rc = r;
    }
    return rc;
}

/* ---- sensitivities of the small-signal values to the bias figures ----
 *
 * Each link is d ln(part) / d ln(figure) of the model's closed forms
 * (docs/devices.md), with the other figures of the line held.  In
 * saturation, with e = lambda VDS / (1 + lambda VDS):
 *   id and k given:        gm = sqrt(2 K ID (1 + lambda VDS)) (the square
 *                          law, Sedra and Smith, "Microelectronic
 *                          Circuits", MOSFET chapter): S(gm, ID) =
 *                          S(gm, K) = 1/2, S(gm, VDS) = S(gm, lambda) = e/2;
 *   id and overdrive:      gm = 2 ID / Vov: S(gm, ID) = 1, S(gm, Vov) = -1;
 *   k and overdrive:       gm = K Vov (1 + lambda VDS): S(gm, K) =
 *                          S(gm, Vov) = 1, S(gm, VDS) = S(gm, lambda) = e;
 *   rds = (1 + lambda VDS) / (lambda ID) when ID is given: S(rds, ID) = -1,
 *                          S(rds, VDS) = e, S(rds, lambda) = e - 1;
 *                          rds = 2 / (lambda K Vov^2) otherwise;
 *   an overdrive as vgs with vth: S(Vov, VGS) = VGS / Vov, S(Vov, Vth) =
 *                          -Vth / Vov, multiplied in;
 *   gmb = gm gamma / (2 sqrt(2 phi + VSB)): as gm, and S(gmb, gamma) = 1,
 *                          S(gmb, phi) = -phi / (2 phi + VSB),
 *                          S(gmb, VSB) = -VSB / (2 (2 phi + VSB)).
 * BJT: gm = IC/VT, VT = kT/q; rpi = beta/gm; re = alpha/gm; ro = (VA +
 * VCE)/IC (or VA/IC); cpi = gm/(2 pi fT) - cmu.
 */

typedef struct linkset {
    gs_bias_link *l;
    size_t n, cap;
    const gs_circuit *c;
    const gs_device *dv;
    const figure *f;
    const figure_spec *spec;
} linkset;

static void link_add(linkset *ls, int fig, const char *part, long double s)
{
    int sym = device_sym(ls->c, ls->dv, part);
    if (sym < 0 || !ls->f[fig].given || s == 0)
        return;
    if (ls->n == ls->cap) {
        ls->cap = ls->cap ? 2 * ls->cap : 8;
        ls->l = gs_reallocarray(ls->l, ls->cap, sizeof *ls->l);
    }
    ls->l[ls->n].device = ls->dv->name;
    ls->l[ls->n].figure = ls->spec[fig].key;
    ls->l[ls->n].value = ls->f[fig].v;
    ls->l[ls->n].part = part;
    ls->l[ls->n].sym = sym;
    ls->l[ls->n].s = s;
    ls->n++;
}

/* The overdrive's figures, times a (the link of the part to Vov). */
static void link_vov(linkset *ls, const char *part, long double a,
                     const gs_mos_op *op)
{
    const figure *f = ls->f;
    if (f[M_VOV].given) {
        link_add(ls, M_VOV, part, a);
        return;
    }
    link_add(ls, M_VGS, part, a * op->vgs / op->vov);
    link_add(ls, M_VTH, part, -a * op->vth / op->vov);
}

static void mos_links(linkset *ls, const gs_mos_op *op)
{
    const figure *f = ls->f;
    long double e = op->lambda * op->vds / (1 + op->lambda * op->vds);
    int by_id = f[M_ID].given, by_k = f[M_K].given;
    const char *gmparts[2] = {"gm", "gmb"};
    int i;
    for (i = 0; i < 2; i++) {
        const char *p = gmparts[i];
        if (i == 1 && !f[M_GAMMA].given)
            break;
        if (by_id && by_k) {
            link_add(ls, M_ID, p, 0.5L);
            link_add(ls, M_K, p, 0.5L);
            link_add(ls, M_VDS, p, e / 2);
            link_add(ls, M_LAMBDA, p, e / 2);
        } else if (by_id) {
            link_add(ls, M_ID, p, 1);
            link_vov(ls, p, -1, op);
        } else {
            link_add(ls, M_K, p, 1);
            link_vov(ls, p, 1, op);
            link_add(ls, M_VDS, p, e);
            link_add(ls, M_LAMBDA, p, e);
        }
    }
    if (op->gds > 0) {
        if (by_id) {
            link_add(ls, M_ID, "rds", -1);
            link_add(ls, M_VDS, "rds", e);
            link_add(ls, M_LAMBDA, "rds", e - 1);
        } else {
            link_add(ls, M_K, "rds", -1);
            link_vov(ls, "rds", -2, op);
            link_add(ls, M_LAMBDA, "rds", -1);
        }
    }
    if (f[M_GAMMA].given) {
        long double phi = f[M_PHI].v, vsb = fabsl(f[M_VSB].v);
        link_add(ls, M_GAMMA, "gmb", 1);
        link_add(ls, M_PHI, "gmb", -phi / (2 * phi + vsb));
        link_add(ls, M_VSB, "gmb", -vsb / (2 * (2 * phi + vsb)));
    }
}

static void bjt_links(linkset *ls, long double gm, long double vce,
                      long double va)
{
    const figure *f = ls->f;
    long double beta = f[B_BETA].v, g;
    int plain = f[B_EARLY].v == 1;
    link_add(ls, B_IC, "gm", 1);
    link_add(ls, B_TEMP, "gm", -1);
    if (f[B_BETA].given) {
        link_add(ls, B_IC, "rpi", -1);
        link_add(ls, B_TEMP, "rpi", 1);
        link_add(ls, B_BETA, "rpi", 1);
        link_add(ls, B_IC, "re", -1);
        link_add(ls, B_TEMP, "re", 1);
        link_add(ls, B_BETA, "re", 1 / (beta + 1));
    }
    if (f[B_VA].given) {
        link_add(ls, B_IC, "ro", -1);
        link_add(ls, B_VA, "ro", plain ? 1 : va / (va + vce));
        if (!plain)
            link_add(ls, B_VCE, "ro", vce / (va + vce));
    }
    if (f[B_FT].given) {
        g = gm / (2 * PI_L * f[B_FT].v);
        link_add(ls, B_IC, "cpi", g / (g - f[B_CMU].v));
        link_add(ls, B_TEMP, "cpi", -g / (g - f[B_CMU].v));
        link_add(ls, B_FT, "cpi", -g / (g - f[B_CMU].v));
        link_add(ls, B_CMU, "cpi", -f[B_CMU].v / (g - f[B_CMU].v));
    }
    link_add(ls, B_CMU, "cmu", 1);
}

int gs_device_bias_links(gs_bias_link **out, size_t *n, const gs_circuit *c,
                         size_t bias_index)
{
    figure f[MAX_FIGURES];
    gs_diag d;
    linkset ls;
    int rc = GS_EINVAL;

    *out = NULL;
    *n = 0;
    if (bias_index >= c->nbiases)
        return GS_EINVAL;
    gs_diag_init(&d);
    memset(&ls, 0, sizeof ls);
    ls.c = c;
    ls.dv = &c->devices[c->biases[bias_index].device];
    ls.f = f;
    if (ls.dv->is_bjt) {
        const gs_bias *b = &c->biases[bias_index];
        int pnp;
        long double vt, gm;
        ls.spec = bjt_keys;
        if (read_figures(f, bjt_keys, B_COUNT, "bjt", c, b, &d) == GS_OK
            && bjt_check(f, 0, 0, ls.dv->name, NULL, &d) == GS_OK
            && gs_thermal_voltage(&vt, f[B_TEMP].given ? f[B_TEMP].v
                                  : GS_TEMP_DEFAULT, NULL, &d) == GS_OK) {
            pnp = f[B_TYPE].v == 1;
            gm = mag(&f[B_IC], pnp) / vt;
            bjt_links(&ls, gm, mag(&f[B_VCE], pnp), mag(&f[B_VA], pnp));
            rc = GS_OK;
        }
    } else {
        const gs_bias *b = &c->biases[bias_index];
        gs_mos_op op;
        ls.spec = mos_keys;
        if (read_figures(f, mos_keys, M_COUNT, "mosfet", c, b, &d) == GS_OK
            && mos_check(f, 0, ls.dv->name, NULL, &d) == GS_OK
            && mos_solve(&op, f, NULL, &d) == GS_OK
            && op.region == GS_MOS_SAT) {
            mos_links(&ls, &op);
            rc = GS_OK;
        }
    }
    gs_diag_clear(&d);
    if (rc != GS_OK) {
        gs_free(ls.l);
        return rc;
    }
    *out = ls.l;
    *n = ls.n;
    return GS_OK;
}
