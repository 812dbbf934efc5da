/* print_json.c - a transfer function as one JSON object. See LICENSE.
 *
 * The layout is documented in docs/json.md; strings are written by
 * gs_json_string (json.h).
 */
#include "analysis/tf.h"
#include "base/mem.h"
#include "base/strbuf.h"
#include "output/json.h"

#include <stdlib.h>
#include <string.h>

static void json_name_or_null(FILE *out, const gs_polyctx *ctx, int var)
{
    if (var >= 0 && var < ctx->nvars)
        gs_json_string(out, gs_symtab_name(ctx->syms, var));
    else
        fputs("null", out);
}

/* "symbols": every symbol of num or den but s, in symbol order. */
static void put_symbols(FILE *out, const gs_tf *tf)
{
    const gs_polyctx *ctx = tf->ctx;
    unsigned char *used = gs_calloc((size_t)ctx->nvars + 1, 2);
    unsigned char *used_d = used + ctx->nvars + 1;
    int i, first = 1;
    gs_poly_used_vars(used, &tf->num, ctx);
    gs_poly_used_vars(used_d, &tf->den, ctx);
    fputc('[', out);
    for (i = 0; i < ctx->nvars; i++) {
        if (i == tf->s_var || !(used[i] || used_d[i]))
            continue;
        fputs(first ? "" : ", ", out);
        gs_json_string(out, gs_symtab_name(ctx->syms, i));
        first = 0;
    }
    fputc(']', out);
    gs_free(used);
}

/* A name that JSON takes as it is (printable ASCII but '"' and '\\'),
   appended without the string writer; any other name goes through
   gs_json_string after the buffer is written out, so the order holds. */
static void put_name(gs_strbuf *b, const char *name)
{
    const unsigned char *p = (const unsigned char *)name;
    while (*p >= 0x20 && *p < 0x7F && *p != '"' && *p != '\\')
        p++;
    if (*p == '\0') {
        gs_strbuf_addn(b, "\"", 1);
        gs_strbuf_add(b, name);
        gs_strbuf_addn(b, "\"", 1);
    } else {
        gs_strbuf_flush(b);
        gs_json_string(b->sink, name);
    }
}

/* c in decimal; a coefficient that fits a word without an allocation */
static void put_coeff(gs_strbuf *b, const gs_int *c)
{
    if (gs_int_is_small(c)) {
        int64_t v = c->u.v;
        if (v < 0)
            gs_strbuf_addn(b, "-", 1);
        gs_strbuf_add_u64(b, v < 0 ? 0 - (uint64_t)v : (uint64_t)v);
    } else {
        char *digits = gs_int_get_str(c);
        gs_strbuf_add(b, digits);
        gs_free(digits);
    }
}

/* {"power": k, "terms": [{"coeff": "-2", "exps": {"gm": 1}}, ...]} for
   the terms idx[0 .. n) of a, their power of x_skip left out (skip -1:
   none), streamed, each term's factors read from the packed words */
static void put_group(FILE *out, const gs_poly *a, const size_t *idx,
                      size_t n, long power, int skip, const gs_polyctx *ctx,
                      int *vars, unsigned *exps)
{
    gs_strbuf b;
    size_t i;
    int j, nf;
    gs_strbuf_init_sink(&b, out);
    gs_strbuf_add(&b, "{\"power\": ");
    if (power < 0)
        gs_strbuf_addn(&b, "-", 1);
    gs_strbuf_add_u64(&b, power < 0 ? 0 - (uint64_t)power : (uint64_t)power);
    gs_strbuf_add(&b, ", \"terms\": [");
    for (i = 0; i < n; i++) {
        size_t t = idx ? idx[i] : i;
        gs_strbuf_add(&b, i ? ", {\"coeff\": \"" : "{\"coeff\": \"");
        put_coeff(&b, &a->coeffs[t]);
        gs_strbuf_add(&b, "\", \"exps\": {");
        nf = gs_poly_term_factors(vars, exps, a, t, skip, ctx);
        for (j = 0; j < nf; j++) {
            if (j > 0)
                gs_strbuf_addn(&b, ", ", 2);
            put_name(&b, gs_symtab_name(ctx->syms, vars[j]));
            gs_strbuf_addn(&b, ": ", 2);
            gs_strbuf_add_u64(&b, exps[j]);
        }
        gs_strbuf_addn(&b, "}}", 2);
    }
    gs_strbuf_addn(&b, "]}", 2);
    gs_strbuf_flush(&b);
    gs_strbuf_clear(&b);
}

/* The groups of a by descending power of var (one group when var < 0),
   each read in place (gs_poly_group_by_var). */
static void put_poly(FILE *out, const gs_poly *a, int var,
                     const gs_polyctx *ctx)
{
    unsigned *exps = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *exps);
    int *vars = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *vars);
    int first = 1;
    fputc('[', out);
    if (var < 0 || var >= ctx->nvars) {
        if (!gs_poly_is_zero(a))
            put_group(out, a, NULL, a->length, 0, -1, ctx, vars, exps);
    } else if (!gs_poly_is_zero(a)) {
        size_t *start, *idx, k;
        size_t n = gs_poly_group_by_var(&idx, &start, a, var, ctx);
        for (k = n; k-- > 0;) {
            size_t lo = k ? start[k - 1] : 0;
            if (lo == start[k])
                continue;
            fputs(first ? "" : ", ", out);
            put_group(out, a, idx + lo, start[k] - lo, (long)k, var, ctx,
                      vars, exps);
            first = 0;
        }
        gs_free(idx);
        gs_free(start);
    }
    fputc(']', out);
    gs_free(vars);
    gs_free(exps);
}

void gs_print_json(FILE *out, const gs_tf *tf, int collect_var)
{
    fputs("{\"name\": ", out);
    gs_json_string(out, gs_tf_name(tf));
    fprintf(out, ", \"kind\": \"%s\", \"description\": ",
            tf->kind == GS_TF_IMPEDANCE ? "impedance" : "transfer");
    if (tf->description != NULL)
        gs_json_string(out, tf->description);
    else
        fputs("null", out);
    fputs(", \"s\": ", out);
    json_name_or_null(out, tf->ctx, tf->s_var);
    fputs(", \"collect\": ", out);
    json_name_or_null(out, tf->ctx, collect_var);
    fputs(", \"symbols\": ", out);
    put_symbols(out, tf);
    fputs(", \"num\": ", out);
    put_poly(out, &tf->num, collect_var, tf->ctx);
    fputs(", \"den\": ", out);
    put_poly(out, &tf->den, collect_var, tf->ctx);
    fputs(", \"text\": ", out);
    gs_print_text_json(out, tf, collect_var);
    fputc('}', out);
}
