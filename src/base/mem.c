/* mem.c - allocation that never returns NULL. See LICENSE.
 *
 * Under a guard (gs_mem_run) the live blocks are kept in one hash set per
 * thread, shared by nested guards: open addressing with linear probing
 * and deletion by backward shift (Knuth, TAOCP vol. 3, 6.4, Algorithm R),
 * so that no tombstones build up under the alloc/free churn of a
 * derivation.  Each entry carries the depth of the guard that owns it: a
 * failed inner guard frees the entries of its depth, a finished one
 * hands them to the guard around it.  The set's own storage comes from
 * libc directly and is never recorded in it.
 */
#include "base/mem.h"
#include "gainsmith.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct live_block {
    void *p;                /* NULL: empty slot */
    size_t depth;           /* the guard that owns it, 1 = outermost */
} live_block;

typedef struct guard {
    jmp_buf unwind;
    struct guard *outer;
    size_t depth;
    gs_mem_hook hook;
    void *hook_arg;
    size_t failed_bytes;
    gs_mem_cleanup *cleanups;   /* most recent first */
    /* the set, owned by the outermost guard, shared through the chain */
    live_block *slots;
    size_t cap;                 /* a power of two, or 0 */
    size_t n;
} guard;

static _Thread_local guard *current;

static void out_of_memory(size_t size)
{
    fprintf(stderr, "gainsmith: out of memory (asked for %zu bytes)\n", size);
    exit(1);
}

void gs_mem_exhausted(size_t bytes)
{
    guard *g = current;
    if (g != NULL) {
        g->failed_bytes = bytes;
        longjmp(g->unwind, 1);
    }
    out_of_memory(bytes);
    exit(1);    /* not reached; keeps noreturn honest for every compiler */
}

/* The set is the outermost guard's; inner guards reach it through it. */
static guard *set_owner(guard *g)
{
    while (g->outer != NULL)
        g = g->outer;
    return g;
}

/* Fibonacci hashing of the address (Knuth, TAOCP vol. 3, 6.4). */
static size_t slot_of(const void *p, size_t cap)
{
    uint64_t h = (uint64_t)(uintptr_t)p * UINT64_C(0x9E3779B97F4A7C15);
    return (size_t)(h >> 32) & (cap - 1);
}

static void set_put(guard *s, void *p, size_t depth)
{
    size_t i = slot_of(p, s->cap);
    while (s->slots[i].p != NULL)
        i = (i + 1) & (s->cap - 1);
    s->slots[i].p = p;
    s->slots[i].depth = depth;
    s->n++;
}

/* Room for one more entry at a load of at most one half; 0 if libc has
   no memory for a larger table. */
static int set_reserve(guard *s)
{
    live_block *old = s->slots;
    size_t oldcap = s->cap, k;
    if (2 * (s->n + 1) <= s->cap)
        return 1;
    s->cap = oldcap ? 2 * oldcap : 256;
    s->slots = calloc(s->cap, sizeof *s->slots);
    if (s->slots == NULL) {
        s->slots = old;
        s->cap = oldcap;
        return 0;
    }
    s->n = 0;
    for (k = 0; k < oldcap; k++)
        if (old[k].p != NULL)
            set_put(s, old[k].p, old[k].depth);
    free(old);
    return 1;
}

/* Forgets p; its owner's depth, or 0 if p was not recorded. */
static size_t set_remove(guard *s, const void *p)
{
    size_t mask = s->cap - 1, i, j, depth;
    if (s->cap == 0)
        return 0;
    for (i = slot_of(p, s->cap); s->slots[i].p != p; i = (i + 1) & mask)
        if (s->slots[i].p == NULL)
            return 0;
    depth = s->slots[i].depth;
    /* Algorithm R: move back every later entry of the run that the hole
       would cut off from its home slot */
    for (j = (i + 1) & mask; s->slots[j].p != NULL; j = (j + 1) & mask) {
        size_t home = slot_of(s->slots[j].p, s->cap);
        int movable = i <= j ? (home <= i || home > j)
                             : (home <= i && home > j);
        if (movable) {
            s->slots[i] = s->slots[j];
            i = j;
        }
    }
    s->slots[i].p = NULL;
    s->n--;
    return depth;
}

/* Records the fresh block p for the current guard g, or frees it and
   fails if the set cannot grow. */
static void *record(guard *g, void *p, size_t size)
{
    guard *s = set_owner(g);
    if (!set_reserve(s)) {
        free(p);
        gs_mem_exhausted(size);
    }
    set_put(s, p, g->depth);
    return p;
}

static void ask_hook(guard *g, size_t size)
{
    if (g->hook != NULL && g->hook(g->hook_arg, size))
        gs_mem_exhausted(size);
}

void *gs_malloc(size_t size)
{
    guard *g = current;
    void *p;
    if (g != NULL)
        ask_hook(g, size);
    p = malloc(size ? size : 1);
    if (p == NULL)
        gs_mem_exhausted(size);
    return g != NULL ? record(g, p, size) : p;
}

void *gs_calloc(size_t count, size_t size)
{
    guard *g = current;
    void *p;
    if (size != 0 && count > SIZE_MAX / size)
        gs_mem_exhausted(SIZE_MAX);
    if (g != NULL)
        ask_hook(g, count * size);
    p = calloc(count ? count : 1, size ? size : 1);
    if (p == NULL)
        gs_mem_exhausted(count * size);
    return g != NULL ? record(g, p, count * size) : p;
}

void *gs_realloc(void *ptr, size_t size)
{
    guard *g = current, *s;
    size_t depth;
    void *p;
    if (g == NULL) {
        p = realloc(ptr, size ? size : 1);
        if (p == NULL)
            out_of_memory(size);
        return p;
    }
    if (ptr == NULL)
        return gs_malloc(size);
    ask_hook(g, size);
    /* forget ptr first (its address is gone once realloc succeeds), and
       record it again if realloc fails and leaves it as it was */
    s = set_owner(g);
    depth = set_remove(s, ptr);
    p = realloc(ptr, size ? size : 1);
    if (p == NULL) {
        if (depth != 0)
            set_put(s, ptr, depth);     /* its slot is still free */
        gs_mem_exhausted(size);
    }
    if (depth != 0)
        set_put(s, p, depth);
    return p;
}

void *gs_reallocarray(void *ptr, size_t count, size_t size)
{
    if (size != 0 && count > SIZE_MAX / size)
        gs_mem_exhausted(SIZE_MAX);
    return gs_realloc(ptr, count * size);
}

void gs_free(void *p)
{
    if (p != NULL && current != NULL)
        set_remove(set_owner(current), p);
    free(p);
}

struct gs_mem_cleanup {
    void (*fn)(void *arg);
    void *arg;
    struct gs_mem_cleanup *next;
};

gs_mem_cleanup *gs_mem_defer(void (*fn)(void *arg), void *arg)
{
    gs_mem_cleanup *c;
    if (current == NULL)
        return NULL;
    c = malloc(sizeof *c);     /* from libc: never one of the set's */
    if (c == NULL) {
        fn(arg);
        gs_mem_exhausted(sizeof *c);
    }
    c->fn = fn;
    c->arg = arg;
    c->next = current->cleanups;
    current->cleanups = c;
    return c;
}

void gs_mem_undefer(gs_mem_cleanup *c)
{
    gs_mem_cleanup **at;
    guard *g;
    if (c == NULL)
        return;
    for (g = current; g != NULL; g = g->outer)
        for (at = &g->cleanups; *at != NULL; at = &(*at)->next)
            if (*at == c) {
                *at = c->next;
                free(c);
                return;
            }
}

/* The guard failed: its clean-ups, then every block it owns. */
static void unwind(guard *g)
{
    guard *s = set_owner(g);
    size_t k;
    while (g->cleanups != NULL) {
        gs_mem_cleanup *c = g->cleanups;
        g->cleanups = c->next;
        c->fn(c->arg);
        free(c);
    }
    for (k = 0; k < s->cap; k++) {
        /* a removal shifts later entries back into slot k: look again */
        while (s->slots[k].p != NULL && s->slots[k].depth >= g->depth) {
            void *p = s->slots[k].p;
            set_remove(s, p);
            free(p);
        }
    }
}

/* The guard finished: its blocks and clean-ups pass to the outer one. */
static void hand_over(guard *g)
{
    guard *s = set_owner(g);
    size_t k;
    if (g->outer == NULL)
        return;
    for (k = 0; k < s->cap; k++)
        if (s->slots[k].p != NULL && s->slots[k].depth == g->depth)
            s->slots[k].depth = g->outer->depth;
    while (g->cleanups != NULL) {
        gs_mem_cleanup *c = g->cleanups;
        g->cleanups = c->next;
        c->next = g->outer->cleanups;
        g->outer->cleanups = c;
    }
}

static void guard_pop(guard *g)
{
    current = g->outer;
    if (g->outer == NULL)
        free(g->slots);
}

int gs_mem_run(int (*fn)(void *arg), void *arg, gs_mem_hook hook,
               void *hook_arg, size_t *failed_bytes)
{
    guard g;
    int rc;
    memset(&g, 0, sizeof g);
    g.outer = current;
    g.depth = current ? current->depth + 1 : 1;
    g.hook = hook ? hook : current ? current->hook : NULL;
    g.hook_arg = hook ? hook_arg : current ? current->hook_arg : NULL;
    current = &g;
    if (setjmp(g.unwind) != 0) {
        unwind(&g);
        guard_pop(&g);
        if (failed_bytes)
            *failed_bytes = g.failed_bytes;
        return GS_ENOMEM;
    }
    rc = fn(arg);
    hand_over(&g);
    guard_pop(&g);
    return rc;
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
