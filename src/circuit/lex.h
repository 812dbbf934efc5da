/* lex.h - tokens of the circuit language, a statement at a time.
 * See LICENSE.
 *
 * The lexer cuts a whole text into statements (one a line, a trailing
 * backslash joining the next line, '#' starting a comment) and each
 * statement into tokens.  Tokens keep their byte offset; line and column
 * are worked out only when a message is made (gs_lex_position).  A
 * statement with a lexical error is flagged `bad` and keeps its first
 * error; the parser reports it, skips the statement and goes on with the
 * next one.
 */
#ifndef GS_LEX_H
#define GS_LEX_H

#include <stddef.h>

#include "base/diag.h"

typedef enum gs_tok_kind {
    GS_TK_END,      /* end of the statement: text "", off just past the
                       last token */
    GS_TK_IDENT,    /* [A-Za-z_][A-Za-z0-9_]*, possibly with inner dots
                       and trailing primes (M1.rds, Q1.b'): see dotted */
    GS_TK_NUMBER,   /* a word that starts with a digit or ".digit":
                       "10k", "1e-3", "007", and also bad ones ("4.7q") */
    GS_TK_STRING,   /* "..." (text keeps the quotes and escapes) */
    GS_TK_PUNCT     /* one of = ( ) , * / ^ + - */
} gs_tok_kind;

typedef struct gs_token {
    gs_tok_kind kind;
    int dotted;     /* IDENT with a '.' or a prime: names a device part */
    size_t off;     /* byte offset of the first character in the text */
    char *text;     /* as written, NUL-terminated; owned by the lexer */
} gs_token;

typedef struct gs_stmt {
    size_t first;   /* index of its first token in gs_lexer.tok */
    size_t n;       /* token count, not counting the END that follows */
    int bad;        /* it has a lexical error: */
    size_t err_off; /*   where */
    char *err;      /*   and the message (owned), see gs_lex_report_bad */
} gs_stmt;

/* Messages: with `what` NULL they are located (file:line:col); with
   `what` set (a one-line string such as a --set argument) they carry no
   location and start with "WHAT: ". */
typedef struct gs_lexer {
    const char *text;
    size_t len;
    const char *file;
    const char *what;
    size_t *line_start;     /* byte offset of each line's start */
    size_t nlines;
    gs_token *tok;
    size_t ntok, atok;
    gs_stmt *stmt;
    size_t nstmt, astmt;
} gs_lexer;

/* Borrow text[0 .. len) (it may hold NUL bytes) and file; both must
   outlive the lexer.  Then gs_lex_run cuts it into statements; a
   statement with a lexical error is kept, flagged bad, with its first
   error, which gs_lex_report_bad adds to d (so that messages come in the
   order of the file).  gs_lex_clear frees the tokens. */
void gs_lex_init(gs_lexer *lx, const char *file, const char *what,
                 const char *text, size_t len);
void gs_lex_run(gs_lexer *lx);
void gs_lex_report_bad(const gs_lexer *lx, gs_diag *d, const gs_stmt *st);
void gs_lex_clear(gs_lexer *lx);
/* Is text written as a number: digits with an optional fraction, an
   optional exponent and an optional SI prefix?  A well-formed number the
   parser still refuses is out of range. */
int gs_number_is_well_formed(const char *text);

/* 1-based line and column (in characters) of byte offset off; both 0
   for a lexer with `what` set. */
void gs_lex_position(const gs_lexer *lx, size_t off, int *line, int *col);

/* Add a message at byte offset off of lx's text (see gs_lexer). */
void gs_lex_report(const gs_lexer *lx, gs_diag *d, int severity, size_t off,
                   const char *hint, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 6, 7)))
#endif
    ;

/* A cursor over the tokens of one statement, for the parsers. */
typedef struct gs_cursor {
    const gs_lexer *lx;
    gs_diag *d;
    const gs_token *tok;    /* the statement's tokens, END-terminated */
    size_t pos;             /* current token */
    int depth;              /* nesting of parentheses being parsed */
} gs_cursor;

void gs_cursor_init(gs_cursor *cur, const gs_lexer *lx, gs_diag *d,
                    const gs_stmt *st);
const gs_token *gs_cur_peek(const gs_cursor *cur);
const gs_token *gs_cur_next(gs_cursor *cur);        /* stays on END */
/* Is the current token the punctuation character ch? */
int gs_cur_is(const gs_cursor *cur, char ch);
/* If so, step over it and return 1. */
int gs_cur_accept(gs_cursor *cur, char ch);
/* An error at token t (see gs_lex_report). */
void gs_cur_error(const gs_cursor *cur, const gs_token *t, const char *hint,
                  const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 4, 5)))
#endif
    ;
/* "expected WHAT, found 'TOKEN'" or, at the end, "missing WHAT". */
void gs_cur_expected(const gs_cursor *cur, const gs_token *t,
                     const char *what, const char *hint);

/* Did-you-mean: the candidate nearest to word in edit distance (letter
   case ignored), if it is close enough to be a likely slip (at most 1 edit
   for words of up to 3 letters, else at most 2), else NULL.  Ties go to the
   earliest candidate.  Levenshtein distance by the dynamic programme of
   Wagner and Fischer (J. ACM 21, 1974). */
const char *gs_suggest(const char *word, const char *const *cand, size_t n);
/* "did you mean 'X'?" for gs_suggest's answer, as a new string the caller
   frees, or NULL when there is none. */
char *gs_suggest_hint(const char *word, const char *const *cand, size_t n);

#endif
