/* poly_print.c - polynomials as plain text, and back. See LICENSE.
 *
 * The text is what people and general-purpose algebra systems type:
 * "3*x^2*y - 2*z + 1".  A reciprocal symbol "1/R" prints in parentheses,
 * "(1/R)", so that the text stays a product of powers.
 */
#include "algebra/poly.h"

#include "gainsmith.h"
#include "base/mem.h"
#include "base/strbuf.h"

#include <assert.h>
#include <ctype.h>
#include <stdlib.h>
#include <string.h>

int gs_poly_term_factors(int *vars, unsigned *exps, const gs_poly *a,
                         size_t i, int skip, const gs_polyctx *ctx)
{
    const uint64_t *e = a->exps + i * (size_t)ctx->nwords;
    int w, f, n = 0, nw = ctx->nwords;  /* a local: vars may alias ctx */
    int skip_w = skip >= 0 ? skip / GS_POLY_VARS_PER_WORD : -1;
    uint64_t keep = skip >= 0
        ? ~(GS_POLY_FIELD_MASK << gs_poly_field_shift(skip)) : ~UINT64_C(0);
    for (w = 0; w < nw; w++) {
        uint64_t x = w == skip_w ? e[w] & keep : e[w];
        if (x == 0)
            continue;
        /* every field is stored and the count moves on past the
           nonzero ones only: no branch on the exponents, whose pattern
           a branch predictor cannot learn */
        for (f = 0; f < GS_POLY_VARS_PER_WORD; f++) {
            unsigned k = (unsigned)((x >> (GS_POLY_FIELD_BITS
                                           * (GS_POLY_VARS_PER_WORD - 1 - f)))
                                    & GS_POLY_FIELD_MASK);
            vars[n] = w * GS_POLY_VARS_PER_WORD + f;
            exps[n] = k;
            n += k != 0;
        }
    }
    return n;
}

/* The n factors of a term, "x^2*(1/R)*y". */
static void put_monomial(gs_strbuf *b, const int *vars, const unsigned *exps,
                         int n, const gs_polyctx *ctx)
{
    int j;
    for (j = 0; j < n; j++) {
        const char *name = gs_symtab_name(ctx->syms, vars[j]);
        if (j > 0)
            gs_strbuf_addn(b, "*", 1);
        if (gs_symtab_is_recip(ctx->syms, vars[j])) {
            gs_strbuf_addn(b, "(", 1);
            gs_strbuf_add(b, name);
            gs_strbuf_addn(b, ")", 1);
        } else {
            gs_strbuf_add(b, name);
        }
        if (exps[j] > 1) {
            gs_strbuf_addn(b, "^", 1);
            gs_strbuf_add_u64(b, exps[j]);
        }
    }
}

/* |c| in decimal; a coefficient that fits a word without an allocation */
static void put_abs(gs_strbuf *b, const gs_int *c)
{
    if (gs_int_is_small(c)) {
        int64_t v = c->u.v;
        gs_strbuf_add_u64(b, v < 0 ? 0 - (uint64_t)v : (uint64_t)v);
    } else {
        char *digits = gs_int_get_str(c);
        gs_strbuf_add(b, digits + (digits[0] == '-'));
        gs_free(digits);
    }
}

char *gs_poly_get_str(const gs_poly *a, const gs_polyctx *ctx)
{
    gs_strbuf b;
    size_t i, room = (size_t)ctx->nvars + 1;
    int *vars = gs_malloc(room * sizeof *vars);
    unsigned *exps = gs_malloc(room * sizeof *exps);
    gs_strbuf_init(&b);
    gs_strbuf_add(&b, a->length == 0 ? "0" : "");
    for (i = 0; i < a->length; i++) {
        const gs_int *c = &a->coeffs[i];
        int neg = gs_int_sgn(c) < 0;
        int n = gs_poly_term_factors(vars, exps, a, i, -1, ctx);
        if (i == 0)
            gs_strbuf_add(&b, neg ? "-" : "");
        else
            gs_strbuf_add(&b, neg ? " - " : " + ");
        if (n == 0 || !(gs_int_is_one(c) || gs_int_cmp_si(c, -1) == 0)) {
            put_abs(&b, c);
            if (n > 0)
                gs_strbuf_addn(&b, "*", 1);
        }
        put_monomial(&b, vars, exps, n, ctx);
    }
    gs_free(vars);
    gs_free(exps);
    return b.p;
}

void gs_poly_print(FILE *out, const gs_poly *a, const gs_polyctx *ctx)
{
    char *s = gs_poly_get_str(a, ctx);
    fputs(s, out);
    gs_free(s);
}

/* Recursive descent over
     expr   = term { ("+" | "-") term }
     term   = factor { "*" factor }
     factor = ("+" | "-") factor | primary [ ("^" | "**") power ]
     power  = digits | "(" digits ")"
     primary = digits | name | "(" "1/" name ")" | "(" expr ")"
   building the polynomial as it goes. */
typedef struct parser {
    const char *s;
    const gs_polyctx *ctx;
    unsigned *da, *db;      /* scratch degree vectors */
    int depth;              /* nesting, bounded to keep the stack small */
} parser;

#define MAX_NESTING 200

static void skip_space(parser *p)
{
    while (*p->s == ' ' || *p->s == '\t' || *p->s == '\n' || *p->s == '\r')
        p->s++;
}

static int accept(parser *p, const char *tok)
{
    size_t n = strlen(tok);
    skip_space(p);
    if (strncmp(p->s, tok, n) != 0)
        return 0;
    p->s += n;
    return 1;
}

static size_t name_len(const char *s)
{
    size_t n = 0;
    if (!(isalpha((unsigned char)s[0]) || s[0] == '_'))
        return 0;
    while (isalnum((unsigned char)s[n]) || s[n] == '_')
        n++;
    return n;
}

static int parse_expr(parser *p, gs_poly *r);

static int parse_number(parser *p, gs_poly *r)
{
    size_t n = 0;
    char *digits;
    gs_int c;
    int rc;
    while (isdigit((unsigned char)p->s[n]))
        n++;
    digits = gs_malloc(n + 1);      /* not strndup: it measures the rest */
    memcpy(digits, p->s, n);
    digits[n] = '\0';
    p->s += n;
    gs_int_init(&c);
    rc = gs_int_set_str(&c, digits);
    if (rc == GS_OK)
        gs_poly_set_int(r, &c, p->ctx);
    gs_int_clear(&c);
    gs_free(digits);
    return rc;
}

/* a symbol of the context named by the n bytes at s (prefixed by pre) */
static int lookup(parser *p, const char *pre, const char *s, size_t n,
                  gs_poly *r)
{
    char *name = gs_asprintf("%s%.*s", pre, (int)n, s);
    int id = gs_symtab_find(p->ctx->syms, name);
    gs_free(name);
    if (id < 0 || id >= p->ctx->nvars)
        return GS_EINVAL;
    gs_poly_set_var(r, id, 1, p->ctx);
    return GS_OK;
}

static int parse_primary(parser *p, gs_poly *r)
{
    size_t n;
    int rc;
    skip_space(p);
    if (isdigit((unsigned char)*p->s))
        return parse_number(p, r);
    n = name_len(p->s);
    if (n > 0) {
        rc = lookup(p, "", p->s, n, r);
        p->s += n;
        return rc;
    }
    if (!accept(p, "(") || p->depth >= MAX_NESTING)
        return GS_ESYNTAX;
    skip_space(p);
    if (strncmp(p->s, "1/", 2) == 0 && (n = name_len(p->s + 2)) > 0) {
        rc = lookup(p, "1/", p->s + 2, n, r);
        p->s += 2 + n;
    } else {
        p->depth++;
        rc = parse_expr(p, r);
        p->depth--;
    }
    if (rc == GS_OK && !accept(p, ")"))
        rc = GS_ESYNTAX;
    return rc;
}

static int parse_power(parser *p, unsigned long *e)
{
    int paren = accept(p, "(");
    unsigned long v = 0;
    skip_space(p);
    if (!isdigit((unsigned char)*p->s))
        return GS_ESYNTAX;
    while (isdigit((unsigned char)*p->s)) {
        v = v * 10 + (unsigned long)(*p->s++ - '0');
        if (v > GS_POLY_MAX_EXP)
            return GS_ERANGE;
    }
    if (paren && !accept(p, ")"))
        return GS_ESYNTAX;
    *e = v;
    return GS_OK;
}

/* GS_ERANGE unless every degree of a (times k) plus b stays in range */
static int degrees_fit(parser *p, const gs_poly *a, unsigned long k,
                       const gs_poly *b)
{
    int v;
    gs_poly_degrees(p->da, a, p->ctx);
    if (b != NULL)
        gs_poly_degrees(p->db, b, p->ctx);
    for (v = 0; v < p->ctx->nvars; v++) {
        unsigned long d = (unsigned long)p->da[v] * k
            + (b != NULL ? p->db[v] : 0);
        if (d > GS_POLY_MAX_EXP)
            return GS_ERANGE;
    }
    return GS_OK;
}

static int parse_factor(parser *p, gs_poly *r)
{
    unsigned long e;
    int rc;
    if (accept(p, "-") || accept(p, "+")) {
        int neg = p->s[-1] == '-';
        if (p->depth >= MAX_NESTING)
            return GS_ESYNTAX;
        p->depth++;
        rc = parse_factor(p, r);
        p->depth--;
        if (neg)
            gs_poly_neg(r, r, p->ctx);
        return rc;
    }
    rc = parse_primary(p, r);
    if (rc != GS_OK)
        return rc;
    if (accept(p, "**") || accept(p, "^")) {
        rc = parse_power(p, &e);
        if (rc == GS_OK)
            rc = degrees_fit(p, r, e, NULL);
        if (rc == GS_OK)
            gs_poly_pow_ui(r, r, e, p->ctx);
    }
    return rc;
}

static int parse_term(parser *p, gs_poly *r)
{
    gs_poly f;
    int rc = parse_factor(p, r);
    gs_poly_init(&f);
    while (rc == GS_OK) {
        skip_space(p);
        if (p->s[0] != '*' || p->s[1] == '*')
            break;
        p->s++;
        rc = parse_factor(p, &f);
        if (rc == GS_OK)
            rc = degrees_fit(p, r, 1, &f);
        if (rc == GS_OK)
            gs_poly_mul(r, r, &f, p->ctx);
    }
    gs_poly_clear(&f);
    return rc;
}

/* Move the terms of t, negated if neg, onto the end of r, unsorted. */
static void append_terms(gs_poly *r, gs_poly *t, int neg,
                         const gs_polyctx *ctx)
{
    size_t i, nw = (size_t)ctx->nwords;
    if (t->length == 0)
        return;         /* "0": r may have no storage yet to copy into */
    gs_poly_fit(r, r->length + t->length, ctx);
    memcpy(r->exps + r->length * nw, t->exps, t->length * nw * 8);
    for (i = 0; i < t->length; i++) {
        gs_int *c = &r->coeffs[r->length + i];
        gs_int_init(c);
        gs_int_swap(c, &t->coeffs[i]);
        if (neg)
            gs_int_neg(c, c);
    }
    r->length += t->length;
    gs_poly_zero(t);
}

/* A long sum is collected unsorted and put in order once at the end:
   adding term by term would take quadratic time. */
static int parse_expr(parser *p, gs_poly *r)
{
    gs_poly t, sum;
    int rc, neg = 0;
    gs_poly_init(&t);
    gs_poly_init(&sum);
    for (;;) {
        rc = parse_term(p, &t);
        if (rc != GS_OK)
            break;
        append_terms(&sum, &t, neg, p->ctx);
        if (accept(p, "+"))
            neg = 0;
        else if (accept(p, "-"))
            neg = 1;
        else
            break;
    }
    if (rc == GS_OK) {
        gs_poly_canonicalise(&sum, p->ctx);
        gs_poly_swap(r, &sum);
    }
    gs_poly_clear(&t);
    gs_poly_clear(&sum);
    return rc;
}

int gs_poly_set_str(gs_poly *r, const char *s, const gs_polyctx *ctx)
{
    parser p;
    gs_poly t;
    int rc;
    p.s = s;
    p.ctx = ctx;
    p.depth = 0;
    p.da = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *p.da);
    p.db = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *p.db);
    gs_poly_init(&t);
    rc = parse_expr(&p, &t);
    skip_space(&p);
    if (rc == GS_OK && *p.s != '\0')
        rc = GS_ESYNTAX;
    if (rc == GS_OK)
        gs_poly_swap(r, &t);
    gs_poly_clear(&t);
    gs_free(p.da);
    gs_free(p.db);
    return rc;
}
