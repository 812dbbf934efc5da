/* mna.c - modified nodal analysis: circuit -> bordered polynomial matrix.
 * See LICENSE.
 *
 * Sign conventions (DESIGN.md): each node row says "sum of the currents
 * leaving the node through elements = 0", with source terms moved to the
 * right-hand side b.  A two-terminal element's current flows from its
 * first node, through it, to its second node.
 */
#include "analysis/mna.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

/* One term of a value: a rational times a monomial (unpacked exponents). */
typedef struct qterm {
    gs_rat c;
    unsigned *e;        /* nvars exponents */
} qterm;

/* A linear combination of unknowns: sum t[k] * x[idx[k]], where
   idx = -1 stands for the input source's unit amplitude. */
typedef struct lin {
    size_t n, alloc;
    int *idx;
    qterm *t;
} lin;

/* An entry while stamping: p / den with p over Z. */
typedef struct qentry {
    gs_poly p;
    gs_int den;
} qentry;

typedef struct builder {
    const gs_circuit *c;
    const gs_polyctx *ctx;
    int nvars;
    int n;              /* unknowns */
    int *branch;        /* element -> branch unknown, or -1 */
    qentry *q;          /* (n+1)^2 */
    qentry c0;
    int input;          /* element index of the input source, or -1 */
    gs_diag *d;
} builder;

static void qterm_init(qterm *t, int nvars)
{
    gs_rat_init(&t->c);
    t->e = gs_calloc((size_t)nvars, sizeof *t->e);
}

static void qterm_clear(qterm *t)
{
    gs_rat_clear(&t->c);
    gs_free(t->e);
}

static void lin_init(lin *l)
{
    l->n = l->alloc = 0;
    l->idx = NULL;
    l->t = NULL;
}

static void lin_clear(lin *l)
{
    size_t i;
    for (i = 0; i < l->n; i++)
        qterm_clear(&l->t[i]);
    gs_free(l->idx);
    gs_free(l->t);
    lin_init(l);
}

/* Append idx * t (t copied) */
static void lin_push(lin *l, int idx, const qterm *t, int nvars)
{
    qterm *dst;
    if (l->n == l->alloc) {
        l->alloc = l->alloc ? 2 * l->alloc : 4;
        l->idx = gs_reallocarray(l->idx, l->alloc, sizeof *l->idx);
        l->t = gs_reallocarray(l->t, l->alloc, sizeof *l->t);
    }
    dst = &l->t[l->n];
    qterm_init(dst, nvars);
    gs_rat_set(&dst->c, &t->c);
    memcpy(dst->e, t->e, (size_t)nvars * sizeof *t->e);
    l->idx[l->n++] = idx;
}

/* t = t * u */
static void qterm_mul(qterm *t, const qterm *u, int nvars)
{
    int i;
    gs_rat_mul(&t->c, &t->c, &u->c);
    for (i = 0; i < nvars; i++)
        t->e[i] += u->e[i];
}

/* t = sign * v, or its reciprocal (invert), times s (times_s).  Negative
   exponents of the monomial become reciprocal symbols. */
static void qterm_from_value(qterm *t, const builder *b, const gs_monomial *v,
                             int invert, int times_s, int sign)
{
    int i;
    memset(t->e, 0, (size_t)b->nvars * sizeof *t->e);
    if (invert)
        gs_rat_inv(&t->c, &v->coeff);   /* coeff != 0: the parser checks */
    else
        gs_rat_set(&t->c, &v->coeff);
    if (sign < 0)
        gs_rat_neg(&t->c, &t->c);
    for (i = 0; i < v->n; i++) {
        int e = invert ? -v->exp[i] : v->exp[i];
        int sym = v->sym[i];
        if (e < 0) {
            sym = gs_symtab_find_recip(b->c->syms, sym);
            e = -e;
        }
        t->e[sym] += (unsigned)e;
    }
    if (times_s)
        t->e[b->c->s_sym] += 1;
}

static void qterm_set_si(qterm *t, int nvars, int64_t v)
{
    gs_rat_set_si(&t->c, v, 1);
    memset(t->e, 0, (size_t)nvars * sizeof *t->e);
}

static qentry *entry(builder *b, int row, int col)
{
    return &b->q[(size_t)row * (size_t)(b->n + 1) + (size_t)col];
}

/* e += t.  The term is pushed, not added: an entry that gathers n stamps
   (a node with n resistors) would otherwise be copied n times, O(n^2)
   terms moved; finish_rows puts each entry in canonical form once. */
static void qentry_add(qentry *q, const qterm *t, const gs_polyctx *ctx)
{
    gs_int l, f;
    gs_int_init(&l);
    gs_int_init(&f);
    gs_int_lcm(&l, &q->den, &t->c.den);
    if (gs_int_cmp(&l, &q->den) != 0) {     /* rare: a new denominator */
        gs_poly_canonicalise(&q->p, ctx);
        gs_int_divexact(&f, &l, &q->den);
        gs_poly_mul_int(&q->p, &q->p, &f, ctx);
    }
    gs_int_divexact(&f, &l, &t->c.den);
    gs_int_mul(&f, &f, &t->c.num);
    gs_poly_push_term(&q->p, &f, t->e, ctx);
    gs_int_swap(&q->den, &l);
    gs_int_clear(&f);
    gs_int_clear(&l);
}

/* entry (row, col) += sign * t; a row or column of -1 is ground: dropped */
static void stamp(builder *b, int row, int col, const qterm *t, int sign)
{
    qterm u;
    if (row < 0 || col < 0)
        return;
    if (sign > 0) {
        qentry_add(entry(b, row, col), t, b->ctx);
        return;
    }
    qterm_init(&u, b->nvars);
    gs_rat_neg(&u.c, &t->c);
    memcpy(u.e, t->e, (size_t)b->nvars * sizeof *u.e);
    qentry_add(entry(b, row, col), &u, b->ctx);
    qterm_clear(&u);
}

static int node_unknown(int node)
{
    return node > 0 ? node - 1 : -1;
}

static int is_two_terminal_admittance(gs_elem_kind k)
{
    return k == GS_RESISTOR || k == GS_CONDUCTANCE || k == GS_CAPACITOR;
}

static void admittance(qterm *t, const builder *b, const gs_element *e,
                       int sign)
{
    qterm_from_value(t, b, &e->value, e->kind == GS_RESISTOR,
                     e->kind == GS_CAPACITOR, sign);
}

/* l += scale * (current through element k), as a combination of unknowns
   (and the input amplitude, idx -1).  depth guards against a controlled
   source that is controlled, through others, by itself. */
static int current_of(lin *l, builder *b, int k, const qterm *scale,
                      int depth)
{
    const gs_element *e = &b->c->elems[k];
    qterm t;
    int rc = GS_OK;

    if (depth > (int)b->c->nelems) {
        gs_diag_add(b->d, GS_SEV_ERROR, b->c->file, e->line, e->col, NULL,
                    "the current of '%s' is controlled by itself through a "
                    "loop of current-controlled sources", e->name);
        return GS_EINVAL;
    }
    qterm_init(&t, b->nvars);
    if (b->branch[k] >= 0) {
        gs_rat_set(&t.c, &scale->c);
        memcpy(t.e, scale->e, (size_t)b->nvars * sizeof *t.e);
        lin_push(l, b->branch[k], &t, b->nvars);
    } else if (is_two_terminal_admittance(e->kind)
               || e->kind == GS_VCCS) {
        int p = e->kind == GS_VCCS ? e->node[2] : e->node[0];
        int m = e->kind == GS_VCCS ? e->node[3] : e->node[1];
        if (e->kind == GS_VCCS)
            qterm_from_value(&t, b, &e->value, 0, 0, 1);
        else
            admittance(&t, b, e, 1);
        qterm_mul(&t, scale, b->nvars);
        if (node_unknown(p) >= 0)
            lin_push(l, node_unknown(p), &t, b->nvars);
        gs_rat_neg(&t.c, &t.c);
        if (node_unknown(m) >= 0)
            lin_push(l, node_unknown(m), &t, b->nvars);
    } else if (e->kind == GS_CCCS) {
        qterm_from_value(&t, b, &e->value, 0, 0, 1);
        qterm_mul(&t, scale, b->nvars);
        rc = current_of(l, b, e->ctrl, &t, depth + 1);
    } else if (e->kind == GS_ISOURCE && k == b->input) {
        gs_rat_set(&t.c, &scale->c);
        memcpy(t.e, scale->e, (size_t)b->nvars * sizeof *t.e);
        lin_push(l, -1, &t, b->nvars);
    }
    qterm_clear(&t);
    return rc;
}

/* A current given by l flows from node a, through the element, to node b:
   it leaves a and enters b. */
static void stamp_current(builder *b, int a, int bb, const lin *l)
{
    size_t i;
    int ra = node_unknown(a), rb = node_unknown(bb);
    for (i = 0; i < l->n; i++) {
        if (l->idx[i] >= 0) {
            stamp(b, ra, l->idx[i], &l->t[i], 1);
            stamp(b, rb, l->idx[i], &l->t[i], -1);
        } else {                 /* known current: to the right side */
            stamp(b, ra, b->n, &l->t[i], -1);
            stamp(b, rb, b->n, &l->t[i], 1);
        }
    }
}

/* row k: v(a) - v(b) ... ; and the branch current in the KCL rows */
static void stamp_branch_voltage(builder *b, int k, int a, int bb,
                                 const qterm *one)
{
    stamp(b, node_unknown(a), k, one, 1);
    stamp(b, node_unknown(bb), k, one, -1);
    stamp(b, k, node_unknown(a), one, 1);
    stamp(b, k, node_unknown(bb), one, -1);
}

/* Row k gets -(sum of l), the constant part moving to the right side. */
static void stamp_row_lin(builder *b, int k, const lin *l)
{
    size_t i;
    for (i = 0; i < l->n; i++) {
        if (l->idx[i] >= 0)
            stamp(b, k, l->idx[i], &l->t[i], -1);
        else
            stamp(b, k, b->n, &l->t[i], 1);
    }
}

static int stamp_element(builder *b, int k)
{
    const gs_element *e = &b->c->elems[k];
    int br = b->branch[k], rc = GS_OK;
    qterm one, t;
    lin l;

    qterm_init(&one, b->nvars);
    qterm_set_si(&one, b->nvars, 1);
    qterm_init(&t, b->nvars);
    lin_init(&l);
    switch (e->kind) {
    case GS_RESISTOR:
    case GS_CONDUCTANCE:
    case GS_CAPACITOR:
    case GS_VCCS:
    case GS_CCCS:
    case GS_ISOURCE:
        rc = current_of(&l, b, k, &one, 0);
        stamp_current(b, e->node[0], e->node[1], &l);
        break;
    case GS_VSOURCE:
        stamp_branch_voltage(b, br, e->node[0], e->node[1], &one);
        if (k == b->input)
            stamp(b, br, b->n, &one, 1);
        break;
    case GS_INDUCTOR:
        stamp_branch_voltage(b, br, e->node[0], e->node[1], &one);
        qterm_from_value(&t, b, &e->value, 0, 1, -1);
        stamp(b, br, br, &t, 1);
        break;
    case GS_VCVS:
        stamp_branch_voltage(b, br, e->node[0], e->node[1], &one);
        qterm_from_value(&t, b, &e->value, 0, 0, 1);
        stamp(b, br, node_unknown(e->node[2]), &t, -1);
        stamp(b, br, node_unknown(e->node[3]), &t, 1);
        break;
    case GS_CCVS:
        stamp_branch_voltage(b, br, e->node[0], e->node[1], &one);
        qterm_from_value(&t, b, &e->value, 0, 0, 1);
        rc = current_of(&l, b, e->ctrl, &t, 1);
        stamp_row_lin(b, br, &l);
        break;
    case GS_OPAMP:
        /* nullor: the output current is free, v(+) = v(-) */
        stamp(b, node_unknown(e->node[0]), br, &one, 1);
        stamp(b, br, node_unknown(e->node[1]), &one, 1);
        stamp(b, br, node_unknown(e->node[2]), &one, -1);
        break;
    }
    lin_clear(&l);
    qterm_clear(&t);
    qterm_clear(&one);
    return rc;
}

static int has_branch(gs_elem_kind k)
{
    return k == GS_INDUCTOR || k == GS_VSOURCE || k == GS_VCVS
        || k == GS_CCVS || k == GS_OPAMP;
}

void gs_mna_intern_symbols(gs_circuit *c)
{
    size_t k;
    int i;
    for (k = 0; k < c->nelems; k++) {
        const gs_element *e = &c->elems[k];
        for (i = 0; i < e->value.n; i++) {
            int neg = e->value.exp[i] < 0;
            if (e->kind == GS_RESISTOR)
                neg = !neg;
            if (neg)
                gs_symtab_recip(c->syms, e->value.sym[i]);
        }
    }
}

static void setup(builder *b, gs_mna *m, const gs_circuit *c,
                  const gs_polyctx *ctx, gs_diag *d)
{
    size_t k, cells;
    int n = c->nnodes - 1;
    b->c = c;
    b->ctx = ctx;
    b->nvars = ctx->nvars;
    b->d = d;
    b->branch = gs_malloc((c->nelems ? c->nelems : 1) * sizeof *b->branch);
    for (k = 0; k < c->nelems; k++)
        b->branch[k] = has_branch(c->elems[k].kind) ? n++ : -1;
    b->n = n;
    cells = (size_t)(n + 1) * (size_t)(n + 1);
    b->q = gs_malloc(cells * sizeof *b->q);
    for (k = 0; k < cells; k++) {
        gs_poly_init(&b->q[k].p);
        gs_int_init(&b->q[k].den);
        gs_int_set_si(&b->q[k].den, 1);
    }
    gs_poly_init(&b->c0.p);
    gs_int_init(&b->c0.den);
    gs_int_set_si(&b->c0.den, 1);

    m->n = n;
    m->nnode_unknowns = c->nnodes - 1;
    m->unknown_name = gs_malloc((size_t)(n ? n : 1) * sizeof(char *));
    for (k = 0; k + 1 < (size_t)c->nnodes; k++)
        m->unknown_name[k] = gs_asprintf("v(%s)", c->node_name[k + 1]);
    for (k = 0; k < c->nelems; k++)
        if (b->branch[k] >= 0)
            m->unknown_name[b->branch[k]] =
                gs_asprintf("i(%s)", c->elems[k].name);
}

/* The probe row: v(a, b) or the current of an element. */
static int stamp_probe(builder *b, const gs_probe *p)
{
    qterm one;
    lin l;
    size_t i;
    int rc = GS_OK;
    qterm_init(&one, b->nvars);
    qterm_set_si(&one, b->nvars, 1);
    lin_init(&l);
    if (p->kind == GS_PROBE_V) {
        stamp(b, b->n, node_unknown(p->a), &one, 1);
        stamp(b, b->n, node_unknown(p->b), &one, -1);
    } else {
        rc = current_of(&l, b, p->elem, &one, 0);
        for (i = 0; i < l.n; i++) {
            if (l.idx[i] >= 0)
                stamp(b, b->n, l.idx[i], &l.t[i], 1);
            else
                qentry_add(&b->c0, &l.t[i], b->ctx);
        }
    }
    lin_clear(&l);
    qterm_clear(&one);
    return rc;
}

/* Turn the rational rows into integer rows: each row times the lcm of its
   denominators.  The border row's factor goes into m->scale. */
static void finish_rows(builder *b, gs_mna *m)
{
    int i, j, n1 = b->n + 1;
    gs_int l, f;
    gs_int_init(&l);
    gs_int_init(&f);
    m->m = gs_malloc((size_t)n1 * (size_t)n1 * sizeof *m->m);
    for (i = 0; i < n1 * n1; i++)
        gs_poly_canonicalise(&b->q[i].p, b->ctx);
    gs_poly_canonicalise(&b->c0.p, b->ctx);
    for (i = 0; i < n1; i++) {
        gs_int_set_si(&l, 1);
        for (j = 0; j < n1; j++)
            gs_int_lcm(&l, &l, &entry(b, i, j)->den);
        if (i == b->n)
            gs_int_lcm(&l, &l, &b->c0.den);
        for (j = 0; j < n1; j++) {
            qentry *q = entry(b, i, j);
            gs_int_divexact(&f, &l, &q->den);
            gs_poly_init(GS_MNA_AT(m, i, j));
            gs_poly_mul_int(GS_MNA_AT(m, i, j), &q->p, &f, b->ctx);
        }
        if (i == b->n) {
            gs_int_divexact(&f, &l, &b->c0.den);
            gs_poly_mul_int(&m->c0, &b->c0.p, &f, b->ctx);
            gs_int_set_si(&f, 1);
            gs_rat_set_int_int(&m->scale, &f, &l);
        }
    }
    gs_int_clear(&f);
    gs_int_clear(&l);
}

static void builder_clear(builder *b)
{
    size_t k, cells = (size_t)(b->n + 1) * (size_t)(b->n + 1);
    for (k = 0; k < cells; k++) {
        gs_poly_clear(&b->q[k].p);
        gs_int_clear(&b->q[k].den);
    }
    gs_free(b->q);
    gs_poly_clear(&b->c0.p);
    gs_int_clear(&b->c0.den);
    gs_free(b->branch);
}

/* The input column b: a unit source at the transfer's input, or a unit
   test current into node a (from b) for an impedance. */
static void stamp_input(builder *b, const gs_output *o)
{
    qterm one;
    qterm_init(&one, b->nvars);
    qterm_set_si(&one, b->nvars, 1);
    if (o->kind == GS_OUT_IMPEDANCE) {
        stamp(b, node_unknown(o->a), b->n, &one, 1);
        stamp(b, node_unknown(o->b), b->n, &one, -1);
    }
    qterm_clear(&one);
}

int gs_mna_build(gs_mna *m, const gs_circuit *c, size_t out,
                 const gs_polyctx *ctx, gs_diag *d)
{
    const gs_output *o = &c->outputs[out];
    builder b;
    size_t k;
    int rc = GS_OK;

    setup(&b, m, c, ctx, d);
    gs_poly_init(&m->c0);
    gs_rat_init(&m->scale);
    b.input = o->kind == GS_OUT_TRANSFER ? o->in : -1;
    for (k = 0; k < c->nelems && rc == GS_OK; k++)
        rc = stamp_element(&b, (int)k);
    if (rc == GS_OK)
        stamp_input(&b, o);
    if (rc == GS_OK) {
        gs_probe p = o->out;
        if (o->kind == GS_OUT_IMPEDANCE) {
            p.kind = GS_PROBE_V;
            p.a = o->a;
            p.b = o->b;
        }
        rc = stamp_probe(&b, &p);
    }
    finish_rows(&b, m);
    builder_clear(&b);
    if (rc != GS_OK)
        gs_mna_clear(m);
    return rc;
}

void gs_mna_clear(gs_mna *m)
{
    size_t k, cells;
    if (m->m == NULL)
        return;
    cells = (size_t)(m->n + 1) * (size_t)(m->n + 1);
    for (k = 0; k < cells; k++)
        gs_poly_clear(&m->m[k]);
    gs_free(m->m);
    m->m = NULL;
    for (k = 0; k < (size_t)m->n; k++)
        gs_free(m->unknown_name[k]);
    gs_free(m->unknown_name);
    m->unknown_name = NULL;
    gs_poly_clear(&m->c0);
    gs_rat_clear(&m->scale);
}
