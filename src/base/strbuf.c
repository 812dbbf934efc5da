/* strbuf.c - a growable string; see strbuf.h.  See LICENSE. */
#include "base/strbuf.h"
#include "base/mem.h"

#include <stdlib.h>

void gs_strbuf_init(gs_strbuf *b)
{
    b->cap = 64;
    b->p = gs_malloc(b->cap);
    b->p[0] = '\0';
    b->n = 0;
    b->sink = NULL;
    b->put = NULL;
    b->put_arg = NULL;
}

void gs_strbuf_init_sink(gs_strbuf *b, FILE *sink)
{
    b->cap = 65536;
    b->p = gs_malloc(b->cap);
    b->p[0] = '\0';
    b->n = 0;
    b->sink = sink;
    b->put = NULL;
    b->put_arg = NULL;
}

void gs_strbuf_init_put(gs_strbuf *b,
                        void (*put)(void *put_arg, const char *p, size_t n),
                        void *put_arg)
{
    gs_strbuf_init_sink(b, NULL);
    b->put = put;
    b->put_arg = put_arg;
}

void gs_strbuf_flush(gs_strbuf *b)
{
    if ((b->sink || b->put) && b->n) {
        if (b->put)
            b->put(b->put_arg, b->p, b->n);
        else
            fwrite(b->p, 1, b->n, b->sink);
        b->n = 0;
        b->p[0] = '\0';
    }
}

void gs_strbuf_clear(gs_strbuf *b)
{
    gs_free(b->p);
    b->p = NULL;
    b->n = b->cap = 0;
    b->sink = NULL;
}

void gs_strbuf_reserve(gs_strbuf *b, size_t more)
{
    if (b->n + more + 1 <= b->cap)
        return;
    gs_strbuf_flush(b);
    if (b->n + more + 1 <= b->cap)
        return;
    while (b->n + more + 1 > b->cap)
        b->cap = b->cap ? 2 * b->cap : 64;
    b->p = gs_realloc(b->p, b->cap);
}
