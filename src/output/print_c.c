/* print_c.c - a transfer function as a self-contained C99 function.
 * See LICENSE.
 *
 * The function takes s and a struct of the other symbols and returns
 * N(s)/D(s), each evaluated by Horner's rule in s (Knuth, TAOCP vol. 2,
 * 4.6.4), each coefficient a sum of products of the parameters with the
 * exact integer coefficients written as double literals.  Names that are
 * not usable as C identifiers are mangled (docs/output.md).
 */
#include "analysis/tf.h"
#include "base/mem.h"
#include "base/strbuf.h"

#include <ctype.h>
#include <stdlib.h>
#include <string.h>

#define C_COLS 78           /* wrap generated lines past this column */

/* Words a generated name must not be: C99, C11 and C23 keywords that do
   not start with an underscore, the macros of <complex.h>, and, for the
   function's own name, its parameters, locals and main. */
static const char *const reserved[] = {
    "auto", "break", "case", "char", "const", "continue", "default", "do",
    "double", "else", "enum", "extern", "float", "for", "goto", "if",
    "inline", "int", "long", "register", "restrict", "return", "short",
    "signed", "sizeof", "static", "struct", "switch", "typedef", "union",
    "unsigned", "void", "volatile", "while", "bool", "true", "false",
    "nullptr", "alignas", "alignof", "static_assert", "thread_local",
    "constexpr", "typeof", "typeof_unqual", "I", "complex", "imaginary"
};
static const char *const reserved_fn[] = { "s", "p", "n", "d", "main" };

static int in_list(const char *s, const char *const *list, size_t n)
{
    size_t i;
    for (i = 0; i < n; i++)
        if (strcmp(s, list[i]) == 0)
            return 1;
    return 0;
}

/* name as a C identifier: other characters become '_', a name that does
   not start with a letter gets "x_" in front, a reserved word a '_'
   after.  A reciprocal symbol 1/R becomes inv_R. */
static char *c_ident(const char *name, int is_function)
{
    size_t n = strlen(name), i;
    char *t = gs_malloc(n + 8), *p = t;
    if (strncmp(name, "1/", 2) == 0 && name[2] != '\0') {
        memcpy(p, "inv_", 4);
        p += 4;
        name += 2;
    } else if (!isalpha((unsigned char)name[0])) {
        memcpy(p, "x_", 2);
        p += 2;
    }
    for (i = 0; name[i]; i++)
        *p++ = isalnum((unsigned char)name[i]) ? name[i] : '_';
    *p = '\0';
    if (in_list(t, reserved, sizeof reserved / sizeof reserved[0])
        || (is_function && in_list(t, reserved_fn, sizeof reserved_fn
                                   / sizeof reserved_fn[0])))
        strcat(t, "_");
    return t;
}

/* The parameters: symbols of num or den other than s, in symbol order,
   with distinct C names (a clash after mangling gets _2, _3, ...). */
typedef struct params {
    int nvars;
    char **cname;           /* per variable; NULL when not a parameter */
} params;

static int name_taken(const params *ps, int upto, const char *t)
{
    int i;
    for (i = 0; i < upto; i++)
        if (ps->cname[i] != NULL && strcmp(ps->cname[i], t) == 0)
            return 1;
    return 0;
}

static void params_init(params *ps, const gs_tf *tf)
{
    const gs_polyctx *ctx = tf->ctx;
    unsigned char *used = gs_calloc((size_t)ctx->nvars + 1, 2);
    unsigned char *used_d = used + ctx->nvars + 1;
    int i, k;
    ps->nvars = ctx->nvars;
    ps->cname = gs_calloc((size_t)ctx->nvars + 1, sizeof *ps->cname);
    gs_poly_used_vars(used, &tf->num, ctx);
    gs_poly_used_vars(used_d, &tf->den, ctx);
    for (i = 0; i < ctx->nvars; i++) {
        char *t;
        if (i == tf->s_var || !(used[i] || used_d[i]))
            continue;
        t = c_ident(gs_symtab_name(ctx->syms, i), 0);
        for (k = 2; name_taken(ps, i, t); k++) {
            char *base = c_ident(gs_symtab_name(ctx->syms, i), 0);
            gs_free(t);
            t = gs_asprintf("%s_%d", base, k);
            gs_free(base);
        }
        ps->cname[i] = t;
    }
    gs_free(used);
}

static void params_clear(params *ps)
{
    int i;
    for (i = 0; i < ps->nvars; i++)
        gs_free(ps->cname[i]);
    gs_free(ps->cname);
}

/* Text safe inside a C comment: printable ASCII without a comment end. */
static int comment_safe(const char *s)
{
    for (; *s; s++)
        if ((unsigned char)*s < 0x20 || (unsigned char)*s >= 0x7F
            || (s[0] == '*' && s[1] == '/'))
            return 0;
    return 1;
}

/* Output that wraps before a piece that would pass C_COLS, streamed
   through a buffer (a result of millions of terms needs no string of
   its size), and the scratch one term is written in. */
typedef struct cout {
    gs_strbuf b;            /* sink: the output */
    gs_strbuf term;
    size_t col;
    const params *ps;
    const gs_polyctx *ctx;
    int s_var;
    int *vars;              /* nvars + 1 each: gs_poly_term_factors */
    unsigned *exps;
} cout;

static void cout_init(cout *o, FILE *out, const params *ps,
                      const gs_polyctx *ctx, int s_var)
{
    gs_strbuf_init_sink(&o->b, out);
    gs_strbuf_init(&o->term);
    o->col = 0;
    o->ps = ps;
    o->ctx = ctx;
    o->s_var = s_var;
    o->vars = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *o->vars);
    o->exps = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *o->exps);
}

static void cout_clear(cout *o)
{
    gs_strbuf_flush(&o->b);
    gs_strbuf_clear(&o->b);
    gs_strbuf_clear(&o->term);
    gs_free(o->vars);
    gs_free(o->exps);
}

static void cout_text(cout *o, const char *text)
{
    gs_strbuf_add(&o->b, text);
}

static void cout_piece(cout *o, const char *sep, const char *piece,
                       size_t np)
{
    size_t ns = strlen(sep);
    if (o->col + ns + np > C_COLS && o->col > 8) {
        while (ns > 0 && *sep == ' ') {
            sep++;
            ns--;
        }
        gs_strbuf_addn(&o->b, "\n        ", 9);
        o->col = 8;
    }
    gs_strbuf_addn(&o->b, sep, ns);
    gs_strbuf_addn(&o->b, piece, np);
    o->col += ns + np;
}

/* Term i of a as C into o->term: "2.0*p->gm*p->RD", "p->gm", "1.0"
   (sign separate), its power of s left out.  The factors come straight
   from the packed words and small coefficients need no string. */
static void term_c(cout *o, const gs_poly *a, size_t i)
{
    const gs_int *c = &a->coeffs[i];
    gs_strbuf *t = &o->term;
    int n = gs_poly_term_factors(o->vars, o->exps, a, i, o->s_var, o->ctx);
    int j, unit = gs_int_is_small(c) && (c->u.v == 1 || c->u.v == -1);
    unsigned e;
    t->n = 0;
    t->p[0] = '\0';
    if (n == 0 || !unit) {
        if (gs_int_is_small(c)) {
            int64_t v = c->u.v;
            gs_strbuf_add_u64(t, v < 0 ? 0 - (uint64_t)v : (uint64_t)v);
        } else {
            char *digits = gs_int_get_str(c);
            gs_strbuf_add(t, digits[0] == '-' ? digits + 1 : digits);
            gs_free(digits);
        }
        gs_strbuf_addn(t, ".0", 2);
    }
    for (j = 0; j < n; j++) {
        const char *name = o->ps->cname[o->vars[j]];
        size_t len = strlen(name);
        for (e = 0; e < o->exps[j]; e++) {
            if (t->n > 0)
                gs_strbuf_addn(t, "*", 1);
            gs_strbuf_addn(t, "p->", 3);
            gs_strbuf_addn(t, name, len);
        }
    }
}

/* Does some coefficient of the group need more than a double's 53
   bits? */
static int has_big(const gs_poly *a, const size_t *idx, size_t n)
{
    size_t i;
    for (i = 0; i < n; i++)
        if (gs_int_bits(&a->coeffs[idx[i]]) > 53)
            return 1;
    return 0;
}

/* The sum of a's terms idx[0 .. n), continuing a line of o ("first": no
   leading +). */
static void put_sum(cout *o, const gs_poly *a, const size_t *idx, size_t n,
                    int first)
{
    size_t i;
    for (i = 0; i < n; i++) {
        int neg = gs_int_sgn(&a->coeffs[idx[i]]) < 0;
        term_c(o, a, idx[i]);
        if (first && i == 0)
            cout_piece(o, neg ? "-" : "", o->term.p, o->term.n);
        else
            cout_piece(o, neg ? " - " : " + ", o->term.p, o->term.n);
    }
}

/* One Horner step over the terms idx[0 .. n) of a: "v = C;" at the top,
   then "v = v*s + C;". */
static void horner_step(cout *o, const gs_poly *a, const size_t *idx,
                        size_t n, char v, int top)
{
    char lead[16];
    o->col = 0;
    if (has_big(a, idx, n))
        cout_text(o, "    /* coefficients of 2^53 or more round to "
                     "double */\n");
    if (top)
        snprintf(lead, sizeof lead, "    %c = ", v);
    else
        snprintf(lead, sizeof lead, "    %c = %c*s", v, v);
    cout_piece(o, "", lead, strlen(lead));
    if (top && n == 0)
        cout_piece(o, "", "0.0", 3);
    else
        put_sum(o, a, idx, n, top);
    cout_text(o, ";\n");
}

/* a by Horner's rule in s: its terms grouped by their power of s
   (gs_poly_group_by_var), each coefficient read in place. */
static void put_horner(cout *o, const gs_poly *a, char v)
{
    const gs_polyctx *ctx = o->ctx;
    size_t n, i, k, nt = a->length, *idx, *start;
    int s_var = o->s_var;
    if (s_var < 0 || s_var >= ctx->nvars || nt == 0) {
        idx = gs_malloc((nt + 1) * sizeof *idx);
        for (i = 0; i < nt; i++)
            idx[i] = i;
        horner_step(o, a, idx, nt, v, 1);
        gs_free(idx);
        return;
    }
    n = gs_poly_group_by_var(&idx, &start, a, s_var, ctx);
    for (k = n; k-- > 0;) {
        size_t lo = k ? start[k - 1] : 0;
        horner_step(o, a, idx + lo, start[k] - lo, v, k == n - 1);
    }
    gs_free(start);
    gs_free(idx);
}

static void put_struct(FILE *out, const params *ps, const char *fn,
                       const gs_polyctx *ctx)
{
    int i, any = 0;
    fprintf(out, "struct %s_params {\n", fn);
    for (i = 0; i < ps->nvars; i++) {
        const char *orig;
        if (ps->cname[i] == NULL)
            continue;
        orig = gs_symtab_name(ctx->syms, i);
        fprintf(out, "    double %s;", ps->cname[i]);
        if (strcmp(orig, ps->cname[i]) != 0 && comment_safe(orig))
            fprintf(out, "  /* %s */", orig);
        fputc('\n', out);
        any = 1;
    }
    if (!any)
        fputs("    char unused;    /* no symbols but s */\n", out);
    fputs("};\n\n", out);
}

static int s_occurs(const gs_tf *tf)
{
    const gs_polyctx *ctx = tf->ctx;
    if (tf->s_var < 0 || tf->s_var >= ctx->nvars)
        return 0;
    return gs_poly_degree(&tf->num, tf->s_var, ctx) > 0
           || gs_poly_degree(&tf->den, tf->s_var, ctx) > 0;
}

static void put_header(FILE *out, const gs_tf *tf, const char *fn)
{
    const char *name = gs_tf_name(tf);
    fputs("/* ", out);
    if (comment_safe(name))
        fprintf(out, "%s", name);
    else
        fputs(fn, out);
    if (tf->description != NULL && comment_safe(tf->description))
        fprintf(out, " = %s", tf->description);
    fprintf(out, " (%s), generated by gainsmith.\n",
            tf->kind == GS_TF_IMPEDANCE ? "impedance" : "transfer");
    fputs(gs_poly_is_one(&tf->den, tf->ctx)
          ? "   N(s), a polynomial, by Horner's rule in s. */\n"
          : "   N(s)/D(s), each by Horner's rule in s. */\n", out);
    fputs("#include <complex.h>\n\n", out);
}

void gs_print_c(FILE *out, const gs_tf *tf)
{
    char *fn = c_ident(gs_tf_name(tf), 1);
    params ps;
    cout o;
    int i, any = 0;

    params_init(&ps, tf);
    put_header(out, tf, fn);
    put_struct(out, &ps, fn, tf->ctx);
    fprintf(out, "double complex %s(double complex s, "
            "const struct %s_params *p);\n\n", fn, fn);
    fprintf(out, "double complex %s(double complex s, "
            "const struct %s_params *p)\n{\n", fn, fn);
    int poly = gs_poly_is_one(&tf->den, tf->ctx);
    fputs(poly ? "    double complex n;\n\n" : "    double complex n, d;\n\n",
          out);
    for (i = 0; i < ps.nvars; i++)
        any |= ps.cname[i] != NULL;
    if (!s_occurs(tf))
        fputs("    (void)s;\n", out);
    if (!any)
        fputs("    (void)p;\n", out);
    cout_init(&o, out, &ps, tf->ctx, tf->s_var);
    put_horner(&o, &tf->num, 'n');
    if (!poly)
        put_horner(&o, &tf->den, 'd');
    cout_clear(&o);
    /* D = 1: H is the polynomial N */
    fputs(poly ? "    return n;\n}\n" : "    return n / d;\n}\n", out);
    params_clear(&ps);
    gs_free(fn);
}
