/* test_derive.c - exact derivations against published closed forms.
 * See LICENSE.
 *
 * Each case is a small circuit whose transfer function a standard textbook
 * gives in closed form.  The comparison is an exact polynomial identity,
 * N * D_book == N_book * D, not a check at a point; and our result must be
 * in lowest terms with the denominator's leading term positive; and,
 * without a limit, agree with an independent numeric solve of the circuit.
 */
#include "check.h"
#include "circuit/circuit.h"
#include "analysis/derive.h"
#include "analysis/job.h"
#include "analysis/mna.h"
#include "numeric/numsolve.h"
#include "algebra/poly.h"

#include <complex.h>
#include <math.h>

#include <stdlib.h>
#include <string.h>

/* The exact result against the independent numeric solve (numsolve.c) at
   a few points s = j w, with every symbol bound to an arbitrary positive
   number: the same circuit, two unrelated solution paths. */
static int agrees_numerically(const gs_tf *tf, const gs_circuit *c,
                              size_t out, const gs_polyctx *ctx)
{
    int nv = ctx->nvars, v, ok = 1, k;
    long double *vals = calloc((size_t)nv, sizeof *vals);
    long double complex *cv = calloc((size_t)nv, sizeof *cv);
    static const long double w[] = {0.3L, 1.7L, 11.0L};
    gs_diag d;
    gs_diag_init(&d);
    for (v = 0; v < nv; v++)
    {
        vals[v] = 1.0L + 0.37L * (long double)v;
        cv[v] = vals[v];
    }
    for (k = 0; k < 3 && ok; k++) {
        long double complex s = w[k] * I, h_num, h_exact;
        cv[c->s_sym] = s;
        h_exact = gs_poly_eval_lc(&tf->num, cv, ctx)
                / gs_poly_eval_lc(&tf->den, cv, ctx);
        ok = gs_numsolve(&h_num, c, out, vals, s, &d) == GS_OK
             && cabsl(h_exact - h_num) <= 1e-12L * (1 + cabsl(h_num));
    }
    gs_diag_clear(&d);
    free(vals);
    free(cv);
    return ok;
}

/* Derive output `name` of circuit text and compare with book_n/book_d
   (in the syntax of gs_poly_set_str).  Returns 1 when identical. */
static int same_ratio(const char *text, const char *name, const char *book_n,
                      const char *book_d, const char *limit_sym, int to_inf)
{
    gs_circuit *c = gs_circuit_new();
    gs_polyctx *ctx = NULL;
    gs_diag d;
    gs_tf tf;
    gs_poly bn, bd, l, r;
    gs_derive_opts o;
    gs_limit lim;
    int ok = 0, idx;

    gs_diag_init(&d);
    gs_poly_init(&bn);
    gs_poly_init(&bd);
    gs_poly_init(&l);
    gs_poly_init(&r);
    if (gs_parse_string(c, "case.gsc", text, &d) != GS_OK) {
        gs_diag_print(stderr, &d);
        goto done;
    }
    gs_mna_intern_symbols(c);
    ctx = gs_polyctx_new(c->syms, gs_symtab_count(c->syms));
    gs_tf_init(&tf, ctx, c->s_sym);
    gs_derive_opts_default(&o);
    if (limit_sym) {
        lim.sym = gs_symtab_find(c->syms, limit_sym);
        lim.to_inf = to_inf;
        o.limits = &lim;
        o.nlimits = 1;
    }
    idx = gs_circuit_find_output(c, name);
    if (idx >= 0 && gs_derive(&tf, c, (size_t)idx, ctx, &o, NULL, &d) == GS_OK
        && gs_poly_set_str(&bn, book_n, ctx) == GS_OK
        && gs_poly_set_str(&bd, book_d, ctx) == GS_OK) {
        gs_poly_mul(&l, &tf.num, &bd, ctx);
        gs_poly_mul(&r, &bn, &tf.den, ctx);
        ok = gs_poly_equal(&l, &r, ctx) && gs_poly_sgn(&tf.den) > 0
             && (limit_sym != NULL
                 || agrees_numerically(&tf, c, (size_t)idx, ctx));
        if (!ok) {
            char *n = gs_poly_get_str(&tf.num, ctx);
            char *dd = gs_poly_get_str(&tf.den, ctx);
            fprintf(stderr, "%s: got (%s)/(%s), book (%s)/(%s)\n", name, n,
                    dd, book_n, book_d);
            free(n);
            free(dd);
        }
    } else {
        gs_diag_print(stderr, &d);
    }
    gs_tf_clear(&tf);
done:
    gs_poly_clear(&bn);
    gs_poly_clear(&bd);
    gs_poly_clear(&l);
    gs_poly_clear(&r);
    gs_polyctx_free(ctx);
    gs_circuit_free(c);
    gs_diag_clear(&d);
    return ok;
}

static void test_passive(void)
{
    /* Voltage divider: R2/(R1+R2) (Ohm's law; any circuits text). */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in out\n"
                     "resistor R2 out gnd\ntransfer H = v(out) / vin\n",
                     "H", "R2", "R1 + R2", NULL, 0));
    /* First-order RC low-pass: 1/(1 + sRC) (Nilsson & Riedel, Electric
       Circuits, first-order circuits, from memory). */
    CHECK(same_ratio("vsource vin in gnd\nresistor R in out\n"
                     "capacitor C out gnd\ntransfer H = v(out) / vin\n",
                     "H", "1", "R*C*s + 1", NULL, 0));
    /* RL high-pass: sL/(R + sL). */
    CHECK(same_ratio("vsource vin in gnd\nresistor R in out\n"
                     "inductor L out gnd\ntransfer H = v(out) / vin\n",
                     "H", "L*s", "L*s + R", NULL, 0));
    /* Wheatstone bridge: v(a,b)/vin = R2/(R1+R2) - R4/(R3+R4). */
    CHECK(same_ratio("vsource vin t gnd\nresistor R1 t a\nresistor R2 a gnd\n"
                     "resistor R3 t b\nresistor R4 b gnd\n"
                     "transfer H = v(a, b) / vin\n", "H",
                     "R2*R3 - R1*R4", "(R1 + R2)*(R3 + R4)", NULL, 0));
    /* Series RLC, output across R: sRC/(s^2 LC + sRC + 1) (band-pass
       section; Nilsson & Riedel, from memory). */
    CHECK(same_ratio("vsource vin a gnd\ninductor L a b\ncapacitor C b out\n"
                     "resistor R out gnd\ntransfer H = v(out) / vin\n",
                     "H", "R*C*s", "L*C*s^2 + R*C*s + 1", NULL, 0));
    /* Parallel RC impedance: R/(1 + sRC). */
    CHECK(same_ratio("resistor R a gnd\ncapacitor C a gnd\n"
                     "impedance Z = a, gnd\n", "Z", "R", "R*C*s + 1",
                     NULL, 0));
    /* Current divider: i(R2)/iin = R1/(R1+R2). */
    CHECK(same_ratio("isource iin gnd a\nresistor R1 a gnd\n"
                     "resistor R2 a gnd\ntransfer H = i(R2) / iin\n",
                     "H", "R1", "R1 + R2", NULL, 0));
    /* Rational and product values: R1 = 2*Rx, R2 = Rx/2 gives
       (Rx/2)/(2Rx + Rx/2) = 1/5. */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in out = 2*Rx\n"
                     "resistor R2 out gnd = Rx/2\ntransfer H = v(out) / vin\n",
                     "H", "1", "5", NULL, 0));
}

static void test_amplifiers(void)
{
    /* Inverting amplifier with finite open-loop gain A:
       -A R2/(R1 + R2 + A R1) (Sedra & Smith, Microelectronic Circuits,
       ch. 2, from memory). */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in n\n"
                     "resistor R2 n out\nvcvs A out gnd gnd n\n"
                     "transfer H = v(out) / vin\n", "H", "-A*R2",
                     "A*R1 + R1 + R2", NULL, 0));
    /* ... and its limit A -> inf: -R2/R1. */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in n\n"
                     "resistor R2 n out\nvcvs A out gnd gnd n\n"
                     "transfer H = v(out) / vin\n", "H", "-R2", "R1",
                     "A", 1));
    /* Non-inverting amplifier, finite A: A(R1+R2)/(R1 + R2 + A R1)
       (Sedra & Smith, ch. 2, from memory). */
    CHECK(same_ratio("vsource vin p gnd\nresistor R1 n gnd\n"
                     "resistor R2 n out\nvcvs A out gnd p n\n"
                     "transfer H = v(out) / vin\n", "H", "A*(R1 + R2)",
                     "A*R1 + R1 + R2", NULL, 0));
    /* Ideal op-amp (nullor) inverting amplifier: -R2/R1. */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in n\n"
                     "resistor R2 n out\nopamp U1 out gnd n\n"
                     "transfer H = v(out) / vin\n", "H", "-R2", "R1",
                     NULL, 0));
    /* Unity-gain Sallen-Key low-pass:
       1/(s^2 R1 R2 C1 C2 + s C2 (R1 + R2) + 1) (Sallen & Key 1955;
       Williams & Taylor, Electronic Filter Design Handbook, from memory). */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in a\n"
                     "resistor R2 a b\ncapacitor C1 a out\n"
                     "capacitor C2 b gnd\nopamp U1 out b out\n"
                     "transfer H = v(out) / vin\n", "H", "1",
                     "R1*R2*C1*C2*s^2 + C2*(R1 + R2)*s + 1", NULL, 0));
}

static void test_transistors(void)
{
    /* Degenerated common-source stage with rds:
       -gm ro RD/(RD + RS + ro + gm ro RS) (Razavi, Design of Analog CMOS
       Integrated Circuits, ch. 3, from memory). */
    const char *cs = "vsource vin in gnd\nmosfet M1 out in src gm=gm "
                     "rds=ro\nresistor RD out gnd\nresistor RS src gnd\n"
                     "transfer Av = v(out) / vin\n";
    CHECK(same_ratio(cs, "Av", "-gm*ro*RD", "RD + RS + ro + gm*ro*RS",
                     NULL, 0));
    /* ... rds -> inf gives -gm RD/(1 + gm RS) (same source). */
    CHECK(same_ratio(cs, "Av", "-gm*RD", "gm*RS + 1", "ro", 1));
    /* Cascode output resistance: ro1 + ro2 + gm2 ro2 ro1 (Razavi, ch. 3,
       from memory; no body effect). */
    CHECK(same_ratio("mosfet M1 mid gnd gnd gm=gm1 rds=ro1\n"
                     "mosfet M2 out gnd mid gm=gm2 rds=ro2\n"
                     "impedance Rout = out, gnd\n", "Rout",
                     "ro1 + ro2 + gm2*ro1*ro2", "1", NULL, 0));
    /* Source follower with body effect:
       gm/(gm + gmb + 1/ro + 1/RL) (Razavi, ch. 3, from memory). */
    CHECK(same_ratio("vsource vin in gnd\nmosfet M1 gnd in out gnd gm=gm "
                     "rds=ro gmb=gmb\nresistor RL out gnd\n"
                     "transfer Av = v(out) / vin\n", "Av", "gm*ro*RL",
                     "ro + RL + (gm + gmb)*ro*RL", NULL, 0));
    /* Common-source stage with Cgd, ideal gate drive:
       RD (s Cgd - gm)/(1 + s RD (Cgd + CL)): a right-half-plane zero at
       gm/Cgd (Razavi, ch. 6, from memory). */
    CHECK(same_ratio("vsource vin g gnd\nmosfet M1 out g gnd gm=gm rds=inf "
                     "cgd=Cgd\nresistor RD out gnd\ncapacitor CL out gnd\n"
                     "transfer Av = v(out) / vin\n", "Av",
                     "RD*(Cgd*s - gm)", "RD*(Cgd + CL)*s + 1", NULL, 0));
    /* BJT common emitter with emitter degeneration, no ro:
       -beta RC/(rpi + (beta + 1) RE) with beta = gm rpi (Sedra & Smith,
       ch. on BJT amplifiers, from memory). */
    CHECK(same_ratio("vsource vin b gnd\nbjt Q1 c b e gm=gm rpi=rpi\n"
                     "resistor RC c gnd\nresistor RE e gnd\n"
                     "transfer Av = v(c) / vin\n", "Av", "-gm*rpi*RC",
                     "rpi + RE + gm*rpi*RE", NULL, 0));
}

static void test_controlled_sources(void)
{
    /* CCCS driven by the current of a resistor: i(R1) = vin/R1, the
       output current beta*vin/R1 into RL gives v(out) = -beta RL/R1 with
       the CCCS pulling current out of node out (KCL). */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in gnd\n"
                     "cccs beta out gnd R1\nresistor RL out gnd\n"
                     "transfer H = v(out) / vin\n", "H", "-beta*RL", "R1",
                     NULL, 0));
    /* CCVS (transresistance rm) controlled by a source's current: the
       current of vin is -vin/R1 (it flows from in through R1 back into
       the source's negative node), so v(out) = -rm/R1 * vin. */
    CHECK(same_ratio("vsource vin in gnd\nresistor R1 in gnd\n"
                     "ccvs rm out gnd vin\nresistor RL out gnd\n"
                     "transfer H = v(out) / vin\n", "H", "-rm", "R1",
                     NULL, 0));
    /* VCCS into a load: -gm RL. */
    CHECK(same_ratio("vsource vin in gnd\nvccs gm out gnd in gnd\n"
                     "resistor RL out gnd\ntransfer H = v(out) / vin\n",
                     "H", "-gm*RL", "1", NULL, 0));
}

/* A run over several outputs where one has no finite limit: that one is
   left out with its message, the others derived.  Zs = v(a)/isens = Rin
   (Ohm's law) grows without bound as Rin -> inf; Av = v(out)/vin =
   Rin/(R1 + Rin) (voltage divider) tends to 1, and Zt = v(out)/it with
   vin at zero is R1 || Rin = R1 Rin/(R1 + Rin) (parallel resistors),
   which tends to R1. */
static const char partial_text[] =
    "isource isens gnd a\nresistor Ra a gnd = Rin\n"
    "vsource vin in gnd\nresistor R1 in out\n"
    "resistor Rb out gnd = Rin\nisource it gnd out\n"
    "transfer Zs = v(a) / isens\ntransfer Av = v(out) / vin\n"
    "transfer Zt = v(out) / it\n";

/* tf == n/d as polynomials in lowest terms: cross-multiplied. */
static int tf_is(const gs_tf *tf, const char *n, const char *d,
                 const gs_polyctx *ctx)
{
    gs_poly bn, bd, l, r;
    int ok;
    gs_poly_init(&bn);
    gs_poly_init(&bd);
    gs_poly_init(&l);
    gs_poly_init(&r);
    ok = gs_poly_set_str(&bn, n, ctx) == GS_OK
         && gs_poly_set_str(&bd, d, ctx) == GS_OK;
    if (ok) {
        gs_poly_mul(&l, &tf->num, &bd, ctx);
        gs_poly_mul(&r, &bn, &tf->den, ctx);
        ok = gs_poly_equal(&l, &r, ctx);
    }
    gs_poly_clear(&bn);
    gs_poly_clear(&bd);
    gs_poly_clear(&l);
    gs_poly_clear(&r);
    return ok;
}

static int derive_partial(gs_job *j, gs_diag *d, const char *only,
                          int to_inf)
{
    gs_derive_opts o;
    gs_limit lim;
    gs_job_init(j);
    gs_diag_init(d);
    gs_derive_opts_default(&o);
    if (gs_job_load_string(j, "probe.gsc", partial_text, d) != GS_OK)
        return GS_ESYNTAX;
    lim.sym = gs_symtab_find(j->c->syms, "Rin");
    lim.to_inf = to_inf;
    o.limits = &lim;
    o.nlimits = 1;
    return gs_job_derive(j, only, &o, d);
}

static void test_partial_limit(void)
{
    gs_job j;
    gs_diag d;
    /* Rin -> inf: Zs left out, Av -> 1 and Zt -> R1 (above) */
    CHECK(derive_partial(&j, &d, NULL, 1) == GS_ERANGE);
    CHECK(j.partial == 1);
    CHECK(j.ntf == 2);
    if (j.ntf == 2) {
        CHECK(strcmp(j.tf[0].name, "Av") == 0 && j.out_index[0] == 1);
        CHECK(tf_is(&j.tf[0], "1", "1", j.ctx));
        CHECK(strcmp(j.tf[1].name, "Zt") == 0 && j.out_index[1] == 2);
        CHECK(tf_is(&j.tf[1], "R1", "1", j.ctx));
    }
    CHECK(d.n == 1 && strstr(d.v[0].message, "Zs has no finite limit") != NULL);
    gs_diag_clear(&d);
    gs_job_clear(&j);
    /* Rin -> 0 is finite for all three: Zs -> 0, Av -> 0, Zt -> 0 */
    CHECK(derive_partial(&j, &d, NULL, 0) == GS_OK);
    CHECK(j.partial == 0 && j.ntf == 3);
    gs_diag_clear(&d);
    gs_job_clear(&j);
    /* only the failing one: nothing derived, and no partial result */
    CHECK(derive_partial(&j, &d, "Zs", 1) == GS_ERANGE);
    CHECK(j.partial == 0 && j.ntf == 0);
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

/* An RC ladder of n sections, R = 1k and C = 1n in each; numeric on the
   element lines, or symbols R1, C1, ... bound by value lines. */
static char *ladder(int n, int symbolic)
{
    size_t cap = (size_t)n * 120 + 200, len = 0;
    char *t = malloc(cap);
    int i;
    len += (size_t)snprintf(t + len, cap - len, "vsource vin n0 gnd\n");
    for (i = 1; i <= n; i++) {
        if (symbolic)
            len += (size_t)snprintf(t + len, cap - len, "resistor R%d n%d "
                                    "n%d\ncapacitor C%d n%d gnd\nvalue R%d "
                                    "= 1k\nvalue C%d = 1n\n", i, i - 1, i,
                                    i, i, i, i);
        else
            len += (size_t)snprintf(t + len, cap - len, "resistor R%d n%d "
                                    "n%d = 1k\ncapacitor C%d n%d gnd = 1n\n",
                                    i, i - 1, i, i, i);
    }
    snprintf(t + len, cap - len, "transfer H = v(n%d) / vin\n", n);
    return t;
}

/* H(s) of the uniform ladder by the chain (ABCD) matrices of its
   sections, [1 R; 0 1][1 0; sC 1] each, the output open: H = 1/A of
   the product (two-port chain matrices, any circuits text, e.g. Nilsson
   and Riedel, "Electric Circuits", two-port chapter, from memory). */
static long double complex ladder_h(int n, long double complex s)
{
    long double complex a = 1, b = 0, c = 0, dd = 1, r = 1e3L, cap = 1e-9L;
    int i;
    for (i = 0; i < n; i++) {
        /* [a b; c dd] x [1 + sRC, R; sC, 1] */
        long double complex na = a * (1 + s * r * cap) + b * s * cap;
        long double complex nb = a * r + b;
        long double complex nc = c * (1 + s * r * cap) + dd * s * cap;
        long double complex nd = c * r + dd;
        a = na;
        b = nb;
        c = nc;
        dd = nd;
    }
    return 1 / a;
}

/* The ladder's exact result against two facts: the DC gain is 1 (no
   current flows at DC) and the s^1 coefficient of D over its s^0 one is
   the Elmore delay, sum over the capacitors of C_i times the resistance
   from the source to it, RC n(n+1)/2 here (W. C. Elmore, J. Appl. Phys.
   19 (1948)); and H at three frequencies against the chain matrices.
   The numeric 30-section one expands (its 31 terms are far below the
   paths of its graph); the numeric 40-section one, 81 unknowns, past the
   63 that one word of columns holds, expands from the graph of minors
   (method minors); the symbolic 70-section one is held as its graph and
   gives the same numbers from it. */
static void test_ladders(void)
{
    static const int sections[] = {30, 40, 70};
    int t;
    for (t = 0; t < 3; t++) {
        int n = sections[t], dn, dd, k;
        char *text = ladder(n, t == 2);
        gs_job j;
        gs_diag d;
        gs_derive_opts o;
        long double *cn = NULL, *cd = NULL, rc = 1e3L * 1e-9L;
        int ok;
        gs_job_init(&j);
        gs_diag_init(&d);
        gs_derive_opts_default(&o);
        j.graph_ok = 1;
        ok = gs_job_load_string(&j, "ladder.gsc", text, &d) == GS_OK
             && gs_job_derive(&j, NULL, &o, &d) == GS_OK
             && gs_job_bind(&j, NULL, 0, &d) == GS_OK;
        CHECK_MSG(ok, "%d sections", n);
        if (!ok) {
            gs_diag_print(stderr, &d);
        } else {
            CHECK_MSG((j.graph[0] != NULL) == (t == 2), "%d sections: %s",
                      n, j.graph[0] ? "graph" : "expanded");
            if (t < 2)
                CHECK_MSG(j.stats[0].method == GS_DET_MINORS,
                          "%d sections: method %d", n, j.stats[0].method);
            cn = gs_job_coeffs(&j, &j.tf[0].num, &dn);
            cd = gs_job_coeffs(&j, &j.tf[0].den, &dd);
            CHECK(dn == 0 && dd == n);
            CHECK(fabsl(cn[0] / cd[0] - 1) < 1e-15L);
            CHECK_MSG(fabsl(cd[1] / cd[0] / (rc * n * (n + 1) / 2) - 1)
                      < 1e-15L, "%d sections: a1/a0 %Lg", n, cd[1] / cd[0]);
            for (k = 0; k < 3 && dd >= 0; k++) {
                long double complex s = I * (0.1L + 3 * k) / rc / n, nv = 0,
                                    dv = 0, h;
                int p;
                for (p = dn; p >= 0; p--)
                    nv = nv * s + cn[p];
                for (p = dd; p >= 0; p--)
                    dv = dv * s + cd[p];
                h = ladder_h(n, s);
                CHECK_MSG(cabsl(nv / dv - h) <= 1e-9L * cabsl(h),
                          "%d sections at %Lg rad/s", n, cimagl(s));
            }
        }
        free(cn);
        free(cd);
        gs_diag_clear(&d);
        gs_job_clear(&j);
        free(text);
    }
}

int main(void)
{
    test_passive();
    test_amplifiers();
    test_transistors();
    test_controlled_sources();
    test_partial_limit();
    test_ladders();
    return check_report("derive");
}
