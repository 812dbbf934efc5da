/* poly_div.c - exact division of sparse polynomials. See LICENSE.
 *
 * The quotient's terms are produced in decreasing order, each from the
 * next term of a - q b, with a heap holding the pending products q_i b_j
 * (Johnson, "Sparse polynomial arithmetic", SIGSAM Bulletin 8(3), 1974;
 * Monagan and Pearce, "Polynomial division using dynamic arrays, heaps,
 * and packed exponent vectors", CASC 2007).  Quotient term i enters the
 * heap paired with b's second term and moves along b one term at a time,
 * so the heap holds at most one entry per quotient term and the work is
 * about len(q) len(b) log len(q).
 *
 * Divisibility fails fast: when b divides a, the division algorithm
 * leaves no remainder, so the first term that the leading monomial of b
 * does not divide, a quotient coefficient that is not an integer, or a
 * quotient term outside the degree bounds deg a - deg b (per variable,
 * both ends) proves the division inexact.  The bounds also keep every
 * exponent in range and the work finite on any input.
 */
#include "poly.h"
#include "poly_heap.h"

#include "gainsmith.h"
#include "mem.h"

#include <assert.h>
#include <stdlib.h>
#include <string.h>

#define GUARD UINT64_C(0x8000800080008000)

typedef struct divstate {
    const gs_polyctx *ctx;
    const gs_poly *a, *b;
    size_t nw;              /* words of a poly.h exponent vector */
    size_t kw;              /* words of a compact key (poly_heap.h) */
    gs_ppack pk;            /* fields sized for the degrees of a */
    uint64_t *qmax, *qmin;  /* per-field bounds on quotient exponents */
    uint64_t *lmb;          /* leading monomial of b */
    uint64_t *m;            /* scratch: a quotient monomial */
    uint64_t *ca, *cb;      /* compact monomials of a and b */
    uint64_t *cq;           /* compact monomials of q; also heap keys */
    uint64_t *keys;         /* per quotient term: key of its heap entry */
    size_t keys_alloc;      /* terms room in cq and keys */
    gs_poly q;
    gs_pheap h;             /* slot i: quotient term i */
} divstate;

static int le_fields(const uint64_t *x, const uint64_t *y, size_t nw)
{
    size_t w;
    for (w = 0; w < nw; w++)
        if ((((y[w] | GUARD) - x[w]) & GUARD) != GUARD)
            return 0;
    return 1;
}

static void pack_degrees(uint64_t *e, const unsigned *d, int nvars)
{
    int v;
    for (v = 0; v < nvars; v++)
        e[v / 4] |= (uint64_t)d[v] << (48 - 16 * (v % 4));
}

/* Per-field bounds from degrees and low degrees; 0 when some variable
   already rules the division out.  da: the degrees of a. */
static int set_bounds(divstate *s, const unsigned *da)
{
    size_t nw = s->nw, w;
    uint64_t *amax = gs_calloc(4 * nw, 8), *bmax = amax + nw;
    uint64_t *amin = bmax + nw, *bmin = amin + nw;
    unsigned *d = gs_malloc(((size_t)s->ctx->nvars + 1) * sizeof *d);
    int ok;
    gs_poly_monomial_content(amin, s->a, s->ctx);
    gs_poly_monomial_content(bmin, s->b, s->ctx);
    pack_degrees(amax, da, s->ctx->nvars);
    gs_poly_degrees(d, s->b, s->ctx);
    pack_degrees(bmax, d, s->ctx->nvars);
    ok = le_fields(bmax, amax, nw) && le_fields(bmin, amin, nw);
    if (ok)
        for (w = 0; w < nw; w++) {
            s->qmax[w] = amax[w] - bmax[w];
            s->qmin[w] = amin[w] - bmin[w];
        }
    ok = ok && le_fields(s->qmin, s->qmax, nw);
    free(d);
    free(amax);
    return ok;
}

/* m = M / lm(b) if that is a possible quotient monomial */
static int quotient_monomial(divstate *s, const uint64_t *mono)
{
    size_t w;
    if (!le_fields(s->lmb, mono, s->nw))
        return 0;
    for (w = 0; w < s->nw; w++)
        s->m[w] = mono[w] - s->lmb[w];
    return le_fields(s->m, s->qmax, s->nw) && le_fields(s->qmin, s->m, s->nw);
}

/* keys[i] = compact monomial of q_i b_j */
static void heap_key(divstate *s, size_t i, size_t j)
{
    size_t w, kw = s->kw;
    for (w = 0; w < kw; w++)
        s->keys[i * kw + w] = s->cq[i * kw + w] + s->cb[j * kw + w];
}

/* The next monomial of a - q b, the larger of a's next term and the heap
   top, as a compact key cm and in poly.h layout sm.  Returns 0 when both
   are exhausted. */
static int next_monomial(divstate *s, size_t ia, uint64_t *cm, uint64_t *sm)
{
    const uint64_t *ea = ia < s->a->length ? s->ca + ia * s->kw : NULL;
    size_t w;
    if (s->h.n > 0 && (ea == NULL || gs_pheap_cmp_top(&s->h, ea) >= 0)) {
        uint64_t pl = s->h.v[0].pl;
        size_t i = (size_t)(pl >> 32), j = (size_t)(pl & 0xFFFFFFFFu);
        memcpy(cm, gs_pheap_key(&s->h, pl), s->kw * 8);
        for (w = 0; w < s->nw; w++)
            sm[w] = s->q.exps[i * s->nw + w] + s->b->exps[j * s->nw + w];
    } else if (ea != NULL) {
        memcpy(cm, ea, s->kw * 8);
        memcpy(sm, s->a->exps + ia * s->nw, s->nw * 8);
    } else {
        return 0;
    }
    return 1;
}

/* does a's term ia have the compact monomial cm? */
static int a_term_at(const divstate *s, size_t ia, const uint64_t *cm)
{
    return ia < s->a->length
        && memcmp(cm, s->ca + ia * s->kw, s->kw * 8) == 0;
}

/* Pop every heap entry at compact monomial cm, handing each (i, j) to the
   caller's accumulator through the arrays pi, pj (n entries; at most
   len(b) - 1, one per j). */
static size_t pop_equal(divstate *s, const uint64_t *cm, size_t *pi,
                        size_t *pj)
{
    size_t n = 0;
    while (s->h.n > 0 && gs_pheap_cmp_top(&s->h, cm) == 0) {
        uint64_t pl = s->h.v[0].pl;
        size_t i = (size_t)(pl >> 32), j = (size_t)(pl & 0xFFFFFFFFu);
        pi[n] = i;
        pj[n++] = j;
        if (j + 1 < s->b->length) {
            heap_key(s, i, j + 1);
            gs_pheap_replace_top(&s->h, pl + 1);
        } else {
            gs_pheap_pop(&s->h);
        }
    }
    return n;
}

/* Append the quotient term with monomial s->m (compact: cm - lm(b)),
   coefficient set by the caller, and queue q_i b_1. */
static gs_int *add_quotient_term(divstate *s, const uint64_t *cm)
{
    size_t i = s->q.length, w, kw = s->kw;
    gs_poly_fit(&s->q, i + 1, s->ctx);
    memcpy(s->q.exps + i * s->nw, s->m, s->nw * 8);
    gs_int_init(&s->q.coeffs[i]);
    s->q.length++;
    assert(i < ((size_t)1 << 31));
    if (i == s->keys_alloc) {
        s->keys_alloc = 2 * s->keys_alloc;
        s->cq = gs_reallocarray(s->cq, s->keys_alloc, kw * 8);
        s->keys = gs_reallocarray(s->keys, s->keys_alloc, kw * 8);
        s->h.keys = s->keys;
    }
    for (w = 0; w < kw; w++)        /* lm(b) divides: no borrows */
        s->cq[i * kw + w] = cm[w] - s->cb[w];
    if (s->b->length > 1) {
        heap_key(s, i, 1);
        gs_pheap_push(&s->h, ((uint64_t)i << 32) | 1);
    }
    return &s->q.coeffs[i];
}

#if GS_HAVE_I128
static size_t bits_i64(int64_t x)
{
    uint64_t u = x < 0 ? (uint64_t)0 - (uint64_t)x : (uint64_t)x;
    size_t n = 0;
    while (u) {
        u >>= 1;
        n++;
    }
    return n;
}

/* 128-bit coefficients: all of a and b fit in int64.  A sum at one
   monomial is a_M minus at most len(b) - 1 products q_i b_j, so with
   |q_i| < 2^bq and |b_j| < 2^bb it stays below 2^127 while
   bq + bb + ceil log2 len(b) <= 125.  Returns 1 done, 0 inexact, -1 when
   a quotient coefficient outgrows the bound (redo with gs_ints). */
static int div_small(divstate *s, size_t *pi, size_t *pj)
{
    const gs_poly *a = s->a, *b = s->b;
    int64_t *qc = NULL, lcb = gs_int_get_si(&b->coeffs[0]);
    size_t qalloc = 0, ia = 0, bb = 0, bq = 0, lg = 0, k, n;
    uint64_t *mono = gs_malloc((s->nw + s->kw) * 8), *cm = mono + s->nw;
    int64_t *bc = gs_malloc(b->length * sizeof *bc);
    int rc = 1;
    for (k = 0; k < b->length; k++) {
        bc[k] = gs_int_get_si(&b->coeffs[k]);
        if (bits_i64(bc[k]) > bb)
            bb = bits_i64(bc[k]);
    }
    while (((size_t)1 << lg) < b->length)
        lg++;
    while (next_monomial(s, ia, cm, mono)) {
        gs_i128 acc = 0, qq;
        if (a_term_at(s, ia, cm))
            acc = gs_int_get_si(&a->coeffs[ia++]);
        n = pop_equal(s, cm, pi, pj);
        for (k = 0; k < n; k++)
            acc -= (gs_i128)qc[pi[k]] * bc[pj[k]];
        if (acc == 0)
            continue;
        if (!quotient_monomial(s, mono) || acc % lcb != 0) {
            rc = 0;
            break;
        }
        qq = acc / lcb;
        if (qq > INT64_MAX || qq < -INT64_MAX
            || bits_i64((int64_t)qq) + bb + lg > 125) {
            rc = -1;
            break;
        }
        if (bits_i64((int64_t)qq) > bq)
            bq = bits_i64((int64_t)qq);
        if (s->q.length == qalloc) {
            qalloc = qalloc ? 2 * qalloc : 16;
            qc = gs_reallocarray(qc, qalloc, sizeof *qc);
        }
        qc[s->q.length] = (int64_t)qq;
        gs_int_set_si(add_quotient_term(s, cm), (int64_t)qq);
    }
    free(qc);
    free(bc);
    free(mono);
    return rc;
}
#endif

/* Multi-precision coefficients.  Returns 1 done, 0 inexact. */
static int div_big(divstate *s, size_t *pi, size_t *pj)
{
    const gs_poly *a = s->a, *b = s->b;
    size_t ia = 0, k, n;
    uint64_t *mono = gs_malloc((s->nw + s->kw) * 8), *cm = mono + s->nw;
    gs_int acc, qq;
    int rc = 1;
    gs_int_init(&acc);
    gs_int_init(&qq);
    while (next_monomial(s, ia, cm, mono)) {
        gs_int_set_si(&acc, 0);
        if (a_term_at(s, ia, cm))
            gs_int_set(&acc, &a->coeffs[ia++]);
        n = pop_equal(s, cm, pi, pj);
        for (k = 0; k < n; k++)
            gs_int_submul(&acc, &s->q.coeffs[pi[k]], &b->coeffs[pj[k]]);
        if (gs_int_is_zero(&acc))
            continue;
        if (!quotient_monomial(s, mono)
            || gs_int_divexact(&qq, &acc, &b->coeffs[0]) != GS_OK) {
            rc = 0;
            break;
        }
        gs_int_swap(add_quotient_term(s, cm), &qq);
    }
    gs_int_clear(&acc);
    gs_int_clear(&qq);
    free(mono);
    return rc;
}

#if GS_HAVE_I128
static int all_small(const gs_poly *p)
{
    size_t i;
    for (i = 0; i < p->length; i++)
        if (!gs_int_is_small(&p->coeffs[i]))
            return 0;
    return 1;
}
#endif

static uint64_t *pack_all(const gs_ppack *pk, const gs_poly *p, size_t nw)
{
    size_t i, kw = (size_t)pk->nw;
    uint64_t *c = gs_malloc((p->length + 1) * kw * 8);
    for (i = 0; i < p->length; i++)
        gs_ppack_pack(pk, c + i * kw, p->exps + i * nw);
    return c;
}

/* Returns 0 when the degree bounds already rule the division out. */
static int state_init(divstate *s, const gs_poly *a, const gs_poly *b,
                      const gs_polyctx *ctx)
{
    unsigned *da = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *da);
    int ok;
    s->ctx = ctx;
    s->a = a;
    s->b = b;
    s->nw = (size_t)ctx->nwords;
    s->qmax = gs_malloc(4 * s->nw * 8);
    s->qmin = s->qmax + s->nw;
    s->lmb = s->qmin + s->nw;
    s->m = s->lmb + s->nw;
    memcpy(s->lmb, b->exps, s->nw * 8);
    gs_poly_degrees(da, a, ctx);
    ok = set_bounds(s, da);
    gs_ppack_init(&s->pk, da, ctx->nvars);   /* every key is <= deg a */
    s->kw = (size_t)s->pk.nw;
    s->ca = ok ? pack_all(&s->pk, a, s->nw) : NULL;
    s->cb = ok ? pack_all(&s->pk, b, s->nw) : NULL;
    s->keys_alloc = 16;
    s->cq = gs_malloc(s->keys_alloc * s->kw * 8);
    s->keys = gs_malloc(s->keys_alloc * s->kw * 8);
    gs_poly_init(&s->q);
    gs_pheap_init(&s->h, (int)s->kw, 16);
    s->h.keys = s->keys;
    free(da);
    return ok;
}

static void state_restart(divstate *s)
{
    gs_poly_zero(&s->q);
    s->h.n = 0;
}

static void state_clear(divstate *s)
{
    free(s->qmax);
    free(s->ca);
    free(s->cb);
    free(s->cq);
    free(s->keys);
    gs_ppack_clear(&s->pk);
    gs_poly_clear(&s->q);
    gs_pheap_clear(&s->h);
}

int gs_poly_divexact(gs_poly *q, const gs_poly *a, const gs_poly *b,
                     const gs_polyctx *ctx)
{
    divstate s;
    size_t *pi, *pj;
    int rc = -1;
    if (b->length == 0) {
        gs_poly_zero(q);
        return GS_EDIVZERO;
    }
    if (a->length == 0) {
        gs_poly_zero(q);
        return GS_OK;
    }
    pi = gs_malloc(2 * (b->length + 1) * sizeof *pi);
    pj = pi + b->length + 1;
    if (!state_init(&s, a, b, ctx)) {
        rc = 0;
    } else {
#if GS_HAVE_I128
        if (all_small(a) && all_small(b))
            rc = div_small(&s, pi, pj);
#endif
        if (rc < 0) {
            state_restart(&s);
            rc = div_big(&s, pi, pj);
        }
    }
    free(pi);
    if (rc == 1)
        gs_poly_swap(q, &s.q);
    else
        gs_poly_zero(q);
    state_clear(&s);
    return rc == 1 ? GS_OK : GS_EINEXACT;
}
