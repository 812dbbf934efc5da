/* diag.h - located diagnostics (errors, warnings, hints). See LICENSE. */
#ifndef GS_DIAG_H
#define GS_DIAG_H

#include <stddef.h>
#include <stdio.h>

#include "gainsmith.h"

enum { GS_SEV_ERROR, GS_SEV_WARNING, GS_SEV_NOTE };

/* One message.  line and col are 1-based (col counts characters, not
   bytes); line 0 means "no location", printed as "gainsmith: error: ...". */
typedef struct gs_diag_entry {
    int severity;
    char *file;     /* owned copy, may be NULL */
    int line, col;
    char *message;  /* owned */
    char *hint;     /* owned, may be NULL: printed as a "hint:" line */
    char *subject;  /* owned, may be NULL: what the message is about when
                       it has no place in the file (an output's name),
                       printed after the file: "amp.gsc: Acm: error: ..." */
} gs_diag_entry;

/* A list of messages, in the order they were added.  The caller owns the
   struct (gs_diag_init / gs_diag_clear); the list owns its entries. */
typedef struct gs_diag {
    gs_diag_entry *v;
    size_t n, alloc;
    size_t nerrors, nwarnings;
    size_t max_errors;  /* 0: unlimited; past it further errors are counted
                           but not stored */
} gs_diag;

void gs_diag_init(gs_diag *d);
void gs_diag_clear(gs_diag *d);

/* Add a message.  file may be NULL; hint may be NULL.  Copies everything. */
void gs_diag_add(gs_diag *d, int severity, const char *file, int line,
                 int col, const char *hint, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 7, 8)))
#endif
    ;

/* Print every message as "FILE:LINE:COL: error: message" followed by
   "FILE:LINE:COL: hint: ..." where there is a hint, and a final line
   "N more errors not shown" if max_errors cut the list. */
void gs_diag_print(FILE *out, const gs_diag *d);

/* Move every entry of src to the end of dst and count them there; src is
   left empty (initialised). */
void gs_diag_append(gs_diag *dst, gs_diag *src);

/* Column (1-based, in UTF-8 characters) of byte offset `off` in the line
   that starts at `line_start`. */
int gs_diag_column(const char *line_start, size_t off);

/* Optimal string alignment distance between a and b (Levenshtein with a
   swap of neighbouring letters as one edit), capped: returns at most
   cap + 1; letter case ignored when fold_case.  For did-you-mean hints. */
int gs_osa_distance(const char *a, const char *b, int cap, int fold_case);
/* gs_osa_distance with letter case significant. */
int gs_edit_distance(const char *a, const char *b, int cap);
/* The candidate closest to word (distance <= 2 and less than its
   length), or NULL: candidates is a NULL-terminated list. */
const char *gs_closest_word(const char *word, const char *const *candidates);

#endif
