/* test_sens.c - normalised sensitivities. See LICENSE. */
#include <complex.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "check.h"
#include "testjob.h"
#include "gainsmith.h"
#include "analysis/job.h"
#include "analysis/sens.h"

static int load(gs_job *j, const char *path)
{
    return test_job_load(j, path);
}

static int load_text(gs_job *j, const char *text)
{
    char path[] = "/tmp/gs_test_sensXXXXXX";
    int fd = mkstemp(path), rc;
    FILE *f = fdopen(fd, "w");
    fputs(text, f);
    fclose(f);
    rc = load(j, path);
    unlink(path);
    return rc;
}

static long double sens_of(const gs_job *j, size_t i, gs_sens_kind k,
                           const char *sym)
{
    gs_sens r;
    size_t n;
    long double v = NAN;
    int id = gs_symtab_find(j->c->syms, sym);
    gs_sens_init(&r);
    gs_sens_compute(&r, &j->tf[i], j->vals, NULL, 0);
    for (n = 0; n < r.n; n++)
        if (r.fig[n].kind == k && id >= 0) {
            v = r.fig[n].s[id];
            break;
        }
    gs_sens_clear(&r);
    return v;
}

/* Unity-gain Sallen-Key low-pass: S(w0, Ri) = S(w0, Ci) = -1/2, since
   w0 = 1/sqrt(R1 R2 C1 C2) (Schaumann and Van Valkenburg, "Design of
   Analog Filters", sensitivity chapter, from memory). */
static void test_sallen_key(void)
{
    gs_job j;
    const char *sym[] = {"R1", "R2", "C1", "C2"};
    int k;
    gs_job_init(&j);
    CHECK(load(&j, "examples/sallen_key.gsc") == GS_OK);
    for (k = 0; k < 4 && j.ntf; k++)
        CHECK_MSG(fabsl(sens_of(&j, 0, GS_SENS_W0, sym[k]) + 0.5L) < 1e-15L,
                  "%s", sym[k]);
    gs_job_clear(&j);
}

/* Degenerated common source with ro -> inf: Av = -gm RD / (1 + gm RS),
   so S(Av, gm) = 1 / (1 + gm RS) (by hand from Sedra & Smith,
   "Microelectronic Circuits", ch. on MOS amplifiers). */
static void test_cs_degen(void)
{
    gs_job j;
    gs_job_init(&j);
    CHECK(load_text(&j, "vsource vin in gnd\n"
                        "mosfet M1 out in src gm=gm1 rds=inf\n"
                        "resistor RD out gnd\nresistor RS src gnd\n"
                        "value RD = 10k\nvalue RS = 1k\nvalue gm1 = 2m\n"
                        "transfer Av = v(out)/vin\n") == GS_OK);
    if (j.ntf)
        CHECK(fabsl(sens_of(&j, 0, GS_SENS_DC, "gm1") - 1.0L / 3) < 1e-15L);
    gs_job_clear(&j);
}

/* Scaling weights per symbol: z[v] the power of k a symbol takes under
   impedance scaling (R, L, transresistance times k; C, G, gm over k),
   f[v] under frequency scaling (L and C over k).  0 if a symbol is in
   elements of different classes (then *ok = 0). */
static void weights(int *z, int *f, int *ok, const gs_job *j)
{
    int nv = j->ctx->nvars, v;
    size_t e;
    int i;
    unsigned char *seen = calloc((size_t)nv, 1);
    *ok = 1;
    for (v = 0; v < nv; v++)
        z[v] = f[v] = 0;
    for (e = 0; e < j->c->nelems; e++) {
        const gs_element *el = &j->c->elems[e];
        int cz = 0, cf = 0;
        switch (el->kind) {
        case GS_RESISTOR: case GS_CCVS: cz = 1; break;
        case GS_INDUCTOR: cz = 1; cf = -1; break;
        case GS_CAPACITOR: cz = -1; cf = -1; break;
        case GS_CONDUCTANCE: case GS_VCCS: cz = -1; break;
        default: break;
        }
        if (el->kind == GS_VSOURCE || el->kind == GS_ISOURCE)
            continue;
        for (i = 0; i < el->value.n; i++) {
            v = el->value.sym[i];
            if (seen[v] && (z[v] != cz * el->value.exp[i]
                            || f[v] != cf * el->value.exp[i]))
                *ok = 0;
            seen[v] = 1;
            z[v] = cz * el->value.exp[i];
            f[v] = cf * el->value.exp[i];
        }
    }
    free(seen);
}

/* The power of k the output itself takes under impedance scaling. */
static int out_degree(const gs_job *j, size_t i)
{
    const gs_output *o = &j->c->outputs[j->out_index[i]];
    int src_i;
    if (o->kind == GS_OUT_IMPEDANCE)
        return 1;
    src_i = j->c->elems[o->in].kind == GS_ISOURCE;
    /* V/V and I/I are dimensionless; V/I an impedance; I/V an admittance */
    if (o->out.kind == GS_PROBE_V)
        return src_i ? 1 : 0;
    return src_i ? 0 : -1;
}

static long double fig_value(const gs_sens_fig *f)
{
    return creall(f->value);
}

/* Central difference of ln Q in ln x with one Richardson step:
   D(h) = (Q(x(1+h)) - Q(x(1-h))) / (2 h Q), error O(h^2), and
   (4 D(h/2) - D(h)) / 3 cancels the h^2 term (Richardson 1911). */
static long double fd_sens_loop(gs_job *j, size_t i, size_t fig, int v,
                                const long double *at, size_t nat, int loop,
                                int *ok)
{
    long double x = j->vals[v], d[2], h = 1e-3L, q0 = 0;
    int step, sgn;
    gs_sens r;
    gs_sens_init(&r);
    *ok = 1;
    for (step = 0; step < 2; step++, h /= 2) {
        long double q[2];
        for (sgn = 0; sgn < 2; sgn++) {
            j->vals[v] = x * (1 + (sgn ? -h : h));
            gs_sens_compute_loop(&r, &j->tf[i], j->vals, at, nat, loop);
            if (r.n <= fig) {
                *ok = 0;
                q[sgn] = 0;
            } else {
                q[sgn] = fig_value(&r.fig[fig]);
            }
        }
        j->vals[v] = x;
        gs_sens_compute_loop(&r, &j->tf[i], j->vals, at, nat, loop);
        q0 = fig_value(&r.fig[fig]);
        d[step] = (q[0] - q[1]) / (2 * h * q0);
    }
    gs_sens_clear(&r);
    return (4 * d[1] - d[0]) / 3;
}

static long double fd_sens(gs_job *j, size_t i, size_t fig, int v,
                           const long double *at, size_t nat, int *ok)
{
    return fd_sens_loop(j, i, fig, v, at, nat, 0, ok);
}

static void check_job(gs_job *j, const char *what, int fd)
{
    int nv = j->ctx->nvars, ok, v;
    int *z = malloc((size_t)nv * sizeof *z), *f = malloc((size_t)nv * sizeof *f);
    long double at[1] = {1e3L};
    size_t i, k;
    weights(z, f, &ok, j);
    for (i = 0; i < j->ntf; i++) {
        gs_sens r;
        gs_sens_init(&r);
        if (gs_sens_compute(&r, &j->tf[i], j->vals, at, 1) != GS_OK) {
            gs_sens_clear(&r);
            continue;
        }
        for (k = 0; k < r.n; k++) {
            const gs_sens_fig *g = &r.fig[k];
            long double sz = 0, sf = 0, ez = 0, big = 1;
            for (v = 0; v < nv; v++)
                if (r.used[v]) {
                    sz += z[v] * g->s[v];
                    sf += f[v] * g->s[v];
                    if (fabsl(g->s[v]) > big)
                        big = fabsl(g->s[v]);
                }
            if (g->kind == GS_SENS_DC || g->kind == GS_SENS_MAG)
                ez = out_degree(j, i);
            /* Frequency scaling (L, C over k) multiplies every root, w0
               and the bandwidth by k: with weight -1 on L and C the sum
               is 1, i.e. the plain sum over L and C of S is -1. */
            /* Euler's theorem on homogeneous functions: for Q(k^z x)
               = k^d Q(x), sum z_x S(Q, x) = d (a math fact). */
            if (ok && g->kind != GS_SENS_PHASE)
                CHECK_MSG(fabsl(sz - ez) < 1e-9L * big, "%s %s fig %zu: "
                          "impedance sum %Lg, want %Lg", what,
                          j->tf[i].name, k, sz, ez);
            if (ok && g->kind != GS_SENS_MAG && g->kind != GS_SENS_PHASE) {
                long double ef = g->kind == GS_SENS_DC || g->kind == GS_SENS_Q
                                 || g->kind == GS_SENS_ZQ ? 0 : 1;
                CHECK_MSG(fabsl(sf - ef) < 1e-9L * big, "%s %s fig %zu: "
                          "frequency sum %Lg, want %Lg", what,
                          j->tf[i].name, k, sf, ef);
            }
            for (v = 0; fd && v < nv; v++) {
                long double s;
                int fok;
                if (!r.used[v])
                    continue;
                s = fd_sens(j, i, k, v, at, 1, &fok);
                if (fok)
                    CHECK_MSG(fabsl(s - g->s[v]) < 1e-6L * (1 + fabsl(s)),
                              "%s %s fig %zu sym %s: exact %Lg, difference "
                              "%Lg", what, j->tf[i].name, k,
                              gs_symtab_name(j->c->syms, v), g->s[v], s);
            }
        }
        gs_sens_clear(&r);
    }
    free(z);
    free(f);
}

static void test_examples(void)
{
    static const char *const ex[] = {
        "bjt_ce_degen", "cascode", "cs_biased", "cs_degen", "inverting_amp",
        "sallen_key", "source_follower", "miller_opamp"
    };
    size_t e;
    char path[128];
    for (e = 0; e < sizeof ex / sizeof ex[0]; e++) {
        gs_job j;
        gs_job_init(&j);
        snprintf(path, sizeof path, "examples/%s.gsc", ex[e]);
        CHECK_MSG(load(&j, path) == GS_OK, "%s", path);
        check_job(&j, path, 1);
        gs_job_clear(&j);
    }
}

/* Knuth's 64-bit linear congruential generator (TAOCP vol. 2, 3.3.4). */
static int rnd(unsigned long long *seed)
{
    *seed = *seed * 6364136223846793005ULL + 1442695040888963407ULL;
    return (int)((*seed >> 33) % 1000);
}

/* 50 random RC/transconductance circuits (seeded LCG). */
static void test_random(void)
{
    unsigned long long seed = 12345;
    int c, loaded = 0;
    for (c = 0; c < 50; c++) {
        char text[2048], name[32];
        size_t n = 0;
        int e, a, b;
        gs_job j;
        n += (size_t)snprintf(text + n, sizeof text - n,
                              "vsource vin 1 gnd\n");
        for (e = 0; e < 4; e++)
            n += (size_t)snprintf(text + n, sizeof text - n,
                                  "resistor Ra%d %d %d\nvalue Ra%d = %dk\n"
                                  "resistor Rb%d %d gnd\nvalue Rb%d = %dk\n",
                                  e, e + 1, e + 2, e, 1 + rnd(&seed) % 90,
                                  e, e + 2, e, 1 + rnd(&seed) % 90);
        for (e = 0; e < 3; e++) {
            a = 1 + rnd(&seed) % 5;
            b = rnd(&seed) % 6;
            if (b == a)
                b = 0;
            n += (size_t)snprintf(text + n, sizeof text - n,
                                  "capacitor C%d %d %d\nvalue C%d = %dn\n",
                                  e, a, b, e, 1 + rnd(&seed) % 90);
        }
        if (rnd(&seed) % 2)
            n += (size_t)snprintf(text + n, sizeof text - n,
                                  "vccs g1 %d gnd %d gnd\nvalue g1 = %du\n",
                                  2 + rnd(&seed) % 4, 1 + rnd(&seed) % 4,
                                  1 + rnd(&seed) % 50);
        snprintf(text + n, sizeof text - n, "transfer H = v(5)/vin\n");
        snprintf(name, sizeof name, "random %d (seed 12345)", c);
        gs_job_init(&j);
        if (load_text(&j, text) == GS_OK) {
            loaded++;
            check_job(&j, name, c < 10);
        }
        gs_job_clear(&j);
    }
    CHECK_MSG(loaded >= 45, "only %d of 50 random circuits derived", loaded);
}

/* The loop figures of output 0 of j: *ugf, *pm their indices in r. */
static void loop_figs(gs_sens *r, size_t *ugf, size_t *pm, gs_job *j)
{
    size_t k;
    *ugf = *pm = (size_t)-1;
    gs_sens_init(r);
    CHECK(gs_sens_compute_loop(r, &j->tf[0], j->vals, NULL, 0, 1) == GS_OK);
    for (k = 0; k < r->n; k++) {
        if (r->fig[k].kind == GS_SENS_UGF)
            *ugf = k;
        if (r->fig[k].kind == GS_SENS_PM)
            *pm = k;
    }
    CHECK(*ugf < r->n && *pm < r->n);
}

static long double sym_s(const gs_sens *r, size_t k, const gs_job *j,
                         const char *sym)
{
    int id = gs_symtab_find(j->c->syms, sym);
    return id >= 0 && k < r->n ? r->fig[k].s[id] : NAN;
}

/* Every loop sensitivity against a central difference with Richardson's
   step, and the scaling sums: wu and PM of a dimensionless T are
   unchanged by impedance scaling (Euler's theorem: sum z S = 0), and
   frequency scaling (C over k) multiplies wu by k and leaves PM (sum
   over C of S(wu) = -1, of S(PM) = 0); a math fact. */
static void check_loop(gs_job *j, const char *what)
{
    int nv = j->ctx->nvars, ok, fok, v;
    int *z = malloc((size_t)nv * sizeof *z), *f = malloc((size_t)nv * sizeof *f);
    size_t ks[2], n;
    gs_sens r;
    weights(z, f, &ok, j);
    loop_figs(&r, &ks[0], &ks[1], j);
    for (n = 0; n < 2 && ks[n] < r.n; n++) {
        const gs_sens_fig *g = &r.fig[ks[n]];
        long double sz = 0, sf = 0;
        for (v = 0; v < nv; v++) {
            long double d;
            if (!r.used[v])
                continue;
            sz += z[v] * g->s[v];
            sf += f[v] * g->s[v];
            d = fd_sens_loop(j, 0, ks[n], v, NULL, 0, 1, &fok);
            CHECK(fok);
            CHECK_MSG(fabsl(d - g->s[v]) < 1e-6L * (1 + fabsl(d)),
                      "%s %s sym %s: exact %Lg, difference %Lg", what,
                      gs_sens_kind_name(g->kind),
                      gs_symtab_name(j->c->syms, v), g->s[v], d);
        }
        CHECK_MSG(ok && fabsl(sz) < 1e-12L, "%s %s: impedance sum %Lg", what,
                  gs_sens_kind_name(g->kind), sz);
        CHECK_MSG(fabsl(sf - (n == 0 ? 1 : 0)) < 1e-12L,
                  "%s %s: frequency sum %Lg", what,
                  gs_sens_kind_name(g->kind), sf);
    }
    gs_sens_clear(&r);
    free(z);
    free(f);
}

/* A single-pole loop T = A0/(1 + s/p), A0 = G1 R1 E1, p = 1/(R1 C1).
   |T(j wu)| = 1 gives wu = p sqrt(A0^2 - 1), so S(wu, A0) = A0^2/(A0^2 -
   1), and through A0 and p, S(wu, R1) = 1/(A0^2 - 1), S(wu, C1) = -1;
   PM = 180 deg - atan(wu/p) = 180 deg - atan(sqrt(A0^2 - 1)), so
   A0 dPM/dA0 = -1/sqrt(A0^2 - 1) (in radians).  Math facts, worked out
   by hand. */
static void test_loop_one_pole(void)
{
    static const char *const text =
        "isource iin gnd a\nvccs G1 gnd b a gnd\nresistor R1 b gnd\n"
        "capacitor C1 b gnd\nvcvs E1 a gnd gnd b\n"
        "value G1 = 10m\nvalue R1 = 1k\nvalue C1 = 1u\nvalue E1 = 1\n"
        "loopgain T = G1\n";
    const long double a0 = 10, p = 1000, pi = acosl(-1);
    const long double wu = p * sqrtl(a0 * a0 - 1);
    const long double pm = pi - atanl(sqrtl(a0 * a0 - 1));
    gs_job j;
    gs_sens r;
    size_t ku, kp;
    gs_job_init(&j);
    CHECK(load_text(&j, text) == GS_OK);
    if (j.ntf == 1) {
        loop_figs(&r, &ku, &kp, &j);
        CHECK(fabsl(creall(r.fig[ku].value) / wu - 1) < 1e-15L);
        CHECK(fabsl(creall(r.fig[kp].value) / (pm * 180 / pi) - 1) < 1e-15L);
        CHECK(fabsl(sym_s(&r, ku, &j, "E1") - a0 * a0 / (a0 * a0 - 1))
              < 1e-15L);
        CHECK(fabsl(sym_s(&r, ku, &j, "G1") - a0 * a0 / (a0 * a0 - 1))
              < 1e-15L);
        CHECK(fabsl(sym_s(&r, ku, &j, "R1") - 1 / (a0 * a0 - 1)) < 1e-15L);
        CHECK(fabsl(sym_s(&r, ku, &j, "C1") + 1) < 1e-15L);
        CHECK(fabsl(sym_s(&r, kp, &j, "E1")
                    + 1 / (sqrtl(a0 * a0 - 1) * pm)) < 1e-15L);
        gs_sens_clear(&r);
        check_loop(&j, "one-pole loop");
    }
    gs_job_clear(&j);
}

/* A two-pole loop T = A0/((1 + s/p1)(1 + s/p2)): the textbook phase
   margin PM = 180 deg - atan(wu/p1) - atan(wu/p2), with wu^2 the
   positive root u of u^2/(p1 p2)^2 + u (1/p1^2 + 1/p2^2) + 1 - A0^2 = 0
   (Gray, Hurst, Lewis and Meyer, "Analysis and Design of Analog
   Integrated Circuits", frequency response of feedback amplifiers,
   from memory). */
static void test_loop_two_pole(void)
{
    static const char *const text =
        "isource iin gnd a\nvccs G1 gnd b a gnd\nresistor R1 b gnd\n"
        "capacitor C1 b gnd\nvccs G2 gnd c b gnd\nresistor R2 c gnd\n"
        "capacitor C2 c gnd\nvcvs E1 a gnd gnd c\n"
        "value G1 = 10m\nvalue R1 = 1k\nvalue C1 = 1u\nvalue G2 = 2m\n"
        "value R2 = 10k\nvalue C2 = 1n\nvalue E1 = 1\nloopgain T = G1\n";
    const long double a0 = 10 * 20, p1 = 1e3L, p2 = 1e5L, pi = acosl(-1);
    const long double qa = 1 / (p1 * p1 * p2 * p2);
    const long double qb = 1 / (p1 * p1) + 1 / (p2 * p2), qc = 1 - a0 * a0;
    const long double wu = sqrtl((-qb + sqrtl(qb * qb - 4 * qa * qc))
                                 / (2 * qa));
    const long double pm = 180 - (atanl(wu / p1) + atanl(wu / p2)) * 180 / pi;
    gs_job j;
    gs_sens r;
    size_t ku, kp;
    gs_job_init(&j);
    CHECK(load_text(&j, text) == GS_OK);
    if (j.ntf == 1) {
        loop_figs(&r, &ku, &kp, &j);
        CHECK_MSG(fabsl(creall(r.fig[ku].value) / wu - 1) < 1e-13L,
                  "wu %Lg, want %Lg", creall(r.fig[ku].value), wu);
        CHECK_MSG(fabsl(creall(r.fig[kp].value) / pm - 1) < 1e-13L,
                  "pm %Lg, want %Lg", creall(r.fig[kp].value), pm);
        gs_sens_clear(&r);
        check_loop(&j, "two-pole loop");
    }
    gs_job_clear(&j);
}

/* S(Q_fig, DEV.FIG) by the chain, for figure index fig of output 0. */
static long double chain_of(const gs_job *j, size_t fig, const char *dev,
                            const char *key, long double *link_gm)
{
    gs_bias_link *l;
    gs_sens r;
    size_t nl, k, m = 0, start = 0;
    long double v = NAN;
    gs_sens_bias_links(&l, &nl, j);
    for (k = 0; k < nl; k++)
        if (strcmp(l[k].device, dev) == 0 && strcmp(l[k].figure, key) == 0) {
            if (m++ == 0)
                start = k;
            if (link_gm && strcmp(l[k].part, "gm") == 0)
                *link_gm = l[k].s;
        }
    gs_sens_init(&r);
    gs_sens_compute(&r, &j->tf[0], j->vals, NULL, 0);
    if (m && fig < r.n)
        v = gs_sens_chain(&r, &r.fig[fig], l + start, m);
    gs_sens_clear(&r);
    free(l);
    return v;
}

/* Figure fig of output 0 of the circuit tmpl with its %.18Lg replaced by x
   (the bias figure), bound again: the bias line recomputes gm, rds, ...
   through the model. */
static long double fig_at_bias(const char *tmpl, long double x, size_t fig,
                               int *ok)
{
    char text[2048];
    gs_job j;
    gs_sens r;
    long double v = NAN;
    snprintf(text, sizeof text, tmpl, x);
    gs_job_init(&j);
    gs_sens_init(&r);
    *ok = load_text(&j, text) == GS_OK && j.ntf >= 1;
    if (*ok) {
        gs_sens_compute(&r, &j.tf[0], j.vals, NULL, 0);
        *ok = fig < r.n;
        if (*ok)
            v = fig_value(&r.fig[fig]);
    }
    gs_sens_clear(&r);
    gs_job_clear(&j);
    return v;
}

/* The whole chain against a central difference of ln Q in ln F with one
   Richardson step (as fd_sens), each step re-binding the bias line. */
static long double fd_bias(const char *tmpl, long double x, size_t fig,
                           int *ok)
{
    long double d[2], h = 1e-3L, q0;
    int step, ok1, ok2, ok0;
    q0 = fig_at_bias(tmpl, x, fig, &ok0);
    *ok = ok0;
    for (step = 0; step < 2; step++, h /= 2) {
        long double qp = fig_at_bias(tmpl, x * (1 + h), fig, &ok1);
        long double qm = fig_at_bias(tmpl, x * (1 - h), fig, &ok2);
        *ok = *ok && ok1 && ok2;
        d[step] = (qp - qm) / (2 * h * q0);
    }
    return (4 * d[1] - d[0]) / 3;
}

/* A common-source stage with a load capacitor, biased by the square law
   with channel-length modulation; each figure of the bias line in turn
   is the %.18Lg. */
static void test_bias_chain(void)
{
    static const char *const head =
        "vsource vin in gnd\nmosfet M1 out in gnd gm=gm1 rds=ro1\n"
        "resistor RD out gnd\ncapacitor CL out gnd\nvalue RD = 10k\n"
        "value CL = 1p\ntransfer Av = v(out)/vin\n";
    static const char *const bjt =
        "vsource vin in gnd\nresistor RS in b\nvalue RS = 2k\n"
        "bjt Q1 out b gnd gm=gmq rpi=rpiq ro=roq cpi=cpiq cmu=cmuq\n"
        "resistor RC out gnd\nvalue RC = 5k\ntransfer Av = v(out)/vin\n";
    static const char *const bq =
        "bias Q1 ic=%s vce=%s beta=%s va=%s ft=%s cmu=%s temp=%s\n";
    static const struct { const char *key, *line; long double x; } fig[] = {
        {"id", "bias M1 id=%.18Lg vds=1.5 k=4m lambda=0.05\n", 200e-6L},
        {"k", "bias M1 id=200u vds=1.5 k=%.18Lg lambda=0.05\n", 4e-3L},
        {"vds", "bias M1 id=200u vds=%.18Lg k=4m lambda=0.05\n", 1.5L},
        {"lambda", "bias M1 id=200u vds=1.5 k=4m lambda=%.18Lg\n", 0.05L},
        {"id", "bias M1 id=%.18Lg vds=1.5 vov=0.3 lambda=0.05\n", 200e-6L},
        {"vov", "bias M1 id=200u vds=1.5 vov=%.18Lg lambda=0.05\n", 0.3L},
        {"vgs", "bias M1 id=200u vds=1.5 vgs=%.18Lg vth=0.45 lambda=0.05\n",
         0.8L},
        {"vth", "bias M1 k=4m vds=1.5 vgs=0.8 vth=%.18Lg lambda=0.05\n",
         0.45L},
        {"k", "bias M1 k=%.18Lg vds=1.5 vov=0.3 lambda=0.05\n", 4e-3L},
        {"vds", "bias M1 k=4m vds=%.18Lg vov=0.3 lambda=0.05\n", 1.5L},
    };
    static const char *const bnom[7] = {"1m", "3", "120", "50", "400M",
                                        "0.5p", "300"};
    static const char *const bkey[7] = {"ic", "vce", "beta", "va", "ft",
                                        "cmu", "temp"};
    static const long double bx[7] = {1e-3L, 3, 120, 50, 400e6L, 0.5e-12L,
                                      300};
    char tmpl[1024], text[1024], line[256];
    const char *bv[7];
    size_t c, k, nm = sizeof fig / sizeof fig[0];
    for (c = 0; c < nm + 7; c++) {
        gs_job j;
        gs_sens r;
        const char *key;
        long double x;
        if (c < nm) {
            key = fig[c].key;
            x = fig[c].x;
            snprintf(tmpl, sizeof tmpl, "%s%s", head, fig[c].line);
        } else {
            /* the BJT: each figure of its bias line in turn */
            for (k = 0; k < 7; k++)
                bv[k] = k == c - nm ? "%.18Lg" : bnom[k];
            snprintf(line, sizeof line, bq, bv[0], bv[1], bv[2], bv[3],
                     bv[4], bv[5], bv[6]);
            key = bkey[c - nm];
            x = bx[c - nm];
            snprintf(tmpl, sizeof tmpl, "%s%s", bjt, line);
        }
        snprintf(text, sizeof text, tmpl, x);
        gs_job_init(&j);
        gs_sens_init(&r);
        CHECK_MSG(load_text(&j, text) == GS_OK, "%s", tmpl);
        if (j.ntf)
            gs_sens_compute(&r, &j.tf[0], j.vals, NULL, 0);
        /* dc and the pole: every figure of the stage */
        for (k = 0; j.ntf && k < r.n; k++) {
            int ok;
            long double ex = chain_of(&j, k, c < nm ? "M1" : "Q1", key,
                                      NULL);
            long double fd = fd_bias(tmpl, x, k, &ok);
            CHECK(ok);
            CHECK_MSG(fabsl(ex - fd) < 1e-6L * (1 + fabsl(fd)),
                      "%s fig %zu: chain %Lg, difference %Lg", tmpl, k, ex,
                      fd);
        }
        CHECK_MSG(r.n >= 2, "%s: %zu figures", tmpl, r.n);
        gs_sens_clear(&r);
        gs_job_clear(&j);
    }
}

/* The square law gm = sqrt(2 K ID) (lambda = 0) gives S(gm, ID) = 1/2
   (Sedra and Smith, "Microelectronic Circuits", MOSFET chapter, from
   memory); with rds dropped Av = -gm RD, so S(Av, ID) = 1/2 too.  The
   BJT's gm = IC/VT gives S(gm, IC) = 1 (the same book, BJT chapter):
   with ro dropped, Av = -gm RC, S(Av, IC) = 1 and S(Av, T) = -1. */
static void test_bias_facts(void)
{
    gs_job j;
    long double link = NAN;
    gs_job_init(&j);
    CHECK(load_text(&j, "vsource vin in gnd\n"
                        "mosfet M1 out in gnd gm=gm1 rds=inf\n"
                        "bias M1 id=150u vds=2 k=3m\n"
                        "resistor RD out gnd\nvalue RD = 20k\n"
                        "transfer Av = v(out)/vin\n") == GS_OK);
    if (j.ntf) {
        CHECK(fabsl(chain_of(&j, 0, "M1", "id", &link) - 0.5L) < 1e-15L);
        CHECK(fabsl(link - 0.5L) < 1e-15L);
        CHECK(fabsl(chain_of(&j, 0, "M1", "k", NULL) - 0.5L) < 1e-15L);
    }
    gs_job_clear(&j);
    gs_job_init(&j);
    CHECK(load_text(&j, "vsource vin in gnd\n"
                        "bjt Q1 out in gnd gm=gmq rpi=rpiq\n"
                        "bias Q1 ic=1m vce=3 beta=120 temp=310\n"
                        "resistor RC out gnd\nvalue RC = 5k\n"
                        "transfer Av = v(out)/vin\n") == GS_OK);
    if (j.ntf) {
        CHECK(fabsl(chain_of(&j, 0, "Q1", "ic", &link) - 1) < 1e-15L);
        CHECK(fabsl(link - 1) < 1e-15L);
        CHECK(fabsl(chain_of(&j, 0, "Q1", "temp", NULL) + 1) < 1e-15L);
    }
    gs_job_clear(&j);
}

int main(void)
{
    test_bias_facts();
    test_bias_chain();
    test_loop_one_pole();
    test_loop_two_pole();
    test_sallen_key();
    test_cs_degen();
    test_examples();
    test_random();
    return check_report("sens");
}
