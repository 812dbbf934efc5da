/* derive.c - circuit output -> transfer function in lowest terms.
 * See LICENSE.
 */
#include "analysis/derive.h"
#include "base/mem.h"
#include "analysis/mna.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gs_derive_opts_default(gs_derive_opts *o)
{
    o->method = GS_DET_AUTO;
    gs_elim_opts_default(&o->elim);
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
    unsigned *db = gs_calloc((size_t)nv + 1, sizeof *db);
    int *to = gs_calloc((size_t)nv + 1, sizeof *to);

    gs_poly_degrees(top, a, ctx);
    gs_poly_degrees(db, b, ctx);
    for (v = 0; v < nv; v++) {
        if (!gs_symtab_is_recip(st, v)) {
            top[v] = 0;
            continue;
        }
        if (db[v] > top[v])
            top[v] = db[v];
        to[v] = gs_symtab_base(st, v);
        any |= top[v] > 0;
    }
    if (any) {
        gs_poly_flip_vars(a, a, to, top, ctx);
        gs_poly_flip_vars(b, b, to, top, ctx);
    }
    free(top);
    free(db);
    free(to);
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
    free(ea);
    free(eb);
}

/* Put num/den in lowest terms in place: reciprocal symbols cleared,
   common monomial, integer and polynomial factors removed, sign made
   positive on den's leading term.  gcd_terms (may be NULL) gets the size
   of the polynomial factor removed. */
static void gs_reduce_ratio(gs_poly *num, gs_poly *den,
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

static int apply_limits(gs_tf *tf, const gs_circuit *c, const gs_output *out,
                        const gs_derive_opts *o, gs_diag *d)
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
        if (rc != GS_OK)
            return GS_ERANGE;
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
    free(probe);
    return text;
}

/* det A and det M by the method o asks for.  Expansion in minors is tried
   first under AUTO; elimination takes over when the expansion's plan is
   too large, and also when A is singular, since elimination can name the
   unknowns left undetermined. */
static int determinants_in(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                           const gs_polyctx *ctx, const gs_derive_opts *o,
                           gs_derive_stats *stats, gs_diag *d)
{
    gs_minors_opts mo;
    int rc;
    if (o->method != GS_DET_BAREISS) {
        gs_minors_opts_default(&mo);
        mo.max_terms = o->elim.max_terms;
        mo.progress = o->elim.progress;
        if (o->method == GS_DET_MINORS)
            mo.max_products = 0;
        rc = gs_minors_bordered(det_a, det_m, m, ctx, &mo, &stats->minors,
                                d);
        if (rc != GS_ERANGE && rc != GS_ESINGULAR) {
            stats->method = GS_DET_MINORS;
            return rc;
        }
        if (rc == GS_ERANGE && o->method == GS_DET_MINORS) {
            gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                        "use --method bareiss (or auto)",
                        "expansion in minors takes at most %d unknowns; "
                        "this circuit has %d", GS_MINORS_MAX_UNKNOWNS, m->n);
            return GS_EINVAL;
        }
    }
    stats->method = GS_DET_BAREISS;
    return gs_elim_bordered(det_a, det_m, m, ctx, &o->elim, &stats->elim, d);
}

/* The determinants only ever hold the symbols that occur in M: the
   conductances 1/R but not R, no symbol of another output.  In a context
   of those alone every monomial packs into fewer words, and the products
   move less memory.  The small context's symbols are the used ones in
   their order, so mapping back keeps the term order. */
static int determinants(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                        const gs_polyctx *ctx, const gs_derive_opts *o,
                        gs_derive_stats *stats, gs_diag *d)
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
    free(used);
    free(here);
    small = gs_polyctx_new(st, nsmall);
    if (small->nwords >= ctx->nwords) {
        rc = determinants_in(det_a, det_m, m, ctx, o, stats, d);
    } else {
        ms = *m;        /* names and scale borrowed, entries new */
        ms.m = gs_malloc(cells * sizeof *ms.m);
        for (k = 0; k < cells; k++) {
            gs_poly_init(&ms.m[k]);
            gs_poly_remap(&ms.m[k], &m->m[k], fwd, ctx, small);
        }
        gs_poly_init(&sa);
        gs_poly_init(&sm);
        rc = determinants_in(&sa, &sm, &ms, small, o, stats, d);
        if (rc == GS_OK) {
            gs_poly_remap(det_a, &sa, back, small, ctx);
            gs_poly_remap(det_m, &sm, back, small, ctx);
        }
        gs_poly_clear(&sa);
        gs_poly_clear(&sm);
        for (k = 0; k < cells; k++)
            gs_poly_clear(&ms.m[k]);
        free(ms.m);
    }
    gs_polyctx_free(small);
    gs_symtab_free(st);
    free(fwd);
    free(back);
    return rc;
}

int gs_derive(gs_tf *tf, const gs_circuit *c, size_t out,
              const gs_polyctx *ctx, const gs_derive_opts *o,
              gs_derive_stats *stats, gs_diag *d)
{
    const gs_output *op = &c->outputs[out];
    gs_derive_stats local;
    gs_mna m;
    gs_poly det_a, det_m;
    char *desc = describe(c, op);
    int rc;

    if (stats == NULL)
        stats = &local;
    memset(stats, 0, sizeof *stats);
    gs_tf_set_name(tf, op->name);
    gs_tf_set_description(tf, desc);
    free(desc);
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
        rc = apply_limits(tf, c, op, o, d);
    }
    return rc;
}
