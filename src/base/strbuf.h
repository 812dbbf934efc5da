/* strbuf.h - a growable NUL-terminated string, the one the printers
 * build their text in.  See LICENSE.
 */
#ifndef GS_STRBUF_H
#define GS_STRBUF_H

#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>

/* p[0 .. n) is the text, p[n] is NUL, cap bytes are allocated.  The
   caller owns the struct; gs_strbuf_clear frees p, or the caller takes p
   (free it with gs_free()) and drops the struct.  With a sink the text is
   written out whenever the buffer fills, so p holds only what came since
   (a printer streams a result of any size through 64 KiB). */
typedef struct gs_strbuf {
    char *p;
    size_t n, cap;
    FILE *sink;             /* NULL: the whole text is kept */
    /* Where the pieces go instead, when not NULL: put(put_arg, piece,
       length).  A piece is what came since the last one, and never
       splits what one gs_strbuf_addn appended when it fits the buffer. */
    void (*put)(void *put_arg, const char *p, size_t n);
    void *put_arg;
} gs_strbuf;

void gs_strbuf_init(gs_strbuf *b);          /* the empty string */
/* The empty string streamed to sink; gs_strbuf_flush writes the rest. */
void gs_strbuf_init_sink(gs_strbuf *b, FILE *sink);
/* The empty string streamed to put (see above). */
void gs_strbuf_init_put(gs_strbuf *b,
                        void (*put)(void *put_arg, const char *p, size_t n),
                        void *put_arg);
void gs_strbuf_flush(gs_strbuf *b);
void gs_strbuf_clear(gs_strbuf *b);
/* room for `more` bytes after the text and its NUL (doubling; with a
   sink, after writing the text out) */
void gs_strbuf_reserve(gs_strbuf *b, size_t more);

/* Append s[0 .. n); inline, as the printers append a few bytes at a
   time. */
static inline void gs_strbuf_addn(gs_strbuf *b, const char *s, size_t n)
{
    if (b->n + n + 1 > b->cap)
        gs_strbuf_reserve(b, n);
    memcpy(b->p + b->n, s, n);
    b->n += n;
    b->p[b->n] = '\0';
}

static inline void gs_strbuf_add(gs_strbuf *b, const char *s)
{
    gs_strbuf_addn(b, s, strlen(s));
}

/* v in decimal at out, without printf (a printer writes millions of
   small coefficients and exponents): 20 bytes at most, no NUL; the count
   written. */
static inline size_t gs_fmt_u64(char *out, uint64_t v)
{
    char d[20];             /* 2^64 - 1 has 20 digits */
    size_t n = sizeof d;
    do {
        d[--n] = (char)('0' + v % 10);
        v /= 10;
    } while (v != 0);
    memcpy(out, d + n, sizeof d - n);
    return sizeof d - n;
}

/* Append v in decimal ("0", "42"). */
static inline void gs_strbuf_add_u64(gs_strbuf *b, uint64_t v)
{
    if (b->n + 21 > b->cap)
        gs_strbuf_reserve(b, 20);
    b->n += gs_fmt_u64(b->p + b->n, v);
    b->p[b->n] = '\0';
}

#endif
