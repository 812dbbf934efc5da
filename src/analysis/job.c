/* job.c - one run over a circuit file: parse, derive, bind values.
 * See LICENSE.
 */
#include "analysis/job.h"
#include "circuit/device.h"
#include "base/mem.h"
#include "analysis/mna.h"
#include "circuit/lex.h"

#include <stdlib.h>
#include <string.h>

void gs_job_init(gs_job *j)
{
    memset(j, 0, sizeof *j);
}

static void free_origins(gs_job *j)
{
    int i;
    if (j->origin == NULL)
        return;
    for (i = 0; i < gs_symtab_count(j->c->syms); i++)
        gs_free(j->origin[i]);
    gs_free(j->origin);
    j->origin = NULL;
}

void gs_job_clear(gs_job *j)
{
    size_t i;
    for (i = 0; i < j->ntf; i++) {
        gs_tf_clear(&j->tf[i]);
        if (j->graph && j->graph[i]) {
            gs_mgraph_clear(j->graph[i]);
            gs_free(j->graph[i]);
        }
    }
    gs_free(j->graph);
    gs_free(j->tf);
    gs_free(j->out_index);
    gs_free(j->stats);
    free_origins(j);
    gs_free(j->vals);
    gs_free(j->set);
    gs_polyctx_free(j->ctx);
    gs_circuit_free(j->c);
    gs_job_init(j);
}

/* After a parse: the MNA's symbols and the polynomial context. */
static int finish_load(gs_job *j, int rc)
{
    if (rc != GS_OK)
        return rc;
    gs_mna_intern_symbols(j->c);
    j->ctx = gs_polyctx_new(j->c->syms, gs_symtab_count(j->c->syms));
    return GS_OK;
}

static int parse_probe_tokens(gs_probe *p, const gs_circuit *c,
                              const char *text, gs_lexer *lx, gs_diag *d);

/* A node or element name: a word, or a node number such as 0 or 12. */
static int is_name_token(const gs_token *t)
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

/* The tokens of "v(a)", "v(a, b)" or "i(X)", cut by the circuit
   language's lexer (names of any length, the same rules as in a file):
   *kind gets 'v' or 'i', a and b the names (b NULL for one), borrowed
   from lx.  0 when text is not of that form. */
static int probe_tokens(char *kind, const char **a, const char **b,
                        gs_lexer *lx)
{
    const gs_token *t;
    size_t n;
    gs_lex_run(lx);
    if (lx->nstmt != 1 || lx->stmt[0].bad)
        return 0;
    t = lx->tok + lx->stmt[0].first;
    n = lx->stmt[0].n;
    if ((n != 4 && n != 6) || t[0].kind != GS_TK_IDENT
        || (strcmp(t[0].text, "v") != 0 && strcmp(t[0].text, "i") != 0)
        || t[1].kind != GS_TK_PUNCT || t[1].text[0] != '('
        || t[n - 1].kind != GS_TK_PUNCT || t[n - 1].text[0] != ')'
        || !is_name_token(&t[2]))
        return 0;
    *kind = t[0].text[0];
    *a = t[2].text;
    *b = NULL;
    if (n == 6) {
        if (*kind != 'v' || t[3].kind != GS_TK_PUNCT || t[3].text[0] != ','
            || !is_name_token(&t[4]))
            return 0;
        *b = t[4].text;
    }
    return 1;
}

int gs_job_load(gs_job *j, const char *path, gs_diag *d)
{
    j->c = gs_circuit_new();
    return finish_load(j, gs_parse_file(j->c, path, d));
}

int gs_job_load_string(gs_job *j, const char *name, const char *text,
                       gs_diag *d)
{
    j->c = gs_circuit_new();
    return finish_load(j, gs_parse_string(j->c, name, text, d));
}

/* Parse "v(a)", "v(a, b)" or "i(X)" into p. */
static int parse_probe(gs_probe *p, const gs_circuit *c, const char *text,
                       gs_diag *d)
{
    gs_lexer lx;
    int rc;
    gs_lex_init(&lx, NULL, "--out", text, strlen(text));
    rc = parse_probe_tokens(p, c, text, &lx, d);
    gs_lex_clear(&lx);
    return rc;
}

static int parse_probe_tokens(gs_probe *p, const gs_circuit *c,
                              const char *text, gs_lexer *lx, gs_diag *d)
{
    char kind = 0;
    const char *a = NULL, *b = NULL;
    int na, nb;
    if (!probe_tokens(&kind, &a, &b, lx)) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                    "write v(NODE), v(NODE, NODE) or i(ELEMENT)",
                    "--out '%s' is not an output quantity", text);
        return GS_ESYNTAX;
    }
    if (kind == 'i') {
        p->kind = GS_PROBE_I;
        p->elem = gs_circuit_find_element(c, a);
        if (p->elem >= 0)
            return GS_OK;
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "--out: the circuit has no element '%s'", a);
        return GS_EINVAL;
    }
    na = gs_circuit_find_node(c, a);
    nb = b ? gs_circuit_find_node(c, b) : 0;
    if (na < 0 || nb < 0) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "--out: the circuit has no node '%s'", na < 0 ? a : b);
        return GS_EINVAL;
    }
    p->kind = GS_PROBE_V;
    p->a = na;
    p->b = nb;
    p->elem = -1;
    return GS_OK;
}

int gs_job_add_transfer(gs_job *j, const char *name, const char *out,
                        const char *src, gs_diag *d)
{
    gs_circuit *c = j->c;
    gs_output *o;
    gs_probe p;
    int in, rc = parse_probe(&p, c, out, d);
    if (rc != GS_OK)
        return rc;
    in = gs_circuit_find_element(c, src);
    if (in < 0 || (c->elems[in].kind != GS_VSOURCE
                   && c->elems[in].kind != GS_ISOURCE)) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                    "the input is a vsource or isource of the circuit",
                    "--in '%s' is not an independent source of the circuit",
                    src);
        return GS_EINVAL;
    }
    c->outputs = gs_reallocarray(c->outputs, c->noutputs + 1,
                                 sizeof *c->outputs);
    o = &c->outputs[c->noutputs++];
    memset(o, 0, sizeof *o);
    o->kind = GS_OUT_TRANSFER;
    o->name = gs_strdup(name);
    o->out = p;
    o->in = in;
    o->a = o->b = -1;
    return GS_OK;
}

/* The graph of minors of output k, for its numbers (mgraph.h). */
static int keep_graph(gs_job *j, size_t k, size_t max_bytes, gs_diag *d)
{
    gs_mna m;
    gs_mgraph *g = gs_malloc(sizeof *g);
    int rc, built = 0;
    memset(&m, 0, sizeof m);
    rc = gs_mna_build(&m, j->c, k, j->ctx, d);
    if (rc == GS_OK) {
        rc = gs_mgraph_build(g, &m, GS_MGRAPH_ORDER_GREEDY, max_bytes,
                             j->ctx);
        built = 1;
    }
    gs_mna_clear(&m);
    if (rc == GS_OK) {
        j->graph[j->ntf - 1] = g;
        j->stats[j->ntf - 1].graph_nodes = g->nnodes;
        j->stats[j->ntf - 1].graph_edges = g->nedges;
        return GS_OK;
    }
    if (rc == GS_EBUDGET)
        gs_mgraph_refused(d, max_bytes);
    if (built)
        gs_mgraph_clear(g);
    gs_free(g);
    return rc;
}

static int derive_one_raw(gs_job *j, size_t k, const gs_derive_opts *o,
                          gs_diag *d);

/* Errors of the analysis carry no place in the file: name the file and
   the output instead ("amp.gsc: Acm: error: ..."), so that a file with
   several outputs says which one failed. */
static void name_output(gs_diag *d, const char *file, const char *name)
{
    size_t i;
    for (i = 0; i < d->n; i++) {
        gs_diag_entry *e = &d->v[i];
        if (e->line != 0 || e->subject)
            continue;
        if (e->file == NULL && file)
            e->file = gs_strdup(file);
        e->subject = gs_strdup(name);
    }
}

/* Give back the last slot of j->tf, the one of a failed output: what
   derive_one_raw added is the result (its name, description and partial
   polynomials) and perhaps a graph; the arrays keep their room. */
static void drop_last(gs_job *j)
{
    size_t i = --j->ntf;
    gs_tf_clear(&j->tf[i]);
    if (j->graph[i]) {
        gs_mgraph_clear(j->graph[i]);
        gs_free(j->graph[i]);
        j->graph[i] = NULL;
    }
}

static int derive_one(gs_job *j, size_t k, const gs_derive_opts *o,
                      gs_diag *d)
{
    int rc;
    gs_diag here;
    gs_diag_init(&here);
    rc = derive_one_raw(j, k, o, &here);
    /* an output with no finite limit has no result to keep */
    if (rc == GS_ERANGE && j->stats[j->ntf - 1].no_limit)
        drop_last(j);
    name_output(&here, j->c->file, j->c->outputs[k].name);
    gs_diag_append(d, &here);
    gs_diag_clear(&here);
    return rc;
}

/* A transfer or an impedance: an output whose numbers the graph of
   minors of its MNA gives (a loop gain or a figure derives other
   circuits or outputs first and combines them). */
static int plain_output(const gs_circuit *c, size_t k)
{
    return c->outputs[k].kind == GS_OUT_TRANSFER
           || c->outputs[k].kind == GS_OUT_IMPEDANCE;
}

static int derive_one_raw(gs_job *j, size_t k, const gs_derive_opts *o,
                          gs_diag *d)
{
    gs_tf *tf;
    gs_diag here;
    gs_derive_opts given;
    gs_mgraph *g = NULL;
    int rc;
    j->graph = gs_reallocarray(j->graph, j->ntf + 1, sizeof *j->graph);
    j->graph[j->ntf] = NULL;
    j->tf = gs_reallocarray(j->tf, j->ntf + 1, sizeof *j->tf);
    j->out_index = gs_reallocarray(j->out_index, j->ntf + 1,
                                   sizeof *j->out_index);
    j->stats = gs_reallocarray(j->stats, j->ntf + 1, sizeof *j->stats);
    tf = &j->tf[j->ntf];
    gs_tf_init(tf, j->ctx, j->c->s_sym);
    j->out_index[j->ntf] = k;
    if (!j->graph_ok || o->nlimits)
        return gs_derive(tf, j->c, k, j->ctx, o, &j->stats[j->ntf++], d);
    /* an expansion over the budget: the numbers come from the graph,
       the one the derivation's size gate built when it refused */
    gs_diag_init(&here);
    given = *o;
    given.graph_out = &g;
    rc = gs_derive(tf, j->c, k, j->ctx, &given, &j->stats[j->ntf++], &here);
    if (rc == GS_EBUDGET && g != NULL) {
        gs_diag_clear(&here);
        gs_diag_init(&here);
        j->graph[j->ntf - 1] = g;
        g = NULL;
        rc = GS_OK;
    } else if (rc == GS_EBUDGET && !plain_output(j->c, k)) {
        /* the graph of minors is one circuit's, one output's: a figure
           or a return ratio is not read off it (its numbers were zero) */
        gs_diag_add(&here, GS_SEV_ERROR, NULL, 0, 0,
                    "raise --max-terms to expand it, or leave it out with "
                    "--only",
                    "the numbers of a %s need its exact expansion: the "
                    "graph of minors gives those of transfers and "
                    "impedances",
                    j->c->outputs[k].kind == GS_OUT_LOOP ? "loopgain"
                                                         : "figure");
    } else if (rc == GS_EBUDGET && !j->stats[j->ntf - 1].graph_refused) {
        gs_diag_clear(&here);
        gs_diag_init(&here);
        rc = keep_graph(j, k, o->elim.max_bytes, &here);
    }
    if (g != NULL) {            /* the trial expanded it after all */
        gs_mgraph_clear(g);
        gs_free(g);
    }
    gs_diag_append(d, &here);
    gs_diag_clear(&here);
    return rc;
}

int gs_job_derive(gs_job *j, const char *only, const gs_derive_opts *o,
                  gs_diag *d)
{
    size_t k, nfailed = 0;
    int rc = GS_OK;
    j->partial = 0;
    if (only) {
        int idx = gs_circuit_find_output(j->c, only);
        if (idx < 0) {
            gs_diag_add(d, GS_SEV_ERROR, j->c->file, 0, 0, NULL,
                        "no transfer or impedance named '%s'", only);
            return GS_EINVAL;
        }
        return derive_one(j, (size_t)idx, o, d);
    }
    if (j->c->noutputs == 0) {
        gs_diag_add(d, GS_SEV_ERROR, j->c->file, 0, 0,
                    "add a line such as 'transfer Av = v(out) / vin'",
                    "the file asks for no transfer or impedance");
        return GS_EINVAL;
    }
    /* An output whose limit is infinite is left out and the others still
       derived: its message says why it is missing.  Any other error ends
       the run, as the outputs after it would likely fail the same way. */
    for (k = 0; k < j->c->noutputs; k++) {
        size_t before = j->ntf;
        rc = derive_one(j, k, o, d);
        if (rc == GS_ERANGE && j->ntf == before)
            nfailed++;
        else if (rc != GS_OK)
            return rc;
    }
    j->partial = nfailed > 0 && j->ntf > 0;
    return nfailed ? GS_ERANGE : GS_OK;
}

/* Replace (or add) the value definition of sym by expr (owned after). */
static void override_value(gs_circuit *c, int sym, gs_expr *expr)
{
    size_t i;
    for (i = 0; i < c->nvalues; i++) {
        if (c->values[i].sym == sym) {
            gs_expr_free(c->values[i].expr);
            c->values[i].expr = expr;
            gs_free(c->values[i].origin);
            c->values[i].origin = gs_strdup("--set");
            return;
        }
    }
    c->values = gs_reallocarray(c->values, c->nvalues + 1,
                                sizeof *c->values);
    c->values[c->nvalues].sym = sym;
    c->values[c->nvalues].expr = expr;
    c->values[c->nvalues].origin = gs_strdup("--set");
    c->values[c->nvalues].line = 0;
    c->values[c->nvalues].col = 0;
    c->nvalues++;
}

static int apply_set(gs_job *j, const char *text, gs_diag *d)
{
    const char *eq = strchr(text, '=');
    char *name;
    gs_expr *e = NULL;
    int sym, rc;
    if (eq == NULL || eq == text) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                    "write it as --set NAME=VALUE, e.g. --set RD=10k",
                    "--set '%s' is not NAME=VALUE", text);
        return GS_ESYNTAX;
    }
    name = gs_strndup(text, (size_t)(eq - text));
    sym = gs_symtab_find(j->c->syms, name);
    if (sym < 0 || sym == j->c->s_sym) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "--set %s: the circuit has no symbol '%s'", name, name);
        gs_free(name);
        return GS_EINVAL;
    }
    gs_free(name);
    rc = gs_expr_parse_string(&e, j->c, eq + 1, "--set", d);
    if (rc != GS_OK)
        return rc;
    override_value(j->c, sym, e);
    return GS_OK;
}

unsigned char *gs_job_used_symbols(const gs_job *j)
{
    int nv = j->ctx->nvars, v;
    unsigned char *used = gs_calloc((size_t)nv, 1);
    unsigned char *tmp = gs_calloc((size_t)nv, 1);
    size_t i;
    for (i = 0; i < j->ntf; i++) {
        const gs_mgraph *g = j->graph ? j->graph[i] : NULL;
        size_t e;
        for (e = 0; g && e < g->nentries; e++) {
            gs_poly_used_vars(tmp, &g->entries[e], j->ctx);
            for (v = 0; v < nv; v++)
                if (tmp[v]) {
                    int b = gs_symtab_base(j->c->syms, v);
                    used[b >= 0 ? b : v] = 1;
                }
        }
        gs_poly_used_vars(tmp, &j->tf[i].num, j->ctx);
        for (v = 0; v < nv; v++)
            used[v] |= tmp[v];
        gs_poly_used_vars(tmp, &j->tf[i].den, j->ctx);
        for (v = 0; v < nv; v++)
            used[v] |= tmp[v];
    }
    gs_free(tmp);
    return used;
}

/* Every symbol of every derived output, other than s, must be bound. */
static int check_bound(gs_job *j, gs_diag *d)
{
    int nv = j->ctx->nvars, v;
    unsigned char *used = gs_job_used_symbols(j);
    size_t len = 0, nmissing = 0;
    char *list = gs_strdup("");
    for (v = 0; v < nv; v++) {
        const char *name = gs_symtab_name(j->c->syms, v);
        if (!used[v] || v == j->c->s_sym || j->set[v])
            continue;
        list = gs_realloc(list, len + strlen(name) + 3);
        len += (size_t)sprintf(list + len, "%s%s", nmissing ? ", " : "",
                               name);
        nmissing++;
    }
    if (nmissing)
        gs_diag_add(d, GS_SEV_ERROR, j->c->file, 0, 0,
                    "add 'value NAME = ...' lines to the file, or --set "
                    "NAME=VALUE",
                    "no value for %s %s", nmissing > 1 ? "symbols" : "symbol",
                    list);
    gs_free(list);
    gs_free(used);
    return nmissing ? GS_EUNBOUND : GS_OK;
}

/* The value line that binds sym, or NULL. */
static const gs_valuedef *value_line(const gs_circuit *c, int sym)
{
    size_t i;
    for (i = 0; i < c->nvalues; i++)
        if (c->values[i].sym == sym)
            return &c->values[i];
    return NULL;
}

/* Bias lines set device symbols; a --set override wins over them, and a
   value line for the same symbol is a conflict. */
static int apply_biases(gs_job *j, gs_diag *d)
{
    int n = gs_symtab_count(j->c->syms), v, rc;
    long double *bv = gs_calloc((size_t)n, sizeof *bv);
    unsigned char *bs = gs_calloc((size_t)n, 1);
    char **bo = gs_calloc((size_t)n, sizeof *bo);
    rc = gs_device_apply_biases(j->c, bv, bs, bo, d);
    /* a bias quantity out of its range is an error in the file: the
       status of bad input (2), as for extract */
    if (rc == GS_ERANGE)
        rc = GS_EINVAL;
    for (v = 0; v < n && rc == GS_OK; v++) {
        const gs_valuedef *vl = value_line(j->c, v);
        if (!bs[v])
            continue;
        if (vl && vl->origin && strcmp(vl->origin, "--set") == 0)
            continue;
        if (vl) {
            gs_diag_add(d, GS_SEV_ERROR, j->c->file, vl->line, vl->col,
                        "remove one of the two", "%s has a value line and "
                        "is also set by %s", gs_symtab_name(j->c->syms, v),
                        bo[v]);
            rc = GS_EINVAL;
            break;
        }
        j->vals[v] = bv[v];
        j->set[v] = 1;
        j->origin[v] = bo[v];
        bo[v] = NULL;
    }
    for (v = 0; v < n; v++)
        gs_free(bo[v]);
    gs_free(bo);
    gs_free(bs);
    gs_free(bv);
    return rc;
}

int gs_job_bind(gs_job *j, char *const *sets, size_t nsets, gs_diag *d)
{
    size_t i, n = (size_t)gs_symtab_count(j->c->syms);
    int rc = GS_OK;
    for (i = 0; i < nsets && rc == GS_OK; i++)
        rc = apply_set(j, sets[i], d);
    if (rc != GS_OK)
        return rc;
    free_origins(j);
    gs_free(j->vals);
    gs_free(j->set);
    j->vals = gs_calloc(n, sizeof *j->vals);
    j->set = gs_calloc(n, 1);
    j->origin = gs_calloc(n, sizeof *j->origin);
    for (i = 0; i < j->c->nvalues; i++)
        if (j->c->values[i].origin)
            j->origin[j->c->values[i].sym] =
                gs_strdup(j->c->values[i].origin);
    rc = gs_circuit_eval_values(j->c, j->vals, j->set, d);
    if (rc == GS_OK)
        rc = apply_biases(j, d);
    if (rc != GS_OK)
        return rc;
    return check_bound(j, d);
}

/* Coefficients of num or den of a graph-held output: both come out of
   one pass; a power of s common to both is divided out, as the exact
   reduction would. */
static long double *graph_coeffs(const gs_job *j, const gs_mgraph *g,
                                 int want_num, int *deg)
{
    long double *vals = gs_malloc(((size_t)j->ctx->nvars + 1)
                                  * sizeof *vals);
    long double *cn, *cd, *out;
    int dn, dd, low = 0, k;
    memcpy(vals, j->vals, (size_t)j->ctx->nvars * sizeof *vals);
    gs_mgraph_fill_recips(vals, j->c->syms, j->ctx->nvars);
    gs_mgraph_coeffs_ld(&cn, &dn, &cd, &dd, g, j->c->s_sym, vals);
    while (dn >= 0 && low <= dn && low <= dd && cn[low] == 0
           && cd[low] == 0)
        low++;
    out = want_num ? cn : cd;
    *deg = want_num ? dn : dd;
    if (low && *deg >= 0) {
        for (k = low; k <= *deg; k++)
            out[k - low] = out[k];
        *deg -= low;
    }
    gs_free(want_num ? cd : cn);
    gs_free(vals);
    return out;
}

long double *gs_job_coeffs(const gs_job *j, const gs_poly *p, int *deg)
{
    size_t i;
    for (i = 0; j->graph && i < j->ntf; i++)
        if (j->graph[i] && (p == &j->tf[i].num || p == &j->tf[i].den))
            return graph_coeffs(j, j->graph[i], p == &j->tf[i].num, deg);
    {
    long dg = gs_poly_degree(p, j->c->s_sym, j->ctx);
    long double *out = gs_calloc((size_t)(dg >= 0 ? dg + 1 : 1),
                                 sizeof *out);
    gs_poly cf;
    long k;
    gs_poly_init(&cf);
    for (k = 0; k <= dg; k++) {
        gs_poly_coeff_var(&cf, p, j->c->s_sym, (unsigned)k, j->ctx);
        out[k] = gs_poly_eval_ld(&cf, j->vals, j->ctx);
    }
    gs_poly_clear(&cf);
    *deg = (int)dg;
    return out;
    }
}

int gs_job_exit_status(int rc)
{
    switch (rc) {
    case GS_OK:
        return 0;
    case GS_ESINGULAR:
    case GS_EBUDGET:
    case GS_ERANGE:
        return 1;
    default:
        return 2;
    }
}

void gs_job_unit(gs_unit_info *u, const gs_job *j, size_t i)
{
    const gs_output *o = &j->c->outputs[j->out_index[i]];
    int out_v, in_v;
    if (o->kind == GS_OUT_IMPEDANCE) {
        *u = (gs_unit_info){"\xce\xa9", "dB\xce\xa9", "impedance", 0};
        return;
    }
    out_v = o->out.kind == GS_PROBE_V;
    in_v = j->c->elems[o->in].kind == GS_VSOURCE;
    if (out_v == in_v)
        *u = (gs_unit_info){out_v ? "V/V" : "A/A", "dB", "gain", 1};
    else if (out_v)
        *u = (gs_unit_info){"V/A", "dB\xce\xa9", "transimpedance", 0};
    else
        *u = (gs_unit_info){"A/V", "dBS", "transadmittance", 0};
}
