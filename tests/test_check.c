/* test_check.c - structural checks of circuits. See LICENSE.
 *
 * The rules checked are the topological conditions for the network
 * equations to have a unique solution: no loop of voltage sources, no
 * cut-set of current sources, every node connected to the reference
 * (Chua and Lin, "Computer-Aided Analysis of Electronic Circuits", 1975,
 * ch. 2; Vlach and Singhal, "Computer Methods for Circuit Analysis and
 * Design", 1983, ch. 4).
 */
#include "check.h"
#include "testlib.h"
#include "circuit/circuit.h"
#include "gainsmith.h"

#include <stdlib.h>
#include <string.h>

/* Parse text; returns the status and leaves the messages in d. */
static int run(const char *text, gs_diag *d)
{
    gs_circuit *c = gs_circuit_new();
    int rc;
    gs_diag_init(d);
    rc = gs_parse_string(c, "t.gsc", text, d);
    gs_circuit_free(c);
    return rc;
}

/* Is there an entry whose message is exactly msg at line:col (col 0:
   any), of the given severity? */
static int has(const gs_diag *d, int sev, int line, int col, const char *msg)
{
    size_t i;
    for (i = 0; i < d->n; i++) {
        const gs_diag_entry *e = &d->v[i];
        if (e->severity == sev && strcmp(e->message, msg) == 0
            && e->line == line && (col == 0 || e->col == col))
            return 1;
    }
    gs_diag_print(stderr, d);
    return 0;
}

/* The circuit text must pass with no message at all. */
static void clean(const char *what, const char *text)
{
    gs_diag d;
    int rc = run(text, &d);
    CHECK_MSG(rc == GS_OK && d.n == 0, "%s: rc %d, %zu messages", what, rc,
              d.n);
    if (d.n)
        gs_diag_print(stderr, &d);
    gs_diag_clear(&d);
}

/* The circuit must fail the checks with exactly one error msg at line. */
static void one_error(const char *text, int line, const char *msg)
{
    gs_diag d;
    int rc = run(text, &d);
    CHECK_MSG(rc == GS_EINVAL && d.nerrors == 1
              && has(&d, GS_SEV_ERROR, line, 0, msg), "expected: %s", msg);
    gs_diag_clear(&d);
}

/* Circuits that are sound, among them the usual textbook stages and the
   shapes device expansion gives, must raise nothing. */
static void test_sound(void)
{
    /* common-source stage with source degeneration (Sedra and Smith) */
    clean("cs_degen", "vsource vin in gnd\nmosfet M1 d in s\n"
          "resistor RD d vdd\nresistor RS s gnd\nground vdd\n"
          "transfer Av = v(d) / vin\n");
    /* ideal cascode, rds = inf: the middle node is set by M2's gm */
    clean("cascode", "vsource vin in gnd\nmosfet M1 x in gnd rds=inf\n"
          "mosfet M2 out gnd x rds=inf\nresistor RL out gnd\n");
    /* differential pair with an ideal tail current source */
    clean("diff pair", "vsource vp p gnd\nvsource vn n gnd\n"
          "mosfet M1 o1 p t rds=inf\nmosfet M2 o2 n t rds=inf\n"
          "isource It t gnd\nresistor R1 o1 gnd\nresistor R2 o2 gnd\n");
    /* source follower into a current-source load */
    clean("follower", "vsource vin in gnd\nmosfet M1 gnd in out rds=inf\n"
          "isource Ib out gnd\n");
    /* inverting amplifier and a follower: opamp outputs drive nodes */
    clean("inverting", "vsource vin in gnd\nresistor R1 in m\n"
          "resistor R2 m out\nopamp U1 out gnd m\nopamp U2 f out f\n");
    /* gate driven through a resistor, the gate only sensed */
    clean("gate resistor", "vsource vin in gnd\nresistor Rg in g\n"
          "mosfet M1 d g gnd\nresistor RD d gnd\n");
    /* bjt with base resistance and all capacitances */
    clean("bjt", "vsource vin in gnd\nbjt Q1 c in e rb=rbb cpi=Cpi cmu=Cmu "
          "ro=ro1\nresistor RC c gnd\nresistor RE e gnd\n");
    /* an inductor in a loop with a source is an impedance, not a short */
    clean("LC", "vsource vin in gnd\ninductor L1 in gnd\n"
          "capacitor C1 in gnd\n");
    /* a cccs chain ending in an element with a current */
    clean("cccs chain", "vsource vin in gnd\nresistor R1 in gnd\n"
          "cccs F1 a gnd R1\nresistor Ra a gnd\ncccs F2 b gnd F1\n"
          "resistor Rb b gnd\n");
}

/* KVL around a loop of voltage-defined branches fixes one voltage twice:
   their branch-current columns are dependent (Chua and Lin, ch. 2). */
static void test_voltage_loops(void)
{
    one_error("vsource V1 a gnd\nvsource V2 a gnd\nresistor R a gnd\n", 2,
              "loop of voltage-defined elements: 'V1', 'V2'");
    one_error("vsource V1 a b\nvcvs E1 b gnd a gnd\nccvs H1 a gnd R\n"
              "resistor R a gnd\nresistor Rb b gnd\n", 3,
              "loop of voltage-defined elements: 'V1', 'E1', 'H1'");
    /* an opamp's output is a voltage branch to gnd */
    one_error("vsource V1 o gnd\nopamp U1 o p o\nresistor Rp p gnd\n", 2,
              "loop of voltage-defined elements: 'V1', 'U1'");
    one_error("vsource V1 a a\nresistor R a gnd\n", 1,
              "vsource 'V1' has both ends on node 'a'");
    one_error("ground vdd\nvsource VDD vdd gnd\nresistor R a vdd\n"
              "vsource V1 a gnd\n", 2,
              "vsource 'VDD' has both ends on node 'gnd'");
    one_error("opamp U1 gnd p n\nresistor Rp p gnd\nresistor Rn n gnd\n", 1,
              "the output of opamp 'U1' is the reference node");
}

/* KCL summed over a part joined only through current sources. */
static void test_cut_sets(void)
{
    one_error("isource I1 a gnd\nresistor R1 a b\n", 1,
              "cut-set of current sources: nodes 'a', 'b' connect to the "
              "rest of the circuit only through I1");
    /* a vccs whose control does not involve the part: unanchored */
    one_error("vsource vin in gnd\nvccs G1 out gnd in gnd\n", 2,
              "cut-set of current sources: node 'out' connects to the rest "
              "of the circuit only through G1");
    /* a mosfet drain with nothing on it and rds = inf */
    one_error("vsource vin in gnd\nmosfet M1 d in gnd rds=inf\n", 2,
              "cut-set of current sources: node 'd' connects to the rest "
              "of the circuit only through M1.gm");
    /* two independent sources in series: the middle node */
    one_error("isource I1 a gnd\nisource I2 gnd a\n", 1,
              "cut-set of current sources: node 'a' connects to the rest "
              "of the circuit only through I1, I2");
}

static void test_floating(void)
{
    one_error("vsource vin in gnd\nresistor R1 in gnd\nresistor R2 a b\n", 3,
              "nodes 'a', 'b' have no path to gnd");
    one_error("vsource vin in gnd\nresistor R1 in gnd\ncapacitor C1 x x\n", 3,
              "node 'x' has no path to gnd");
    /* a vccs control node with nothing else on it */
    one_error("vccs G1 o gnd c gnd\nresistor Ro o gnd\n", 1,
              "node 'c' only senses voltage; it is floating");
    /* a floating opamp input */
    one_error("opamp U1 o p o\n", 1,
              "node 'p' only senses voltage; it is floating");
}

/* The ideal opamp as a nullor (Tellegen 1954; Carlin, "Singular network
   elements", IEEE Trans. Circuit Theory 11, 1964): its input pair fixes a
   voltage and its output carries a free current. */
static void test_opamps(void)
{
    one_error("vsource vin p gnd\nvsource V2 p n\nresistor Rn n gnd\n"
              "opamp U1 o p n\nresistor Ro o gnd\n", 4,
              "the inputs of opamp 'U1' close a loop of voltage-defined "
              "elements: 'V2'");
    one_error("vsource vin p gnd\nopamp U1 o p p\nresistor Ro o gnd\n", 2,
              "opamp 'U1' has both inputs on node 'p'");
    /* an output with nothing else on it: no feedback */
    one_error("vsource vin p gnd\nresistor Rn n gnd\nopamp U1 o p n\n", 3,
              "nothing sets the voltage of node 'o': it connects to the rest "
              "of the circuit only through U1");
    /* with a load but still no feedback: only the pattern shows it */
    one_error("vsource vin p gnd\nresistor Rn n gnd\nopamp U1 out p n\n"
              "resistor RL out gnd\n", 3,
              "the circuit's equations are singular whatever the values: "
              "nothing determines v(out), i(U1)");
}

static void test_cccs_loops(void)
{
    one_error("cccs F1 a gnd F2\ncccs F2 a gnd F1\nresistor R a gnd\n", 1,
              "loop of current-controlled sources: F1 -> F2 -> F1");
    one_error("resistor R a gnd\ncccs F1 a gnd F1\n", 2,
              "loop of current-controlled sources: F1 -> F1");
}

static void test_outputs(void)
{
    one_error("vsource vin in gnd\nresistor R1 in gnd\n"
              "transfer T = v(in) / R1\n", 3,
              "the input 'R1' of transfer 'T' is a resistor, not an "
              "independent source");
    one_error("vsource vin in gnd\nresistor R1 in gnd\n"
              "impedance Z = in, in\n", 3,
              "impedance 'Z' is measured between node 'in' and itself");
}

static void test_warnings(void)
{
    gs_diag d;
    int rc2 = run("vsource vin in gnd\nresistor R1 in gnd\n"
                  "vccs G1 in gnd x x\nresistor Rx x gnd\n"
                  "mosfet M1 in g g\nresistor Rg g gnd\n", &d);
    CHECK(rc2 == GS_OK && d.nerrors == 0 && d.nwarnings == 1);
    CHECK(has(&d, GS_SEV_WARNING, 3, 6, "vccs 'G1' senses the voltage "
              "between node 'x' and itself, which is always 0"));
    gs_diag_clear(&d);
    int rc = run("vsource vin in gnd\nresistor R1 in gnd\n"
                 "resistor R2 in dangle\n", &d);
    CHECK(rc == GS_OK && d.nerrors == 0 && d.nwarnings == 1);
    CHECK(has(&d, GS_SEV_WARNING, 3, 16,
              "node 'dangle' has only one connection (resistor 'R2')"));
    gs_diag_clear(&d);
}

/* Every error of a circuit is reported, not only the first. */
static void test_all_reported(void)
{
    gs_diag d;
    int rc = run("vsource V1 a gnd\nvsource V2 a gnd\n"
                 "isource I1 b gnd\nresistor R b c\n"
                 "value x = y\nvalue y = x\n", &d);
    CHECK(rc == GS_EINVAL && d.nerrors == 3);
    CHECK(has(&d, GS_SEV_ERROR, 2, 9,
              "loop of voltage-defined elements: 'V1', 'V2'"));
    CHECK(has(&d, GS_SEV_ERROR, 3, 12, "cut-set of current sources: nodes "
              "'b', 'c' connect to the rest of the circuit only through I1"));
    CHECK(has(&d, GS_SEV_ERROR, 5, 7, "value cycle: x -> y -> x"));
    gs_diag_clear(&d);
}

/* gs_circuit_check on its own, on a circuit parsed without errors. */
static void test_direct(void)
{
    gs_circuit *c = gs_circuit_new();
    gs_diag d;
    gs_diag_init(&d);
    CHECK(gs_parse_string(c, "t.gsc", "vsource vin in gnd\n"
                          "resistor R in gnd\n", &d) == GS_OK);
    CHECK(gs_circuit_check(c, &d) == GS_OK && d.n == 0);
    c->elems[1].kind = GS_VSOURCE;      /* now two sources in parallel */
    CHECK(gs_circuit_check(c, &d) == GS_EINVAL);
    CHECK(has(&d, GS_SEV_ERROR, 2, 10,
              "loop of voltage-defined elements: 'vin', 'R'"));
    gs_diag_clear(&d);
    gs_circuit_free(c);
}

/* ---- property: a rejected circuit has a singular MNA matrix ---- */

/* An exact MNA matrix, built here independently of the library's own
   (modified nodal analysis: Ho, Ruehli and Brennan, IEEE Trans. Circuits
   Syst. 22, 1975), with every symbol and s set to random integers.  The
   structural conditions make det A vanish identically, so the number
   must be exactly 0 (and a nonzero number proves the matrix regular for
   almost all values: Schwartz, J. ACM 27, 1980). */
typedef struct qmat {
    int n;
    gs_rat *a;
} qmat;

static gs_rat *at(qmat *m, int i, int j)
{
    return &m->a[i * m->n + j];
}

/* a[i][j] += sign * v, rows and columns of gnd (-1) dropped */
static void add(qmat *m, int i, int j, const gs_rat *v, int sign)
{
    gs_rat t;
    if (i < 0 || j < 0)
        return;
    gs_rat_init(&t);
    if (sign < 0)
        gs_rat_neg(&t, v);
    else
        gs_rat_set(&t, v);
    gs_rat_add(at(m, i, j), at(m, i, j), &t);
    gs_rat_clear(&t);
}

static void value_num(gs_rat *r, const gs_monomial *v, const int64_t *num)
{
    gs_rat x;
    int i;
    gs_rat_init(&x);
    gs_rat_set(r, &v->coeff);
    for (i = 0; i < v->n; i++) {
        gs_rat_set_si(&x, num[v->sym[i]], 1);
        gs_rat_pow_si(&x, &x, v->exp[i]);
        gs_rat_mul(r, r, &x);
    }
    gs_rat_clear(&x);
}

static int has_branch(gs_elem_kind k)
{
    return k == GS_INDUCTOR || k == GS_VSOURCE || k == GS_VCVS
           || k == GS_CCVS || k == GS_OPAMP;
}

/* The stamping context: values of every element and the branch column of
   each (or -1). */
typedef struct mna_ctx {
    const gs_circuit *c;
    gs_rat *val;
    int *br;
    gs_rat s;
} mna_ctx;

/* Row `row` += scale * (current through element j) in the unknowns; the
   current of an isource is a known (zeroed) source, not in A.  Returns 0
   for a cccs controlled through others by itself, which the MNA cannot
   write at all. */
static int add_current(qmat *m, const mna_ctx *x, int row, int j,
                       const gs_rat *scale, size_t depth)
{
    const gs_element *e = &x->c->elems[j];
    gs_rat t;
    int ok = 1;
    if (depth > x->c->nelems)
        return 0;
    gs_rat_init(&t);
    gs_rat_set(&t, scale);
    if (x->br[j] >= 0) {
        add(m, row, x->br[j], &t, 1);
    } else if (e->kind == GS_CCCS) {
        gs_rat_mul(&t, &t, &x->val[j]);
        ok = add_current(m, x, row, e->ctrl, &t, depth + 1);
    } else if (e->kind != GS_ISOURCE) {
        int p = e->kind == GS_VCCS ? e->node[2] : e->node[0];
        int q = e->kind == GS_VCCS ? e->node[3] : e->node[1];
        if (e->kind == GS_RESISTOR) {
            gs_rat_div(&t, &t, &x->val[j]);
        } else {
            gs_rat_mul(&t, &t, &x->val[j]);
            if (e->kind == GS_CAPACITOR)
                gs_rat_mul(&t, &t, &x->s);
        }
        add(m, row, p - 1, &t, 1);
        add(m, row, q - 1, &t, -1);
    }
    gs_rat_clear(&t);
    return ok;
}

/* The stamp of element j: its current into the KCL rows, or its branch
   row.  Returns 0 as add_current does. */
static int stamp_elem(qmat *m, const mna_ctx *x, int j)
{
    const gs_element *e = &x->c->elems[j];
    const gs_rat *v = &x->val[j];
    int a = e->node[0] - 1, b = e->node[1] - 1, br = x->br[j], ok = 1;
    gs_rat one, t;
    gs_rat_init(&one);
    gs_rat_init(&t);
    gs_rat_set_si(&one, 1, 1);
    if (e->kind == GS_OPAMP) {
        add(m, a, br, &one, 1);
        add(m, br, e->node[1] - 1, &one, 1);
        add(m, br, e->node[2] - 1, &one, -1);
    } else if (br < 0) {
        gs_rat_neg(&t, &one);
        ok = add_current(m, x, a, j, &one, 0)
             && add_current(m, x, b, j, &t, 0);
    } else {
        add(m, a, br, &one, 1);
        add(m, b, br, &one, -1);
        add(m, br, a, &one, 1);
        add(m, br, b, &one, -1);
        if (e->kind == GS_INDUCTOR) {
            gs_rat_mul(&t, v, &x->s);
            add(m, br, br, &t, -1);
        } else if (e->kind == GS_VCVS) {
            add(m, br, e->node[2] - 1, v, -1);
            add(m, br, e->node[3] - 1, v, 1);
        } else if (e->kind == GS_CCVS) {
            gs_rat_neg(&t, v);
            ok = add_current(m, x, br, e->ctrl, &t, 0);
        }
    }
    gs_rat_clear(&t);
    gs_rat_clear(&one);
    return ok;
}

/* Is det A = 0?  Gaussian elimination over Q, exact. */
static int singular(qmat *m)
{
    int i, j, k, p, n = m->n;
    gs_rat f, t;
    gs_rat_init(&f);
    gs_rat_init(&t);
    for (k = 0; k < n; k++) {
        for (p = k; p < n && gs_rat_is_zero(at(m, p, k)); p++)
            ;
        if (p == n)
            break;
        for (j = 0; j < n && p != k; j++) {
            gs_rat_set(&t, at(m, k, j));
            gs_rat_set(at(m, k, j), at(m, p, j));
            gs_rat_set(at(m, p, j), &t);
        }
        for (i = k + 1; i < n; i++) {
            gs_rat_div(&f, at(m, i, k), at(m, k, k));
            for (j = k; j < n; j++) {
                gs_rat_mul(&t, &f, at(m, k, j));
                gs_rat_sub(at(m, i, j), at(m, i, j), &t);
            }
        }
    }
    gs_rat_clear(&t);
    gs_rat_clear(&f);
    return k < n;
}

/* Is the MNA matrix of c singular at these values?  (A circuit the MNA
   cannot write counts as singular.) */
static int circuit_singular(const gs_circuit *c, const int64_t *num)
{
    qmat m;
    mna_ctx x;
    size_t i;
    int n = c->nnodes - 1, k, result = 1, ok = 1;
    x.c = c;
    x.val = malloc((c->nelems + 1) * sizeof *x.val);
    x.br = malloc((c->nelems + 1) * sizeof *x.br);
    gs_rat_init(&x.s);
    gs_rat_set_si(&x.s, 7, 1);
    for (i = 0; i < c->nelems; i++) {
        gs_rat_init(&x.val[i]);
        value_num(&x.val[i], &c->elems[i].value, num);
        x.br[i] = has_branch(c->elems[i].kind) ? n++ : -1;
    }
    m.n = n;
    m.a = malloc((size_t)(n > 0 ? n * n : 1) * sizeof *m.a);
    for (k = 0; k < n * n; k++)
        gs_rat_init(&m.a[k]);
    for (i = 0; i < c->nelems && ok; i++)
        ok = stamp_elem(&m, &x, (int)i);
    if (ok)
        result = n > 0 && singular(&m);
    for (k = 0; k < n * n; k++)
        gs_rat_clear(&m.a[k]);
    for (i = 0; i < c->nelems; i++)
        gs_rat_clear(&x.val[i]);
    gs_rat_clear(&x.s);
    free(m.a);
    free(x.br);
    free(x.val);
    return result;
}

static unsigned next_rand(gs_rng *state)
{
    return test_below(state, 0x8000);
}

/* A random circuit of every element kind but devices. */
static char *random_circuit(gs_rng *st)
{
    static const char *const kinds[] = {"resistor", "capacitor", "inductor",
        "conductance", "vsource", "isource", "vccs", "vcvs", "opamp",
        "cccs", "ccvs"};
    static const int nn[] = {2, 2, 2, 2, 2, 2, 4, 4, 3, 2, 2};
    char *text = calloc(4096, 1);
    int nodes = 2 + (int)(next_rand(st) % 4);
    int ne = 2 + (int)(next_rand(st) % 6);
    int e, j;
    for (e = 0; e < ne; e++) {
        int k = (int)(next_rand(st) % 11);
        sprintf(text + strlen(text), "%s X%d", kinds[k], e);
        for (j = 0; j < nn[k]; j++) {
            int node = (int)(next_rand(st) % (unsigned)(nodes + 1));
            sprintf(text + strlen(text), " %d", node);
        }
        if (k >= 9)             /* the controlling element: any of them */
            sprintf(text + strlen(text), " X%u", next_rand(st) % (unsigned)ne);
        strcat(text, "\n");
    }
    return text;
}

static void test_rejected_are_singular(void)
{
    unsigned seed = 1234567u;
    gs_rng st;
    int round, rejected = 0, accepted = 0;
    gs_rng_seed(&st, seed);
    for (round = 0; round < 3000; round++) {
        char *text = random_circuit(&st);
        gs_circuit *c = gs_circuit_new();
        gs_diag d;
        int rc, k, nsym;
        int64_t *num;
        gs_diag_init(&d);
        rc = gs_parse_string(c, "r.gsc", text, &d);
        nsym = gs_symtab_count(c->syms);
        num = malloc((size_t)nsym * sizeof *num);
        for (k = 0; k < nsym; k++)     /* distinct primes-ish values */
            num[k] = 11 + 2 * (int64_t)(next_rand(&st) % 500);
        if (rc == GS_EINVAL) {
            rejected++;
            CHECK_MSG(circuit_singular(c, num), "seed %u round %d: rejected "
                      "but regular:\n%s", seed, round, text);
        } else {
            accepted += rc == GS_OK;
            CHECK_MSG(rc == GS_OK, "seed %u round %d: rc %d", seed, round,
                      rc);
        }
        free(num);
        free(text);
        gs_diag_clear(&d);
        gs_circuit_free(c);
    }
    CHECK(rejected > 300 && accepted > 300);    /* both sides exercised */
}

int main(void)
{
    test_sound();
    test_voltage_loops();
    test_cut_sets();
    test_floating();
    test_opamps();
    test_cccs_loops();
    test_outputs();
    test_warnings();
    test_all_reported();
    test_direct();
    test_rejected_are_singular();
    return check_report("check");
}
