/* poly_heap.h - the priority queue of monomials shared by polynomial
 * multiplication and division (internal to poly_*.c).  See LICENSE.
 *
 * A binary max-heap (Williams, CACM 7, 1964) of two-word entries: the
 * first word of a packed exponent vector, and a payload whose high 32 bits
 * name a slot.  The whole key of slot i lives in keys[i * nw ..], owned by
 * the caller, and is read only when first words tie, so entries move as
 * two words whatever the number of variables (Monagan and Pearce keep
 * pointers to monomials in their heaps for the same reason).  Each slot
 * is in the heap at most once.  Moves use a hole instead of swaps.
 */
#ifndef GS_POLY_HEAP_H
#define GS_POLY_HEAP_H

#include <stdint.h>
#include <stdlib.h>

#include "mem.h"

#if defined(__SIZEOF_INT128__)
__extension__ typedef __int128 gs_i128;
__extension__ typedef unsigned __int128 gs_u128;
#define GS_HAVE_I128 1
#else
#define GS_HAVE_I128 0
#endif

typedef struct gs_pheap_entry {
    uint64_t k0;        /* first key word */
    uint64_t pl;        /* payload: slot << 32 | user bits */
} gs_pheap_entry;

typedef struct gs_pheap {
    gs_pheap_entry *v;
    size_t n, alloc;
    int nw;
    const uint64_t *keys;   /* borrowed: nw words per slot */
} gs_pheap;

static inline void gs_pheap_init(gs_pheap *h, int nw, size_t hint)
{
    h->nw = nw;
    h->n = 0;
    h->alloc = hint > 4 ? hint : 4;
    h->v = gs_reallocarray(NULL, h->alloc, sizeof *h->v);
    h->keys = NULL;
}

static inline void gs_pheap_clear(gs_pheap *h)
{
    free(h->v);
    h->v = NULL;
    h->n = h->alloc = 0;
}

static inline const uint64_t *gs_pheap_key(const gs_pheap *h, uint64_t pl)
{
    return h->keys + (size_t)(pl >> 32) * (size_t)h->nw;
}

/* entry x against entry y in the monomial order: <0, 0, >0 */
static inline int gs_pheap_cmp(const gs_pheap *h, const gs_pheap_entry *x,
                               const gs_pheap_entry *y)
{
    const uint64_t *kx, *ky;
    int w;
    if (x->k0 != y->k0)
        return x->k0 > y->k0 ? 1 : -1;
    if (h->nw == 1)
        return 0;
    kx = gs_pheap_key(h, x->pl);
    ky = gs_pheap_key(h, y->pl);
    for (w = 1; w < h->nw; w++)
        if (kx[w] != ky[w])
            return kx[w] > ky[w] ? 1 : -1;
    return 0;
}

/* the top entry against a whole key */
static inline int gs_pheap_cmp_top(const gs_pheap *h, const uint64_t *key)
{
    const uint64_t *kt = gs_pheap_key(h, h->v[0].pl);
    int w;
    if (h->v[0].k0 != key[0])
        return h->v[0].k0 > key[0] ? 1 : -1;
    for (w = 1; w < h->nw; w++)
        if (kt[w] != key[w])
            return kt[w] > key[w] ? 1 : -1;
    return 0;
}

/* Keep v[n] a sentinel smaller than or equal to every key, so that the
   one-word sift below may look at a missing right child. */
static inline void gs_pheap_sentinel(gs_pheap *h)
{
    h->v[h->n].k0 = 0;
    h->v[h->n].pl = 0;
}

static inline void gs_pheap_sift_up(gs_pheap *h, size_t k, gs_pheap_entry e)
{
    while (k > 0) {
        size_t p = (k - 1) / 2;
        if (gs_pheap_cmp(h, &h->v[p], &e) >= 0)
            break;
        h->v[k] = h->v[p];
        k = p;
    }
    h->v[k] = e;
}

/* Insert slot pl >> 32, whose key the caller has stored in keys. */
static inline void gs_pheap_push(gs_pheap *h, uint64_t pl)
{
    gs_pheap_entry e;
    if (h->n + 1 >= h->alloc) {
        h->alloc *= 2;
        h->v = gs_reallocarray(h->v, h->alloc, sizeof *h->v);
    }
    e.k0 = gs_pheap_key(h, pl)[0];
    e.pl = pl;
    h->n++;
    gs_pheap_sentinel(h);
    gs_pheap_sift_up(h, h->n - 1, e);
}

/* Fill the hole at the top with e.  Bottom-up (Wegener, "Bottom-up
   heapsort", TCS 118, 1993): walk the hole down along the larger
   children to a leaf, one comparison a level, then let e climb back; e
   is a successor of the entry it replaces, so it seldom climbs far.  With
   one-word keys the child choice is a branch-free compare. */
static inline void gs_pheap_sift_down(gs_pheap *h, gs_pheap_entry e)
{
    size_t k = 0, c, n = h->n;
    if (h->nw == 1) {
        gs_pheap_entry *v = h->v;
        while ((c = 2 * k + 1) < n) {
            c += v[c + 1].k0 > v[c].k0;     /* v[n] is the sentinel */
            v[k] = v[c];
            k = c;
        }
    } else {
        while ((c = 2 * k + 1) < n) {
            if (c + 1 < n && gs_pheap_cmp(h, &h->v[c + 1], &h->v[c]) > 0)
                c++;
            h->v[k] = h->v[c];
            k = c;
        }
    }
    gs_pheap_sift_up(h, k, e);
}

/* Replace the top by slot pl >> 32 (typically the same slot, its key
   advanced by the caller). */
static inline void gs_pheap_replace_top(gs_pheap *h, uint64_t pl)
{
    gs_pheap_entry e;
    e.k0 = gs_pheap_key(h, pl)[0];
    e.pl = pl;
    gs_pheap_sift_down(h, e);
}

static inline void gs_pheap_pop(gs_pheap *h)
{
    if (--h->n > 0)
        gs_pheap_sift_down(h, h->v[h->n]);
    gs_pheap_sentinel(h);
}

/* Compact keys.  The heap compares exponent vectors repacked with just
   enough bits per variable for the largest exponent that can occur
   (Monagan and Pearce pack monomials as tightly for the same reason):
   fields keep the variable order, most significant first, and never
   straddle a word, so word comparison is still the lex order and sums
   stay exact.  Often the whole key fits in one word. */
typedef struct gs_ppack {
    int nvars;
    int nw;             /* words of a compact key, at least 1 */
    int *word;          /* per variable: word, or -1 when always 0 */
    int *shift;
} gs_ppack;

/* maxv[v] bounds variable v's exponent in every key (0: left out). */
static inline void gs_ppack_init(gs_ppack *p, const unsigned *maxv,
                                 int nvars)
{
    int v, pos = 64, w = 0;
    p->nvars = nvars;
    p->word = gs_malloc(2 * ((size_t)nvars + 1) * sizeof *p->word);
    p->shift = p->word + nvars + 1;
    for (v = 0; v < nvars; v++) {
        int bits = 0;
        while (bits < 16 && (maxv[v] >> bits) != 0)
            bits++;
        p->word[v] = -1;
        p->shift[v] = 0;
        if (bits == 0)
            continue;
        if (bits > pos) {
            w++;
            pos = 64;
        }
        pos -= bits;
        p->word[v] = w;
        p->shift[v] = pos;
    }
    p->nw = w + 1;
}

static inline void gs_ppack_clear(gs_ppack *p)
{
    free(p->word);
}

/* out = compact form of the packed exponent vector e (poly.h layout) */
static inline void gs_ppack_pack(const gs_ppack *p, uint64_t *out,
                                 const uint64_t *e)
{
    int v;
    for (v = 0; v < p->nw; v++)
        out[v] = 0;
    for (v = 0; v < p->nvars; v++)
        if (p->word[v] >= 0)
            out[p->word[v]] |= ((e[v / 4] >> (48 - 16 * (v % 4))) & 0xFFFFu)
                << p->shift[v];
}

#endif
