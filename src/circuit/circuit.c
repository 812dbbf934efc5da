/* circuit.c - the circuit model: lifetime, monomials, look-ups.
 * See LICENSE.
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

/* ---- monomials ---- */

void gs_monomial_init(gs_monomial *m)
{
    gs_rat_init(&m->coeff);
    gs_rat_set_si(&m->coeff, 1, 1);
    m->n = 0;
    m->sym = NULL;
    m->exp = NULL;
}

void gs_monomial_clear(gs_monomial *m)
{
    gs_rat_clear(&m->coeff);
    free(m->sym);
    free(m->exp);
    m->n = 0;
    m->sym = m->exp = NULL;
}

void gs_monomial_set(gs_monomial *r, const gs_monomial *a)
{
    if (r == a)
        return;
    gs_rat_set(&r->coeff, &a->coeff);
    free(r->sym);
    free(r->exp);
    r->n = a->n;
    r->sym = gs_malloc((size_t)a->n * sizeof *r->sym);
    r->exp = gs_malloc((size_t)a->n * sizeof *r->exp);
    if (a->n > 0) {
        memcpy(r->sym, a->sym, (size_t)a->n * sizeof *r->sym);
        memcpy(r->exp, a->exp, (size_t)a->n * sizeof *r->exp);
    }
}

void gs_monomial_mul_sym(gs_monomial *r, int sym, int exp)
{
    int i = 0, j;
    while (i < r->n && r->sym[i] < sym)
        i++;
    if (i < r->n && r->sym[i] == sym) {
        r->exp[i] += exp;
        if (r->exp[i] == 0) {           /* cancelled: close the gap */
            for (j = i; j + 1 < r->n; j++) {
                r->sym[j] = r->sym[j + 1];
                r->exp[j] = r->exp[j + 1];
            }
            r->n--;
        }
        return;
    }
    if (exp == 0)
        return;
    r->sym = gs_reallocarray(r->sym, (size_t)r->n + 1, sizeof *r->sym);
    r->exp = gs_reallocarray(r->exp, (size_t)r->n + 1, sizeof *r->exp);
    for (j = r->n; j > i; j--) {
        r->sym[j] = r->sym[j - 1];
        r->exp[j] = r->exp[j - 1];
    }
    r->sym[i] = sym;
    r->exp[i] = exp;
    r->n++;
}

void gs_monomial_mul(gs_monomial *r, const gs_monomial *a,
                     const gs_monomial *b)
{
    gs_monomial t;
    int i;
    gs_monomial_init(&t);
    gs_monomial_set(&t, a);
    gs_rat_mul(&t.coeff, &t.coeff, &b->coeff);
    for (i = 0; i < b->n; i++)
        gs_monomial_mul_sym(&t, b->sym[i], b->exp[i]);
    gs_monomial_clear(r);
    *r = t;
}

int gs_monomial_pow_si(gs_monomial *r, const gs_monomial *a, long e)
{
    int i;
    if (e < 0 && gs_rat_is_zero(&a->coeff))
        return GS_EDIVZERO;
    gs_monomial_set(r, a);
    gs_rat_pow_si(&r->coeff, &r->coeff, e);
    for (i = 0; i < r->n; i++)
        r->exp[i] = (int)(r->exp[i] * e);
    if (e == 0) {
        r->n = 0;
    }
    return GS_OK;
}

int gs_monomial_equal(const gs_monomial *a, const gs_monomial *b)
{
    int i;
    if (a->n != b->n || !gs_rat_equal(&a->coeff, &b->coeff))
        return 0;
    for (i = 0; i < a->n; i++)
        if (a->sym[i] != b->sym[i] || a->exp[i] != b->exp[i])
            return 0;
    return 1;
}

char *gs_monomial_get_str(const gs_monomial *m, const gs_symtab *st)
{
    char *out, *cf;
    int i, one;
    gs_rat unit;
    gs_rat_init(&unit);
    gs_rat_set_si(&unit, 1, 1);
    one = gs_rat_equal(&m->coeff, &unit);
    gs_rat_clear(&unit);
    cf = gs_rat_get_str(&m->coeff);
    out = gs_strdup(one && m->n > 0 ? "" : cf);
    free(cf);
    for (i = 0; i < m->n; i++) {
        const char *name = gs_symtab_name(st, m->sym[i]);
        const char *sep = (i == 0 && one) ? "" : "*";
        char *next = m->exp[i] == 1
                     ? gs_asprintf("%s%s%s", out, sep, name)
                     : gs_asprintf("%s%s%s^%d", out, sep, name, m->exp[i]);
        free(out);
        out = next;
    }
    return out;
}

/* ---- expressions ---- */

void gs_expr_free(gs_expr *e)
{
    if (e == NULL)
        return;
    gs_expr_free(e->lhs);
    gs_expr_free(e->rhs);
    gs_rat_clear(&e->num);
    free(e->func);
    free(e);
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
        free(v[i]);
    free(v);
}

static void free_elements(gs_circuit *c)
{
    size_t i;
    for (i = 0; i < c->nelems; i++) {
        free(c->elems[i].name);
        gs_monomial_clear(&c->elems[i].value);
    }
    free(c->elems);
}

static void free_lines(gs_circuit *c)
{
    size_t i;
    for (i = 0; i < c->noutputs; i++) {
        free(c->outputs[i].name);
        gs_expr_free(c->outputs[i].figure);
        free(c->outputs[i].loop_for);
    }
    free(c->outputs);
    for (i = 0; i < c->nvalues; i++) {
        gs_expr_free(c->values[i].expr);
        free(c->values[i].origin);
    }
    free(c->values);
    for (i = 0; i < c->ndevices; i++) {
        free(c->devices[i].name);
        free_strings(c->devices[i].keys, (size_t)c->devices[i].nparams);
        free_strings(c->devices[i].vals, (size_t)c->devices[i].nparams);
    }
    free(c->devices);
    for (i = 0; i < c->nbiases; i++) {
        free_strings(c->biases[i].keys, (size_t)c->biases[i].nparams);
        free_strings(c->biases[i].vals, (size_t)c->biases[i].nparams);
        free(c->biases[i].val_col);
    }
    free(c->biases);
}

void gs_circuit_free(gs_circuit *c)
{
    if (c == NULL)
        return;
    free(c->file);
    free(c->title);
    gs_symtab_free(c->syms);
    free_strings(c->node_name, (size_t)c->nnodes);
    free(c->node_line);
    free(c->node_col);
    free_strings(c->ref_alias, c->nref_alias);
    free_elements(c);
    free_lines(c);
    gs_expr_free(c->temperature);
    free(c);
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
        free(c->outputs[i].name);
    c->noutputs = 0;
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
