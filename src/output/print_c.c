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

/* Output that wraps before a piece that would pass C_COLS. */
typedef struct cout {
    FILE *f;
    size_t col;
} cout;

static void cout_piece(cout *o, const char *sep, const char *piece)
{
    size_t ns = strlen(sep), np = strlen(piece);
    if (o->col + ns + np > C_COLS && o->col > 8) {
        while (ns > 0 && *sep == ' ') {
            sep++;
            ns--;
        }
        fputs("\n        ", o->f);
        o->col = 8;
    }
    fputs(sep, o->f);
    fputs(piece, o->f);
    o->col += ns + np;
}

/* One term as C: "2.0*p->gm*p->RD", "p->gm", "1.0" (sign separate). */
static char *term_c(const params *ps, const gs_int *c, const unsigned *exps)
{
    char *digits = gs_int_get_str(c), *t;
    const char *mag = digits[0] == '-' ? digits + 1 : digits;
    size_t len = 0, cap = strlen(mag) + 8;
    int i, any = 0;
    unsigned e;
    t = gs_malloc(cap);
    t[0] = '\0';
    for (i = 0; i < ps->nvars; i++)
        any |= exps[i] != 0 && ps->cname[i] != NULL;
    if (!any || strcmp(mag, "1") != 0)
        len += (size_t)sprintf(t, "%s.0", mag);
    for (i = 0; i < ps->nvars; i++) {
        if (ps->cname[i] == NULL)
            continue;
        for (e = 0; e < exps[i]; e++) {
            size_t need = len + strlen(ps->cname[i]) + 5;
            if (need > cap) {
                cap = 2 * need;
                t = gs_realloc(t, cap);
            }
            len += (size_t)sprintf(t + len, "%sp->%s", len ? "*" : "",
                                   ps->cname[i]);
        }
    }
    gs_free(digits);
    return t;
}

/* Does some coefficient need more than a double's 53 bits? */
static int has_big(const gs_poly *c)
{
    size_t i;
    for (i = 0; i < c->length; i++)
        if (gs_int_bits(&c->coeffs[i]) > 53)
            return 1;
    return 0;
}

/* The sum of c's terms, continuing a line of o ("first": no leading +). */
static void put_sum(cout *o, const params *ps, const gs_poly *c, int first,
                    const gs_polyctx *ctx)
{
    unsigned *exps = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *exps);
    size_t i;
    for (i = 0; i < c->length; i++) {
        int neg = gs_int_sgn(&c->coeffs[i]) < 0;
        char *t;
        gs_poly_get_term_exps(exps, c, i, ctx);
        t = term_c(ps, &c->coeffs[i], exps);
        if (first && i == 0)
            cout_piece(o, neg ? "-" : "", t);
        else
            cout_piece(o, neg ? " - " : " + ", t);
        gs_free(t);
    }
    gs_free(exps);
}

/* One Horner step: "v = C;" at the top, then "v = v*s + C;". */
static void horner_step(FILE *out, const params *ps, const gs_poly *c,
                        char v, int top, const gs_polyctx *ctx)
{
    cout o;
    char lead[16];
    o.f = out;
    o.col = 0;
    if (has_big(c))
        fputs("    /* coefficients of 2^53 or more round to double */\n",
              out);
    if (top)
        snprintf(lead, sizeof lead, "    %c = ", v);
    else
        snprintf(lead, sizeof lead, "    %c = %c*s", v, v);
    cout_piece(&o, "", lead);
    if (top && gs_poly_is_zero(c))
        cout_piece(&o, "", "0.0");
    else
        put_sum(&o, ps, c, top, ctx);
    fputs(";\n", out);
}

static void put_horner(FILE *out, const params *ps, const gs_poly *a, char v,
                       int s_var, const gs_polyctx *ctx)
{
    size_t n, i;
    gs_poly *c;
    if (s_var < 0 || s_var >= ctx->nvars || gs_poly_is_zero(a)) {
        horner_step(out, ps, a, v, 1, ctx);
        return;
    }
    n = (size_t)gs_poly_degree(a, s_var, ctx) + 1;
    c = gs_malloc(n * sizeof *c);
    for (i = 0; i < n; i++)
        gs_poly_init(&c[i]);
    gs_poly_coeffs_var(c, n, a, s_var, ctx);
    for (i = n; i-- > 0;)
        horner_step(out, ps, &c[i], v, i == n - 1, ctx);
    for (i = 0; i < n; i++)
        gs_poly_clear(&c[i]);
    gs_free(c);
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
    put_horner(out, &ps, &tf->num, 'n', tf->s_var, tf->ctx);
    if (poly) {
        /* D = 1: H is the polynomial N */
        fputs("    return n;\n}\n", out);
    } else {
        put_horner(out, &ps, &tf->den, 'd', tf->s_var, tf->ctx);
        fputs("    return n / d;\n}\n", out);
    }
    params_clear(&ps);
    gs_free(fn);
}
