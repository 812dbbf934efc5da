/* poly.c - sparse polynomials over Z: storage, order, sums, scalars,
 * monomials, content, degrees, calculus, limits, evaluation.
 * See LICENSE.
 *
 * Multiplication and powers are in poly_mul.c, exact division in
 * poly_div.c, text in poly_print.c, the gcd in poly_gcd.c, substitution
 * (which multiplies) in poly_subst.c.
 */
#include "algebra/poly.h"

#include "gainsmith.h"
#include "base/mem.h"

#include <assert.h>
#include <stdlib.h>
#include <string.h>


static const uint64_t *term_exps(const gs_poly *a, size_t i,
                                 const gs_polyctx *ctx)
{
    return a->exps + i * (size_t)ctx->nwords;
}

/* lexicographic comparison of packed exponent vectors: <0, 0, >0 */
static int exps_cmp(const uint64_t *x, const uint64_t *y, int nw)
{
    int w;
    for (w = 0; w < nw; w++)
        if (x[w] != y[w])
            return x[w] > y[w] ? 1 : -1;
    return 0;
}

/* per-field x >= y in every field of every word */
static int exps_divides(const uint64_t *y, const uint64_t *x, int nw)
{
    int w;
    for (w = 0; w < nw; w++)
        if (!gs_poly_fields_le(y[w], x[w]))
            return 0;
    return 1;
}


gs_polyctx *gs_polyctx_new(const gs_symtab *st, int nvars)
{
    gs_polyctx *ctx = gs_malloc(sizeof *ctx);
    assert(nvars >= 0);
    ctx->syms = st;
    ctx->nvars = nvars;
    ctx->nwords = (nvars + GS_POLY_VARS_PER_WORD - 1) / GS_POLY_VARS_PER_WORD;
    if (ctx->nwords < 1)
        ctx->nwords = 1;
    return ctx;
}

void gs_polyctx_free(gs_polyctx *ctx)
{
    gs_free(ctx);
}

void gs_poly_init(gs_poly *p)
{
    p->coeffs = NULL;
    p->exps = NULL;
    p->length = 0;
    p->alloc = 0;
}

void gs_poly_clear(gs_poly *p)
{
    size_t i;
    for (i = 0; i < p->length; i++)
        gs_int_clear(&p->coeffs[i]);
    gs_free(p->coeffs);
    gs_free(p->exps);
    gs_poly_init(p);
}

void gs_poly_swap(gs_poly *a, gs_poly *b)
{
    gs_poly t = *a;
    *a = *b;
    *b = t;
}

/* Only coeffs[0 .. length-1] are live gs_ints; slots past length are raw
   memory, so growing is a plain realloc and shrinking clears. */
void gs_poly_fit(gs_poly *r, size_t n, const gs_polyctx *ctx)
{
    size_t na;
    if (n <= r->alloc)
        return;
    na = r->alloc * 2 > n ? r->alloc * 2 : n;
    if (na < 4)
        na = 4;
    r->coeffs = gs_reallocarray(r->coeffs, na, sizeof *r->coeffs);
    r->exps = gs_reallocarray(r->exps, na, (size_t)ctx->nwords * 8);
    r->alloc = na;
}

void gs_poly_shrink(gs_poly *r, const gs_polyctx *ctx)
{
    size_t na = r->length < 4 ? 4 : r->length;
    if (r->alloc <= na + na / 4)
        return;
    r->coeffs = gs_reallocarray(r->coeffs, na, sizeof *r->coeffs);
    r->exps = gs_reallocarray(r->exps, na, (size_t)ctx->nwords * 8);
    r->alloc = na;
}

static void truncate_to(gs_poly *r, size_t n)
{
    while (r->length > n)
        gs_int_clear(&r->coeffs[--r->length]);
}

void gs_poly_zero(gs_poly *r)
{
    truncate_to(r, 0);
}

void gs_poly_set(gs_poly *r, const gs_poly *a, const gs_polyctx *ctx)
{
    size_t i, n = a->length;
    if (r == a)
        return;
    truncate_to(r, 0);
    gs_poly_fit(r, n, ctx);
    for (i = 0; i < n; i++) {
        gs_int_init(&r->coeffs[i]);
        gs_int_set(&r->coeffs[i], &a->coeffs[i]);
    }
    if (n > 0)
        memcpy(r->exps, a->exps, n * (size_t)ctx->nwords * 8);
    r->length = n;
}

/* Append a term after the current last one (the caller keeps the order);
   returns the new coefficient slot, initialised to 0. */
static gs_int *append_term(gs_poly *r, const uint64_t *e,
                           const gs_polyctx *ctx)
{
    size_t nw = (size_t)ctx->nwords;
    gs_poly_fit(r, r->length + 1, ctx);
    if (e != NULL)
        memcpy(r->exps + r->length * nw, e, nw * 8);
    else
        memset(r->exps + r->length * nw, 0, nw * 8);
    gs_int_init(&r->coeffs[r->length]);
    return &r->coeffs[r->length++];
}

/* Drop the last term if its coefficient came out zero. */
static void drop_last_if_zero(gs_poly *r)
{
    if (r->length > 0 && gs_int_is_zero(&r->coeffs[r->length - 1]))
        gs_int_clear(&r->coeffs[--r->length]);
}

void gs_poly_set_int(gs_poly *r, const gs_int *c, const gs_polyctx *ctx)
{
    gs_int t;
    gs_int_init(&t);
    gs_int_set(&t, c);     /* c may be a coefficient of r */
    truncate_to(r, 0);
    if (!gs_int_is_zero(&t))
        gs_int_swap(append_term(r, NULL, ctx), &t);
    gs_int_clear(&t);
}

void gs_poly_set_si(gs_poly *r, int64_t c, const gs_polyctx *ctx)
{
    truncate_to(r, 0);
    if (c != 0)
        gs_int_set_si(append_term(r, NULL, ctx), c);
}

static void pack_exps(uint64_t *e, const unsigned *exps,
                      const gs_polyctx *ctx)
{
    int v;
    memset(e, 0, (size_t)ctx->nwords * 8);
    for (v = 0; v < ctx->nvars; v++) {
        assert(exps[v] <= GS_POLY_MAX_EXP);
        e[v / GS_POLY_VARS_PER_WORD] |=
            (uint64_t)exps[v] << gs_poly_field_shift(v);
    }
}

void gs_poly_set_var(gs_poly *r, int var, unsigned e, const gs_polyctx *ctx)
{
    gs_int *c;
    assert(var >= 0 && var < ctx->nvars && e <= GS_POLY_MAX_EXP);
    truncate_to(r, 0);
    c = append_term(r, NULL, ctx);
    gs_int_set_si(c, 1);
    r->exps[var / GS_POLY_VARS_PER_WORD] |=
        (uint64_t)e << gs_poly_field_shift(var);
}

void gs_poly_set_term(gs_poly *r, const gs_int *c, const unsigned *exps,
                      const gs_polyctx *ctx)
{
    gs_poly_set_int(r, c, ctx);
    if (r->length == 1)
        pack_exps(r->exps, exps, ctx);
}

void gs_poly_push_term(gs_poly *r, const gs_int *c, const unsigned *exps,
                       const gs_polyctx *ctx)
{
    gs_int *slot;
    gs_poly_fit(r, r->length + 1, ctx);
    pack_exps(r->exps + r->length * (size_t)ctx->nwords, exps, ctx);
    slot = &r->coeffs[r->length];
    gs_int_init(slot);
    gs_int_set(slot, c);
    r->length++;
}

static int is_canonical(const gs_poly *r, const gs_polyctx *ctx)
{
    size_t i;
    for (i = 0; i < r->length; i++) {
        if (gs_int_is_zero(&r->coeffs[i]))
            return 0;
        if (i > 0 && exps_cmp(term_exps(r, i - 1, ctx), term_exps(r, i, ctx),
                              ctx->nwords) <= 0)
            return 0;
    }
    return 1;
}

/* Stable merge sort of term indices by decreasing monomial (qsort has no
   context argument, and the word count lives in ctx). */
static void sort_perm(size_t *perm, size_t *tmp, size_t n, const gs_poly *r,
                      const gs_polyctx *ctx)
{
    size_t h, i, j, k;
    if (n < 2)
        return;
    h = n / 2;
    sort_perm(perm, tmp, h, r, ctx);
    sort_perm(perm + h, tmp, n - h, r, ctx);
    i = 0;
    j = h;
    k = 0;
    while (i < h && j < n) {
        if (exps_cmp(term_exps(r, perm[j], ctx), term_exps(r, perm[i], ctx),
                     ctx->nwords) > 0)
            tmp[k++] = perm[j++];
        else
            tmp[k++] = perm[i++];
    }
    while (i < h)
        tmp[k++] = perm[i++];
    while (j < n)
        tmp[k++] = perm[j++];
    memcpy(perm, tmp, n * sizeof *perm);
}

/* Put the terms in the order of perm in place (term perm[i] to slot i),
   cycle by cycle, perm[i] = i marking a slot done: no second copy of a
   polynomial that may hold millions of terms.  A gs_int moves by struct
   assignment: its slot is overwritten before it is read again. */
static void apply_perm(gs_poly *r, size_t *perm, const gs_polyctx *ctx)
{
    size_t n = r->length, nw = (size_t)ctx->nwords, i, j, k;
    uint64_t *save = gs_malloc(nw * 8);
    gs_int c;
    for (i = 0; i < n; i++) {
        if (perm[i] == i)
            continue;
        memcpy(save, r->exps + i * nw, nw * 8);
        c = r->coeffs[i];
        for (j = i; perm[j] != i; j = k) {
            k = perm[j];
            memcpy(r->exps + j * nw, r->exps + k * nw, nw * 8);
            r->coeffs[j] = r->coeffs[k];
            perm[j] = j;
        }
        memcpy(r->exps + j * nw, save, nw * 8);
        r->coeffs[j] = c;
        perm[j] = j;
    }
    gs_free(save);
}

/* Sorted terms: equal monomials merged and zero coefficients dropped,
   in place. */
static void merge_sorted(gs_poly *r, const gs_polyctx *ctx)
{
    size_t n = r->length, nw = (size_t)ctx->nwords, i, w = 0;
    for (i = 0; i < n; i++) {
        if (w > 0 && exps_cmp(term_exps(r, w - 1, ctx), term_exps(r, i, ctx),
                              ctx->nwords) == 0) {
            gs_int_add(&r->coeffs[w - 1], &r->coeffs[w - 1], &r->coeffs[i]);
            gs_int_clear(&r->coeffs[i]);
            continue;
        }
        if (w > 0 && gs_int_is_zero(&r->coeffs[w - 1]))
            gs_int_clear(&r->coeffs[--w]);
        if (w != i) {
            memcpy(r->exps + w * nw, r->exps + i * nw, nw * 8);
            r->coeffs[w] = r->coeffs[i];
        }
        w++;
    }
    if (w > 0 && gs_int_is_zero(&r->coeffs[w - 1]))
        gs_int_clear(&r->coeffs[--w]);
    r->length = w;
}

/* The comparison sort: any monomials, n log n comparisons of the words. */
static void sort_compare(gs_poly *r, const gs_polyctx *ctx)
{
    size_t n = r->length, i, *perm, *tmp;
    perm = gs_malloc((n + 1) * sizeof *perm);
    tmp = gs_malloc((n + 1) * sizeof *tmp);
    for (i = 0; i < n; i++)
        perm[i] = i;
    sort_perm(perm, tmp, n, r, ctx);
    gs_free(tmp);
    apply_perm(r, perm, ctx);
    gs_free(perm);
}

/* Number of bits of x (0 for 0). */
static unsigned bit_length(uint64_t x)
{
    unsigned b = 0, h;
    for (h = 32; h > 0; h >>= 1)        /* binary search for the top bit */
        if (x >> h) {
            b += h;
            x >>= h;
        }
    return b + (unsigned)x;
}

/* Below this many terms the comparison sort is as quick and needs no
   bucket counts. */
#define PACKED_MIN_TERMS 1024
/* Radix digits of at most this many bits: 2^11 counts fit a cache. */
#define PACKED_DIGIT_BITS 11

/* Stable LSD radix sort of x[0 .. n-1] by bits [lo, lo + bits), into
   decreasing order (Knuth, TAOCP vol. 3, sec. 5.2.5, from memory); tmp
   has room for n.  A pass whose digit is the same in every word is
   skipped.  When xi is not NULL, xi[i] travels with x[i] (through ti, of
   room n) and *xi_out gets the array that holds it at the end.  Returns
   the array that holds the result (x or tmp). */
static uint64_t *radix_desc(uint64_t *x, uint64_t *tmp, uint32_t *xi,
                            uint32_t *ti, uint32_t **xi_out, size_t n,
                            unsigned lo, unsigned bits)
{
    size_t count[1u << PACKED_DIGIT_BITS], i, at;
    unsigned passes = (bits + PACKED_DIGIT_BITS - 1) / PACKED_DIGIT_BITS;
    unsigned d = passes ? (bits + passes - 1) / passes : 0, p, k, nb;
    for (p = 0; p < passes; p++) {
        unsigned sh = lo + p * d, dd = bits - p * d < d ? bits - p * d : d;
        uint64_t mask = (UINT64_C(1) << dd) - 1, *t;
        nb = 1u << dd;
        memset(count, 0, nb * sizeof *count);
        for (i = 0; i < n; i++)
            count[(x[i] >> sh) & mask]++;
        if (count[(x[0] >> sh) & mask] == n)
            continue;
        at = 0;                         /* the largest digit first */
        for (k = nb; k-- > 0;) {
            size_t c = count[k];
            count[k] = at;
            at += c;
        }
        if (xi) {
            uint32_t *u;
            for (i = 0; i < n; i++) {
                size_t to = count[(x[i] >> sh) & mask]++;
                tmp[to] = x[i];
                ti[to] = xi[i];
            }
            u = xi;
            xi = ti;
            ti = u;
        } else {
            for (i = 0; i < n; i++)
                tmp[count[(x[i] >> sh) & mask]++] = x[i];
        }
        t = x;
        x = tmp;
        tmp = t;
    }
    if (xi_out)
        *xi_out = xi;
    return x;
}

/* Monomials packed into one word with the term's index: each variable
   that may occur gets as many bits as its largest exponent needs,
   variable 0 highest, so the packed keys compare as the exponent vectors
   do (lexicographically), the index below them keeps the keys distinct
   and the sort stable, and a key gives its monomial back.  When the
   monomial's bits fill the word, the index goes to an array of its own
   beside the keys (split): 4 bytes a term more, but a comparison sort
   of the monomials avoided, as for the 24 million terms of an
   18-section RC ladder (41 bits of monomial, 25 of index). */
typedef struct keyplan {
    int n;              /* variables in the key */
    int *var;           /* which, in increasing order */
    unsigned *pos;      /* the lowest bit of each in the key */
    unsigned *wid;      /* bits of each */
    int *word;          /* the word of each in a monomial */
    unsigned *shift;    /* and its field's shift there */
    int *first;         /* the first variable of the key in that word */
    int at_bit[64];     /* the variable of the key holding each key bit */
    unsigned bits;      /* their sum */
    unsigned ib;        /* bits of the index in the key (0 when split) */
    int split;          /* the index is kept apart from the key */
} keyplan;

static void keyplan_clear(keyplan *k)
{
    gs_free(k->var);
    gs_free(k->pos);
    gs_free(k->wid);
    gs_free(k->word);
    gs_free(k->shift);
    gs_free(k->first);
}

/* The plan for n terms whose exponents are at most bound[v]; 0 when the
   monomials would not fit a word (k is then cleared already). */
static int keyplan_init(keyplan *k, const unsigned *bound, size_t n,
                        const gs_polyctx *ctx)
{
    size_t nv = (size_t)ctx->nvars + 1;
    unsigned at;
    int v, j;
    k->var = gs_malloc(nv * sizeof *k->var);
    k->pos = gs_malloc(nv * sizeof *k->pos);
    k->wid = gs_malloc(nv * sizeof *k->wid);
    k->word = gs_malloc(nv * sizeof *k->word);
    k->shift = gs_malloc(nv * sizeof *k->shift);
    k->first = gs_malloc(nv * sizeof *k->first);
    k->n = 0;
    k->bits = 0;
    k->ib = bit_length(n - 1);
    k->split = 0;
    for (v = 0; v < ctx->nvars; v++) {
        unsigned b = bit_length(bound[v]);
        if (b == 0)
            continue;
        k->var[k->n] = v;
        k->word[k->n] = v / GS_POLY_VARS_PER_WORD;
        k->shift[k->n] = (unsigned)gs_poly_field_shift(v);
        k->wid[k->n++] = b;
        k->bits += b;
    }
    if (k->bits + k->ib > 64) {
        if (k->bits > 64 || n > UINT32_MAX) {
            keyplan_clear(k);
            return 0;
        }
        k->split = 1;
        k->ib = 0;
    }
    at = k->ib;
    for (j = k->n; j-- > 0;) {
        unsigned b;
        k->pos[j] = at;
        for (b = 0; b < k->wid[j]; b++)
            k->at_bit[at + b] = j;
        at += k->wid[j];
    }
    for (j = 0; j < k->n; j++)
        k->first[j] = j > 0 && k->word[j - 1] == k->word[j] ? k->first[j - 1]
                                                            : j;
    return 1;
}

static uint64_t pack_key(const uint64_t *e, size_t i, const keyplan *k)
{
    uint64_t key = k->split ? 0 : i;
    int j;
    for (j = 0; j < k->n; j++)
        key += ((e[k->word[j]] >> k->shift[j]) & GS_POLY_FIELD_MASK)
               << k->pos[j];
    return key;
}

/* The monomial of a key into e (nw words), from the word of the key's
   variable j0 on: the words before it are the caller's. */
static void unpack_key(uint64_t *e, size_t nw, uint64_t key,
                       const keyplan *k, int j0)
{
    uint64_t cur = 0;
    int j, w;
    if (j0 >= k->n) {
        memset(e, 0, nw * sizeof *e);
        return;
    }
    w = k->word[j0];
    memset(e + w, 0, (nw - (size_t)w) * sizeof *e);
    for (j = j0; j < k->n; j++) {    /* words in increasing order */
        if (k->word[j] != w) {
            e[w] = cur;
            cur = 0;
            w = k->word[j];
        }
        cur |= ((key >> k->pos[j]) & ((UINT64_C(1) << k->wid[j]) - 1))
               << k->shift[j];
    }
    e[w] = cur;
}

/* coeffs[i] = the old coeffs[from[i]], cycle by cycle in place; from is
   left the identity. */
static void permute_coeffs_split(gs_poly *r, uint32_t *from)
{
    size_t n = r->length, i, j, t;
    gs_int c;
    for (i = 0; i < n; i++) {
        if (from[i] == i)
            continue;
        c = r->coeffs[i];
        for (j = i; (t = from[j]) != i; j = t) {
            r->coeffs[j] = r->coeffs[t];
            from[j] = (uint32_t)j;
        }
        r->coeffs[j] = c;
        from[j] = (uint32_t)j;
    }
}

/* Put r's terms in the order of their keys x (x is freed): radix sort,
   so linear in the terms whatever order they come in.  Only the
   coefficients are moved (in place, cycle by cycle as in apply_perm,
   the index bits of x, or the split index, marking a slot done); the
   monomials are written again from the keys, in order, so the large
   exponent array is never read at random.  Returns nonzero when two terms have the same monomial
   (merge_sorted must follow). */
static uint64_t *order_keys(gs_poly *r, uint64_t *x, const keyplan *k)
{
    size_t n = r->length, i, j, t;
    uint64_t *tmp = gs_malloc(n * sizeof *tmp);
    uint64_t low = (UINT64_C(1) << k->ib) - 1;
    uint32_t *xi = NULL, *ti = NULL, *yi = NULL;
    uint64_t *y;
    gs_int c;
    if (k->split) {
        xi = gs_malloc(n * sizeof *xi);
        ti = gs_malloc(n * sizeof *ti);
        for (i = 0; i < n; i++)
            xi[i] = (uint32_t)i;
    }
    y = radix_desc(x, tmp, xi, ti, &yi, n, k->ib, k->bits);
    gs_free(y == x ? tmp : x);
    x = y;
    if (k->split) {
        gs_free(yi == xi ? ti : xi);
        permute_coeffs_split(r, yi);
        gs_free(yi);
    }
    for (i = 0; i < n && !k->split; i++) {
        if ((x[i] & low) == i)
            continue;
        c = r->coeffs[i];
        for (j = i; (t = (size_t)(x[j] & low)) != i; j = t) {
            r->coeffs[j] = r->coeffs[t];
            x[j] = (x[j] & ~low) | j;
        }
        r->coeffs[j] = c;
        x[j] = (x[j] & ~low) | j;
    }
    return x;
}

/* r's monomials written from the sorted keys x (x is freed).  Returns
   nonzero when two are the same. */
static int write_keys(gs_poly *r, uint64_t *x, const keyplan *k,
                      const gs_polyctx *ctx)
{
    size_t n = r->length, nw = (size_t)ctx->nwords, i;
    int same = 0;
    memset(r->exps, 0, nw * sizeof *r->exps);   /* words before the key's */
    unpack_key(r->exps, nw, x[0], k, 0);
    for (i = 1; i < n; i++) {
        /* Sorted keys share long prefixes: the words wholly above the
           highest bit that differs from the previous key are copied. */
        uint64_t d = (x[i] ^ x[i - 1]) >> k->ib;
        uint64_t *e = r->exps + i * nw;
        int j0;
        if (d == 0) {
            same = 1;
            memcpy(e, e - nw, nw * sizeof *e);
            continue;
        }
        j0 = k->first[k->at_bit[k->ib + bit_length(d) - 1]];
        memcpy(e, e - nw, (size_t)k->word[j0] * sizeof *e);
        unpack_key(e, nw, x[i], k, j0);
    }
    gs_free(x);
    return same;
}

static int sort_keys(gs_poly *r, uint64_t *x, const keyplan *k,
                     const gs_polyctx *ctx)
{
    return write_keys(r, order_keys(r, x, k), k, ctx);
}

/* The order of sort_compare by packed keys; 0, doing nothing, when they
   do not fit.  One pass finds the largest exponents, one packs. */
static int sort_packed(gs_poly *r, const gs_polyctx *ctx)
{
    size_t n = r->length, i;
    unsigned *deg = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *deg);
    uint64_t *x;
    keyplan k;
    int fits;
    gs_poly_degrees(deg, r, ctx);
    fits = keyplan_init(&k, deg, n, ctx);
    gs_free(deg);
    if (!fits)
        return 0;
    x = gs_malloc(n * sizeof *x);
    for (i = 0; i < n; i++)
        x[i] = pack_key(term_exps(r, i, ctx), i, &k);
    sort_keys(r, x, &k, ctx);
    keyplan_clear(&k);
    return 1;
}

void gs_poly_canonicalise(gs_poly *r, const gs_polyctx *ctx)
{
    if (is_canonical(r, ctx))
        return;
    if (r->length < PACKED_MIN_TERMS || !sort_packed(r, ctx))
        sort_compare(r, ctx);
    merge_sorted(r, ctx);
}

void gs_poly_canonicalise_compare(gs_poly *r, const gs_polyctx *ctx)
{
    if (is_canonical(r, ctx))
        return;
    sort_compare(r, ctx);
    merge_sorted(r, ctx);
}

static void put_exp(uint64_t *e, int var, unsigned x)
{
    int w = var / GS_POLY_VARS_PER_WORD, sh = gs_poly_field_shift(var);
    e[w] = (e[w] & ~((uint64_t)GS_POLY_FIELD_MASK << sh)) | (uint64_t)x << sh;
}

/* One term: x_v^k -> x_to[v]^(top[v] - k) for the flipped v, in order. */
static void flip_term(uint64_t *e, const int *fv, int nf, const int *to,
                      const unsigned *top)
{
    int j;
    for (j = 0; j < nf; j++) {
        int v = fv[j];
        unsigned k = gs_poly_exp_get(e, v);
        assert(k <= top[v]);
        put_exp(e, v, 0);
        put_exp(e, to[v], gs_poly_exp_get(e, to[v]) + top[v] - k);
    }
}

/* The key of the flipped term straight from the term before the flip:
   the fields that stay, plus top - k for each flipped x_v^k in the
   field of to[v] (key = kept + add - sum of k << pos, no field
   overflowing since each result fits its width). */
typedef struct keyfield {
    int word;           /* a field of the monomial before the flip */
    unsigned shift;
    unsigned pos;       /* and where it lands in the key */
} keyfield;

typedef struct flipkey {
    keyplan k;
    int nkeep, nflip;
    keyfield *keep, *flip;  /* fields that stay; the flipped ones */
    uint64_t add;           /* the sum of top << pos */
} flipkey;

static keyfield key_field(int v, unsigned pos)
{
    keyfield f;
    f.word = v / GS_POLY_VARS_PER_WORD;
    f.shift = (unsigned)gs_poly_field_shift(v);
    f.pos = pos;
    return f;
}

/* The keys of a (in context from) renamed into context dst: variable v
   becomes dst's map[v], x_v^k for a flipped v (top[v] > 0) becomes
   x_map[v]^(top[v] - k), and the exponents landing in one variable of
   dst add up.  0 when the keys do not fit, or, within one context, when
   a variable flips into another flipped one (the flips then depend on
   their order). */
static int flipkey_init(flipkey *f, const gs_poly *a, const int *map,
                        const unsigned *top, const unsigned *degs,
                        const gs_polyctx *from, const gs_polyctx *dst)
{
    size_t nv = (size_t)from->nvars + 1, nd = (size_t)dst->nvars + 1;
    unsigned *deg = gs_malloc(nv * sizeof *deg);
    unsigned *bound = gs_calloc(nd, sizeof *bound);
    unsigned *at = gs_calloc(nd, sizeof *at);
    int v, j, ok = 1;
    if (degs)
        memcpy(deg, degs, (nv - 1) * sizeof *deg);
    else
        gs_poly_degrees(deg, a, from);
    for (v = 0; v < from->nvars; v++) {
        if (top[v] > 0)
            ok &= (from != dst || top[map[v]] == 0) && deg[v] <= top[v];
        bound[map[v]] += top[v] > 0 ? top[v] : deg[v];
    }
    ok = ok && keyplan_init(&f->k, bound, a->length, dst);
    gs_free(bound);
    if (!ok) {
        gs_free(deg);
        gs_free(at);
        return 0;
    }
    for (j = 0; j < f->k.n; j++)
        at[f->k.var[j]] = f->k.pos[j];
    f->keep = gs_malloc(nv * sizeof *f->keep);
    f->flip = gs_malloc(nv * sizeof *f->flip);
    f->nkeep = f->nflip = 0;
    f->add = 0;
    for (v = 0; v < from->nvars; v++) {
        if (top[v] > 0) {
            f->flip[f->nflip++] = key_field(v, at[map[v]]);
            f->add += (uint64_t)top[v] << at[map[v]];
        } else if (deg[v] > 0) {
            f->keep[f->nkeep++] = key_field(v, at[map[v]]);
        }
    }
    gs_free(deg);
    gs_free(at);
    return 1;
}

static void flipkey_clear(flipkey *f)
{
    keyplan_clear(&f->k);
    gs_free(f->keep);
    gs_free(f->flip);
}

static uint64_t flip_key(const uint64_t *e, size_t i, const flipkey *f)
{
    uint64_t key = (f->k.split ? 0 : i) + f->add;
    int j;
    for (j = 0; j < f->nkeep; j++)
        key += ((e[f->keep[j].word] >> f->keep[j].shift) & GS_POLY_FIELD_MASK)
               << f->keep[j].pos;
    for (j = 0; j < f->nflip; j++)
        key -= ((e[f->flip[j].word] >> f->flip[j].shift) & GS_POLY_FIELD_MASK)
               << f->flip[j].pos;
    return key;
}

/* The flip reverses the order in each flipped variable and moves its
   exponents to another place in the order, so the flipped terms come in
   many short sorted runs.  The exponents after the flip are bounded by
   the degrees before it, so a large polynomial's keys for the packed
   sort are made straight from its terms, and the sort writes the
   flipped monomials. */
void gs_poly_flip_vars(gs_poly *r, const gs_poly *a, const int *to,
                       const unsigned *top, const unsigned *degs,
                       const gs_polyctx *ctx)
{
    size_t i, n;
    int *fv = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *fv);
    int v, nf = 0;
    flipkey f;
    if (r != a)
        gs_poly_set(r, a, ctx);
    n = r->length;
    for (v = 0; v < ctx->nvars; v++)        /* where each variable goes */
        fv[v] = top[v] > 0 ? to[v] : v;
    if (n >= PACKED_MIN_TERMS
        && flipkey_init(&f, r, fv, top, degs, ctx, ctx)) {
        uint64_t *x = gs_malloc(n * sizeof *x);
        for (i = 0; i < n; i++)
            x[i] = flip_key(term_exps(r, i, ctx), i, &f);
        if (sort_keys(r, x, &f.k, ctx))
            merge_sorted(r, ctx);
        flipkey_clear(&f);
        gs_free(fv);
        return;
    }
    for (v = 0; v < ctx->nvars; v++)        /* the flipped ones, in order */
        if (top[v] > 0)
            fv[nf++] = v;
    for (i = 0; i < n; i++)
        flip_term(r->exps + i * (size_t)ctx->nwords, fv, nf, to, top);
    gs_free(fv);
    gs_poly_canonicalise(r, ctx);
}

/* Renaming variables moves exponent fields between words.  The fields
   that go from the same word to the same word by the same distance in
   bits move together, under one mask: a run of variables renamed to a
   run (the conductances of a circuit, say) moves a word at a time. */
typedef struct fieldmove {
    int from, to;       /* words */
    unsigned left, right;   /* the shift, one of them 0 */
    uint64_t mask;      /* the fields, in the from word */
} fieldmove;

/* The moves for map (from->nvars of them at most) into mv; their count. */
static int plan_moves(fieldmove *mv, const int *map, const gs_polyctx *from)
{
    int v, j, n = 0;
    for (v = 0; v < from->nvars; v++) {
        int fw = v / GS_POLY_VARS_PER_WORD, tw = map[v] / GS_POLY_VARS_PER_WORD;
        int fs = gs_poly_field_shift(v), ts = gs_poly_field_shift(map[v]);
        unsigned left = ts > fs ? (unsigned)(ts - fs) : 0;
        unsigned right = fs > ts ? (unsigned)(fs - ts) : 0;
        for (j = 0; j < n; j++)
            if (mv[j].from == fw && mv[j].to == tw && mv[j].left == left
                && mv[j].right == right)
                break;
        if (j == n) {
            mv[n].from = fw;
            mv[n].to = tw;
            mv[n].left = left;
            mv[n].right = right;
            mv[n++].mask = 0;
        }
        mv[j].mask |= GS_POLY_FIELD_MASK << fs;
    }
    return n;
}

/* f (nt words) = the monomial e with its fields moved */
static void apply_moves(uint64_t *f, size_t nt, const uint64_t *e,
                        const fieldmove *mv, int n)
{
    int j;
    memset(f, 0, nt * sizeof *f);
    for (j = 0; j < n; j++)
        f[mv[j].to] |= ((e[mv[j].from] & mv[j].mask) << mv[j].left)
                       >> mv[j].right;
}

void gs_poly_remap(gs_poly *r, const gs_poly *a, const int *map,
                   const gs_polyctx *from, const gs_polyctx *to)
{
    size_t i, nf = (size_t)from->nwords, nt = (size_t)to->nwords;
    fieldmove *mv;
    int nmv;
    assert(r != a);
    gs_poly_zero(r);
    if (a->length == 0)
        return;
    mv = gs_malloc(((size_t)from->nvars + 1) * sizeof *mv);
    nmv = plan_moves(mv, map, from);
    gs_poly_fit(r, a->length, to);
    for (i = 0; i < a->length; i++) {
        apply_moves(r->exps + i * nt, nt, a->exps + i * nf, mv, nmv);
        gs_int_init(&r->coeffs[i]);
        gs_int_set(&r->coeffs[i], &a->coeffs[i]);
    }
    gs_free(mv);
    r->length = a->length;
}

/* Into a wider context, a's own storage is grown and the terms remapped
   in it from the last: term i lands at or after where it was, past every
   term before it, so only its own words must be read first.  The
   coefficients stay where they are, and of the exponents only the new
   part of the block is memory the process has not touched yet (on the
   18-section ladder 0.8 GB of the 2.5 GB, each fresh page a fault). */
static void remap_take_wider(gs_poly *r, gs_poly *a, const fieldmove *mv,
                             int nmv, size_t nf, size_t nt)
{
    size_t n = a->length, i;
    uint64_t *src = gs_malloc(nf * sizeof *src);
    a->coeffs = gs_reallocarray(a->coeffs, n, sizeof *a->coeffs);
    a->exps = gs_reallocarray(a->exps, n, nt * sizeof *a->exps);
    a->alloc = n;
    for (i = n; i-- > 0;) {
        memcpy(src, a->exps + i * nf, nf * sizeof *src);
        apply_moves(a->exps + i * nt, nt, src, mv, nmv);
    }
    gs_free(src);
    gs_poly_swap(r, a);
}

void gs_poly_remap_take(gs_poly *r, gs_poly *a, const int *map,
                        const gs_polyctx *from, const gs_polyctx *to)
{
    size_t n = a->length, i, nf = (size_t)from->nwords;
    size_t nt = (size_t)to->nwords, step = n / 16 > 65536 ? n / 16 : 65536;
    fieldmove *mv;
    int nmv;
    assert(r != a);
    gs_poly_zero(r);
    if (n == 0)
        return;
    mv = gs_malloc(((size_t)from->nvars + 1) * sizeof *mv);
    nmv = plan_moves(mv, map, from);
    if (nt >= nf) {
        remap_take_wider(r, a, mv, nmv, nf, nt);
        gs_free(mv);
        return;
    }
    gs_poly_fit(r, n, to);
    for (i = n; i-- > 0;) {
        apply_moves(r->exps + i * nt, nt, a->exps + i * nf, mv, nmv);
        r->coeffs[i] = a->coeffs[i];        /* moved, not copied */
        if (i % step == 0 && i > 0) {
            a->length = i;                  /* the moved ones are r's */
            gs_poly_shrink(a, from);
        }
    }
    gs_free(mv);
    r->length = n;
    a->length = 0;
    gs_poly_clear(a);
    gs_poly_init(a);
}

/* The keys hold the whole renamed and flipped monomial, so once they are
   made the old exponents are not read again: the block is resized to the
   new width (keeping the pages already touched) and written from the
   sorted keys. */
void gs_poly_remap_flip_take(gs_poly *r, gs_poly *a, const int *map,
                             const int *to, const unsigned *top,
                             const gs_polyctx *from, const gs_polyctx *dst)
{
    size_t n = a->length, i, nv = (size_t)from->nvars + 1;
    int *where = gs_malloc(nv * sizeof *where);
    unsigned *ftop = gs_calloc(nv, sizeof *ftop);
    int v, any = 0;
    flipkey f;
    for (v = 0; v < from->nvars; v++) {
        int d = map[v];
        ftop[v] = top[d];
        where[v] = top[d] > 0 ? to[d] : d;
        any |= top[d] > 0;
    }
    if (n >= PACKED_MIN_TERMS
        && flipkey_init(&f, a, where, ftop, NULL, from, dst)) {
        uint64_t *x = gs_malloc(n * sizeof *x);
        for (i = 0; i < n; i++)
            x[i] = flip_key(term_exps(a, i, from), i, &f);
        x = order_keys(a, x, &f.k);     /* its scratch freed before: */
        a->coeffs = gs_reallocarray(a->coeffs, n, sizeof *a->coeffs);
        a->exps = gs_reallocarray(a->exps, n,
                                  (size_t)dst->nwords * sizeof *a->exps);
        a->alloc = n;
        gs_poly_zero(r);
        gs_poly_swap(r, a);
        if (write_keys(r, x, &f.k, dst))
            merge_sorted(r, dst);
        flipkey_clear(&f);
    } else {
        gs_poly_remap_take(r, a, map, from, dst);
        if (any)
            gs_poly_flip_vars(r, r, to, top, NULL, dst);
    }
    gs_free(where);
    gs_free(ftop);
}

/* A stable counting sort by the power; each term's power is read once,
   so the second pass runs over two bytes a term instead of its exponent
   words. */
size_t gs_poly_group_by_var(size_t **idx, size_t **ends, const gs_poly *a,
                            int var, const gs_polyctx *ctx)
{
    size_t n = (size_t)gs_poly_degree(a, var, ctx) + 1, i, k;
    size_t nt = a->length, nw = (size_t)ctx->nwords;
    size_t *end = gs_calloc(n + 1, sizeof *end);
    size_t *at = gs_malloc((nt ? nt : 1) * sizeof *at);
    uint16_t *pw = gs_malloc((nt ? nt : 1) * sizeof *pw);
    for (i = 0; i < nt; i++) {
        pw[i] = (uint16_t)gs_poly_exp_get(a->exps + i * nw, var);
        end[pw[i] + 1]++;
    }
    for (k = 0; k < n; k++)
        end[k + 1] += end[k];
    for (i = 0; i < nt; i++)
        at[end[pw[i]]++] = i;
    gs_free(pw);
    *idx = at;
    *ends = end;        /* end[k] is now where power k's run ends */
    return n;
}

void gs_poly_get_term_exps(unsigned *exps, const gs_poly *a, size_t i,
                           const gs_polyctx *ctx)
{
    int v;
    for (v = 0; v < ctx->nvars; v++)
        exps[v] = gs_poly_exp_get(term_exps(a, i, ctx), v);
}

unsigned gs_poly_term_exp(const gs_poly *a, size_t i, int var,
                          const gs_polyctx *ctx)
{
    return gs_poly_exp_get(term_exps(a, i, ctx), var);
}

static int exps_are_zero(const uint64_t *e, int nw)
{
    int w;
    for (w = 0; w < nw; w++)
        if (e[w] != 0)
            return 0;
    return 1;
}

size_t gs_poly_storage(const gs_poly *a, const gs_polyctx *ctx)
{
    size_t bytes = a->alloc * (sizeof *a->coeffs
                               + (size_t)ctx->nwords * sizeof *a->exps), i;
    for (i = 0; i < a->length; i++)
        bytes += (size_t)a->coeffs[i].alloc * sizeof(uint32_t);
    return bytes;
}

int gs_poly_is_zero(const gs_poly *a)
{
    return a->length == 0;
}

int gs_poly_is_one(const gs_poly *a, const gs_polyctx *ctx)
{
    return a->length == 1 && exps_are_zero(a->exps, ctx->nwords)
        && gs_int_is_one(&a->coeffs[0]);
}

int gs_poly_is_const(const gs_poly *a, const gs_polyctx *ctx)
{
    return a->length == 0
        || (a->length == 1 && exps_are_zero(a->exps, ctx->nwords));
}

int gs_poly_equal(const gs_poly *a, const gs_poly *b, const gs_polyctx *ctx)
{
    size_t i;
    if (a->length != b->length)
        return 0;
    if (a->length == 0)
        return 1;
    if (memcmp(a->exps, b->exps, a->length * (size_t)ctx->nwords * 8) != 0)
        return 0;
    for (i = 0; i < a->length; i++)
        if (!gs_int_equal(&a->coeffs[i], &b->coeffs[i]))
            return 0;
    return 1;
}

/* splitmix64's finaliser (Steele, Lea and Flood, OOPSLA 2014) */
static uint64_t mix64(uint64_t x)
{
    x = (x ^ (x >> 30)) * UINT64_C(0xbf58476d1ce4e5b9);
    x = (x ^ (x >> 27)) * UINT64_C(0x94d049bb133111eb);
    return x ^ (x >> 31);
}

/* At most 64 terms, spread over a, are hashed: the gcd seeds its random
   choices from this, and hashing every term of a large determinant cost
   3.6 % of its derivation. */
uint64_t gs_poly_hash(const gs_poly *a, const gs_polyctx *ctx)
{
    uint64_t h = mix64(a->length + UINT64_C(0x9e3779b97f4a7c15));
    size_t i, nw = (size_t)ctx->nwords, w, step = a->length / 64 + 1;
    for (i = 0; i < a->length; i += step) {
        for (w = 0; w < nw; w++)
            h = mix64(h ^ a->exps[i * nw + w]);
        h = mix64(h ^ gs_int_hash(&a->coeffs[i]));
    }
    return h;
}

int gs_poly_sgn(const gs_poly *a)
{
    return a->length == 0 ? 0 : gs_int_sgn(&a->coeffs[0]);
}

void gs_poly_neg(gs_poly *r, const gs_poly *a, const gs_polyctx *ctx)
{
    size_t i;
    gs_poly_set(r, a, ctx);
    for (i = 0; i < r->length; i++)
        gs_int_neg(&r->coeffs[i], &r->coeffs[i]);
}

/* Copy or, when the source is being overwritten anyway, move term i of a
   onto the end of t, negated if neg. */
static void take_term(gs_poly *t, gs_poly *a, size_t i, int steal, int neg,
                      const gs_polyctx *ctx)
{
    gs_int *c = append_term(t, term_exps(a, i, ctx), ctx);
    if (steal)
        gs_int_swap(c, &a->coeffs[i]);
    else
        gs_int_set(c, &a->coeffs[i]);
    if (neg)
        gs_int_neg(c, c);
}

/* r = a + b or a - b: one merge of the two sorted term lists. */
static void add_sub(gs_poly *r, const gs_poly *a, const gs_poly *b, int sub,
                    const gs_polyctx *ctx)
{
    gs_poly t;
    size_t i = 0, j = 0;
    int sa = (r == a && r != b), sb = (r == b && r != a);
    gs_poly *ma = (gs_poly *)a, *mb = (gs_poly *)b;  /* moved from only
                                                        when aliased to r */
    gs_poly_init(&t);
    gs_poly_fit(&t, a->length + b->length, ctx);
    while (i < a->length && j < b->length) {
        int c = exps_cmp(term_exps(a, i, ctx), term_exps(b, j, ctx),
                         ctx->nwords);
        if (c > 0) {
            take_term(&t, ma, i++, sa, 0, ctx);
        } else if (c < 0) {
            take_term(&t, mb, j++, sb, sub, ctx);
        } else {
            gs_int *s = append_term(&t, term_exps(a, i, ctx), ctx);
            if (sub)
                gs_int_sub(s, &a->coeffs[i], &b->coeffs[j]);
            else
                gs_int_add(s, &a->coeffs[i], &b->coeffs[j]);
            drop_last_if_zero(&t);
            i++;
            j++;
        }
    }
    while (i < a->length)
        take_term(&t, ma, i++, sa, 0, ctx);
    while (j < b->length)
        take_term(&t, mb, j++, sb, sub, ctx);
    gs_poly_swap(r, &t);
    gs_poly_clear(&t);
}

void gs_poly_add(gs_poly *r, const gs_poly *a, const gs_poly *b,
                 const gs_polyctx *ctx)
{
    add_sub(r, a, b, 0, ctx);
}

void gs_poly_sub(gs_poly *r, const gs_poly *a, const gs_poly *b,
                 const gs_polyctx *ctx)
{
    add_sub(r, a, b, 1, ctx);
}

void gs_poly_mul_int(gs_poly *r, const gs_poly *a, const gs_int *c,
                     const gs_polyctx *ctx)
{
    gs_int t;
    size_t i;
    if (gs_int_is_zero(c)) {
        gs_poly_zero(r);
        return;
    }
    gs_int_init(&t);
    gs_int_set(&t, c);         /* c may be a coefficient of r or a */
    gs_poly_set(r, a, ctx);
    if (!gs_int_is_one(&t))
        for (i = 0; i < r->length; i++)
            gs_int_mul(&r->coeffs[i], &r->coeffs[i], &t);
    gs_int_clear(&t);
}

void gs_poly_mul_si(gs_poly *r, const gs_poly *a, int64_t c,
                    const gs_polyctx *ctx)
{
    size_t i;
    if (c == 0) {
        gs_poly_zero(r);
        return;
    }
    gs_poly_set(r, a, ctx);
    if (c != 1)
        for (i = 0; i < r->length; i++)
            gs_int_mul_si(&r->coeffs[i], &r->coeffs[i], c);
}

void gs_poly_mul_monomial(gs_poly *r, const gs_poly *a, const uint64_t *exps,
                          const gs_polyctx *ctx)
{
    size_t i, nw = (size_t)ctx->nwords, w;
    uint64_t *m = gs_malloc(nw * 8);
    memcpy(m, exps, nw * 8);   /* exps may point into a or r */
    gs_poly_set(r, a, ctx);
    for (i = 0; i < r->length; i++)
        for (w = 0; w < nw; w++) {
            uint64_t s = r->exps[i * nw + w] + m[w];
            assert((s & GS_POLY_GUARD) == 0);   /* precondition: no overflow */
            r->exps[i * nw + w] = s;
        }
    gs_free(m);
}

int gs_poly_div_monomial(gs_poly *r, const gs_poly *a, const uint64_t *exps,
                         const gs_polyctx *ctx)
{
    size_t i, nw = (size_t)ctx->nwords, w;
    uint64_t *m = gs_malloc(nw * 8);
    memcpy(m, exps, nw * 8);
    for (i = 0; i < a->length; i++)
        if (!exps_divides(m, term_exps(a, i, ctx), ctx->nwords)) {
            gs_free(m);
            gs_poly_zero(r);
            return GS_EINEXACT;
        }
    gs_poly_set(r, a, ctx);
    for (i = 0; i < r->length; i++)
        for (w = 0; w < nw; w++)
            r->exps[i * nw + w] -= m[w];
    gs_free(m);
    return GS_OK;
}

int gs_poly_divexact_int(gs_poly *q, const gs_poly *a, const gs_int *c,
                         const gs_polyctx *ctx)
{
    gs_poly t;
    gs_int t0;
    size_t i;
    if (gs_int_is_zero(c)) {
        gs_poly_zero(q);
        return GS_EDIVZERO;
    }
    if (q == a) {
        /* in place, with no second copy of the terms; on a remainder q is
           zeroed all the same */
        int one = gs_int_cmp_si(c, 1) == 0, minus = gs_int_cmp_si(c, -1) == 0;
        gs_int_init(&t0);
        for (i = 0; i < q->length && !one; i++) {
            if (minus) {
                gs_int_neg(&q->coeffs[i], &q->coeffs[i]);
                continue;
            }
            if (gs_int_divexact(&t0, &q->coeffs[i], c) != GS_OK) {
                gs_int_clear(&t0);
                gs_poly_zero(q);
                return GS_EINEXACT;
            }
            gs_int_swap(&t0, &q->coeffs[i]);
        }
        gs_int_clear(&t0);
        return GS_OK;
    }
    gs_poly_init(&t);
    gs_poly_fit(&t, a->length, ctx);
    for (i = 0; i < a->length; i++) {
        gs_int *s = append_term(&t, term_exps(a, i, ctx), ctx);
        if (gs_int_divexact(s, &a->coeffs[i], c) != GS_OK) {
            gs_poly_clear(&t);
            gs_poly_zero(q);
            return GS_EINEXACT;
        }
    }
    gs_poly_swap(q, &t);
    gs_poly_clear(&t);
    return GS_OK;
}

void gs_poly_content(gs_int *c, const gs_poly *a)
{
    gs_int g;
    size_t i;
    gs_int_init(&g);
    for (i = 0; i < a->length && !gs_int_is_one(&g); i++)
        gs_int_gcd(&g, &g, &a->coeffs[i]);
    if (a->length > 0 && gs_int_sgn(&a->coeffs[0]) < 0)
        gs_int_neg(&g, &g);
    gs_int_swap(c, &g);
    gs_int_clear(&g);
}

void gs_poly_primitive(gs_poly *r, const gs_poly *a, const gs_polyctx *ctx)
{
    gs_int c;
    gs_int_init(&c);
    gs_poly_content(&c, a);
    if (gs_int_is_zero(&c))
        gs_poly_zero(r);
    else if (gs_int_is_one(&c))
        gs_poly_set(r, a, ctx);
    else
        gs_poly_divexact_int(r, a, &c, ctx);   /* exact by construction */
    gs_int_clear(&c);
}

void gs_poly_monomial_content(uint64_t *exps, const gs_poly *a,
                              const gs_polyctx *ctx)
{
    size_t i, nw = (size_t)ctx->nwords, w;
    if (a->length == 0) {
        memset(exps, 0, nw * 8);
        return;
    }
    /* The last term is the least in lex order: start from it, so that
       the usual answer (none) comes at once, whichever variable is
       first. */
    memcpy(exps, a->exps + (a->length - 1) * nw, nw * 8);
    for (i = 0; i + 1 < a->length; i++) {
        uint64_t any = 0;
        for (w = 0; w < nw; w++) {
            exps[w] = gs_poly_fields_min(exps[w], a->exps[i * nw + w]);
            any |= exps[w];
        }
        if (any == 0)       /* the usual end: no variable divides all */
            return;
    }
}

void gs_poly_degrees(unsigned *degs, const gs_poly *a, const gs_polyctx *ctx)
{
    size_t i, nw = (size_t)ctx->nwords, w;
    uint64_t *m = gs_calloc(nw, 8);
    int v;
    for (i = 0; i < a->length; i++)
        for (w = 0; w < nw; w++)
            m[w] = gs_poly_fields_max(m[w], a->exps[i * nw + w]);
    for (v = 0; v < ctx->nvars; v++)
        degs[v] = gs_poly_exp_get(m, v);
    gs_free(m);
}

/* The OR of every term's exponent words, in a new array: per variable at
   least its degree, with as many bits, and nonzero where it occurs. */
static uint64_t *exps_or(const gs_poly *a, const gs_polyctx *ctx)
{
    size_t i, nw = (size_t)ctx->nwords, w;
    uint64_t *m = gs_calloc(nw, 8);
    for (i = 0; i < a->length; i++)
        for (w = 0; w < nw; w++)
            m[w] |= a->exps[i * nw + w];
    return m;
}

void gs_poly_degree_bounds(unsigned *bounds, const gs_poly *a,
                           const gs_polyctx *ctx)
{
    uint64_t *m = exps_or(a, ctx);
    int v;
    for (v = 0; v < ctx->nvars; v++)
        bounds[v] = gs_poly_exp_get(m, v);
    gs_free(m);
}

long gs_poly_degree(const gs_poly *a, int var, const gs_polyctx *ctx)
{
    size_t i;
    unsigned d = 0;
    if (a->length == 0)
        return -1;
    if (var == 0)      /* lex order: the first term has the top degree */
        return (long)gs_poly_exp_get(a->exps, 0);
    for (i = 0; i < a->length; i++) {
        unsigned e = gs_poly_exp_get(term_exps(a, i, ctx), var);
        if (e > d)
            d = e;
    }
    return (long)d;
}

long gs_poly_lowdegree(const gs_poly *a, int var, const gs_polyctx *ctx)
{
    size_t i;
    unsigned d;
    if (a->length == 0)
        return -1;
    d = GS_POLY_MAX_EXP;
    for (i = 0; i < a->length && d > 0; i++) {
        unsigned e = gs_poly_exp_get(term_exps(a, i, ctx), var);
        if (e < d)
            d = e;
    }
    return (long)d;
}

static long exps_total(const uint64_t *e, int nw)
{
    long t = 0;
    int w, f;
    for (w = 0; w < nw; w++)
        for (f = 0; f < 4; f++)
            t += (long)((e[w] >> (GS_POLY_FIELD_BITS * f))
                        & GS_POLY_FIELD_MASK);
    return t;
}

long gs_poly_total_degree(const gs_poly *a, const gs_polyctx *ctx)
{
    size_t i;
    long d = -1;
    for (i = 0; i < a->length; i++) {
        long t = exps_total(term_exps(a, i, ctx), ctx->nwords);
        if (t > d)
            d = t;
    }
    return d;
}

void gs_poly_used_vars(unsigned char *used, const gs_poly *a,
                       const gs_polyctx *ctx)
{
    uint64_t *m = exps_or(a, ctx);
    int v;
    for (v = 0; v < ctx->nvars; v++)
        used[v] = gs_poly_exp_get(m, v) != 0;
    gs_free(m);
}

/* Terms with equal exponent of var keep their relative order when that
   exponent is cleared (lex order ignores an equal field), so each
   coefficient comes out canonical without sorting. */
void gs_poly_coeff_var(gs_poly *r, const gs_poly *a, int var, unsigned k,
                       const gs_polyctx *ctx)
{
    gs_poly t;
    size_t i;
    int w = var / GS_POLY_VARS_PER_WORD;
    uint64_t clear =
        ~((uint64_t)GS_POLY_FIELD_MASK << gs_poly_field_shift(var));
    gs_poly_init(&t);
    for (i = 0; i < a->length; i++) {
        const uint64_t *e = term_exps(a, i, ctx);
        if (gs_poly_exp_get(e, var) == k) {
            gs_int_set(append_term(&t, e, ctx), &a->coeffs[i]);
            t.exps[(t.length - 1) * (size_t)ctx->nwords + (size_t)w] &= clear;
        }
    }
    gs_poly_swap(r, &t);
    gs_poly_clear(&t);
}

void gs_poly_coeffs_var(gs_poly *out, size_t n, const gs_poly *a, int var,
                        const gs_polyctx *ctx)
{
    size_t i, k, nw = (size_t)ctx->nwords;
    size_t *count = gs_calloc(n + 1, sizeof *count);
    int w = var / GS_POLY_VARS_PER_WORD;
    uint64_t clear =
        ~((uint64_t)GS_POLY_FIELD_MASK << gs_poly_field_shift(var));
    for (i = 0; i < a->length; i++) {
        k = gs_poly_exp_get(term_exps(a, i, ctx), var);
        assert(k < n);
        count[k]++;
    }
    for (k = 0; k < n; k++) {
        gs_poly_zero(&out[k]);
        gs_poly_fit(&out[k], count[k], ctx);
    }
    for (i = 0; i < a->length; i++) {
        const uint64_t *e = term_exps(a, i, ctx);
        gs_poly *c = &out[gs_poly_exp_get(e, var)];
        gs_int_set(append_term(c, e, ctx), &a->coeffs[i]);
        c->exps[(c->length - 1) * nw + (size_t)w] &= clear;
    }
    gs_free(count);
}

/* Subtracting one from the exponent of var in every term that has it is
   the same shift for all of them, so the order is kept. */
void gs_poly_derivative(gs_poly *r, const gs_poly *a, int var,
                        const gs_polyctx *ctx)
{
    gs_poly t;
    size_t i, nw = (size_t)ctx->nwords;
    uint64_t one = (uint64_t)1 << gs_poly_field_shift(var);
    gs_poly_init(&t);
    for (i = 0; i < a->length; i++) {
        const uint64_t *e = term_exps(a, i, ctx);
        unsigned k = gs_poly_exp_get(e, var);
        if (k > 0) {
            gs_int *c = append_term(&t, e, ctx);
            gs_int_mul_si(c, &a->coeffs[i], (int64_t)k);
            t.exps[(t.length - 1) * nw + (size_t)var / 4] -= one;
        }
    }
    gs_poly_swap(r, &t);
    gs_poly_clear(&t);
}

/* c[k] = coefficient of x_var^k in a for k = 0 .. n (n = degree in var);
   a new array of n + 1 initialised polynomials. */
/* Only the extreme coefficients in x_var decide the limit of n/d: the
   leading ones as x -> infinity, the trailing ones as x -> 0. */
int gs_poly_limit_ratio(gs_poly *rn, gs_poly *rd, const gs_poly *n,
                        const gs_poly *d, int var, int to_inf,
                        const gs_polyctx *ctx)
{
    long dn, dd;
    gs_poly tn, td;
    if (gs_poly_is_zero(d))
        return GS_EDIVZERO;
    if (gs_poly_is_zero(n)) {
        gs_poly_zero(rn);
        gs_poly_set_si(rd, 1, ctx);
        return GS_OK;
    }
    dn = to_inf ? gs_poly_degree(n, var, ctx) : gs_poly_lowdegree(n, var, ctx);
    dd = to_inf ? gs_poly_degree(d, var, ctx) : gs_poly_lowdegree(d, var, ctx);
    if (to_inf ? dn > dd : dn < dd)
        return GS_ERANGE;
    if (dn != dd) {
        gs_poly_zero(rn);
        gs_poly_set_si(rd, 1, ctx);
        return GS_OK;
    }
    gs_poly_init(&tn);
    gs_poly_init(&td);
    gs_poly_coeff_var(&tn, n, var, (unsigned)dn, ctx);
    gs_poly_coeff_var(&td, d, var, (unsigned)dd, ctx);
    gs_poly_swap(rn, &tn);
    gs_poly_swap(rd, &td);
    gs_poly_clear(&tn);
    gs_poly_clear(&td);
    return GS_OK;
}

/* Evaluation: a table of powers vals[v]^k for k <= deg_v (each by one
   more multiplication), then a plain sum of coefficient times monomial.
   The four precisions share this body. */
#define EVAL_BODY(T, GETC)                                                \
    unsigned *deg = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *deg);    \
    size_t *off = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *off);      \
    size_t i, tot = 0;                                                    \
    T *pw, sum = 0;                                                       \
    int v;                                                                \
    gs_poly_degrees(deg, a, ctx);                                         \
    for (v = 0; v < ctx->nvars; v++) {                                    \
        off[v] = tot;                                                     \
        tot += (size_t)deg[v] + 1;                                        \
    }                                                                     \
    pw = gs_malloc((tot + 1) * sizeof *pw);                               \
    for (v = 0; v < ctx->nvars; v++) {                                    \
        unsigned k;                                                       \
        pw[off[v]] = 1;                                                   \
        for (k = 1; k <= deg[v]; k++)                                     \
            pw[off[v] + k] = pw[off[v] + k - 1] * vals[v];                \
    }                                                                     \
    for (i = 0; i < a->length; i++) {                                     \
        const uint64_t *e = term_exps(a, i, ctx);                         \
        T m = GETC(&a->coeffs[i]);                                        \
        for (v = 0; v < ctx->nvars; v++) {                                \
            unsigned k = gs_poly_exp_get(e, v);                           \
            if (k != 0)                                                   \
                m *= pw[off[v] + k];                                      \
        }                                                                 \
        sum += m;                                                         \
    }                                                                     \
    gs_free(pw);                                                             \
    gs_free(off);                                                            \
    gs_free(deg);                                                            \
    return sum

double gs_poly_eval_d(const gs_poly *a, const double *vals,
                      const gs_polyctx *ctx)
{
    EVAL_BODY(double, gs_int_get_d);
}

long double gs_poly_eval_ld(const gs_poly *a, const long double *vals,
                            const gs_polyctx *ctx)
{
    EVAL_BODY(long double, gs_int_get_ld);
}

double complex gs_poly_eval_c(const gs_poly *a, const double complex *vals,
                              const gs_polyctx *ctx)
{
    EVAL_BODY(double complex, gs_int_get_d);
}

long double complex gs_poly_eval_lc(const gs_poly *a,
                                    const long double complex *vals,
                                    const gs_polyctx *ctx)
{
    EVAL_BODY(long double complex, gs_int_get_ld);
}
