/* formula.c - short text formulas set as LaTeX. See LICENSE.
 *
 * A recursive-descent reading of the grammar in formula.h that builds
 * the LaTeX bottom-up; each part remembers whether it is a sum (needs
 * parentheses as a factor) or a fraction (needs them as a base).
 */
#include "output/formula.h"

#include <ctype.h>
#include <stdlib.h>
#include <string.h>

#include "algebra/sym.h"
#include "base/mem.h"

typedef struct part {
    char *tex;          /* NULL: a syntax error */
    int sum;            /* a top-level + or - */
    int frac;           /* a \frac */
} part;

typedef struct reader {
    const char *s;
} reader;

static void skip_space(reader *r)
{
    while (*r->s == ' ')
        r->s++;
}

static part fail(part *a, part *b)
{
    part p = {NULL, 0, 0};
    if (a)
        gs_free(a->tex);
    if (b)
        gs_free(b->tex);
    return p;
}

static part read_sum(reader *r);
static part read_power(reader *r);

/* A name as the polynomial printers set it, the trailing "{}" of a bare
   Greek letter dropped. */
static char *name_tex(const char *from, size_t n)
{
    char *name = gs_strndup(from, n), *t = gs_sym_latex_name(name);
    size_t len = strlen(t);
    if (len > 2 && strcmp(t + len - 2, "{}") == 0)
        t[len - 2] = '\0';
    gs_free(name);
    return t;
}

static part read_atom(reader *r)
{
    part p = {NULL, 0, 0}, q;
    const char *start;
    skip_space(r);
    start = r->s;
    if (isdigit((unsigned char)*r->s) || *r->s == '.') {
        while (isalnum((unsigned char)*r->s) || *r->s == '.'
               || ((*r->s == '+' || *r->s == '-')
                   && (r->s[-1] == 'e' || r->s[-1] == 'E')))
            r->s++;
        p.tex = gs_strndup(start, (size_t)(r->s - start));
    } else if (isalpha((unsigned char)*r->s) || *r->s == '_') {
        while (isalnum((unsigned char)*r->s) || *r->s == '_')
            r->s++;
        p.tex = name_tex(start, (size_t)(r->s - start));
    } else if (*r->s == '(') {
        r->s++;
        q = read_sum(r);
        skip_space(r);
        if (q.tex == NULL || *r->s != ')')
            return fail(&q, NULL);
        r->s++;
        if (!q.sum)             /* a product or a fraction needs none */
            return q;
        p.tex = gs_asprintf("\\left(%s\\right)", q.tex);
        gs_free(q.tex);
    } else if (*r->s == '-') {
        r->s++;
        q = read_power(r);
        if (q.tex == NULL)
            return q;
        p.tex = gs_asprintf(q.sum ? "-\\left(%s\\right)" : "-%s", q.tex);
        gs_free(q.tex);
    }
    return p;
}

static part read_power(reader *r)
{
    part base = read_atom(r), ex;
    char *t;
    skip_space(r);
    if (base.tex == NULL || *r->s != '^')
        return base;
    r->s++;
    ex = read_atom(r);
    if (ex.tex == NULL)
        return fail(&base, NULL);
    t = gs_asprintf(base.frac || base.sum ? "\\left(%s\\right)^{%s}"
                                          : "%s^{%s}", base.tex, ex.tex);
    gs_free(base.tex);
    gs_free(ex.tex);
    base.tex = t;
    base.sum = base.frac = 0;
    return base;
}

/* Append factor f to *side, thin-space separated; f's parentheses as a
   factor when it is a sum. */
static void put_factor(char **side, const part *f)
{
    char *t;
    const char *fmt = f->sum ? "%s%s\\left(%s\\right)" : "%s%s%s";
    t = gs_asprintf(fmt, *side ? *side : "", *side ? "\\," : "", f->tex);
    gs_free(*side);
    *side = t;
}

static part read_product(reader *r)
{
    char *num = NULL, *den = NULL;
    part f = read_power(r), p = {NULL, 0, 0};
    int over = 0;
    for (;;) {
        if (f.tex == NULL) {
            gs_free(num);
            gs_free(den);
            return p;
        }
        put_factor(over ? &den : &num, &f);
        gs_free(f.tex);
        skip_space(r);
        if (*r->s != '*' && *r->s != '/')
            break;
        over = *r->s == '/';
        r->s++;
        f = read_power(r);
    }
    if (den == NULL) {
        p.tex = num;
        return p;
    }
    p.tex = gs_asprintf("\\frac{%s}{%s}", num, den);
    p.frac = 1;
    gs_free(num);
    gs_free(den);
    return p;
}

static part read_sum(reader *r)
{
    part p = read_product(r), q;
    char *t;
    for (;;) {
        char op;
        skip_space(r);
        if (p.tex == NULL || (*r->s != '+' && *r->s != '-'))
            return p;
        op = *r->s++;
        q = read_product(r);
        if (q.tex == NULL)
            return fail(&p, NULL);
        t = gs_asprintf("%s %c %s", p.tex, op, q.tex);
        gs_free(p.tex);
        gs_free(q.tex);
        p.tex = t;
        p.sum = 1;
        p.frac = 0;
    }
}

char *gs_formula_latex(const char *text)
{
    reader r;
    part p;
    r.s = text;
    p = read_sum(&r);
    skip_space(&r);
    if (p.tex != NULL && *r.s != '\0') {
        gs_free(p.tex);
        return NULL;
    }
    return p.tex;
}
