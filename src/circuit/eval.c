/* eval.c - numeric values of value lines, in dependency order.
 * See LICENSE.
 *
 * Value lines may use each other in any order, so they are evaluated in
 * a post-order of their dependency graph, found by depth-first search
 * with an explicit stack; a back edge of the search is a cycle (Tarjan,
 * "Depth-first search and linear graph algorithms", SIAM J. Comput. 1,
 * 1972).  Arithmetic is long double (C11 7.12); a domain error or an
 * overflow is reported where the operation is written.
 */
#include "gainsmith.h"
#include "base/mem.h"
#include "circuit/parse.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* pi to more digits than any long double holds */
#define PI_LD 3.141592653589793238462643383279502884L

typedef struct evaluator {
    const gs_circuit *c;
    const long double *vals;
    const unsigned char *set;
    gs_diag *d;
    const gs_valuedef *def; /* the value being computed, or NULL */
} evaluator;

/* A message at e; one without a place in the file (an expression from
   the command line) says which value it is about instead. */
static int fail(const evaluator *ev, const gs_expr *e, int rc,
                const char *hint, const char *msg)
{
    const gs_valuedef *v = ev->def;
    if (e->line > 0 || v == NULL)
        gs_diag_add(ev->d, GS_SEV_ERROR, e->line > 0 ? ev->c->file : NULL,
                    e->line, e->col, hint, "%s", msg);
    else
        gs_diag_add(ev->d, GS_SEV_ERROR, NULL, 0, 0, hint, "%s %s: %s",
                    v->origin ? v->origin : "value",
                    gs_symtab_name(ev->c->syms, v->sym), msg);
    return rc;
}

static int failf(const evaluator *ev, const gs_expr *e, const char *fmt,
                 long double a, long double b)
{
    char msg[160];
    snprintf(msg, sizeof msg, fmt, a, b);
    return fail(ev, e, GS_EINVAL, NULL, msg);
}

static int overflow(const evaluator *ev, const gs_expr *e, long double r,
                    const char *what)
{
    char msg[64];
    if (isfinite(r))
        return GS_OK;
    snprintf(msg, sizeof msg, "overflow in %s", what);
    return fail(ev, e, GS_EINVAL, NULL, msg);
}

static int eval_rec(long double *out, const evaluator *ev, const gs_expr *e);

static int eval_call(long double *out, const evaluator *ev, const gs_expr *e)
{
    long double x;
    int rc;
    if (strcmp(e->func, "pi") == 0) {
        *out = PI_LD;
        return GS_OK;
    }
    if ((rc = eval_rec(&x, ev, e->lhs)) != GS_OK)
        return rc;
    if (strcmp(e->func, "sqrt") == 0 && x < 0)
        return failf(ev, e, "sqrt of a negative number (%Lg)", x, 0);
    if ((strcmp(e->func, "log") == 0 || strcmp(e->func, "log10") == 0)
        && x <= 0) {
        char fmt[64];
        snprintf(fmt, sizeof fmt, "%s of a non-positive number (%%Lg)",
                 e->func);
        return failf(ev, e, fmt, x, 0);
    }
    if (strcmp(e->func, "sqrt") == 0)
        *out = sqrtl(x);
    else if (strcmp(e->func, "exp") == 0)
        *out = expl(x);
    else if (strcmp(e->func, "log") == 0)
        *out = logl(x);
    else if (strcmp(e->func, "log10") == 0)
        *out = log10l(x);
    else
        *out = fabsl(x);
    return overflow(ev, e, *out, "exp()");
}

static int eval_pow(long double *out, const evaluator *ev, const gs_expr *e,
                    long double x, long double y)
{
    if (x < 0 && y != floorl(y))
        return failf(ev, e, "negative number to a non-integer power "
                     "((%Lg)^%Lg)", x, y);
    if (x == 0 && y < 0)
        return failf(ev, e, "zero to a negative power (0^%Lg)", y, 0);
    *out = powl(x, y);
    return overflow(ev, e, *out, "'^'");
}

static int eval_binary(long double *out, const evaluator *ev,
                       const gs_expr *e)
{
    static const char *const name[] = {"'+'", "'-'", "'*'", "'/'"};
    long double x, y;
    int rc, op;
    if ((rc = eval_rec(&x, ev, e->lhs)) != GS_OK
        || (rc = eval_rec(&y, ev, e->rhs)) != GS_OK)
        return rc;
    switch (e->kind) {
    case GS_EX_ADD: *out = x + y; op = 0; break;
    case GS_EX_SUB: *out = x - y; op = 1; break;
    case GS_EX_MUL: *out = x * y; op = 2; break;
    case GS_EX_DIV:
        if (y == 0)
            return fail(ev, e, GS_EINVAL, NULL, "division by zero");
        *out = x / y;
        op = 3;
        break;
    default:
        return eval_pow(out, ev, e, x, y);
    }
    return overflow(ev, e, *out, name[op]);
}

static int eval_rec(long double *out, const evaluator *ev, const gs_expr *e)
{
    char *hint;
    int rc;
    switch (e->kind) {
    case GS_EX_NUM:
        *out = gs_rat_get_ld(&e->num);
        if (!isfinite(*out))
            return fail(ev, e, GS_EINVAL, NULL, "number too large for a "
                        "long double");
        if (*out == 0 && !gs_rat_is_zero(&e->num))
            return fail(ev, e, GS_EINVAL, "write 0 if zero is meant",
                        "number too small for a long double (it would "
                        "read as 0)");
        return GS_OK;
    case GS_EX_SYM:
        if (ev->set[e->sym]) {
            *out = ev->vals[e->sym];
            return GS_OK;
        }
        hint = gs_asprintf("bind it with a line 'value %s = ...'",
                           gs_symtab_name(ev->c->syms, e->sym));
        {
            char *msg = gs_asprintf("'%s' has no value",
                                    gs_symtab_name(ev->c->syms, e->sym));
            fail(ev, e, GS_EUNBOUND, hint, msg);
            gs_free(msg);
        }
        gs_free(hint);
        return GS_EUNBOUND;
    case GS_EX_NEG:
        if ((rc = eval_rec(out, ev, e->lhs)) == GS_OK)
            *out = -*out;
        return rc;
    case GS_EX_CALL:
        return eval_call(out, ev, e);
    default:
        return eval_binary(out, ev, e);
    }
}

int gs_expr_eval(long double *out, const gs_expr *e, const gs_circuit *c,
                 const long double *vals, const unsigned char *set,
                 gs_diag *d)
{
    evaluator ev;
    ev.c = c;
    ev.vals = vals;
    ev.set = set;
    ev.d = d;
    ev.def = NULL;
    return eval_rec(out, &ev, e);
}

/* ---- the dependency graph of value definitions ---- */

typedef struct vgraph {
    size_t n;
    size_t *start;          /* deps of def i: dep[start[i] .. start[i+1]) */
    int *dep;               /* def indices */
    size_t ndep, adep;
} vgraph;

static void collect_deps(vgraph *g, const gs_expr *e, const int *def_of)
{
    if (e == NULL)
        return;
    if (e->kind == GS_EX_SYM && def_of[e->sym] >= 0) {
        g->dep = gs_grow(g->dep, g->ndep, &g->adep, sizeof *g->dep);
        g->dep[g->ndep++] = def_of[e->sym];
    }
    collect_deps(g, e->lhs, def_of);
    collect_deps(g, e->rhs, def_of);
}

/* def_of[sym]: the first definition of sym, -1 if none or if skip[sym]. */
static int *definitions(const gs_circuit *c, const unsigned char *skip)
{
    size_t nsym = (size_t)gs_symtab_count(c->syms), i;
    int *def_of = gs_malloc((nsym ? nsym : 1) * sizeof *def_of);
    for (i = 0; i < nsym; i++)
        def_of[i] = -1;
    for (i = c->nvalues; i-- > 0;) {
        int s = c->values[i].sym;
        if (skip == NULL || !skip[s])
            def_of[s] = (int)i;
    }
    return def_of;
}

static void graph_build(vgraph *g, const gs_circuit *c, const int *def_of)
{
    size_t i;
    memset(g, 0, sizeof *g);
    g->n = c->nvalues;
    g->start = gs_malloc((g->n + 1) * sizeof *g->start);
    for (i = 0; i < g->n; i++) {
        g->start[i] = g->ndep;
        if (def_of[c->values[i].sym] == (int)i)
            collect_deps(g, c->values[i].expr, def_of);
    }
    g->start[g->n] = g->ndep;
}

static void graph_clear(vgraph *g)
{
    gs_free(g->start);
    gs_free(g->dep);
}

/* "value cycle: a -> b -> a" for the stack entries from `from` up. */
static void report_cycle(const gs_circuit *c, gs_diag *d, const int *stack,
                         size_t from, size_t top)
{
    const gs_valuedef *v0 = &c->values[stack[from]];
    char *msg = gs_strdup("value cycle:"), *next;
    size_t i;
    for (i = from; i <= top; i++) {
        next = gs_asprintf("%s %s ->", msg,
                           gs_symtab_name(c->syms, c->values[stack[i]].sym));
        gs_free(msg);
        msg = next;
    }
    next = gs_asprintf("%s %s", msg, gs_symtab_name(c->syms, v0->sym));
    gs_free(msg);
    gs_diag_add(d, GS_SEV_ERROR, v0->line > 0 ? c->file : NULL, v0->line,
                v0->col, NULL, "%s", next);
    gs_free(next);
}

/* Post-order of the definitions into order[] (count returned); every def
   on a cycle, and every def reaching one, gets bad[] = 1.  Cycles are
   reported. */
static size_t graph_order(const vgraph *g, const gs_circuit *c, gs_diag *d,
                          size_t *order, unsigned char *bad)
{
    unsigned char *state = gs_calloc(g->n + 1, 1);  /* 1 open, 2 done */
    int *stack = gs_malloc((g->n + 1) * sizeof *stack);
    size_t *next = gs_malloc((g->n + 1) * sizeof *next), top, root, n = 0;
    for (root = 0; root < g->n; root++) {
        if (state[root])
            continue;
        stack[0] = (int)root;
        next[0] = g->start[root];
        state[root] = 1;
        top = 0;
        for (;;) {
            int v = stack[top];
            if (next[top] < g->start[v + 1]) {
                int w = g->dep[next[top]++];
                if (state[w] == 1) {
                    size_t from = top;
                    while (stack[from] != w)
                        from--;
                    report_cycle(c, d, stack, from, top);
                    bad[w] = 1;
                } else if (state[w] == 0) {
                    stack[++top] = w;
                    next[top] = g->start[w];
                    state[w] = 1;
                }
                if (bad[w])
                    bad[v] = 1;
                continue;
            }
            state[v] = 2;
            order[n++] = (size_t)v;
            if (top == 0)
                break;
            top--;
            if (bad[v])
                bad[stack[top]] = 1;
        }
    }
    gs_free(next);
    gs_free(stack);
    gs_free(state);
    return n;
}

int gs_values_check_cycles(const gs_circuit *c, gs_diag *d)
{
    int *def_of = definitions(c, NULL);
    size_t *order = gs_malloc((c->nvalues + 1) * sizeof *order);
    unsigned char *bad = gs_calloc(c->nvalues + 1, 1);
    size_t before = d->nerrors;
    vgraph g;
    graph_build(&g, c, def_of);
    graph_order(&g, c, d, order, bad);
    graph_clear(&g);
    gs_free(bad);
    gs_free(order);
    gs_free(def_of);
    return d->nerrors == before ? GS_OK : GS_EINVAL;
}

int gs_circuit_eval_values(const gs_circuit *c, long double *vals,
                           unsigned char *set, gs_diag *d)
{
    int *def_of = definitions(c, set);
    size_t *order = gs_malloc((c->nvalues + 1) * sizeof *order), n, i;
    unsigned char *bad = gs_calloc(c->nvalues + 1, 1);
    size_t before = d->nerrors;
    evaluator ev;
    vgraph g;

    graph_build(&g, c, def_of);
    n = graph_order(&g, c, d, order, bad);
    ev.c = c;
    ev.vals = vals;
    ev.set = set;
    ev.d = d;
    for (i = 0; i < n; i++) {
        size_t k = order[i], j;
        const gs_valuedef *v = &c->values[k];
        long double x;
        if (def_of[v->sym] != (int)k || bad[k])
            continue;
        for (j = g.start[k]; j < g.start[k + 1]; j++)
            if (bad[g.dep[j]])
                bad[k] = 1;             /* its inputs are reported */
        ev.def = v;
        if (bad[k] || eval_rec(&x, &ev, v->expr) != GS_OK) {
            bad[k] = 1;
            continue;
        }
        vals[v->sym] = x;
        set[v->sym] = 1;
    }
    graph_clear(&g);
    gs_free(bad);
    gs_free(order);
    gs_free(def_of);
    return d->nerrors == before ? GS_OK : GS_EINVAL;
}
