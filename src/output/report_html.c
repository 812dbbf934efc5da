/* report_html.c - the review document as one HTML file. See LICENSE.
 *
 * No script and no network: the style sheet (with a print style) is
 * inline, formulas are MathML, plots are inline SVG.
 */
#include "output/report.h"

#include <string.h>

static void esc(FILE *f, const char *s)
{
    for (; *s; s++) {
        if (*s == '<')
            fputs("&lt;", f);
        else if (*s == '>')
            fputs("&gt;", f);
        else if (*s == '&')
            fputs("&amp;", f);
        else
            fputc(*s, f);
    }
}

static void h_begin(gs_report_out *o, const char *title)
{
    fputs("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
          "<title>", o->f);
    esc(o->f, title);
    fputs("</title>\n<style>\n"
          "body { font-family: serif; max-width: 52em; margin: 2em auto;"
          " color: #000; background: #fff; }\n"
          "table { border-collapse: collapse; }\n"
          "td, th { border: 1px solid #999; padding: 0.15em 0.5em;"
          " text-align: right; }\n"
          "pre { background: #f4f4f4; padding: 0.5em; overflow-x: auto; }\n"
          "math { font-size: 1.1em; }\n"
          /* a formula scrolls inside its box rather than widen the
             page; its long sides are already set as rows (h_formula) */
          ".formula { overflow-x: auto; max-width: 100%; }\n"
          "mtd { text-align: left; }\n"
          ".wide { overflow-x: auto; max-width: 100%; }\n"
          "@media print { body { max-width: none; margin: 0; }"
          " .formula, .wide { overflow-x: visible; }"
          " pre { background: none; border: 1px solid #999;"
          " white-space: pre-wrap; overflow-x: visible; }"
          " svg { max-width: 100%; height: auto; }"
          " h2 { page-break-after: avoid; } }\n"
          "</style>\n</head>\n<body>\n<h1>", o->f);
    esc(o->f, title);
    fputs("</h1>\n", o->f);
}

static void h_end(gs_report_out *o)
{
    fputs("</body>\n</html>\n", o->f);
}

static void h_heading(gs_report_out *o, int level, const char *text)
{
    fprintf(o->f, "<h%d>", level);
    esc(o->f, text);
    fprintf(o->f, "</h%d>\n", level);
}

static void h_para(gs_report_out *o, const char *text)
{
    fputs("<p>", o->f);
    esc(o->f, text);
    fputs("</p>\n", o->f);
}

static void h_listing(gs_report_out *o, char *const *lines, size_t n)
{
    size_t i;
    fputs("<pre class=\"listing\">", o->f);
    for (i = 0; i < n; i++) {
        fprintf(o->f, "%3zu  ", i + 1);
        esc(o->f, lines[i]);
        fputc('\n', o->f);
    }
    fputs("</pre>\n", o->f);
}

static void h_table(gs_report_out *o, char *const *cells, size_t rows,
                    size_t cols)
{
    size_t r, c;
    fputs("<div class=\"wide\"><table>\n", o->f);
    for (r = 0; r < rows; r++) {
        fputs("<tr>", o->f);
        for (c = 0; c < cols; c++) {
            fputs(r ? "<td>" : "<th>", o->f);
            esc(o->f, cells[r * cols + c]);
            fputs(r ? "</td>" : "</th>", o->f);
        }
        fputs("</tr>\n", o->f);
    }
    fputs("</table></div>\n", o->f);
}

/* A long side is set as a column of rows, each ending at the first
   top-level + or - after ROW_CHARS characters of the source text: MathML
   as Chromium renders it has no line breaking of its own, and a printed
   page cannot scroll. */
#define ROW_CHARS 56

typedef struct hstate {
    FILE *f;
    size_t chars;
    int depth, rows;
} hstate;

static void tok(int kind, const char *t, size_t len, unsigned pw, void *arg)
{
    hstate *st = arg;
    FILE *f = st->f;
    st->chars += len;
    if (kind == 'o' && *t == '(')
        st->depth++;
    if (kind == 'o' && *t == ')')
        st->depth--;
    if (st->rows && kind == 'o' && (*t == '+' || *t == '-')
        && st->depth == 0 && st->chars > ROW_CHARS) {
        fputs("</mrow></mtd></mtr>\n<mtr><mtd><mrow>", f);
        st->chars = 0;
    }
    switch (kind) {
    case 'i':
        if (pw)
            fputs("<msup>", f);
        fprintf(f, "<mi>%.*s</mi>", (int)len, t);
        if (pw)
            fprintf(f, "<mn>%u</mn></msup>", pw);
        break;
    case 'n':
        fprintf(f, "<mn>%.*s</mn>", (int)len, t);
        break;
    case 'e':
        fputs("<mo>&#x22EF;</mo>", f);
        break;
    default:
        if (*t == '*')
            fputs("<mo>&#x22C5;</mo>", f);
        else if (*t == '-')
            fputs("<mo>&#x2212;</mo>", f);
        else
            fprintf(f, "<mo>%c</mo>", *t);
    }
}

static void side(FILE *f, const char *s)
{
    hstate st = {f, 0, 0, 0};
    st.rows = strlen(s) > ROW_CHARS;
    fputs(st.rows ? "<mtable><mtr><mtd><mrow>" : "<mrow>", f);
    gs_report_tokens(s, tok, &st);
    fputs(st.rows ? "</mrow></mtd></mtr></mtable>" : "</mrow>", f);
}

static void h_formula(gs_report_out *o, const char *lhs, const char *num,
                      const char *den)
{
    fputs("<div class=\"formula\"><math display=\"block\"><mrow><mi>",
          o->f);
    esc(o->f, lhs);
    fputs("</mi><mo>=</mo><mfrac>", o->f);
    side(o->f, num);
    side(o->f, den);
    fputs("</mfrac></mrow></math></div>\n", o->f);
}

static void h_figure(gs_report_out *o, const char *svg, size_t len,
                     const char *alt)
{
    const char *start = strstr(svg, "<svg");
    o->nfig++;
    fputs("<figure>\n", o->f);
    if (start)
        fwrite(start, 1, len - (size_t)(start - svg), o->f);
    fputs("<figcaption>", o->f);
    esc(o->f, alt);
    fputs("</figcaption>\n</figure>\n", o->f);
}

const gs_report_writer gs_report_html = {
    h_begin, h_end, h_heading, h_para, h_listing, h_table, h_formula,
    h_figure
};
