/* derive.c - circuit output -> transfer function in lowest terms.
 * See LICENSE.
 */
#include "analysis/derive.h"
#include "base/mem.h"
#include "analysis/mna.h"
#include "analysis/mgraph.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gs_derive_opts_default(gs_derive_opts *o)
{
    o->method = GS_DET_AUTO;
    gs_elim_opts_default(&o->elim);
    o->elim.max_terms = GS_DEFAULT_MAX_TERMS;
    o->elim.max_bytes = GS_DEFAULT_MAX_BYTES;
    o->terms_given = 0;
    o->graph_out = NULL;
    o->limits = NULL;
    o->nlimits = 0;
    o->no_gcd = 0;
}

/* For each reciprocal symbol r = 1/B: e(r) = its largest degree in a or b.
   Multiplying both by prod B^e(r) turns r^k into B^(e-k): the smallest
   monomial that clears every reciprocal, so results read in R. */
static void clear_reciprocals(gs_poly *a, gs_poly *b, const gs_symtab *st,
                              const gs_polyctx *ctx)
{
    int nv = ctx->nvars, v, any = 0;
    unsigned *top = gs_calloc((size_t)nv + 1, sizeof *top);
    unsigned *da = gs_calloc((size_t)nv + 1, sizeof *da);
    unsigned *db = gs_calloc((size_t)nv + 1, sizeof *db);
    int *to = gs_calloc((size_t)nv + 1, sizeof *to);

    gs_poly_degrees(da, a, ctx);
    gs_poly_degrees(db, b, ctx);
    for (v = 0; v < nv; v++) {
        if (!gs_symtab_is_recip(st, v))
            continue;
        top[v] = da[v] > db[v] ? da[v] : db[v];
        to[v] = gs_symtab_base(st, v);
        any |= top[v] > 0;
    }
    if (any) {          /* the degrees save the flips a pass each */
        gs_poly_flip_vars(a, a, to, top, da, ctx);
        gs_poly_flip_vars(b, b, to, top, db, ctx);
    }
    gs_free(top);
    gs_free(da);
    gs_free(db);
    gs_free(to);
}

static void remove_monomial_content(gs_poly *a, gs_poly *b,
                                    const gs_polyctx *ctx)
{
    uint64_t *ea = gs_calloc((size_t)ctx->nwords, sizeof *ea);
    uint64_t *eb = gs_calloc((size_t)ctx->nwords, sizeof *eb);
    int w, any = 0;
    gs_poly_monomial_content(ea, a, ctx);
    gs_poly_monomial_content(eb, b, ctx);
    for (w = 0; w < ctx->nwords; w++) {
        uint64_t m = gs_poly_fields_min(ea[w], eb[w]);
        ea[w] = m;
        any |= m != 0;
    }
    if (any) {
        gs_poly_div_monomial(a, a, ea, ctx);
        gs_poly_div_monomial(b, b, ea, ctx);
    }
    gs_free(ea);
    gs_free(eb);
}

/* Put num/den in lowest terms in place: reciprocal symbols cleared,
   common monomial, integer and polynomial factors removed, sign made
   positive on den's leading term.  gcd_terms (may be NULL) gets the size
   of the polynomial factor removed. */
void gs_reduce_ratio(gs_poly *num, gs_poly *den,
                            const gs_symtab *st, const gs_polyctx *ctx,
                            int use_gcd, size_t *gcd_terms)
{
    gs_poly g;
    gs_int cn, cd;

    if (gcd_terms)
        *gcd_terms = 0;
    clear_reciprocals(num, den, st, ctx);
    if (gs_poly_is_zero(num)) {
        gs_poly_set_si(den, 1, ctx);
        return;
    }
    remove_monomial_content(num, den, ctx);
    gs_int_init(&cn);
    gs_int_init(&cd);
    gs_poly_content(&cn, num);
    gs_poly_content(&cd, den);
    gs_int_gcd(&cn, &cn, &cd);
    if (gs_poly_sgn(den) < 0)
        gs_int_neg(&cn, &cn);
    gs_poly_divexact_int(num, num, &cn, ctx);
    gs_poly_divexact_int(den, den, &cn, ctx);
    gs_int_clear(&cd);
    gs_int_clear(&cn);
    if (!use_gcd)
        return;
    gs_poly_init(&g);
    gs_poly_gcd(&g, num, den, ctx);
    if (!gs_poly_is_const(&g, ctx)) {
        if (gcd_terms)
            *gcd_terms = g.length;
        gs_poly_divexact(num, num, &g, ctx);
        gs_poly_divexact(den, den, &g, ctx);
        if (gs_poly_sgn(den) < 0) {
            gs_poly_neg(num, num, ctx);
            gs_poly_neg(den, den, ctx);
        }
    }
    gs_poly_clear(&g);
}

/* A limit that is infinite sets stats->no_limit: it is the one GS_ERANGE
   that concerns this output alone, which a run over several outputs can
   leave out and go on (job.c); an exponent overflow is another. */
static int apply_limits(gs_tf *tf, const gs_circuit *c, const gs_output *out,
                        const gs_derive_opts *o, gs_derive_stats *stats,
                        gs_diag *d)
{
    size_t i;
    for (i = 0; i < o->nlimits; i++) {
        const gs_limit *l = &o->limits[i];
        gs_poly rn, rd;
        int rc;
        gs_poly_init(&rn);
        gs_poly_init(&rd);
        rc = gs_poly_limit_ratio(&rn, &rd, &tf->num, &tf->den, l->sym,
                                 l->to_inf, tf->ctx);
        if (rc == GS_OK) {
            gs_poly_swap(&rn, &tf->num);
            gs_poly_swap(&rd, &tf->den);
            gs_reduce_ratio(&tf->num, &tf->den, c->syms, tf->ctx, 1, NULL);
        } else {
            gs_diag_add(d, GS_SEV_ERROR, c->file, out->line, out->col,
                        NULL, "%s has no finite limit as %s -> %s",
                        out->name, gs_symtab_name(c->syms, l->sym),
                        l->to_inf ? "inf" : "0");
        }
        gs_poly_clear(&rn);
        gs_poly_clear(&rd);
        if (rc != GS_OK) {
            stats->no_limit = 1;
            return GS_ERANGE;
        }
    }
    return GS_OK;
}

/* H = scale * (c0 * detA - detM) / detA, scale = p/q: num and den. */
static void assemble(gs_tf *tf, const gs_mna *m, gs_poly *det_a,
                     gs_poly *det_m, const gs_polyctx *ctx)
{
    gs_poly_mul(&tf->num, &m->c0, det_a, ctx);
    gs_poly_sub(&tf->num, &tf->num, det_m, ctx);
    gs_poly_mul_int(&tf->num, &tf->num, &m->scale.num, ctx);
    gs_poly_swap(&tf->den, det_a);
    if (!gs_int_is_one(&m->scale.den))
        gs_poly_mul_int(&tf->den, &tf->den, &m->scale.den, ctx);
}

/* "v(out) / vin", "i(R1) / iin", "out, gnd": what the output asks for. */
static char *describe(const gs_circuit *c, const gs_output *o)
{
    char *probe, *text;
    if (o->kind == GS_OUT_IMPEDANCE)
        return gs_asprintf("%s, %s", c->node_name[o->a], c->node_name[o->b]);
    if (o->out.kind == GS_PROBE_I)
        probe = gs_asprintf("i(%s)", c->elems[o->out.elem].name);
    else if (o->out.b == 0)
        probe = gs_asprintf("v(%s)", c->node_name[o->out.a]);
    else
        probe = gs_asprintf("v(%s, %s)", c->node_name[o->out.a],
                            c->node_name[o->out.b]);
    text = gs_asprintf("%s / %s", probe, c->elems[o->in].name);
    gs_free(probe);
    return text;
}

/* det A and det M by the method o asks for.  Expansion in minors is tried
   first under AUTO; elimination takes over when the expansion's plan is
   too large, and also when A is singular, since elimination can name the
   unknowns left undetermined. */
/* Under AUTO with no budget given, the graph of minors is built first
   (it takes a fraction of the expansion's time) and its path counts say
   how large the expansion would be; one far past what anyone reads is
   refused, naming the graph that holds it instead.  Returns GS_OK to go
   on expanding. */
/* A bound on the terms of the determinant of the leading k x k block of
   M from the degrees alone: a term is a monomial, and the degree of the
   determinant in a symbol is at most the sum over the rows (or over the
   columns) of its largest degree there, since every term of the
   expansion takes one entry from each row and each column (the Leibniz
   formula).  So the terms are at most the product over the symbols of
   (that degree + 1); where the entries are mostly numbers this is far
   below the paths of the graph, which count terms before equal
   monomials combine.  In double: the product may overflow to inf. */
static double degree_bound(const gs_mna *m, int k, const gs_polyctx *ctx)
{
    int nv = ctx->nvars, v, i, j;
    unsigned *row = gs_calloc((size_t)nv, sizeof *row);
    unsigned *col = gs_calloc((size_t)nv * (size_t)k, sizeof *col);
    unsigned *degs = gs_calloc((size_t)nv, sizeof *degs);
    unsigned long *sum_r = gs_calloc((size_t)nv, sizeof *sum_r);
    unsigned long *sum_c = gs_calloc((size_t)nv, sizeof *sum_c);
    double bound = 1;
    for (i = 0; i < k; i++) {
        memset(row, 0, (size_t)nv * sizeof *row);
        for (j = 0; j < k; j++) {
            const gs_poly *e = GS_MNA_AT(m, i, j);
            if (e->length == 0)
                continue;
            gs_poly_degrees(degs, e, ctx);
            for (v = 0; v < nv; v++) {
                if (degs[v] > row[v])
                    row[v] = degs[v];
                if (degs[v] > col[(size_t)j * (size_t)nv + (size_t)v])
                    col[(size_t)j * (size_t)nv + (size_t)v] = degs[v];
            }
        }
        for (v = 0; v < nv; v++)
            sum_r[v] += row[v];
    }
    for (j = 0; j < k; j++)
        for (v = 0; v < nv; v++)
            sum_c[v] += col[(size_t)j * (size_t)nv + (size_t)v];
    for (v = 0; v < nv; v++)
        bound *= (double)(sum_r[v] < sum_c[v] ? sum_r[v] : sum_c[v]) + 1;
    gs_free(row);
    gs_free(col);
    gs_free(degs);
    gs_free(sum_r);
    gs_free(sum_c);
    return bound;
}

/* The graph is handed to *out (when not NULL) on a refusal by its
   paths, for the caller's numbers. */
static int size_gate(const gs_mna *m, const gs_polyctx *ctx,
                     size_t max_bytes, gs_derive_stats *stats, gs_diag *d,
                     gs_mgraph **out)
{
    gs_mgraph g;
    gs_int c;
    double bn, bd;
    int rc = gs_mgraph_build(&g, m, GS_MGRAPH_ORDER_GREEDY, max_bytes, ctx);
    if (rc != GS_OK) {
        gs_mgraph_clear(&g);
        if (rc == GS_EBUDGET) {
            gs_mgraph_refused(d, max_bytes);
            stats->graph_refused = 1;
        }
        /* singular: elimination says why */
        return rc == GS_EBUDGET ? GS_EBUDGET : GS_OK;
    }
    gs_int_init(&c);
    stats->graph_nodes = g.nnodes;
    stats->graph_edges = g.nedges;
    gs_mgraph_count_paths(&c, &g, g.root_n);
    stats->graph_paths_n = (double)gs_int_get_d(&c);
    gs_mgraph_count_paths(&c, &g, g.root_d);
    stats->graph_paths_d = (double)gs_int_get_d(&c);
    gs_int_clear(&c);
    bd = degree_bound(m, m->n, ctx);
    /* N is c0 det A - det M */
    bn = degree_bound(m, m->n + 1, ctx) + (m->c0.length ? bd : 0);
    bn = bn < stats->graph_paths_n ? bn : stats->graph_paths_n;
    bd = bd < stats->graph_paths_d ? bd : stats->graph_paths_d;
    if (bn <= GS_DERIVE_MAX_PATHS && bd <= GS_DERIVE_MAX_PATHS) {
        gs_mgraph_clear(&g);
        return GS_OK;
    }
    if (out) {
        *out = gs_malloc(sizeof **out);
        **out = g;              /* moved: its storage is the caller's */
    } else {
        gs_mgraph_clear(&g);
    }
    gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                "eval, bode, poles and check compute from the graph, approx "
                "gives the dominant terms; --max-terms N expands anyway",
                "the expansion is too large to print: about %.3g terms in "
                "N and %.3g in D, held as a graph of %zu minors and %zu "
                "edges", bn, bd, stats->graph_nodes, stats->graph_edges);
    return GS_EBUDGET;
}

static int expand(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                  const gs_polyctx *ctx, const gs_derive_opts *o,
                  gs_derive_stats *stats, gs_diag *d)
{
    gs_minors_opts mo;
    int rc;
    if (o->method != GS_DET_BAREISS) {
        gs_minors_opts_default(&mo);
        mo.max_terms = o->elim.max_terms;
        mo.max_bytes = o->elim.max_bytes;
        mo.progress = o->elim.progress;
        if (o->method == GS_DET_MINORS)
            mo.max_products = 0;
        rc = gs_minors_bordered(det_a, det_m, m, ctx, &mo, &stats->minors,
                                d);
        /* an exponent overflow would overflow elimination too: it is
           reported, not retried */
        if ((rc != GS_ERANGE && rc != GS_ESINGULAR)
            || stats->minors.exp_overflow) {
            stats->method = GS_DET_MINORS;
            return rc;
        }
    }
    stats->method = GS_DET_BAREISS;
    return gs_elim_bordered(det_a, det_m, m, ctx, &o->elim, &stats->elim, d);
}

/* Under AUTO without a term budget the size gate runs first, for any
   number of unknowns (the graph of minors takes column sets of any
   width).  Its estimate counts terms before they combine or cancel, which
   can be far too many (a resistor chain, whose det is one product, has
   10^24 paths at 64 resistors), so a refusal is tried once: the
   expansion within GS_DERIVE_TRY_TERMS terms an entry.  Only when that
   outgrows its budget does the gate's message stand (determinants, at
   the end of this part, runs the gate).  Here: the expansion, or with
   the gate's refusal in gate (not NULL) the trial, gate's message
   standing if the trial fails; gate is cleared. */
static int determinants_in(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                           const gs_polyctx *ctx, const gs_derive_opts *o,
                           gs_derive_stats *stats, gs_diag *d, gs_diag *gate)
{
    gs_derive_opts tried;
    gs_diag trial;
    int rc;
    if (gate == NULL)
        return expand(det_a, det_m, m, ctx, o, stats, d);
    tried = *o;
    if (tried.elim.max_terms == 0 || tried.elim.max_terms > GS_DERIVE_TRY_TERMS)
        tried.elim.max_terms = GS_DERIVE_TRY_TERMS;
    gs_diag_init(&trial);
    rc = expand(det_a, det_m, m, ctx, &tried, stats, &trial);
    /* the graph is not singular (the gate built it): a trial that fails
       outgrew its budget or its exponents, and the graph holds it */
    if (rc != GS_OK)
        rc = GS_EBUDGET;
    gs_diag_append(d, rc == GS_EBUDGET ? gate : &trial);
    gs_diag_clear(&trial);
    gs_diag_clear(gate);
    return rc;
}

/* det A and det M back into the full context, their conductances 1/R
   cleared on the way (gs_poly_remap_flip_take): both multiplied by the
   same prod R^top, top the larger degree of 1/R in the two, which the
   ratio H = (c0 det A - det M) / det A does not see.  The reduction that
   follows clears what c0 brings and divides out any common monomial, so
   the result is the one clearing them after the assembly gives, and the
   largest polynomials of the run are written once in the full context
   instead of twice. */
static void remap_back(gs_poly *det_a, gs_poly *det_m, gs_poly *sa,
                       gs_poly *sm, const int *back, const gs_polyctx *small,
                       const gs_polyctx *ctx)
{
    size_t nv = (size_t)ctx->nvars + 1;
    unsigned *da = gs_calloc((size_t)small->nvars + 1, sizeof *da);
    unsigned *dm = gs_calloc((size_t)small->nvars + 1, sizeof *dm);
    unsigned *top = gs_calloc(nv, sizeof *top);
    int *to = gs_calloc(nv, sizeof *to);
    int v;
    gs_poly_degrees(da, sa, small);
    gs_poly_degrees(dm, sm, small);
    for (v = 0; v < small->nvars; v++) {
        int b = back[v];
        if (!gs_symtab_is_recip(ctx->syms, b))
            continue;
        top[b] = da[v] > dm[v] ? da[v] : dm[v];
        to[b] = gs_symtab_base(ctx->syms, b);
    }
    gs_poly_remap_flip_take(det_a, sa, back, to, top, small, ctx);
    gs_poly_remap_flip_take(det_m, sm, back, to, top, small, ctx);
    gs_free(da);
    gs_free(dm);
    gs_free(top);
    gs_free(to);
}

/* The determinants only ever hold the symbols that occur in M: the
   conductances 1/R but not R, no symbol of another output.  In a context
   of those alone every monomial packs into fewer words, and the products
   move less memory.  The small context's symbols are the used ones in
   their order, so mapping back keeps the term order. */
static int determinants_small(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                              const gs_polyctx *ctx, const gs_derive_opts *o,
                              gs_derive_stats *stats, gs_diag *d,
                              gs_diag *refused)
{
    size_t k, cells = (size_t)(m->n + 1) * (size_t)(m->n + 1);
    unsigned char *used = gs_calloc((size_t)ctx->nvars + 1, 1);
    unsigned char *here = gs_calloc((size_t)ctx->nvars + 1, 1);
    int *fwd = gs_calloc((size_t)ctx->nvars + 1, sizeof *fwd);
    int *back = gs_calloc((size_t)ctx->nvars + 1, sizeof *back);
    int v, nsmall = 0, rc;
    gs_symtab *st;
    gs_polyctx *small;
    gs_mna ms;
    gs_poly sa, sm;

    for (k = 0; k < cells; k++) {
        gs_poly_used_vars(here, &m->m[k], ctx);
        for (v = 0; v < ctx->nvars; v++)
            used[v] |= here[v];
    }
    st = gs_symtab_new();
    for (v = 0; v < ctx->nvars; v++) {
        char name[24];
        if (!used[v])
            continue;
        snprintf(name, sizeof name, "x%d", v);  /* never printed */
        gs_symtab_intern(st, name);
        fwd[v] = nsmall;
        back[nsmall++] = v;
    }
    gs_free(used);
    gs_free(here);
    small = gs_polyctx_new(st, nsmall);
    if (small->nwords >= ctx->nwords) {
        rc = determinants_in(det_a, det_m, m, ctx, o, stats, d, refused);
    } else {
        ms = *m;        /* names and scale borrowed, entries new */
        ms.m = gs_malloc(cells * sizeof *ms.m);
        for (k = 0; k < cells; k++) {
            gs_poly_init(&ms.m[k]);
            gs_poly_remap(&ms.m[k], &m->m[k], fwd, ctx, small);
        }
        gs_poly_init(&sa);
        gs_poly_init(&sm);
        rc = determinants_in(&sa, &sm, &ms, small, o, stats, d, refused);
        if (rc == GS_OK)
            remap_back(det_a, det_m, &sa, &sm, back, small, ctx);
        gs_poly_clear(&sa);
        gs_poly_clear(&sm);
        for (k = 0; k < cells; k++)
            gs_poly_clear(&ms.m[k]);
        gs_free(ms.m);
    }
    gs_polyctx_free(small);
    gs_symtab_free(st);
    gs_free(fwd);
    gs_free(back);
    return rc;
}

/* Under AUTO with the default budget the gate runs first, on the MNA as
   it is, so that a graph it hands out (o->graph_out) is in the caller's
   context. */
static int determinants(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                        const gs_polyctx *ctx, const gs_derive_opts *o,
                        gs_derive_stats *stats, gs_diag *d)
{
    gs_diag gate;
    int rc;
    if (o->method != GS_DET_AUTO || o->terms_given)
        return determinants_small(det_a, det_m, m, ctx, o, stats, d, NULL);
    gs_diag_init(&gate);
    rc = size_gate(m, ctx, o->elim.max_bytes, stats, &gate, o->graph_out);
    if (rc == GS_EBUDGET)       /* the trial, and gate's message if not */
        return determinants_small(det_a, det_m, m, ctx, o, stats, d, &gate);
    gs_diag_append(d, &gate);
    gs_diag_clear(&gate);
    return rc != GS_OK ? rc
           : determinants_small(det_a, det_m, m, ctx, o, stats, d, NULL);
}

/* ---- figures: rational functions of other outputs ---- */

static int derive_loop(gs_tf *tf, const gs_circuit *cc, size_t out,
                       const gs_polyctx *ctx, const gs_derive_opts *o,
                       gs_derive_stats *stats, gs_diag *d);

/* The text of a figure's expression, as written but with the least
   parentheses: "Adm / Acm". */
static char *expr_text(const gs_circuit *c, const gs_expr *e, int prec)
{
    char *l, *r, *t;
    const char *op;
    int mine;
    switch (e->kind) {
    case GS_EX_NUM:
        return gs_rat_get_str(&e->num);
    case GS_EX_SYM:
        return gs_strdup(gs_symtab_name(c->syms, e->sym));
    case GS_EX_NEG:
        l = expr_text(c, e->lhs, 3);
        t = gs_asprintf(prec > 1 ? "(-%s)" : "-%s", l);
        gs_free(l);
        return t;
    default:
        break;
    }
    switch (e->kind) {
    case GS_EX_ADD: op = " + "; mine = 1; break;
    case GS_EX_SUB: op = " - "; mine = 1; break;
    case GS_EX_MUL: op = "*"; mine = 2; break;
    case GS_EX_DIV: op = " / "; mine = 2; break;
    default: op = "^"; mine = 4; break;
    }
    l = expr_text(c, e->lhs, mine);
    r = expr_text(c, e->rhs, mine + 1);
    t = gs_asprintf(mine < prec ? "(%s%s%s)" : "%s%s%s", l, op, r);
    gs_free(l);
    gs_free(r);
    return t;
}

typedef struct ratfn {
    gs_poly num, den;
} ratfn;

static void ratfn_init(ratfn *r)
{
    gs_poly_init(&r->num);
    gs_poly_init(&r->den);
}

static void ratfn_clear(ratfn *r)
{
    gs_poly_clear(&r->num);
    gs_poly_clear(&r->den);
}

/* r = the value of e, each name the output of that name derived again
   (depth bounds figures of figures; the parser refuses cycles). */
static int figure_eval(ratfn *r, const gs_circuit *c, const gs_output *fig,
                       const gs_expr *e, const gs_polyctx *ctx,
                       const gs_derive_opts *o, gs_diag *d, int depth)
{
    ratfn a, b;
    gs_poly t;
    gs_tf tf;
    long n, k;
    int rc = GS_OK, idx;
    if (depth > (int)c->noutputs + 1)
        return GS_EINVAL;
    if (e->kind == GS_EX_NUM) {
        gs_poly_set_int(&r->num, &e->num.num, ctx);
        gs_poly_set_int(&r->den, &e->num.den, ctx);
        return GS_OK;
    }
    if (e->kind == GS_EX_SYM) {
        idx = gs_circuit_find_output(c, gs_symtab_name(c->syms, e->sym));
        if (idx < 0)
            return GS_EINVAL;
        gs_tf_init(&tf, ctx, c->s_sym);
        rc = gs_derive_figure_part(&tf, c, (size_t)idx, ctx, o, d,
                                   depth + 1);
        if (rc == GS_OK) {
            gs_poly_swap(&r->num, &tf.num);
            gs_poly_swap(&r->den, &tf.den);
        }
        gs_tf_clear(&tf);
        return rc;
    }
    ratfn_init(&a);
    ratfn_init(&b);
    gs_poly_init(&t);
    rc = figure_eval(&a, c, fig, e->lhs, ctx, o, d, depth);
    if (rc == GS_OK && e->rhs && e->kind != GS_EX_POW)
        rc = figure_eval(&b, c, fig, e->rhs, ctx, o, d, depth);
    if (rc == GS_OK) {
        switch (e->kind) {
        case GS_EX_NEG:
            gs_poly_neg(&r->num, &a.num, ctx);
            gs_poly_set(&r->den, &a.den, ctx);
            break;
        case GS_EX_ADD:
        case GS_EX_SUB:
            gs_poly_mul(&r->num, &a.num, &b.den, ctx);
            gs_poly_mul(&t, &b.num, &a.den, ctx);
            if (e->kind == GS_EX_ADD)
                gs_poly_add(&r->num, &r->num, &t, ctx);
            else
                gs_poly_sub(&r->num, &r->num, &t, ctx);
            gs_poly_mul(&r->den, &a.den, &b.den, ctx);
            break;
        case GS_EX_MUL:
            gs_poly_mul(&r->num, &a.num, &b.num, ctx);
            gs_poly_mul(&r->den, &a.den, &b.den, ctx);
            break;
        case GS_EX_DIV:
            gs_poly_mul(&r->num, &a.num, &b.den, ctx);
            gs_poly_mul(&r->den, &a.den, &b.num, ctx);
            break;
        case GS_EX_POW:
            n = e->rhs->kind == GS_EX_NEG
                ? -(long)gs_rat_get_ld(&e->rhs->lhs->num)
                : (long)gs_rat_get_ld(&e->rhs->num);
            gs_poly_set_si(&r->num, 1, ctx);
            gs_poly_set_si(&r->den, 1, ctx);
            for (k = 0; k < (n < 0 ? -n : n) && k < 64; k++) {
                gs_poly_mul(&r->num, &r->num, n < 0 ? &a.den : &a.num, ctx);
                gs_poly_mul(&r->den, &r->den, n < 0 ? &a.num : &a.den, ctx);
            }
            break;
        default:
            rc = GS_EINVAL;
            break;
        }
    }
    if (rc == GS_OK && gs_poly_is_zero(&r->den)) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, e->line, e->col,
                    "a figure may not divide by an output that is zero",
                    "figure '%s': division by zero", fig->name);
        rc = GS_ESINGULAR;
    }
    if (rc == GS_OK)
        gs_reduce_ratio(&r->num, &r->den, c->syms, ctx, 1, NULL);
    gs_poly_clear(&t);
    ratfn_clear(&a);
    ratfn_clear(&b);
    return rc;
}

int gs_derive_figure_part(gs_tf *tf, const gs_circuit *c, size_t out,
                          const gs_polyctx *ctx, const gs_derive_opts *o,
                          gs_diag *d, int depth)
{
    const gs_output *op = &c->outputs[out];
    gs_derive_opts plain = *o;
    ratfn r;
    int rc;
    plain.nlimits = 0;          /* limits apply to the whole figure */
    plain.graph_out = NULL;     /* a part's graph is not the figure's */
    if (op->kind == GS_OUT_LOOP)
        return derive_loop(tf, c, out, ctx, &plain, NULL, d);
    if (op->kind != GS_OUT_FIGURE)
        return gs_derive(tf, c, out, ctx, &plain, NULL, d);
    ratfn_init(&r);
    rc = figure_eval(&r, c, op, op->figure, ctx, &plain, d, depth);
    if (rc == GS_OK) {
        gs_poly_swap(&tf->num, &r.num);
        gs_poly_swap(&tf->den, &r.den);
    }
    ratfn_clear(&r);
    return rc;
}

/* ---- the return ratio ---- */

/* The return ratio of controlled source X (Bode's definition; Gray,
   Hurst, Lewis and Meyer, feedback chapter; Rosenstark, "Feedback
   Amplifier Principles", from memory): X made an independent source of
   its own kind (current or voltage) with every other independent source
   set to zero, T = -(gain of X) * (the control X sees) / (what X
   injects).  The circuit is changed for the derivation and restored:
   the element becomes an isource or vsource of amplitude 1 and the output
   a transfer from it to X's control. */
/* The transfer loop_of with controlled source X set to zero (made an
   independent source, which superposition then nulls): the direct
   feed-through d of the asymptotic-gain model. */
static int derive_direct(gs_tf *tf, gs_circuit *c, const gs_output *op,
                         const gs_polyctx *ctx, const gs_derive_opts *o,
                         gs_diag *d)
{
    gs_element *x = &c->elems[op->in];
    gs_elem_kind kind = x->kind;
    int rc;
    x->kind = kind == GS_VCCS || kind == GS_CCCS ? GS_ISOURCE : GS_VSOURCE;
    rc = gs_derive_figure_part(tf, c, (size_t)op->loop_of, ctx, o, d, 1);
    x->kind = kind;
    return rc;
}

/* The parts of the asymptotic-gain model (Rosenstark, "Feedback
   Amplifier Principles"; Gray, Hurst, Lewis and Meyer, feedback chapter,
   from memory): A = Ainf T/(1 + T) + d/(1 + T), so
   Ainf = (A (1 + T) - d) / T; part 2 is d itself. */
static int derive_loop_part(gs_tf *tf, gs_circuit *c, size_t out,
                            const gs_polyctx *ctx, const gs_derive_opts *o,
                            gs_derive_stats *stats, gs_diag *d)
{
    gs_output *op = &c->outputs[out];
    gs_derive_opts plain = *o;
    gs_tf a, t, dd;
    gs_poly x, y;
    char *desc;
    int rc;
    if (op->loop_of < 0)
        return GS_EINVAL;
    plain.nlimits = 0;
    plain.graph_out = NULL;     /* the parts' graphs are not the output's */
    gs_tf_init(&a, ctx, c->s_sym);
    gs_tf_init(&t, ctx, c->s_sym);
    gs_tf_init(&dd, ctx, c->s_sym);
    rc = derive_direct(&dd, c, op, ctx, &plain, d);
    if (rc == GS_OK && op->loop_part == 1) {
        rc = gs_derive_figure_part(&a, c, (size_t)op->loop_of, ctx, &plain,
                                   d, 1);
        if (rc == GS_OK) {
            op->loop_part = 0;
            rc = derive_loop(&t, c, out, ctx, &plain, NULL, d);
            op->loop_part = 1;
        }
        if (rc == GS_OK && gs_poly_is_zero(&t.num)) {
            gs_diag_add(d, GS_SEV_ERROR, c->file, op->line, op->col, NULL,
                        "%s: the return ratio is zero: no asymptotic gain",
                        op->name);
            rc = GS_ESINGULAR;
        }
        if (rc == GS_OK) {
            /* a/b, t/u, e/f: (a f (u + t) - e b u) / (b f t) */
            gs_poly_init(&x);
            gs_poly_init(&y);
            gs_poly_add(&x, &t.den, &t.num, ctx);
            gs_poly_mul(&x, &x, &a.num, ctx);
            gs_poly_mul(&x, &x, &dd.den, ctx);
            gs_poly_mul(&y, &dd.num, &a.den, ctx);
            gs_poly_mul(&y, &y, &t.den, ctx);
            gs_poly_sub(&tf->num, &x, &y, ctx);
            gs_poly_mul(&x, &a.den, &dd.den, ctx);
            gs_poly_mul(&tf->den, &x, &t.num, ctx);
            gs_poly_clear(&x);
            gs_poly_clear(&y);
            gs_reduce_ratio(&tf->num, &tf->den, c->syms, ctx, 1, NULL);
        }
    } else if (rc == GS_OK) {
        gs_poly_swap(&tf->num, &dd.num);
        gs_poly_swap(&tf->den, &dd.den);
    }
    gs_tf_clear(&a);
    gs_tf_clear(&t);
    gs_tf_clear(&dd);
    gs_tf_set_name(tf, op->name);
    desc = gs_asprintf(op->loop_part == 1 ? "asymptotic gain of %s for %s"
                       : "direct feed-through of %s, %s set to zero",
                       c->outputs[op->loop_of].name, c->elems[op->in].name);
    gs_tf_set_description(tf, desc);
    gs_free(desc);
    tf->kind = GS_TF_TRANSFER;
    if (rc == GS_OK)
        rc = apply_limits(tf, c, op, o, stats, d);
    return rc;
}

static int derive_loop(gs_tf *tf, const gs_circuit *cc, size_t out,
                       const gs_polyctx *ctx, const gs_derive_opts *o,
                       gs_derive_stats *stats, gs_diag *d)
{
    gs_circuit *c = (gs_circuit *)cc;     /* restored before returning */
    gs_output *op = &c->outputs[out], saved_out = *op;
    gs_element *x = &c->elems[op->in], saved_x = *x;
    gs_derive_opts plain = *o;
    gs_poly g, t;
    char *desc;
    int rc, i;

    plain.graph_out = NULL;     /* its graph would be H's, not T = -g H */

    if (op->loop_part != 0)
        return derive_loop_part(tf, c, out, ctx, o, stats, d);
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
    gs_monomial_init(&x->value);
    plain.nlimits = 0;
    rc = gs_derive(tf, c, out, ctx, &plain, stats, d);
    gs_monomial_clear(&x->value);
    *x = saved_x;
    *op = saved_out;
    if (rc != GS_OK)
        return rc;
    /* T = -g H, g a monomial of the gain's symbols */
    gs_poly_init(&g);
    gs_poly_init(&t);
    gs_poly_set_int(&t, &x->value.coeff.num, ctx);
    gs_poly_neg(&t, &t, ctx);
    gs_poly_mul(&tf->num, &tf->num, &t, ctx);
    gs_poly_set_int(&t, &x->value.coeff.den, ctx);
    gs_poly_mul(&tf->den, &tf->den, &t, ctx);
    for (i = 0; i < x->value.n; i++) {
        int e = x->value.exp[i];
        gs_poly_set_var(&g, x->value.sym[i], (unsigned)(e < 0 ? -e : e),
                        ctx);
        if (e > 0)
            gs_poly_mul(&tf->num, &tf->num, &g, ctx);
        else
            gs_poly_mul(&tf->den, &tf->den, &g, ctx);
    }
    gs_poly_clear(&g);
    gs_poly_clear(&t);
    gs_reduce_ratio(&tf->num, &tf->den, c->syms, ctx, !o->no_gcd, NULL);
    gs_tf_set_name(tf, op->name);
    desc = gs_asprintf("return ratio of %s", x->name);
    gs_tf_set_description(tf, desc);
    gs_free(desc);
    return apply_limits(tf, c, op, o, stats, d);
}

int gs_derive(gs_tf *tf, const gs_circuit *c, size_t out,
              const gs_polyctx *ctx, const gs_derive_opts *o,
              gs_derive_stats *stats, gs_diag *d)
{
    const gs_output *op = &c->outputs[out];
    gs_derive_stats local;
    gs_mna m;
    gs_poly det_a, det_m;
    char *desc;
    int rc;

    if (stats == NULL)
        stats = &local;
    memset(stats, 0, sizeof *stats);
    if (op->kind == GS_OUT_LOOP)
        return derive_loop(tf, c, out, ctx, o, stats, d);
    if (op->kind == GS_OUT_FIGURE) {
        desc = expr_text(c, op->figure, 0);
        gs_tf_set_name(tf, op->name);
        gs_tf_set_description(tf, desc);
        gs_free(desc);
        tf->kind = GS_TF_TRANSFER;
        rc = gs_derive_figure_part(tf, c, out, ctx, o, d, 0);
        if (rc == GS_OK)
            rc = apply_limits(tf, c, op, o, stats, d);
        return rc;
    }
    desc = describe(c, op);
    gs_tf_set_name(tf, op->name);
    gs_tf_set_description(tf, desc);
    gs_free(desc);
    tf->kind = op->kind == GS_OUT_IMPEDANCE ? GS_TF_IMPEDANCE
                                            : GS_TF_TRANSFER;
    memset(&m, 0, sizeof m);
    rc = gs_mna_build(&m, c, out, ctx, d);
    if (rc != GS_OK)
        return rc;
    gs_poly_init(&det_a);
    gs_poly_init(&det_m);
    stats->unknowns = m.n;
    rc = determinants(&det_a, &det_m, &m, ctx, o, stats, d);
    if (rc == GS_OK)
        assemble(tf, &m, &det_a, &det_m, ctx);
    /* freed before the reduction: the determinants can be the largest
       polynomials of the whole run */
    gs_poly_clear(&det_a);
    gs_poly_clear(&det_m);
    gs_mna_clear(&m);
    if (rc == GS_OK) {
        gs_reduce_ratio(&tf->num, &tf->den, c->syms, ctx, !o->no_gcd,
                        &stats->gcd_terms);
        rc = apply_limits(tf, c, op, o, stats, d);
    }
    return rc;
}
