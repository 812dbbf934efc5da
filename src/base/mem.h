/* mem.h - allocation that never returns NULL. See LICENSE. */
#ifndef GS_MEM_H
#define GS_MEM_H

#include <stdarg.h>
#include <stddef.h>

/* These behave like malloc, calloc, realloc and strdup, except that on
   exhaustion they print one message to stderr and exit with status 1: the
   single place where the library stops the process (STYLE.md). A zero size
   returns a valid unique pointer.  Free with free(). */
void *gs_malloc(size_t size);
void *gs_calloc(size_t count, size_t size);
void *gs_realloc(void *ptr, size_t size);
/* realloc to count*size bytes, failing cleanly if the product overflows */
void *gs_reallocarray(void *ptr, size_t count, size_t size);
char *gs_strdup(const char *s);
char *gs_strndup(const char *s, size_t n);
/* printf into a fresh string the caller frees */
char *gs_asprintf(const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 1, 2)))
#endif
    ;
/* The same from a va_list, which it consumes (va_end is the caller's);
   the one place that sizes a formatted string. */
char *gs_vasprintf(const char *fmt, va_list ap)
#if defined(__GNUC__)
    __attribute__((format(printf, 1, 0)))
#endif
    ;
/* An array v of *alloc items of size `size`, grown (doubling) if need be
   to hold n + 1 items; returns the array, *alloc updated. */
void *gs_grow(void *v, size_t n, size_t *alloc, size_t size);

#endif
