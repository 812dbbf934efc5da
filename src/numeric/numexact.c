/* numexact.c - the exact reference value of a circuit's output at one s.
 * See LICENSE.
 *
 * The same equations as numsolve.c (unknowns: node voltages 1 .. nnodes-1,
 * then one current per element that defines a voltage; rows: KCL at each
 * node, then each such element's voltage equation), stamped in Gaussian
 * rationals into a bordered matrix
 *
 *     M = [ A  b ]      A x = b the MNA, c^T x the output quantity,
 *         [ c  0 ]
 *
 * whose determinants give c^T x = -det M / det A (expand det M along its
 * last row and column: det M = -c^T adj(A) b).  Both come out of one
 * fraction-free elimination (E. H. Bareiss, "Sylvester's identity and
 * multistep integer-preserving Gaussian elimination", Math. Comp. 22
 * (1968)): after step k the pivot is the leading (k+1)-by-(k+1) minor,
 * every division is exact, and it holds in any integral domain, here the
 * Gaussian integers Z[i] once each row is scaled by the lcm of its
 * denominators.  Pivots are taken from the first n rows only, so a row
 * swap changes the sign of both determinants alike.
 */
#include "numeric/numexact.h"
#include "algebra/rat.h"
#include "base/mem.h"
#include "numeric/roots.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* ---- Gaussian rationals and integers --------------------------------- */

typedef struct crat {
    gs_rat re, im;
} crat;

typedef struct gint {
    gs_int re, im;
} gint;

static void cr_init(crat *a)
{
    gs_rat_init(&a->re);
    gs_rat_init(&a->im);
}

static void cr_clear(crat *a)
{
    gs_rat_clear(&a->re);
    gs_rat_clear(&a->im);
}

static void cr_set(crat *r, const crat *a)
{
    gs_rat_set(&r->re, &a->re);
    gs_rat_set(&r->im, &a->im);
}

static void cr_set_si(crat *r, int64_t v)
{
    gs_rat_set_si(&r->re, v, 1);
    gs_rat_set_si(&r->im, 0, 1);
}

static int cr_is_zero(const crat *a)
{
    return gs_rat_is_zero(&a->re) && gs_rat_is_zero(&a->im);
}

static void cr_add(crat *r, const crat *a, const crat *b)
{
    gs_rat_add(&r->re, &a->re, &b->re);
    gs_rat_add(&r->im, &a->im, &b->im);
}

static void cr_sub(crat *r, const crat *a, const crat *b)
{
    gs_rat_sub(&r->re, &a->re, &b->re);
    gs_rat_sub(&r->im, &a->im, &b->im);
}

static void cr_neg(crat *r, const crat *a)
{
    gs_rat_neg(&r->re, &a->re);
    gs_rat_neg(&r->im, &a->im);
}

static void cr_mul(crat *r, const crat *a, const crat *b)
{
    gs_rat t1, t2, re;
    gs_rat_init(&t1);
    gs_rat_init(&t2);
    gs_rat_init(&re);
    gs_rat_mul(&t1, &a->re, &b->re);
    gs_rat_mul(&t2, &a->im, &b->im);
    gs_rat_sub(&re, &t1, &t2);
    gs_rat_mul(&t1, &a->re, &b->im);
    gs_rat_mul(&t2, &a->im, &b->re);
    gs_rat_add(&r->im, &t1, &t2);
    gs_rat_set(&r->re, &re);
    gs_rat_clear(&t1);
    gs_rat_clear(&t2);
    gs_rat_clear(&re);
}

/* r = a / b = a conj(b) / |b|^2; GS_EDIVZERO for b = 0. */
static int cr_div(crat *r, const crat *a, const crat *b)
{
    crat cb;
    gs_rat n2, t;
    if (cr_is_zero(b))
        return GS_EDIVZERO;
    cr_init(&cb);
    gs_rat_init(&n2);
    gs_rat_init(&t);
    gs_rat_mul(&n2, &b->re, &b->re);
    gs_rat_mul(&t, &b->im, &b->im);
    gs_rat_add(&n2, &n2, &t);
    gs_rat_set(&cb.re, &b->re);
    gs_rat_neg(&cb.im, &b->im);
    cr_mul(r, a, &cb);
    gs_rat_div(&r->re, &r->re, &n2);
    gs_rat_div(&r->im, &r->im, &n2);
    cr_clear(&cb);
    gs_rat_clear(&n2);
    gs_rat_clear(&t);
    return GS_OK;
}

static void gi_init(gint *a)
{
    gs_int_init(&a->re);
    gs_int_init(&a->im);
}

static void gi_clear(gint *a)
{
    gs_int_clear(&a->re);
    gs_int_clear(&a->im);
}

static int gi_is_zero(const gint *a)
{
    return gs_int_is_zero(&a->re) && gs_int_is_zero(&a->im);
}

static void gi_swap(gint *a, gint *b)
{
    gs_int_swap(&a->re, &b->re);
    gs_int_swap(&a->im, &b->im);
}

/* r = a*b - c*d, with the scratch t (four integers). */
static void gi_cross(gint *r, const gint *a, const gint *b, const gint *c,
                     const gint *d, gs_int *t)
{
    gs_int_mul(&t[0], &a->re, &b->re);
    gs_int_submul(&t[0], &a->im, &b->im);
    gs_int_mul(&t[1], &a->re, &b->im);
    gs_int_addmul(&t[1], &a->im, &b->re);
    gs_int_submul(&t[0], &c->re, &d->re);
    gs_int_addmul(&t[0], &c->im, &d->im);
    gs_int_submul(&t[1], &c->re, &d->im);
    gs_int_submul(&t[1], &c->im, &d->re);
    gs_int_swap(&r->re, &t[0]);
    gs_int_swap(&r->im, &t[1]);
}

/* r = a / p, exact in Z[i] (Bareiss guarantees it): a conj(p) / |p|^2,
   scratch t (four integers).  p is a real integer most of the time, the
   cheap case. */
static int gi_divexact(gint *r, const gint *a, const gint *p, gs_int *t)
{
    int rc;
    if (gs_int_is_zero(&p->im)) {
        rc = gs_int_divexact(&r->re, &a->re, &p->re);
        if (rc == GS_OK)
            rc = gs_int_divexact(&r->im, &a->im, &p->re);
        return rc;
    }
    gs_int_mul(&t[2], &p->re, &p->re);
    gs_int_addmul(&t[2], &p->im, &p->im);
    gs_int_mul(&t[0], &a->re, &p->re);
    gs_int_addmul(&t[0], &a->im, &p->im);
    gs_int_mul(&t[1], &a->im, &p->re);
    gs_int_submul(&t[1], &a->re, &p->im);
    rc = gs_int_divexact(&r->re, &t[0], &t[2]);
    if (rc == GS_OK)
        rc = gs_int_divexact(&r->im, &t[1], &t[2]);
    return rc;
}

/* The exact rational a long double is: its 64-bit significand times a
   power of two.  GS_ERANGE for infinities and NaN. */
static int rat_from_ld(gs_rat *r, long double x)
{
    gs_int n, d;
    int e;
    long double m;
    if (!isfinite(x))
        return GS_ERANGE;
    gs_int_init(&n);
    gs_int_init(&d);
    m = frexpl(x, &e);                  /* x = m 2^e, 1/2 <= |m| < 1 */
    gs_int_set_ui(&n, (uint64_t)ldexpl(fabsl(m), 64));
    if (x < 0)
        gs_int_neg(&n, &n);
    e -= 64;
    gs_int_set_si(&d, 1);
    if (e >= 0)
        gs_int_mul_2exp(&n, &n, (unsigned long)e);
    else
        gs_int_mul_2exp(&d, &d, (unsigned long)-e);
    gs_rat_set_int_int(r, &n, &d);
    gs_int_clear(&n);
    gs_int_clear(&d);
    return GS_OK;
}

/* ---- the system ------------------------------------------------------- */

typedef struct xsys {
    int n;              /* unknowns; the bordered matrix is (n+1)^2 */
    crat *m;            /* row-major, (n+1) x (n+1) */
    crat known;         /* the output's part that no unknown carries */
    int *branch;        /* element -> current unknown, or -1 */
    const gs_circuit *c;
    gs_rat *v;          /* exact symbol values, converted on first use */
    unsigned char *have;
    const long double *vals;
    crat s;
    int input;          /* the input source, or -1 */
    gs_numexact_why *why;
} xsys;

static crat *at(xsys *sy, int r, int col)
{
    return &sy->m[(size_t)r * (size_t)(sy->n + 1) + (size_t)col];
}

static int vidx(int node)
{
    return node - 1;        /* node 0 is ground: -1, dropped */
}

static void add(xsys *sy, int r, int col, const crat *v)
{
    if (r >= 0 && col >= 0)
        cr_add(at(sy, r, col), at(sy, r, col), v);
}

static void add_si(xsys *sy, int r, int col, int64_t v)
{
    crat t;
    cr_init(&t);
    cr_set_si(&t, v);
    add(sy, r, col, &t);
    cr_clear(&t);
}

static void sub(xsys *sy, int r, int col, const crat *v)
{
    if (r >= 0 && col >= 0)
        cr_sub(at(sy, r, col), at(sy, r, col), v);
}

/* out = the exact value of monomial m.  GS_EDIVZERO (why->zero_sym set)
   when a symbol of value 0 has a negative power. */
static int value_of(crat *out, xsys *sy, const gs_monomial *m)
{
    gs_rat p;
    int i, rc = GS_OK;
    gs_rat_init(&p);
    gs_rat_set(&out->re, &m->coeff);
    gs_rat_set_si(&out->im, 0, 1);
    for (i = 0; i < m->n && rc == GS_OK; i++) {
        int v = m->sym[i];
        if (!sy->have[v]) {
            rc = rat_from_ld(&sy->v[v], sy->vals[v]);
            sy->have[v] = 1;
            if (rc != GS_OK)
                break;
        }
        if (m->exp[i] < 0 && gs_rat_is_zero(&sy->v[v])) {
            if (sy->why)
                sy->why->zero_sym = v;
            rc = GS_EDIVZERO;
            break;
        }
        gs_rat_pow_si(&p, &sy->v[v], m->exp[i]);
        gs_rat_mul(&out->re, &out->re, &p);
    }
    gs_rat_clear(&p);
    return rc;
}

/* y = the admittance of a two-terminal element k (G, 1/R or sC). */
static int admittance(crat *y, xsys *sy, int k)
{
    const gs_element *e = &sy->c->elems[k];
    crat one;
    int rc = value_of(y, sy, &e->value);
    if (rc != GS_OK || e->kind != GS_RESISTOR) {
        if (rc == GS_OK && e->kind == GS_CAPACITOR)
            cr_mul(y, y, &sy->s);
        if (rc == GS_EDIVZERO && sy->why)
            sy->why->zero_elem = k;
        return rc;
    }
    cr_init(&one);
    cr_set_si(&one, 1);
    rc = cr_div(y, &one, y);
    cr_clear(&one);
    if (rc != GS_OK && sy->why) {
        sy->why->zero_elem = k;
        if (sy->why->zero_sym < 0 && e->value.n > 0)
            sy->why->zero_sym = e->value.sym[0];
    }
    return rc;
}

/* The current through element k as coefficients over the unknowns plus a
   known part (the input source's unit current), times scale. */
static int current_coeffs(crat *row, crat *known, xsys *sy, int k,
                          const crat *scale, int depth)
{
    const gs_element *e = &sy->c->elems[k];
    crat y;
    int rc = GS_OK;
    if (depth > (int)sy->c->nelems)
        return GS_OK;       /* a control loop: mna.c reports it */
    if (sy->branch[k] >= 0) {
        cr_add(&row[sy->branch[k]], &row[sy->branch[k]], scale);
        return GS_OK;
    }
    cr_init(&y);
    switch (e->kind) {
    case GS_RESISTOR:
    case GS_CONDUCTANCE:
    case GS_CAPACITOR:
    case GS_VCCS:
        rc = e->kind == GS_VCCS ? value_of(&y, sy, &e->value)
                                : admittance(&y, sy, k);
        if (rc != GS_OK)
            break;
        cr_mul(&y, &y, scale);
        {
            int p = e->kind == GS_VCCS ? 2 : 0;
            if (vidx(e->node[p]) >= 0)
                cr_add(&row[vidx(e->node[p])], &row[vidx(e->node[p])], &y);
            if (vidx(e->node[p + 1]) >= 0)
                cr_sub(&row[vidx(e->node[p + 1])],
                       &row[vidx(e->node[p + 1])], &y);
        }
        break;
    case GS_CCCS:
        rc = value_of(&y, sy, &e->value);
        if (rc == GS_OK) {
            cr_mul(&y, &y, scale);
            rc = current_coeffs(row, known, sy, e->ctrl, &y, depth + 1);
        }
        break;
    case GS_ISOURCE:
        if (k == sy->input)
            cr_add(known, known, scale);
        break;
    default:
        break;
    }
    cr_clear(&y);
    return rc;
}

static void row_zero(crat *row, int n)
{
    int j;
    for (j = 0; j < n; j++)
        cr_set_si(&row[j], 0);
}

/* A current (row . x + known) flowing from node a through the element to
   node b; the known part goes to the right-hand side, column n. */
static void stamp_flow(xsys *sy, int a, int b, const crat *row,
                       const crat *known)
{
    int j;
    for (j = 0; j < sy->n; j++) {
        if (cr_is_zero(&row[j]))
            continue;
        add(sy, vidx(a), j, &row[j]);
        sub(sy, vidx(b), j, &row[j]);
    }
    sub(sy, vidx(a), sy->n, known);
    add(sy, vidx(b), sy->n, known);
}

static void stamp_voltage_row(xsys *sy, int k, const gs_element *e)
{
    int br = sy->branch[k];
    add_si(sy, vidx(e->node[0]), br, 1);
    add_si(sy, vidx(e->node[1]), br, -1);
    add_si(sy, br, vidx(e->node[0]), 1);
    add_si(sy, br, vidx(e->node[1]), -1);
}

static int stamp(xsys *sy, int k, crat *row, crat *g, crat *known)
{
    const gs_element *e = &sy->c->elems[k];
    int br = sy->branch[k], j, rc = GS_OK;
    row_zero(row, sy->n);
    cr_set_si(known, 0);
    switch (e->kind) {
    case GS_VSOURCE:
        stamp_voltage_row(sy, k, e);
        if (k == sy->input)
            add_si(sy, br, sy->n, 1);
        break;
    case GS_INDUCTOR:
        stamp_voltage_row(sy, k, e);
        rc = value_of(g, sy, &e->value);
        cr_mul(g, g, &sy->s);
        sub(sy, br, br, g);
        break;
    case GS_VCVS:
        stamp_voltage_row(sy, k, e);
        rc = value_of(g, sy, &e->value);
        sub(sy, br, vidx(e->node[2]), g);
        add(sy, br, vidx(e->node[3]), g);
        break;
    case GS_CCVS:
        stamp_voltage_row(sy, k, e);
        rc = value_of(g, sy, &e->value);
        if (rc == GS_OK)
            rc = current_coeffs(row, known, sy, e->ctrl, g, 1);
        for (j = 0; j < sy->n; j++)
            sub(sy, br, j, &row[j]);
        add(sy, br, sy->n, known);
        break;
    case GS_OPAMP:
        add_si(sy, vidx(e->node[0]), br, 1);
        add_si(sy, br, vidx(e->node[1]), 1);
        add_si(sy, br, vidx(e->node[2]), -1);
        break;
    default:
        cr_set_si(g, 1);
        rc = current_coeffs(row, known, sy, k, g, 0);
        stamp_flow(sy, e->node[0], e->node[1], row, known);
        break;
    }
    if (rc == GS_EDIVZERO && sy->why && sy->why->zero_elem < 0)
        sy->why->zero_elem = k;
    return rc;
}

/* The output row c (row n) and its known part. */
static int stamp_output(xsys *sy, const gs_output *o, crat *row, crat *g)
{
    int j, a = o->out.a, b = o->out.b, rc = GS_OK;
    if (o->kind == GS_OUT_IMPEDANCE || o->out.kind == GS_PROBE_V) {
        if (o->kind == GS_OUT_IMPEDANCE) {
            a = o->a;
            b = o->b;
        }
        add_si(sy, sy->n, vidx(a), 1);
        add_si(sy, sy->n, vidx(b), -1);
        return GS_OK;
    }
    row_zero(row, sy->n);
    cr_set_si(g, 1);
    rc = current_coeffs(row, &sy->known, sy, o->out.elem, g, 0);
    for (j = 0; j < sy->n; j++)
        add(sy, sy->n, j, &row[j]);
    return rc;
}

/* Scale each row of the bordered matrix to Gaussian integers; *lc gets
   the border row's scale. */
static void to_integers(gint *z, gs_int *lc, const xsys *sy)
{
    int nn = sy->n + 1, i, j;
    gs_int l, q;
    gs_int_init(&l);
    gs_int_init(&q);
    for (i = 0; i < nn; i++) {
        const crat *r = &sy->m[(size_t)i * (size_t)nn];
        gs_int_set_si(&l, 1);
        for (j = 0; j < nn; j++) {
            gs_int_lcm(&l, &l, &r[j].re.den);
            gs_int_lcm(&l, &l, &r[j].im.den);
        }
        for (j = 0; j < nn; j++) {
            gint *e = &z[(size_t)i * (size_t)nn + (size_t)j];
            gs_int_divexact(&q, &l, &r[j].re.den);
            gs_int_mul(&e->re, &r[j].re.num, &q);
            gs_int_divexact(&q, &l, &r[j].im.den);
            gs_int_mul(&e->im, &r[j].im.num, &q);
        }
        if (i == sy->n)
            gs_int_set(lc, &l);
    }
    gs_int_clear(&l);
    gs_int_clear(&q);
}

/* Bareiss on z (nn = n+1 square), pivots from the first n rows.  *da gets
   det A and *dm det M, both times the same sign.  GS_ESINGULAR when
   det A = 0. */
static int bareiss(gint *da, gint *dm, gint *z, int n)
{
    int nn = n + 1, i, j, k, p, rc = GS_OK;
    gint prev;
    gs_int t[4];
#define Z(r, cc) (&z[(size_t)(r) * (size_t)nn + (size_t)(cc)])
    gi_init(&prev);
    for (i = 0; i < 4; i++)
        gs_int_init(&t[i]);
    gs_int_set_si(&prev.re, 1);
    for (k = 0; k < n && rc == GS_OK; k++) {
        for (p = k; p < n && gi_is_zero(Z(p, k)); p++)
            ;
        if (p == n) {
            rc = GS_ESINGULAR;
            break;
        }
        if (p != k)
            for (j = 0; j < nn; j++)
                gi_swap(Z(p, j), Z(k, j));
        for (i = k + 1; i < nn && rc == GS_OK; i++)
            for (j = k + 1; j < nn && rc == GS_OK; j++) {
                gi_cross(Z(i, j), Z(k, k), Z(i, j), Z(i, k), Z(k, j), t);
                rc = gi_divexact(Z(i, j), Z(i, j), &prev, t);
            }
        gs_int_set(&prev.re, &Z(k, k)->re);
        gs_int_set(&prev.im, &Z(k, k)->im);
    }
    if (rc == GS_OK) {
        gs_int_set(&da->re, &prev.re);
        gs_int_set(&da->im, &prev.im);
        gs_int_set(&dm->re, &Z(n, n)->re);
        gs_int_set(&dm->im, &Z(n, n)->im);
    }
#undef Z
    gi_clear(&prev);
    for (i = 0; i < 4; i++)
        gs_int_clear(&t[i]);
    return rc;
}

/* h = -dm / (da * lc) + known, as a Gaussian rational. */
static void read_off(crat *h, const gint *da, const gint *dm,
                     const gs_int *lc, const crat *known)
{
    crat num, den;
    cr_init(&num);
    cr_init(&den);
    gs_rat_set_int(&num.re, &dm->re);
    gs_rat_set_int(&num.im, &dm->im);
    cr_neg(&num, &num);
    gs_rat_set_int(&den.re, &da->re);
    gs_rat_set_int(&den.im, &da->im);
    gs_rat_set_int(&den.re, &da->re);
    {
        gs_rat l;
        gs_rat_init(&l);
        gs_rat_set_int(&l, lc);
        gs_rat_mul(&den.re, &den.re, &l);
        gs_rat_mul(&den.im, &den.im, &l);
        gs_rat_clear(&l);
    }
    cr_div(h, &num, &den);          /* den != 0: det A was a pivot */
    cr_add(h, h, known);
    cr_clear(&num);
    cr_clear(&den);
}

static int is_voltage_defined(gs_elem_kind k)
{
    return k == GS_INDUCTOR || k == GS_VSOURCE || k == GS_VCVS
        || k == GS_CCVS || k == GS_OPAMP;
}

typedef struct xctx {
    const gs_circuit *c;
    gs_rat *v;
    unsigned char *have;
    const long double *vals;
    crat s;
    gs_numexact_why *why;
} xctx;

/* A transfer or an impedance: stamp, eliminate, read off. */
static int solve_linear(crat *h, xctx *x, const gs_output *o)
{
    const gs_circuit *c = x->c;
    xsys sy;
    size_t k, nn2;
    int n = c->nnodes - 1, rc = GS_OK;
    crat *row, g, known;
    gint *z, da, dm;
    gs_int lc;

    sy.branch = gs_malloc((c->nelems ? c->nelems : 1) * sizeof *sy.branch);
    for (k = 0; k < c->nelems; k++)
        sy.branch[k] = is_voltage_defined(c->elems[k].kind) ? n++ : -1;
    sy.n = n;
    sy.c = c;
    sy.v = x->v;
    sy.have = x->have;
    sy.vals = x->vals;
    sy.s = x->s;                    /* shallow: read only */
    sy.why = x->why;
    sy.input = o->kind == GS_OUT_TRANSFER ? o->in : -1;
    nn2 = (size_t)(n + 1) * (size_t)(n + 1);
    sy.m = gs_malloc(nn2 * sizeof *sy.m);
    for (k = 0; k < nn2; k++)
        cr_init(&sy.m[k]);
    cr_init(&sy.known);
    row = gs_malloc((size_t)(n + 1) * sizeof *row);
    for (k = 0; k < (size_t)n + 1; k++)
        cr_init(&row[k]);
    cr_init(&g);
    cr_init(&known);
    for (k = 0; k < c->nelems && rc == GS_OK; k++)
        rc = stamp(&sy, (int)k, row, &g, &known);
    if (rc == GS_OK && o->kind == GS_OUT_IMPEDANCE) {
        add_si(&sy, vidx(o->a), n, 1);      /* unit test current into a */
        add_si(&sy, vidx(o->b), n, -1);
    }
    if (rc == GS_OK)
        rc = stamp_output(&sy, o, row, &g);
    if (rc == GS_OK) {
        z = gs_malloc(nn2 * sizeof *z);
        for (k = 0; k < nn2; k++)
            gi_init(&z[k]);
        gi_init(&da);
        gi_init(&dm);
        gs_int_init(&lc);
        to_integers(z, &lc, &sy);
        rc = bareiss(&da, &dm, z, n);
        if (rc == GS_OK)
            read_off(h, &da, &dm, &lc, &sy.known);
        for (k = 0; k < nn2; k++)
            gi_clear(&z[k]);
        gs_free(z);
        gi_clear(&da);
        gi_clear(&dm);
        gs_int_clear(&lc);
    }
    for (k = 0; k < nn2; k++)
        cr_clear(&sy.m[k]);
    for (k = 0; k < (size_t)n + 1; k++)
        cr_clear(&row[k]);
    cr_clear(&sy.known);
    cr_clear(&g);
    cr_clear(&known);
    gs_free(row);
    gs_free(sy.m);
    gs_free(sy.branch);
    return rc;
}

static int solve_out(crat *h, xctx *x, size_t out, int depth);

/* The return ratio of a controlled source and the asymptotic-gain parts,
   as derive.c defines them (and numsolve.c's loop_value computes them):
   the circuit changed for the solve and restored. */
static int solve_loop(crat *h, xctx *x, size_t out, int depth)
{
    gs_circuit *c = (gs_circuit *)x->c;
    gs_output *op = &c->outputs[out], saved_out = *op;
    gs_element *xe = &c->elems[op->in], saved_x = *xe;
    crat g, a, t, dd, one;
    int rc;
    cr_init(&g);
    cr_init(&a);
    cr_init(&t);
    cr_init(&dd);
    cr_init(&one);
    if (op->loop_part != 0) {
        gs_elem_kind kind = xe->kind;
        rc = GS_EINVAL;
        if (op->loop_of >= 0) {
            xe->kind = kind == GS_VCCS || kind == GS_CCCS ? GS_ISOURCE
                                                          : GS_VSOURCE;
            rc = solve_out(&dd, x, (size_t)op->loop_of, depth + 1);
            xe->kind = kind;
        }
        if (rc == GS_OK && op->loop_part == 2)
            cr_set(h, &dd);
        else if (rc == GS_OK) {
            rc = solve_out(&a, x, (size_t)op->loop_of, depth + 1);
            op->loop_part = 0;
            if (rc == GS_OK)
                rc = solve_loop(&t, x, out, depth + 1);
            op->loop_part = saved_out.loop_part;
            if (rc == GS_OK) {          /* (a (1 + t) - dd) / t */
                cr_set_si(&one, 1);
                cr_add(&one, &one, &t);
                cr_mul(&a, &a, &one);
                cr_sub(&a, &a, &dd);
                rc = cr_div(h, &a, &t) == GS_OK ? GS_OK : GS_ESINGULAR;
            }
        }
    } else {
        xsys vs;                    /* value_of needs only the cache */
        memset(&vs, 0, sizeof vs);
        vs.v = x->v;
        vs.have = x->have;
        vs.vals = x->vals;
        vs.why = x->why;
        rc = value_of(&g, &vs, &xe->value);
        if (rc == GS_OK) {
            if (xe->kind == GS_VCCS || xe->kind == GS_VCVS) {
                op->out.kind = GS_PROBE_V;
                op->out.a = xe->node[2];
                op->out.b = xe->node[3];
            } else {
                op->out.kind = GS_PROBE_I;
                op->out.elem = xe->ctrl;
            }
            op->kind = GS_OUT_TRANSFER;
            xe->kind = xe->kind == GS_VCCS || xe->kind == GS_CCCS
                       ? GS_ISOURCE : GS_VSOURCE;
            rc = solve_linear(h, x, op);
            *xe = saved_x;
            *op = saved_out;
            if (rc == GS_OK) {
                cr_mul(h, h, &g);
                cr_neg(h, h);
            }
        }
    }
    cr_clear(&g);
    cr_clear(&a);
    cr_clear(&t);
    cr_clear(&dd);
    cr_clear(&one);
    return rc;
}

/* A figure's value from the exact values of the outputs it names. */
static int solve_figure(crat *h, xctx *x, const gs_expr *e, int depth)
{
    const gs_circuit *c = x->c;
    crat a, b;
    int rc = GS_OK, idx;
    if (depth > (int)c->noutputs + 1)
        return GS_EINVAL;
    if (e->kind == GS_EX_NUM) {
        gs_rat_set(&h->re, &e->num);
        gs_rat_set_si(&h->im, 0, 1);
        return GS_OK;
    }
    if (e->kind == GS_EX_SYM) {
        idx = gs_circuit_find_output(c, gs_symtab_name(c->syms, e->sym));
        if (idx < 0)
            return GS_EINVAL;
        return solve_out(h, x, (size_t)idx, depth + 1);
    }
    if (e->kind == GS_EX_POW
        && !(e->rhs && e->rhs->kind == GS_EX_NUM && gs_rat_is_int(&e->rhs->num)
             && gs_int_fits_si(&e->rhs->num.num)
             && gs_int_cmp_si(&e->rhs->num.num, 64) <= 0
             && gs_int_cmp_si(&e->rhs->num.num, -64) >= 0))
        return GS_EINEXACT;         /* no exact value */
    cr_init(&a);
    cr_init(&b);
    rc = solve_figure(&a, x, e->lhs, depth);
    if (rc == GS_OK && e->rhs && e->kind != GS_EX_POW)
        rc = solve_figure(&b, x, e->rhs, depth);
    if (rc == GS_OK) {
        switch (e->kind) {
        case GS_EX_NEG: cr_neg(h, &a); break;
        case GS_EX_ADD: cr_add(h, &a, &b); break;
        case GS_EX_SUB: cr_sub(h, &a, &b); break;
        case GS_EX_MUL: cr_mul(h, &a, &b); break;
        case GS_EX_DIV:
            rc = cr_div(h, &a, &b) == GS_OK ? GS_OK : GS_ESINGULAR;
            break;
        case GS_EX_POW: {
            int64_t p = gs_int_get_si(&e->rhs->num.num), i;
            cr_set_si(&b, 1);
            for (i = 0; i < (p < 0 ? -p : p); i++)
                cr_mul(&b, &b, &a);
            if (p < 0) {
                cr_set_si(&a, 1);
                rc = cr_div(h, &a, &b) == GS_OK ? GS_OK : GS_ESINGULAR;
            } else {
                cr_set(h, &b);
            }
            break;
        }
        default:
            rc = GS_EINEXACT;       /* a function call: no exact value */
            break;
        }
    }
    cr_clear(&a);
    cr_clear(&b);
    return rc;
}

static int solve_out(crat *h, xctx *x, size_t out, int depth)
{
    const gs_output *o = &x->c->outputs[out];
    if (depth > (int)x->c->noutputs + 2)
        return GS_EINVAL;
    if (o->kind == GS_OUT_FIGURE)
        return solve_figure(h, x, o->figure, depth);
    if (o->kind == GS_OUT_LOOP)
        return solve_loop(h, x, out, depth);
    return solve_linear(h, x, o);
}

int gs_numsolve_exact(long double complex *h, const gs_circuit *c,
                      size_t out, const long double *vals,
                      long double complex s, gs_numexact_why *why)
{
    xctx x;
    crat r;
    size_t nsym = (size_t)gs_symtab_count(c->syms), k;
    int rc;
    if (why) {
        why->zero_sym = -1;
        why->zero_elem = -1;
    }
    x.c = c;
    x.vals = vals;
    x.why = why;
    x.v = gs_malloc((nsym ? nsym : 1) * sizeof *x.v);
    x.have = gs_calloc(nsym ? nsym : 1, 1);
    for (k = 0; k < nsym; k++)
        gs_rat_init(&x.v[k]);
    cr_init(&x.s);
    cr_init(&r);
    rc = rat_from_ld(&x.s.re, creall(s));
    if (rc == GS_OK)
        rc = rat_from_ld(&x.s.im, cimagl(s));
    if (rc == GS_OK)
        rc = solve_out(&r, &x, out, 0);
    if (rc == GS_OK)
        *h = gs_cmplxl(gs_rat_get_ld(&r.re), gs_rat_get_ld(&r.im));
    for (k = 0; k < nsym; k++)
        gs_rat_clear(&x.v[k]);
    gs_free(x.v);
    gs_free(x.have);
    cr_clear(&x.s);
    cr_clear(&r);
    return rc;
}
