/* report_tex.c - the review document as a LaTeX article. See LICENSE.
 *
 * A complete document for pdflatex (amsmath only).  Numerator and
 * denominator are set as their own multline* equations, broken after
 * every few terms, so long results stay inside the margin.  pdflatex
 * reads no SVG: the plots are left to the HTML and Markdown documents.
 */
#include "output/report.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

#include "algebra/sym.h"

/* A broken equation's line ends at the first + or - after this many
   characters of the source text; a table wider than TABLE_COLS columns
   is set as several tables that repeat the first column. */
#define LINE_CHARS 48
#define TABLE_COLS 7

static void esc(FILE *f, const char *s)
{
    for (; *s; s++) {
        if (strchr("#$%&_{}", *s))
            fprintf(f, "\\%c", *s);
        else if (*s == '~' || *s == '^' || *s == '\\')
            fprintf(f, "\\char%d{}", *s);
        else if (*s == '|')
            fputs("$|$", f);
        else
            fputc(*s, f);
    }
}

static void t_begin(gs_report_out *o, const char *title)
{
    fputs("\\documentclass[11pt]{article}\n\\usepackage[utf8]{inputenc}\n"
          "\\usepackage{amsmath}\n\\begin{document}\n\\title{", o->f);
    esc(o->f, title);
    fputs("}\n\\date{}\n\\maketitle\n", o->f);
}

static void t_end(gs_report_out *o)
{
    fputs("\\end{document}\n", o->f);
}

static void t_heading(gs_report_out *o, int level, const char *text)
{
    fputs(level <= 2 ? "\\section*{" : "\\subsection*{", o->f);
    esc(o->f, text);
    fputs("}\n", o->f);
}

/* A paragraph may hold a formula in text syntax (the approx section's
   forms): a line may break after its * and /, so a long product does
   not run into the margin. */
static void t_para(gs_report_out *o, const char *text)
{
    char one[2] = {0, 0};
    for (; *text; text++) {
        one[0] = *text;
        esc(o->f, one);
        if (*text == '*' || *text == '/')
            fputs("\\allowbreak{}", o->f);
    }
    fputs("\n\n", o->f);
}

static void t_listing(gs_report_out *o, char *const *lines, size_t n)
{
    size_t i;
    fputs("{\\footnotesize\n\\begin{verbatim}\n", o->f);
    for (i = 0; i < n; i++)
        fprintf(o->f, "%3zu  %.70s\n", i + 1, lines[i]);
    fputs("\\end{verbatim}\n}\n", o->f);
}

static void t_table_part(gs_report_out *o, char *const *cells,
                         size_t rows, size_t cols, size_t c0, size_t c1)
{
    size_t r, c;
    fputs("{\\footnotesize\n\\begin{tabular}{l", o->f);
    for (c = c0; c < c1; c++)
        fputc('r', o->f);
    fputs("}\n", o->f);
    for (r = 0; r < rows; r++) {
        esc(o->f, cells[r * cols]);
        for (c = c0; c < c1; c++) {
            fputs(" & ", o->f);
            esc(o->f, cells[r * cols + c]);
        }
        fputs(r == 0 ? " \\\\ \\hline\n" : " \\\\\n", o->f);
    }
    fputs("\\end{tabular}\n}\n\n", o->f);
}

static void t_table(gs_report_out *o, char *const *cells, size_t rows,
                    size_t cols)
{
    size_t c0;
    for (c0 = 1; c0 < cols || c0 == 1; c0 += TABLE_COLS - 1)
        t_table_part(o, cells, rows, cols, c0, c0 + TABLE_COLS - 1 < cols
                     ? c0 + TABLE_COLS - 1 : cols);
}

typedef struct tstate {
    FILE *f;
    size_t chars;
    int depth;
} tstate;

static void tok(int kind, const char *t, size_t len, unsigned pw, void *arg)
{
    tstate *st = arg;
    char name[128], *lx;
    st->chars += len;
    switch (kind) {
    case 'i':
        snprintf(name, sizeof name, "%.*s", (int)len, t);
        lx = gs_sym_latex_name(name);
        fputs(lx, st->f);
        gs_free(lx);
        if (pw)
            fprintf(st->f, "^{%u}", pw);
        break;
    case 'n':
        fprintf(st->f, "%.*s", (int)len, t);
        break;
    case 'e':
        fputs("\\cdots", st->f);
        break;
    default:
        if (*t == '(')
            st->depth++;
        if (*t == ')')
            st->depth--;
        if (*t == '*') {
            fputs("\\,", st->f);
            break;
        }
        if ((*t == '+' || *t == '-') && st->depth == 0
            && st->chars > LINE_CHARS) {
            fputs(" \\displaybreak[0]\\\\\n", st->f);
            st->chars = 0;
        }
        fprintf(st->f, " %c ", *t);
    }
}

static void side(gs_report_out *o, const char *lhs, const char *s)
{
    tstate st = {o->f, 0, 0};
    fputs("\\begin{multline*}\n", o->f);
    fprintf(o->f, "%s = ", lhs);
    gs_report_tokens(s, tok, &st);
    fputs("\n\\end{multline*}\n", o->f);
}

static void t_formula(gs_report_out *o, const char *lhs, const char *num,
                      const char *den)
{
    char *l = gs_sym_latex_name(lhs);
    fprintf(o->f, "\\[ %s = \\frac{N}{D} \\]\nwith\n", l);
    side(o, "N", num);
    side(o, "D", den);
    gs_free(l);
}

static void t_figure(gs_report_out *o, const char *svg, size_t len,
                     const char *alt)
{
    (void)svg;
    (void)len;
    o->nfig++;
    esc(o->f, alt);
    fputs(": in the HTML and Markdown versions of this document.\n\n",
          o->f);
}

const gs_report_writer gs_report_tex = {
    t_begin, t_end, t_heading, t_para, t_listing, t_table, t_formula,
    t_figure
};
