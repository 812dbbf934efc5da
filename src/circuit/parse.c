/* parse.c - the circuit language: statements, names, the whole file.
 * See LICENSE.
 *
 * A file is read in three passes over its statements (DESIGN.md, "The
 * circuit language"): first the `ground` lines, so that a rail merged
 * into the reference is merged wherever it is written; then every
 * statement in order, each error reported and the next statement parsed
 * all the same; then the names that may be used before their line
 * (controlling elements, sources, output nodes, bias devices) are looked
 * up.  A file without errors then goes through gs_circuit_check.
 */
#include "gainsmith.h"
#include "base/mem.h"
#include "circuit/parse.h"

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* One statement keyword: its parser and, for element lines, its shape. */
typedef struct stmt_kind {
    const char *word;
    int (*parse)(gs_parser *p, const struct stmt_kind *k);
    gs_elem_kind kind;
    int nnodes;
    const char *role[4];    /* what each node is called in messages */
    int ctrl;               /* a controlling element follows the nodes */
    int value;              /* 0: no value; 1: symbol default; 2: 1 */
    const char *form;       /* the usage line, for hints */
} stmt_kind;

void gs_parser_expected(gs_parser *p, const gs_token *t, const char *what,
                        const char *form)
{
    char *hint = form ? gs_asprintf("the form is: %s", form) : NULL;
    gs_cur_expected(&p->cur, t, what, hint);
    gs_free(hint);
}

/* "unexpected 'x' at the end of the statement", unless t is the end. */
static int expect_end(gs_parser *p, const char *form)
{
    const gs_token *t = gs_cur_peek(&p->cur);
    char *hint;
    if (t->kind == GS_TK_END)
        return GS_OK;
    hint = form ? gs_asprintf("the form is: %s", form) : NULL;
    gs_cur_error(&p->cur, t, hint, "unexpected '%s' at the end of the "
                 "statement", t->text);
    gs_free(hint);
    return GS_ESYNTAX;
}

void gs_parser_zero_value(gs_parser *p, gs_elem_kind kind, const char *name,
                          size_t off)
{
    const char *hint = kind == GS_RESISTOR
        ? "a zero resistance is a short: join its two nodes instead"
        : "an element of value zero does nothing: leave it out";
    gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, off, hint,
                  "the value of %s '%s' is zero", gs_elem_kind_name(kind),
                  name);
}

/* ---- names and nodes ---- */

int gs_parser_new_name(gs_parser *p, const gs_token *t)
{
    int id = gs_symtab_find(p->names, t->text), line, col;
    if (t->dotted) {
        gs_cur_error(&p->cur, t, NULL, "'%s' is not a valid name: dots and "
                     "primes are kept for device parts", t->text);
        return -1;
    }
    if (strcmp(t->text, "s") == 0) {
        gs_cur_error(&p->cur, t, NULL,
                     "'s' is reserved for the Laplace variable");
        return -1;
    }
    if (id >= 0) {
        gs_lex_position(&p->lx, p->name_off[id], &line, &col);
        gs_cur_error(&p->cur, t, NULL, "duplicate element name '%s' (first "
                     "defined at %d:%d)", t->text, line, col);
        return -1;
    }
    id = gs_symtab_intern(p->names, t->text);
    gs_parser_set_name(p, id, GS_NAME_BAD, -1, t->off);  /* until its line
                                                            is complete */
    return id;
}

void gs_parser_set_name(gs_parser *p, int id, int kind, int index,
                        size_t off)
{
    if ((size_t)id >= p->names_alloc) {
        size_t a = 2 * (size_t)id + 16;
        p->name_kind = gs_reallocarray(p->name_kind, a, sizeof *p->name_kind);
        p->name_index = gs_reallocarray(p->name_index, a,
                                        sizeof *p->name_index);
        p->name_off = gs_reallocarray(p->name_off, a, sizeof *p->name_off);
        p->names_alloc = a;
    }
    p->name_kind[id] = kind;
    p->name_index[id] = index;
    p->name_off[id] = off;
}

/* Is t a syntactically valid node name (an identifier or an integer)? */
static int gs_parser_is_node_token(const gs_token *t)
{
    size_t i;
    if (t->kind == GS_TK_IDENT)
        return 1;
    if (t->kind != GS_TK_NUMBER)
        return 0;
    for (i = 0; t->text[i]; i++)
        if (t->text[i] < '0' || t->text[i] > '9')
            return 0;
    return 1;
}

static int is_reference_name(const gs_circuit *c, const char *name)
{
    size_t i;
    if (strcmp(name, "gnd") == 0 || strcmp(name, "0") == 0)
        return 1;
    for (i = 0; i < c->nref_alias; i++)
        if (strcmp(c->ref_alias[i], name) == 0)
            return 1;
    return 0;
}

/* A new node named name, first written at off. */
static int add_node(gs_parser *p, const char *name, size_t off)
{
    gs_circuit *c = p->c;
    size_t n = (size_t)c->nnodes, a = p->nodes_alloc;
    int id = gs_symtab_intern(p->nodes, name);
    c->node_name = gs_grow(c->node_name, n, &a, sizeof *c->node_name);
    a = p->nodes_alloc;
    c->node_line = gs_grow(c->node_line, n, &a, sizeof *c->node_line);
    c->node_col = gs_grow(c->node_col, n, &p->nodes_alloc,
                          sizeof *c->node_col);
    c->node_name[n] = gs_strdup(name);
    gs_lex_position(&p->lx, off, &c->node_line[n], &c->node_col[n]);
    c->nnodes++;
    return id;
}

int gs_parser_check_node(gs_parser *p, const gs_token *t, const char *what)
{
    if (t->kind == GS_TK_IDENT && t->dotted) {
        gs_cur_error(&p->cur, t, NULL, "'%s' is not a valid name: dots and "
                     "primes are kept for device parts", t->text);
        return GS_ESYNTAX;
    }
    if (!gs_parser_is_node_token(t)) {
        gs_cur_expected(&p->cur, t, what, NULL);
        return GS_ESYNTAX;
    }
    return GS_OK;
}

int gs_parser_node(gs_parser *p, const gs_token *t, const char *what)
{
    int id;
    if (gs_parser_check_node(p, t, what) != GS_OK)
        return -1;
    if (is_reference_name(p->c, t->text))
        return 0;
    id = gs_symtab_find(p->nodes, t->text);
    return id >= 0 ? id : add_node(p, t->text, t->off);
}

gs_element *gs_parser_add_element(gs_parser *p, gs_elem_kind kind,
                                  const char *name, size_t off)
{
    gs_circuit *c = p->c;
    gs_element *e;
    int k;
    c->elems = gs_grow(c->elems, c->nelems, &p->elems_alloc,
                       sizeof *c->elems);
    e = &c->elems[c->nelems++];
    e->kind = kind;
    e->name = gs_strdup(name);
    gs_lex_position(&p->lx, off, &e->line, &e->col);
    for (k = 0; k < 4; k++)
        e->node[k] = -1;
    e->ctrl = -1;
    gs_monomial_init(&e->value);
    e->device = -1;
    return e;
}

void gs_parser_add_ref(gs_parser *p, gs_ref_kind kind, size_t index,
                       int field, const gs_token *t)
{
    gs_ref *r;
    p->refs = gs_grow(p->refs, p->nrefs, &p->refs_alloc, sizeof *p->refs);
    r = &p->refs[p->nrefs++];
    r->kind = kind;
    r->index = index;
    r->field = field;
    r->name = gs_strdup(t->text);
    r->off = t->off;
}

/* ---- element lines ---- */

/* The nodes, and the controlling element, of an element line. */
static int element_nodes(gs_parser *p, const stmt_kind *k, const char *name,
                         int *node, const gs_token **ctrl)
{
    int i;
    for (i = 0; i < k->nnodes; i++) {
        const gs_token *t = gs_cur_next(&p->cur);
        char *what = gs_asprintf("node %s of %s '%s'", k->role[i], k->word,
                                 name);
        if (t->kind == GS_TK_END)
            gs_parser_expected(p, t, what, k->form);
        else
            node[i] = gs_parser_node(p, t, what);
        gs_free(what);
        if (t->kind == GS_TK_END || node[i] < 0)
            return GS_ESYNTAX;
    }
    if (k->ctrl) {
        const gs_token *t = gs_cur_next(&p->cur);
        if (t->kind != GS_TK_IDENT) {
            char *what = gs_asprintf("the controlling element of %s '%s'",
                                     k->word, name);
            gs_parser_expected(p, t, what, k->form);
            gs_free(what);
            return GS_ESYNTAX;
        }
        *ctrl = t;
    }
    return GS_OK;
}

/* The value: "= MONOMIAL", or the default. */
static int element_value(gs_parser *p, const stmt_kind *k,
                         const gs_token *name, gs_monomial *v)
{
    const gs_token *first;
    int sym;
    if (k->value == 0 || !gs_cur_accept(&p->cur, '=')) {
        if (k->value != 1)
            return GS_OK;               /* sources, opamp: 1 */
        if ((sym = gs_parse_symbol(&p->cur, name, p->c)) < 0)
            return GS_ESYNTAX;
        gs_monomial_mul_sym(v, sym, 1);
        return GS_OK;
    }
    first = gs_cur_peek(&p->cur);
    if (gs_parse_monomial(v, &p->cur, p->c) != GS_OK)
        return GS_ESYNTAX;
    if (k->value == 1 && gs_rat_is_zero(&v->coeff)) {
        gs_parser_zero_value(p, k->kind, name->text, first->off);
        return GS_ESYNTAX;
    }
    return GS_OK;
}

static int parse_element(gs_parser *p, const stmt_kind *k)
{
    const gs_token *name = gs_cur_next(&p->cur), *ctrl = NULL;
    int node[4] = {-1, -1, -1, -1}, id, rc, i;
    gs_monomial v;
    gs_element *e;
    char *what;

    if (name->kind != GS_TK_IDENT) {
        what = gs_asprintf("%s name", k->word);
        gs_parser_expected(p, name, what, k->form);
        gs_free(what);
        return GS_ESYNTAX;
    }
    if ((id = gs_parser_new_name(p, name)) < 0)
        return GS_ESYNTAX;
    gs_monomial_init(&v);
    rc = element_nodes(p, k, name->text, node, &ctrl);
    if (rc == GS_OK)
        rc = element_value(p, k, name, &v);
    if (rc == GS_OK)
        rc = expect_end(p, k->form);
    if (rc == GS_OK) {
        e = gs_parser_add_element(p, k->kind, name->text, name->off);
        for (i = 0; i < 4; i++)
            e->node[i] = node[i];
        gs_monomial_set(&e->value, &v);
        p->name_kind[id] = GS_NAME_ELEM;
        p->name_index[id] = (int)p->c->nelems - 1;
        if (ctrl)
            gs_parser_add_ref(p, GS_REF_CTRL, p->c->nelems - 1, 0, ctrl);
    }
    gs_monomial_clear(&v);
    return rc;
}

/* ---- title, ground, value ---- */

/* The text of a string token without its quotes and escapes. */
static char *unquote(const char *s)
{
    size_t n = strlen(s), i, j = 0;
    char *out = gs_malloc(n);
    for (i = 1; i + 1 < n; i++) {
        if (s[i] == '\\' && (s[i + 1] == '"' || s[i + 1] == '\\')
            && i + 2 < n)
            i++;
        out[j++] = s[i];
    }
    out[j] = '\0';
    return out;
}

static int parse_title(gs_parser *p, const stmt_kind *k)
{
    const gs_token *kw = &p->cur.tok[0], *t = gs_cur_next(&p->cur);
    int line, col;
    if (t->kind != GS_TK_STRING) {
        gs_parser_expected(p, t, "the title in double quotes", k->form);
        return GS_ESYNTAX;
    }
    if (expect_end(p, k->form) != GS_OK)
        return GS_ESYNTAX;
    if (p->c->title != NULL) {
        gs_lex_position(&p->lx, p->title_off, &line, &col);
        gs_cur_error(&p->cur, kw, NULL, "second title (the first is at "
                     "%d:%d)", line, col);
        return GS_ESYNTAX;
    }
    p->c->title = unquote(t->text);
    p->title_off = kw->off;
    return GS_OK;
}

/* The names were merged in the first pass (collect_grounds); here only
   the syntax is checked. */
static int parse_ground(gs_parser *p, const stmt_kind *k)
{
    const gs_token *t = gs_cur_peek(&p->cur);
    if (t->kind == GS_TK_END) {
        gs_parser_expected(p, t, "a node to merge into the reference",
                           k->form);
        return GS_ESYNTAX;
    }
    for (; t->kind != GS_TK_END; t = gs_cur_peek(&p->cur)) {
        if (t->kind == GS_TK_IDENT && t->dotted) {
            gs_cur_error(&p->cur, t, NULL, "'%s' is not a valid name: dots "
                         "and primes are kept for device parts", t->text);
            return GS_ESYNTAX;
        }
        if (!gs_parser_is_node_token(t)) {
            gs_parser_expected(p, t, "a node name", k->form);
            return GS_ESYNTAX;
        }
        gs_cur_next(&p->cur);
    }
    return GS_OK;
}

static int parse_value(gs_parser *p, const stmt_kind *k)
{
    const gs_token *t = gs_cur_next(&p->cur), *eq;
    gs_expr *e = NULL;
    int sym, line, col, prev;
    if (t->kind != GS_TK_IDENT) {
        gs_parser_expected(p, t, "the symbol to bind", k->form);
        return GS_ESYNTAX;
    }
    if ((sym = gs_parse_symbol(&p->cur, t, p->c)) < 0)
        return GS_ESYNTAX;
    eq = gs_cur_next(&p->cur);
    if (eq->kind != GS_TK_PUNCT || eq->text[0] != '=') {
        gs_parser_expected(p, eq, "'='", k->form);
        return GS_ESYNTAX;
    }
    if (gs_parse_expr(&e, &p->cur, p->c) != GS_OK)
        return GS_ESYNTAX;
    if (expect_end(p, k->form) != GS_OK) {
        gs_expr_free(e);
        return GS_ESYNTAX;
    }
    if ((prev = gs_circuit_find_value(p->c, sym)) >= 0) {
        gs_cur_error(&p->cur, t, NULL, "duplicate value for '%s' (first at "
                     "%d:%d)", t->text, p->c->values[prev].line,
                     p->c->values[prev].col);
        gs_expr_free(e);
        return GS_ESYNTAX;
    }
    gs_lex_position(&p->lx, t->off, &line, &col);
    gs_circuit_add_value(p->c, sym, e, NULL, line, col);
    return GS_OK;
}

/* The temperature of the noise analysis, in kelvin: an expression as on
   a value line, at most one line per file. */
static int parse_temperature(gs_parser *p, const stmt_kind *k)
{
    const gs_token *kw = &p->cur.tok[0], *t = gs_cur_peek(&p->cur);
    gs_expr *e = NULL;
    int line, col;
    if (t->kind == GS_TK_END) {
        gs_parser_expected(p, t, "the temperature in kelvin", k->form);
        return GS_ESYNTAX;
    }
    if (gs_parse_expr(&e, &p->cur, p->c) != GS_OK)
        return GS_ESYNTAX;
    if (expect_end(p, k->form) != GS_OK) {
        gs_expr_free(e);
        return GS_ESYNTAX;
    }
    if (p->c->temperature != NULL) {
        gs_cur_error(&p->cur, kw, "give the temperature once", "second "
                     "temperature (the first is at %d:%d)",
                     p->c->temp_line, p->c->temp_col);
        gs_expr_free(e);
        return GS_ESYNTAX;
    }
    gs_lex_position(&p->lx, kw->off, &line, &col);
    p->c->temperature = e;
    p->c->temp_line = line;
    p->c->temp_col = col;
    return GS_OK;
}

/* ---- figures: expressions in other outputs ---- */

static gs_output *new_output(gs_parser *p, gs_output_kind kind,
                             const gs_token *name);
static const gs_token *output_head(gs_parser *p, const stmt_kind *k);

static int parse_figure(gs_parser *p, const stmt_kind *k)
{
    const gs_token *name = output_head(p, k);
    gs_expr *e = NULL;
    gs_output *o;
    if (name == NULL)
        return GS_ESYNTAX;
    if (gs_cur_peek(&p->cur)->kind == GS_TK_END) {
        gs_parser_expected(p, gs_cur_peek(&p->cur), "an expression in "
                           "outputs", k->form);
        return GS_ESYNTAX;
    }
    if (gs_parse_expr(&e, &p->cur, p->c) != GS_OK)
        return GS_ESYNTAX;
    if (expect_end(p, k->form) != GS_OK) {
        gs_expr_free(e);
        return GS_ESYNTAX;
    }
    o = new_output(p, GS_OUT_FIGURE, name);
    o->figure = e;
    return GS_OK;
}

/* Once the file is read: every name in a figure is an output, powers are
   whole numbers, no functions, and no figure depends on itself. */
static void check_figure_expr(gs_parser *p, const gs_output *o,
                              const gs_expr *e, int depth)
{
    gs_circuit *c = p->c;
    const char *nm;
    int k;
    if (e == NULL)
        return;
    switch (e->kind) {
    case GS_EX_SYM:
        nm = gs_symtab_name(c->syms, e->sym);
        k = gs_circuit_find_output(c, nm);
        if (k < 0) {
            const char **names = gs_malloc((c->noutputs + 1)
                                           * sizeof *names);
            size_t i;
            char *hint;
            for (i = 0; i < c->noutputs; i++)
                names[i] = c->outputs[i].name;
            hint = gs_suggest_hint(nm, names, c->noutputs);
            gs_diag_add(p->d, GS_SEV_ERROR, c->file, e->line, e->col,
                        hint ? hint : "a figure combines transfer, "
                        "impedance and figure lines of the file",
                        "figure '%s': '%s' is not an output", o->name, nm);
            gs_free(hint);
            gs_free(names);
        } else if (c->outputs[k].kind == GS_OUT_FIGURE) {
            if (&c->outputs[k] == o || depth > (int)c->noutputs)
                gs_diag_add(p->d, GS_SEV_ERROR, c->file, e->line, e->col,
                            "a figure may use other figures, but not "
                            "itself", "figure '%s' depends on itself",
                            o->name);
            else
                check_figure_expr(p, o, c->outputs[k].figure, depth + 1);
        }
        return;
    case GS_EX_CALL:
        gs_diag_add(p->d, GS_SEV_ERROR, c->file, e->line, e->col,
                    "a figure is a rational function: + - * / and whole "
                    "powers only", "figure '%s': '%s' is not allowed in "
                    "a figure", o->name, e->func);
        return;
    case GS_EX_POW:
        if (e->rhs->kind != GS_EX_NUM
            && !(e->rhs->kind == GS_EX_NEG && e->rhs->lhs->kind
                 == GS_EX_NUM)) {
            gs_diag_add(p->d, GS_SEV_ERROR, c->file, e->rhs->line,
                        e->rhs->col, "write the power as a whole number",
                        "figure '%s': the power must be a number",
                        o->name);
            return;
        }
        break;
    default:
        break;
    }
    if (depth == 0 || e->kind != GS_EX_SYM) {
        check_figure_expr(p, o, e->lhs, depth);
        check_figure_expr(p, o, e->rhs, depth);
    }
}

static void check_figures(gs_parser *p)
{
    size_t i;
    for (i = 0; i < p->c->noutputs; i++)
        if (p->c->outputs[i].kind == GS_OUT_FIGURE)
            check_figure_expr(p, &p->c->outputs[i],
                              p->c->outputs[i].figure, 0);
}

/* ---- loop gain by the return ratio ---- */

/* loopgain NAME = SOURCE [for TRANSFER]: the return ratio of a
   controlled source, and with `for` the asymptotic gain and the direct
   feed-through of that transfer. */
static int parse_loopgain(gs_parser *p, const stmt_kind *k)
{
    const gs_token *name = output_head(p, k), *t, *of = NULL, *w;
    gs_output *o;
    if (name == NULL)
        return GS_ESYNTAX;
    t = gs_cur_next(&p->cur);
    if (t->kind != GS_TK_IDENT) {
        gs_parser_expected(p, t, "a controlled source (vccs, vcvs, cccs, "
                           "ccvs, or a device's gm)", k->form);
        return GS_ESYNTAX;
    }
    w = gs_cur_peek(&p->cur);
    if (w->kind == GS_TK_IDENT && strcmp(w->text, "for") == 0) {
        gs_cur_next(&p->cur);
        of = gs_cur_next(&p->cur);
        if (of->kind != GS_TK_IDENT) {
            gs_parser_expected(p, of, "the transfer to decompose", k->form);
            return GS_ESYNTAX;
        }
    }
    if (expect_end(p, k->form) != GS_OK)
        return GS_ESYNTAX;
    o = new_output(p, GS_OUT_LOOP, name);
    o->loop_of = -1;
    gs_parser_add_ref(p, GS_REF_SOURCE, p->c->noutputs - 1, 0, t);
    if (of != NULL) {
        /* the asymptotic-gain parts: NAME_inf and NAME_direct */
        static const char *suffix[2] = {"inf", "direct"};
        int part;
        size_t src = p->c->noutputs - 1;
        for (part = 1; part <= 2; part++) {
            char *nm = gs_asprintf("%s_%s", name->text, suffix[part - 1]);
            gs_token pt = *name;
            pt.text = nm;
            if (gs_circuit_find_output(p->c, nm) >= 0)
                gs_cur_error(&p->cur, name, NULL, "duplicate output '%s'",
                             nm);
            o = new_output(p, GS_OUT_LOOP, &pt);
            o->loop_part = part;
            o->loop_of = -1;
            gs_parser_add_ref(p, GS_REF_SOURCE, p->c->noutputs - 1, 0, t);
            gs_free(nm);
        }
        for (part = 0; part < 3; part++) {
            gs_output *q = &p->c->outputs[src + (size_t)part];
            q->loop_for = gs_strdup(of->text);
            gs_lex_position(&p->lx, of->off, &q->for_line, &q->for_col);
        }
    }
    return GS_OK;
}

static void check_loops(gs_parser *p)
{
    gs_circuit *c = p->c;
    size_t i;
    for (i = 0; i < c->noutputs; i++) {
        const gs_output *o = &c->outputs[i];
        const gs_element *e;
        if (o->kind != GS_OUT_LOOP || o->in < 0)
            continue;
        if (o->loop_for != NULL) {
            int k = gs_circuit_find_output(c, o->loop_for);
            if (k < 0 || c->outputs[k].kind != GS_OUT_TRANSFER) {
                if (o->loop_part == 0)
                    gs_diag_add(p->d, GS_SEV_ERROR, c->file, o->for_line,
                                o->for_col, "name a transfer line of the "
                                "file", "loopgain '%s': '%s' is not a "
                                "transfer", o->name, o->loop_for);
            } else {
                c->outputs[i].loop_of = k;
            }
        }
        if (o->loop_part != 0)
            continue;
        e = &c->elems[o->in];
        if (e->kind != GS_VCCS && e->kind != GS_VCVS && e->kind != GS_CCCS
            && e->kind != GS_CCVS)
            gs_diag_add(p->d, GS_SEV_ERROR, c->file, o->line, o->col,
                        "the return ratio is that of a vccs, vcvs, cccs or "
                        "ccvs, or of a device's gm (M1.gm)",
                        "loopgain '%s': %s '%s' is not a controlled source",
                        o->name, gs_elem_kind_name(e->kind), e->name);
    }
}

/* ---- balanced drive and sensing of a node pair ---- */

/* A part NAME.SUFFIX of a balanced or sense line: an element known by
   that name to the other lines. */
static gs_element *pair_part(gs_parser *p, gs_elem_kind kind,
                             const gs_token *name, const char *suffix,
                             int n0, int n1, int c0, int c1, int half)
{
    char *nm = gs_asprintf("%s.%s", name->text, suffix);
    gs_element *e = gs_parser_add_element(p, kind, nm, name->off);
    e->node[0] = n0;
    e->node[1] = n1;
    e->node[2] = c0;
    e->node[3] = c1;
    if (half)
        gs_rat_set_si(&e->value.coeff, 1, 2);
    gs_parser_set_name(p, gs_symtab_intern(p->names, nm), GS_NAME_ELEM,
                       (int)p->c->nelems - 1, name->off);
    gs_free(nm);
    return e;
}

static int pair_node(gs_parser *p, const gs_token *name, const char *suffix)
{
    char *nm = gs_asprintf("%s.%s", name->text, suffix);
    gs_token t;
    int id;
    t.kind = GS_TK_IDENT;
    t.dotted = 0;
    t.off = name->off;
    t.text = nm;
    id = gs_parser_node(p, &t, "node");
    gs_free(nm);
    return id;
}

/* NAME P N: the name (reserved like an element's) and the two nodes. */
static int pair_head(gs_parser *p, const stmt_kind *k, const gs_token **name,
                     int *a, int *b)
{
    const gs_token *t = gs_cur_next(&p->cur), *u;
    int id;
    if (t->kind != GS_TK_IDENT) {
        gs_parser_expected(p, t, "a name", k->form);
        return GS_ESYNTAX;
    }
    *name = t;
    u = gs_cur_next(&p->cur);
    if (u->kind == GS_TK_END) {
        gs_parser_expected(p, u, "the first node of the pair", k->form);
        return GS_ESYNTAX;
    }
    if ((*a = gs_parser_node(p, u, "the first node of the pair")) < 0)
        return GS_ESYNTAX;
    u = gs_cur_next(&p->cur);
    if (u->kind == GS_TK_END) {
        gs_parser_expected(p, u, "the second node of the pair", k->form);
        return GS_ESYNTAX;
    }
    if ((*b = gs_parser_node(p, u, "the second node of the pair")) < 0)
        return GS_ESYNTAX;
    if (expect_end(p, k->form) != GS_OK)
        return GS_ESYNTAX;
    if (*a == *b) {
        gs_cur_error(&p->cur, u, "name two different nodes", "the pair of "
                     "%s '%s' is one node", k->word, t->text);
        return GS_ESYNTAX;
    }
    if ((id = gs_parser_new_name(p, t)) < 0)
        return GS_ESYNTAX;
    gs_parser_set_name(p, id, GS_NAME_BAD, -1, t->off);
    return GS_OK;
}

/* balanced NAME P N: v(P) = vc + vd/2, v(N) = vc - vd/2, with the
   independent sources NAME.dm (vd, to node NAME.vd) and NAME.cm (vc, to
   node NAME.vc) and the halves as vcvs NAME.p and NAME.n of gain 1/2. */
static int parse_balanced(gs_parser *p, const stmt_kind *k)
{
    const gs_token *name;
    int a, b, vd, vc;
    if (pair_head(p, k, &name, &a, &b) != GS_OK)
        return GS_ESYNTAX;
    vd = pair_node(p, name, "vd");
    vc = pair_node(p, name, "vc");
    pair_part(p, GS_VSOURCE, name, "dm", vd, 0, -1, -1, 0);
    pair_part(p, GS_VSOURCE, name, "cm", vc, 0, -1, -1, 0);
    pair_part(p, GS_VCVS, name, "p", a, vc, vd, 0, 1);
    pair_part(p, GS_VCVS, name, "n", vc, b, vd, 0, 1);
    return GS_OK;
}

/* sense NAME P N: node NAME.dm carries v(P) - v(N) and node NAME.cm
   (v(P) + v(N))/2, as outputs of vcvs that draw no current from P, N. */
static int parse_sense(gs_parser *p, const stmt_kind *k)
{
    const gs_token *name;
    int a, b, dm, cm, h;
    if (pair_head(p, k, &name, &a, &b) != GS_OK)
        return GS_ESYNTAX;
    dm = pair_node(p, name, "dm");
    cm = pair_node(p, name, "cm");
    h = pair_node(p, name, "half");
    pair_part(p, GS_VCVS, name, "dm", dm, 0, a, b, 0);
    pair_part(p, GS_VCVS, name, "cp", cm, h, a, 0, 1);
    pair_part(p, GS_VCVS, name, "cn", h, 0, b, 0, 1);
    return GS_OK;
}

/* ---- transfer and impedance ---- */

static gs_output *new_output(gs_parser *p, gs_output_kind kind,
                             const gs_token *name)
{
    gs_circuit *c = p->c;
    gs_output *o;
    c->outputs = gs_grow(c->outputs, c->noutputs, &p->outputs_alloc,
                         sizeof *c->outputs);
    o = &c->outputs[c->noutputs++];
    memset(o, 0, sizeof *o);
    o->kind = kind;
    o->name = gs_strdup(name->text);
    gs_lex_position(&p->lx, name->off, &o->line, &o->col);
    o->out.kind = GS_PROBE_V;
    o->out.a = o->out.b = 0;
    o->out.elem = -1;
    o->in = -1;
    return o;
}

/* "NAME =" of a transfer or impedance line; the name token or NULL. */
static const gs_token *output_head(gs_parser *p, const stmt_kind *k)
{
    const gs_token *t = gs_cur_next(&p->cur), *eq;
    int prev, line, col;
    if (t->kind != GS_TK_IDENT || t->dotted) {
        char *what = gs_asprintf("%s name", k->word);
        gs_parser_expected(p, t, what, k->form);
        gs_free(what);
        return NULL;
    }
    if ((prev = gs_circuit_find_output(p->c, t->text)) >= 0) {
        line = p->c->outputs[prev].line;
        col = p->c->outputs[prev].col;
        gs_cur_error(&p->cur, t, NULL, "duplicate output '%s' (first "
                     "defined at %d:%d)", t->text, line, col);
        return NULL;
    }
    eq = gs_cur_next(&p->cur);
    if (eq->kind != GS_TK_PUNCT || eq->text[0] != '=') {
        gs_parser_expected(p, eq, "'='", k->form);
        return NULL;
    }
    return t;
}

/* A node written where it must already exist (resolved at the end). */
static const gs_token *node_ref(gs_parser *p, const char *what,
                                const char *form)
{
    const gs_token *t = gs_cur_next(&p->cur);
    if (gs_parser_is_node_token(t))
        return t;
    gs_parser_expected(p, t, what, form);
    return NULL;
}

/* '(' ... ')' of v(a [, b]) or i(element): the tokens it names. */
static int probe_args(gs_parser *p, const gs_token *fn, const gs_token **a,
                      const gs_token **b, const char *form)
{
    const gs_token *open = gs_cur_next(&p->cur);
    int line, col;
    *a = *b = NULL;
    if (fn->text[0] == 'i') {
        *a = gs_cur_next(&p->cur);
        if ((*a)->kind != GS_TK_IDENT) {
            gs_parser_expected(p, *a, "an element name", form);
            return GS_ESYNTAX;
        }
    } else {
        if ((*a = node_ref(p, "a node", form)) == NULL)
            return GS_ESYNTAX;
        if (gs_cur_accept(&p->cur, ',')
            && (*b = node_ref(p, "a node", form)) == NULL)
            return GS_ESYNTAX;
    }
    if (gs_cur_accept(&p->cur, ')'))
        return GS_OK;
    gs_lex_position(&p->lx, open->off, &line, &col);
    gs_cur_error(&p->cur, gs_cur_peek(&p->cur), NULL, "')' expected to "
                 "close '(' at %d:%d", line, col);
    return GS_ESYNTAX;
}

static int parse_transfer(gs_parser *p, const stmt_kind *k)
{
    const gs_token *name = output_head(p, k), *fn, *a, *b, *src;
    gs_output *o;
    size_t idx;
    if (name == NULL)
        return GS_ESYNTAX;
    fn = gs_cur_peek(&p->cur);
    if (fn->kind != GS_TK_IDENT || (strcmp(fn->text, "v") != 0
                                    && strcmp(fn->text, "i") != 0)
        || fn[1].kind != GS_TK_PUNCT || fn[1].text[0] != '(') {
        gs_parser_expected(p, fn, "an output v(node), v(a, b) or "
                           "i(element)", k->form);
        return GS_ESYNTAX;
    }
    gs_cur_next(&p->cur);
    if (probe_args(p, fn, &a, &b, k->form) != GS_OK)
        return GS_ESYNTAX;
    if (!gs_cur_accept(&p->cur, '/')) {
        gs_parser_expected(p, gs_cur_peek(&p->cur), "'/' and the input "
                           "source", k->form);
        return GS_ESYNTAX;
    }
    src = gs_cur_next(&p->cur);
    if (src->kind != GS_TK_IDENT) {
        gs_parser_expected(p, src, "the input source", k->form);
        return GS_ESYNTAX;
    }
    if (expect_end(p, k->form) != GS_OK)
        return GS_ESYNTAX;
    o = new_output(p, GS_OUT_TRANSFER, name);
    idx = p->c->noutputs - 1;
    o->out.kind = fn->text[0] == 'i' ? GS_PROBE_I : GS_PROBE_V;
    gs_parser_add_ref(p, fn->text[0] == 'i' ? GS_REF_PROBE : GS_REF_NODE,
                      idx, GS_FIELD_OUT_A, a);
    if (b)
        gs_parser_add_ref(p, GS_REF_NODE, idx, GS_FIELD_OUT_B, b);
    gs_parser_add_ref(p, GS_REF_SOURCE, idx, 0, src);
    return GS_OK;
}

static int parse_impedance(gs_parser *p, const stmt_kind *k)
{
    const gs_token *name = output_head(p, k), *a, *b = NULL;
    size_t idx;
    if (name == NULL || (a = node_ref(p, "a node", k->form)) == NULL)
        return GS_ESYNTAX;
    if (gs_cur_accept(&p->cur, ',')
        && (b = node_ref(p, "a node", k->form)) == NULL)
        return GS_ESYNTAX;
    if (expect_end(p, k->form) != GS_OK)
        return GS_ESYNTAX;
    new_output(p, GS_OUT_IMPEDANCE, name);
    idx = p->c->noutputs - 1;
    gs_parser_add_ref(p, GS_REF_NODE, idx, GS_FIELD_A, a);
    if (b)
        gs_parser_add_ref(p, GS_REF_NODE, idx, GS_FIELD_B, b);
    return GS_OK;
}

static int parse_mosfet(gs_parser *p, const stmt_kind *k)
{
    (void)k;
    return gs_parse_device(p, 0);
}

static int parse_bjt(gs_parser *p, const stmt_kind *k)
{
    (void)k;
    return gs_parse_device(p, 1);
}

static int parse_bias(gs_parser *p, const stmt_kind *k)
{
    (void)k;
    return gs_parse_bias(p);
}

#define TWO {"n+", "n-", NULL, NULL}
#define FOUR {"n+", "n-", "c+", "c-"}
#define VFOUR {"o+", "o-", "c+", "c-"}
#define NONE {NULL, NULL, NULL, NULL}

static const stmt_kind kinds[] = {
    {"title", parse_title, GS_RESISTOR, 0, NONE, 0, 0, "title \"TEXT\""},
    {"ground", parse_ground, GS_RESISTOR, 0, NONE, 0, 0, "ground NODE..."},
    {"resistor", parse_element, GS_RESISTOR, 2, TWO, 0, 1,
     "resistor NAME n+ n- [= VALUE]"},
    {"conductance", parse_element, GS_CONDUCTANCE, 2, TWO, 0, 1,
     "conductance NAME n+ n- [= VALUE]"},
    {"capacitor", parse_element, GS_CAPACITOR, 2, TWO, 0, 1,
     "capacitor NAME n+ n- [= VALUE]"},
    {"inductor", parse_element, GS_INDUCTOR, 2, TWO, 0, 1,
     "inductor NAME n+ n- [= VALUE]"},
    {"vsource", parse_element, GS_VSOURCE, 2, TWO, 0, 2,
     "vsource NAME n+ n- [= AMPLITUDE]"},
    {"isource", parse_element, GS_ISOURCE, 2, TWO, 0, 2,
     "isource NAME n+ n- [= AMPLITUDE]"},
    {"vccs", parse_element, GS_VCCS, 4, FOUR, 0, 1,
     "vccs NAME n+ n- c+ c- [= GAIN]"},
    {"vcvs", parse_element, GS_VCVS, 4, VFOUR, 0, 1,
     "vcvs NAME o+ o- c+ c- [= GAIN]"},
    {"cccs", parse_element, GS_CCCS, 2, TWO, 1, 1,
     "cccs NAME n+ n- CONTROL [= GAIN]"},
    {"ccvs", parse_element, GS_CCVS, 2, {"o+", "o-", NULL, NULL}, 1, 1,
     "ccvs NAME o+ o- CONTROL [= GAIN]"},
    {"opamp", parse_element, GS_OPAMP, 3, {"out", "in+", "in-", NULL}, 0, 0,
     "opamp NAME out in+ in-"},
    {"mosfet", parse_mosfet, GS_VCCS, 0, NONE, 0, 0,
     "mosfet NAME d g s [b] [KEY=VALUE...]"},
    {"bjt", parse_bjt, GS_VCCS, 0, NONE, 0, 0,
     "bjt NAME c b e [KEY=VALUE...]"},
    {"bias", parse_bias, GS_VCCS, 0, NONE, 0, 0,
     "bias DEVICE KEY=VALUE..."},
    {"value", parse_value, GS_VCCS, 0, NONE, 0, 0,
     "value SYMBOL = EXPRESSION"},
    {"transfer", parse_transfer, GS_VCCS, 0, NONE, 0, 0,
     "transfer NAME = v(NODE) / SOURCE"},
    {"impedance", parse_impedance, GS_VCCS, 0, NONE, 0, 0,
     "impedance NAME = NODE [, NODE]"},
    {"temperature", parse_temperature, GS_VCCS, 0, NONE, 0, 0,
     "temperature KELVIN"},
    {"loopgain", parse_loopgain, GS_VCCS, 0, NONE, 0, 0,
     "loopgain NAME = CONTROLLED-SOURCE"},
    {"figure", parse_figure, GS_VCCS, 0, NONE, 0, 0,
     "figure NAME = EXPRESSION IN OUTPUTS"},
    {"balanced", parse_balanced, GS_VCCS, 0, NONE, 0, 0,
     "balanced NAME NODE+ NODE-"},
    {"sense", parse_sense, GS_VCCS, 0, NONE, 0, 0,
     "sense NAME NODE+ NODE-"},
};
#define NKINDS (sizeof kinds / sizeof kinds[0])

static int parse_statement(gs_parser *p)
{
    const gs_token *kw = gs_cur_next(&p->cur);
    const char *words[NKINDS];
    char *hint;
    size_t i;
    if (kw->kind == GS_TK_IDENT) {
        for (i = 0; i < NKINDS; i++)
            if (strcmp(kw->text, kinds[i].word) == 0)
                return kinds[i].parse(p, &kinds[i]);
    }
    if (kw->kind != GS_TK_IDENT) {
        gs_cur_expected(&p->cur, kw, "a statement keyword", NULL);
        return GS_ESYNTAX;
    }
    for (i = 0; i < NKINDS; i++)
        words[i] = kinds[i].word;
    hint = gs_suggest_hint(kw->text, words, NKINDS);
    gs_cur_error(&p->cur, kw, hint, "unknown statement '%s'", kw->text);
    gs_free(hint);
    return GS_ESYNTAX;
}

/* ---- the passes ---- */

/* First pass: every name on a ground line joins the reference. */
static void collect_grounds(gs_parser *p)
{
    gs_circuit *c = p->c;
    size_t i, j;
    for (i = 0; i < p->lx.nstmt; i++) {
        const gs_stmt *st = &p->lx.stmt[i];
        const gs_token *t = p->lx.tok + st->first;
        if (st->bad || st->n == 0 || t->kind != GS_TK_IDENT
            || strcmp(t->text, "ground") != 0)
            continue;
        for (j = 1; j < st->n; j++) {
            if (!gs_parser_is_node_token(&t[j]) || t[j].dotted
                || is_reference_name(c, t[j].text))
                continue;
            c->ref_alias = gs_reallocarray(c->ref_alias, c->nref_alias + 1,
                                           sizeof *c->ref_alias);
            c->ref_alias[c->nref_alias++] = gs_strdup(t[j].text);
        }
    }
}

static void parser_init(gs_parser *p, gs_circuit *c, gs_diag *d)
{
    memset(p, 0, sizeof *p);
    p->c = c;
    p->d = d;
    p->nodes = gs_symtab_new();
    gs_symtab_intern(p->nodes, "gnd");         /* node 0 */
    p->names = gs_symtab_new();
    p->nodes_alloc = (size_t)c->nnodes;
    p->elems_alloc = c->nelems;
    p->outputs_alloc = c->noutputs;
    p->devices_alloc = c->ndevices;
    p->biases_alloc = c->nbiases;
}

static void parser_clear(gs_parser *p)
{
    size_t i;
    for (i = 0; i < p->nrefs; i++)
        gs_free(p->refs[i].name);
    gs_free(p->refs);
    for (i = 0; i < p->c->ndevices; i++)
        gs_free(p->dev_body[i]);
    gs_free(p->dev_body);
    gs_free(p->bias_noise);
    gs_free(p->name_kind);
    gs_free(p->name_index);
    gs_free(p->name_off);
    gs_symtab_free(p->names);
    gs_symtab_free(p->nodes);
    gs_lex_clear(&p->lx);
}

int gs_parse_string(gs_circuit *c, const char *name, const char *text,
                    gs_diag *d)
{
    return gs_parse_text(c, name, text, strlen(text), d);
}

int gs_parse_text(gs_circuit *c, const char *name, const char *text,
                  size_t len, gs_diag *d)
{
    gs_parser p;
    size_t before = d->nerrors, i;
    gs_free(c->file);
    c->file = gs_strdup(name ? name : "<input>");
    parser_init(&p, c, d);
    gs_lex_init(&p.lx, c->file, NULL, text, len);
    gs_lex_run(&p.lx);
    collect_grounds(&p);
    for (i = 0; i < p.lx.nstmt; i++) {
        if (p.lx.stmt[i].bad) {
            gs_lex_report_bad(&p.lx, d, &p.lx.stmt[i]);
            continue;
        }
        gs_cursor_init(&p.cur, &p.lx, d, &p.lx.stmt[i]);
        parse_statement(&p);
    }
    gs_parser_resolve(&p);
    gs_parser_bias_noise(&p);
    check_figures(&p);
    check_loops(&p);
    gs_parser_finish_devices(&p);
    parser_clear(&p);
    if (d->nerrors != before)
        return GS_ESYNTAX;
    return gs_circuit_check(c, d);
}

/* The whole of f, NUL bytes included. */
static char *read_all(FILE *f, size_t *len)
{
    size_t alloc = 4096, n = 0, got;
    char *buf = gs_malloc(alloc);
    while ((got = fread(buf + n, 1, alloc - n - 1, f)) > 0) {
        n += got;
        if (alloc - n - 1 == 0) {
            alloc *= 2;
            buf = gs_realloc(buf, alloc);
        }
    }
    buf[n] = '\0';
    *len = n;
    return buf;
}

static void close_file(void *f)
{
    fclose(f);
}

int gs_parse_file(gs_circuit *c, const char *path, gs_diag *d)
{
    int is_stdin = strcmp(path, "-") == 0, rc, err;
    FILE *f = is_stdin ? stdin : fopen(path, "rb");
    size_t len;
    char *text;
    gs_mem_cleanup *close_f = NULL;
    if (f == NULL) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL, "cannot read '%s': %s",
                    path, strerror(errno));
        return GS_EIO;
    }
    if (!is_stdin)     /* read_all allocates; a failure must close f */
        close_f = gs_mem_defer(close_file, f);
    text = read_all(f, &len);
    err = ferror(f) ? errno : 0;
    if (!is_stdin) {
        gs_mem_undefer(close_f);
        fclose(f);
    }
    if (err != 0) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL, "cannot read '%s': %s",
                    is_stdin ? "<stdin>" : path, strerror(err));
        gs_free(text);
        return GS_EIO;
    }
    rc = gs_parse_text(c, is_stdin ? "<stdin>" : path, text, len, d);
    gs_free(text);
    return rc;
}
