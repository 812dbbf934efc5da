/* mem.c - allocation that never returns NULL. See LICENSE. */
#include "base/mem.h"

#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void out_of_memory(size_t size)
{
    fprintf(stderr, "gainsmith: out of memory (asked for %zu bytes)\n", size);
    exit(1);
}

void *gs_malloc(size_t size)
{
    void *p = malloc(size ? size : 1);
    if (p == NULL)
        out_of_memory(size);
    return p;
}

void *gs_calloc(size_t count, size_t size)
{
    void *p = calloc(count ? count : 1, size ? size : 1);
    if (p == NULL)
        out_of_memory(count * size);
    return p;
}

void *gs_realloc(void *ptr, size_t size)
{
    void *p = realloc(ptr, size ? size : 1);
    if (p == NULL)
        out_of_memory(size);
    return p;
}

void *gs_reallocarray(void *ptr, size_t count, size_t size)
{
    if (size != 0 && count > SIZE_MAX / size)
        out_of_memory(SIZE_MAX);
    return gs_realloc(ptr, count * size);
}

char *gs_strndup(const char *s, size_t n)
{
    /* at most n bytes are read: s need not be terminated within them */
    const char *nul = memchr(s, '\0', n);
    size_t len = nul ? (size_t)(nul - s) : n;
    char *p;
    p = gs_malloc(len + 1);
    memcpy(p, s, len);
    p[len] = '\0';
    return p;
}

char *gs_strdup(const char *s)
{
    return gs_strndup(s, strlen(s));
}

char *gs_vasprintf(const char *fmt, va_list ap)
{
    va_list aq;
    int n;
    char *p;
    va_copy(aq, ap);
    n = vsnprintf(NULL, 0, fmt, aq);
    va_end(aq);
    p = gs_malloc(n > 0 ? (size_t)n + 1 : 1);
    p[0] = '\0';
    if (n > 0)
        vsnprintf(p, (size_t)n + 1, fmt, ap);
    return p;
}

char *gs_asprintf(const char *fmt, ...)
{
    va_list ap;
    char *p;
    va_start(ap, fmt);
    p = gs_vasprintf(fmt, ap);
    va_end(ap);
    return p;
}

void *gs_grow(void *v, size_t n, size_t *alloc, size_t size)
{
    if (n < *alloc && v != NULL)
        return v;
    *alloc = *alloc > n ? *alloc : (n < 8 ? 16 : 2 * n);
    return gs_reallocarray(v, *alloc, size);
}
