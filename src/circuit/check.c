/* check.c - structural checks of a circuit before any algebra.
 * See LICENSE.
 *
 * Each check finds a circuit whose MNA matrix is singular for every value
 * of its symbols, and says why in terms of the elements, before the
 * elimination would only find "singular":
 *
 *  - a loop of voltage-defined branches (vsource, vcvs and ccvs outputs,
 *    an opamp's output, which is a voltage branch to gnd): KVL fixes the
 *    same voltage twice, so their branch-current columns are dependent;
 *  - a part of the circuit joined to the rest only through current
 *    sources (isource, vccs, cccs): KCL summed over its nodes is 0 = the
 *    sum of those currents, and unless some sensed voltage ties the part's
 *    potential to the rest, shifting all its node voltages together
 *    changes no equation (the cut-set dual of the loop rule);
 *  - a part with no branch to the rest at all, and a node touched only by
 *    sensing terminals (vccs/vcvs controls, opamp inputs), whose KCL row
 *    is empty;
 *  - a cccs controlled, through other cccs, by its own current.
 *
 * Inductors count as ordinary branches: in the s-domain they are
 * impedances s*L, and a loop of an inductor and a source is sound.  The
 * loop and cut-set rules are the topological conditions for a unique
 * solution of a network's equations (Chua and Lin, "Computer-Aided
 * Analysis of Electronic Circuits", 1975, ch. 2; Vlach and Singhal,
 * "Computer Methods for Circuit Analysis and Design", 1983).
 *
 * The ideal opamp is a nullor (Tellegen's nullator at the inputs: v = 0
 * and i = 0; a norator at the output to gnd: v and i free), so its output
 * counts in loops of elements with a free current, and its inputs in
 * loops of elements with a fixed voltage.  check_parts.c has the rules for
 * parts cut off from gnd, check_rank.c a last test on the pattern of the
 * equations; gs_circuit_check at the end of this file runs them all.  The
 * helpers they share are in check_util.c, which calls none of them.
 */
#include "circuit/checker.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

/* ---- outputs ---- */

static void check_outputs(const gs_checker *k)
{
    const gs_circuit *c = k->c;
    size_t i;
    for (i = 0; i < c->noutputs; i++) {
        const gs_output *o = &c->outputs[i];
        char *msg = NULL;
        if (o->kind == GS_OUT_TRANSFER && o->in >= 0
            && c->elems[o->in].kind != GS_VSOURCE
            && c->elems[o->in].kind != GS_ISOURCE)
            msg = gs_asprintf("the input '%s' of transfer '%s' is a %s, "
                              "not an independent source",
                              c->elems[o->in].name, o->name,
                              gs_elem_kind_name(c->elems[o->in].kind));
        else if (o->kind == GS_OUT_IMPEDANCE && o->a == o->b && o->a >= 0)
            msg = gs_asprintf("impedance '%s' is measured between node '%s' "
                              "and itself", o->name, c->node_name[o->a]);
        if (msg)
            gs_check_report(k, GS_SEV_ERROR, o->line, o->col, o->kind ==
                            GS_OUT_TRANSFER ? "the input of a transfer is a "
                            "vsource or an isource" : NULL, msg);
        gs_free(msg);
    }
}

/* ---- loops ---- */

/* A branch in a loop search: an element's branch, or an opamp's input
   pair (its nullator). */
typedef struct edge {
    int elem;
    int a, b;
    int nullator;
} edge;

static int has_free_current(gs_elem_kind k)
{
    return k == GS_VSOURCE || k == GS_VCVS || k == GS_CCVS;
}

/* Edges on the path from a to b in the forest tree[0 .. ntree), found by
   breadth-first search, into path; returns their count. */
static size_t forest_path(const gs_circuit *c, const edge *tree,
                          size_t ntree, int a, int b, int *path)
{
    int *via = gs_malloc((size_t)c->nnodes * sizeof *via);
    int *queue = gs_malloc((size_t)c->nnodes * sizeof *queue);
    size_t head = 0, tail = 0, i, n = 0;
    int v;
    for (v = 0; v < c->nnodes; v++)
        via[v] = -2;
    via[a] = -1;
    queue[tail++] = a;
    while (head < tail && via[b] == -2) {
        v = queue[head++];
        for (i = 0; i < ntree; i++) {
            int w = tree[i].a == v ? tree[i].b : tree[i].b == v ? tree[i].a
                    : -1;
            if (w >= 0 && via[w] == -2) {
                via[w] = (int)i;
                queue[tail++] = w;
            }
        }
    }
    for (v = b; via[v] >= 0; n++) {     /* walk back from b to a */
        const edge *t = &tree[via[v]];
        path[n] = via[v];
        v = t->a == v ? t->b : t->a;
    }
    gs_free(queue);
    gs_free(via);
    return n;
}

static int cmp_edge(const void *x, const void *y)
{
    const edge *a = x, *b = y;
    return a->elem != b->elem ? (a->elem > b->elem) - (a->elem < b->elem)
                              : a->nullator - b->nullator;
}

/* "'V1', 'U2' (inputs)" of the loop closed by e: the path and e, in file
   order. */
static char *loop_names(const gs_circuit *c, const edge *tree,
                        const int *path, size_t n, const edge *e,
                        int with_closing)
{
    edge *v = gs_malloc((n + 1) * sizeof *v);
    char **names = gs_malloc((n + 1) * sizeof *names), *list;
    size_t i, m = 0;
    for (i = 0; i < n; i++)
        v[m++] = tree[path[i]];
    if (with_closing)
        v[m++] = *e;
    qsort(v, m, sizeof *v, cmp_edge);
    for (i = 0; i < m; i++)
        names[i] = gs_asprintf(v[i].nullator ? "%s (inputs)" : "%s",
                               c->elems[v[i].elem].name);
    list = gs_check_list((const char *const *)names, m, 1);
    for (i = 0; i < m; i++)
        gs_free(names[i]);
    gs_free(names);
    gs_free(v);
    return list;
}

static void report_loop(const gs_checker *k, const edge *tree,
                        const int *path, size_t n, const edge *e)
{
    const gs_element *el = &k->c->elems[e->elem];
    char *list, *msg;
    if (e->nullator) {
        list = loop_names(k->c, tree, path, n, e, 0);
        msg = gs_asprintf("the inputs of opamp '%s' close a loop of "
                          "voltage-defined elements: %s", el->name, list);
        gs_check_report(k, GS_SEV_ERROR, el->line, el->col, "an ideal opamp "
                        "sets v(in+) = v(in-), which the loop fixes already",
                        msg);
    } else {
        list = loop_names(k->c, tree, path, n, e, 1);
        msg = gs_asprintf("loop of voltage-defined elements: %s", list);
        gs_check_report(k, GS_SEV_ERROR, el->line, el->col, "a loop of "
                        "voltage sources (vsource, vcvs, ccvs, opamp "
                        "outputs) sets one voltage twice", msg);
    }
    gs_free(msg);
    gs_free(list);
}

/* A voltage-defined branch across a single node. */
static void report_shorted(const gs_checker *k, const gs_element *e)
{
    const gs_circuit *c = k->c;
    char *msg, *hint = NULL;
    if (e->node[0] == 0 && c->nref_alias > 0 && e->kind != GS_OPAMP) {
        char *list = gs_check_list((const char *const *)c->ref_alias,
                                   c->nref_alias, 1);
        hint = gs_asprintf("the ground line merges %s into gnd", list);
        gs_free(list);
    }
    if (e->kind == GS_OPAMP)
        msg = gs_asprintf("the output of opamp '%s' is the reference node",
                          e->name);
    else
        msg = gs_asprintf("%s '%s' has both ends on node '%s'",
                          gs_elem_kind_name(e->kind), e->name,
                          c->node_name[e->node[0]]);
    gs_check_report(k, GS_SEV_ERROR, e->line, e->col, hint, msg);
    gs_free(msg);
    gs_free(hint);
}

/* An opamp whose inputs are one node: v(+) = v(-) says nothing, and the
   output current is left undetermined. */
static void report_inputs_shorted(const gs_checker *k, const gs_element *e)
{
    char *msg = gs_asprintf("opamp '%s' has both inputs on node '%s'",
                            e->name, k->c->node_name[e->node[1]]);
    gs_check_report(k, GS_SEV_ERROR, e->line, e->col, "an ideal opamp sets "
                    "v(in+) = v(in-); with one node there it sets nothing",
                    msg);
    gs_free(msg);
}

/* Is the loop (path and e) certainly singular?  A loop of independent
   vsources always is (its KVL rows are dependent); otherwise a current
   circulating in it changes no equation unless some cccs or ccvs senses
   the current of one of its elements. */
static int loop_is_singular(const gs_circuit *c, const edge *tree,
                            const int *path, size_t n, const edge *e,
                            const unsigned char *sensed)
{
    size_t i;
    int all_sources = c->elems[e->elem].kind == GS_VSOURCE, any_sensed;
    any_sensed = sensed[e->elem];
    for (i = 0; i < n; i++) {
        const edge *t = &tree[path[i]];
        all_sources &= c->elems[t->elem].kind == GS_VSOURCE || t->nullator;
        any_sensed |= sensed[t->elem];
    }
    return all_sources || !any_sensed;
}

/* Add edge e to the forest, or report the loop it closes. */
static void loop_edge(gs_checker *k, edge *tree, size_t *ntree, int *path,
                      const edge *e, const unsigned char *sensed)
{
    int ra = gs_uf_find(k->parent, e->a), rb = gs_uf_find(k->parent, e->b);
    size_t n;
    if (ra != rb) {
        k->parent[ra] = rb;
        tree[(*ntree)++] = *e;
    } else if (sensed != NULL) {
        n = forest_path(k->c, tree, *ntree, e->a, e->b, path);
        if (loop_is_singular(k->c, tree, path, n, e, sensed))
            report_loop(k, tree, path, n, e);
    }
}

/* Which elements' currents a cccs or ccvs senses. */
static unsigned char *sensed_currents(const gs_circuit *c)
{
    unsigned char *s = gs_calloc(c->nelems + 1, 1);
    size_t i;
    for (i = 0; i < c->nelems; i++)
        if ((c->elems[i].kind == GS_CCCS || c->elems[i].kind == GS_CCVS)
            && c->elems[i].ctrl >= 0)
            s[c->elems[i].ctrl] = 1;
    return s;
}

/* The opamps' input pairs, added to the forest of vsources. */
static void nullator_edges(gs_checker *k, edge *tree, size_t *ntree,
                           int *path, const unsigned char *sensed)
{
    const gs_circuit *c = k->c;
    size_t i;
    edge e;
    for (i = 0; i < c->nelems; i++) {
        const gs_element *el = &c->elems[i];
        if (el->kind != GS_OPAMP)
            continue;
        if (el->node[1] == el->node[2]) {
            report_inputs_shorted(k, el);
            continue;
        }
        e.elem = (int)i;
        e.nullator = 1;
        e.a = el->node[1];
        e.b = el->node[2];
        loop_edge(k, tree, ntree, path, &e, sensed);
    }
}

/* Two searches.  Elements with a free current (sources with a voltage
   set, opamp outputs) must not form a loop: its circulating current would
   be set by nothing.  Independent vsources and opamp inputs, whose
   voltages are fixed, must not either: KVL would fix one voltage twice.
   Loops of sources alone are reported by the first search only. */
static void check_loops(gs_checker *k)
{
    const gs_circuit *c = k->c;
    edge *tree = gs_malloc((c->nelems + 1) * sizeof *tree), e;
    int *path = gs_malloc((c->nelems + 1) * sizeof *path), pass;
    unsigned char *sensed = sensed_currents(c);
    size_t i, ntree;
    for (pass = 0; pass < 2; pass++) {
        gs_uf_reset(k->parent, c->nnodes);
        ntree = 0;
        for (i = 0; i < c->nelems; i++) {
            const gs_element *el = &c->elems[i];
            e.elem = (int)i;
            e.nullator = 0;
            e.a = el->node[0];
            e.b = el->kind == GS_OPAMP ? 0 : el->node[1];
            if (!has_free_current(el->kind) && el->kind != GS_OPAMP)
                continue;
            if (e.a == e.b) {       /* its branch current is in no KCL */
                if (pass == 0 && (el->kind == GS_VSOURCE || !sensed[i]))
                    report_shorted(k, el);
                continue;
            }
            if (pass == 0)
                loop_edge(k, tree, &ntree, path, &e, sensed);
            else if (el->kind == GS_VSOURCE)
                loop_edge(k, tree, &ntree, path, &e, NULL);
        }
        if (pass == 1)
            nullator_edges(k, tree, &ntree, path, sensed);
    }
    gs_free(sensed);
    gs_free(path);
    gs_free(tree);
}

/* ---- loops of current-controlled current sources ---- */

static void report_cccs_loop(const gs_checker *k, const int *stack,
                             size_t from, size_t n, int j)
{
    const gs_circuit *c = k->c;
    char *msg = gs_strdup("loop of current-controlled sources:"), *t;
    for (; from < n; from++) {
        t = gs_asprintf("%s %s ->", msg, c->elems[stack[from]].name);
        gs_free(msg);
        msg = t;
    }
    t = gs_asprintf("%s %s", msg, c->elems[j].name);
    gs_check_report(k, GS_SEV_ERROR, c->elems[j].line, c->elems[j].col,
                    "sense one of the currents through a vsource of value "
                    "0 in series instead", t);
    gs_free(t);
    gs_free(msg);
}

/* Each cccs has one successor (its control): a walk that meets itself
   is a loop. */
static void check_cccs_loops(const gs_checker *k)
{
    const gs_circuit *c = k->c;
    unsigned char *state = gs_calloc(c->nelems + 1, 1);
    int *stack = gs_malloc((c->nelems + 1) * sizeof *stack);
    size_t i;
    for (i = 0; i < c->nelems; i++) {
        size_t n = 0, from;
        int j = (int)i;
        while (j >= 0 && c->elems[j].kind == GS_CCCS && state[j] == 0) {
            state[j] = 1;
            stack[n++] = j;
            j = c->elems[j].ctrl;
        }
        if (j >= 0 && c->elems[j].kind == GS_CCCS && state[j] == 1) {
            for (from = 0; stack[from] != j; from++)
                ;
            report_cccs_loop(k, stack, from, n, j);
        }
        while (n > 0)
            state[stack[--n]] = 2;
    }
    gs_free(stack);
    gs_free(state);
}

int gs_circuit_check(const gs_circuit *c, gs_diag *d)
{
    gs_checker k;
    size_t before = d->nerrors;
    k.c = c;
    k.d = d;
    k.parent = gs_malloc((size_t)c->nnodes * sizeof *k.parent);
    k.flagged = gs_calloc((size_t)c->nnodes, 1);
    check_outputs(&k);
    check_loops(&k);
    check_cccs_loops(&k);
    gs_check_parts(&k);
    if (d->nerrors == before)           /* the catch-all, when nothing */
        gs_check_rank(&k);              /* more specific was found */
    gs_check_single(&k);
    gs_values_check_cycles(c, d);
    gs_free(k.flagged);
    gs_free(k.parent);
    return d->nerrors == before ? GS_OK : GS_EINVAL;
}
