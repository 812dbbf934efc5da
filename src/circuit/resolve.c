/* resolve.c - names used before their line: looked up after the file.
 * See LICENSE.
 *
 * A cccs may name its controlling element, a transfer its source and a
 * bias line its device before the line that defines them, and an output
 * may name any node.  The parser records each such use (gs_ref); here
 * each is looked up, with a did-you-mean hint when it is not found.  A
 * name whose own line had an error is skipped quietly: that line has
 * its message already.
 */
#include "gainsmith.h"
#include "base/mem.h"
#include "circuit/parse.h"

#include <stdlib.h>
#include <string.h>

/* Names of every element, or of the independent sources only. */
static const char **element_names(const gs_circuit *c, int sources_only,
                                  size_t *n)
{
    const char **v = gs_malloc((c->nelems + 1) * sizeof *v);
    size_t i;
    *n = 0;
    for (i = 0; i < c->nelems; i++) {
        gs_elem_kind k = c->elems[i].kind;
        if (!sources_only || k == GS_VSOURCE || k == GS_ISOURCE)
            v[(*n)++] = c->elems[i].name;
    }
    return v;
}

/* The hint for an unknown element name: a near name, or for a device,
   which of its parts to name. */
static char *element_hint(gs_parser *p, const char *name, int sources_only)
{
    int id = gs_symtab_find(p->names, name);
    const char **cand;
    size_t n;
    char *hint;
    if (id >= 0 && p->name_kind[id] == GS_NAME_DEVICE) {
        const gs_device *dv = &p->c->devices[p->name_index[id]];
        return gs_asprintf("'%s' is a %s; name one of its parts, such as "
                           "'%s.gm'", name, dv->is_bjt ? "bjt" : "mosfet",
                           name);
    }
    cand = element_names(p->c, sources_only, &n);
    hint = gs_suggest_hint(name, cand, n);
    gs_free(cand);
    return hint;
}

/* The element named by r, or -1, reported as "unknown ..." + what. */
static int find_element(gs_parser *p, const gs_ref *r, const char *what)
{
    int id = gs_symtab_find(p->names, r->name);
    char *hint;
    if (id >= 0 && p->name_kind[id] == GS_NAME_ELEM)
        return p->name_index[id];
    if (id >= 0 && p->name_kind[id] == GS_NAME_BAD)
        return -1;
    hint = element_hint(p, r->name, r->kind == GS_REF_SOURCE);
    gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, r->off, hint, "unknown %s "
                  "'%s' %s", r->kind == GS_REF_CTRL ? "controlling element"
                  : r->kind == GS_REF_SOURCE ? "source" : "element",
                  r->name, what);
    gs_free(hint);
    return -1;
}

static int find_node(gs_parser *p, const gs_ref *r)
{
    int id = gs_circuit_find_node(p->c, r->name);
    char *hint;
    if (id >= 0)
        return id;
    hint = gs_suggest_hint(r->name, (const char *const *)p->c->node_name,
                           (size_t)p->c->nnodes);
    gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, r->off, hint,
                  "unknown node '%s'", r->name);
    gs_free(hint);
    return -1;
}

static void set_node(gs_output *o, int field, int node)
{
    switch (field) {
    case GS_FIELD_OUT_A: o->out.a = node; break;
    case GS_FIELD_OUT_B: o->out.b = node; break;
    case GS_FIELD_A:     o->a = node; break;
    default:             o->b = node; break;
    }
}

/* The device of a bias line: a mosfet or bjt, biased once. */
static void resolve_bias(gs_parser *p, const gs_ref *r)
{
    int id = gs_symtab_find(p->names, r->name), line, col;
    gs_bias *b = &p->c->biases[r->index];
    size_t i;
    if (id >= 0 && p->name_kind[id] == GS_NAME_BAD)
        return;
    if (id >= 0 && p->name_kind[id] == GS_NAME_ELEM) {
        gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, r->off, "bias lines "
                      "set the operating point of mosfet and bjt lines",
                      "'%s' is a %s, not a mosfet or bjt", r->name,
                      gs_elem_kind_name(p->c->elems[p->name_index[id]].kind));
        return;
    }
    if (id < 0) {
        const char **cand = gs_malloc((p->c->ndevices + 1) * sizeof *cand);
        char *hint;
        for (i = 0; i < p->c->ndevices; i++)
            cand[i] = p->c->devices[i].name;
        hint = gs_suggest_hint(r->name, cand, p->c->ndevices);
        gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, r->off, hint,
                      "unknown device '%s'", r->name);
        gs_free(hint);
        gs_free(cand);
        return;
    }
    for (i = 0; i < r->index; i++) {
        if (p->c->biases[i].device == p->name_index[id]) {
            line = p->c->biases[i].line;
            col = p->c->biases[i].col;
            gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, r->off, NULL,
                          "duplicate bias for '%s' (first at %d:%d)",
                          r->name, line, col);
            return;
        }
    }
    b->device = p->name_index[id];
}

static void resolve_one(gs_parser *p, const gs_ref *r)
{
    gs_circuit *c = p->c;
    char *what;
    int k;
    if (r->kind == GS_REF_NODE) {
        set_node(&c->outputs[r->index], r->field, find_node(p, r));
        return;
    }
    if (r->kind == GS_REF_BIAS) {
        resolve_bias(p, r);
        return;
    }
    if (r->kind == GS_REF_CTRL)
        what = gs_asprintf("of %s '%s'",
                           gs_elem_kind_name(c->elems[r->index].kind),
                           c->elems[r->index].name);
    else
        what = gs_asprintf("in transfer '%s'", c->outputs[r->index].name);
    k = find_element(p, r, what);
    gs_free(what);
    if (r->kind == GS_REF_CTRL)
        c->elems[r->index].ctrl = k;
    else if (r->kind == GS_REF_SOURCE)
        c->outputs[r->index].in = k;
    else
        c->outputs[r->index].out.elem = k;
}

void gs_parser_resolve(gs_parser *p)
{
    size_t i;
    for (i = 0; i < p->nrefs; i++)
        resolve_one(p, &p->refs[i]);
}
