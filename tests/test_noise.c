/* test_noise.c - noise densities against textbook closed forms, and every
 * symbolic density against the adjoint numeric solve (numsolve.c).
 * See LICENSE.
 */
#include "check.h"
#include "analysis/job.h"
#include "analysis/mna.h"
#include "analysis/noise.h"
#include "analysis/noise_approx.h"
#include "circuit/device.h"
#include "numeric/numsolve.h"
#include "numeric/spectrum.h"

#include <complex.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

typedef struct fixture {
    gs_job j;
    gs_noise n;
    gs_noise_num nn;
    int ok;
} fixture;

/* Parse, set up the noise sources, derive every target and transfer,
   bind the values and make the numbers. */
static void load(fixture *f, const char *text)
{
    gs_derive_opts o;
    gs_diag d;
    size_t i;
    int rc;
    gs_job_init(&f->j);
    gs_noise_init(&f->n);
    memset(&f->nn, 0, sizeof f->nn);
    gs_diag_init(&d);
    f->j.c = gs_circuit_new();
    rc = gs_parse_string(f->j.c, "t.gsc", text, &d);
    if (rc == GS_OK) {
        gs_mna_intern_symbols(f->j.c);
        f->j.ctx = gs_polyctx_new(f->j.c->syms,
                                  gs_symtab_count(f->j.c->syms));
        rc = gs_noise_setup(&f->n, f->j.c, NULL, &d);
    }
    gs_derive_opts_default(&o);
    for (i = 0; rc == GS_OK && i < f->j.c->noutputs; i++)
        rc = gs_job_derive(&f->j, f->j.c->outputs[i].name, &o, &d);
    if (rc == GS_OK)
        rc = gs_job_bind(&f->j, NULL, 0, &d);
    if (rc == GS_OK)
        rc = gs_noise_num_make(&f->nn, &f->n, &f->j, &d);
    if (rc != GS_OK)
        gs_diag_print(stderr, &d);
    gs_diag_clear(&d);
    f->ok = rc == GS_OK;
}

static void unload(fixture *f)
{
    gs_noise_num_clear(&f->nn);
    gs_noise_clear(&f->n);
    gs_job_clear(&f->j);
}

static int src_index(const fixture *f, const char *name)
{
    size_t k;
    for (k = 0; k < f->n.nsrc; k++)
        if (strcmp(f->n.src[k].name, name) == 0)
            return (int)k;
    return -1;
}

static int close_to(long double a, long double b, long double rel)
{
    return fabsl(a - b) <= rel * fabsl(b);
}

/* Every source's output density, from the exact H_k, against the
   transfer from the adjoint solve at several frequencies: 1e-9. */
static int adjoint_agrees(const fixture *f)
{
    static const long double fr[] = {1.0L, 37.0L, 1e3L, 4.2e4L, 1e6L,
                                     3e8L};
    const gs_circuit *c = f->j.c;
    size_t i, k, q, ns = f->n.nsrc;
    int *from = calloc(ns, sizeof *from), *to = calloc(ns, sizeof *to);
    long double complex *h = calloc(ns, sizeof *h);
    long double *part = calloc(ns, sizeof *part), worst = 0;
    gs_diag d;
    int ok = 1;
    gs_diag_init(&d);
    for (k = 0; k < ns; k++) {
        from[k] = f->n.src[k].from;
        to[k] = f->n.src[k].to;
    }
    for (i = 0; i < f->n.ntarget && ok; i++)
        for (q = 0; q < sizeof fr / sizeof fr[0] && ok; q++) {
            long double tot = gs_noise_out_psd(&f->nn, i, fr[q], part);
            long double sum = 0;
            ok = gs_numsolve_adjoint(h, c, f->n.target[i].out, f->j.vals,
                                     2 * acosl(-1) * fr[q] * I, from, to,
                                     ns, &d) == GS_OK;
            for (k = 0; k < ns && ok; k++) {
                const gs_noise_term *t = &f->nn.term[i * ns + k];
                long double s = t->white + t->flicker / fr[q];
                long double a = cabsl(h[k]) * cabsl(h[k]) * s;
                long double e = fabsl(part[k] - a);
                sum += a;
                if (a > 0 || part[k] > 0)
                    e /= fmaxl(a, part[k]);
                worst = fmaxl(worst, e);
            }
            worst = fmaxl(worst, fabsl(tot - sum) / sum);
        }
    if (worst > 1e-9L) {
        fprintf(stderr, "adjoint disagreement %Lg\n", worst);
        ok = 0;
    }
    gs_diag_clear(&d);
    free(from);
    free(to);
    free(h);
    free(part);
    return ok;
}

static long double kT(long double t)
{
    return GS_BOLTZMANN * t;
}

/* A divider's output noise is the thermal noise of R1 || R2
   (Johnson-Nyquist, a textbook fact): 4kT R1 R2/(R1 + R2). */
static void test_divider(void)
{
    fixture f;
    long double r = 10e3L * 40e3L / 50e3L, fr;
    load(&f, "vsource vin in gnd\nresistor R1 in out = 10k\n"
             "resistor R2 out gnd = 40k\ntransfer Av = v(out) / vin\n");
    CHECK(f.ok);
    if (!f.ok)
        return;
    CHECK(f.n.nsrc == 2);
    CHECK(close_to(f.nn.t, 300, 1e-15L));
    for (fr = 1; fr < 1e9L; fr *= 31)
        CHECK(close_to(gs_noise_out_psd(&f.nn, 0, fr, NULL),
                       4 * kT(300) * r, 1e-12L));
    /* referred to the input: over |Av|^2 = (4/5)^2 */
    CHECK(close_to(gs_noise_in_psd(&f.nn, 0, 1e3L),
                   4 * kT(300) * r / 0.64L, 1e-12L));
    CHECK(adjoint_agrees(&f));
    unload(&f);
}

/* An RC low-pass integrates to kT/C whatever R (Gray, Hurst, Lewis and
   Meyer, noise chapter, from memory); over a finite band exactly
   (kT/C)(2/pi)(atan(f2/fc) - atan(f1/fc)), fc = 1/(2 pi R C). */
static void test_rc_ktc(void)
{
    static const char *r[] = {"1k", "220k"};
    static const long double rv[] = {1e3L, 220e3L};
    int i;
    for (i = 0; i < 2; i++) {
        fixture f;
        char text[256];
        long double out, in, c = 1e-9L, fc, pi = acosl(-1);
        snprintf(text, sizeof text, "vsource vin in gnd\n"
                 "resistor R in out = %s\ncapacitor C out gnd = 1n\n"
                 "temperature 290\ntransfer H = v(out) / vin\n", r[i]);
        load(&f, text);
        CHECK(f.ok);
        if (!f.ok)
            continue;
        CHECK(close_to(f.nn.t, 290, 1e-15L));
        gs_noise_band(&out, &in, NULL, &f.nn, 0, 1e-9L, 1e18L);
        CHECK_MSG(close_to(out, kT(290) / c, 1e-8L), "%Lg vs %Lg", out,
                  kT(290) / c);
        fc = 1 / (2 * pi * rv[i] * c);
        gs_noise_band(&out, &in, NULL, &f.nn, 0, fc / 7, fc * 3);
        CHECK(close_to(out, kT(290) / c * 2 / pi
                            * (atanl(3) - atanl(1.0L / 7)), 1e-10L));
        CHECK(adjoint_agrees(&f));
        unload(&f);
    }
}

/* A common-source stage, input-referred: 4kT gamma/gm + 4kT RD/(gm RD)^2
   (Razavi, "Design of Analog CMOS Integrated Circuits", noise chapter,
   from memory), gamma 2/3 by default, and bound by a value line or by
   the mosfet line (an expression there as on a value line). */
static void test_cs_stage(void)
{
    static const char *gam[] = {"", "value nthermal_M1 = 1\n", "", ""};
    static const char *line[] = {"", "", " nthermal=1", " nthermal=5/4"};
    static const long double gv[] = {2.0L / 3.0L, 1.0L, 1.0L, 1.25L};
    int i;
    for (i = 0; i < 4; i++) {
        fixture f;
        char text[512];
        long double gm = 2e-3L, rd = 5e3L, want;
        snprintf(text, sizeof text, "vsource vin g gnd\n"
                 "mosfet M1 d g gnd gm=gm1 rds=inf%s\nresistor RD d vdd\n"
                 "ground vdd\nvalue gm1 = 2m\nvalue RD = 5k\n%s"
                 "transfer Av = v(d) / vin\n", line[i], gam[i]);
        load(&f, text);
        CHECK(f.ok);
        if (!f.ok)
            continue;
        CHECK(src_index(&f, "M1.channel") >= 0 && src_index(&f, "RD") >= 0);
        want = 4 * kT(300) * gv[i] / gm
             + 4 * kT(300) * rd / ((gm * rd) * (gm * rd));
        CHECK(close_to(gs_noise_in_psd(&f.nn, 0, 1e3L), want, 1e-12L));
        CHECK(adjoint_agrees(&f));
        unload(&f);
    }
}

/* Flicker noise: gm^2 K/(Cox W L f) at the drain, so the gate-referred
   density falls as 1/f (Razavi, noise chapter, from memory). */
static void test_flicker(int on_line)
{
    fixture f;
    long double k = 1e-25L, cox = 5e-3L, w = 10e-6L, l = 1e-6L, gm = 1e-3L;
    if (on_line)        /* the same parameters on the mosfet line */
        load(&f, "vsource vin g gnd\nmosfet M1 d g gnd gm=gm1 rds=ro "
                 "kf=1e-25 cox=5m w=10u l=wl/10\n"
                 "resistor RD d gnd = 10k\nvalue gm1 = 1m\n"
                 "value ro = 100k\nvalue wl = 10u\n"
                 "transfer Av = v(d) / vin\n");
    else
        load(&f, "vsource vin g gnd\nmosfet M1 d g gnd gm=gm1 rds=ro\n"
                 "resistor RD d gnd = 10k\nvalue gm1 = 1m\n"
                 "value ro = 100k\nvalue kf_M1 = 1e-25\n"
                 "value cox_M1 = 5m\nvalue w_M1 = 10u\n"
                 "value l_M1 = 1u\ntransfer Av = v(d) / vin\n");
    CHECK_MSG(f.ok, "flicker, on the line %d", on_line);
    if (!f.ok)
        return;
    {
        int fl = src_index(&f, "M1.flicker");
        long double *part = calloc(f.n.nsrc, sizeof *part);
        CHECK(fl >= 0);
        gs_noise_out_psd(&f.nn, 0, 100, part);
        /* referred to the gate: over |Av|^2 */
        if (fl >= 0)
            CHECK(close_to(part[fl] / gs_spectrum_term(&f.nn.in[0], 100),
                           k / (cox * w * l * 100), 1e-12L));
        (void)gm;
        free(part);
    }
    CHECK(adjoint_agrees(&f));
    unload(&f);
}

/* The density of source NAME of f (white, and the 1/f coefficient). */
static int density_of(long double *white, long double *flicker,
                      const fixture *f, const char *name)
{
    int k = src_index(f, name), rc;
    gs_diag d;
    if (k < 0)
        return 0;
    gs_diag_init(&d);
    rc = gs_noise_density(white, flicker, &f->n.src[k], f->j.c, f->j.vals,
                          f->j.set, f->nn.t, &d);
    gs_diag_clear(&d);
    return rc == GS_OK;
}

/* The noise parameters on a mosfet's bias line: the same densities as
   the same numbers on value lines, and the channel density 4kT*gamma*gm
   and the flicker coefficient gm^2*K_f/(Cox*W*L) with gm of the square
   law in saturation, gm = sqrt(2*K*ID*(1 + lambda*VDS)) (Razavi, "Design
   of Analog CMOS Integrated Circuits", ch. 2 and the noise chapter, from
   memory), worked out here from the bias figures. */
static void test_bias_params(void)
{
    static const char head[] =
        "vsource vin g gnd\nmosfet M1 d g gnd gm=gm1 rds=ro1\n"
        "resistor RD d vdd = 5k\nground vdd\n"
        "transfer Av = v(d) / vin\nbias M1 id=1m vds=2 k=2m lambda=0.04";
    char text[2][512];
    fixture f[2];
    long double w[2], fl[2], cw[2], cf[2], k = 2e-3L, id = 1e-3L;
    long double gm = sqrtl(2 * k * id * (1 + 0.04L * 2));
    long double kf = 2e-25L, cox = 8e-3L, wd = 20e-6L, l = 0.5e-6L;
    int i, sym;
    snprintf(text[0], sizeof text[0], "%s nthermal=1 kf=2e-25 "
             "cox=8mF/m^2 w=20um l=0.5u\n", head);
    snprintf(text[1], sizeof text[1], "%s\nvalue nthermal_M1 = 1\n"
             "value kf_M1 = 2e-25\nvalue cox_M1 = 8m\nvalue w_M1 = 20u\n"
             "value l_M1 = 0.5u\n", head);
    for (i = 0; i < 2; i++) {
        load(&f[i], text[i]);
        CHECK_MSG(f[i].ok, "bias params, form %d", i);
        if (!f[i].ok)
            return;
        CHECK(density_of(&w[i], &fl[i], &f[i], "M1.channel"));
        CHECK(density_of(&cw[i], &cf[i], &f[i], "M1.flicker"));
    }
    /* the same numbers either way (exact decimals, rounded once) */
    CHECK_MSG(w[0] == w[1] && cf[0] == cf[1], "%Lg %Lg, %Lg %Lg", w[0],
              w[1], cf[0], cf[1]);
    CHECK(fl[0] == 0 && cw[0] == 0);
    CHECK(close_to(gs_noise_out_psd(&f[0].nn, 0, 1e3L, NULL),
                   gs_noise_out_psd(&f[1].nn, 0, 1e3L, NULL), 1e-15L));
    /* against the textbook forms, gamma = nthermal = 1 */
    CHECK_MSG(close_to(w[0], 4 * kT(300) * 1 * gm, 1e-15L), "%Lg vs %Lg",
              w[0], 4 * kT(300) * gm);
    CHECK(close_to(cf[0], gm * gm * kf / (cox * wd * l), 1e-15L));
    /* bound as values from the bias line; the line keeps its figures */
    sym = gs_symtab_find(f[0].j.c->syms, "kf_M1");
    CHECK(sym >= 0 && f[0].j.origin[sym]
          && strcmp(f[0].j.origin[sym], "bias M1") == 0);
    CHECK(f[0].j.c->nbiases == 1 && f[0].j.c->biases[0].nparams == 4);
    /* rds = (1 + lambda*VDS)/(lambda*ID) (square law with channel-length
       modulation, same chapter): the figures still fix the point */
    sym = gs_symtab_find(f[0].j.c->syms, "ro1");
    CHECK(sym >= 0 && close_to(f[0].j.vals[sym], 1.08L / (0.04L * id),
                               1e-15L));
    CHECK(adjoint_agrees(&f[0]));
    unload(&f[0]);
    unload(&f[1]);
}

/* Parse text; the messages joined "LINE:COL: message" a line. */
static int parse_errors(char *out, size_t size, const char *text)
{
    gs_circuit *c = gs_circuit_new();
    gs_diag d;
    size_t i, n = 0;
    int rc;
    gs_diag_init(&d);
    rc = gs_parse_string(c, "t.gsc", text, &d);
    out[0] = '\0';
    for (i = 0; i < d.n && n < size; i++)
        n += (size_t)snprintf(out + n, size - n, "%d:%d: %s\n", d.v[i].line,
                              d.v[i].col, d.v[i].message);
    gs_diag_clear(&d);
    gs_circuit_free(c);
    return rc;
}

/* A noise parameter bound twice (the second place is reported, as for
   two value lines), or at or below zero; a bjt's bias line takes none. */
static void test_bias_param_errors(void)
{
    static const char *const text[] = {
        "mosfet M1 d g gnd gm=1m rds=inf\nbias M1 id=1m vds=2 k=2m "
        "w=20u\nvalue w_M1 = 1u\n",
        "mosfet M1 d g gnd gm=1m rds=inf\nvalue w_M1 = 1u\nbias M1 "
        "id=1m vds=2 k=2m w=20u\n",
        "bias M1 id=1m vds=2 k=2m kf=1e-25\nmosfet M1 d g gnd gm=1m "
        "rds=inf kf=2e-25\n",
        "mosfet M1 d g gnd gm=1m rds=inf\nbias M1 id=1m vds=2 k=2m "
        "l=0 nthermal=-1\n",
        "mosfet M1 d g gnd gm=1m rds=inf\nbias M1 id=1m vds=2 k=2m "
        "cox=8mF w=1/0\n",
    };
    static const char *const want[] = {
        "3:7: duplicate value for 'w_M1' (first at 2:26)\n",
        "3:26: duplicate value for 'w_M1' (first at 2:7)\n",
        "2:33: duplicate value for 'kf_M1' (first at 1:26)\n",
        "2:28: l must be positive, got 0 m\n"
        "2:39: nthermal must be positive, got -1\n",
        "2:30: cox expects F/m^2, got 8mF\n"
        "2:36: w: division by zero in 1/0\n",
    };
    char got[512];
    size_t i;
    for (i = 0; i < sizeof text / sizeof text[0]; i++) {
        int rc = parse_errors(got, sizeof got, text[i]);
        CHECK_MSG(rc != GS_OK && strcmp(got, want[i]) == 0,
                  "case %zu: got\n%s", i, got);
    }
}

/* Bias line TEXT read and applied: the first message, "" for none. */
static void bias_applied(char *out, size_t size, const char *text)
{
    gs_circuit *c = gs_circuit_new();
    gs_diag d;
    long double vals[64] = {0};
    unsigned char set[64] = {0};
    gs_diag_init(&d);
    if (gs_parse_string(c, "t.gsc", text, &d) == GS_OK
        && gs_symtab_count(c->syms) <= 64)
        gs_device_apply_biases(c, vals, set, NULL, &d);
    snprintf(out, size, "%s", d.n ? d.v[0].message : "");
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

/* The noise parameters fix no operating point: the rules of the figures
   say the same with them as without; a bjt's bias line refuses them (its
   shot noise needs only the gm and rpi the line sets). */
static void test_bias_param_rules(void)
{
    char a[256], b[256];
    static const char cs[] = "vsource vin g gnd\nresistor RD d gnd = 1k\n"
                             "mosfet M1 d g gnd rds=inf\n";
    char text[256];
    snprintf(text, sizeof text, "%sbias M1 id=1m kf=1e-25 cox=5m w=1u l=1u "
             "nthermal=1\n", cs);
    bias_applied(a, sizeof a, text);
    snprintf(text, sizeof text, "%sbias M1 id=1m\n", cs);
    bias_applied(b, sizeof b, text);
    CHECK_MSG(strcmp(a, b) == 0 && strstr(a, "under-determined") != NULL,
              "'%s' vs '%s'", a, b);
    snprintf(text, sizeof text, "%sbias M1 id=1m vds=2 k=2m kf=1e-25 "
             "cox=5m w=1u l=1u\n", cs);
    bias_applied(a, sizeof a, text);
    CHECK_MSG(a[0] == '\0', "'%s'", a);
    bias_applied(a, sizeof a, "vsource vin b gnd\nresistor RC c gnd = 1k\n"
                 "bjt Q1 c b gnd\nbias Q1 ic=1m vce=2 beta=100 kf=1e-25\n");
    CHECK_MSG(strcmp(a, "unknown bjt bias figure 'kf'") == 0, "'%s'", a);
}

/* A non-inverting amplifier: a noise voltage at the + input reaches the
   output through the noise gain 1 + R2/R1 (Franco, "Design with
   Operational Amplifiers and Analog Integrated Circuits", noise chapter,
   from memory).  The voltage is the thermal noise 4kT Rn of a resistor
   in series with the input. */
static void test_noninverting(void)
{
    fixture f;
    int k;
    long double *part;
    load(&f, "vsource vin in gnd\nresistor Rn in p = 100\n"
             "opamp A out p m\nresistor R1 m gnd = 1k\n"
             "resistor R2 out m = 9k\ntransfer Av = v(out) / vin\n");
    CHECK(f.ok);
    if (!f.ok)
        return;
    k = src_index(&f, "Rn");
    part = calloc(f.n.nsrc, sizeof *part);
    gs_noise_out_psd(&f.nn, 0, 1e3L, part);
    CHECK(k >= 0);
    if (k >= 0)
        CHECK(close_to(part[k], 100 * 4 * kT(300) * 100, 1e-12L));
    CHECK(adjoint_agrees(&f));
    free(part);
    unload(&f);
}

/* A bjt stage's noise figure with the source resistance at its optimum
   sqrt(beta)/gm: about 1 + 1/sqrt(beta) (Gray, Hurst, Lewis and Meyer,
   noise chapter, from memory, with rb = 0); exactly, from the shot
   noises 2qIC, 2qIB and the source's 4kT Rs,
   F = 1 + Rs/(2 rpi) + (Rs + rpi)^2/(2 gm Rs rpi^2)  (by hand). */
static void test_bjt_nf(void)
{
    fixture f;
    long double gm = 40e-3L, beta = 100, rpi = beta / gm;
    long double rs = sqrtl(beta) / gm, fexact, fgot, *part;
    int k;
    load(&f, "vsource vin src gnd\nresistor RS src b = 250\n"
             "bjt Q1 c b gnd gm=40m rpi=2.5k\nresistor RC c gnd = 1\n"
             "transfer Av = v(c) / vin\n");
    CHECK(f.ok);
    if (!f.ok)
        return;
    k = src_index(&f, "RS");
    CHECK(k >= 0 && src_index(&f, "Q1.collector") >= 0
          && src_index(&f, "Q1.base") >= 0);
    part = calloc(f.n.nsrc, sizeof *part);
    fgot = gs_noise_out_psd(&f.nn, 0, 1e3L, part) / part[k];
    /* the load RC's own noise is left out of the device's figure */
    fgot -= part[src_index(&f, "RC")] / part[k];
    fexact = 1 + rs / (2 * rpi) + (rs + rpi) * (rs + rpi)
                                  / (2 * gm * rs * rpi * rpi);
    CHECK(close_to(fgot, fexact, 1e-12L));
    CHECK(fabsl(fgot - (1 + 1 / sqrtl(beta))) < 0.15L / sqrtl(beta));
    CHECK(adjoint_agrees(&f));
    free(part);
    unload(&f);
}

/* A bjt with base resistance and capacitances, two transfers: only the
   adjoint check, over frequency. */
static void test_bjt_adjoint(void)
{
    fixture f;
    load(&f, "vsource vin src gnd\nresistor RS src b = 1k\n"
             "bjt Q1 c b e gm=20m rpi=5k ro=80k cpi=10p cmu=1p rb=200\n"
             "resistor RC c vdd = 4.7k\nresistor RE e gnd = 100\n"
             "capacitor CL c gnd = 2p\nground vdd\n"
             "transfer Av = v(c) / vin\ntransfer Ae = v(e) / vin\n");
    CHECK(f.ok);
    if (!f.ok)
        return;
    CHECK(f.n.ntarget == 2 && src_index(&f, "Q1.rb") >= 0);
    CHECK(adjoint_agrees(&f));
    unload(&f);
}

/* The short form of target 0 of f at tolerance tol over [f1, f2]. */
static int short_form(gs_noise_short *sh, const fixture *f, long double tol,
                      long double f1, long double f2)
{
    gs_approx_opts o;
    gs_diag d;
    int rc;
    gs_approx_opts_default(&o);
    o.tol_db = tol;
    o.f_lo = f1;
    o.f_hi = f2;
    gs_diag_init(&d);
    gs_noise_short_init(sh);
    rc = gs_noise_short_make(sh, &f->n, &f->nn, &f->j, 0, &o, &d);
    if (rc != GS_OK)
        gs_diag_print(stderr, &d);
    gs_diag_clear(&d);
    return rc;
}

/* Short forms of a divider R1 = 1k, R2 = 1M.  Its parts are 4kT R1 and
   4kT R2 times the squares of R2/(R1 + R2) and R1/(R1 + R2)
   (Johnson-Nyquist with the divider rule, textbook facts): R2's share is
   R1/(R1 + R2) = 1/1001 at every frequency.  At 0.5 dB (a third of it,
   3.8 %, for what is left out) R2 goes, and the short S_out is then low
   by the factor R2/(R1 + R2) whatever the short transfer of R1 (R1 R2 /
   (R1 + R2) or R1): an error of 10 log10(1.001) dB.  At 0.01 dB (a third
   is 0.077 %) it stays. */
static void test_short_divider(void)
{
    fixture f;
    gs_noise_short sh;
    int r1, r2;
    load(&f, "vsource vin in gnd\nresistor R1 in out = 1k\n"
             "resistor R2 out gnd = 1M\ntransfer Av = v(out) / vin\n");
    CHECK(f.ok);
    if (!f.ok)
        return;
    r1 = src_index(&f, "R1");
    r2 = src_index(&f, "R2");
    CHECK(short_form(&sh, &f, 0.5L, 1, 1e9L) == GS_OK);
    CHECK(sh.kept[r1] == 1 && sh.kept[r2] == 0 && sh.met);
    CHECK(close_to(sh.max_share[r2], 1 / 1001.0L, 1e-12L));
    CHECK_MSG(close_to(sh.err_out_db, 10 * log10l(1.001L), 1e-9L),
              "%Lg dB", sh.err_out_db);
    CHECK(sh.err_in_db <= 0.5L);
    gs_noise_short_clear(&sh);
    CHECK(short_form(&sh, &f, 0.01L, 1, 1e9L) == GS_OK);
    CHECK(sh.kept[r1] == 1 && sh.kept[r2] == 1 && sh.met);
    CHECK(sh.err_out_db <= 0.01L && sh.err_in_db <= 0.01L);
    gs_noise_short_clear(&sh);
    unload(&f);
}

/* An RC low-pass has nothing to leave out: one source, and a first-order
   transfer that loses either term at a large error.  The short density
   is the textbook 4kTR / (1 + (f/fc)^2) (Gray, Hurst, Lewis and Meyer,
   noise chapter, from memory), checked at three frequencies. */
static void test_short_rc(void)
{
    fixture f;
    gs_noise_short sh;
    long double r = 10e3L, c = 1e-9L, fc = 1 / (2 * acosl(-1) * r * c);
    int q;
    load(&f, "vsource vin in gnd\nresistor R in out = 10k\n"
             "capacitor C out gnd = 1n\ntransfer H = v(out) / vin\n");
    CHECK(f.ok);
    if (!f.ok)
        return;
    CHECK(short_form(&sh, &f, 0.1L, 1, 1e9L) == GS_OK);
    CHECK(sh.nsrc == 1 && sh.kept[0] == 1 && sh.met);
    CHECK(sh.err_out_db < 1e-12L && sh.err_in_db < 1e-12L);
    for (q = 0; q < 3; q++) {
        long double fr = fc * powl(10, q - 1), want, got;
        gs_noise_term t = f.nn.term[0];
        long double *num = gs_job_coeffs(&f.j, &sh.h[0].h.num, &t.dn);
        long double *den = gs_job_coeffs(&f.j, &sh.h[0].h.den, &t.dd);
        t.num = num;
        t.den = den;
        got = gs_spectrum_term(&t, fr);
        want = 4 * kT(300) * r / (1 + (fr / fc) * (fr / fc));
        CHECK_MSG(close_to(got, want, 1e-12L), "at %Lg Hz: %Lg vs %Lg", fr,
                  got, want);
        free(num);
        free(den);
    }
    gs_noise_short_clear(&sh);
    unload(&f);
}

int main(void)
{
    test_divider();
    test_rc_ktc();
    test_cs_stage();
    test_flicker(0);
    test_flicker(1);
    test_bias_params();
    test_bias_param_errors();
    test_bias_param_rules();
    test_noninverting();
    test_bjt_nf();
    test_bjt_adjoint();
    test_short_divider();
    test_short_rc();
    return check_report("noise");
}
