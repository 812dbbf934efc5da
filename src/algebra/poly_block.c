/* poly_block.c - polynomials cut into blocks of a common prefix, for the
 * products and quotients of poly_mul.c and poly_div.c.  See LICENSE.
 */
#include "algebra/poly_impl.h"
#include "base/mem.h"

#include <assert.h>
#include <string.h>

void gs_playout_init(gs_playout *lay, const gs_polyctx *ctx, int m,
                     const unsigned *radix)
{
    int v, n = ctx->nvars;
    size_t d = 1;
    unsigned *maxv = gs_malloc(((size_t)n + 1) * sizeof *maxv);
    lay->ctx = ctx;
    lay->nw = ctx->nwords;
    lay->m = m;
    lay->radix = gs_malloc(((size_t)n + 1) * sizeof *lay->radix);
    lay->stride = gs_malloc(((size_t)n + 1) * sizeof *lay->stride);
    lay->premask = gs_calloc((size_t)lay->nw, 8);
    for (v = n - 1; v >= 0; v--) {
        lay->radix[v] = radix[v];
        lay->stride[v] = v >= m ? d : 0;
        maxv[v] = v < m ? radix[v] - 1 : 0;
        if (v >= m)
            d *= radix[v];
        else
            lay->premask[v / GS_POLY_VARS_PER_WORD] |=
                (uint64_t)GS_POLY_FIELD_MASK << gs_poly_field_shift(v);
    }
    lay->dsize = d;
    assert(d <= ((size_t)1 << 16));     /* for gs_playout_digit */
    lay->inv = gs_malloc(2 * ((size_t)n + 1) * sizeof *lay->inv);
    for (v = 0; v < n; v++) {
        size_t st = lay->stride[v] ? lay->stride[v] : 1;
        lay->inv[2 * v] = (((uint64_t)1 << 32) + st - 1) / st;
        lay->inv[2 * v + 1] = (((uint64_t)1 << 32) + radix[v] - 1) / radix[v];
    }
    gs_ppack_init(&lay->pk, maxv, n);
    lay->kw = lay->pk.nw;
    gs_free(maxv);
}

void gs_playout_clear(gs_playout *lay)
{
    gs_free(lay->radix);
    gs_free(lay->stride);
    gs_free(lay->premask);
    gs_free(lay->inv);
    gs_ppack_clear(&lay->pk);
}

void gs_playout_decode(const gs_playout *lay, uint64_t *e, size_t k)
{
    int v;
    if (lay->dsize == 1)
        return;
    for (v = lay->m; v < lay->ctx->nvars; v++)
        e[v / GS_POLY_VARS_PER_WORD] |=
            (uint64_t)gs_playout_digit(lay, k, v) << gs_poly_field_shift(v);
}

void gs_pside_build(gs_pside *s, const gs_poly *p, const gs_playout *lay,
                    int small)
{
    size_t i, n = p->length, nw = (size_t)lay->nw, w, nb = 0;
    int v, nvars = lay->ctx->nvars;
    s->nterms = n;
    s->start = gs_malloc((n + 1) * sizeof *s->start);
    s->skey = gs_malloc((n + 1) * nw * 8);
    s->key = gs_malloc((n + 1) * (size_t)lay->kw * 8);
    s->idx = gs_malloc((n + 1) * sizeof *s->idx);
    s->small = small ? gs_malloc((n + 1) * sizeof *s->small) : NULL;
    s->coeffs = p->coeffs;
    for (i = 0; i < n; i++) {
        const uint64_t *e = p->exps + i * nw;
        uint64_t *k = s->skey + nb * nw;
        size_t x = 0;
        int same = nb > 0;
        for (w = 0; w < nw; w++) {
            k[w] = e[w] & lay->premask[w];
            same = same && k[w] == (k - nw)[w];
        }
        if (!same) {
            gs_ppack_pack(&lay->pk, s->key + nb * (size_t)lay->kw, k);
            s->start[nb++] = i;
        }
        for (v = lay->m; v < nvars; v++)
            x += gs_poly_exp_get(e, v) * lay->stride[v];
        s->idx[i] = (uint32_t)x;
        if (small)
            s->small[i] = gs_int_get_si(&p->coeffs[i]);
    }
    s->start[nb] = n;
    s->nblocks = nb;
    assert(nb < ((size_t)1 << 31));
}

void gs_pside_clear(gs_pside *s)
{
    gs_free(s->start);
    gs_free(s->skey);
    gs_free(s->key);
    gs_free(s->idx);
    gs_free(s->small);
}

/* Consecutive terms start a new block of prefix length m exactly when
   their first differing variable is below m. */
void gs_poly_block_counts(size_t *blocks, const gs_poly *a,
                          const gs_polyctx *ctx)
{
    size_t i, nw = (size_t)ctx->nwords, w;
    int n = ctx->nvars, m;
    size_t *hist = gs_calloc(nw * GS_POLY_VARS_PER_WORD + 1, sizeof *hist);
    for (i = 1; i < a->length; i++) {
        const uint64_t *x = a->exps + (i - 1) * nw, *y = x + nw;
        uint64_t d;
        int f = 0;
        for (w = 0; w < nw && x[w] == y[w]; w++)
            ;
        assert(w < nw);     /* canonical: no repeated monomials */
        d = x[w] ^ y[w];
        while (((d >> gs_poly_field_shift(f)) & GS_POLY_FIELD_MASK) == 0)
            f++;
        hist[w * GS_POLY_VARS_PER_WORD + (size_t)f]++;
    }
    blocks[0] = a->length > 0;
    for (m = 0; m < n; m++)
        blocks[m + 1] = blocks[m] + hist[m];
    gs_free(hist);
}
