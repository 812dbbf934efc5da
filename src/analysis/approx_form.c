/* approx_form.c - design-oriented forms of a ratio of polynomials.
 * See LICENSE.
 *
 * Middlebrook's "low-entropy" expressions (R. D. Middlebrook, "Low-entropy
 * expressions: the key to design-oriented analysis", Frontiers in
 * Education 1991): factors pulled out, parallel combinations written as
 * such.  Circuit polynomials are multilinear in most symbols, and a
 * multilinear p = x A + B (A, B free of x) with a factor g free of x has g
 * dividing both A and B, so gcd(A, B) finds every factor that does not
 * hold x; that split, repeated, is the factorisation used here.
 */
#include "analysis/approx.h"

#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

typedef struct sbuf {
    char *s;
    size_t n, cap;
} sbuf;

static void put(sbuf *b, const char *t)
{
    size_t k = strlen(t);
    if (b->n + k + 1 > b->cap) {
        b->cap = (b->n + k + 1) * 2;
        b->s = gs_realloc(b->s, b->cap);
    }
    memcpy(b->s + b->n, t, k + 1);
    b->n += k;
}

/* factors of a primitive polynomial without monomial content */
static void split(gs_poly **f, size_t *nf, const gs_poly *p,
                  const gs_polyctx *ctx)
{
    int v;
    if (p->length > 1 && p->length <= 400)
        for (v = 0; v < ctx->nvars; v++) {
            gs_poly a, b, g, q;
            int found = 0;
            if (gs_poly_degree(p, v, ctx) != 1)
                continue;
            gs_poly_init(&a);
            gs_poly_init(&b);
            gs_poly_init(&g);
            gs_poly_init(&q);
            gs_poly_coeff_var(&a, p, v, 1, ctx);
            gs_poly_coeff_var(&b, p, v, 0, ctx);
            if (!gs_poly_is_zero(&b)) {
                gs_poly_gcd(&g, &a, &b, ctx);
                if (!gs_poly_is_const(&g, ctx)
                    && gs_poly_divexact(&q, p, &g, ctx) == GS_OK) {
                    split(f, nf, &g, ctx);
                    split(f, nf, &q, ctx);
                    found = 1;
                }
            }
            gs_poly_clear(&a);
            gs_poly_clear(&b);
            gs_poly_clear(&g);
            gs_poly_clear(&q);
            if (found)
                return;
        }
    *f = gs_reallocarray(*f, *nf + 1, sizeof **f);
    gs_poly_init(&(*f)[*nf]);
    gs_poly_set(&(*f)[*nf], p, ctx);
    (*nf)++;
}

typedef struct parts {
    gs_int c;
    unsigned *mono;         /* nvars exponents */
    gs_poly *f;
    size_t nf;
} parts;

static void decompose(parts *pt, const gs_poly *p, const gs_polyctx *ctx)
{
    gs_poly q;
    uint64_t *m = gs_calloc((size_t)ctx->nwords, sizeof *m);
    int v;
    gs_int_init(&pt->c);
    pt->mono = gs_calloc((size_t)ctx->nvars + 1, sizeof *pt->mono);
    pt->f = NULL;
    pt->nf = 0;
    gs_poly_init(&q);
    gs_poly_content(&pt->c, p);
    if (gs_poly_is_zero(p)) {
        gs_free(m);
        return;
    }
    gs_poly_primitive(&q, p, ctx);
    gs_poly_monomial_content(m, &q, ctx);
    gs_poly_div_monomial(&q, &q, m, ctx);
    {
        gs_poly t;
        gs_int one;
        gs_poly_init(&t);
        gs_int_init(&one);
        gs_int_set_si(&one, 1);
        gs_poly_set_term(&t, &one, pt->mono, ctx);
        gs_poly_mul_monomial(&t, &t, m, ctx);
        gs_poly_get_term_exps(pt->mono, &t, 0, ctx);
        gs_poly_clear(&t);
        gs_int_clear(&one);
    }
    if (!gs_poly_is_one(&q, ctx))
        split(&pt->f, &pt->nf, &q, ctx);
    (void)v;
    gs_poly_clear(&q);
    gs_free(m);
}

size_t gs_approx_factors(gs_poly **f, const gs_poly *p,
                         const gs_polyctx *ctx)
{
    parts pt;
    decompose(&pt, p, ctx);
    *f = pt.f;
    pt.f = NULL;
    gs_int_clear(&pt.c);
    gs_free(pt.mono);
    return pt.nf;
}

static void parts_clear(parts *pt)
{
    size_t i;
    gs_int_clear(&pt->c);
    gs_free(pt->mono);
    for (i = 0; i < pt->nf; i++)
        gs_poly_clear(&pt->f[i]);
    gs_free(pt->f);
}

static char *poly_str(const gs_poly *p, int style, const gs_polyctx *ctx)
{
    sbuf b = {0, 0, 0};
    size_t i;
    unsigned *e;
    int v;
    if (style != GS_FORM_LATEX)
        return gs_poly_get_str(p, ctx);
    e = gs_calloc((size_t)ctx->nvars + 1, sizeof *e);
    put(&b, "");
    for (i = 0; i < p->length; i++) {
        char *c = gs_int_get_str(&p->coeffs[i]);
        const char *digits = c[0] == '-' ? c + 1 : c;
        int any = 0;
        put(&b, c[0] == '-' ? (i ? " - " : "-") : (i ? " + " : ""));
        gs_poly_get_term_exps(e, p, i, ctx);
        for (v = 0; v < ctx->nvars; v++)
            any |= e[v] != 0;
        if (strcmp(digits, "1") || !any)
            put(&b, digits);
        for (v = 0; v < ctx->nvars; v++)
            if (e[v]) {
                char *l = gs_symtab_latex(ctx->syms, v), num[32];
                put(&b, " ");
                put(&b, l);
                if (e[v] > 1) {
                    snprintf(num, sizeof num, "^{%u}", e[v]);
                    put(&b, num);
                }
                gs_free(l);
            }
        gs_free(c);
    }
    gs_free(e);
    return b.s;
}

static void put_mono(sbuf *b, const unsigned *e, int style, int *first,
                     const gs_polyctx *ctx)
{
    int v;
    char num[32];
    for (v = 0; v < ctx->nvars; v++)
        if (e[v]) {
            if (!*first)
                put(b, style == GS_FORM_LATEX ? " " : "*");
            *first = 0;
            if (style == GS_FORM_LATEX) {
                char *l = gs_symtab_latex(ctx->syms, v);
                put(b, l);
                gs_free(l);
                if (e[v] > 1) {
                    snprintf(num, sizeof num, "^{%u}", e[v]);
                    put(b, num);
                }
            } else {
                put(b, gs_symtab_name(ctx->syms, v));
                if (e[v] > 1) {
                    snprintf(num, sizeof num, "^%u", e[v]);
                    put(b, num);
                }
            }
        }
}

static char *mono_str(const unsigned *e, int style, const gs_polyctx *ctx)
{
    sbuf b = {0, 0, 0};
    int first = 1;
    put(&b, "");
    put_mono(&b, e, style, &first, ctx);
    if (first)
        put(&b, "1");
    return b.s;
}

/* A product: |c|, the monomial, the factors, the parallel pairs. */
static void put_product(sbuf *b, const parts *pt, char **pars, size_t npar,
                        int style, const gs_polyctx *ctx)
{
    int first = 1;
    size_t i;
    gs_int a;
    char *c;
    gs_int_init(&a);
    gs_int_abs(&a, &pt->c);
    if (!gs_int_is_one(&a)) {
        c = gs_int_get_str(&a);
        put(b, c);
        gs_free(c);
        first = 0;
    }
    gs_int_clear(&a);
    put_mono(b, pt->mono, style, &first, ctx);
    for (i = 0; i < npar; i++) {
        if (!first)
            put(b, style == GS_FORM_LATEX ? " " : "*");
        first = 0;
        put(b, pars[i]);
    }
    for (i = 0; i < pt->nf; i++) {
        char *s = poly_str(&pt->f[i], style, ctx);
        if (!first)
            put(b, style == GS_FORM_LATEX ? " " : "*");
        first = 0;
        put(b, style == GS_FORM_LATEX ? "\\left(" : "(");
        put(b, s);
        put(b, style == GS_FORM_LATEX ? "\\right)" : ")");
        gs_free(s);
    }
    if (first)
        put(b, "1");
}

char *gs_approx_form(const gs_poly *num, const gs_poly *den, int style,
                     const gs_polyctx *ctx)
{
    parts pn, pd;
    sbuf b = {0, 0, 0};
    char **pars = NULL;
    size_t npar = 0, i, k;
    int v, neg, dtriv;
    unsigned *e1 = gs_calloc((size_t)ctx->nvars + 1, sizeof *e1);
    unsigned *e2 = gs_calloc((size_t)ctx->nvars + 1, sizeof *e2);
    put(&b, "");
    if (gs_poly_is_zero(num)) {
        put(&b, "0");
        gs_free(e1);
        gs_free(e2);
        return b.s;
    }
    decompose(&pn, num, ctx);
    decompose(&pd, den, ctx);
    /* a denominator factor u + w with u*w in the numerator's monomial */
    for (i = 0; i < pd.nf; i++) {
        gs_poly *f = &pd.f[i];
        int ok;
        if (f->length != 2 || !gs_int_is_one(&f->coeffs[0])
            || !gs_int_is_one(&f->coeffs[1]))
            continue;
        gs_poly_get_term_exps(e1, f, 0, ctx);
        gs_poly_get_term_exps(e2, f, 1, ctx);
        ok = 1;
        for (v = 0; v < ctx->nvars; v++)
            if (pn.mono[v] < e1[v] + e2[v])
                ok = 0;
        if (!ok)
            continue;
        {
            char *a = mono_str(e1, style, ctx), *c = mono_str(e2, style, ctx);
            char *t = style == GS_FORM_TEXT ? gs_asprintf("par(%s, %s)", a, c)
                : style == GS_FORM_PRETTY ? gs_asprintf("(%s||%s)", a, c)
                : gs_asprintf("\\left(%s \\parallel %s\\right)", a, c);
            gs_free(a);
            gs_free(c);
            pars = gs_reallocarray(pars, npar + 1, sizeof *pars);
            pars[npar++] = t;
        }
        for (v = 0; v < ctx->nvars; v++)
            pn.mono[v] -= e1[v] + e2[v];
        gs_poly_clear(f);
        for (k = i; k + 1 < pd.nf; k++)
            pd.f[k] = pd.f[k + 1];
        pd.nf--;
        i--;
    }
    neg = gs_int_sgn(&pn.c) * gs_int_sgn(&pd.c) < 0;
    dtriv = pd.nf == 0 && gs_int_is_one(&pd.c) == 0 ? 0 : pd.nf == 0;
    for (v = 0; v < ctx->nvars; v++)
        if (pd.mono[v])
            dtriv = 0;
    if (gs_int_cmp_si(&pd.c, 1) != 0 && gs_int_cmp_si(&pd.c, -1) != 0)
        dtriv = 0;
    if (neg)
        put(&b, "-");
    if (style == GS_FORM_LATEX && !dtriv) {
        put(&b, "\\frac{");
        put_product(&b, &pn, pars, npar, style, ctx);
        put(&b, "}{");
        put_product(&b, &pd, NULL, 0, style, ctx);
        put(&b, "}");
    } else {
        put_product(&b, &pn, pars, npar, style, ctx);
        if (!dtriv) {
            put(&b, "/(");
            put_product(&b, &pd, NULL, 0, style, ctx);
            put(&b, ")");
        }
    }
    for (i = 0; i < npar; i++)
        gs_free(pars[i]);
    gs_free(pars);
    parts_clear(&pn);
    parts_clear(&pd);
    gs_free(e1);
    gs_free(e2);
    return b.s;
}
