/* poly_impl.h - internals shared by poly_mul.c, poly_div.c and
 * poly_block.c: a heap of monomials, compact keys, operands cut into
 * blocks.  See LICENSE.
 *
 * The heap is a binary max-heap (Williams, CACM 7, 1964) of two-word
 * entries: the first word of a packed exponent vector, and a payload
 * whose high 32 bits name a slot.  The whole key of slot i lives in
 * keys[i * nw ..], owned by the caller, and is read only when first words tie, so entries move as
 * two words whatever the number of variables (Monagan and Pearce keep
 * pointers to monomials in their heaps for the same reason).  Each slot
 * is in the heap at most once.  Moves use a hole instead of swaps.
 */
#ifndef GS_POLY_IMPL_H
#define GS_POLY_IMPL_H

#include <stdint.h>
#include <stdlib.h>

#include "base/mem.h"
#include "algebra/poly.h"

/* GS_PORTABLE_INT (the plain C build of int.c, for tests) also leaves
   out the 128-bit and three-word accumulators: the paths a compiler
   without __int128 takes. */
#if defined(__SIZEOF_INT128__) && !defined(GS_PORTABLE_INT)
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
    h->v[0].k0 = h->v[0].pl = 0;    /* the sentinel, see below */
}

static inline void gs_pheap_clear(gs_pheap *h)
{
    gs_free(h->v);
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

/* Fill the hole at the top with e, moving larger children up.  With
   one-word keys the choice of child is a branch-free compare (v[n] is
   the sentinel, so a missing right child is never chosen), which matters
   because that choice is a coin toss for the branch predictor. */
static inline void gs_pheap_sift_down(gs_pheap *h, gs_pheap_entry e)
{
    size_t k = 0, n = h->n, c;
    gs_pheap_entry *v = h->v;
    if (h->nw == 1) {
        while ((c = 2 * k + 1) < n) {
            c += v[c + 1].k0 > v[c].k0;
            if (v[c].k0 <= e.k0)
                break;
            v[k] = v[c];
            k = c;
        }
        v[k] = e;
        return;
    }
    while ((c = 2 * k + 1) < n) {
        if (c + 1 < n && gs_pheap_cmp(h, &v[c + 1], &v[c]) > 0)
            c++;
        if (gs_pheap_cmp(h, &v[c], &e) <= 0)
            break;
        v[k] = v[c];
        k = c;
    }
    v[k] = e;
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
    gs_pheap_entry e = h->v[--h->n];
    gs_pheap_sentinel(h);
    if (h->n > 0)
        gs_pheap_sift_down(h, e);
}

static inline void gs_pheap_empty(gs_pheap *h)
{
    h->n = 0;
    gs_pheap_sentinel(h);
}

/* Compact keys.  The heap compares exponent vectors repacked with just
   enough bits per variable for the largest exponent that can occur
   (Monagan and Pearce pack monomials as tightly for the same reason):
   fields keep the variable order, most significant first, and never
   straddle a word, so word comparison is still the lex order and sums
   stay exact.  Often the whole key fits in one word. */
typedef struct gs_ppack {
    int nw;             /* words of a compact key, at least 1 */
    int nact;           /* variables that take part */
    int *from;          /* per active variable: poly.h word * 64 + shift */
    int *to;            /* and compact word * 64 + shift */
} gs_ppack;

/* maxv[v] bounds variable v's exponent in every key (0: left out). */
static inline void gs_ppack_init(gs_ppack *p, const unsigned *maxv,
                                 int nvars)
{
    int v, pos = 64, w = 0;
    p->from = gs_malloc(2 * ((size_t)nvars + 1) * sizeof *p->from);
    p->to = p->from + nvars + 1;
    p->nact = 0;
    for (v = 0; v < nvars; v++) {
        int bits = 0;
        while (bits < 16 && (maxv[v] >> bits) != 0)
            bits++;
        if (bits == 0)
            continue;
        if (bits > pos) {
            w++;
            pos = 64;
        }
        pos -= bits;
        p->from[p->nact] = (v / GS_POLY_VARS_PER_WORD) * 64
                           + gs_poly_field_shift(v);
        p->to[p->nact++] = w * 64 + pos;
    }
    p->nw = w + 1;
}

static inline void gs_ppack_clear(gs_ppack *p)
{
    gs_free(p->from);
}

/* out = compact form of the packed exponent vector e (poly.h layout) */
static inline void gs_ppack_pack(const gs_ppack *p, uint64_t *out,
                                 const uint64_t *e)
{
    int k;
    if (p->nw == 1) {           /* the usual case: one word, in a register */
        uint64_t x = 0;
        for (k = 0; k < p->nact; k++) {
            int f = p->from[k];
            x |= ((e[f >> 6] >> (f & 63)) & GS_POLY_FIELD_MASK)
                 << (p->to[k] & 63);
        }
        out[0] = x;
        return;
    }
    for (k = 0; k < p->nw; k++)
        out[k] = 0;
    for (k = 0; k < p->nact; k++) {
        int f = p->from[k], t = p->to[k];
        out[t >> 6] |= ((e[f >> 6] >> (f & 63)) & GS_POLY_FIELD_MASK)
                       << (t & 63);
    }
}

/* Blocks.  The variables are cut into a prefix 0 .. m-1 and a suffix
   m .. nvars-1; the terms of an operand that share their prefix
   exponents form a block, contiguous in the lex order.  Within a block
   the suffix exponents are read as the digits of a mixed-radix number
   (Kronecker's substitution): with radices above every exponent sum that
   can occur, the index of a product of terms is the sum of their indices,
   and decreasing index is decreasing lex order. */
typedef struct gs_playout {
    const gs_polyctx *ctx;
    int nw;             /* words of a poly.h exponent vector */
    int kw;             /* words of a compact prefix key */
    int m;              /* prefix length */
    size_t dsize;       /* product of the suffix radices */
    unsigned *radix;    /* per variable */
    size_t *stride;     /* per variable; 0 in the prefix */
    uint64_t *inv;      /* per suffix variable: ceil(2^32 / stride), then
                           ceil(2^32 / radix), for digit() */
    uint64_t *premask;  /* nw words: all-ones fields over the prefix */
    gs_ppack pk;        /* compact form of prefixes, for the heap */
} gs_playout;

/* radix[v] > every exponent of v that sums of terms can reach */
void gs_playout_init(gs_playout *lay, const gs_polyctx *ctx, int m,
                     const unsigned *radix);
void gs_playout_clear(gs_playout *lay);
/* OR the suffix exponents of dense index k into e (poly.h layout) */
void gs_playout_decode(const gs_playout *lay, uint64_t *e, size_t k);

/* Digit v of dense index k, (k / stride) % radix, by multiplications:
   for k, d < 2^16 and c = ceil(2^32 / d), floor(k c / 2^32) = floor(k / d)
   since the error k (c d - 2^32) / 2^32 d stays below 1/d (Granlund and
   Montgomery, "Division by invariant integers using multiplication",
   PLDI 1994).  Dense sizes are at most 2^16. */
static inline unsigned gs_playout_digit(const gs_playout *lay, size_t k,
                                        int v)
{
    uint64_t q = ((uint64_t)k * lay->inv[2 * v]) >> 32;
    uint64_t r = (q * lay->inv[2 * v + 1]) >> 32;
    return (unsigned)(q - r * lay->radix[v]);
}

/* One operand cut into blocks. */
typedef struct gs_pside {
    size_t nterms, nblocks;
    size_t *start;      /* block k is terms start[k] .. start[k+1]-1 */
    uint64_t *skey;     /* nblocks * nw: prefix exponents, poly.h layout */
    uint64_t *key;      /* nblocks * kw: the same, compact */
    uint32_t *idx;      /* per term: dense index of its suffix */
    int64_t *small;     /* per term coefficient when asked for, or NULL */
    const gs_int *coeffs;   /* borrowed */
} gs_pside;

/* small: also copy the coefficients, which must all fit in int64 */
void gs_pside_build(gs_pside *s, const gs_poly *p, const gs_playout *lay,
                    int small);
void gs_pside_clear(gs_pside *s);

/* blocks[m] for m = 0 .. nvars: the number of blocks of a with prefix
   length m (blocks[nvars] = length of a; 1 for m = 0 unless a = 0). */
void gs_poly_block_counts(size_t *blocks, const gs_poly *a,
                          const gs_polyctx *ctx);

/* Largest dense block, in entries: 2^16 entries of 16 bytes stay within
   the 1-2 MiB second-level cache of current processors. */
#define GS_POLY_DENSE_CAP 65536.0

#endif
