/* diag.c - located diagnostics (errors, warnings, hints). See LICENSE. */
#include "base/diag.h"
#include "base/mem.h"

#include <stdarg.h>
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
        free(d->v[i].file);
        free(d->v[i].message);
        free(d->v[i].hint);
    }
    free(d->v);
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
    e.hint = hint ? gs_strdup(hint) : NULL;
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

/* Levenshtein distance between a and b, capped: returns at most cap + 1. */
static int gs_edit_distance(const char *a, const char *b, int cap)
{
    size_t la = strlen(a), lb = strlen(b), i, j;
    int *prev, *cur, *tmp, result;
    if (la > lb + (size_t)cap || lb > la + (size_t)cap)
        return cap + 1;
    prev = gs_malloc((lb + 1) * sizeof *prev);
    cur = gs_malloc((lb + 1) * sizeof *cur);
    for (j = 0; j <= lb; j++)
        prev[j] = (int)j;
    for (i = 1; i <= la; i++) {
        cur[0] = (int)i;
        for (j = 1; j <= lb; j++) {
            int sub = prev[j - 1] + (a[i - 1] != b[j - 1]);
            int del = prev[j] + 1, ins = cur[j - 1] + 1;
            int best = sub < del ? sub : del;
            cur[j] = best < ins ? best : ins;
        }
        tmp = prev;
        prev = cur;
        cur = tmp;
    }
    result = prev[lb] > cap ? cap + 1 : prev[lb];
    free(prev);
    free(cur);
    return result;
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
