/* circuit.c - the circuit model: lifetime, look-ups.
 * See LICENSE.
 *
 * The values it holds (monomials, expression trees) are in value.c.
 */
#include "circuit/circuit.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

const char *gs_elem_kind_name(gs_elem_kind k)
{
    switch (k) {
    case GS_RESISTOR:    return "resistor";
    case GS_CONDUCTANCE: return "conductance";
    case GS_CAPACITOR:   return "capacitor";
    case GS_INDUCTOR:    return "inductor";
    case GS_VSOURCE:     return "vsource";
    case GS_ISOURCE:     return "isource";
    case GS_VCCS:        return "vccs";
    case GS_VCVS:        return "vcvs";
    case GS_CCCS:        return "cccs";
    case GS_CCVS:        return "ccvs";
    case GS_OPAMP:       return "opamp";
    }
    return "element";
}

/* ---- the circuit ---- */

gs_circuit *gs_circuit_new(void)
{
    gs_circuit *c = gs_calloc(1, sizeof *c);
    c->syms = gs_symtab_new();
    c->s_sym = gs_symtab_intern(c->syms, "s");     /* always 0 */
    c->nnodes = 1;
    c->node_name = gs_malloc(sizeof *c->node_name);
    c->node_line = gs_calloc(1, sizeof *c->node_line);
    c->node_col = gs_calloc(1, sizeof *c->node_col);
    c->node_name[0] = gs_strdup("gnd");
    return c;
}

static void free_strings(char **v, size_t n)
{
    size_t i;
    for (i = 0; i < n; i++)
        gs_free(v[i]);
    gs_free(v);
}

static void free_elements(gs_circuit *c)
{
    size_t i;
    for (i = 0; i < c->nelems; i++) {
        gs_free(c->elems[i].name);
        gs_monomial_clear(&c->elems[i].value);
    }
    gs_free(c->elems);
}

static void free_lines(gs_circuit *c)
{
    size_t i;
    for (i = 0; i < c->noutputs; i++) {
        gs_free(c->outputs[i].name);
        gs_expr_free(c->outputs[i].figure);
        gs_free(c->outputs[i].loop_for);
    }
    gs_free(c->outputs);
    for (i = 0; i < c->nvalues; i++) {
        gs_expr_free(c->values[i].expr);
        gs_free(c->values[i].origin);
    }
    gs_free(c->values);
    for (i = 0; i < c->ndevices; i++) {
        gs_free(c->devices[i].name);
        free_strings(c->devices[i].keys, (size_t)c->devices[i].nparams);
        free_strings(c->devices[i].vals, (size_t)c->devices[i].nparams);
    }
    gs_free(c->devices);
    for (i = 0; i < c->nbiases; i++) {
        free_strings(c->biases[i].keys, (size_t)c->biases[i].nparams);
        free_strings(c->biases[i].vals, (size_t)c->biases[i].nparams);
        gs_free(c->biases[i].val_col);
    }
    gs_free(c->biases);
}

void gs_circuit_free(gs_circuit *c)
{
    if (c == NULL)
        return;
    gs_free(c->file);
    gs_free(c->title);
    gs_symtab_free(c->syms);
    free_strings(c->node_name, (size_t)c->nnodes);
    gs_free(c->node_line);
    gs_free(c->node_col);
    free_strings(c->ref_alias, c->nref_alias);
    free_elements(c);
    free_lines(c);
    gs_expr_free(c->temperature);
    gs_free(c);
}

int gs_circuit_find_element(const gs_circuit *c, const char *name)
{
    size_t i;
    for (i = 0; i < c->nelems; i++)
        if (strcmp(c->elems[i].name, name) == 0)
            return (int)i;
    return -1;
}

int gs_circuit_find_node(const gs_circuit *c, const char *name)
{
    size_t i;
    int k;
    if (strcmp(name, "0") == 0)
        return 0;
    for (i = 0; i < c->nref_alias; i++)
        if (strcmp(c->ref_alias[i], name) == 0)
            return 0;
    for (k = 0; k < c->nnodes; k++)
        if (strcmp(c->node_name[k], name) == 0)
            return k;
    return -1;
}

int gs_circuit_find_output(const gs_circuit *c, const char *name)
{
    size_t i;
    for (i = 0; i < c->noutputs; i++)
        if (strcmp(c->outputs[i].name, name) == 0)
            return (int)i;
    return -1;
}

int gs_circuit_find_device(const gs_circuit *c, const char *name)
{
    size_t i;
    for (i = 0; i < c->ndevices; i++)
        if (strcmp(c->devices[i].name, name) == 0)
            return (int)i;
    return -1;
}

void gs_circuit_clear_outputs(gs_circuit *c)
{
    size_t i;
    for (i = 0; i < c->noutputs; i++)
        gs_free(c->outputs[i].name);
    c->noutputs = 0;
}

int gs_circuit_find_value(const gs_circuit *c, int sym)
{
    size_t i;
    for (i = 0; i < c->nvalues; i++)
        if (c->values[i].sym == sym)
            return (int)i;
    return -1;
}

size_t gs_circuit_add_value(gs_circuit *c, int sym, gs_expr *expr,
                            const char *origin, int line, int col)
{
    gs_valuedef *v;
    c->values = gs_reallocarray(c->values, c->nvalues + 1,
                                sizeof *c->values);
    v = &c->values[c->nvalues];
    v->sym = sym;
    v->expr = expr;
    v->origin = origin ? gs_strdup(origin) : NULL;
    v->line = line;
    v->col = col;
    return c->nvalues++;
}
