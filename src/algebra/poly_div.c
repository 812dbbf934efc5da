/* poly_div.c - exact division of sparse polynomials. See LICENSE.
 *
 * The quotient is produced in decreasing order from the successive
 * leading terms of a - q b, with a heap holding the pending products
 * q_i b_j (Johnson, "Sparse polynomial arithmetic", SIGSAM Bulletin 8(3),
 * 1974; Monagan and Pearce, "Polynomial division using dynamic arrays,
 * heaps, and packed exponent vectors", CASC 2007).  As in poly_mul.c the
 * work is done in blocks of terms sharing a prefix of exponents: the
 * heap merges block products q_i b_j (j >= 1), the terms of one prefix
 * are gathered in a dense array R, and R is divided by b's leading block
 * there, by the schoolbook method from the top index down, each new
 * quotient term subtracting its multiple of that block at once.  With a
 * one-term suffix (prefix = all variables) this is the plain heap
 * division, one entry per quotient term.
 *
 * Divisibility fails fast: when b divides a, the division algorithm
 * leaves no remainder, so the first term that the leading monomial of b
 * does not divide, a quotient coefficient that is not an integer, or a
 * quotient term outside the degree bounds deg a - deg b (per variable,
 * both ends) proves the division inexact.  The bounds also keep every
 * exponent and dense index in range and the work finite on any input.
 */
#include "algebra/poly.h"
#include "algebra/poly_impl.h"

#include "gainsmith.h"
#include "base/mem.h"

#include <assert.h>
#include <stdlib.h>
#include <string.h>

typedef struct divstate {
    const gs_polyctx *ctx;
    const gs_poly *a, *b;
    size_t nw, kw;
    int small;              /* 128-bit R and int64 quotient coefficients */
#if GS_HAVE_I128
    gs_i128 *ac;            /* small mode: the coefficients of a */
#endif
    gs_playout lay;         /* radices deg_v(a) + 1 */
    gs_pside sa, sb;
    uint64_t *qmax, *qmin;  /* bounds on quotient exponents (poly.h) */
    uint64_t *lmb_pre;      /* prefix of lm(b) */
    unsigned *dlmb, *dqmax, *dqmin;   /* the same per variable */
    gs_poly q;              /* the quotient so far; its blocks: */
    size_t qblocks, qballoc, qtalloc;
    size_t *qstart;         /* qblocks + 1 */
    uint64_t *qskey, *qkey; /* per block: prefix, poly.h and compact */
    uint64_t *keys;         /* per block: key of its heap entry */
    uint32_t *qidx;         /* per term: dense suffix index */
    int64_t *qsmall;        /* per term, small mode */
    gs_pheap h;             /* slot i: quotient block i with b's block j */
    uint64_t *cur, *cur_std, *qpre;     /* scratch */
    size_t bb, lg;          /* small mode: bits of |b|, ceil log2 len b */
    gs_int qq;
} divstate;

/* x <= y in every field */
static int le_fields(const uint64_t *x, const uint64_t *y, size_t nw)
{
    size_t w;
    for (w = 0; w < nw; w++)
        if (!gs_poly_fields_le(x[w], y[w]))
            return 0;
    return 1;
}

/* mx, mn = per-field maximum and minimum of the exponents of p (p != 0):
   its degrees and low degrees in every variable, in one pass. */
static void exp_range(uint64_t *mx, uint64_t *mn, const gs_poly *p,
                      size_t nw)
{
    size_t i, w;
    memcpy(mx, p->exps, nw * 8);
    memcpy(mn, p->exps, nw * 8);
    for (i = 1; i < p->length; i++)
        for (w = 0; w < nw; w++) {
            uint64_t e = p->exps[i * nw + w];
            uint64_t m1 = gs_poly_fields_ge(e, mx[w]);
            uint64_t m2 = gs_poly_fields_ge(e, mn[w]);
            mx[w] = (e & m1) | (mx[w] & ~m1);
            mn[w] = (mn[w] & m2) | (e & ~m2);
        }
}

/* Bounds from degrees and low degrees (deg q = deg a - deg b in every
   variable, and so for the low degrees); 0 when they rule the division
   out already.  amax: the degrees of a, filled in here. */
static int set_bounds(divstate *s, uint64_t *amax)
{
    size_t nw = s->nw, w;
    uint64_t *amin = gs_malloc(3 * nw * 8), *bmax = amin + nw;
    uint64_t *bmin = bmax + nw;
    int ok;
    exp_range(amax, amin, s->a, nw);
    exp_range(bmax, bmin, s->b, nw);
    ok = le_fields(bmax, amax, nw) && le_fields(bmin, amin, nw);
    for (w = 0; ok && w < nw; w++) {
        s->qmax[w] = amax[w] - bmax[w];
        s->qmin[w] = amin[w] - bmin[w];
    }
    ok = ok && le_fields(s->qmin, s->qmax, nw);
    gs_free(amin);
    return ok;
}

/* The prefix length: the longest suffix whose dense block stays small
   (8192 entries, 128 KiB) and is not wildly emptier than a (blocks of a
   times the block size within 256 entries per term of a).  The array is
   scanned only between the extreme indices that occur, so a block far
   emptier than that still pays for itself; measured on products of the
   elimination and of random sparse polynomials (common practice is
   similar: pick the dense size by the cache, then check sparsity). */
#define DIV_DENSE_MAX 8192.0
#define DIV_FILL 256.0

static int div_plan(const gs_poly *a, const unsigned *radix, int method,
                    const gs_polyctx *ctx)
{
    int n = ctx->nvars, m, best = n;
    size_t *blocks = gs_malloc(((size_t)n + 1) * sizeof *blocks);
    double dsize = 1, budget = DIV_FILL * (double)a->length + 4096;
    double cap = method == GS_POLY_MUL_DENSE ? GS_POLY_DENSE_CAP
                                             : DIV_DENSE_MAX;
    gs_poly_block_counts(blocks, a, ctx);
    for (m = n - 1; m >= 0 && method != GS_POLY_MUL_HEAP; m--) {
        dsize *= radix[m];
        if (dsize > cap)
            break;
        if (method == GS_POLY_MUL_DENSE
            || (double)blocks[m] * dsize <= budget)
            best = m;
    }
    gs_free(blocks);
    return best;
}

static void grow_blocks(divstate *s)
{
    s->qballoc *= 2;
    s->qstart = gs_reallocarray(s->qstart, s->qballoc + 1,
                                sizeof *s->qstart);
    s->qskey = gs_reallocarray(s->qskey, s->qballoc, s->nw * 8);
    s->qkey = gs_reallocarray(s->qkey, s->qballoc, s->kw * 8);
    s->keys = gs_reallocarray(s->keys, s->qballoc, s->kw * 8);
    s->h.keys = s->keys;
}

static void grow_terms(divstate *s)
{
    s->qtalloc *= 2;
    s->qidx = gs_reallocarray(s->qidx, s->qtalloc, sizeof *s->qidx);
    s->qsmall = gs_reallocarray(s->qsmall, s->qtalloc, sizeof *s->qsmall);
}

/* keys[i] = compact prefix of quotient block i times b's block j */
static void heap_key(divstate *s, size_t i, size_t j)
{
    size_t w, kw = s->kw;
    for (w = 0; w < kw; w++)
        s->keys[i * kw + w] = s->qkey[i * kw + w] + s->sb.key[j * kw + w];
}

/* The next prefix of a - q b, the larger of a's next block and the heap
   top, into cur and cur_std; 0 when both are exhausted. */
static int next_prefix(divstate *s, size_t ia)
{
    const uint64_t *ka = ia < s->sa.nblocks ? s->sa.key + ia * s->kw : NULL;
    size_t w;
    if (s->h.n > 0 && (ka == NULL || gs_pheap_cmp_top(&s->h, ka) >= 0)) {
        uint64_t pl = s->h.v[0].pl;
        size_t i = (size_t)(pl >> 32), j = (size_t)(pl & 0xFFFFFFFFu);
        memcpy(s->cur, gs_pheap_key(&s->h, pl), s->kw * 8);
        for (w = 0; w < s->nw; w++)
            s->cur_std[w] = s->qskey[i * s->nw + w]
                + s->sb.skey[j * s->nw + w];
    } else if (ka != NULL) {
        memcpy(s->cur, ka, s->kw * 8);
        memcpy(s->cur_std, s->sa.skey + ia * s->nw, s->nw * 8);
    } else {
        return 0;
    }
    return 1;
}

static void widen(size_t *lo, size_t *hi, size_t l, size_t u)
{
    if (l < *lo)
        *lo = l;
    if (u > *hi)
        *hi = u;
}

/* R = a's block ia (R is zero there) */
static void scatter_a(divstate *s, void *R, size_t ia, size_t *lo,
                      size_t *hi)
{
    size_t t, t0 = s->sa.start[ia], t1 = s->sa.start[ia + 1];
    widen(lo, hi, s->sa.idx[t1 - 1], s->sa.idx[t0]);
    for (t = t0; t < t1; t++) {
#if GS_HAVE_I128
        if (s->small)
            ((gs_i128 *)R)[s->sa.idx[t]] = s->ac[t];
        else
#endif
            gs_int_set(&((gs_int *)R)[s->sa.idx[t]], &s->a->coeffs[t]);
    }
}

/* R -= (terms t0 .. t1-1 of q) * (terms u0 .. u1-1 of b), both as dense
   suffix indices: the inner loop of the division. */
static void sub_product(divstate *s, void *R, size_t t0, size_t t1,
                        size_t u0, size_t u1)
{
    const uint32_t *ib = s->sb.idx;
    size_t t, u;
#if GS_HAVE_I128
    if (s->small) {
        const int64_t *cb = s->sb.small;
        for (t = t0; t < t1; t++) {
            gs_i128 *row = (gs_i128 *)R + s->qidx[t];
            int64_t c = s->qsmall[t];
            for (u = u0; u < u1; u++)
                row[ib[u]] -= (gs_i128)c * cb[u];
        }
        return;
    }
#endif
    for (t = t0; t < t1; t++) {
        gs_int *row = (gs_int *)R + s->qidx[t];
        const gs_int *c = &s->q.coeffs[t];
        for (u = u0; u < u1; u++)
            gs_int_submul(&row[ib[u]], c, &s->b->coeffs[u]);
    }
}

/* Pop the heap entries at the current prefix into R, queueing their
   successors. */
static void pop_pairs(divstate *s, void *R, size_t *lo, size_t *hi)
{
    const gs_pside *b = &s->sb;
    while (s->h.n > 0 && gs_pheap_cmp_top(&s->h, s->cur) == 0) {
        uint64_t pl = s->h.v[0].pl;
        size_t i = (size_t)(pl >> 32), j = (size_t)(pl & 0xFFFFFFFFu);
        size_t t0 = s->qstart[i], t1 = s->qstart[i + 1];
        widen(lo, hi, s->qidx[t1 - 1] + b->idx[b->start[j + 1] - 1],
              s->qidx[t0] + b->idx[b->start[j]]);
        sub_product(s, R, t0, t1, b->start[j], b->start[j + 1]);
        if (j + 1 < b->nblocks) {
            heap_key(s, i, j + 1);
            gs_pheap_replace_top(&s->h, pl + 1);
        } else {
            gs_pheap_pop(&s->h);
        }
    }
}

/* Is the quotient prefix cur_std - prefix(lm b) in bounds?  Sets qpre. */
static int prefix_ok(divstate *s)
{
    size_t w;
    if (!le_fields(s->lmb_pre, s->cur_std, s->nw))
        return 0;
    for (w = 0; w < s->nw; w++)
        s->qpre[w] = s->cur_std[w] - s->lmb_pre[w];
    for (w = 0; w < s->nw; w++) {
        uint64_t hi = s->qmax[w] & s->lay.premask[w];
        uint64_t lo = s->qmin[w] & s->lay.premask[w];
        if (!gs_poly_fields_le(s->qpre[w], hi)
            || !gs_poly_fields_le(lo, s->qpre[w]))
            return 0;
    }
    return 1;
}

/* Is dense index k, divided by the suffix of lm(b), a possible suffix of
   a quotient term? */
static int suffix_ok(const divstate *s, size_t k)
{
    int v;
    for (v = s->lay.m; v < s->ctx->nvars; v++) {
        unsigned d = gs_playout_digit(&s->lay, k, v);
        if (d < s->dlmb[v] || d - s->dlmb[v] > s->dqmax[v]
            || d - s->dlmb[v] < s->dqmin[v])
            return 0;
    }
    return 1;
}

static int entry_zero(const divstate *s, const void *R, size_t k)
{
#if GS_HAVE_I128
    if (s->small)
        return ((const gs_i128 *)R)[k] == 0;
#endif
    (void)s;
    return gs_int_is_zero(&((const gs_int *)R)[k]);
}

#if GS_HAVE_I128
static size_t bits_u64(uint64_t u)
{
    size_t n = 0;
    while (u) {
        u >>= 1;
        n++;
    }
    return n;
}
#endif

/* The quotient coefficient R[k] / lc(b) into s->qq (and qsmall[t]):
   1 done, 0 not an integer, -1 too large for small mode.  In small
   mode a sum at one monomial is a coefficient of a, below 2^125, less at
   most len(b) products q_i b_j: with |q_i| < 2^bq and |b_j| < 2^bb it
   stays below 2^126 while bq + bb + ceil log2 len(b) <= 125. */
static int quotient_coeff(divstate *s, void *R, size_t k, size_t t)
{
#if GS_HAVE_I128
    if (s->small) {
        gs_i128 r = ((gs_i128 *)R)[k], c;
        int64_t lcb = s->sb.small[0];
        uint64_t mag;
        if (r % lcb != 0)
            return 0;
        c = r / lcb;
        if (c > INT64_MAX || c < -INT64_MAX)
            return -1;
        mag = c < 0 ? (uint64_t)-c : (uint64_t)c;
        if (bits_u64(mag) + s->bb + s->lg > 125)
            return -1;
        s->qsmall[t] = (int64_t)c;
        gs_int_set_si(&s->qq, (int64_t)c);
        return 1;
    }
#endif
    (void)t;
    return gs_int_divexact(&s->qq, &((gs_int *)R)[k], &s->b->coeffs[0])
        == GS_OK;
}

/* Append quotient term t with suffix index qi and coefficient s->qq. */
static void append_quotient(divstate *s, size_t qi)
{
    size_t t = s->q.length, w;
    uint64_t *e;
    gs_poly_fit(&s->q, t + 1, s->ctx);
    e = s->q.exps + t * s->nw;
    for (w = 0; w < s->nw; w++)
        e[w] = s->qpre[w];
    gs_playout_decode(&s->lay, e, qi);
    gs_int_init(&s->q.coeffs[t]);
    gs_int_swap(&s->q.coeffs[t], &s->qq);
    s->qidx[t] = (uint32_t)qi;
    s->q.length++;
}

/* Close the quotient block that starts at term t0 and queue it with b's
   second block. */
static void close_block(divstate *s, size_t t0)
{
    size_t i = s->qblocks;
    if (s->q.length == t0)
        return;
    if (i == s->qballoc)
        grow_blocks(s);
    s->qstart[i] = t0;
    s->qstart[i + 1] = s->q.length;
    memcpy(s->qskey + i * s->nw, s->qpre, s->nw * 8);
    gs_ppack_pack(&s->lay.pk, s->qkey + i * s->kw, s->qpre);
    s->qblocks++;
    if (s->sb.nblocks > 1) {
        heap_key(s, i, 1);
        gs_pheap_push(&s->h, ((uint64_t)i << 32) | 1);
    }
}

/* Divide R, over indices lo .. hi, by b's leading block: from the top
   index down, each nonzero entry gives a quotient term, whose product
   with that block is subtracted at once (reaching down to lower indices,
   so lo may move).  1 done, 0 inexact, -1 small mode overflow. */
static int block_divide(divstate *s, void *R, size_t lo, size_t hi)
{
    const gs_pside *b = &s->sb;
    size_t k, t0 = s->q.length, b1 = b->start[1], ilmb = b->idx[0];
    size_t ilast = b->idx[b1 - 1];
    int valid = prefix_ok(s), rc;
    for (k = hi + 1; k-- > lo;) {
        if (entry_zero(s, R, k))
            continue;
        if (!valid || k < ilmb || !suffix_ok(s, k))
            return 0;
        if (s->q.length == s->qtalloc)
            grow_terms(s);
        rc = quotient_coeff(s, R, k, s->q.length);
        if (rc != 1)
            return rc;
        append_quotient(s, k - ilmb);
        sub_product(s, R, s->q.length - 1, s->q.length, 0, b1);
        if (k - ilmb + ilast < lo)
            lo = k - ilmb + ilast;
    }
    close_block(s, t0);
    return 1;
}

static int div_loop(divstate *s, void *R)
{
    size_t ia = 0;
    while (next_prefix(s, ia)) {
        size_t lo = SIZE_MAX, hi = 0;
        int rc;
        if (ia < s->sa.nblocks
            && memcmp(s->cur, s->sa.key + ia * s->kw, s->kw * 8) == 0)
            scatter_a(s, R, ia++, &lo, &hi);
        pop_pairs(s, R, &lo, &hi);
        rc = block_divide(s, R, lo, hi);
        if (rc != 1)
            return rc;
    }
    return 1;
}

#if GS_HAVE_I128
/* c as a 128-bit integer, for |c| < 2^125: |c| = h 2^62 + l */
static gs_i128 get_i128(const gs_int *c, gs_int *t, gs_int *h, gs_int *l,
                        const gs_int *two62)
{
    gs_i128 v;
    if (gs_int_is_small(c))
        return gs_int_get_si(c);
    gs_int_abs(t, c);
    gs_int_fdiv_qr(h, l, t, two62);
    v = (gs_i128)gs_int_get_si(h) * ((gs_i128)1 << 62) + gs_int_get_si(l);
    return gs_int_sgn(c) < 0 ? -v : v;
}

static void a_to_i128(divstate *s)
{
    gs_int t, h, l, two62;
    size_t i;
    gs_int_init(&t);
    gs_int_init(&h);
    gs_int_init(&l);
    gs_int_init(&two62);
    gs_int_set_si(&two62, (int64_t)1 << 62);
    s->ac = gs_malloc((s->a->length + 1) * sizeof *s->ac);
    for (i = 0; i < s->a->length; i++)
        s->ac[i] = get_i128(&s->a->coeffs[i], &t, &h, &l, &two62);
    gs_int_clear(&t);
    gs_int_clear(&h);
    gs_int_clear(&l);
    gs_int_clear(&two62);
}
#endif

static int bits_at_most(const gs_poly *p, size_t bits)
{
    size_t i;
    for (i = 0; i < p->length; i++)
        if (!gs_int_is_small(&p->coeffs[i])
            && gs_int_bits(&p->coeffs[i]) > bits)
            return 0;
    return 1;
}

static int all_small(const gs_poly *p, size_t *bits)
{
    size_t i;
    *bits = 0;
    for (i = 0; i < p->length; i++) {
        if (!gs_int_is_small(&p->coeffs[i]))
            return 0;
        if (gs_int_bits(&p->coeffs[i]) > *bits)
            *bits = gs_int_bits(&p->coeffs[i]);
    }
    return 1;
}

/* per-variable bounds and the suffix digits of lm(b) */
static void unpack_bounds(divstate *s)
{
    int v, n = s->ctx->nvars;
    s->dlmb = gs_malloc(3 * ((size_t)n + 1) * sizeof *s->dlmb);
    s->dqmax = s->dlmb + n + 1;
    s->dqmin = s->dqmax + n + 1;
    for (v = 0; v < n; v++) {
        s->dlmb[v] = gs_poly_exp_get(s->b->exps, v);
        s->dqmax[v] = gs_poly_exp_get(s->qmax, v);
        s->dqmin[v] = gs_poly_exp_get(s->qmin, v);
    }
}

static void state_init(divstate *s, int m, const unsigned *radix, int small)
{
    size_t w;
    s->small = small;
    gs_playout_init(&s->lay, s->ctx, m, radix);
    s->kw = (size_t)s->lay.kw;
    gs_pside_build(&s->sa, s->a, &s->lay, 0);
    gs_pside_build(&s->sb, s->b, &s->lay, small);
#if GS_HAVE_I128
    s->ac = NULL;
    if (small)
        a_to_i128(s);
#endif
    s->lmb_pre = gs_malloc(4 * s->nw * 8);
    s->cur_std = s->lmb_pre + s->nw;
    s->qpre = s->cur_std + s->nw;
    s->cur = s->qpre + s->nw;   /* kw <= nw */
    for (w = 0; w < s->nw; w++)
        s->lmb_pre[w] = s->b->exps[w] & s->lay.premask[w];
    unpack_bounds(s);
    gs_poly_init(&s->q);
    s->qblocks = 0;
    s->qballoc = s->qtalloc = 16;
    s->qstart = gs_malloc((s->qballoc + 1) * sizeof *s->qstart);
    s->qskey = gs_malloc(s->qballoc * s->nw * 8);
    s->qkey = gs_malloc(s->qballoc * s->kw * 8);
    s->keys = gs_malloc(s->qballoc * s->kw * 8);
    s->qidx = gs_malloc(s->qtalloc * sizeof *s->qidx);
    s->qsmall = gs_malloc(s->qtalloc * sizeof *s->qsmall);
    gs_pheap_init(&s->h, (int)s->kw, 16);
    s->h.keys = s->keys;
    gs_int_init(&s->qq);
}

static void state_clear(divstate *s)
{
    gs_pside_clear(&s->sa);
    gs_pside_clear(&s->sb);
    gs_playout_clear(&s->lay);
#if GS_HAVE_I128
    gs_free(s->ac);
#endif
    gs_free(s->lmb_pre);
    gs_free(s->dlmb);
    gs_poly_clear(&s->q);
    gs_free(s->qstart);
    gs_free(s->qskey);
    gs_free(s->qkey);
    gs_free(s->keys);
    gs_free(s->qidx);
    gs_free(s->qsmall);
    gs_pheap_clear(&s->h);
    gs_int_clear(&s->qq);
}

/* One attempt with the given coefficient mode: 1, 0 or -1 as above; the
   quotient is left in s->q. */
static int divide(divstate *s, int m, const unsigned *radix, int small)
{
    size_t k, d;
    int rc;
    state_init(s, m, radix, small);
    d = s->lay.dsize;
#if GS_HAVE_I128
    if (small) {
        gs_i128 *R = gs_calloc(d, sizeof *R);
        rc = div_loop(s, R);
        gs_free(R);
        return rc;
    }
#endif
    {
        gs_int *R = gs_malloc(d * sizeof *R);
        for (k = 0; k < d; k++)
            gs_int_init(&R[k]);
        rc = div_loop(s, R);
        for (k = 0; k < d; k++)
            gs_int_clear(&R[k]);
        gs_free(R);
    }
    return rc;
}

int gs_poly_divexact_method(gs_poly *q, const gs_poly *a, const gs_poly *b,
                            int method, const gs_polyctx *ctx)
{
    divstate s;
    unsigned *radix;
    size_t v;
    int rc = 0, m, small;
    if (b->length == 0 || a->length == 0) {
        gs_poly_zero(q);
        return b->length == 0 ? GS_EDIVZERO : GS_OK;
    }
    s.ctx = ctx;
    s.a = a;
    s.b = b;
    s.nw = (size_t)ctx->nwords;
    s.qmax = gs_malloc(3 * s.nw * 8);
    s.qmin = s.qmax + s.nw;
    radix = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *radix);
    if (set_bounds(&s, s.qmin + s.nw)) {
        for (v = 0; v < (size_t)ctx->nvars; v++)    /* every key is at */
            /* most deg a */
            radix[v] = gs_poly_exp_get(s.qmin + s.nw, (int)v) + 1;
        m = div_plan(a, radix, method & 7, ctx);
        small = GS_HAVE_I128 && !(method & GS_POLY_MUL_BIGACC)
            && all_small(b, &s.bb) && bits_at_most(a, 125);
        for (s.lg = 0; ((size_t)1 << s.lg) < b->length; s.lg++)
            ;
        rc = divide(&s, m, radix, small);
        if (rc < 0) {       /* a quotient coefficient outgrew int64 */
            state_clear(&s);
            rc = divide(&s, m, radix, 0);
        }
        if (rc == 1)
            gs_poly_swap(q, &s.q);
        state_clear(&s);
    }
    if (rc != 1)
        gs_poly_zero(q);
    gs_free(radix);
    gs_free(s.qmax);
    return rc == 1 ? GS_OK : GS_EINEXACT;
}

int gs_poly_divexact(gs_poly *q, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx)
{
    return gs_poly_divexact_method(q, a, b, GS_POLY_MUL_AUTO, ctx);
}
