/* numsolve.c - an independent numeric solve of a circuit at one s.
 * See LICENSE.
 *
 * Unknowns: the voltages of nodes 1 .. nnodes-1, then one current for each
 * element that defines a voltage (inductor, voltage source, VCVS, CCVS,
 * op-amp output).  Rows: KCL at each node (currents leaving through
 * elements), then each such element's voltage equation.
 */
#include "numeric/numsolve.h"
#include "base/mem.h"
#include "numeric/roots.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

typedef long double complex cplx;

typedef struct numsys {
    int n;
    cplx *a;            /* n x n, row-major */
    cplx *rhs;
    int *branch;        /* element -> current unknown, or -1 */
    const gs_circuit *c;
    const long double *vals;
    cplx s;
    int input;          /* the input source, or -1 */
    int absmode;        /* stamp |v| for every v: the magnitudes the
                           entries are sums of, for the error bound */
} numsys;

/* dst += v, or |v| in absmode. */
static void acc(const numsys *sy, cplx *dst, cplx v)
{
    *dst += sy->absmode ? (cplx)cabsl(v) : v;
}

static long double value_of(const numsys *sy, const gs_monomial *m)
{
    long double v = gs_rat_get_ld(&m->coeff);
    int i;
    for (i = 0; i < m->n; i++)
        v *= powl(sy->vals[m->sym[i]], (long double)m->exp[i]);
    return v;
}

static void add(numsys *sy, int node_row, int col, cplx v)
{
    if (node_row >= 0 && col >= 0)
        acc(sy, &sy->a[(size_t)node_row * (size_t)sy->n + (size_t)col], v);
}

static int vidx(int node)
{
    return node - 1;        /* node 0 is ground: -1, dropped */
}

/* The current through element k as coefficients over the unknowns plus a
   known part (the input source's unit current). */
static void current_coeffs(cplx *row, cplx *known, const numsys *sy, int k,
                           cplx scale, int depth)
{
    const gs_element *e = &sy->c->elems[k];
    cplx y;
    if (depth > (int)sy->c->nelems)
        return;             /* a control loop: mna.c reports it */
    if (sy->branch[k] >= 0) {
        acc(sy, &row[sy->branch[k]], scale);
        return;
    }
    switch (e->kind) {
    case GS_RESISTOR:
    case GS_CONDUCTANCE:
    case GS_CAPACITOR:
        y = value_of(sy, &e->value);
        if (e->kind == GS_RESISTOR)
            y = 1 / y;
        if (e->kind == GS_CAPACITOR)
            y *= sy->s;
        if (vidx(e->node[0]) >= 0)
            acc(sy, &row[vidx(e->node[0])], scale * y);
        if (vidx(e->node[1]) >= 0)
            acc(sy, &row[vidx(e->node[1])], -scale * y);
        break;
    case GS_VCCS:
        y = value_of(sy, &e->value);
        if (vidx(e->node[2]) >= 0)
            acc(sy, &row[vidx(e->node[2])], scale * y);
        if (vidx(e->node[3]) >= 0)
            acc(sy, &row[vidx(e->node[3])], -scale * y);
        break;
    case GS_CCCS:
        current_coeffs(row, known, sy, e->ctrl,
                       scale * value_of(sy, &e->value), depth + 1);
        break;
    case GS_ISOURCE:
        if (k == sy->input)
            acc(sy, known, scale);
        break;
    default:
        break;
    }
}

/* A current (row . x + known) flowing from node a through the element to
   node b. */
static void stamp_flow(numsys *sy, int a, int b, const cplx *row, cplx known)
{
    int j;
    for (j = 0; j < sy->n; j++) {
        if (row[j] == 0)
            continue;
        add(sy, vidx(a), j, row[j]);
        add(sy, vidx(b), j, -row[j]);
    }
    if (vidx(a) >= 0)
        acc(sy, &sy->rhs[vidx(a)], -known);
    if (vidx(b) >= 0)
        acc(sy, &sy->rhs[vidx(b)], known);
}

static void stamp_voltage_row(numsys *sy, int k, const gs_element *e)
{
    int br = sy->branch[k];
    add(sy, vidx(e->node[0]), br, 1);
    add(sy, vidx(e->node[1]), br, -1);
    add(sy, br, vidx(e->node[0]), 1);
    add(sy, br, vidx(e->node[1]), -1);
}

static void stamp(numsys *sy, int k, cplx *row)
{
    const gs_element *e = &sy->c->elems[k];
    int br = sy->branch[k], j;
    cplx known = 0, g;
    memset(row, 0, (size_t)sy->n * sizeof *row);
    switch (e->kind) {
    case GS_VSOURCE:
        stamp_voltage_row(sy, k, e);
        if (k == sy->input)
            acc(sy, &sy->rhs[br], 1);
        break;
    case GS_INDUCTOR:
        stamp_voltage_row(sy, k, e);
        add(sy, br, br, -sy->s * value_of(sy, &e->value));
        break;
    case GS_VCVS:
        stamp_voltage_row(sy, k, e);
        g = value_of(sy, &e->value);
        add(sy, br, vidx(e->node[2]), -g);
        add(sy, br, vidx(e->node[3]), g);
        break;
    case GS_CCVS:
        stamp_voltage_row(sy, k, e);
        current_coeffs(row, &known, sy, e->ctrl, value_of(sy, &e->value),
                       1);
        for (j = 0; j < sy->n; j++)
            add(sy, br, j, -row[j]);
        acc(sy, &sy->rhs[br], known);
        break;
    case GS_OPAMP:
        add(sy, vidx(e->node[0]), br, 1);
        add(sy, br, vidx(e->node[1]), 1);
        add(sy, br, vidx(e->node[2]), -1);
        break;
    default:
        current_coeffs(row, &known, sy, k, 1, 0);
        stamp_flow(sy, e->node[0], e->node[1], row, known);
        break;
    }
}

/* Solve a x = rhs in place (x in rhs) by LU with partial pivoting. */
static int lu_solve(cplx *a, cplx *rhs, int n)
{
    int i, j, k, p;
    long double scale = 0;
    for (i = 0; i < n * n; i++)
        if (cabsl(a[i]) > scale)
            scale = cabsl(a[i]);
    for (k = 0; k < n; k++) {
        p = k;
        for (i = k + 1; i < n; i++)
            if (cabsl(a[i * n + k]) > cabsl(a[p * n + k]))
                p = i;
        if (cabsl(a[p * n + k]) <= scale * 1e-30L)
            return GS_ESINGULAR;
        if (p != k) {
            for (j = 0; j < n; j++) {
                cplx t = a[k * n + j];
                a[k * n + j] = a[p * n + j];
                a[p * n + j] = t;
            }
            { cplx t = rhs[k]; rhs[k] = rhs[p]; rhs[p] = t; }
        }
        for (i = k + 1; i < n; i++) {
            cplx f = a[i * n + k] / a[k * n + k];
            if (f == 0)
                continue;
            for (j = k; j < n; j++)
                a[i * n + j] -= f * a[k * n + j];
            rhs[i] -= f * rhs[k];
        }
    }
    for (k = n - 1; k >= 0; k--) {
        cplx acc = rhs[k];
        for (j = k + 1; j < n; j++)
            acc -= a[k * n + j] * rhs[j];
        rhs[k] = acc / a[k * n + k];
    }
    return GS_OK;
}

static int is_voltage_defined(gs_elem_kind k)
{
    return k == GS_INDUCTOR || k == GS_VSOURCE || k == GS_VCVS
        || k == GS_CCVS || k == GS_OPAMP;
}

/* The system of c at s with the values vals: one unknown per node but
   ground and one per element with a defined voltage (its current), the
   matrix and right side zero, input the source left on (-1: none).
   Returns the number of unknowns. */
static int numsys_init(numsys *sy, const gs_circuit *c,
                       const long double *vals, cplx s, int input)
{
    int n = c->nnodes - 1;
    size_t k;
    sy->branch = gs_malloc((c->nelems ? c->nelems : 1) * sizeof *sy->branch);
    for (k = 0; k < c->nelems; k++)
        sy->branch[k] = is_voltage_defined(c->elems[k].kind) ? n++ : -1;
    sy->n = n;
    sy->c = c;
    sy->vals = vals;
    sy->s = s;
    sy->absmode = 0;
    sy->input = input;
    sy->a = gs_calloc((size_t)n * (size_t)n + 1, sizeof *sy->a);
    sy->rhs = gs_calloc((size_t)n + 1, sizeof *sy->rhs);
    return n;
}

/* The output: v(a) - v(b), or an element's current, from the solution. */
static cplx probe_value(const numsys *sy, const gs_output *o, const cplx *x,
                        cplx *row)
{
    cplx known = 0, v = 0;
    int j, a = o->out.a, b = o->out.b;
    if (o->kind == GS_OUT_IMPEDANCE || o->out.kind == GS_PROBE_V) {
        if (o->kind == GS_OUT_IMPEDANCE) {
            a = o->a;
            b = o->b;
        }
        return (vidx(a) >= 0 ? x[vidx(a)] : 0)
             - (vidx(b) >= 0 ? x[vidx(b)] : 0);
    }
    memset(row, 0, (size_t)sy->n * sizeof *row);
    current_coeffs(row, &known, sy, o->out.elem, 1, 0);
    for (j = 0; j < sy->n; j++)
        v += row[j] * x[j];
    return v + known;
}

/* The return ratio of a controlled source, as derive.c defines it: the
   circuit changed for the solve and restored. */
static int loop_value(cplx *h, const gs_circuit *cc, size_t out,
                      const long double *vals, cplx s, gs_diag *d)
{
    gs_circuit *c = (gs_circuit *)cc;
    gs_output *op = &c->outputs[out], saved_out = *op;
    gs_element *x = &c->elems[op->in], saved_x = *x;
    long double g = 1;
    int rc, i;
    if (op->loop_part != 0) {
        /* the asymptotic-gain parts, as derive.c defines them */
        gs_elem_kind kind = x->kind;
        cplx a = 0, t = 0, dd = 0;
        if (op->loop_of < 0)
            return GS_EINVAL;
        x->kind = kind == GS_VCCS || kind == GS_CCCS ? GS_ISOURCE
                                                     : GS_VSOURCE;
        rc = gs_numsolve(&dd, c, (size_t)op->loop_of, vals, s, d);
        x->kind = kind;
        if (rc != GS_OK || op->loop_part == 2) {
            *h = dd;
            return rc;
        }
        rc = gs_numsolve(&a, c, (size_t)op->loop_of, vals, s, d);
        op->loop_part = 0;
        if (rc == GS_OK)
            rc = loop_value(&t, c, out, vals, s, d);
        op->loop_part = 1;
        if (rc == GS_OK)
            *h = (a * (1 + t) - dd) / t;
        return rc;
    }
    g = gs_rat_get_ld(&x->value.coeff);
    for (i = 0; i < x->value.n; i++)
        g *= powl(vals[x->value.sym[i]], (long double)x->value.exp[i]);
    if (x->kind == GS_VCCS || x->kind == GS_VCVS) {
        op->out.kind = GS_PROBE_V;
        op->out.a = x->node[2];
        op->out.b = x->node[3];
    } else {
        op->out.kind = GS_PROBE_I;
        op->out.elem = x->ctrl;
    }
    op->kind = GS_OUT_TRANSFER;
    x->kind = x->kind == GS_VCCS || x->kind == GS_CCCS ? GS_ISOURCE
                                                       : GS_VSOURCE;
    rc = gs_numsolve(h, c, out, vals, s, d);
    *x = saved_x;
    *op = saved_out;
    if (rc == GS_OK)
        *h *= -g;
    return rc;
}

/* A figure's value from the values of the outputs it names. */
static int figure_value(cplx *h, const gs_circuit *c, const gs_expr *e,
                        const long double *vals, cplx s, gs_diag *d,
                        int depth)
{
    cplx a = 0, b = 0;
    int rc = GS_OK, idx;
    if (depth > (int)c->noutputs + 1)
        return GS_EINVAL;
    switch (e->kind) {
    case GS_EX_NUM:
        *h = gs_rat_get_ld(&e->num);
        return GS_OK;
    case GS_EX_SYM:
        idx = gs_circuit_find_output(c, gs_symtab_name(c->syms, e->sym));
        if (idx < 0)
            return GS_EINVAL;
        if (c->outputs[idx].kind == GS_OUT_FIGURE)
            return figure_value(h, c, c->outputs[idx].figure, vals, s, d,
                                depth + 1);
        return gs_numsolve(h, c, (size_t)idx, vals, s, d);
    default:
        break;
    }
    rc = figure_value(&a, c, e->lhs, vals, s, d, depth);
    if (rc == GS_OK && e->rhs)
        rc = figure_value(&b, c, e->rhs, vals, s, d, depth);
    if (rc != GS_OK)
        return rc;
    switch (e->kind) {
    case GS_EX_NEG: *h = -a; break;
    case GS_EX_ADD: *h = a + b; break;
    case GS_EX_SUB: *h = a - b; break;
    case GS_EX_MUL: *h = a * b; break;
    case GS_EX_DIV: *h = a / b; break;
    case GS_EX_POW: *h = cpowl(a, b); break;
    default: return GS_EINVAL;
    }
    return GS_OK;
}

int gs_numsolve(long double complex *h, const gs_circuit *c, size_t out,
                const long double *vals, long double complex s, gs_diag *d)
{
    const gs_output *o = &c->outputs[out];
    numsys sy;
    size_t k;
    int n = c->nnodes - 1, rc;
    cplx *row;

    if (o->kind == GS_OUT_FIGURE)
        return figure_value(h, c, o->figure, vals, s, d, 0);
    if (o->kind == GS_OUT_LOOP)
        return loop_value(h, c, out, vals, s, d);

    n = numsys_init(&sy, c, vals, s,
                    o->kind == GS_OUT_TRANSFER ? o->in : -1);
    row = gs_calloc((size_t)n + 1, sizeof *row);
    for (k = 0; k < c->nelems; k++)
        stamp(&sy, (int)k, row);
    if (o->kind == GS_OUT_IMPEDANCE) {   /* unit test current into a */
        if (vidx(o->a) >= 0)
            sy.rhs[vidx(o->a)] += 1;
        if (vidx(o->b) >= 0)
            sy.rhs[vidx(o->b)] -= 1;
    }
    rc = lu_solve(sy.a, sy.rhs, n);
    if (rc == GS_OK)
        *h = probe_value(&sy, o, sy.rhs, row);
    else
        gs_diag_add(d, GS_SEV_ERROR, c->file, o->line, o->col, NULL,
                    "%s: the circuit's equations have no unique solution "
                    "at s = %Lg%+Lgj",
                    o->name, creall(s), cimagl(s));
    gs_free(row);
    gs_free(sy.a);
    gs_free(sy.rhs);
    gs_free(sy.branch);
    return rc;
}

int gs_numsolve_adjoint(long double complex *h, const gs_circuit *c,
                        size_t out, const long double *vals,
                        long double complex s, const int *from,
                        const int *to, size_t n, gs_diag *d)
{
    const gs_output *o = &c->outputs[out];
    numsys sy;
    size_t k;
    int nu = c->nnodes - 1, rc, i, j;
    cplx *row, *y, known = 0;

    if (o->kind != GS_OUT_TRANSFER)
        return GS_EINVAL;
    nu = numsys_init(&sy, c, vals, s, -1);     /* every source nulled */
    row = gs_calloc((size_t)nu + 1, sizeof *row);
    y = gs_calloc((size_t)nu + 1, sizeof *y);
    for (k = 0; k < c->nelems; k++)
        stamp(&sy, (int)k, row);
    /* the output row c: a voltage difference or an element's current */
    if (o->out.kind == GS_PROBE_V) {
        if (vidx(o->out.a) >= 0)
            y[vidx(o->out.a)] += 1;
        if (vidx(o->out.b) >= 0)
            y[vidx(o->out.b)] -= 1;
    } else {
        memset(row, 0, (size_t)nu * sizeof *row);
        current_coeffs(y, &known, &sy, o->out.elem, 1, 0);
    }
    for (i = 0; i < nu; i++)            /* A := A^T */
        for (j = i + 1; j < nu; j++) {
            cplx t = sy.a[i * nu + j];
            sy.a[i * nu + j] = sy.a[j * nu + i];
            sy.a[j * nu + i] = t;
        }
    rc = lu_solve(sy.a, y, nu);
    for (k = 0; k < n && rc == GS_OK; k++)  /* b_k: -1 at from, +1 at to */
        h[k] = (vidx(to[k]) >= 0 ? y[vidx(to[k])] : 0)
             - (vidx(from[k]) >= 0 ? y[vidx(from[k])] : 0);
    if (rc != GS_OK)
        gs_diag_add(d, GS_SEV_ERROR, c->file, o->line, o->col, NULL,
                    "%s: the adjoint system is singular at s = %Lg%+Lgj",
                    o->name, creall(s), cimagl(s));
    gs_free(row);
    gs_free(y);
    gs_free(sy.a);
    gs_free(sy.rhs);
    gs_free(sy.branch);
    return rc;
}

/* ---- the solve that bounds its own error ----------------------------- */

/* LU with partial pivoting in place, P A = L U, the swaps in piv (LAPACK's
   convention: row k was swapped with row piv[k] at step k).  GS_ESINGULAR
   on a zero or non-finite pivot. */
static int lu_factor(cplx *a, int *piv, int n)
{
    int i, j, k, p;
    for (k = 0; k < n; k++) {
        p = k;
        for (i = k + 1; i < n; i++)
            if (cabsl(a[i * n + k]) > cabsl(a[p * n + k]))
                p = i;
        piv[k] = p;
        if (!(cabsl(a[p * n + k]) > 0) || !isfinite(cabsl(a[p * n + k])))
            return GS_ESINGULAR;
        if (p != k)
            for (j = 0; j < n; j++) {
                cplx t = a[k * n + j];
                a[k * n + j] = a[p * n + j];
                a[p * n + j] = t;
            }
        for (i = k + 1; i < n; i++) {
            cplx f = a[i * n + k] / a[k * n + k];
            a[i * n + k] = f;
            if (f == 0)
                continue;
            for (j = k + 1; j < n; j++)
                a[i * n + j] -= f * a[k * n + j];
        }
    }
    return GS_OK;
}

/* x := A^-1 x from the factors. */
static void lu_apply(const cplx *lu, const int *piv, int n, cplx *x)
{
    int i, j;
    for (i = 0; i < n; i++)
        if (piv[i] != i) {
            cplx t = x[i];
            x[i] = x[piv[i]];
            x[piv[i]] = t;
        }
    for (i = 0; i < n; i++)
        for (j = 0; j < i; j++)
            x[i] -= lu[i * n + j] * x[j];
    for (i = n - 1; i >= 0; i--) {
        for (j = i + 1; j < n; j++)
            x[i] -= lu[i * n + j] * x[j];
        x[i] /= lu[i * n + i];
    }
}

/* y := A^-T y: A^T = U^T L^T P. */
static void lu_apply_t(const cplx *lu, const int *piv, int n, cplx *y)
{
    int i, j;
    for (i = 0; i < n; i++) {
        for (j = 0; j < i; j++)
            y[i] -= lu[j * n + i] * y[j];
        y[i] /= lu[i * n + i];
    }
    for (i = n - 1; i >= 0; i--)
        for (j = i + 1; j < n; j++)
            y[i] -= lu[j * n + i] * y[j];
    for (i = n - 1; i >= 0; i--)
        if (piv[i] != i) {
            cplx t = y[i];
            y[i] = y[piv[i]];
            y[piv[i]] = t;
        }
}

/* A sum kept as a long double and its error, by error-free
   transformations: Knuth's TwoSum and the fma TwoProduct, the Dot2 of T.
   Ogita, S. M. Rump and S. Oishi, "Accurate sum and dot product", SIAM J.
   Sci. Comput. 26 (2005): about twice the working precision. */
typedef struct sum2 {
    long double s, c;
} sum2;

static void sum2_add(sum2 *a, long double x)
{
    long double t = a->s + x, z = t - a->s;
    a->c += (a->s - (t - z)) + (x - z);
    a->s = t;
}

static void sum2_addmul(sum2 *a, long double x, long double y)
{
    long double p = x * y;
    sum2_add(a, p);
    a->c += fmal(x, y, -p);
}

/* r = b - op(A) x, each entry in twice the working precision; op is A or
   A^T (trans). */
static void residual(cplx *r, const cplx *a, const cplx *b, const cplx *x,
                     int n, int trans)
{
    int i, j;
    for (i = 0; i < n; i++) {
        sum2 re = {creall(b[i]), 0}, im = {cimagl(b[i]), 0};
        for (j = 0; j < n; j++) {
            cplx e = trans ? a[j * n + i] : a[i * n + j];
            long double ar = creall(e), ai = cimagl(e);
            long double xr = creall(x[j]), xi = cimagl(x[j]);
            sum2_addmul(&re, -ar, xr);
            sum2_addmul(&re, ai, xi);
            sum2_addmul(&im, -ar, xi);
            sum2_addmul(&im, -ai, xr);
        }
        r[i] = gs_cmplxl(re.s + re.c, im.s + im.c);
    }
}

static long double max_abs(const cplx *v, int n)
{
    long double m = 0;
    int i;
    for (i = 0; i < n; i++)
        if (cabsl(v[i]) > m)
            m = cabsl(v[i]);
    return m;
}

/* Solve op(A) x = b from the factors, refined: each step's residual in
   twice the working precision (J. H. Wilkinson, "Rounding Errors in
   Algebraic Processes", 1963; N. J. Higham, "Accuracy and Stability of
   Numerical Algorithms", 2nd ed., ch. 12).  r gets the last residual.
   Returns 1 when the last correction was small beside x (the solve
   converged), else 0. */
static int refined(cplx *x, cplx *r, const cplx *a, const cplx *lu,
                   const int *piv, const cplx *b, int n, int trans)
{
    int it, i, ok = 0;
    memcpy(x, b, (size_t)n * sizeof *x);
    (trans ? lu_apply_t : lu_apply)(lu, piv, n, x);
    for (it = 0; it < 4; it++) {
        residual(r, a, b, x, n, trans);
        (trans ? lu_apply_t : lu_apply)(lu, piv, n, r);
        ok = max_abs(r, n) <= 1e-3L * max_abs(x, n);
        for (i = 0; i < n; i++)
            x[i] += r[i];
        if (max_abs(r, n) <= LDBL_EPSILON * max_abs(x, n))
            break;
    }
    residual(r, a, b, x, n, trans);
    return ok;
}

static long double gamma_k(long double k)
{
    long double ku = k * (LDBL_EPSILON / 2);
    return ku < 0.5L ? ku / (1 - ku) : INFINITY;
}

/* The longest monomial of the circuit's values, for the stamping bound. */
static int max_factors(const gs_circuit *c)
{
    size_t k;
    int m = 0, i, f;
    for (k = 0; k < c->nelems; k++) {
        for (f = 0, i = 0; i < c->elems[k].value.n; i++)
            f += abs(c->elems[k].value.exp[i]);
        if (f > m)
            m = f;
    }
    return m;
}

int gs_numsolve_bounded(long double complex *h, long double *bound,
                        const gs_circuit *c, size_t out,
                        const long double *vals, long double complex s)
{
    const gs_output *o = &c->outputs[out];
    numsys sy, ab;
    size_t k;
    int n = c->nnodes - 1, rc = GS_OK, i, j, conv;
    cplx *lu, *x, *r, *y, *ry, *cv, *cabs, *row, kn = 0, kabs = 0;
    int *piv;
    long double g, sum = 0, dot = 0;

    *bound = INFINITY;
    if (o->kind != GS_OUT_TRANSFER && o->kind != GS_OUT_IMPEDANCE)
        return GS_EINVAL;
    n = numsys_init(&sy, c, vals, s,
                    o->kind == GS_OUT_TRANSFER ? o->in : -1);
    ab = sy;
    ab.absmode = 1;
    ab.a = gs_calloc((size_t)n * (size_t)n + 1, sizeof *ab.a);
    ab.rhs = gs_calloc((size_t)n + 1, sizeof *ab.rhs);
    lu = gs_calloc((size_t)n * (size_t)n + 1, sizeof *lu);
    piv = gs_calloc((size_t)n + 1, sizeof *piv);
    x = gs_calloc((size_t)n + 1, sizeof *x);
    r = gs_calloc((size_t)n + 1, sizeof *r);
    y = gs_calloc((size_t)n + 1, sizeof *y);
    ry = gs_calloc((size_t)n + 1, sizeof *ry);
    cv = gs_calloc((size_t)n + 1, sizeof *cv);
    cabs = gs_calloc((size_t)n + 1, sizeof *cabs);
    row = gs_calloc((size_t)n + 1, sizeof *row);
    for (k = 0; k < c->nelems; k++) {
        stamp(&sy, (int)k, row);
        stamp(&ab, (int)k, row);
    }
    if (o->kind == GS_OUT_IMPEDANCE) {   /* unit test current into a */
        if (vidx(o->a) >= 0)
            sy.rhs[vidx(o->a)] += 1;
        if (vidx(o->b) >= 0)
            sy.rhs[vidx(o->b)] -= 1;
    }
    /* the output c^T x + kn, and its magnitudes */
    if (o->kind == GS_OUT_IMPEDANCE || o->out.kind == GS_PROBE_V) {
        int a = o->kind == GS_OUT_IMPEDANCE ? o->a : o->out.a;
        int b = o->kind == GS_OUT_IMPEDANCE ? o->b : o->out.b;
        if (vidx(a) >= 0)
            cv[vidx(a)] += 1;
        if (vidx(b) >= 0)
            cv[vidx(b)] -= 1;
    } else {
        current_coeffs(cv, &kn, &sy, o->out.elem, 1, 0);
        current_coeffs(cabs, &kabs, &ab, o->out.elem, 1, 0);
    }
    memcpy(lu, sy.a, (size_t)n * (size_t)n * sizeof *lu);
    rc = lu_factor(lu, piv, n);
    for (i = 0; i < n * n && rc == GS_OK; i++)
        if (!isfinite(cabsl(sy.a[i])))
            rc = GS_ERANGE;
    if (rc == GS_OK) {
        conv = refined(x, r, sy.a, lu, piv, sy.rhs, n, 0);
        conv &= refined(y, ry, sy.a, lu, piv, cv, n, 1);
        /* each entry is a sum of products of values, each rounded: */
        g = gamma_k(3 * (long double)max_factors(c) + 16
                    + (long double)c->nelems);
        for (i = 0; i < n; i++) {
            long double ax = 0;
            for (j = 0; j < n; j++)
                ax += creall(ab.a[i * n + j]) * cabsl(x[j]);
            sum += cabsl(y[i]) * (cabsl(r[i])
                                  + g * (ax + creall(ab.rhs[i])));
        }
        for (i = 0; i < n; i++) {
            dot += cabsl(cv[i]) * cabsl(x[i]);
            sum += g * creall(cabs[i]) * cabsl(x[i]);
        }
        sum += g * creall(kabs) + gamma_k(2 * (long double)n + 4) * dot;
        *h = kn;
        for (i = 0; i < n; i++)
            *h += cv[i] * x[i];
        /* first order in the errors: doubled, and only when both solves
           converged, so that y is good to a digit */
        if (conv && isfinite(sum) && isfinite(cabsl(*h)))
            *bound = 2 * sum + 4 * (LDBL_EPSILON / 2) * cabsl(*h);
    }
    gs_free(sy.a);
    gs_free(sy.rhs);
    gs_free(ab.a);
    gs_free(ab.rhs);
    gs_free(lu);
    gs_free(piv);
    gs_free(x);
    gs_free(r);
    gs_free(y);
    gs_free(ry);
    gs_free(cv);
    gs_free(cabs);
    gs_free(row);
    gs_free(sy.branch);
    return rc;
}
