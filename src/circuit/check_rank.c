/* check_rank.c - MNA equations singular by their pattern alone.
 * See LICENSE.
 *
 * The last structural check: a square matrix whose nonzero pattern has
 * no perfect matching between rows and columns is singular whatever the
 * values of its entries (Frobenius-König theorem; Duff, "On algorithms
 * for obtaining a maximum transversal", ACM TOMS 7, 1981).  The pattern
 * is that of the MNA equations as mna.c writes them: a KCL row per node
 * but gnd, a row per branch current (inductors, voltage sources, vcvs,
 * ccvs, opamp outputs); columns are node voltages and branch currents.
 * An entry is left out only where its terms cancel for every value (an
 * element with both ends on one node).  A maximum matching is grown by
 * augmenting paths (Kuhn's method); when a column stays unmatched, the
 * columns reachable from it by alternating paths are a set that fewer
 * rows than columns mention (Hall's condition fails), and those unknowns
 * are what the circuit leaves undetermined.  This catches, for one, an
 * ideal opamp without feedback.
 */
#include "circuit/checker.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

typedef struct pattern {
    int n;              /* rows = columns */
    int *start, *col;   /* row r: col[start[r] .. start[r+1]) */
    int *branch;        /* per element: its branch unknown, or -1 */
    /* building: (row, col) pairs */
    int *pr, *pc;
    size_t np, ap;
} pattern;

static int has_branch(gs_elem_kind k)
{
    return k == GS_INDUCTOR || k == GS_VSOURCE || k == GS_VCVS
           || k == GS_CCVS || k == GS_OPAMP;
}

static void put(pattern *p, int row, int col)
{
    if (row < 0 || col < 0)
        return;
    if (p->np == p->ap) {
        p->ap = p->ap ? 2 * p->ap : 64;
        p->pr = gs_reallocarray(p->pr, p->ap, sizeof *p->pr);
        p->pc = gs_reallocarray(p->pc, p->ap, sizeof *p->pc);
    }
    p->pr[p->np] = row;
    p->pc[p->np++] = col;
}

/* rows r1, r2 (node numbers) x columns a, b (node numbers) */
static void put_nodes(pattern *p, int r1, int r2, int a, int b)
{
    put(p, r1 - 1, a - 1);
    put(p, r1 - 1, b - 1);
    put(p, r2 - 1, a - 1);
    put(p, r2 - 1, b - 1);
}

/* Columns the current of element j depends on, put into `row`. */
static void put_current(pattern *p, const gs_circuit *c, int row, int j,
                        size_t depth)
{
    const gs_element *e;
    if (j < 0 || depth > c->nelems)
        return;
    e = &c->elems[j];
    if (p->branch[j] >= 0) {
        put(p, row, p->branch[j]);
    } else if (e->kind == GS_VCCS && e->node[2] != e->node[3]) {
        put(p, row, e->node[2] - 1);
        put(p, row, e->node[3] - 1);
    } else if (e->kind == GS_CCCS) {
        put_current(p, c, row, e->ctrl, depth + 1);
    } else if (e->kind != GS_ISOURCE && e->kind != GS_VCCS
               && e->node[0] != e->node[1]) {
        put(p, row, e->node[0] - 1);
        put(p, row, e->node[1] - 1);
    }
}

static void put_element(pattern *p, const gs_circuit *c, int j)
{
    const gs_element *e = &c->elems[j];
    int a = e->node[0], b = e->node[1], k = p->branch[j];
    if (e->kind == GS_OPAMP) {
        put(p, a - 1, k);
        if (e->node[1] != e->node[2]) {
            put(p, k, e->node[1] - 1);
            put(p, k, e->node[2] - 1);
        }
        return;
    }
    if (k < 0) {                            /* current into KCL rows */
        if (a != b) {
            put_current(p, c, a - 1, j, 0);
            put_current(p, c, b - 1, j, 0);
        }
        return;
    }
    if (a != b) {
        put(p, a - 1, k);
        put(p, b - 1, k);
        put(p, k, a - 1);
        put(p, k, b - 1);
    }
    if (e->kind == GS_INDUCTOR)
        put(p, k, k);
    else if (e->kind == GS_VCVS && e->node[2] != e->node[3])
        put_nodes(p, k + 1, k + 1, e->node[2], e->node[3]);
    else if (e->kind == GS_CCVS)
        put_current(p, c, k, e->ctrl, 0);
}

/* Rows as adjacency lists, from the (row, col) pairs (counting sort). */
static void finish(pattern *p)
{
    int r;
    size_t i, *fill = gs_calloc((size_t)p->n + 1, sizeof *fill);
    p->start = gs_calloc((size_t)p->n + 1, sizeof *p->start);
    p->col = gs_malloc((p->np + 1) * sizeof *p->col);
    for (i = 0; i < p->np; i++)
        p->start[p->pr[i] + 1]++;
    for (r = 0; r < p->n; r++)
        p->start[r + 1] += p->start[r];
    for (i = 0; i < p->np; i++) {
        int row = p->pr[i];
        p->col[(size_t)p->start[row] + fill[row]++] = p->pc[i];
    }
    gs_free(fill);
}

static void build(pattern *p, const gs_circuit *c)
{
    size_t j;
    memset(p, 0, sizeof *p);
    p->n = c->nnodes - 1;
    p->branch = gs_malloc((c->nelems + 1) * sizeof *p->branch);
    for (j = 0; j < c->nelems; j++)
        p->branch[j] = has_branch(c->elems[j].kind) ? p->n++ : -1;
    for (j = 0; j < c->nelems; j++)
        put_element(p, c, (int)j);
    finish(p);
}

static void pattern_clear(pattern *p)
{
    gs_free(p->start);
    gs_free(p->col);
    gs_free(p->branch);
    gs_free(p->pr);
    gs_free(p->pc);
}

/* Look for an augmenting path from unmatched row r0 (depth-first, with
   an explicit stack); on success flip it.  mrow[r] / mcol[c]: partner or
   -1; seen[c] = r0 + 1 marks columns visited in this search. */
static int augment(const pattern *p, int r0, int *mrow, int *mcol,
                   int *seen, int *stack, int *pos)
{
    int top = 0;
    stack[0] = r0;
    pos[0] = p->start[r0];
    while (top >= 0) {
        int r = stack[top];
        if (pos[top] == p->start[r + 1]) {
            top--;                          /* dead end: back up */
            continue;
        }
        {
            int col = p->col[pos[top]++];
            if (seen[col] == r0 + 1)
                continue;
            seen[col] = r0 + 1;         /* stamp: no clearing per search */
            if (mcol[col] < 0) {            /* free column: flip the path */
                for (; top >= 0; top--) {
                    int rr = stack[top], cc = p->col[pos[top] - 1];
                    mrow[rr] = cc;
                    mcol[cc] = rr;
                }
                return 1;
            }
            stack[++top] = mcol[col];
            pos[top] = p->start[mcol[col]];
        }
    }
    return 0;
}

/* The name of unknown u: v(node) or i(element). */
static char *unknown_name(const gs_circuit *c, const pattern *p, int u)
{
    size_t j;
    if (u < c->nnodes - 1)
        return gs_asprintf("v(%s)", c->node_name[u + 1]);
    for (j = 0; j < c->nelems; j++)
        if (p->branch[j] == u)
            return gs_asprintf("i(%s)", c->elems[j].name);
    return gs_strdup("?");
}

/* Where unknown u is first written: its node's or its element's place. */
static void unknown_place(const gs_circuit *c, const pattern *p, int u,
                          int *line, int *col)
{
    size_t j;
    if (u < c->nnodes - 1) {
        *line = c->node_line[u + 1];
        *col = c->node_col[u + 1];
        return;
    }
    for (j = 0; j < c->nelems; j++) {
        if (p->branch[j] == u) {
            *line = c->elems[j].line;
            *col = c->elems[j].col;
        }
    }
}

/* The columns reachable from free column u0 by alternating paths (any
   row that holds a column of the set, then that row's partner column). */
static int *hall_set(const pattern *p, int u0, const int *mrow, int *count)
{
    int *set = gs_malloc((size_t)p->n * sizeof *set), n = 1, i, r;
    unsigned char *in = gs_calloc((size_t)p->n, 1);
    set[0] = u0;
    in[u0] = 1;
    for (i = 0; i < n; i++) {
        for (r = 0; r < p->n; r++) {
            int q, has = 0;
            for (q = p->start[r]; q < p->start[r + 1] && !has; q++)
                has = p->col[q] == set[i];
            if (has && mrow[r] >= 0 && !in[mrow[r]]) {
                in[mrow[r]] = 1;
                set[n++] = mrow[r];
            }
        }
    }
    gs_free(in);
    *count = n;
    return set;
}

static int cmp_int(const void *a, const void *b)
{
    int x = *(const int *)a, y = *(const int *)b;
    return (x > y) - (x < y);
}

static void report_free(const gs_checker *k, const pattern *p, int u,
                        const int *mrow)
{
    const gs_circuit *c = k->c;
    int n, i, line = 0, col = 0, opamp = 0;
    int *set = hall_set(p, u, mrow, &n);
    char **names = gs_malloc((size_t)n * sizeof *names), *list, *msg;
    size_t j;
    qsort(set, (size_t)n, sizeof *set, cmp_int);
    for (i = 0; i < n; i++)
        names[i] = unknown_name(c, p, set[i]);
    list = gs_check_list((const char *const *)names, (size_t)n, 0);
    for (j = 0; j < c->nelems; j++)
        opamp |= c->elems[j].kind == GS_OPAMP;
    unknown_place(c, p, set[0], &line, &col);
    msg = gs_asprintf("the circuit's equations are singular whatever the "
                      "values: nothing determines %s", list);
    gs_check_report(k, GS_SEV_ERROR, line, col, opamp ? "an ideal opamp "
                    "needs feedback, a path from its output back to its "
                    "inputs" : NULL, msg);
    gs_free(msg);
    gs_free(list);
    for (i = 0; i < n; i++)
        gs_free(names[i]);
    gs_free(names);
    gs_free(set);
}

void gs_check_rank(const gs_checker *k)
{
    pattern p;
    int *mrow, *mcol, *stack, *pos, *seen, r, u;
    build(&p, k->c);
    if (p.n == 0) {
        pattern_clear(&p);
        return;
    }
    mrow = gs_malloc((size_t)p.n * sizeof *mrow);
    mcol = gs_malloc((size_t)p.n * sizeof *mcol);
    stack = gs_malloc((size_t)p.n * sizeof *stack);
    pos = gs_malloc((size_t)p.n * sizeof *pos);
    seen = gs_calloc((size_t)p.n, sizeof *seen);
    for (r = 0; r < p.n; r++)
        mrow[r] = mcol[r] = -1;
    for (r = 0; r < p.n; r++)
        augment(&p, r, mrow, mcol, seen, stack, pos);
    for (u = 0; u < p.n; u++) {
        if (mcol[u] < 0) {          /* the first undetermined unknowns */
            report_free(k, &p, u, mrow);
            break;
        }
    }
    gs_free(seen);
    gs_free(pos);
    gs_free(stack);
    gs_free(mcol);
    gs_free(mrow);
    pattern_clear(&p);
}
