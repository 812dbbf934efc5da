/* print_text.c - text, 2-D text and LaTeX forms of a transfer function.
 * See LICENSE.
 *
 * All three write N and D as sums over the powers of a collecting
 * variable (normally s), highest power first: a power whose coefficient
 * is one term reads "C*R*s^2", one with several "(C*R*RD + 1)*s^2", and
 * the power 0 comes last, its terms written out.  Within a coefficient
 * the terms keep the canonical order of poly.h, so output is determined
 * by the polynomials alone.  docs/output.md describes the formats.
 */
#include "analysis/tf.h"
#include "base/mem.h"
#include "base/strbuf.h"
#include "output/json.h"

#include <ctype.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#define PRETTY_COLS 79      /* longest line of the 2-D form, if it can */
#define PRETTY_MIN 20       /* narrowest block it wraps to */

/* A growing string that also records where a line may be broken: at the
   space that starts each " + " or " - " between terms. */
typedef struct sbuf {
    gs_strbuf s;
    size_t *brk;
    size_t nbrk, capbrk;
    int streamed;           /* 1: s has a sink, no breaks are kept */
    int measured;           /* 1: the text is dropped, its breaks kept */
    size_t given;           /* bytes of text already dropped */
    /* Streamed with line breaks: cut[j] nonzero ends a line at break j
       (NULL: none), nseen the breaks passed so far. */
    const unsigned char *cut;
    size_t nseen;
} sbuf;

/* How names, products, powers and groups are spelt. */
typedef struct style {
    int latex;              /* 0 text; 1 LaTeX; 2 LaTeX with plain
                               parentheses, which may hold a line break */
    char **names;           /* per variable, owned, NAME_PAD zeros after */
    size_t *lens;           /* their lengths */
    size_t longest;         /* the longest */
    const char *mul;        /* the product sign (2 bytes or more with its
                               NUL, copied 2 at once), its length */
    size_t mul_len;
    int *vars;              /* a term's factors (gs_poly_term_factors): */
    unsigned *exps;         /* scratch, room for nvars + 1 */
    const gs_polyctx *ctx;
} style;

static void sb_init(sbuf *b)
{
    gs_strbuf_init(&b->s);
    b->brk = NULL;
    b->nbrk = b->capbrk = 0;
    b->streamed = 0;
    b->measured = 0;
    b->given = 0;
    b->cut = NULL;
    b->nseen = 0;
}

/* Text written to out as it is made, in 64 KiB pieces. */
static void sb_init_stream(sbuf *b, FILE *out)
{
    sb_init(b);
    gs_strbuf_clear(&b->s);
    gs_strbuf_init_sink(&b->s, out);
    b->streamed = 1;
}

static void count_piece(void *given, const char *p, size_t n)
{
    (void)p;
    *(size_t *)given += n;
}

/* Text only measured: its break points are kept (as offsets in the
   whole text), the text itself is dropped 64 KiB at a time. */
static void sb_init_measure(sbuf *b)
{
    sb_init(b);
    gs_strbuf_clear(&b->s);
    gs_strbuf_init_put(&b->s, count_piece, &b->given);
    b->measured = 1;
}

/* The length of the text so far. */
static size_t sb_length(const sbuf *b)
{
    return b->given + b->s.n;
}

static void sb_free(sbuf *b)
{
    gs_strbuf_clear(&b->s);
    gs_free(b->brk);
}

static void sb_putn(sbuf *b, const char *s, size_t n)
{
    gs_strbuf_addn(&b->s, s, n);
}

static void sb_puts(sbuf *b, const char *s)
{
    gs_strbuf_add(&b->s, s);
}

/* A place where the line may break; nonzero when b's cut list ends the
   line here. */
static int sb_mark_break(sbuf *b)
{
    if (b->streamed && !b->measured)
        return b->cut != NULL && b->cut[b->nseen++];
    if (b->nbrk == b->capbrk) {
        b->capbrk = b->capbrk ? 2 * b->capbrk : 16;
        b->brk = gs_reallocarray(b->brk, b->capbrk, sizeof *b->brk);
    }
    b->brk[b->nbrk++] = sb_length(b);
    return 0;
}

static int is_identifier(const char *s)
{
    if (!isalpha((unsigned char)*s))
        return 0;
    for (s++; *s; s++)
        if (!isalnum((unsigned char)*s) && *s != '_')
            return 0;
    return 1;
}

/* A name that gs_sym_latex_name cannot take (not an identifier) in
   upright type, with the characters LaTeX reserves escaped. */
static char *latex_escape(const char *name)
{
    sbuf b;
    char one[2] = {0, 0};
    sb_init(&b);
    sb_puts(&b, "\\mathrm{");
    for (; *name; name++) {
        unsigned char c = (unsigned char)*name;
        if (c == ' ')
            sb_puts(&b, "\\ ");
        else if (strchr("#$%&_{}", c) != NULL) {
            one[0] = (char)c;
            sb_puts(&b, "\\");
            sb_puts(&b, one);
        } else if (c < 0x20 || c >= 0x7F || strchr("\\^~", c) != NULL) {
            sb_puts(&b, "?");
        } else {
            one[0] = (char)c;
            sb_puts(&b, one);
        }
    }
    sb_puts(&b, "}");
    gs_free(b.brk);
    return b.s.p;
}

/* LaTeX for a plain name.  The "{}" that gs_sym_latex_name puts after a
   bare Greek letter is dropped: here a name is always followed by a
   space, a thin space, a superscript or the end of a group. */
static char *latex_plain(const char *name)
{
    char *t;
    size_t n;
    if (!is_identifier(name))
        return latex_escape(name);
    t = gs_sym_latex_name(name);
    n = strlen(t);
    if (n > 2 && strcmp(t + n - 2, "{}") == 0)
        t[n - 2] = '\0';
    return t;
}

static char *var_name(const style *st, int id)
{
    const gs_symtab *syms = st->ctx->syms;
    int base = gs_symtab_base(syms, id);
    char *inner, *out;
    if (!st->latex) {
        if (base < 0)
            return gs_strdup(gs_symtab_name(syms, id));
        return gs_asprintf("(%s)", gs_symtab_name(syms, id));
    }
    if (base < 0)
        return latex_plain(gs_symtab_name(syms, id));
    inner = latex_plain(gs_symtab_name(syms, base));
    out = gs_asprintf("{\\frac{1}{%s}}", inner);
    gs_free(inner);
    return out;
}

/* Every name is stored with this many bytes of zeros after it, so
   that a name of up to NAME_PAD bytes is copied as one block of fixed
   size (a few moves, no call), the bytes past it overwritten next. */
#define NAME_PAD 16

/* Every name is made at the start, so that writing a factor needs no
   test, and the longest bounds the room a term takes. */
static void style_init(style *st, const gs_polyctx *ctx, int latex)
{
    int i;
    st->latex = latex;
    st->ctx = ctx;
    st->names = gs_calloc((size_t)ctx->nvars + 1, sizeof *st->names);
    st->lens = gs_calloc((size_t)ctx->nvars + 1, sizeof *st->lens);
    st->longest = 0;
    for (i = 0; i < ctx->nvars; i++) {
        char *name = var_name(st, i);
        size_t n = strlen(name);
        st->names[i] = gs_calloc(n + NAME_PAD, 1);
        memcpy(st->names[i], name, n);
        st->lens[i] = n;
        if (n > st->longest)
            st->longest = n;
        gs_free(name);
    }
    st->mul = latex ? "\\," : "*";
    st->mul_len = strlen(st->mul);
    st->vars = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *st->vars);
    st->exps = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *st->exps);
}

static void style_clear(style *st)
{
    int i;
    for (i = 0; i < st->ctx->nvars; i++)
        gs_free(st->names[i]);
    gs_free(st->names);
    gs_free(st->lens);
    gs_free(st->vars);
    gs_free(st->exps);
}

/* x_var^k; k >= 1 */
static void put_power(sbuf *b, style *st, int var, unsigned k)
{
    sb_putn(b, st->names[var], st->lens[var]);
    if (k == 1)
        return;
    if (st->latex) {
        sb_putn(b, "^{", 2);
        gs_strbuf_add_u64(&b->s, k);
        sb_putn(b, "}", 1);
    } else {
        sb_putn(b, "^", 1);
        gs_strbuf_add_u64(&b->s, k);
    }
}

static void put_mul(sbuf *b, const style *st)
{
    sb_putn(b, st->mul, st->mul_len);
}

static char *copy_name(char *p, const char *name, size_t len)
{
    if (len <= NAME_PAD)
        memcpy(p, name, NAME_PAD);
    else
        memcpy(p, name, len);
    return p + len;
}

/* The n factors in st->vars, st->exps, written through a pointer after
   one reservation: the factors of the many terms of a large result are
   most of its text, and appending each piece checked for room cost
   more than making them.  A factor takes at most its name, the product
   sign before it (2 bytes) and "^{" 5 digits "}" (8). */
static void put_monomial(sbuf *b, style *st, int n)
{
    /* read into locals once: the stores through p may alias st */
    char *const *names = st->names;
    const size_t *lens = st->lens;
    const int *vars = st->vars;
    const unsigned *exps = st->exps;
    const char *mul = st->mul;
    size_t mul_len = st->mul_len;
    int latex = st->latex;
    size_t room = NAME_PAD + (size_t)n * (st->longest + 10);
    char *p;
    int j;
    if (b->s.n + room + 1 > b->s.cap)
        gs_strbuf_reserve(&b->s, room);
    p = b->s.p + b->s.n;
    for (j = 0; j < n; j++) {
        int v = vars[j];
        unsigned k = exps[j];
        if (j > 0) {
            memcpy(p, mul, 2);
            p += mul_len;
        }
        p = copy_name(p, names[v], lens[v]);
        if (k > 1) {
            *p++ = '^';
            if (latex)
                *p++ = '{';
            p += gs_fmt_u64(p, k);
            if (latex)
                *p++ = '}';
        }
    }
    *p = '\0';
    b->s.n = (size_t)(p - b->s.p);
}

/* Sign and unit tests of a coefficient read a small value where it lies
   (int.h: a value that fits a word is never kept in limbs). */
static int is_negative(const gs_int *c)
{
    return gs_int_is_small(c) ? c->u.v < 0 : gs_int_sgn(c) < 0;
}

static int is_unit(const gs_int *c)
{
    return gs_int_is_small(c) && (c->u.v == 1 || c->u.v == -1);
}

/* |c| in decimal: a coefficient that fits a word without an allocation */
static void put_abs(sbuf *b, const gs_int *c)
{
    if (gs_int_is_small(c)) {
        int64_t v = c->u.v;
        gs_strbuf_add_u64(&b->s, v < 0 ? 0 - (uint64_t)v : (uint64_t)v);
    } else {
        char *digits = gs_int_get_str(c);
        sb_puts(b, digits[0] == '-' ? digits + 1 : digits);
        gs_free(digits);
    }
}

/* |c| times the n factors of st; "1" for the constant term +-1. */
static void put_term(sbuf *b, style *st, const gs_int *c, int n)
{
    if (n == 0 || !is_unit(c)) {
        put_abs(b, c);
        if (n > 0)
            put_mul(b, st);
    }
    put_monomial(b, st, n);
}

/* The sign before a term: nothing or "-" first, " + " or " - " after. */
static void put_sign(sbuf *b, int negative, int first)
{
    if (first) {
        if (negative)
            sb_putn(b, "-", 1);
        return;
    }
    if (sb_mark_break(b)) {     /* multline's break, then "+ term" */
        sb_puts(b, " \\displaybreak[0]\\\\\n");
        sb_putn(b, negative ? "- " : "+ ", 2);
        return;
    }
    sb_putn(b, negative ? " - " : " + ", 3);
}

/* Some terms of a polynomial, in its order: a's terms idx[0 .. n), with
   the exponent of drop (-1: none) read as 0.  The coefficients of the
   powers of s are printed through such views, so that a result of
   millions of terms is not copied to be printed. */
typedef struct view {
    const gs_poly *a;
    const size_t *idx;      /* NULL: the terms 0 .. n-1 */
    size_t n;
    int drop;
} view;

static size_t view_at(const view *v, size_t i)
{
    return v->idx ? v->idx[i] : i;
}

/* Term i's factors into st->vars and st->exps, less the factor of drop;
   their count. */
static int view_factors(style *st, const view *v, size_t i)
{
    return gs_poly_term_factors(st->vars, st->exps, v->a, view_at(v, i),
                                v->drop, st->ctx);
}

/* The terms of v, one after the other; flip negates each sign. */
static void put_terms(sbuf *b, style *st, const view *v, int first,
                      int flip)
{
    size_t i;
    for (i = 0; i < v->n; i++) {
        const gs_int *c = &v->a->coeffs[view_at(v, i)];
        int neg = is_negative(c) != (flip != 0);
        int n = view_factors(st, v, i);
        put_sign(b, neg, first && i == 0);
        put_term(b, st, c, n);
    }
}

/* c * x_var^k for k >= 1, c (the view, its terms free of x_var once
   dropped) nonzero.  A coefficient of several terms goes in parentheses,
   its leading sign outside. */
static void put_group(sbuf *b, style *st, const view *c, int var,
                      unsigned k, int first)
{
    const gs_int *c0 = &c->a->coeffs[view_at(c, 0)];
    int neg = is_negative(c0);
    put_sign(b, neg, first);
    if (c->n == 1) {
        int n = view_factors(st, c, 0);
        if (n > 0 || !is_unit(c0)) {
            put_term(b, st, c0, n);
            put_mul(b, st);
        }
    } else {
        sb_puts(b, st->latex == 1 ? "\\left( " : "(");
        put_terms(b, st, c, 1, neg);
        sb_puts(b, st->latex == 1 ? " \\right) "
                   : st->latex ? ")\\," : ")*");
    }
    put_power(b, st, var, k);
}

/* a written as a sum over the powers of x_var (var < 0: as it is), the
   powers highest first, each coefficient read in place
   (gs_poly_group_by_var). */
static void put_poly(sbuf *b, style *st, const gs_poly *a, int var)
{
    const gs_polyctx *ctx = st->ctx;
    view v;
    long k;
    int first = 1;

    v.a = a;
    v.idx = NULL;
    v.n = a->length;
    v.drop = -1;
    if (gs_poly_is_zero(a)) {
        sb_puts(b, "0");
    } else if (var < 0 || var >= ctx->nvars) {
        put_terms(b, st, &v, 1, 0);
    } else {
        size_t *start, *idx;
        size_t n = gs_poly_group_by_var(&idx, &start, a, var, ctx);
        v.drop = var;
        for (k = (long)n - 1; k >= 0; k--) {
            size_t lo = k ? start[k - 1] : 0, hi = start[k];
            if (lo == hi)
                continue;
            v.idx = idx + lo;
            v.n = hi - lo;
            if (k == 0)
                put_terms(b, st, &v, first, 0);
            else
                put_group(b, st, &v, var, (unsigned)k, first);
            first = 0;
        }
        gs_free(idx);
        gs_free(start);
    }
}

/* a in the style latex, with its break points (b initialised, empty). */
static void poly_into(sbuf *b, const gs_tf *tf, const gs_poly *a,
                      int collect_var, int latex)
{
    style st;
    style_init(&st, tf->ctx, latex);
    put_poly(b, &st, a, collect_var);
    style_clear(&st);
}

static void poly_sbuf(sbuf *b, const gs_tf *tf, const gs_poly *a,
                      int collect_var, int latex)
{
    sb_init(b);
    poly_into(b, tf, a, collect_var, latex);
}

static char *poly_str(const gs_tf *tf, const gs_poly *a, int collect_var,
                      int latex)
{
    sbuf b;
    poly_sbuf(&b, tf, a, collect_var, latex);
    gs_free(b.brk);
    return b.s.p;
}

char *gs_tf_get_str(const gs_tf *tf, int collect_var)
{
    char *n = poly_str(tf, &tf->num, collect_var, 0);
    char *d = poly_str(tf, &tf->den, collect_var, 0);
    /* a polynomial result (D = 1) reads as N alone: "Rout = ro1 + ro2" */
    char *line = gs_poly_is_one(&tf->den, tf->ctx)
                 ? gs_asprintf("%s = %s", gs_tf_name(tf), n)
                 : gs_asprintf("%s = (%s)/(%s)", gs_tf_name(tf), n, d);
    gs_free(n);
    gs_free(d);
    return line;
}

/* The same line as gs_tf_get_str, written to out as it is made: a result
   of millions of terms needs no string of its size (nor two). */
static void print_line(FILE *out, const gs_tf *tf, int collect_var,
                       void (*put)(void *, const char *, size_t),
                       const char *end)
{
    sbuf b;
    style st;
    int poly = gs_poly_is_one(&tf->den, tf->ctx);
    sb_init_stream(&b, out);
    b.s.put = put;
    b.s.put_arg = out;
    style_init(&st, tf->ctx, 0);
    sb_puts(&b, gs_tf_name(tf));
    sb_puts(&b, poly ? " = " : " = (");
    put_poly(&b, &st, &tf->num, collect_var);
    if (!poly) {
        sb_puts(&b, ")/(");
        put_poly(&b, &st, &tf->den, collect_var);
        sb_puts(&b, ")");
    }
    sb_puts(&b, end);
    gs_strbuf_flush(&b.s);
    style_clear(&st);
    sb_free(&b);
}

void gs_print_text(FILE *out, const gs_tf *tf, int collect_var)
{
    print_line(out, tf, collect_var, NULL, "\n");
}

static void json_piece(void *out, const char *p, size_t n)
{
    gs_json_put_escaped(out, p, n);
}

void gs_print_text_json(FILE *out, const gs_tf *tf, int collect_var)
{
    fputc('"', out);
    print_line(out, tf, collect_var, json_piece, "");
    fputc('"', out);
}

/* A LaTeX side longer than this many characters of its text form is
   broken across lines.  About what a 10 pt article's text width holds
   of products in math italic, with room for the "N_{H} = " before it. */
#define LATEX_COLS 56

/* The LaTeX of side a, broken greedily: the text form (the same terms
   in the same order, so the same break points) measures each line, and
   a line ends where the next term would pass LATEX_COLS.  The breaks
   are multline's "\\", each allowing a page break (\displaybreak[0]),
   so even a result of hundreds of terms is set.  Two walks, neither
   kept whole: the text's only counts where its breaks fall, which
   decides the lines; the LaTeX is then written as it is made, ending a
   line at each break so chosen. */
static void latex_broken(FILE *out, const gs_tf *tf, const gs_poly *a,
                         int collect_var)
{
    sbuf tx, lx;
    size_t j, start = 0, cut = 0, bp;
    unsigned char *ends;
    int have_cut = 0;
    sb_init_measure(&tx);
    poly_into(&tx, tf, a, collect_var, 0);
    ends = gs_calloc(tx.nbrk + 1, 1);
    for (j = 0; j <= tx.nbrk; j++) {
        bp = j < tx.nbrk ? tx.brk[j] : sb_length(&tx);
        if (bp - start > LATEX_COLS && have_cut && cut > start) {
            ends[j - 1] = 1;        /* the line before break j - 1 */
            start = cut + 1;        /* the line goes on with "+ term" */
        }
        cut = bp;
        have_cut = 1;
    }
    sb_free(&tx);
    sb_init_stream(&lx, out);
    lx.cut = ends;
    poly_into(&lx, tf, a, collect_var, 2);
    gs_strbuf_flush(&lx.s);
    sb_free(&lx);
    gs_free(ends);
}

static size_t text_len(const gs_tf *tf, const gs_poly *a, int collect_var)
{
    char *t;
    /* every term prints at least one character: no need to make the text
       of a long side to know that it is long */
    if (a->length > LATEX_COLS)
        return a->length;
    t = poly_str(tf, a, collect_var, 0);
    size_t n = strlen(t);
    gs_free(t);
    return n;
}

void gs_print_latex(FILE *out, const gs_tf *tf, int collect_var)
{
    char *name = latex_plain(gs_tf_name(tf));
    int poly = gs_poly_is_one(&tf->den, tf->ctx);
    char *n, *d;
    if (text_len(tf, &tf->num, collect_var) > LATEX_COLS
        || (!poly && text_len(tf, &tf->den, collect_var) > LATEX_COLS)) {
        /* long: a numbered equation H = N_H / D_H, then each side as
           its own multline* (amsmath) */
        if (poly) {
            fprintf(out, "\\begin{multline}\n%s = ", name);
            latex_broken(out, tf, &tf->num, collect_var);
            fputs("\n\\end{multline}\n", out);
        } else {
            fprintf(out, "\\begin{equation}\n%s = \\frac{N_{%s}}{D_{%s}}\n"
                    "\\end{equation}\n\\begin{multline*}\nN_{%s} = ",
                    name, name, name, name);
            latex_broken(out, tf, &tf->num, collect_var);
            fprintf(out, "\n\\end{multline*}\n\\begin{multline*}\n"
                    "D_{%s} = ", name);
            latex_broken(out, tf, &tf->den, collect_var);
            fputs("\n\\end{multline*}\n", out);
        }
        gs_free(name);
        return;
    }
    n = poly_str(tf, &tf->num, collect_var, 1);
    d = poly_str(tf, &tf->den, collect_var, 1);
    if (poly)
        fprintf(out, "\\begin{equation}\n%s = %s\n\\end{equation}\n",
                name, n);
    else
        fprintf(out, "\\begin{equation}\n%s = \\frac{%s}{%s}\n"
                "\\end{equation}\n", name, n, d);
    gs_free(name);
    gs_free(n);
    gs_free(d);
}

/* ---- 2-D text ---- */

/* Lines of a wrapped block: line i is text[start[i] .. start[i]+len[i]). */
typedef struct block {
    const char *text;
    size_t *start, *len;
    size_t nlines, width;
} block;

static void block_add(block *bl, size_t from, size_t to)
{
    bl->start = gs_reallocarray(bl->start, bl->nlines + 1,
                                sizeof *bl->start);
    bl->len = gs_reallocarray(bl->len, bl->nlines + 1, sizeof *bl->len);
    bl->start[bl->nlines] = from;
    bl->len[bl->nlines] = to - from;
    if (to - from > bl->width)
        bl->width = to - from;
    bl->nlines++;
}

/* Greedy fill: break at the last break point that keeps a line within
   width; a single term longer than that gets a line of its own. */
static void block_wrap(block *bl, const sbuf *b, size_t width)
{
    size_t j, start = 0, cut = 0, bp;
    int have_cut = 0;
    bl->text = b->s.p;
    bl->start = bl->len = NULL;
    bl->nlines = bl->width = 0;
    for (j = 0; j <= b->nbrk; j++) {
        bp = j < b->nbrk ? b->brk[j] : b->s.n;
        if (bp - start > width && have_cut && cut > start) {
            block_add(bl, start, cut);
            start = cut + 1;        /* the line goes on with "+ term" */
        }
        cut = bp;
        have_cut = 1;
    }
    block_add(bl, start, b->s.n);
}

static void block_free(block *bl)
{
    gs_free(bl->start);
    gs_free(bl->len);
}

static void put_spaces(FILE *out, size_t n)
{
    while (n-- > 0)
        fputc(' ', out);
}

static void block_print(FILE *out, const block *bl, size_t indent,
                        size_t rule)
{
    size_t i;
    for (i = 0; i < bl->nlines; i++) {
        put_spaces(out, indent + (rule - bl->width) / 2);
        fwrite(bl->text + bl->start[i], 1, bl->len[i], out);
        fputc('\n', out);
    }
}

void gs_print_pretty(FILE *out, const gs_tf *tf, int collect_var)
{
    const char *name = gs_tf_name(tf);
    size_t indent = strlen(name) + 3, width, rule, i;
    style st;
    sbuf n, d;
    block bn, bd;

    width = indent + 2 + PRETTY_MIN < PRETTY_COLS
                ? PRETTY_COLS - indent - 2 : PRETTY_MIN;
    sb_init(&n);
    sb_init(&d);
    style_init(&st, tf->ctx, 0);
    put_poly(&n, &st, &tf->num, collect_var);
    put_poly(&d, &st, &tf->den, collect_var);
    style_clear(&st);
    block_wrap(&bn, &n, width);
    block_wrap(&bd, &d, width);
    if (gs_poly_is_one(&tf->den, tf->ctx)) {
        /* no fraction bar over 1: the numerator's lines after the name */
        for (i = 0; i < bn.nlines; i++) {
            if (i == 0)
                fprintf(out, "%s = ", name);
            else
                put_spaces(out, indent);
            fwrite(bn.text + bn.start[i], 1, bn.len[i], out);
            fputc('\n', out);
        }
        block_free(&bn);
        block_free(&bd);
        sb_free(&n);
        sb_free(&d);
        return;
    }
    rule = (bn.width > bd.width ? bn.width : bd.width) + 2;
    block_print(out, &bn, indent, rule);
    fprintf(out, "%s = ", name);
    for (i = 0; i < rule; i++)
        fputc('-', out);
    fputc('\n', out);
    block_print(out, &bd, indent, rule);
    block_free(&bn);
    block_free(&bd);
    sb_free(&n);
    sb_free(&d);
}
