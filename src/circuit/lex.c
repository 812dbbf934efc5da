/* lex.c - tokens of the circuit language, a statement at a time.
 * See LICENSE.
 */
#include "circuit/lex.h"
#include "base/mem.h"

#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gs_lex_init(gs_lexer *lx, const char *file, const char *what,
                 const char *text, size_t len)
{
    memset(lx, 0, sizeof *lx);
    lx->text = text;
    lx->len = len;
    lx->file = file;
    lx->what = what;
}

void gs_lex_clear(gs_lexer *lx)
{
    size_t i;
    for (i = 0; i < lx->ntok; i++)
        gs_free(lx->tok[i].text);
    for (i = 0; i < lx->nstmt; i++)
        gs_free(lx->stmt[i].err);
    gs_free(lx->tok);
    gs_free(lx->stmt);
    gs_free(lx->line_start);
    memset(lx, 0, sizeof *lx);
}

void gs_lex_position(const gs_lexer *lx, size_t off, int *line, int *col)
{
    size_t lo = 0, hi = lx->nlines;
    if (lx->what != NULL || lx->nlines == 0) {
        *line = *col = 0;
        return;
    }
    while (hi - lo > 1) {       /* last line that starts at or before off */
        size_t mid = lo + (hi - lo) / 2;
        if (lx->line_start[mid] <= off)
            lo = mid;
        else
            hi = mid;
    }
    *line = (int)lo + 1;
    *col = gs_diag_column(lx->text + lx->line_start[lo],
                          off - lx->line_start[lo]);
}

static void vreport(const gs_lexer *lx, gs_diag *d, int severity, size_t off,
                    const char *hint, const char *fmt, va_list ap)
{
    int line, col;
    char *msg = gs_vasprintf(fmt, ap);
    gs_lex_position(lx, off, &line, &col);
    if (lx->what != NULL)
        gs_diag_add(d, severity, NULL, 0, 0, hint, "%s: %s", lx->what, msg);
    else
        gs_diag_add(d, severity, lx->file, line, col, hint, "%s", msg);
    gs_free(msg);
}

void gs_lex_report(const gs_lexer *lx, gs_diag *d, int severity, size_t off,
                   const char *hint, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vreport(lx, d, severity, off, hint, fmt, ap);
    va_end(ap);
}

/* ---- cutting the text ---- */

static int is_ident_start(int ch)
{
    return (ch >= 'A' && ch <= 'Z') || (ch >= 'a' && ch <= 'z') || ch == '_';
}

static int is_digit(int ch)
{
    return ch >= '0' && ch <= '9';
}

static int is_ident_char(int ch)
{
    return is_ident_start(ch) || is_digit(ch);
}

static int is_space(int ch)
{
    return ch == ' ' || ch == '\t' || ch == '\r' || ch == '\f' || ch == '\v';
}

static void find_lines(gs_lexer *lx)
{
    size_t i, alloc = 64;
    lx->line_start = gs_malloc(alloc * sizeof *lx->line_start);
    lx->line_start[lx->nlines++] = 0;
    for (i = 0; i < lx->len; i++) {
        /* a line ends at LF, CR LF, or a CR alone (the old Macintosh
           convention); the CR of CR LF is blank space in the line */
        if (lx->text[i] != '\n'
            && (lx->text[i] != '\r'
                || (i + 1 < lx->len && lx->text[i + 1] == '\n')))
            continue;
        if (lx->nlines == alloc) {
            alloc *= 2;
            lx->line_start = gs_reallocarray(lx->line_start, alloc,
                                             sizeof *lx->line_start);
        }
        lx->line_start[lx->nlines++] = i + 1;
    }
}

static void push_token(gs_lexer *lx, gs_tok_kind kind, size_t off,
                       size_t end, int dotted)
{
    gs_token *t;
    if (lx->ntok == lx->atok) {
        lx->atok = lx->atok ? 2 * lx->atok : 64;
        lx->tok = gs_reallocarray(lx->tok, lx->atok, sizeof *lx->tok);
    }
    t = &lx->tok[lx->ntok++];
    t->kind = kind;
    t->dotted = dotted;
    t->off = off;
    t->text = gs_strndup(lx->text + off, end - off);
}

/* Is [p, q) only digits and dots: the mantissa before an exponent? */
static int only_mantissa(const char *p, const char *q)
{
    for (; p < q; p++)
        if (!is_digit(*p) && *p != '.')
            return 0;
    return 1;
}

/* End of a number word starting at p: letters, digits, dots, a sign right
   after the 'e' of an exponent, and the micro signs U+00B5 and U+03BC
   (gs_rat_parse decides what is a number). */
static const char *scan_number(const char *p, const char *end)
{
    const char *q = p;
    while (q < end) {
        unsigned char ch = (unsigned char)*q;
        if (is_ident_char(ch) || ch == '.')
            q++;
        else if ((ch == '+' || ch == '-') && q - p >= 2
                 && (q[-1] == 'e' || q[-1] == 'E')
                 && only_mantissa(p, q - 1))
            q++;
        else if (q + 1 < end && ((ch == 0xC2 && (unsigned char)q[1] == 0xB5)
                                 || (ch == 0xCE
                                     && (unsigned char)q[1] == 0xBC)))
            q += 2;
        else
            break;
    }
    return q;
}

int gs_number_is_well_formed(const char *text)
{
    const char *p = text;
    size_t n = 0;
    while (is_digit((unsigned char)*p))
        p++, n++;
    if (*p == '.')
        for (p++; is_digit((unsigned char)*p); p++)
            n++;
    if (n == 0)
        return 0;
    if (*p == 'e' || *p == 'E') {
        p++;
        if (*p == '+' || *p == '-')
            p++;
        if (!is_digit((unsigned char)*p))
            return 0;
        while (is_digit((unsigned char)*p))
            p++;
    }
    if (*p != '\0' && strchr("fpnumkMGT", *p) != NULL)
        p++;
    else if (strncmp(p, "\xc2\xb5", 2) == 0 || strncmp(p, "\xce\xbc", 2) == 0)
        p += 2;
    return *p == '\0';
}

static const char *scan_ident(const char *p, const char *end, int *dotted)
{
    const char *q = p + 1;
    *dotted = 0;
    for (;;) {
        if (q < end && is_ident_char((unsigned char)*q)) {
            q++;
        } else if (q + 1 < end && *q == '.'
                   && is_ident_char((unsigned char)q[1])) {
            *dotted = 1;
            q++;
        } else {
            break;
        }
    }
    while (q < end && *q == '\'') {     /* primes: Q1.b' */
        *dotted = 1;
        q++;
    }
    return q;
}

/* The closing quote of a string opened at p, or NULL if the line ends. */
static const char *scan_string(const char *p, const char *end)
{
    const char *q = p + 1;
    while (q < end && *q != '"') {
        if (*q == '\\' && q + 1 < end && (q[1] == '"' || q[1] == '\\'))
            q++;
        q++;
    }
    return q < end ? q : NULL;
}

/* The character at p as text for a message: a whole UTF-8 sequence, or
   \xNN for a control byte or a stray byte. */
static void show_char(char *buf, size_t size, const char *p, const char *end)
{
    unsigned char ch = (unsigned char)*p;
    size_t n = 1;
    if (ch >= 0xC0 && ch < 0xF8) {
        n = ch >= 0xF0 ? 4 : ch >= 0xE0 ? 3 : 2;
        if ((size_t)(end - p) < n)
            n = 0;
        else {
            size_t i;
            for (i = 1; i < n; i++)
                if (((unsigned char)p[i] & 0xC0) != 0x80)
                    n = 0;
        }
    } else if (ch < 0x20 || ch >= 0x7F) {
        n = 0;
    }
    if (n == 0)
        snprintf(buf, size, "\\x%02X", ch);
    else
        snprintf(buf, size, "%.*s", (int)n, p);
}

/* Is the rest of the line [p, end) blank or a comment? */
static int rest_is_blank(const char *p, const char *end)
{
    while (p < end && is_space((unsigned char)*p))
        p++;
    return p == end || *p == '#';
}

/* One lexical error per statement: later ones are side effects. */
static void lex_error(gs_stmt *st, size_t off, const char *msg)
{
    if (st->bad)
        return;
    st->bad = 1;
    st->err_off = off;
    st->err = gs_strdup(msg);
}

void gs_lex_report_bad(const gs_lexer *lx, gs_diag *d, const gs_stmt *st)
{
    if (st->bad)
        gs_lex_report(lx, d, GS_SEV_ERROR, st->err_off, NULL, "%s", st->err);
}

/* Tokens of one physical line [p, end) into statement st.  Returns 1 when
   the line ends in a continuation backslash. */
static int lex_line(gs_lexer *lx, gs_stmt *st, const char *p,
                    const char *end)
{
    const char *base = lx->text;
    while (p < end) {
        unsigned char ch = (unsigned char)*p;
        const char *q;
        int dotted = 0;
        if (is_space(ch)) {
            p++;
            continue;
        }
        if (ch == '#')
            return 0;
        if (ch == '\\' && rest_is_blank(p + 1, end))
            return 1;
        if (is_digit(ch) || (ch == '.' && p + 1 < end && is_digit(p[1]))) {
            q = scan_number(p, end);
            push_token(lx, GS_TK_NUMBER, (size_t)(p - base),
                       (size_t)(q - base), 0);
        } else if (is_ident_start(ch)) {
            q = scan_ident(p, end, &dotted);
            push_token(lx, GS_TK_IDENT, (size_t)(p - base),
                       (size_t)(q - base), dotted);
        } else if (ch == '"') {
            q = scan_string(p, end);
            if (q == NULL) {
                lex_error(st, (size_t)(p - base), "unterminated string");
                return 0;
            }
            q++;
            push_token(lx, GS_TK_STRING, (size_t)(p - base),
                       (size_t)(q - base), 0);
        } else if (strchr("=(),*/^+-", ch) != NULL && ch != '\0') {
            q = p + 1;
            push_token(lx, GS_TK_PUNCT, (size_t)(p - base),
                       (size_t)(q - base), 0);
        } else {
            char shown[16], msg[48];
            show_char(shown, sizeof shown, p, end);
            snprintf(msg, sizeof msg, "unexpected character '%s'", shown);
            lex_error(st, (size_t)(p - base), msg);
            q = p + 1;
        }
        p = q;
    }
    return 0;
}

static gs_stmt *open_stmt(gs_lexer *lx)
{
    gs_stmt *st;
    if (lx->nstmt == lx->astmt) {
        lx->astmt = lx->astmt ? 2 * lx->astmt : 32;
        lx->stmt = gs_reallocarray(lx->stmt, lx->astmt, sizeof *lx->stmt);
    }
    st = &lx->stmt[lx->nstmt];
    st->first = lx->ntok;
    st->n = 0;
    st->bad = 0;
    st->err_off = 0;
    st->err = NULL;
    return st;
}

/* Keep a statement that has tokens (or an error), ending it with END. */
static void close_stmt(gs_lexer *lx, gs_stmt *st)
{
    size_t off;
    st->n = lx->ntok - st->first;
    if (st->n == 0 && !st->bad)
        return;                         /* blank or comment line */
    off = st->n ? lx->tok[lx->ntok - 1].off
                  + strlen(lx->tok[lx->ntok - 1].text) : 0;
    push_token(lx, GS_TK_END, off, off, 0);
    lx->nstmt++;
}

void gs_lex_run(gs_lexer *lx)
{
    size_t i;
    int cont = 0;
    gs_stmt *st = NULL;

    find_lines(lx);
    for (i = 0; i < lx->nlines; i++) {
        const char *p = lx->text + lx->line_start[i];
        const char *end = i + 1 < lx->nlines
                          ? lx->text + lx->line_start[i + 1] - 1
                          : lx->text + lx->len;
        /* a UTF-8 byte-order mark that opens the file is no character */
        if (i == 0 && lx->len >= 3 && (unsigned char)p[0] == 0xEF
            && (unsigned char)p[1] == 0xBB && (unsigned char)p[2] == 0xBF)
            p += 3;
        if (!cont)
            st = open_stmt(lx);
        cont = lex_line(lx, st, p, end);
        if (!cont || i + 1 == lx->nlines)   /* a '\\' on the last line */
            close_stmt(lx, st);
    }
}

/* ---- cursor ---- */

void gs_cursor_init(gs_cursor *cur, const gs_lexer *lx, gs_diag *d,
                    const gs_stmt *st)
{
    cur->lx = lx;
    cur->d = d;
    cur->tok = lx->tok + st->first;
    cur->pos = 0;
    cur->depth = 0;
}

const gs_token *gs_cur_peek(const gs_cursor *cur)
{
    return &cur->tok[cur->pos];
}

const gs_token *gs_cur_next(gs_cursor *cur)
{
    const gs_token *t = &cur->tok[cur->pos];
    if (t->kind != GS_TK_END)
        cur->pos++;
    return t;
}

int gs_cur_is(const gs_cursor *cur, char ch)
{
    const gs_token *t = &cur->tok[cur->pos];
    return t->kind == GS_TK_PUNCT && t->text[0] == ch;
}

int gs_cur_accept(gs_cursor *cur, char ch)
{
    if (!gs_cur_is(cur, ch))
        return 0;
    cur->pos++;
    return 1;
}

void gs_cur_error(const gs_cursor *cur, const gs_token *t, const char *hint,
                  const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vreport(cur->lx, cur->d, GS_SEV_ERROR, t->off, hint, fmt, ap);
    va_end(ap);
}

void gs_cur_expected(const gs_cursor *cur, const gs_token *t,
                     const char *what, const char *hint)
{
    if (t->kind == GS_TK_END)
        gs_cur_error(cur, t, hint, "missing %s", what);
    else
        gs_cur_error(cur, t, hint, "expected %s, found '%s'", what, t->text);
}

/* ---- did you mean ---- */

const char *gs_suggest(const char *word, const char *const *cand, size_t n)
{
    size_t limit = strlen(word) <= 3 ? 1 : 2, best = limit + 1, i;
    const char *pick = NULL;
    for (i = 0; i < n; i++) {
        size_t dist;
        if (cand[i] == NULL || strcmp(cand[i], word) == 0)
            continue;
        /* a swap of neighbours ("otu" for "out") is one edit */
        dist = (size_t)gs_osa_distance(word, cand[i], (int)limit, 1);
        if (dist < best) {
            best = dist;
            pick = cand[i];
        }
    }
    return pick;
}

char *gs_suggest_hint(const char *word, const char *const *cand, size_t n)
{
    const char *pick = gs_suggest(word, cand, n);
    return pick ? gs_asprintf("did you mean '%s'?", pick) : NULL;
}
