/* poly_mul.c - products and powers of sparse polynomials. See LICENSE.
 *
 * One method with a knob.  The variables are cut into a prefix 0 .. m-1
 * and a suffix m .. nvars-1; the terms of an operand that share their
 * prefix exponents form a block (they are contiguous, since the order is
 * lexicographic).  The blocks of the product come out in decreasing order
 * from a heap of block pairs, the heap method of Johnson ("Sparse
 * polynomial arithmetic", SIGSAM Bulletin 8(3), 1974) as used by Monagan
 * and Pearce ("Sparse polynomial multiplication and division in Maple
 * 14", 2010, and ISSAC 2009): a pair (i, j+1) enters only when (i, j)
 * leaves, and (i+1, 0) when (i, 0) leaves, so the heap holds at most one
 * pair per block of the first operand.  Within a block the suffix exponents are
 * read as the digits of a mixed-radix number, radix deg_a + deg_b + 1 per
 * variable (Kronecker's substitution), so a term product lands at the sum
 * of two indices in a dense accumulator and the digits never carry.
 *
 * m = nvars makes every block one term: the plain heap method, right for
 * very sparse operands.  Small m gives few large blocks: a dense product
 * whose inner loop is a multiply-add into an array, right for products
 * with many coinciding monomials (Fateman's benchmark).  mul_plan picks m
 * by a cost estimate.  Coefficients accumulate in the narrowest of three
 * kinds of cell that a bound proves cannot overflow: a signed 128-bit
 * word, three words (192 bits, for 64-bit inputs whose sums pass 128
 * bits, as in Fateman's benchmark at n = 30), else a gs_int.
 */
#include "algebra/poly.h"
#include "algebra/poly_impl.h"

#include "gainsmith.h"
#include "base/mem.h"

#include <assert.h>
#include <stdlib.h>
#include <string.h>

typedef struct mulstate {
    const gs_polyctx *ctx;
    gs_playout lay;         /* radices deg_a + deg_b + 1 */
    gs_pside a, b;          /* heap slot i is a's block i */
    gs_poly out;
    uint64_t *cur;          /* kw: compact prefix of the current block */
    uint64_t *cur_std;      /* nw: the same prefix, poly.h layout */
    gs_int tmp;
    size_t cap;             /* stop once out holds more terms; 0: none */
} mulstate;

/* The kinds of accumulator cell (acc_kind picks one). */
enum { ACC_BIG, ACC_I128, ACC_MID };

static double log2_approx(double x)
{
    double l = 0;
    while (x >= 2) {
        x /= 2;
        l += 1;
    }
    return l + (x - 1);
}

/* Estimated work for prefix length m, in units of one dense multiply-add:
   every term pair costs one, every block pair a heap operation and loop
   set-up, every output block a scan of its dense range.  The number of
   output blocks is bounded by the block pairs and by the prefix box. */
static double plan_cost(double na, double nb, double ablocks,
                        double bblocks, double box, double dsize)
{
    double pairs = ablocks * bblocks;
    double outb = pairs < box ? pairs : box;
    double prod = dsize > 4096 ? 1.5 : 1.0;    /* beyond the first level
                                                  cache */
    return na * nb * prod + pairs * (12 + 3 * log2_approx(ablocks + 1))
        + outb * (10 + 0.25 * dsize);
}

static int mul_plan(const gs_poly *a, const gs_poly *b, const unsigned *radix,
                    int method, const gs_polyctx *ctx)
{
    int n = ctx->nvars, m, best = n;
    size_t *ba = gs_malloc(((size_t)n + 1) * sizeof *ba);
    size_t *bb = gs_malloc(((size_t)n + 1) * sizeof *bb);
    double dsize = 1, box = 1, bestcost;
    gs_poly_block_counts(ba, a, ctx);
    gs_poly_block_counts(bb, b, ctx);
    for (m = 0; m < n; m++)
        box *= radix[m];
    bestcost = plan_cost((double)a->length, (double)b->length,
                         (double)a->length, (double)b->length, box, 1);
    for (m = n - 1; m >= 0 && method != GS_POLY_MUL_HEAP; m--) {
        double cost;
        dsize *= radix[m];
        box /= radix[m];
        if (dsize > GS_POLY_DENSE_CAP)
            break;
        cost = plan_cost((double)a->length, (double)b->length,
                         (double)ba[m], (double)bb[m], box, dsize);
        if (method == GS_POLY_MUL_DENSE || cost < bestcost) {
            best = m;
            bestcost = cost;
        }
    }
    gs_free(ba);
    gs_free(bb);
    return best;
}

/* Append the term (prefix cur_std, suffix index k) to the product;
   returns its coefficient slot, initialised to 0. */
static gs_int *emit(mulstate *st, size_t k)
{
    gs_poly *o = &st->out;
    size_t nw = (size_t)st->lay.nw, w;
    uint64_t *e;
    gs_poly_fit(o, o->length + 1, st->ctx);
    e = o->exps + o->length * nw;
    for (w = 0; w < nw; w++)
        e[w] = st->cur_std[w];
    gs_playout_decode(&st->lay, e, k);
    gs_int_init(&o->coeffs[o->length]);
    return &o->coeffs[o->length++];
}

#if GS_HAVE_I128
static void set_i128(gs_int *r, gs_i128 x, gs_int *tmp)
{
    gs_u128 u;
    if (x >= -(gs_i128)INT64_MAX && x <= (gs_i128)INT64_MAX) {
        gs_int_set_si(r, (int64_t)x);
        return;
    }
    u = x < 0 ? -(gs_u128)x : (gs_u128)x;
    gs_int_set_ui(r, (uint64_t)(u >> 64));
    gs_int_mul_2exp(r, r, 64);
    gs_int_set_ui(tmp, (uint64_t)u);
    gs_int_add(r, r, tmp);
    if (x < 0)
        gs_int_neg(r, r);
}

/* acc[ia + ib] += ca * cb over one block pair: the hot loop. */
static void pair_small(gs_i128 *acc, const gs_pside *a, size_t i,
                       const gs_pside *b, size_t j)
{
    size_t s, t, b0 = b->start[j], nb = b->start[j + 1] - b0;
    const uint32_t *ib = b->idx + b0;
    const int64_t *cb = b->small + b0;
    for (s = a->start[i]; s < a->start[i + 1]; s++) {
        gs_i128 *row = acc + a->idx[s];
        int64_t c = a->small[s];
        for (t = 0; t < nb; t++)
            row[ib[t]] += (gs_i128)c * cb[t];
    }
}

static void flush_small(mulstate *st, gs_i128 *acc, size_t lo, size_t hi)
{
    size_t k;
    for (k = hi + 1; k-- > lo;)
        if (acc[k] != 0) {
            set_i128(emit(st, k), acc[k], &st->tmp);
            acc[k] = 0;
        }
}

/* A three-word cell k: the value hi[k] * 2^128 + lo[k].  lo[k] is a
   signed 128-bit sum that wraps; hi[k] counts its wraps, +1 for each
   past 2^127, -1 for each below -2^127.  Sums of products of 64-bit
   coefficients stay exact in it while they stay below 2^190 (acc_kind;
   then |hi| < 2^63).  On Fateman's benchmark at n = 30 a sum passes
   2^128 only after many products, so the wrap test is a branch the
   processor predicts, and a product costs an add with carry and that
   branch instead of a multi-precision multiply-add.  The high words
   live in an array of their own, so the hot loop streams through no
   more memory than the 128-bit one does. */
typedef struct acc3 {
    gs_i128 *lo;
    int64_t *hi;
} acc3;

/* r = hi * 2^128 + lo */
static void set_acc3(gs_int *r, gs_i128 lo_s, int64_t hi_s, gs_int *tmp)
{
    gs_u128 lo = (gs_u128)lo_s;
    uint64_t hi;
    int neg;
    if (hi_s == 0) {
        set_i128(r, lo_s, tmp);
        return;
    }
    /* as 192-bit two's complement: lo's sign moves into the top word */
    hi = (uint64_t)(hi_s - (lo_s < 0));
    neg = (int64_t)hi < 0;
    if (neg) {              /* the magnitude: negate all three words */
        lo = ~lo + 1;
        hi = ~hi + (lo == 0);
    }
    gs_int_set_ui(r, hi);
    gs_int_mul_2exp(r, r, 64);
    gs_int_set_ui(tmp, (uint64_t)(lo >> 64));
    gs_int_add(r, r, tmp);
    gs_int_mul_2exp(r, r, 64);
    gs_int_set_ui(tmp, (uint64_t)lo);
    gs_int_add(r, r, tmp);
    if (neg)
        gs_int_neg(r, r);
}

/* pair_small with three-word cells.  __builtin_add_overflow (GCC and
   clang, as __int128 itself) says when the signed sum wrapped. */
static void pair_mid(const acc3 *acc, const gs_pside *a, size_t i,
                     const gs_pside *b, size_t j)
{
    size_t s, t, b0 = b->start[j], nb = b->start[j + 1] - b0;
    const uint32_t *ib = b->idx + b0;
    const int64_t *cb = b->small + b0;
    for (s = a->start[i]; s < a->start[i + 1]; s++) {
        gs_i128 *row = acc->lo + a->idx[s];
        int64_t *rowhi = acc->hi + a->idx[s];
        int64_t c = a->small[s];
        for (t = 0; t < nb; t++) {
            gs_i128 p = (gs_i128)c * cb[t];
            if (__builtin_add_overflow(row[ib[t]], p, &row[ib[t]]))
                rowhi[ib[t]] += p < 0 ? -1 : 1;
        }
    }
}

static void flush_mid(mulstate *st, const acc3 *acc, size_t lo, size_t hi)
{
    size_t k;
    for (k = hi + 1; k-- > lo;)
        if (acc->lo[k] != 0 || acc->hi[k] != 0) {
            set_acc3(emit(st, k), acc->lo[k], acc->hi[k], &st->tmp);
            acc->lo[k] = 0;
            acc->hi[k] = 0;
        }
}
#endif

static void pair_big(gs_int *acc, const gs_pside *a, size_t i,
                     const gs_pside *b, size_t j)
{
    size_t s, t, b0 = b->start[j], b1 = b->start[j + 1];
    for (s = a->start[i]; s < a->start[i + 1]; s++) {
        gs_int *row = acc + a->idx[s];
        const gs_int *c = &a->coeffs[s];
        for (t = b0; t < b1; t++)
            gs_int_addmul(&row[b->idx[t]], c, &b->coeffs[t]);
    }
}

static void flush_big(mulstate *st, gs_int *acc, size_t lo, size_t hi)
{
    size_t k;
    for (k = hi + 1; k-- > lo;)
        if (!gs_int_is_zero(&acc[k]))
            gs_int_swap(emit(st, k), &acc[k]);
}

/* keys[i] = compact prefix of a's block i plus that of b's block j */
static void pair_key(uint64_t *keys, const mulstate *st, size_t i, size_t j)
{
    size_t kw = (size_t)st->lay.kw, w;
    const uint64_t *x = st->a.key + i * kw, *y = st->b.key + j * kw;
    uint64_t *k = keys + i * kw;
    for (w = 0; w < kw; w++)
        k[w] = x[w] + y[w];
}

/* cur_std = the prefix of the block pair (i, j), poly.h layout */
static void pair_std(mulstate *st, size_t i, size_t j)
{
    size_t nw = (size_t)st->lay.nw, w;
    const uint64_t *x = st->a.skey + i * nw, *y = st->b.skey + j * nw;
    for (w = 0; w < nw; w++)
        st->cur_std[w] = x[w] + y[w];
}

/* Accumulate the block pair at the heap top into acc, widen [lo, hi] to
   its range, and queue its successors (i, j+1) and, from (i, 0), the
   pair (i+1, 0). */
static void take_pair(mulstate *st, gs_pheap *h, uint64_t *keys, void *acc,
                      int kind, size_t *lo, size_t *hi)
{
    const gs_pside *a = &st->a, *b = &st->b;
    uint64_t pl = h->v[0].pl;
    size_t i = (size_t)(pl >> 32), j = (size_t)(pl & 0xFFFFFFFFu);
    size_t l = a->idx[a->start[i + 1] - 1] + b->idx[b->start[j + 1] - 1];
    size_t u = a->idx[a->start[i]] + b->idx[b->start[j]];
#if GS_HAVE_I128
    if (kind == ACC_I128)
        pair_small(acc, a, i, b, j);
    else if (kind == ACC_MID)
        pair_mid(acc, a, i, b, j);
    else
#endif
        pair_big(acc, a, i, b, j);
    (void)kind;
    *lo = l < *lo ? l : *lo;
    *hi = u > *hi ? u : *hi;
    if (j + 1 < b->nblocks) {
        pair_key(keys, st, i, j + 1);
        gs_pheap_replace_top(h, pl + 1);
    } else {
        gs_pheap_pop(h);
    }
    if (j == 0 && i + 1 < a->nblocks) {
        pair_key(keys, st, i + 1, 0);
        gs_pheap_push(h, (uint64_t)(i + 1) << 32);
    }
}

/* Take every block pair of the top prefix, then write out that output
   block.  acc is the dense accumulator of the chosen kind (ACC_*). */
static void mul_loop(mulstate *st, void *acc, int kind)
{
    gs_pheap h;
    size_t kw = (size_t)st->lay.kw;
    uint64_t *keys = gs_malloc((st->a.nblocks + 1) * kw * 8);
    gs_pheap_init(&h, (int)kw, st->a.nblocks + 1);
    h.keys = keys;
    pair_key(keys, st, 0, 0);
    gs_pheap_push(&h, 0);
    while (h.n > 0 && !(st->cap && st->out.length > st->cap)) {
        size_t lo = SIZE_MAX, hi = 0;
        uint64_t top = h.v[0].pl;
        memcpy(st->cur, gs_pheap_key(&h, top), kw * 8);
        pair_std(st, (size_t)(top >> 32), (size_t)(top & 0xFFFFFFFFu));
        do
            take_pair(st, &h, keys, acc, kind, &lo, &hi);
        while (h.n > 0 && gs_pheap_cmp_top(&h, st->cur) == 0);
#if GS_HAVE_I128
        if (kind == ACC_I128)
            flush_small(st, acc, lo, hi);
        else if (kind == ACC_MID)
            flush_mid(st, acc, lo, hi);
        else
#endif
            flush_big(st, acc, lo, hi);
    }
    gs_pheap_clear(&h);
    gs_free(keys);
}

/* Which cell holds every coefficient sum?  |a_i| < 2^ba, |b_j| < 2^bb
   and at most min(len a, len b) products meet in one coefficient, so the
   sums stay below 2^(ba + bb + ceil log2 min): within 126 bits a signed
   128-bit word, within 190 bits three words (both keep a bit spare).
   Either needs every coefficient to fit int64, for the pside's small
   copies.  mid_first takes three words even when 128 bits would do. */
static int acc_kind(const gs_poly *a, const gs_poly *b, int mid_first)
{
    size_t i, n = a->length < b->length ? a->length : b->length;
    size_t ba = 0, bb = 0, lg = 0;
    for (i = 0; i < a->length; i++) {
        if (!gs_int_is_small(&a->coeffs[i]))
            return ACC_BIG;
        if (gs_int_bits(&a->coeffs[i]) > ba)
            ba = gs_int_bits(&a->coeffs[i]);
    }
    for (i = 0; i < b->length; i++) {
        if (!gs_int_is_small(&b->coeffs[i]))
            return ACC_BIG;
        if (gs_int_bits(&b->coeffs[i]) > bb)
            bb = gs_int_bits(&b->coeffs[i]);
    }
    while (((size_t)1 << lg) < n)
        lg++;
    if (!GS_HAVE_I128 || ba + bb + lg > 190)
        return ACC_BIG;
    return ba + bb + lg <= 126 && !mid_first ? ACC_I128 : ACC_MID;
}

/* r = a * b with prefix length m; the blocks of a go in the heap. */
static void mul_blocks(gs_poly *r, const gs_poly *a, const gs_poly *b, int m,
                       const unsigned *radix, int kind, size_t cap,
                       const gs_polyctx *ctx)
{
    mulstate st;
    size_t k, dsize;
    st.ctx = ctx;
    st.cap = cap;
    gs_playout_init(&st.lay, ctx, m, radix);
    gs_pside_build(&st.a, a, &st.lay, kind != ACC_BIG);
    gs_pside_build(&st.b, b, &st.lay, kind != ACC_BIG);
    st.cur = gs_malloc((size_t)st.lay.kw * 8);
    st.cur_std = gs_malloc((size_t)st.lay.nw * 8);
    gs_poly_init(&st.out);
    gs_int_init(&st.tmp);
    gs_poly_fit(&st.out, a->length + b->length, ctx);
    dsize = st.lay.dsize;
#if GS_HAVE_I128
    if (kind == ACC_I128) {
        gs_i128 *acc = gs_calloc(dsize, sizeof *acc);
        mul_loop(&st, acc, ACC_I128);
        gs_free(acc);
    } else if (kind == ACC_MID) {
        acc3 acc;
        acc.lo = gs_calloc(dsize, sizeof *acc.lo);
        acc.hi = gs_calloc(dsize, sizeof *acc.hi);
        mul_loop(&st, &acc, ACC_MID);
        gs_free(acc.lo);
        gs_free(acc.hi);
    } else
#endif
    {
        gs_int *acc = gs_malloc(dsize * sizeof *acc);
        for (k = 0; k < dsize; k++)
            gs_int_init(&acc[k]);
        mul_loop(&st, acc, ACC_BIG);
        for (k = 0; k < dsize; k++)
            gs_int_clear(&acc[k]);
        gs_free(acc);
    }
    gs_poly_swap(r, &st.out);
    gs_poly_clear(&st.out);
    gs_int_clear(&st.tmp);
    gs_free(st.cur);
    gs_free(st.cur_std);
    gs_pside_clear(&st.a);
    gs_pside_clear(&st.b);
    gs_playout_clear(&st.lay);
}

/* r = a * (c x^e) for a one-term b. */
static void mul_term(gs_poly *r, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx)
{
    gs_int c;
    uint64_t *e = gs_malloc((size_t)ctx->nwords * 8);
    gs_int_init(&c);
    gs_int_set(&c, &b->coeffs[0]);
    memcpy(e, b->exps, (size_t)ctx->nwords * 8);
    gs_poly_mul_monomial(r, a, e, ctx);
    gs_poly_mul_int(r, r, &c, ctx);
    gs_int_clear(&c);
    gs_free(e);
}

static void mul_capped(gs_poly *r, const gs_poly *a, const gs_poly *b,
                       int method, size_t cap, const gs_polyctx *ctx)
{
    unsigned *da, *db, *radix;
    int v, m, alg = method & 7;
    if (a->length == 0 || b->length == 0) {
        gs_poly_zero(r);
        return;
    }
    if (alg == GS_POLY_MUL_AUTO && (a->length == 1 || b->length == 1)) {
        if (b->length == 1)
            mul_term(r, a, b, ctx);
        else
            mul_term(r, b, a, ctx);
        return;
    }
    da = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *da);
    db = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *db);
    radix = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *radix);
    gs_poly_degrees(da, a, ctx);
    gs_poly_degrees(db, b, ctx);
    for (v = 0; v < ctx->nvars; v++) {
        assert(da[v] + db[v] <= GS_POLY_MAX_EXP);  /* precondition */
        radix[v] = da[v] + db[v] + 1;
    }
    m = mul_plan(a, b, radix, alg, ctx);
    mul_blocks(r, a, b, m, radix,
               method & GS_POLY_MUL_BIGACC
                   ? ACC_BIG : acc_kind(a, b, method & GS_POLY_MUL_MIDACC),
               cap, ctx);
    gs_free(da);
    gs_free(db);
    gs_free(radix);
}

void gs_poly_mul_method(gs_poly *r, const gs_poly *a, const gs_poly *b,
                        int method, const gs_polyctx *ctx)
{
    mul_capped(r, a, b, method, 0, ctx);
}

int gs_poly_mul_cap(gs_poly *r, const gs_poly *a, const gs_poly *b,
                    size_t cap, const gs_polyctx *ctx)
{
    mul_capped(r, a, b, GS_POLY_MUL_AUTO, cap, ctx);
    if (cap && r->length > cap) {
        gs_poly_zero(r);
        return GS_EBUDGET;
    }
    return GS_OK;
}

/* One stream of gs_poly_sum_of_products: term t of a[k] times b[k]. */
typedef struct sop_stream {
    const gs_poly *big;
    const uint64_t *mono;   /* exponents of the small factor's term */
    const gs_int *c;        /* its coefficient */
    int neg;
    size_t pos;             /* next term of big */
} sop_stream;

/* key = big's term pos times mono: packed fields add without carries */
static void sop_key(uint64_t *key, const sop_stream *s, int nw)
{
    const uint64_t *e = s->big->exps + s->pos * (size_t)nw;
    int w;
    for (w = 0; w < nw; w++) {
        key[w] = e[w] + s->mono[w];
        assert((key[w] & GS_POLY_GUARD) == 0);
    }
}

void gs_poly_sum_of_products(gs_poly *r, const gs_poly *const *a,
                             const gs_poly *const *b, const int *neg,
                             size_t n, const gs_polyctx *ctx)
{
    int nw = ctx->nwords;
    size_t k, t, ns = 0, total = 0;
    sop_stream *st;
    uint64_t *keys, *cur;
    gs_pheap h;
    gs_int acc;

    for (k = 0; k < n; k++) {
        assert(r != a[k] && r != b[k]);
        if (b[k]->length > 0) {
            ns += a[k]->length;
            total += a[k]->length * b[k]->length;
        }
    }
    gs_poly_zero(r);
    if (ns == 0)
        return;
    st = gs_malloc(ns * sizeof *st);
    keys = gs_malloc((ns + 1) * (size_t)nw * sizeof *keys);
    cur = keys + ns * (size_t)nw;
    gs_pheap_init(&h, nw, ns + 1);
    h.keys = keys;
    ns = 0;
    for (k = 0; k < n; k++) {
        if (b[k]->length == 0)
            continue;
        for (t = 0; t < a[k]->length; t++, ns++) {
            st[ns].big = b[k];
            st[ns].mono = a[k]->exps + t * (size_t)nw;
            st[ns].c = &a[k]->coeffs[t];
            st[ns].neg = neg != NULL && neg[k];
            st[ns].pos = 0;
            sop_key(keys + ns * (size_t)nw, &st[ns], nw);
            gs_pheap_push(&h, (uint64_t)ns << 32);
        }
    }
    /* about as many terms as the largest product: a start, not a bound */
    gs_poly_fit(r, total < 16 ? 16 : total / ns + 16, ctx);
    gs_int_init(&acc);
    while (h.n > 0) {
        memcpy(cur, gs_pheap_key(&h, h.v[0].pl), (size_t)nw * 8);
        gs_int_set_si(&acc, 0);
        do {
            size_t i = (size_t)(h.v[0].pl >> 32);
            sop_stream *s = &st[i];
            if (s->neg)
                gs_int_submul(&acc, s->c, &s->big->coeffs[s->pos]);
            else
                gs_int_addmul(&acc, s->c, &s->big->coeffs[s->pos]);
            if (++s->pos < s->big->length) {
                sop_key(keys + i * (size_t)nw, s, nw);
                gs_pheap_replace_top(&h, h.v[0].pl);
            } else {
                gs_pheap_pop(&h);
            }
        } while (h.n > 0 && gs_pheap_cmp_top(&h, cur) == 0);
        if (!gs_int_is_zero(&acc)) {
            if (r->length == r->alloc)
                gs_poly_fit(r, r->length + 1, ctx);
            memcpy(r->exps + r->length * (size_t)nw, cur, (size_t)nw * 8);
            gs_int_init(&r->coeffs[r->length]);
            gs_int_swap(&r->coeffs[r->length], &acc);
            r->length++;
        }
    }
    gs_int_clear(&acc);
    gs_pheap_clear(&h);
    gs_free(keys);
    gs_free(st);
    gs_poly_shrink(r, ctx);
}

int gs_poly_mul_fits(int *var, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx)
{
    unsigned *da, *db;
    int v, ok = 1;
    if (a->length == 0 || b->length == 0)
        return 1;
    da = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *da);
    db = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *db);
    gs_poly_degrees(da, a, ctx);
    gs_poly_degrees(db, b, ctx);
    for (v = 0; v < ctx->nvars && ok; v++)
        if (da[v] + db[v] > GS_POLY_MAX_EXP) {
            ok = 0;
            if (var)
                *var = v;
        }
    gs_free(da);
    gs_free(db);
    return ok;
}

void gs_poly_mul(gs_poly *r, const gs_poly *a, const gs_poly *b,
                 const gs_polyctx *ctx)
{
    gs_poly_mul_method(r, a, b, GS_POLY_MUL_AUTO, ctx);
}

/* (c x^u)^e */
static void pow_term(gs_poly *r, const gs_poly *a, unsigned long e,
                     const gs_polyctx *ctx)
{
    size_t w;
    gs_poly_set(r, a, ctx);
    gs_int_pow_ui(&r->coeffs[0], &r->coeffs[0], e);
    for (w = 0; w < (size_t)ctx->nwords; w++)
        r->exps[w] *= e;    /* fields stay below 2^15: no carries */
}

/* (u + v)^e = sum_k C(e, k) u^(e-k) v^k (binomial theorem); u > v, so the
   terms come out in decreasing order as k grows. */
static void pow_binomial(gs_poly *r, const gs_poly *a, unsigned long e,
                         const gs_polyctx *ctx)
{
    size_t nw = (size_t)ctx->nwords, w;
    unsigned long k;
    gs_int *up = gs_malloc((e + 1) * sizeof *up), binom, vk, kk;
    gs_poly t;
    gs_poly_init(&t);
    gs_poly_fit(&t, e + 1, ctx);
    gs_int_init(&binom);
    gs_int_init(&vk);
    gs_int_init(&kk);
    gs_int_set_si(&binom, 1);
    gs_int_set_si(&vk, 1);
    for (k = 0; k <= e; k++) {
        gs_int_init(&up[k]);
        if (k == 0)
            gs_int_set_si(&up[0], 1);
        else
            gs_int_mul(&up[k], &up[k - 1], &a->coeffs[0]);
    }
    for (k = 0; k <= e; k++) {
        gs_int *c = &t.coeffs[k];
        gs_int_init(c);
        gs_int_mul(c, &binom, &up[e - k]);
        gs_int_mul(c, c, &vk);
        for (w = 0; w < nw; w++)
            t.exps[k * nw + w] = a->exps[w] * (e - k) + a->exps[nw + w] * k;
        gs_int_mul(&vk, &vk, &a->coeffs[1]);
        /* C(e, k+1) = C(e, k) (e - k) / (k + 1), exactly */
        gs_int_mul_si(&binom, &binom, (int64_t)(e - k));
        gs_int_set_si(&kk, (int64_t)(k + 1));
        gs_int_divexact(&binom, &binom, &kk);
    }
    t.length = e + 1;
    gs_poly_swap(r, &t);
    gs_poly_clear(&t);
    for (k = 0; k <= e; k++)
        gs_int_clear(&up[k]);
    gs_free(up);
    gs_int_clear(&binom);
    gs_int_clear(&vk);
    gs_int_clear(&kk);
}

/* Powers by repeated multiplication: for sparse multivariate operands it
   does less work than repeated squaring, and is in essence optimal
   (Gentleman, "Optimal multiplication chains for computing a power of a
   symbolic polynomial", Math. Comp. 26, 1972). */
void gs_poly_pow_ui(gs_poly *r, const gs_poly *a, unsigned long e,
                    const gs_polyctx *ctx)
{
    gs_poly base, t;
    unsigned long k;
    int v;
    if (e == 0) {
        gs_poly_set_si(r, 1, ctx);
        return;
    }
    for (v = 0; v < ctx->nvars; v++) {
        long d = gs_poly_degree(a, v, ctx);
        assert(d <= 0 || e <= GS_POLY_MAX_EXP / (unsigned long)d);
        (void)d;
    }
    if (a->length <= 1 || e == 1) {
        if (a->length == 0)
            gs_poly_zero(r);
        else if (e == 1)
            gs_poly_set(r, a, ctx);
        else
            pow_term(r, a, e, ctx);
        return;
    }
    if (a->length == 2) {
        pow_binomial(r, a, e, ctx);
        return;
    }
    gs_poly_init(&base);
    gs_poly_init(&t);
    gs_poly_set(&base, a, ctx);
    gs_poly_set(&t, a, ctx);
    for (k = 1; k < e; k++)
        gs_poly_mul(&t, &t, &base, ctx);
    gs_poly_swap(r, &t);
    gs_poly_clear(&t);
    gs_poly_clear(&base);
}
