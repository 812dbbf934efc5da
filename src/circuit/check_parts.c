/* check_parts.c - parts of a circuit that nothing ties to gnd.
 * See LICENSE.
 *
 * Two rules, each a reason for the MNA matrix to be singular for all
 * values of the elements:
 *
 *  - rows: join the nodes by every element whose current depends on the
 *    unknowns (all but independent current sources).  For a group S of
 *    nodes that this leaves apart from gnd, the sum of the KCL rows of S
 *    is the sum of the currents that leave S, which are then only
 *    independent sources: the rows are dependent.  With no element at
 *    all leaving S, S "has no path to gnd"; with only current sources,
 *    they are a cut-set of current sources.
 *
 *  - columns: join the nodes by every equation that holds a voltage
 *    difference: two-terminal elements, branches with a set voltage, the
 *    sensed control voltages of vccs and vcvs, and opamp inputs.  For a
 *    group T that this leaves apart from gnd, adding one constant to
 *    every voltage of T changes no equation: the columns are dependent.
 *    T then meets the rest only through current sources (a vccs's output
 *    does not depend on its own voltage) or opamp outputs.
 *
 * These are the cut-set conditions of Chua and Lin, "Computer-Aided
 * Analysis of Electronic Circuits", 1975, ch. 2, in the form the MNA
 * equations give them.
 */
#include "circuit/checker.h"
#include "circuit/lex.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

/* The terminals an element's current flows between (gnd for an opamp's
   output). */
static void branch(const gs_element *e, int *a, int *b)
{
    *a = e->node[0];
    *b = e->kind == GS_OPAMP ? 0 : e->node[1];
}

/* Does the element's current depend on the unknowns? */
static int row_edge(const gs_element *e)
{
    return e->kind != GS_ISOURCE && !(e->kind == GS_VCCS
                                      && gs_senses_nothing(e));
}

/* The voltage differences the element's equations hold, as node pairs
   (up to two); returns their count. */
static int col_edges(const gs_element *e, int *pair)
{
    int n = 0;
    switch (e->kind) {
    case GS_VCCS:
        break;
    case GS_ISOURCE:
    case GS_CCCS:
        return 0;
    case GS_OPAMP:
        pair[0] = e->node[1];
        pair[1] = e->node[2];
        return 1;
    default:
        pair[n++] = e->node[0];
        pair[n++] = e->node[1];
        break;
    }
    if (e->kind == GS_VCCS || e->kind == GS_VCVS) {
        pair[2 * (n / 2)] = e->node[2];
        pair[2 * (n / 2) + 1] = e->node[3];
        n += 2;
    }
    return n / 2;
}

/* Names of the nodes in group r, flagging them. */
static char *group_nodes(const gs_checker *k, int r, size_t *n)
{
    const gs_circuit *c = k->c;
    const char **v = gs_malloc((size_t)c->nnodes * sizeof *v);
    char *list;
    int i;
    *n = 0;
    for (i = 1; i < c->nnodes; i++) {
        if (gs_uf_find(k->parent, i) == r) {
            v[(*n)++] = c->node_name[i];
            k->flagged[i] = 1;
        }
    }
    list = gs_check_list(v, *n, 1);
    gs_free(v);
    return list;
}

/* Names of the elements whose current leaves group r; *opamps counts the
   opamp outputs among them. */
static char *group_exits(const gs_checker *k, int r, size_t *n, int *opamps)
{
    const gs_circuit *c = k->c;
    const char **v = gs_malloc((c->nelems + 1) * sizeof *v);
    char *list;
    size_t i;
    *n = 0;
    *opamps = 0;
    for (i = 0; i < c->nelems; i++) {
        int a, b, ra, rb;
        branch(&c->elems[i], &a, &b);
        ra = gs_uf_find(k->parent, a);
        rb = gs_uf_find(k->parent, b);
        if (ra != rb && (ra == r || rb == r)) {
            v[(*n)++] = c->elems[i].name;
            *opamps += c->elems[i].kind == GS_OPAMP;
        }
    }
    list = gs_check_list(v, *n, 0);
    gs_free(v);
    return list;
}

/* Does some current-carrying terminal touch group r? */
static int group_carries(const gs_checker *k, int r)
{
    const gs_circuit *c = k->c;
    size_t i;
    for (i = 0; i < c->nelems; i++) {
        int a, b;
        branch(&c->elems[i], &a, &b);
        if (gs_uf_find(k->parent, a) == r || gs_uf_find(k->parent, b) == r)
            return 1;
    }
    return 0;
}

static void report_group(const gs_checker *k, int r, int first, int by_rows)
{
    const gs_circuit *c = k->c;
    size_t nn, ne;
    int opamps, carries = group_carries(k, r);
    char *nodes = group_nodes(k, r, &nn);
    char *exits = group_exits(k, r, &ne, &opamps), *msg;
    const char *hint;
    const char *s = nn > 1 ? "s" : "";
    if (!carries) {
        msg = gs_asprintf("node%s %s only sense%s voltage; %s floating", s,
                          nodes, nn > 1 ? "" : "s", nn > 1 ? "they are"
                          : "it is");
        hint = "a node needs an element that carries current, such as a "
               "resistor, to the rest of the circuit";
    } else if (by_rows && ne == 0) {
        msg = gs_asprintf("node%s %s ha%s no path to gnd", s, nodes,
                          nn > 1 ? "ve" : "s");
        hint = "every part of a circuit needs a connection to gnd";
    } else if (opamps) {
        msg = gs_asprintf("nothing sets the voltage of node%s %s: %s "
                          "connect%s to the rest of the circuit only through "
                          "%s", s, nodes, nn > 1 ? "they" : "it",
                          nn > 1 ? "" : "s", exits);
        hint = "an ideal opamp needs feedback, a path from its output back "
               "to its inputs";
    } else {
        msg = gs_asprintf("cut-set of current sources: node%s %s connect%s "
                          "to the rest of the circuit only through %s", s,
                          nodes, nn > 1 ? "" : "s", exits);
        hint = "the currents cannot balance: give the nodes a path for "
               "current, such as an output resistance (rds, ro) or a load";
    }
    gs_check_report(k, GS_SEV_ERROR, c->node_line[first], c->node_col[first],
                    hint, msg);
    gs_free(msg);
    gs_free(exits);
    gs_free(nodes);
}

/* Report each group of nodes the union-find leaves apart from gnd, once,
   skipping groups with a node reported already. */
static void report_groups(const gs_checker *k, int by_rows)
{
    const gs_circuit *c = k->c;
    unsigned char *seen = gs_calloc((size_t)c->nnodes, 1);
    int v, r0 = gs_uf_find(k->parent, 0);
    for (v = 1; v < c->nnodes; v++)
        if (k->flagged[v])
            seen[gs_uf_find(k->parent, v)] = 1;
    for (v = 1; v < c->nnodes; v++) {
        int r = gs_uf_find(k->parent, v);
        if (r == r0 || seen[r])
            continue;
        seen[r] = 1;
        report_group(k, r, v, by_rows);
    }
    gs_free(seen);
}

void gs_check_parts(gs_checker *k)
{
    const gs_circuit *c = k->c;
    size_t i;
    int pair[4], n, j;
    gs_uf_reset(k->parent, c->nnodes);
    for (i = 0; i < c->nelems; i++) {
        int a, b;
        if (!row_edge(&c->elems[i]))
            continue;
        branch(&c->elems[i], &a, &b);
        gs_uf_union(k->parent, a, b);
    }
    report_groups(k, 1);
    gs_uf_reset(k->parent, c->nnodes);
    for (i = 0; i < c->nelems; i++) {
        n = col_edges(&c->elems[i], pair);
        for (j = 0; j < n; j++)
            gs_uf_union(k->parent, pair[2 * j], pair[2 * j + 1]);
    }
    report_groups(k, 0);
}

/* ---- warnings ---- */

static void warn_senses_nothing(const gs_checker *k, const gs_element *e)
{
    char *msg = gs_asprintf("%s '%s' senses the voltage between node '%s' "
                            "and itself, which is always 0",
                            gs_elem_kind_name(e->kind), e->name,
                            k->c->node_name[e->node[2]]);
    gs_check_report(k, GS_SEV_WARNING, e->line, e->col, NULL, msg);
    gs_free(msg);
}

/* A node with a single terminal on it is legal but a sign of a slip (a
   misspelt node name).  Sensing terminals count, so a gate driven
   through a resistor (the resistor and the gate's sensing terminal) is
   two connections and no warning.  A device part whose control is shorted
   (a mosfet with its gate on its source) is a common way to use a device,
   and not warned about either.  Nor is the output of a vcvs or ccvs: its
   voltage is set by what the source senses, so a node driven by one and
   nothing else is a point made to observe (a buffer to a probe), not a
   slip. */
void gs_check_single(const gs_checker *k)
{
    const gs_circuit *c = k->c;
    int *count = gs_calloc((size_t)c->nnodes, sizeof *count);
    int *last = gs_calloc((size_t)c->nnodes, sizeof *last);
    unsigned char *driven = gs_calloc((size_t)c->nnodes, 1);
    size_t i;
    int v, t;
    for (i = 0; i < c->nelems; i++) {
        const gs_element *e = &c->elems[i];
        for (t = 0; t < 4; t++) {
            if (e->node[t] >= 0) {
                count[e->node[t]]++;
                last[e->node[t]] = (int)i;
                if (t < 2 && (e->kind == GS_VCVS || e->kind == GS_CCVS))
                    driven[e->node[t]] = 1;
            }
        }
        if (gs_senses_nothing(e) && e->device < 0)
            warn_senses_nothing(k, e);
    }
    for (v = 1; v < c->nnodes; v++) {
        const gs_element *e = &c->elems[last[v]];
        const char *near;
        char *msg, *hint;
        if (count[v] != 1 || k->flagged[v] || driven[v])
            continue;
        /* a node the file did not name (a sense line's vo.dm) cannot be
           misspelt */
        if (strchr(c->node_name[v], '.') != NULL)
            continue;
        msg = gs_asprintf("node '%s' has only one connection (%s '%s')",
                          c->node_name[v], gs_elem_kind_name(e->kind),
                          e->name);
        near = gs_suggest(c->node_name[v], (const char *const *)c->node_name,
                          (size_t)c->nnodes);
        hint = near ? gs_asprintf("an element joined at one end only "
                                  "carries no current; did you mean '%s'?",
                                  near)
                    : gs_strdup("an element joined at one end only carries "
                                "no current; is the node name misspelt?");
        gs_check_report(k, GS_SEV_WARNING, c->node_line[v], c->node_col[v],
                        hint, msg);
        gs_free(hint);
        gs_free(msg);
    }
    gs_free(driven);
    gs_free(last);
    gs_free(count);
}
