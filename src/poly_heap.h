/* poly_heap.h - the priority queue of packed monomials shared by
 * polynomial multiplication and division (internal to poly_*.c).
 * See LICENSE.
 *
 * A binary max-heap (Williams 1964) whose entries are nw key words, a
 * packed exponent vector compared lexicographically as the monomial order,
 * followed by one payload word.  Moves use a hole instead of swaps.
 */
#ifndef GS_POLY_HEAP_H
#define GS_POLY_HEAP_H

#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "mem.h"

#if defined(__SIZEOF_INT128__)
__extension__ typedef __int128 gs_i128;
__extension__ typedef unsigned __int128 gs_u128;
#define GS_HAVE_I128 1
#else
#define GS_HAVE_I128 0
#endif

typedef struct gs_pheap {
    uint64_t *v;        /* n entries of nw + 1 words */
    size_t n, alloc;
    int nw;
} gs_pheap;

static inline void gs_pheap_init(gs_pheap *h, int nw, size_t hint)
{
    h->nw = nw;
    h->n = 0;
    h->alloc = hint > 4 ? hint : 4;
    h->v = gs_reallocarray(NULL, h->alloc, ((size_t)nw + 1) * 8);
}

static inline void gs_pheap_clear(gs_pheap *h)
{
    free(h->v);
    h->v = NULL;
    h->n = h->alloc = 0;
}

static inline uint64_t *gs_pheap_at(const gs_pheap *h, size_t k)
{
    return h->v + k * ((size_t)h->nw + 1);
}

static inline int gs_pheap_cmp(const uint64_t *x, const uint64_t *y, int nw)
{
    int w;
    for (w = 0; w < nw; w++)
        if (x[w] != y[w])
            return x[w] > y[w] ? 1 : -1;
    return 0;
}

static inline void gs_pheap_put(gs_pheap *h, size_t k, const uint64_t *key,
                                uint64_t payload)
{
    uint64_t *e = gs_pheap_at(h, k);
    memcpy(e, key, (size_t)h->nw * 8);
    e[h->nw] = payload;
}

/* key must not point into the heap */
static inline void gs_pheap_push(gs_pheap *h, const uint64_t *key,
                                 uint64_t payload)
{
    size_t k, sz = ((size_t)h->nw + 1) * 8;
    if (h->n == h->alloc) {
        h->alloc *= 2;
        h->v = gs_reallocarray(h->v, h->alloc, sz);
    }
    k = h->n++;
    while (k > 0) {
        size_t p = (k - 1) / 2;
        if (gs_pheap_cmp(gs_pheap_at(h, p), key, h->nw) >= 0)
            break;
        memcpy(gs_pheap_at(h, k), gs_pheap_at(h, p), sz);
        k = p;
    }
    gs_pheap_put(h, k, key, payload);
}

/* Replace the top by (key, payload) and restore the heap. */
static inline void gs_pheap_replace_top(gs_pheap *h, const uint64_t *key,
                                        uint64_t payload)
{
    size_t k = 0, n = h->n, sz = ((size_t)h->nw + 1) * 8;
    int nw = h->nw;
    for (;;) {
        size_t c = 2 * k + 1;
        if (c >= n)
            break;
        if (c + 1 < n && gs_pheap_cmp(gs_pheap_at(h, c + 1),
                                      gs_pheap_at(h, c), nw) > 0)
            c++;
        if (gs_pheap_cmp(gs_pheap_at(h, c), key, nw) <= 0)
            break;
        memcpy(gs_pheap_at(h, k), gs_pheap_at(h, c), sz);
        k = c;
    }
    gs_pheap_put(h, k, key, payload);
}

/* Remove the top; tmp is scratch of nw + 1 words. */
static inline void gs_pheap_pop(gs_pheap *h, uint64_t *tmp)
{
    if (--h->n == 0)
        return;
    memcpy(tmp, gs_pheap_at(h, h->n), ((size_t)h->nw + 1) * 8);
    gs_pheap_replace_top(h, tmp, tmp[h->nw]);
}

#endif
