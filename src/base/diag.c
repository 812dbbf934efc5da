/* diag.c - located diagnostics (errors, warnings, hints). See LICENSE. */
#include "base/diag.h"
#include "base/mem.h"

#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gs_diag_init(gs_diag *d)
{
    d->v = NULL;
    d->n = d->alloc = 0;
    d->nerrors = d->nwarnings = 0;
    d->max_errors = 0;
}

void gs_diag_clear(gs_diag *d)
{
    size_t i;
    for (i = 0; i < d->n; i++) {
        gs_free(d->v[i].file);
        gs_free(d->v[i].message);
        gs_free(d->v[i].hint);
        gs_free(d->v[i].subject);
    }
    gs_free(d->v);
    gs_diag_init(d);
}

static void push(gs_diag *d, gs_diag_entry e)
{
    if (d->n == d->alloc) {
        d->alloc = d->alloc ? 2 * d->alloc : 8;
        d->v = gs_reallocarray(d->v, d->alloc, sizeof *d->v);
    }
    d->v[d->n++] = e;
}

/* Length of the UTF-8 sequence at p (at most n bytes), or 0 when the
   bytes there are not a well-formed sequence (RFC 3629). */
static size_t utf8_len(const unsigned char *p, size_t n, unsigned long *cp)
{
    size_t k, i;
    unsigned long v;
    if (p[0] < 0x80) {
        *cp = p[0];
        return 1;
    }
    if (p[0] >= 0xC2 && p[0] < 0xE0) {
        k = 2;
        v = p[0] & 0x1F;
    } else if (p[0] >= 0xE0 && p[0] < 0xF0) {
        k = 3;
        v = p[0] & 0x0F;
    } else if (p[0] >= 0xF0 && p[0] < 0xF5) {
        k = 4;
        v = p[0] & 0x07;
    } else {
        return 0;
    }
    if (n < k)
        return 0;
    for (i = 1; i < k; i++) {
        if ((p[i] & 0xC0) != 0x80)
            return 0;
        v = v << 6 | (p[i] & 0x3F);
    }
    if ((k == 3 && (v < 0x800 || (v >= 0xD800 && v < 0xE000)))
        || (k == 4 && (v < 0x10000 || v > 0x10FFFF)))
        return 0;
    *cp = v;
    return k;
}

/* Characters a terminal shows as nothing or that move the cursor: C0 and
   C1 controls, DEL, the zero-width and direction marks, the line and
   paragraph separators, and the byte-order mark (Unicode's Cc and Cf
   categories, the ones a message could carry). */
static int invisible(unsigned long cp)
{
    return cp < 0x20 || (cp >= 0x7F && cp < 0xA0) || cp == 0xAD
           || (cp >= 0x200B && cp <= 0x200F)
           || (cp >= 0x2028 && cp <= 0x202E)
           || (cp >= 0x2060 && cp <= 0x2064) || cp == 0xFEFF;
}

/* msg with every unprintable character written as an escape: \xNN for a
   control byte or a byte that is not UTF-8, \uNNNN for an invisible
   character; a new string.  A message quotes the user's text, which may
   hold anything. */
static char *escape_message(const char *msg)
{
    const unsigned char *p = (const unsigned char *)msg;
    size_t n = strlen(msg), i = 0, o = 0;
    char *out = gs_malloc(6 * n + 1);
    while (i < n) {
        unsigned long cp = 0;
        size_t k = utf8_len(p + i, n - i, &cp);
        if (k == 0) {
            o += (size_t)sprintf(out + o, "\\x%02X", p[i]);
            i++;
        } else if (invisible(cp)) {
            if (cp < 0x100)
                o += (size_t)sprintf(out + o, "\\x%02lX", cp);
            else
                o += (size_t)sprintf(out + o, "\\u%04lX", cp);
            i += k;
        } else {
            memcpy(out + o, p + i, k);
            o += k;
            i += k;
        }
    }
    out[o] = '\0';
    return out;
}

void gs_diag_add(gs_diag *d, int severity, const char *file, int line,
                 int col, const char *hint, const char *fmt, ...)
{
    gs_diag_entry e;
    va_list ap;

    if (severity == GS_SEV_ERROR) {
        d->nerrors++;
        if (d->max_errors && d->nerrors > d->max_errors)
            return;     /* counted, not stored: see gs_diag_print */
    } else if (severity == GS_SEV_WARNING) {
        d->nwarnings++;
    }
    e.severity = severity;
    e.file = file ? gs_strdup(file) : NULL;
    e.line = line;
    e.col = col;
    va_start(ap, fmt);
    e.message = gs_vasprintf(fmt, ap);
    va_end(ap);
    {
        char *shown = escape_message(e.message);
        gs_free(e.message);
        e.message = shown;
    }
    e.hint = hint ? escape_message(hint) : NULL;
    e.subject = NULL;
    push(d, e);
}

static const char *severity_word(int severity)
{
    switch (severity) {
    case GS_SEV_ERROR:   return "error";
    case GS_SEV_WARNING: return "warning";
    default:             return "note";
    }
}

static void print_location(FILE *out, const gs_diag_entry *e)
{
    if (e->line > 0)
        fprintf(out, "%s:%d:%d: ", e->file ? e->file : "<input>", e->line,
                e->col);
    else if (e->file)
        fprintf(out, "%s: ", e->file);
    else
        fputs("gainsmith: ", out);
    if (e->subject)
        fprintf(out, "%s: ", e->subject);
}

void gs_diag_print(FILE *out, const gs_diag *d)
{
    size_t i;
    for (i = 0; i < d->n; i++) {
        const gs_diag_entry *e = &d->v[i];
        print_location(out, e);
        fprintf(out, "%s: %s\n", severity_word(e->severity), e->message);
        if (e->hint) {
            print_location(out, e);
            fprintf(out, "hint: %s\n", e->hint);
        }
    }
    if (d->max_errors && d->nerrors > d->max_errors)
        fprintf(out, "gainsmith: %zu more errors not shown\n",
                d->nerrors - d->max_errors);
}

void gs_diag_append(gs_diag *dst, gs_diag *src)
{
    size_t i;
    for (i = 0; i < src->n; i++)
        push(dst, src->v[i]);
    dst->nerrors += src->nerrors;
    dst->nwarnings += src->nwarnings;
    gs_free(src->v);
    gs_diag_init(src);
}

int gs_diag_column(const char *line_start, size_t off)
{
    int col = 1;
    size_t i;
    for (i = 0; i < off; i++) {
        /* count bytes that start a UTF-8 sequence, not continuation bytes */
        if (((unsigned char)line_start[i] & 0xC0) != 0x80)
            col++;
    }
    return col;
}

static int fold_letter(int ch, int fold_case)
{
    return fold_case && ch >= 'A' && ch <= 'Z' ? ch - 'A' + 'a' : ch;
}

/* Optimal string alignment distance: the Levenshtein distance with a swap
   of two neighbouring letters counted as one edit (Damerau 1964), computed
   with three rows of the Wagner-Fischer table (Wagner & Fischer 1974;
   the restricted form of Lowrance & Wagner 1975, where no substring is
   edited twice).  "otu" is one edit from "out", as a typist sees it. */
int gs_osa_distance(const char *a, const char *b, int cap, int fold_case)
{
    size_t la = strlen(a), lb = strlen(b), i, j;
    int *prev2, *prev, *cur, *tmp, result;
    if (la > lb + (size_t)cap || lb > la + (size_t)cap)
        return cap + 1;
    prev2 = gs_malloc((lb + 1) * sizeof *prev2);
    prev = gs_malloc((lb + 1) * sizeof *prev);
    cur = gs_malloc((lb + 1) * sizeof *cur);
    for (j = 0; j <= lb; j++)
        prev[j] = prev2[j] = (int)j;
    for (i = 1; i <= la; i++) {
        int ai = fold_letter((unsigned char)a[i - 1], fold_case);
        cur[0] = (int)i;
        for (j = 1; j <= lb; j++) {
            int bj = fold_letter((unsigned char)b[j - 1], fold_case);
            int sub = prev[j - 1] + (ai != bj);
            int del = prev[j] + 1, ins = cur[j - 1] + 1;
            int best = sub < del ? sub : del;
            if (ins < best)
                best = ins;
            if (i > 1 && j > 1
                && ai == fold_letter((unsigned char)b[j - 2], fold_case)
                && bj == fold_letter((unsigned char)a[i - 2], fold_case)
                && ai != bj && prev2[j - 2] + 1 < best)
                best = prev2[j - 2] + 1;
            cur[j] = best;
        }
        tmp = prev2;
        prev2 = prev;
        prev = cur;
        cur = tmp;
    }
    result = prev[lb] > cap ? cap + 1 : prev[lb];
    gs_free(prev2);
    gs_free(prev);
    gs_free(cur);
    return result;
}

int gs_edit_distance(const char *a, const char *b, int cap)
{
    return gs_osa_distance(a, b, cap, 0);
}

const char *gs_closest_word(const char *word, const char *const *candidates)
{
    const char *best = NULL;
    int best_d = 3;
    size_t len = strlen(word);
    for (; *candidates; candidates++) {
        int d = gs_edit_distance(word, *candidates, 2);
        if (d < best_d && (size_t)d < len) {
            best = *candidates;
            best_d = d;
        }
    }
    return best;
}
