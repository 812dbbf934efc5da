/* report_md.c - the review document as Markdown. See LICENSE.
 *
 * Formulas are LaTeX between $$; each plot is written beside the
 * document as PATH-N.svg and linked.
 */
#include "output/report.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

#include "algebra/sym.h"

static void m_begin(gs_report_out *o, const char *title)
{
    fprintf(o->f, "# %s\n\n", title);
}

static void m_end(gs_report_out *o)
{
    (void)o;
}

static void m_heading(gs_report_out *o, int level, const char *text)
{
    fprintf(o->f, "%.*s %s\n\n", level, "######", text);
}

/* A paragraph may hold a formula in text syntax (the approx section's
   forms), whose * and _ would otherwise read as emphasis. */
static void m_para(gs_report_out *o, const char *text)
{
    for (; *text; text++) {
        if (strchr("\\*_`", *text))
            fputc('\\', o->f);
        fputc(*text, o->f);
    }
    fputs("\n\n", o->f);
}

static void m_listing(gs_report_out *o, char *const *lines, size_t n)
{
    size_t i;
    fputs("```\n", o->f);
    for (i = 0; i < n; i++)
        fprintf(o->f, "%3zu  %s\n", i + 1, lines[i]);
    fputs("```\n\n", o->f);
}

static void cell(FILE *f, const char *s)
{
    for (; *s; s++) {
        if (*s == '|')
            fputc('\\', f);
        fputc(*s, f);
    }
}

static void m_table(gs_report_out *o, char *const *cells, size_t rows,
                    size_t cols)
{
    size_t r, c;
    for (r = 0; r < rows; r++) {
        fputc('|', o->f);
        for (c = 0; c < cols; c++) {
            fputc(' ', o->f);
            cell(o->f, cells[r * cols + c]);
            fputs(" |", o->f);
        }
        fputc('\n', o->f);
        if (r == 0) {
            fputc('|', o->f);
            for (c = 0; c < cols; c++)
                fputs("---|", o->f);
            fputc('\n', o->f);
        }
    }
    fputc('\n', o->f);
}

/* LaTeX tokens, shared with report_tex.c's formula through this file's
   own copy: identifiers via gs_sym_latex_name. */
static void tok(int kind, const char *t, size_t len, unsigned pw, void *arg)
{
    FILE *f = arg;
    char name[128], *lx;
    switch (kind) {
    case 'i':
        snprintf(name, sizeof name, "%.*s", (int)len, t);
        lx = gs_sym_latex_name(name);
        fputs(lx, f);
        gs_free(lx);
        if (pw)
            fprintf(f, "^{%u}", pw);
        break;
    case 'n':
        fprintf(f, "%.*s", (int)len, t);
        break;
    case 'e':
        fputs("\\cdots", f);
        break;
    default:
        if (*t == '*')
            fputs("\\,", f);
        else
            fprintf(f, " %c ", *t);
    }
}

static void m_formula(gs_report_out *o, const char *lhs, const char *num,
                      const char *den)
{
    fprintf(o->f, "$$%s = \\frac{", lhs);
    gs_report_tokens(num, tok, o->f);
    fputs("}{", o->f);
    gs_report_tokens(den, tok, o->f);
    fputs("}$$\n\n", o->f);
}

static void m_figure(gs_report_out *o, const char *svg, size_t len,
                     const char *alt)
{
    char path[4096];
    const char *base;
    FILE *f;
    o->nfig++;
    snprintf(path, sizeof path, "%s-%d.svg", o->path, o->nfig);
    if ((f = fopen(path, "w")) == NULL) {
        fprintf(o->f, "(%s: %s could not be written)\n\n", alt, path);
        return;
    }
    fwrite(svg, 1, len, f);
    fclose(f);
    base = strrchr(path, '/');
    fprintf(o->f, "![%s](%s)\n\n", alt, base ? base + 1 : path);
}

const gs_report_writer gs_report_md = {
    m_begin, m_end, m_heading, m_para, m_listing, m_table, m_formula,
    m_figure
};
