/* report.h - the review document of one circuit. See LICENSE.
 *
 * gs_report_write writes, for a derived and bound job, the title, the
 * circuit listing with line numbers, the bound values and where each came
 * from, and per output the exact result (folded to its first and last
 * terms when long), the short forms of approx.h with their measured
 * errors (or a sentence saying there is none), the DC gain, the poles
 * and zeros, the Bode plot and step response (svg.h), the sensitivity
 * table (sens.h), the noise at a spot frequency and over the plot's
 * span with each source's share (noise.h), the check verdict, then the
 * caution.  The document is a list of section writers (report.c); the
 * format is a gs_report_writer (report_html.c, report_md.c, report_tex.c).
 */
#ifndef GS_REPORT_H
#define GS_REPORT_H

#include <stdio.h>

#include "analysis/job.h"
#include "analysis/noise.h"

typedef enum gs_report_format {
    GS_REPORT_HTML, GS_REPORT_MD, GS_REPORT_TEX
} gs_report_format;

/* The noise analysis of the circuit, made beside the job (noise.h): its
   sources and targets, their numbers, and the job that derived them; or
   only `skipped`, a sentence saying why there is none. */
typedef struct gs_report_noise {
    const gs_noise *n;
    const gs_noise_num *nn;
    const gs_job *j;
    const char *skipped;
} gs_report_noise;

/* Where a document goes: path names it (the Markdown writer puts its SVG
   files beside it, PATH-N.svg); nfig counts the figures written; noise,
   when not NULL, adds a noise section to each output it analysed. */
typedef struct gs_report_out {
    FILE *f;
    const char *path;
    int nfig;
    const gs_report_noise *noise;
} gs_report_out;

/* One format.  Strings are UTF-8 and unescaped; each writer escapes.
   A formula's sides are in the text syntax of gs_poly_get_str, where
   "..." stands for terms left out. */
typedef struct gs_report_writer {
    void (*begin)(gs_report_out *o, const char *title);
    void (*end)(gs_report_out *o);
    void (*heading)(gs_report_out *o, int level, const char *text);
    void (*para)(gs_report_out *o, const char *text);
    void (*listing)(gs_report_out *o, char *const *lines, size_t n);
    /* rows x cols cells, row-major; row 0 is the header */
    void (*table)(gs_report_out *o, char *const *cells, size_t rows,
                  size_t cols);
    void (*formula)(gs_report_out *o, const char *lhs, const char *num,
                    const char *den);
    /* an SVG document; alt describes it */
    void (*figure)(gs_report_out *o, const char *svg, size_t len,
                   const char *alt);
} gs_report_writer;

extern const gs_report_writer gs_report_html;
extern const gs_report_writer gs_report_md;
extern const gs_report_writer gs_report_tex;

/* The format from the file name's extension (.html/.htm, .md, .tex), or
   -1. */
int gs_report_format_of(const char *path);

/* Write the document for j (derived and bound) to o->f.  Returns GS_OK or
   GS_EIO (a write error, or a figure file that could not be written). */
int gs_report_write(gs_report_out *o, const gs_report_writer *w,
                    const gs_job *j);

/* Tokens of a formula side, for the writers: calls tok(kind, text, len,
   power, arg) per token, kind one of 'i' identifier (power > 0 when it
   carries ^power), 'n' number, 'o' operator (+ - * ( ) /), 'e' the
   ellipsis "...". */
void gs_report_tokens(const char *s,
                      void (*tok)(int kind, const char *text, size_t len,
                                  unsigned power, void *arg),
                      void *arg);

#endif
