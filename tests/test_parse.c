/* test_parse.c - the circuit language: statements, values, devices.
 * See LICENSE.
 */
#include "check.h"
#include "testlib.h"
#include "circuit/circuit.h"
#include "gainsmith.h"
#include "circuit/lex.h"
#include "base/mem.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Parse text as "t.gsc"; *rc gets the status.  The caller frees. */
static gs_circuit *parse(const char *text, gs_diag *d, int *rc)
{
    gs_circuit *c = gs_circuit_new();
    gs_diag_init(d);
    *rc = gs_parse_string(c, "t.gsc", text, d);
    return c;
}

/* The first message containing `part`, or NULL. */
static const gs_diag_entry *find_msg(const gs_diag *d, const char *part)
{
    size_t i;
    for (i = 0; i < d->n; i++)
        if (strstr(d->v[i].message, part) != NULL)
            return &d->v[i];
    return NULL;
}

static void dump(const gs_diag *d)
{
    gs_diag_print(stderr, d);
}

/* value of element `name` as a string, e.g. "1/2*R" */
static int value_is(const gs_circuit *c, const char *name, const char *want)
{
    int k = gs_circuit_find_element(c, name);
    char *s;
    int ok;
    if (k < 0)
        return 0;
    s = gs_monomial_get_str(&c->elems[k].value, c->syms);
    ok = strcmp(s, want) == 0;
    if (!ok)
        fprintf(stderr, "value of %s is %s, expected %s\n", name, s, want);
    free(s);
    return ok;
}

static int nodes_are(const gs_circuit *c, const char *name, const char *a,
                     const char *b, const char *p, const char *q)
{
    int k = gs_circuit_find_element(c, name);
    const char *want[4];
    int i;
    want[0] = a;
    want[1] = b;
    want[2] = p;
    want[3] = q;
    if (k < 0)
        return 0;
    for (i = 0; i < 4; i++) {
        int n = c->elems[k].node[i];
        if (want[i] == NULL ? n != -1
            : n < 0 || n != gs_circuit_find_node(c, want[i]))
            return 0;
    }
    return 1;
}

static const char every_kind[] =
    "title \"A \\\"quoted\\\" title\"\n"
    "resistor    RD   out  vdd\n"
    "resistor    RS   src  gnd = 2*Rx\n"
    "capacitor   CL   out  gnd = 4.7p\n"
    "inductor    L1   a    b\n"
    "resistor    Ra   a    0\n"
    "conductance G1   b    gnd\n"
    "vsource     vin  in   gnd\n"
    "isource     iin  a    b = 2m\n"
    "vccs        gm1  out  src  in src\n"
    "vcvs        A    o    gnd  out gnd\n"
    "resistor    Ro   o    gnd\n"
    "cccs        beta x    gnd  Rq = 100\n"
    "resistor    Rq   x    gnd\n"
    "ccvs        rm   y    gnd  RD\n"
    "resistor    Ry   y    0 = R/2\n"
    "opamp       U1   z    out  z\n"
    "transfer    Av   = v(out) / vin\n"
    "transfer    Ai   = i(Rq) / iin\n"
    "transfer    Ad   = v(out, o) / iin\n"
    "impedance   Zout = out, gnd\n"
    "impedance   Zin  = in\n"
    "ground      vdd\n";

static void test_every_kind(void)
{
    gs_diag d;
    int rc;
    gs_circuit *c = parse(every_kind, &d, &rc);
    const gs_output *o;
    CHECK_MSG(rc == GS_OK, "rc %d", rc);
    if (rc != GS_OK)
        dump(&d);
    CHECK(d.n == 0);
    CHECK(c->title && strcmp(c->title, "A \"quoted\" title") == 0);
    CHECK(c->nelems == 16);
    CHECK(c->s_sym == 0 && strcmp(gs_symtab_name(c->syms, 0), "s") == 0);
    CHECK(c->elems[0].kind == GS_RESISTOR && c->elems[15].kind == GS_OPAMP);
    CHECK(nodes_are(c, "RD", "out", "gnd", NULL, NULL));    /* vdd merged */
    CHECK(nodes_are(c, "gm1", "out", "src", "in", "src"));
    CHECK(nodes_are(c, "A", "o", "gnd", "out", "gnd"));
    CHECK(nodes_are(c, "U1", "z", "out", "z", NULL));
    CHECK(nodes_are(c, "Ra", "a", "gnd", NULL, NULL));
    CHECK(c->elems[gs_circuit_find_element(c, "beta")].ctrl
          == gs_circuit_find_element(c, "Rq"));   /* defined later */
    CHECK(c->elems[gs_circuit_find_element(c, "rm")].ctrl
          == gs_circuit_find_element(c, "RD"));
    CHECK(value_is(c, "RD", "RD"));       /* default: its own name */
    CHECK(value_is(c, "RS", "2*Rx"));
    CHECK(value_is(c, "beta", "100"));
    CHECK(value_is(c, "vin", "1"));       /* sources: amplitude 1 */
    CHECK(value_is(c, "iin", "1/500"));   /* 2m = 2/1000 */
    CHECK(value_is(c, "Ry", "1/2*R"));
    CHECK(value_is(c, "U1", "1"));
    CHECK(c->noutputs == 5);
    o = &c->outputs[gs_circuit_find_output(c, "Av")];
    CHECK(o->kind == GS_OUT_TRANSFER && o->out.kind == GS_PROBE_V);
    CHECK(o->out.a == gs_circuit_find_node(c, "out") && o->out.b == 0);
    CHECK(o->in == gs_circuit_find_element(c, "vin"));
    o = &c->outputs[gs_circuit_find_output(c, "Ai")];
    CHECK(o->out.kind == GS_PROBE_I
          && o->out.elem == gs_circuit_find_element(c, "Rq"));
    o = &c->outputs[gs_circuit_find_output(c, "Ad")];
    CHECK(o->out.b == gs_circuit_find_node(c, "o"));
    o = &c->outputs[gs_circuit_find_output(c, "Zout")];
    CHECK(o->kind == GS_OUT_IMPEDANCE && o->b == 0
          && o->a == gs_circuit_find_node(c, "out"));
    o = &c->outputs[gs_circuit_find_output(c, "Zin")];
    CHECK(o->b == 0 && o->a == gs_circuit_find_node(c, "in"));
    CHECK(o->line == 22 && o->col == 13);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

/* Exact decimals with SI prefixes (BIPM, "The International System of
   Units", 9th edition 2019, table 7: f 1e-15 ... T 1e12). */
static void test_numbers(void)
{
    static const struct {
        const char *text;
        int64_t num, den;
    } cases[] = {
        {"4.7k", 4700, 1},
        {"2.2n", 11, 5000000000},
        {"1e-3", 1, 1000},
        {"10u", 1, 100000},
        {"10\xC2\xB5", 1, 100000},
        {"3M", 3000000, 1},
        {"3m", 3, 1000},
        {"1.5f", 3, 2000000000000000},
        {"2T", 2000000000000, 1},
        {"0.1", 1, 10},
        {"1E+2", 100, 1},
    };
    size_t i;
    for (i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        char *text = gs_asprintf("resistor R1 a gnd = %s\n"
                                 "resistor R2 a gnd\n", cases[i].text);
        gs_diag d;
        int rc;
        gs_circuit *c = parse(text, &d, &rc);
        gs_rat want;
        gs_rat_init(&want);
        gs_rat_set_si(&want, cases[i].num, cases[i].den);
        CHECK_MSG(rc == GS_OK && c->nelems == 2
                  && c->elems[0].value.n == 0
                  && gs_rat_equal(&c->elems[0].value.coeff, &want),
                  "number %s", cases[i].text);
        gs_rat_clear(&want);
        gs_diag_clear(&d);
        gs_circuit_free(c);
        free(text);
    }
}

/* Monomial arithmetic: the laws of exponents (a^m a^n = a^(m+n),
   (a^m)^n = a^(mn), a^0 = 1). */
static void test_monomials(void)
{
    static const struct {
        const char *text, *want;
    } cases[] = {
        {"R/2", "1/2*R"},
        {"1/G", "G^-1"},
        {"gm1*2", "2*gm1"},
        {"2*Rx", "2*Rx"},
        {"(2*R)^2/R", "4*R"},
        {"R^2*R^-2*3", "3"},
        {"-R", "-1*R"},
        {"1/(2*R*C)", "1/2*R^-1*C^-1"},
        {"10k*x/4.7k", "100/47*x"},
        {"R^0", "1"},
    };
    size_t i;
    for (i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        char *text = gs_asprintf("resistor R a gnd\nresistor C a gnd\n"
                                 "resistor X a gnd = %s\n", cases[i].text);
        gs_diag d;
        int rc;
        gs_circuit *c = parse(text, &d, &rc);
        CHECK_MSG(rc == GS_OK && value_is(c, "X", cases[i].want),
                  "value %s", cases[i].text);
        gs_diag_clear(&d);
        gs_circuit_free(c);
        free(text);
    }
}

/* Random monomials: text built from random factors parses to the product
   computed with gs_monomial_mul_sym, and a / a == 1. */
static void test_monomial_random(void)
{
    unsigned seed = 20261201u;
    gs_rng r;
    int round;
    gs_rng_seed(&r, seed);
    for (round = 0; round < 200; round++) {
        gs_monomial want, inv, one;
        char text[512] = "2";
        gs_circuit *c = gs_circuit_new();
        int f, nf, ok;
        gs_diag d;
        char *full, *got;
        gs_monomial_init(&want);
        gs_rat_set_si(&want.coeff, 2, 1);
        nf = (int)test_below(&r, 6) + 1;
        for (f = 0; f < nf; f++) {
            char name[8];
            int e, sym;
            snprintf(name, sizeof name, "x%u", test_below(&r, 4));
            e = (int)test_below(&r, 7) - 3;
            sym = gs_symtab_intern(c->syms, name);
            snprintf(text + strlen(text), sizeof text - strlen(text),
                     "*%s^%d", name, e);
            gs_monomial_mul_sym(&want, sym, e);
        }
        full = gs_asprintf("resistor X a gnd = %s\nresistor Y a gnd\n",
                           text);
        gs_diag_init(&d);
        ok = gs_parse_string(c, "r.gsc", full, &d) == GS_OK;
        ok = ok && gs_monomial_equal(&c->elems[0].value, &want);
        gs_monomial_init(&inv);
        gs_monomial_init(&one);
        gs_monomial_pow_si(&inv, &want, -1);
        gs_monomial_mul(&inv, &inv, &want);       /* aliasing r = a */
        ok = ok && gs_monomial_equal(&inv, &one);
        got = gs_monomial_get_str(&c->elems[0].value, c->syms);
        CHECK_MSG(ok, "seed %u round %d: %s parsed as %s", seed, round,
                  text, got);
        free(got);
        free(full);
        gs_monomial_clear(&one);
        gs_monomial_clear(&inv);
        gs_monomial_clear(&want);
        gs_diag_clear(&d);
        gs_circuit_free(c);
    }
}

static void test_lines(void)
{
    gs_diag d;
    int rc;
    gs_circuit *c = parse("# a comment line\n"
                          "\n"
                          "resistor R1 \\\n"
                          "   a gnd   # the rest \\ of a comment\n"
                          "resistor R2 a \\  # comment after the backslash\n"
                          "  b = 3\r\n"
                          "resistor R3 b gnd\n"
                          "resistor R4 b gnd \\", &d, &rc);
    CHECK(rc == GS_OK && c->nelems == 4);
    CHECK(nodes_are(c, "R2", "a", "b", NULL, NULL));
    CHECK(value_is(c, "R2", "3"));
    CHECK(c->elems[0].line == 3 && c->elems[0].col == 10);
    CHECK(c->elems[1].line == 5);
    CHECK(c->node_line[gs_circuit_find_node(c, "b")] == 6);
    CHECK(c->node_col[gs_circuit_find_node(c, "b")] == 3);
    gs_diag_clear(&d);
    gs_circuit_free(c);

    /* columns count characters, not bytes: 'µ' is two bytes */
    c = parse("resistor R\xC2\xB5 a gnd\n", &d, &rc);
    CHECK(rc == GS_ESYNTAX && d.n == 1 && d.v[0].col == 11);
    CHECK(strcmp(d.v[0].message, "unexpected character '\xC2\xB5'") == 0);
    gs_diag_clear(&d);
    gs_circuit_free(c);
    c = parse("resistor R1 a gnd = 10\xC2\xB5 x\n", &d, &rc);
    CHECK(rc == GS_ESYNTAX && d.n == 1 && d.v[0].col == 25);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

static void test_ground(void)
{
    gs_diag d;
    int rc;
    gs_circuit *c = parse("resistor R1 a vdd\n"
                          "resistor R2 a vss\n"
                          "resistor R3 a 0\n"
                          "ground vdd vss gnd 0\n"
                          "ground vdd\n", &d, &rc);
    CHECK(rc == GS_OK);
    CHECK(c->nnodes == 2);
    CHECK(gs_circuit_find_node(c, "vdd") == 0);
    CHECK(gs_circuit_find_node(c, "vss") == 0);
    CHECK(gs_circuit_find_node(c, "0") == 0);
    CHECK(gs_circuit_find_node(c, "gnd") == 0);
    CHECK(gs_circuit_find_node(c, "a") == 1);
    CHECK(gs_circuit_find_node(c, "b") == -1);
    CHECK(c->nref_alias == 2 && strcmp(c->ref_alias[1], "vss") == 0);
    CHECK(strcmp(c->node_name[0], "gnd") == 0);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

/* Device lines expand into the hybrid-pi small-signal models (Sedra and
   Smith, "Microelectronic Circuits", the MOSFET and BJT small-signal
   equivalent circuits). */
static void test_mosfet(void)
{
    gs_diag d;
    int rc, dev;
    gs_circuit *c = parse("vsource vin g gnd\n"
                          "mosfet M1 d g s b gm=gm1 rds=2*ro gmb=gmb1 "
                          "cgs=Cgs1 cgd=1f cdb=Cdb csb=Csb\n"
                          "resistor RD d gnd\nresistor RS s gnd\n"
                          "resistor RB b gnd\n"
                          "mosfet M2 d2 g s\nresistor R2 d2 gnd\n", &d, &rc);
    CHECK_MSG(rc == GS_OK, "rc %d", rc);
    if (rc != GS_OK)
        dump(&d);
    CHECK(c->ndevices == 2);
    CHECK(strcmp(c->elems[1].name, "M1.gm") == 0);
    CHECK(nodes_are(c, "M1.gm", "d", "s", "g", "s"));
    CHECK(nodes_are(c, "M1.rds", "d", "s", NULL, NULL));
    CHECK(nodes_are(c, "M1.gmb", "d", "s", "b", "s"));
    CHECK(nodes_are(c, "M1.cgs", "g", "s", NULL, NULL));
    CHECK(nodes_are(c, "M1.cgd", "g", "d", NULL, NULL));
    CHECK(nodes_are(c, "M1.cdb", "d", "b", NULL, NULL));
    CHECK(nodes_are(c, "M1.csb", "s", "b", NULL, NULL));
    CHECK(c->elems[gs_circuit_find_element(c, "M1.csb")].kind
          == GS_CAPACITOR);
    CHECK(c->elems[gs_circuit_find_element(c, "M1.gmb")].kind == GS_VCCS);
    CHECK(value_is(c, "M1.rds", "2*ro"));
    CHECK(value_is(c, "M1.cgd", "1/1000000000000000"));
    CHECK(value_is(c, "M2.gm", "gm_M2"));     /* defaults */
    CHECK(value_is(c, "M2.rds", "rds_M2"));
    CHECK(gs_circuit_find_element(c, "M2.gmb") < 0);
    CHECK(gs_circuit_find_element(c, "M2.cgs") < 0);
    dev = gs_circuit_find_device(c, "M1");
    CHECK(dev == 0 && !c->devices[0].is_bjt && c->devices[0].nparams == 7);
    CHECK(strcmp(c->devices[0].keys[1], "rds") == 0);
    CHECK(strcmp(c->devices[0].vals[1], "2*ro") == 0);
    CHECK(c->devices[0].nodes[3] == gs_circuit_find_node(c, "b"));
    CHECK(c->devices[1].nodes[3] == -1);
    CHECK(c->elems[gs_circuit_find_element(c, "M1.cdb")].device == 0);
    CHECK(c->elems[gs_circuit_find_element(c, "RD")].device == -1);
    gs_diag_clear(&d);
    gs_circuit_free(c);

    /* b = s: no body effect part, no shorted csb; rds=inf: no rds */
    c = parse("vsource vin g gnd\n"
              "mosfet M1 d g s s gmb=gmb1 csb=1f rds=inf\n"
              "resistor RD d gnd\nresistor RS s gnd\n", &d, &rc);
    CHECK(rc == GS_OK && c->nelems == 4);
    CHECK(gs_circuit_find_element(c, "M1.gmb") < 0);
    CHECK(gs_circuit_find_element(c, "M1.rds") < 0);
    CHECK(strcmp(c->devices[0].vals[0], "inf") == 0);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

static void test_bjt(void)
{
    gs_diag d;
    int rc, bi;
    gs_circuit *c = parse("vsource vin b gnd\n"
                          "bjt Q1 c b e gm=40m rpi=2.5k ro=inf cpi=Cpi "
                          "cmu=Cmu rb=100\n"
                          "resistor RC c gnd\nresistor RE e gnd\n"
                          "bjt Q2 c2 b e ro=r0\nresistor R2 c2 gnd\n",
                          &d, &rc);
    CHECK_MSG(rc == GS_OK, "rc %d", rc);
    if (rc != GS_OK)
        dump(&d);
    bi = gs_circuit_find_node(c, "Q1.b'");
    CHECK(bi > 0);
    CHECK(nodes_are(c, "Q1.gm", "c", "e", "Q1.b'", "e"));
    CHECK(nodes_are(c, "Q1.rpi", "Q1.b'", "e", NULL, NULL));
    CHECK(nodes_are(c, "Q1.cpi", "Q1.b'", "e", NULL, NULL));
    CHECK(nodes_are(c, "Q1.cmu", "Q1.b'", "c", NULL, NULL));
    CHECK(nodes_are(c, "Q1.rb", "b", "Q1.b'", NULL, NULL));
    CHECK(gs_circuit_find_element(c, "Q1.ro") < 0);       /* ro=inf */
    CHECK(value_is(c, "Q1.gm", "1/25"));                  /* 40m */
    CHECK(value_is(c, "Q1.rpi", "2500"));
    CHECK(nodes_are(c, "Q2.gm", "c2", "e", "b", "e"));    /* no rb */
    CHECK(value_is(c, "Q2.rpi", "rpi_Q2"));
    CHECK(value_is(c, "Q2.ro", "r0"));
    CHECK(gs_circuit_find_element(c, "Q2.cpi") < 0);
    CHECK(c->devices[1].is_bjt && c->devices[1].nodes[3] == -1);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

static void test_bias(void)
{
    gs_diag d;
    int rc;
    gs_circuit *c = parse("bias M1 id=1m vds=2 vth=-0.5 k = 2*k0\n"
                          "vsource vin g gnd\nmosfet M1 d g gnd\n"
                          "resistor RD d gnd\n", &d, &rc);
    CHECK(rc == GS_OK && c->nbiases == 1);
    CHECK(c->biases[0].device == 0 && c->biases[0].nparams == 4);
    CHECK(strcmp(c->biases[0].keys[2], "vth") == 0);
    CHECK(strcmp(c->biases[0].vals[2], "-0.5") == 0);
    CHECK(strcmp(c->biases[0].vals[3], "2*k0") == 0);
    CHECK(c->biases[0].val_col[0] == 12 && c->biases[0].line == 1);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

static long double value_of(const gs_circuit *c, const long double *vals,
                            const unsigned char *set, const char *name)
{
    int s = gs_symtab_find(c->syms, name);
    return s >= 0 && set[s] ? vals[s] : -12345.0L;
}

static int close_to(long double got, long double want)
{
    return fabsl(got - want) <= 1e-15L * fabsl(want) + 1e-300L;
}

static void test_values(void)
{
    gs_diag d;
    int rc, n;
    gs_circuit *c = parse(
        "resistor RD a gnd\nisource I1 a gnd\n"
        "value gm = sqrt(2*k*id)    # used before k and id are bound\n"
        "value k = 2m\nvalue id = 1m\n"
        "value ro = 1/(lambda*id)\nvalue lambda = 0.04\n"
        "value RD = 4.7k\n"
        "value p1 = -2^2\nvalue p2 = 2^3^2\nvalue p3 = (1 + 2) * 3 - 4 / 8\n"
        "value e1 = exp(log(7))\nvalue e2 = log10(1000) + abs(-2)\n"
        "value tau = 2*pi\n", &d, &rc);
    long double *vals;
    unsigned char *set;
    CHECK(rc == GS_OK && c->nvalues == 12);
    n = gs_symtab_count(c->syms);
    vals = calloc((size_t)n, sizeof *vals);
    set = calloc((size_t)n, 1);
    rc = gs_circuit_eval_values(c, vals, set, &d);
    CHECK(rc == GS_OK && d.n == 0);
    /* square law: gm = sqrt(2 k ID) = sqrt(4e-6) = 2 mA/V, and
       ro = 1/(lambda ID) = 25 kOhm (Sedra and Smith, MOSFET small-signal
       parameters); hand arithmetic */
    CHECK(close_to(value_of(c, vals, set, "gm"), 2e-3L));
    CHECK(close_to(value_of(c, vals, set, "ro"), 25000.0L));
    CHECK(value_of(c, vals, set, "RD") == 4700.0L);
    /* conventions: ^ binds tighter than unary minus, and to the right */
    CHECK(value_of(c, vals, set, "p1") == -4.0L);
    CHECK(value_of(c, vals, set, "p2") == 512.0L);
    CHECK(value_of(c, vals, set, "p3") == 8.5L);
    CHECK(close_to(value_of(c, vals, set, "e1"), 7.0L));   /* exp(log x) */
    CHECK(close_to(value_of(c, vals, set, "e2"), 5.0L));
    CHECK(close_to(value_of(c, vals, set, "tau"),
                   6.283185307179586476925286766559L));
    CHECK(!set[gs_symtab_find(c->syms, "s")]);

    /* a value the caller binds first wins, and feeds its dependents */
    memset(set, 0, (size_t)n);
    vals[gs_symtab_find(c->syms, "id")] = 4e-3L;
    set[gs_symtab_find(c->syms, "id")] = 1;
    rc = gs_circuit_eval_values(c, vals, set, &d);
    CHECK(rc == GS_OK);
    CHECK(close_to(value_of(c, vals, set, "gm"), 4e-3L));  /* sqrt(16e-6) */
    CHECK(close_to(value_of(c, vals, set, "id"), 4e-3L));
    free(vals);
    free(set);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

static void test_value_errors(void)
{
    gs_diag d;
    int rc, n;
    gs_circuit *c = parse("resistor R1 a gnd\nisource I1 a gnd\n"
                          "value a = sqrt(b)\nvalue b = -4\n"
                          "value c = a + 1\nvalue e = f * 2\n"
                          "value g = 1 / (R1 - R1)\nvalue R1 = 1k\n"
                          "value ok = 3\n", &d, &rc);
    long double *vals;
    unsigned char *set;
    const gs_diag_entry *m;
    CHECK(rc == GS_OK);
    n = gs_symtab_count(c->syms);
    vals = calloc((size_t)n, sizeof *vals);
    set = calloc((size_t)n, 1);
    rc = gs_circuit_eval_values(c, vals, set, &d);
    CHECK(rc == GS_EINVAL);
    CHECK(d.nerrors == 3);              /* c fails quietly after a */
    m = find_msg(&d, "sqrt of a negative number (-4)");
    CHECK(m && m->line == 3 && m->col == 11);
    m = find_msg(&d, "'f' has no value");
    CHECK(m && m->line == 6 && m->col == 11 && m->hint);
    m = find_msg(&d, "division by zero");
    CHECK(m && m->line == 7 && m->col == 13);
    CHECK(value_of(c, vals, set, "ok") == 3.0L);
    CHECK(value_of(c, vals, set, "R1") == 1000.0L);
    free(vals);
    free(set);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

static void test_expr_string(void)
{
    gs_circuit *c = gs_circuit_new();
    gs_diag d;
    gs_expr *e;
    long double x;
    unsigned char set[8] = {0};
    long double vals[8] = {0};
    gs_diag_init(&d);
    CHECK(gs_expr_parse_string(&e, c, "10k", "--set", &d) == GS_OK);
    CHECK(e && e->kind == GS_EX_NUM && e->line == 0);
    CHECK(gs_expr_eval(&x, e, c, vals, set, &d) == GS_OK && x == 1e4L);
    gs_expr_free(e);
    CHECK(gs_expr_parse_string(&e, c, "sqrt(2*kx)", "--set", &d) == GS_OK);
    CHECK(gs_expr_eval(&x, e, c, vals, set, &d) == GS_EUNBOUND);
    CHECK(strcmp(d.v[0].message, "'kx' has no value") == 0);
    CHECK(d.v[0].line == 0 && d.v[0].file == NULL);
    set[gs_symtab_find(c->syms, "kx")] = 1;
    vals[gs_symtab_find(c->syms, "kx")] = 8;
    CHECK(gs_expr_eval(&x, e, c, vals, set, &d) == GS_OK && x == 4.0L);
    gs_expr_free(e);
    CHECK(gs_expr_parse_string(&e, c, "4.7q", "--set", &d) == GS_ESYNTAX);
    CHECK(e == NULL);
    CHECK(strcmp(d.v[1].message, "--set: '4.7q' is not a number") == 0);
    CHECK(gs_expr_parse_string(&e, c, "(1", "--set", &d) == GS_ESYNTAX);
    CHECK(strcmp(d.v[2].message, "--set: ')' expected to close '('") == 0);
    CHECK(gs_expr_parse_string(&e, c, "", "--set", &d) == GS_ESYNTAX);
    CHECK(strcmp(d.v[3].message, "--set: expected one expression, found "
                 "nothing") == 0);
    CHECK(gs_expr_parse_string(&e, c, "1 2", "--set", &d) == GS_ESYNTAX);
    CHECK(strcmp(d.v[4].message, "--set: unexpected '2' after the "
                 "expression") == 0);
    CHECK(gs_expr_parse_string(&e, c, "s*2", "--set", &d) == GS_ESYNTAX);
    CHECK(gs_expr_parse_string(&e, c, "@", "--set", &d) == GS_ESYNTAX);
    CHECK(strcmp(d.v[6].message, "--set: unexpected character '@'") == 0);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

/* Every statement error is reported, each at its token, in file order. */
static void test_many_errors(void)
{
    gs_diag d;
    int rc;
    gs_circuit *c = parse("resistr R1 a b\n"
                          "resistor R2 a\n"
                          "resistor R3 a $ b\n"
                          "resistor R4 a b = 4.7q\n"
                          "resistor R5 a gnd\n", &d, &rc);
    CHECK(rc == GS_ESYNTAX && d.nerrors == 4);
    CHECK(d.n == 4 && d.v[0].line == 1 && d.v[1].line == 2
          && d.v[2].line == 3 && d.v[3].line == 4);
    CHECK(strcmp(d.v[0].message, "unknown statement 'resistr'") == 0);
    CHECK(d.v[0].hint && strcmp(d.v[0].hint, "did you mean 'resistor'?")
          == 0);
    CHECK(strcmp(d.v[1].message, "missing node n- of resistor 'R2'") == 0);
    CHECK(d.v[1].col == 14);
    CHECK(strcmp(d.v[2].message, "unexpected character '$'") == 0);
    CHECK(d.v[2].col == 15);
    CHECK(strcmp(d.v[3].message, "'4.7q' is not a number") == 0);
    CHECK(d.v[3].col == 19);
    CHECK(c->nelems == 1);
    gs_diag_clear(&d);
    gs_circuit_free(c);

    /* max_errors: the rest are counted, not stored */
    c = gs_circuit_new();
    gs_diag_init(&d);
    d.max_errors = 2;
    rc = gs_parse_string(c, "t.gsc", "x\ny\nz\nw\n", &d);
    CHECK(rc == GS_ESYNTAX && d.n == 2 && d.nerrors == 4);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

/* Names used before they are defined, and did-you-mean hints. */
static void test_names(void)
{
    gs_diag d;
    int rc;
    gs_circuit *c = parse("transfer T = v(out) / vin\n"
                          "cccs F1 out gnd Rout\n"
                          "vsource vin in gnd\n"
                          "resistor Rin in out\nresistor Rout out gnd\n"
                          "resistor Rin a b\n", &d, &rc);
    const gs_diag_entry *m;
    CHECK(rc == GS_ESYNTAX);
    m = find_msg(&d, "duplicate element name 'Rin' (first defined at 4:10)");
    CHECK(m && m->line == 6 && m->col == 10);
    CHECK(c->elems[gs_circuit_find_element(c, "F1")].ctrl
          == gs_circuit_find_element(c, "Rout"));
    gs_diag_clear(&d);
    gs_circuit_free(c);

    c = parse("vsource vin in gnd\nresistor Rin in out\n"
              "resistor Rout out gnd\ncccs F1 out gnd Routt\n"
              "transfer T = v(ot) / vn\n", &d, &rc);
    CHECK(rc == GS_ESYNTAX);
    m = find_msg(&d, "unknown controlling element 'Routt' of cccs 'F1'");
    CHECK(m && m->hint && strcmp(m->hint, "did you mean 'Rout'?") == 0);
    m = find_msg(&d, "unknown node 'ot'");
    CHECK(m && m->hint && strcmp(m->hint, "did you mean 'out'?") == 0);
    m = find_msg(&d, "unknown source 'vn' in transfer 'T'");
    CHECK(m && m->hint && strcmp(m->hint, "did you mean 'vin'?") == 0);
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

static void test_suggest(void)
{
    static const char *const words[] = {"resistor", "capacitor", "vccs",
                                        "vcvs", "RD"};
    CHECK(strcmp(gs_suggest("resistr", words, 5), "resistor") == 0);
    CHECK(strcmp(gs_suggest("Resistor", words, 5), "resistor") == 0);
    CHECK(strcmp(gs_suggest("capactor", words, 5), "capacitor") == 0);
    CHECK(strcmp(gs_suggest("vcc", words, 5), "vccs") == 0);
    CHECK(strcmp(gs_suggest("rd", words, 5), "RD") == 0);
    CHECK(gs_suggest("inductor", words, 5) == NULL);
    CHECK(strcmp(gs_suggest("vccs", words, 5), "vcvs") == 0); /* not itself */
    CHECK(gs_suggest("vccs", words + 2, 1) == NULL);
    /* a swap of neighbours is one edit (Damerau 1964), so a three-letter
       word still gets its hint */
    {
        static const char *const nodes[] = {"out", "vin", "in"};
        CHECK(gs_suggest("otu", nodes, 3) != NULL
              && strcmp(gs_suggest("otu", nodes, 3), "out") == 0);
        CHECK(gs_suggest("vni", nodes, 3) != NULL
              && strcmp(gs_suggest("vni", nodes, 3), "vin") == 0);
    }
    /* optimal string alignment distances, worked by hand: "ca" -> "ac"
       is one swap; "abc" -> "ca" is 3 in OSA (no substring edited twice)
       where the unrestricted Damerau distance would be 2 */
    CHECK(gs_osa_distance("ca", "ac", 5, 0) == 1);
    CHECK(gs_osa_distance("abc", "ca", 5, 0) == 3);
    CHECK(gs_osa_distance("kitten", "sitting", 5, 0) == 3);
    CHECK(gs_osa_distance("OTU", "out", 5, 1) == 1);
    CHECK(gs_osa_distance("OTU", "out", 5, 0) == 3);
    CHECK(gs_edit_distance("resitsor", "resistor", 2) == 1);
    CHECK(gs_number_is_well_formed("1e999999"));
    CHECK(gs_number_is_well_formed("2.5E-3k"));
    CHECK(gs_number_is_well_formed(".5"));
    CHECK(!gs_number_is_well_formed("1e"));
    CHECK(!gs_number_is_well_formed("1.2.3"));
    CHECK(!gs_number_is_well_formed("1e3x"));
    CHECK(!gs_number_is_well_formed("1kk"));
}

static void test_file(void)
{
    gs_circuit *c = gs_circuit_new();
    gs_diag d;
    gs_diag_init(&d);
    CHECK(gs_parse_file(c, "/nonexistent/dir/x.gsc", &d) == GS_EIO);
    CHECK(d.n == 1 && strstr(d.v[0].message, "cannot read "
                             "'/nonexistent/dir/x.gsc'") != NULL);
    gs_diag_clear(&d);
    gs_circuit_free(c);
    c = gs_circuit_new();
    CHECK(gs_parse_text(c, "nul.gsc", "resistor R1 a gnd\n\0", 19, &d)
          == GS_ESYNTAX);
    CHECK(d.n == 1 && strcmp(d.v[0].message,
                             "unexpected character '\\x00'") == 0);
    gs_diag_clear(&d);
    gs_circuit_free(c);
    /* text[0 .. len) need not be followed by a NUL: nothing past the end
       is read (the sanitizer build proves it) */
    {
        static const char body[] = "vsource vin in gnd\ncapacitor";
        size_t n = sizeof body - 1;
        char *exact = gs_malloc(n);
        memcpy(exact, body, n);
        c = gs_circuit_new();
        CHECK(gs_parse_text(c, "end.gsc", exact, n, &d) == GS_ESYNTAX);
        CHECK(find_msg(&d, "missing capacitor name") != NULL);
        gs_diag_clear(&d);
        gs_circuit_free(c);
        free(exact);
    }
    gs_circuit_free(NULL);
}

int main(void)
{
    test_every_kind();
    test_numbers();
    test_monomials();
    test_monomial_random();
    test_lines();
    test_ground();
    test_mosfet();
    test_bjt();
    test_bias();
    test_values();
    test_value_errors();
    test_expr_string();
    test_many_errors();
    test_names();
    test_suggest();
    test_file();
    return check_report("parse");
}
