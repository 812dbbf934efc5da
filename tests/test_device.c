/* test_device.c - unit tests of the device models, bias lines and the
 * extract command. See LICENSE.
 *
 * Sources of the check values, named again beside each check:
 *  [RZ] B. Razavi, Design of Analog CMOS Integrated Circuits, ch. 2
 *       (square law with the 1/2 outside K = µCox·W/L, gm = µCox(W/L)Vov
 *       = 2ID/Vov = sqrt(2µCox(W/L)ID), rds = 1/(λID), body effect
 *       gmb = gm·γ/(2·sqrt(2φF + VSB))), from memory; formulas only.
 *  [SS] A. Sedra, K. Smith, Microelectronic Circuits, chapters on the
 *       MOSFET and the BJT small-signal models (gm = IC/VT, rπ = β/gm,
 *       re = α/gm, ro = VA/IC; the textbook's round numbers IC = 1 mA,
 *       VT = 25 mV, β = 100 give gm = 40 mA/V, rπ = 2.5 kΩ, re ≈ 25 Ω),
 *       from memory.
 *  [GM] P. Gray, P. Hurst, S. Lewis, R. Meyer, Analysis and Design of
 *       Analog Integrated Circuits, ch. 1 (fT = gm/(2π(Cπ + Cμ)); the
 *       output resistance ro = (VA + VCE)/IC of the Early effect), from
 *       memory; formulas only.
 *  [CODATA] CODATA 2018 / SI 2019: k = 1.380649e-23 J/K and
 *       q = 1.602176634e-19 C exactly, so kT/q at 300 K is
 *       0.025851999786435532300991... V (the exact quotient, worked out
 *       with Python's fractions module) = 25.852 mV to five digits.
 * Round trips use the model's own algebra: forward values, then the
 * extraction, must give back the chosen parameters.
 */
#include "check.h"
#include "testlib.h"
#include "circuit/circuit.h"
#include "cli/cmd.h"
#include "circuit/device.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int close_rel(long double a, long double b, long double tol)
{
    return fabsl(a - b) <= tol * fabsl(b);
}

/* The precision of long double arithmetic as carried out at run time
   (an emulator may do it in double precision), and whether it has an
   infinity; checks that depend on either say so when skipped. */
static long double run_eps(void)
{
    volatile long double e = 1;
    while (1 + e / 2 != 1)
        e /= 2;
    return e;
}

static int has_inf(void)
{
    volatile long double z = 0;
    if (isinf(1 / z))
        return 1;
    printf("device: long double has no infinity at run time; the checks "
           "of infinite values are skipped\n");
    return 0;
}

/* The number after "key": in JSON text, or NAN. */
static long double json_num(const char *text, const char *key)
{
    char pat[64];
    const char *p;
    snprintf(pat, sizeof pat, "\"%s\": ", key);
    p = strstr(text, pat);
    return p ? strtold(p + strlen(pat), NULL) : NAN;
}

/* ---- MOSFET model ---- */

static void test_region_boundaries(void)
{
    /* the boundaries belong to cut-off (VGS = Vth) and to saturation
       (VDS = Vov): [RZ] */
    CHECK(gs_mos_region_of(0, 1) == GS_MOS_CUTOFF);
    CHECK(gs_mos_region_of(-0.1L, 1) == GS_MOS_CUTOFF);
    CHECK(gs_mos_region_of(1e-12L, 1) == GS_MOS_SAT);
    CHECK(gs_mos_region_of(0.5L, 0.5L) == GS_MOS_SAT);
    CHECK(gs_mos_region_of(0.5L, 0.5L * (1 - 1e-12L)) == GS_MOS_TRIODE);
    CHECK(gs_mos_region_of(0.5L, 0) == GS_MOS_TRIODE);
}

static void test_square_law(void)
{
    gs_mos_op op;
    gs_diag d;
    long double k = 2e-3L, vov = 0.5L, lam = 0.04L, vds = 2, f = 1.08L;

    gs_diag_init(&d);
    CHECK(gs_mos_at_vov(&op, k, lam, vov, vds, NULL, &d) == GS_OK);
    CHECK(op.region == GS_MOS_SAT);
    /* [RZ] ID = (K/2)Vov²(1 + λVDS) = 1m·0.25·1.08 */
    CHECK(close_rel(op.id, 0.27e-3L, 1e-15L));
    /* [RZ] gm = K·Vov·(1 + λVDS) = 2·ID/Vov = sqrt(2·K·ID·(1 + λVDS)) */
    CHECK(close_rel(op.gm, k * vov * f, 1e-15L));
    CHECK(close_rel(op.gm, 2 * op.id / vov, 1e-15L));
    CHECK(close_rel(op.gm, sqrtl(2 * k * op.id * f), 1e-15L));
    /* gds = λ(K/2)Vov², the exact derivative; [RZ] rds ≈ 1/(λID) is
       the same to first order: here λID/gds = 1 + λVDS exactly */
    CHECK(close_rel(op.gds, lam * k / 2 * vov * vov, 1e-15L));
    CHECK(close_rel(lam * op.id / op.gds, f, 1e-15L));
    /* the intrinsic gain gm·rds = 2(1 + λVDS)/(λVov) [RZ] */
    CHECK(close_rel(op.gm / op.gds, 2 * f / (lam * vov), 1e-15L));
    CHECK(d.n == 0);
    gs_diag_clear(&d);
}

static void test_triode_and_cutoff(void)
{
    gs_mos_op op, sat;
    gs_diag d;
    long double k = 1e-3L, lam = 0.05L, vov = 0.8L, vds = 0.3L;
    long double f = 1 + lam * vds, q = vov * vds - vds * vds / 2;

    gs_diag_init(&d);
    CHECK(gs_mos_at_vov(&op, k, lam, vov, vds, NULL, &d) == GS_OK);
    CHECK(op.region == GS_MOS_TRIODE);
    /* [RZ] triode ID = K(Vov·VDS - VDS²/2), with the (1 + λVDS) factor
       kept so the two laws meet at VDS = Vov; gm and gds are the exact
       derivatives of that expression */
    CHECK(close_rel(op.id, k * q * f, 1e-15L));
    CHECK(close_rel(op.gm, k * vds * f, 1e-15L));
    CHECK(close_rel(op.gds, k * (vov - vds) * f + lam * k * q, 1e-15L));
    /* continuity at VDS = Vov: triode just below equals saturation */
    gs_mos_at_vov(&sat, k, lam, vov, vov, NULL, &d);
    gs_mos_at_vov(&op, k, lam, vov, vov * (1 - 1e-12L), NULL, &d);
    CHECK(op.region == GS_MOS_TRIODE && sat.region == GS_MOS_SAT);
    CHECK(close_rel(op.id, sat.id, 1e-11L));
    CHECK(close_rel(op.gm, sat.gm, 1e-11L));
    CHECK(close_rel(op.gds, sat.gds, 1e-9L));
    /* cut-off at VGS = Vth: no current, no gain */
    CHECK(gs_mos_at_vov(&op, k, lam, 0, 1, NULL, &d) == GS_OK);
    CHECK(op.region == GS_MOS_CUTOFF && op.id == 0 && op.gm == 0
          && op.gds == 0);
    CHECK(d.n == 0);
    gs_diag_clear(&d);
}

static void test_at_id_and_k(void)
{
    gs_mos_op op;
    gs_diag d;
    long double k;

    gs_diag_init(&d);
    /* DESIGN.md's bias example id=1m vds=2 k=2m lambda=0.04: closed form
       Vov = sqrt(2ID/(K(1+λVDS))), gm = sqrt(2K·ID(1+λVDS)) [RZ],
       rds = (1 + λVDS)/(λID) = 27 kOhm exactly */
    CHECK(gs_mos_at_id(&op, 2e-3L, 0.04L, 1e-3L, 2, NULL, &d) == GS_OK);
    CHECK(op.region == GS_MOS_SAT);
    CHECK(close_rel(op.vov, sqrtl(1 / 1.08L), 1e-15L));
    CHECK(close_rel(op.gm, sqrtl(4.32e-6L), 1e-15L));
    CHECK(close_rel(1 / op.gds, 27000, 1e-15L));
    CHECK(close_rel(op.id, 1e-3L, 1e-15L));
    /* too much current for saturation at a small VDS: the triode root */
    CHECK(gs_mos_at_id(&op, 2e-3L, 0, 1e-3L, 0.2L, NULL, &d) == GS_OK);
    CHECK(op.region == GS_MOS_TRIODE);
    CHECK(close_rel(op.vov, 1e-3L / (2e-3L * 0.2L) + 0.1L, 1e-15L));
    CHECK(close_rel(op.id, 1e-3L, 1e-15L));
    /* K back from ID and Vov, both regions */
    CHECK(gs_mos_k_from_id(&k, 1e-3L, 0.5L, 0.04L, 2, NULL, &d) == GS_OK);
    CHECK(close_rel(k, 2e-3L / (0.25L * 1.08L), 1e-15L));
    CHECK(gs_mos_k_from_id(&k, 1e-3L, 0.5L, 0, 0.25L, NULL, &d) == GS_OK);
    CHECK(close_rel(k, 1e-3L / (0.5L * 0.25L - 0.25L * 0.25L / 2),
                    1e-15L));
    CHECK(d.n == 0);
    gs_diag_clear(&d);
}

static void test_gmb(void)
{
    gs_diag d;
    long double gmb = 0;

    gs_diag_init(&d);
    /* [RZ] gmb = gm·γ/(2·sqrt(2φF + VSB)): γ = 0.5, φF = 0.3, VSB = 0.4
       gives sqrt(1) = 1 and gmb = gm/4 */
    CHECK(gs_mos_gmb(&gmb, 4e-3L, 0.5L, 0.3L, 0.4L, NULL, &d) == GS_OK);
    CHECK(close_rel(gmb, 1e-3L, 1e-15L));
    CHECK(gs_mos_gmb(&gmb, 4e-3L, -0.5L, 0.3L, 0, NULL, &d) == GS_ERANGE);
    CHECK(gs_mos_gmb(&gmb, 4e-3L, 0.5L, 0.3L, -0.6L, NULL, &d)
          == GS_ERANGE);
    CHECK(d.n == 2 && strcmp(d.v[1].message, "2*phi + VSB must be "
                             "positive, got 0 V") == 0);
    gs_diag_clear(&d);
}

/* Chosen K, Vth, λ and bias -> gm, gds -> extraction -> the same K, λ and
   VGS to 1e-12 relative (the model's own algebra). */
static void test_round_trip_point(void)
{
    unsigned seed = 777u;
    int i;

    gs_rng r;

    gs_rng_seed(&r, seed);
    for (i = 0; i < 500; i++) {
        long double k = 1e-5L * powl(1000, test_unit(&r));
        long double vth = 0.2L + 0.8L * test_unit(&r);
        long double lam = 0.001L + 0.2L * test_unit(&r);
        long double vov = 0.05L + test_unit(&r);
        long double vds = vov + 5.0L * test_unit(&r);
        gs_mos_op fw, back;
        gs_diag d;
        int rc;

        gs_diag_init(&d);
        gs_mos_at_vov(&fw, k, lam, vov, vds, NULL, &d);
        rc = gs_mos_fit_point(&back, fw.id, fw.gm, &fw.gds, NULL, &vds,
                              NULL, &d);
        CHECK_MSG(rc == GS_OK && close_rel(back.k, k, 1e-12L)
                  && close_rel(back.lambda, lam, 1e-12L)
                  && close_rel(vth + back.vov, vth + vov, 1e-12L)
                  && close_rel(back.gm, fw.gm, 1e-12L)
                  && close_rel(back.gds, fw.gds, 1e-12L),
                  "seed %u case %d: K %Lg Vth %Lg lambda %Lg Vov %Lg VDS "
                  "%Lg -> K %Lg lambda %Lg Vov %Lg", seed, i, k, vth, lam,
                  vov, vds, back.k, back.lambda, back.vov);
        /* the same with lambda given instead of gds */
        rc = gs_mos_fit_point(&back, fw.id, fw.gm, NULL, &lam, &vds, NULL,
                              &d);
        CHECK_MSG(rc == GS_OK && close_rel(back.k, k, 1e-12L)
                  && close_rel(back.gds, fw.gds, 1e-12L),
                  "seed %u case %d (lambda given)", seed, i);
        /* and the bias solver: ID back to the overdrive */
        rc = gs_mos_at_id(&back, k, lam, fw.id, vds, NULL, &d);
        CHECK_MSG(rc == GS_OK && close_rel(back.vov, vov, 1e-12L),
                  "seed %u case %d (from ID)", seed, i);
        CHECK(d.n == 0);
        gs_diag_clear(&d);
    }
}

static void test_round_trip_two(void)
{
    unsigned seed = 4242u;
    int i;

    gs_rng r;

    gs_rng_seed(&r, seed);
    for (i = 0; i < 500; i++) {
        long double k = 1e-5L * powl(1000, test_unit(&r));
        long double vth = -0.5L + 1.5L * test_unit(&r);
        long double lam = (i % 2) ? 0.1L * test_unit(&r) : 0;
        long double v1 = 0.05L + test_unit(&r);
        long double v2 = v1 + 0.01L + test_unit(&r);
        long double vds = v2 + 1;
        gs_mos_op a, b, fit;
        gs_diag d;
        int rc;

        gs_diag_init(&d);
        gs_mos_at_vov(&a, k, lam, v1, vds, NULL, &d);
        gs_mos_at_vov(&b, k, lam, v2, vds, NULL, &d);
        /* points given in either order */
        rc = gs_mos_fit_two(&fit, (i % 3) ? a.id : b.id,
                            vth + ((i % 3) ? v1 : v2), (i % 3) ? b.id : a.id,
                            vth + ((i % 3) ? v2 : v1), lam, &vds, NULL, &d);
        CHECK_MSG(rc == GS_OK && close_rel(fit.k, k, 1e-12L)
                  && fabsl(fit.vth - vth) <= 1e-12L * (1 + fabsl(vth)),
                  "seed %u case %d: K %Lg Vth %Lg -> K %Lg Vth %Lg", seed,
                  i, k, vth, fit.k, fit.vth);
        CHECK(d.n == 0);
        gs_diag_clear(&d);
    }
}

/* ---- BJT model ---- */

static void test_bjt(void)
{
    gs_diag d;
    long double vt, gm, rpi, re, ro, va, cpi;

    gs_diag_init(&d);
    /* [CODATA] kT/q at 300 K */
    CHECK(gs_thermal_voltage(&vt, 300, NULL, &d) == GS_OK);
    CHECK(fabsl(vt - 0.0258519997864355323L) < 8 * run_eps() * vt);
    CHECK(fabsl(vt - 0.025852L) < 5e-7L);
    CHECK(GS_BOLTZMANN == 1.380649e-23L);
    CHECK(GS_ELEMENTARY_CHARGE == 1.602176634e-19L);
    /* [SS] IC = 1 mA, VT = 25 mV, beta = 100: gm = 40 mA/V,
       rpi = 2.5 kOhm, re = alpha/gm = 24.75 Ohm (about 25 Ohm) */
    CHECK(gs_bjt_gm(&gm, 1e-3L, 0.025L, NULL, &d) == GS_OK);
    CHECK(close_rel(gm, 0.04L, 1e-15L));
    CHECK(gs_bjt_rpi(&rpi, &re, 100, gm, NULL, &d) == GS_OK);
    CHECK(close_rel(rpi, 2500, 1e-15L));
    CHECK(close_rel(re, 2500.0L / 101, 1e-15L));
    /* [SS] ro = VA/IC: VA = 100 V, IC = 1 mA -> 100 kOhm;
       [GM] ro = (VA + VCE)/IC with VCE = 5 V -> 105 kOhm */
    CHECK(gs_bjt_ro(&ro, 100, 5, 1e-3L, 1, NULL, &d) == GS_OK);
    CHECK(close_rel(ro, 1e5L, 1e-15L));
    CHECK(gs_bjt_ro(&ro, 100, 5, 1e-3L, 0, NULL, &d) == GS_OK);
    CHECK(close_rel(ro, 1.05e5L, 1e-15L));
    CHECK(gs_bjt_va(&va, ro, 5, 1e-3L, 0, NULL, &d) == GS_OK);
    CHECK(close_rel(va, 100, 1e-15L));
    CHECK(gs_bjt_va(&va, 1e5L, 5, 1e-3L, 1, NULL, &d) == GS_OK);
    CHECK(close_rel(va, 100, 1e-15L));
    /* [GM] Cpi + Cmu = gm/(2 pi fT): gm = 40 mS, fT = 400 MHz gives
       15.9155 pF; with Cmu = 1 pF, Cpi = 14.9155 pF */
    CHECK(gs_bjt_cpi(&cpi, 0.04L, 400e6L, 1e-12L, NULL, &d) == GS_OK);
    CHECK(close_rel(cpi, 0.04L / (2 * 3.14159265358979323846L * 400e6L)
                         - 1e-12L, 1e-15L));
    CHECK(fabsl(cpi - 14.9155e-12L) < 1e-16L);
    /* saturation below 0.2 V (common practice); 0.2 V itself is active */
    CHECK(gs_bjt_saturated(0.1L) && !gs_bjt_saturated(0.2L));
    CHECK(d.n == 0);
    /* a temperature at or below 0 K */
    CHECK(gs_thermal_voltage(&vt, 0, NULL, &d) == GS_ERANGE);
    CHECK(gs_thermal_voltage(&vt, -5, NULL, &d) == GS_ERANGE);
    CHECK(d.n == 2 && strcmp(d.v[0].message, "the temperature must be "
                             "above 0 K, got 0 K") == 0);
    gs_diag_clear(&d);
}

/* ---- bias lines, on a circuit built by hand ---- */

typedef struct fixture {
    gs_circuit c;
    gs_device dev;
    gs_bias bias;
    char *dkeys[8], *dvals[8], *bkeys[16], *bvals[16];
    int bcols[16];
    char dbuf[256], bbuf[256];
    long double vals[32];
    unsigned char set[32];
    char *origin[32];
    gs_diag d;
} fixture;

/* Split "k=v k=v" in place into keys and values; col0 is the column of
   text[0] (so a value's column is col0 + its offset). */
static int split_pairs(char *text, char **keys, char **vals, int *cols,
                       int col0)
{
    int n = 0;
    char *p = text;

    while (*p) {
        char *eq, *end;
        while (*p == ' ')
            p++;
        if (!*p)
            break;
        eq = strchr(p, '=');
        end = strchr(p, ' ');
        if (end)
            *end = '\0';
        *eq = '\0';
        keys[n] = p;
        vals[n] = eq + 1;
        if (cols)
            cols[n] = col0 + (int)(eq + 1 - text);
        n++;
        p = end ? end + 1 : eq + 1 + strlen(eq + 1);
    }
    return n;
}

/* Device M1 (or Q1) with line params `dparams`, the bias line
   "bias NAME <btext>" on line 7, symbols `syms` interned. */
static void fixture_init(fixture *f, int is_bjt, const char *dparams,
                         const char *btext, const char *const *syms)
{
    int i;

    memset(f, 0, sizeof *f);
    f->c.file = "amp.gsc";
    f->c.syms = gs_symtab_new();
    gs_symtab_intern(f->c.syms, "s");
    for (i = 0; syms[i]; i++)
        gs_symtab_intern(f->c.syms, syms[i]);
    snprintf(f->dbuf, sizeof f->dbuf, "%s", dparams);
    snprintf(f->bbuf, sizeof f->bbuf, "%s", btext);
    f->dev.name = is_bjt ? "Q1" : "M1";
    f->dev.is_bjt = is_bjt;
    f->dev.line = 3;
    f->dev.col = 1;
    f->dev.nparams = split_pairs(f->dbuf, f->dkeys, f->dvals, NULL, 0);
    f->dev.keys = f->dkeys;
    f->dev.vals = f->dvals;
    f->bias.device = 0;
    f->bias.line = 7;
    f->bias.col = 1;
    f->bias.nparams = split_pairs(f->bbuf, f->bkeys, f->bvals, f->bcols, 9);
    f->bias.keys = f->bkeys;
    f->bias.vals = f->bvals;
    f->bias.val_col = f->bcols;
    f->c.ndevices = 1;
    f->c.devices = &f->dev;
    f->c.nbiases = 1;
    f->c.biases = &f->bias;
    gs_diag_init(&f->d);
}

static void fixture_clear(fixture *f)
{
    int i;
    for (i = 0; i < 32; i++)
        free(f->origin[i]);
    gs_diag_clear(&f->d);
    gs_symtab_free(f->c.syms);
}

static int apply(fixture *f)
{
    return gs_device_apply_biases(&f->c, f->vals, f->set, f->origin, &f->d);
}

static long double val(const fixture *f, const char *name)
{
    int s = gs_symtab_find(f->c.syms, name);
    return s >= 0 && f->set[s] ? f->vals[s] : NAN;
}

static int has_message(const fixture *f, int sev, const char *msg, int col)
{
    size_t i;
    for (i = 0; i < f->d.n; i++)
        if (f->d.v[i].severity == sev && strcmp(f->d.v[i].message, msg) == 0
            && f->d.v[i].line == 7 && f->d.v[i].col == col
            && strcmp(f->d.v[i].file, "amp.gsc") == 0)
            return 1;
    return 0;
}

static const char *const mos_syms[] = {"gm_M1", "rds_M1", "gmb_M1", NULL};

static void test_bias_mos(void)
{
    fixture f;
    int s;

    /* DESIGN.md's example: the closed forms of test_at_id_and_k [RZ] */
    fixture_init(&f, 0, "", "id=1m vds=2 k=2m vth=0.5 lambda=0.04",
                 mos_syms);
    CHECK(apply(&f) == GS_OK && f.d.n == 0);
    CHECK(close_rel(val(&f, "gm_M1"), sqrtl(4.32e-6L), 1e-15L));
    CHECK(close_rel(val(&f, "rds_M1"), 27000, 1e-15L));
    CHECK(isnan(val(&f, "gmb_M1")));      /* no gamma: left alone */
    s = gs_symtab_find(f.c.syms, "gm_M1");
    CHECK(f.origin[s] && strcmp(f.origin[s], "bias M1") == 0);
    fixture_clear(&f);

    /* named symbols on the device line, VGS with Vth and K [RZ]:
       Vov = 0.5, gm = K·Vov·(1+λVDS) = 2m·0.5·1.08 */
    fixture_init(&f, 0, "gm=gm1 rds=ro1 gmb=gb1",
                 "vgs=1 vth=0.5 vds=2 k=2m lambda=0.04 gamma=0.5 phi=0.3 "
                 "vsb=0.4", (const char *const[]){"gm1", "ro1", "gb1",
                 "gm_M1", NULL});
    CHECK(apply(&f) == GS_OK && f.d.n == 0);
    CHECK(close_rel(val(&f, "gm1"), 1.08e-3L, 1e-15L));
    CHECK(close_rel(val(&f, "ro1"), 1 / (0.04L * 1e-3L * 0.25L), 1e-15L));
    CHECK(close_rel(val(&f, "gb1"), 1.08e-3L / 4, 1e-15L));
    CHECK(isnan(val(&f, "gm_M1")));
    fixture_clear(&f);

    /* ID with VGS and Vth: K follows; rds=inf makes lambda optional */
    fixture_init(&f, 0, "rds=inf", "id=1m vgs=1.5 vth=0.5 vds=3",
                 mos_syms);
    CHECK(apply(&f) == GS_OK && f.d.n == 0);
    CHECK(close_rel(val(&f, "gm_M1"), 2e-3L, 1e-15L));  /* 2ID/Vov */
    CHECK(isnan(val(&f, "rds_M1")));
    fixture_clear(&f);

    /* a PMOS with signed figures: magnitudes give the NMOS numbers */
    fixture_init(&f, 0, "", "type=pmos id=-1m vgs=-1.5 vth=-0.5 vds=-3 "
                 "lambda=0", (const char *const[]){"gm_M1", NULL});
    CHECK(apply(&f) == GS_OK && f.d.n == 0);
    CHECK(close_rel(val(&f, "gm_M1"), 2e-3L, 1e-15L));
    fixture_clear(&f);
}

static void test_bias_mos_regions(void)
{
    fixture f;

    /* triode: a warning, and the triode values [RZ] */
    fixture_init(&f, 0, "", "vgs=1.5 vth=0.5 vds=0.2 k=2m lambda=0",
                 mos_syms);
    CHECK(apply(&f) == GS_OK);
    CHECK(has_message(&f, GS_SEV_WARNING, "M1 is in triode, not in "
                      "saturation (VDS = 200 mV < Vov = 1 V): the triode "
                      "small-signal values are used", 1));
    CHECK(close_rel(val(&f, "gm_M1"), 2e-3L * 0.2L, 1e-15L));
    CHECK(close_rel(val(&f, "rds_M1"), 1 / (2e-3L * 0.8L), 1e-15L));
    fixture_clear(&f);

    /* the boundary VDS = Vov is saturation: no warning */
    fixture_init(&f, 0, "", "vgs=1.5 vth=0.5 vds=1 k=2m lambda=0.01",
                 mos_syms);
    CHECK(apply(&f) == GS_OK && f.d.n == 0);
    fixture_clear(&f);

    /* VGS = Vth: cut off, an error, nothing set */
    fixture_init(&f, 0, "", "vgs=0.5 vth=0.5 vds=1 k=2m lambda=0.01",
                 mos_syms);
    CHECK(apply(&f) == GS_EINVAL);
    CHECK(has_message(&f, GS_SEV_ERROR, "M1 is cut off (VGS - Vth = 0 V <= "
                      "0): it has no small-signal gain", 1));
    CHECK(isnan(val(&f, "gm_M1")) && isnan(val(&f, "rds_M1")));
    fixture_clear(&f);
}

/* One bias line that must fail with `msg` at column col. */
static void bias_error(int is_bjt, const char *dparams, const char *btext,
                       int rc, const char *msg, int col, const char *hint)
{
    static const char *const syms[] = {"gm_M1", "rds_M1", "gmb_M1",
                                       "gm_Q1", "rpi_Q1", "ro_Q1",
                                       "cpi_Q1", NULL};
    fixture f;
    size_t i;
    int got;

    fixture_init(&f, is_bjt, dparams, btext, syms);
    got = apply(&f);
    CHECK_MSG(got == rc, "'%s': rc %d, want %d", btext, got, rc);
    CHECK_MSG(has_message(&f, GS_SEV_ERROR, msg, col), "'%s': want '%s' "
              "at 7:%d, got '%s' at 7:%d", btext, msg, col,
              f.d.n ? f.d.v[0].message : "", f.d.n ? f.d.v[0].col : 0);
    if (hint)
        CHECK_MSG(f.d.n && f.d.v[0].hint
                  && strcmp(f.d.v[0].hint, hint) == 0, "'%s': hint '%s'",
                  btext, f.d.n && f.d.v[0].hint ? f.d.v[0].hint : "");
    for (i = 0; i < 32; i++)
        CHECK(!f.set[i]);       /* an error sets nothing */
    fixture_clear(&f);
}

static void test_bias_errors(void)
{
    bias_error(0, "", "id=1m vgs=1 vth=0.5 k=2m vds=2 lambda=0", GS_EINVAL,
               "bias M1 is over-determined: id, k and vgs with vth are all "
               "given, but any two of them fix the third", 1,
               "drop one of them");
    bias_error(0, "", "vov=0.5 vgs=1 vth=0.5 k=2m vds=2 lambda=0",
               GS_EINVAL, "bias M1 is over-determined: vov, vgs and vth are "
               "all given, but vov = vgs - vth", 1, NULL);
    bias_error(0, "", "id=1m", GS_EINVAL, "bias M1 is under-determined: "
               "missing vds, lambda and one of k and vov (or vgs with vth)", 1,
               "a mosfet bias takes vds, lambda and two of id, k and vov "
               "(or vgs with vth); rds=inf on the mosfet line makes lambda "
               "optional");
    bias_error(0, "", "vgs=1 k=2m vds=1 lambda=0", GS_EINVAL,
               "bias M1 is under-determined: missing one of id and vth", 1,
               NULL);
    bias_error(0, "", "vov=1 vds=1 lambda=0", GS_EINVAL,
               "bias M1 is under-determined: missing one of id and k", 1, NULL);
    bias_error(0, "rds=inf", "vds=1", GS_EINVAL,
               "bias M1 is under-determined: missing two of id, k and vov "
               "(or vgs with vth)", 1, "a mosfet bias takes vds and two of "
               "id, k and vov (or vgs with vth)");
    bias_error(0, "", "id=1m k=2m vds=2 lambda=0.01 gamma=0.4", GS_EINVAL,
               "bias M1 is under-determined: missing phi and vsb", 1, NULL);
    bias_error(0, "", "id=1m k=2m vds=2 lambda=0", GS_EINVAL,
               "lambda = 0 makes rds of M1 infinite", 1,
               "write rds=inf on the mosfet line to drop rds");
    bias_error(0, "", "idd=1m k=2m vds=2 lambda=0", GS_ESYNTAX,
               "unknown mosfet bias figure 'idd'", 1, "did you mean 'id'?");
    bias_error(0, "", "zz=1", GS_ESYNTAX, "unknown mosfet bias figure 'zz'",
               1, "a mosfet bias takes type, id, vgs, vov, vds, k, vth, "
               "lambda, gamma, phi, vsb");
    bias_error(0, "", "id=1m id=2m", GS_ESYNTAX, "id is given twice", 1,
               NULL);
    /* a unit error at the value's column: "bias M1 id=1m vds=2mS" */
    bias_error(0, "", "id=1m vds=2mS k=2m lambda=0", GS_EINVAL,
               "vds expects volts, got 2mS", 19, NULL);
    bias_error(0, "", "type=cmos id=1m", GS_ESYNTAX,
               "type expects nmos or pmos, got cmos", 14, NULL);
    bias_error(0, "", "id=-1m k=2m vds=2 lambda=0.01", GS_ERANGE,
               "ID must be positive, got -1 mA", 1, NULL);
    bias_error(0, "", "id=1m k=-2m vds=2 lambda=0.01", GS_ERANGE,
               "K must be positive, got -2 mA/V^2", 1, NULL);
    bias_error(0, "", "id=1m k=2m vds=-2 lambda=0.01", GS_ERANGE,
               "VDS must not be negative, got -2 V", 1,
               "a PMOS takes type=pmos (--type=pmos); its voltages and "
               "current are then read as magnitudes");
    bias_error(0, "", "id=1m vgs=0.4 vth=0.5 vds=2 lambda=0.01", GS_EINVAL,
               "ID = 1 mA with VGS - Vth = -100 mV <= 0: in this model the "
               "device is cut off and carries no current", 1, NULL);
    bias_error(0, "", "id=1m k=2m vds=0 lambda=0.01", GS_EINVAL,
               "at VDS = 0 no drain current flows in this model, so ID = "
               "1 mA cannot be reached", 1, NULL);
    bias_error(0, "", "id=1m k=2m vds=2 lambda=0.01 gamma=0.4 phi=-1 vsb=0",
               GS_ERANGE, "2*phi + VSB must be positive, got -2 V", 1, NULL);
    bias_error(1, "", "ic=1m", GS_EINVAL, "bias Q1 is under-determined: "
               "missing vce, beta and va", 1, "a bjt bias takes ic and vce, "
               "beta for rpi, va for ro, ft and cmu for cpi, and temp "
               "(300 K unless given); early=plain takes ro = VA/IC, which "
               "needs no vce");
    bias_error(1, "", "ic=1m vce=2 beta=100 va=50 ft=300M", GS_EINVAL,
               "bias Q1 is under-determined: missing cmu (cmu=0 neglects "
               "it)", 1, NULL);
    bias_error(1, "", "ic=1m vce=2 beta=100 va=50 temp=0K", GS_ERANGE,
               "the temperature must be above 0 K, got 0 K", 1, NULL);
    bias_error(1, "", "ic=1m vce=-2 beta=100 va=50", GS_ERANGE,
               "VCE must not be negative, got -2 V", 1, NULL);
    bias_error(1, "", "ic=1m vce=2 beta=100 va=50 temp=-1", GS_ERANGE,
               "the temperature must be above 0 K, got -1 K", 1, NULL);
    bias_error(1, "", "ic=1m vce=2 beta=-1 va=50", GS_ERANGE,
               "beta must be positive, got -1", 1, NULL);
    bias_error(1, "", "ic=1m vce=2 beta=100 va=50 ft=300M cmu=1n",
               GS_ERANGE, "Cmu = 1 nF is not below gm/(2*pi*fT) = 20.5213 "
               "pF, so Cpi would not be positive", 1, NULL);
    bias_error(1, "", "ic=1m vce=2 beta=100 va=50 early=half", GS_ESYNTAX,
               "early expects full or plain, got half", 42, NULL);
    bias_error(1, "", "ic=1m id=1m", GS_ESYNTAX,
               "unknown bjt bias figure 'id'", 1, "did you mean 'ic'?");
}

static void test_bias_bjt(void)
{
    static const char *const syms[] = {"gm_Q1", "rpi_Q1", "ro_Q1",
                                       "cpi_Q1", "cmu_Q1", NULL};
    fixture f;
    long double vt = 0.0258519997864355323L;

    /* [SS]/[GM] hybrid-pi: gm = IC/VT, rpi = beta/gm,
       ro = (VA + VCE)/IC, Cpi = gm/(2 pi fT) - Cmu */
    fixture_init(&f, 1, "", "ic=1m vce=5 beta=100 va=100 ft=400M cmu=1p",
                 syms);
    CHECK(apply(&f) == GS_OK && f.d.n == 0);
    CHECK(close_rel(val(&f, "gm_Q1"), 1e-3L / vt, 1e-15L));
    CHECK(close_rel(val(&f, "rpi_Q1"), 100 * vt / 1e-3L, 1e-15L));
    CHECK(close_rel(val(&f, "ro_Q1"), 105e3L, 1e-15L));
    CHECK(close_rel(val(&f, "cpi_Q1"), 1e-3L / vt / (2
                    * 3.14159265358979323846L * 400e6L) - 1e-12L, 1e-15L));
    CHECK(close_rel(val(&f, "cmu_Q1"), 1e-12L, 1e-15L));
    fixture_clear(&f);

    /* 27C = 300.15 K; early=plain needs no vce; saturation warns */
    fixture_init(&f, 1, "ro=inf", "ic=1m temp=27C beta=100 early=plain",
                 syms);
    CHECK(apply(&f) == GS_OK && f.d.n == 0);
    CHECK(close_rel(val(&f, "gm_Q1"), 1e-3L / (vt * 300.15L / 300),
                    1e-15L));
    CHECK(isnan(val(&f, "ro_Q1")));
    fixture_clear(&f);

    fixture_init(&f, 1, "", "type=pnp ic=-1m vce=-0.1 beta=100 va=-50",
                 syms);
    CHECK(apply(&f) == GS_OK);
    CHECK(has_message(&f, GS_SEV_WARNING, "Q1 is saturated (VCE = 100 mV "
                      "is below 200 mV): the forward-active small-signal "
                      "values do not hold there", 1));
    CHECK(close_rel(val(&f, "ro_Q1"), 50.1L / 1e-3L, 1e-15L));
    fixture_clear(&f);

    /* a part the device line fixes to a number is left alone, warned */
    fixture_init(&f, 1, "ro=50k", "ic=1m vce=2 beta=100 va=50", syms);
    CHECK(apply(&f) == GS_OK);
    CHECK(has_message(&f, GS_SEV_WARNING, "Q1's ro is fixed to 50k on its "
                      "device line; the bias line leaves it alone", 1));
    CHECK(isnan(val(&f, "ro_Q1")));
    fixture_clear(&f);
}

/* ---- the extract command ---- */

typedef struct run {
    int status;
    char out[8192];
    char err[4096];
} run;

static void slurp(char *buf, size_t size, FILE *fp)
{
    size_t n;
    rewind(fp);
    n = fread(buf, 1, size - 1, fp);
    buf[n] = '\0';
    fclose(fp);
}

/* gainsmith extract ARGS (split at spaces) */
static int extract(run *r, const char *args)
{
    char buf[512], *argv[40], *p;
    int argc = 0;
    FILE *out = tmpfile(), *err = tmpfile();

    snprintf(buf, sizeof buf, "extract %s", args);
    for (p = strtok(buf, " "); p && argc < 39; p = strtok(NULL, " "))
        argv[argc++] = p;
    argv[argc] = NULL;
    r->status = gs_cmd_extract(argc, argv, out, err);
    slurp(r->out, sizeof r->out, out);
    slurp(r->err, sizeof r->err, err);
    return r->status;
}

/* a line of the text output, "  label = value ..." */
static int has_line(const char *text, const char *line)
{
    const char *p = text;
    size_t n = strlen(line);
    while ((p = strstr(p, line)) != NULL) {
        if ((p == text || p[-1] == '\n') && (p[n] == '\n' || p[n] == '\0'))
            return 1;
        p++;
    }
    return 0;
}

static void test_extract_mos(void)
{
    run r;

    /* ID = 1 mA, gm = 4 mS, gds = 40 uS at VDS = 2 V: Vov = 2ID/gm =
       0.5 V, lambda = gds/(ID - gds*VDS) = 40/920, K = 2ID/(Vov²(1 +
       lambda*VDS)) = 7.36 mA/V^2 (the model's algebra, [RZ]) */
    CHECK(extract(&r, "mos --id=1m --vds=2 --gm=4m --gds=40u --vth=0.5 "
                  "--at-id=2m --at-vds=2") == 0);
    CHECK(r.err[0] == '\0');
    CHECK(has_line(r.out, "  Vov      = 500 mV             Vov = 2*ID/gm"));
    CHECK(has_line(r.out, "  lambda   = 0.0434783 1/V      lambda = "
                   "gds/(ID - gds*VDS)"));
    CHECK(has_line(r.out, "  K        = 7.36 mA/V^2        K = "
                   "2*ID/(Vov^2*(1 + lambda*VDS))"));
    CHECK(has_line(r.out, "  VGS      = 1 V                VGS = Vth + "
                   "Vov"));
    CHECK(has_line(r.out, "  rds      = 25 kOhm            rds = 1/gds"));
    /* carried to 2 mA at the same VDS: Vov scales by sqrt(2), and
       gds = lambda*ID/(1 + lambda*VDS) doubles */
    CHECK(has_line(r.out, "  Vov      = 707.107 mV"));
    CHECK(has_line(r.out, "  gm       = 5.65685 mS"));
    CHECK(has_line(r.out, "  gds      = 80 uS"));
    CHECK(has_line(r.out, "  rds      = 12.5 kOhm          rds = 1/gds"));
    CHECK(strncmp(r.out, "model: long-channel square-law MOSFET, "
                  "first-order hand analysis (nmos)\n", 71) == 0);

    /* two points, lambda = 0: K = 2 mA/V^2, Vth = 0.5 from ID = 0.25 mA
       at 1 V and 1 mA at 1.5 V (the square law [RZ]) */
    CHECK(extract(&r, "mos --id1=0.25m --vgs1=1 --id2=1m --vgs2=1.5 "
                  "--vds=2") == 0);
    CHECK(has_line(r.out, "  Vth      = 500 mV             Vth = VGS1 - "
                   "sqrt(ID1)*(VGS2 - VGS1)/(sqrt(ID2) - sqrt(ID1))"));
    CHECK(has_line(r.out, "  K        = 2 mA/V^2           K = "
                   "2*ID1/((VGS1 - Vth)^2*(1 + lambda*VDS))"));
    /* gm = 2*ID/Vov at each point, also when saturation is assumed */
    CHECK(has_line(r.out, "  gm2      = 2 mS               gm2 = "
                   "2*ID2/Vov2"));
    CHECK(extract(&r, "mos --id1=0.25m --vgs1=1 --id2=1m --vgs2=1.5") == 0);
    CHECK(has_line(r.out, "  gm1      = 1 mS               gm1 = "
                   "2*ID1/Vov1"));
    CHECK(has_line(r.out, "  gm2      = 2 mS               gm2 = "
                   "2*ID2/Vov2"));
    CHECK(!has_inf() || has_line(r.out, "  rds2     = inf Ohm            "
                                 "rds2 = 1/(lambda*(K/2)*Vov2^2)"));

    /* a PMOS with signed figures, and JSON */
    CHECK(extract(&r, "mos --type=pmos --id=-1m --vds=-2 --gm=4m "
                  "--gds=40u --vgs=-1 --format=json") == 0);
    CHECK(strstr(r.out, "  \"type\": \"pmos\",\n") != NULL);
    CHECK(close_rel(json_num(r.out, "vth"), 0.5L, 1e-12L));
    CHECK(close_rel(json_num(r.out, "k"), 7.36e-3L, 1e-12L));
    CHECK(close_rel(json_num(r.out, "rds"), 25000, 1e-12L));
    CHECK(r.out[0] == '{' && strstr(r.out, "\n}\n") != NULL);

    /* options also take their value as the next argument */
    CHECK(extract(&r, "mos --id 1m --gm 4m --vds 2 --format json") == 0);
    CHECK(close_rel(json_num(r.out, "k"), 8e-3L, 1e-12L));
    CHECK(strstr(r.out, "  \"fit\": \"point\",\n") != NULL);

    /* lambda = 0: rds is infinite, null in JSON */
    CHECK(extract(&r, "mos --id=1m --gm=4m --format=json") == 0);
    CHECK(strstr(r.out, "    \"gds\": 0,\n") != NULL);
    CHECK(!has_inf() || strstr(r.out, "    \"rds\": null,\n") != NULL);
    CHECK(strstr(r.out, "    \"region\": \"saturation (assumed)\",\n")
          != NULL);
    CHECK(strstr(r.out, "\"notes\": [\"neither --gds nor --lambda is "
                 "given: lambda = 0, so rds is infinite\", \"no --vds: "
                 "saturation (VDS >= Vov) is assumed, not checked\"]")
          != NULL);
}

static void test_extract_bjt(void)
{
    run r;

    /* [CODATA] VT = 25.852 mV at 300 K; [SS] rpi = beta/gm; [GM] ro =
       (VA + VCE)/IC = 105 kOhm */
    CHECK(extract(&r, "bjt --ic=1m --beta=100 --va=100 --vce=5") == 0);
    CHECK(has_line(r.out, "  VT       = 25.852 mV          VT = k*T/q at "
                   "T = 300 K"));
    CHECK(has_line(r.out, "  gm       = 38.6817 mS         gm = IC/VT"));
    CHECK(has_line(r.out, "  rpi      = 2.5852 kOhm        rpi = beta/gm"));
    CHECK(has_line(r.out, "  ro       = 105 kOhm           ro = (VA + "
                   "VCE)/IC"));
    /* the inverse: VA = ro*IC - VCE; [GM] Cpi from fT */
    CHECK(extract(&r, "bjt --ic=1m --gm=40m --ro=105k --vce=5 --ft=400M "
                  "--cmu=1p") == 0);
    CHECK(has_line(r.out, "  VA       = 100 V              VA = ro*IC - "
                   "VCE"));
    CHECK(has_line(r.out, "  Cpi      = 14.9155 pF         Cpi = "
                   "gm/(2*pi*fT) - Cmu"));
    CHECK(extract(&r, "bjt --ic=1m --ro=100k --early=plain") == 0);
    CHECK(has_line(r.out, "  VA       = 100 V              VA = ro*IC"));
    /* saturation is a warning, not an error */
    CHECK(extract(&r, "bjt --ic=1m --vce=0.1") == 0);
    CHECK(strcmp(r.err, "gainsmith extract: warning: VCE = 100 mV is below "
                 "200 mV: the transistor is saturated, where the "
                 "forward-active figures do not hold\n") == 0);
}

/* Every error message of extract, with its exit status. */
static void extract_error(const char *args, int status, const char *err)
{
    run r;
    extract(&r, args);
    CHECK_MSG(r.status == status, "'%s': status %d, want %d", args,
              r.status, status);
    CHECK_MSG(strcmp(r.err, err) == 0, "'%s':\n got: %s want: %s", args,
              r.err, err);
    CHECK_MSG(status != 2 || r.out[0] == '\0', "'%s': output on error",
              args);
}

#define E "gainsmith extract: error: "
#define H "gainsmith extract: hint: "

#define PMOS_HINT H "a PMOS takes type=pmos (--type=pmos); its voltages " \
    "and current are then read as magnitudes\n"

static void test_extract_errors_usage(void)
{
    run r;

    extract_error("", 2, E "extract needs a device: mos or bjt\n"
                  H "'gainsmith extract --help' shows the usage\n");
    extract_error("fet", 2, E "unknown device 'fet': expected mos or bjt\n"
                  H "'gainsmith extract --help' shows the usage\n");
    extract_error("mos", 2, E "extract mos needs --id and --gm (one point), "
                  "or --id1, --vgs1, --id2 and --vgs2 (two points)\n"
                  H "'gainsmith extract --help' lists the options\n");
    extract_error("mos --id=1m", 2, E "the one-point fit needs --gm\n"
                  H "'gainsmith extract --help' lists the options\n");
    extract_error("mos --id1=1m --vgs2=1", 2, E "the two-point fit needs "
                  "--vgs1 and --id2\n"
                  H "'gainsmith extract --help' lists the options\n");
    extract_error("mos --id=1m --gm=4m --id1=1m", 2, E "the one-point "
                  "figures (--id, --gm, --gds, --vth, --vgs) and the "
                  "two-point figures (--id1, --vgs1, --id2, --vgs2) do not "
                  "mix\n");
    extract_error("mos --idd=1m", 2, E "unknown option '--idd'\n"
                  H "did you mean '--id'?\n");
    extract_error("mos --id=1m --id=2m", 2,
                  E "option '--id' given twice\n");
    extract_error("mos --id", 2, E "option '--id' needs a value\n");
    extract_error("mos extra --id=1m", 2, E "unexpected argument 'extra'\n"
                  H "options are written --NAME=VALUE\n");
    extract_error("mos --format=xml --id=1m --gm=1m", 2,
                  E "--format expects text or json, got xml\n");
    extract_error("mos --type=cmos --id=1m --gm=1m", 2,
                  E "--type expects nmos or pmos, got cmos\n");
    extract_error("bjt --ic=1m --early=maybe", 2,
                  E "--early expects full or plain, got maybe\n");
    extract_error("mos --id=1mV --gm=4m", 2,
                  E "--id expects amperes, got 1mV\n");
    extract_error("mos --id=1m --gm=10mA", 2,
                  E "--gm expects siemens, got 10mA\n");
    extract_error("bjt --ic=1m --ro=1K --vce=1", 2,
                  E "--ro expects ohms, got 1K\n"
                  H "K is the kelvin (and C degrees Celsius); the prefix "
                  "kilo is a lowercase k, as in 45k\n");
    extract_error("mos --id=lots --gm=4m", 2,
                  E "--id expects a number, got lots\n"
                  H "write --id as a number with an optional SI prefix "
                  "(f p n u m k M G T) and unit, e.g. 1mA\n");
    extract_error("mos --id=1m --gm=4m --vth=1 --vgs=2", 2, E "give --vth "
                  "or --vgs, not both: VGS = Vth + 2*ID/gm fixes one from "
                  "the other\n");
    /* help tells the truth and goes to out */
    CHECK(extract(&r, "--help") == 0 && r.err[0] == '\0');
    CHECK(strcmp(r.out, gs_cmd_extract_help()) == 0);
    CHECK(strstr(r.out, "first-order hand-analysis models") != NULL);
    CHECK(strstr(r.out, "manufacturer's or foundry's models") != NULL);
    CHECK(extract(&r, "bjt --ic=1m --help") == 0);
    CHECK(strcmp(r.out, gs_cmd_extract_help()) == 0);
}

static void test_extract_errors_mos(void)
{
    extract_error("mos --id=-1m --gm=4m", 2,
                  E "ID must be positive, got -1 mA\n" PMOS_HINT);
    extract_error("mos --id=0 --gm=4m", 2,
                  E "ID must be positive, got 0 A\n" PMOS_HINT);
    extract_error("mos --id=1m --gm=0", 2, E "gm must be positive, got 0 S\n");
    extract_error("mos --id=1m --gm=-4m", 2,
                  E "gm must be positive, got -4 mS\n");
    extract_error("mos --id=1m --gm=4m --gds=-1u --vds=1", 2,
                  E "gds must not be negative, got -1 uS\n");
    extract_error("mos --id=1m --gm=4m --gds=10u", 2, E "gds needs VDS: the "
                  "model has the factor (1 + lambda*VDS)\n");
    extract_error("mos --id=1m --gm=4m --lambda=0.1", 2, E "lambda needs "
                  "VDS: the model has the factor (1 + lambda*VDS)\n");
    extract_error("mos --id=1m --gm=4m --lambda=-1 --vds=2", 2,
                  E "lambda must not be negative, got -1 1/V\n");
    extract_error("mos --id=1m --gm=4m --gds=1m --vds=1", 2,
                  E "gds*VDS = 1 mA is not below ID = 1 mA, so lambda = "
                  "gds/(ID - gds*VDS) would be infinite or negative\n"
                  H "in this model gds is below ID/VDS; check the figures "
                  "and their units\n");
    extract_error("mos --id=1m --gm=4m --gds=1m --lambda=1 --vds=1", 2,
                  E "gds and lambda are both given, but one follows from "
                  "the other\n");
    extract_error("mos --id=1m --gm=4m --vds=-1", 2,
                  E "VDS must not be negative, got -1 V\n" PMOS_HINT);
    extract_error("mos --id=1m --gm=4m --vds=0.2", 1, E "VDS = 200 mV is "
                  "below Vov = 2*ID/gm = 500 mV: these figures put the "
                  "device in triode, where the square-law saturation "
                  "equations do not hold\n"
                  H "the saturation equations need VDS >= Vov\n");
    extract_error("mos --id1=1m --vgs1=1 --id2=1m --vgs2=1.5", 2,
                  E "ID goes from 1 mA to 1 mA while VGS goes from 1 V to "
                  "1.5 V: in the square law ID rises with VGS, so these "
                  "points do not fit it\n");
    extract_error("mos --id1=2m --vgs1=1 --id2=1m --vgs2=1.5", 2,
                  E "ID goes from 2 mA to 1 mA while VGS goes from 1 V to "
                  "1.5 V: in the square law ID rises with VGS, so these "
                  "points do not fit it\n");
    extract_error("mos --id1=-1m --vgs1=1 --id2=1m --vgs2=1.5", 2,
                  E "ID1 must be positive, got -1 mA\n" PMOS_HINT);
    extract_error("mos --id1=1m --vgs1=1 --id2=0 --vgs2=1.5", 2,
                  E "ID2 must be positive, got 0 A\n" PMOS_HINT);
    extract_error("mos --id1=0.25m --vgs1=1 --id2=1m --vgs2=1.5 "
                  "--lambda=0.1", 2, E "lambda needs VDS: the model has "
                  "the factor (1 + lambda*VDS)\n");
    extract_error("mos --id1=0.25m --vgs1=1 --id2=1m --vgs2=1.5 --vds=0.7",
                  1, E "at VDS = 700 mV point 2 (Vov = 1 V) is in triode, "
                  "where the square-law saturation equations do not hold\n"
                  H "the two-point fit needs both points in saturation\n");
}

static void test_extract_errors_carry(void)
{
    const char *pt = "mos --id=1m --gm=4m --vds=2 ";
    char args[256];

#define CARRY(extra, st, msg)                                    \
    do {                                                         \
        snprintf(args, sizeof args, "%s%s", pt, extra);          \
        extract_error(args, st, msg);                            \
    } while (0)

    CARRY("--at-id=1m --at-vgs=1 --at-vds=1", 2, E "give --at-id or "
          "--at-vgs, not both: one fixes the other\n");
    CARRY("--at-vds=1", 2, E "--at-vds needs --at-id or --at-vgs\n");
    CARRY("--at-id=2m", 2, E "--at-id needs --at-vds\n");
    CARRY("--at-vgs=2", 2, E "--at-vgs needs --at-vds\n");
    CARRY("--at-vgs=2 --at-vds=2", 2, E "--at-vgs needs the threshold Vth\n"
          H "give --vth (or --vgs) at the first point, or carry by current "
          "with --at-id\n");
    CARRY("--vth=0.5 --at-vgs=0.4 --at-vds=2", 1, E "at VGS = 400 mV the "
          "device is cut off (VGS <= Vth = 500 mV): it has no small-signal "
          "gain\n");
    CARRY("--vth=0.5 --at-vgs=0.5 --at-vds=2", 1, E "at VGS = 500 mV the "
          "device is cut off (VGS <= Vth = 500 mV): it has no small-signal "
          "gain\n");
    CARRY("--at-id=-1m --at-vds=2", 2,
          E "--at-id must be positive, got -1 mA\n");
    CARRY("--at-id=1m --at-vds=-2", 2,
          E "VDS must not be negative, got -2 V\n" PMOS_HINT);
    CARRY("--at-id=1m --at-vds=0", 1, E "at VDS = 0 no drain current flows "
          "in this model, so ID = 1 mA cannot be reached\n");
    /* triode at the new point: a warning, exit 0 */
    CARRY("--vth=0.5 --at-vgs=1.5 --at-vds=0.2", 0, "gainsmith extract: "
          "warning: the new point is in triode, not in saturation (VDS = "
          "200 mV < Vov = 1 V): the triode small-signal values are shown\n");
    /* the boundary VDS = Vov at the new point is saturation */
    CARRY("--vth=0.5 --at-vgs=1.5 --at-vds=1", 0, "");
#undef CARRY
}

static void test_extract_errors_bjt(void)
{
    extract_error("bjt", 2, E "extract bjt needs --ic\n"
                  H "'gainsmith extract --help' lists the options\n");
    extract_error("bjt --ic=1m --ro=1k --va=2", 2, E "give --ro or --va, "
                  "not both: ro = (VA + VCE)/IC fixes one from the other\n");
    extract_error("bjt --ic=1m --ro=1k", 2, E "--ro needs --vce: ro = (VA + "
                  "VCE)/IC\n" H "or give --early=plain for ro = VA/IC\n");
    extract_error("bjt --ic=1m --va=50", 2, E "--va needs --vce: ro = (VA + "
                  "VCE)/IC\n" H "or give --early=plain for ro = VA/IC\n");
    extract_error("bjt --ic=1m --cmu=1p", 2, E "--cmu is used only with "
                  "--ft: Cpi = gm/(2*pi*fT) - Cmu\n");
    extract_error("bjt --ic=1m --vce=-1", 2, E "VCE must not be negative, "
                  "got -1 V\n" H "a PNP takes --type=pnp; its figures are "
                  "then read as magnitudes\n");
    extract_error("bjt --ic=1m --temp=0K", 2, E "the temperature must be "
                  "above 0 K, got 0 K\n");
    extract_error("bjt --ic=1m --temp=-300C", 2, E "the temperature must be "
                  "above 0 K, got -26.85 K\n");
    extract_error("bjt --ic=0", 2, E "IC must be positive, got 0 A\n"
                  H "a PNP takes type=pnp (--type=pnp); its figures are "
                  "then read as magnitudes\n");
    extract_error("bjt --ic=1m --gm=-1m", 2,
                  E "gm must be positive, got -1 mS\n");
    extract_error("bjt --ic=1m --beta=0", 2,
                  E "beta must be positive, got 0\n");
    extract_error("bjt --ic=1m --ro=0 --vce=1", 2,
                  E "ro must be positive, got 0 Ohm\n");
    extract_error("bjt --ic=1m --ro=1k --vce=1", 2, E "ro*IC = 1 V is not "
                  "above VCE = 1 V, so VA = ro*IC - VCE would not be "
                  "positive\n" H "check the figures, or use the form ro = "
                  "VA/IC\n");
    extract_error("bjt --ic=1m --va=-5 --vce=1", 2,
                  E "VA must be positive, got -5 V\n");
    extract_error("bjt --ic=1m --ft=0", 2, E "fT must be positive, got 0 "
                  "Hz\n");
    extract_error("bjt --ic=1m --ft=300M --cmu=1n", 2, E "Cmu = 1 nF is not "
                  "below gm/(2*pi*fT) = 20.5213 pF, so Cpi would not be "
                  "positive\n");
    extract_error("bjt --ic=1m --ft=300M --cmu=-1p", 2,
                  E "Cmu must not be negative, got -1 pF\n");
    extract_error("bjt --ic=1m --beta=100V", 2,
                  E "--beta expects a plain number, got 100V\n");
}

int main(void)
{
    test_region_boundaries();
    test_square_law();
    test_triode_and_cutoff();
    test_at_id_and_k();
    test_gmb();
    test_round_trip_point();
    test_round_trip_two();
    test_bjt();
    test_bias_mos();
    test_bias_mos_regions();
    test_bias_errors();
    test_bias_bjt();
    test_extract_mos();
    test_extract_bjt();
    test_extract_errors_usage();
    test_extract_errors_mos();
    test_extract_errors_carry();
    test_extract_errors_bjt();
    return check_report("device");
}
