/* mgraph_terms.c - dominant terms of the graph of minors, best first.
 * See LICENSE.
 *
 * A term of one power s^p of a root is a path to the empty minor that
 * picks one term of each edge's entry, with s-degrees adding up to p.
 * best[v][d] is the largest |value| of any completion from node v with
 * s-degree d, computed children first (the max-product analogue of the
 * numeric pass).  With that exact bound, a best-first (A*) search over
 * partial paths ordered by |value so far| * best[v][rest] takes complete
 * paths in decreasing |value| (the idea of dominant-term generation by
 * shortest paths in a determinant decision diagram: Tan and Shi, IEEE
 * TCAD 23(4), 2004).  Paths of one monomial are merged; every path of a
 * monomial whose value per unit coefficient is u has |value| >= u, since
 * the entries' coefficients are integers, so the monomial's coefficient
 * is final once the search's next bound falls below u.
 */
#include "analysis/mgraph.h"
#include "base/mem.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define NONE SIZE_MAX

typedef struct state {
    size_t node, parent;        /* parent: the state this one extends */
    uint32_t edge, term;
    int rest;                   /* s-degree still to pick */
    long double so_far, key;
} state;

typedef struct search {
    state *st;
    size_t nst, ast;
    size_t *heap;               /* max-heap of state ids by key */
    size_t nheap, aheap;
} search;

static void push(search *q, const state *s)
{
    size_t i;
    if (q->nst == q->ast) {
        q->ast = q->ast ? 2 * q->ast : 256;
        q->st = gs_reallocarray(q->st, q->ast, sizeof *q->st);
    }
    q->st[q->nst] = *s;
    if (q->nheap == q->aheap) {
        q->aheap = q->aheap ? 2 * q->aheap : 256;
        q->heap = gs_reallocarray(q->heap, q->aheap, sizeof *q->heap);
    }
    i = q->nheap++;
    /* ties keep the earlier state on top: a deterministic order */
    while (i > 0) {
        size_t up = (i - 1) / 2;
        const state *a = &q->st[q->heap[up]];
        if (a->key > s->key || (a->key == s->key && q->heap[up] < q->nst))
            break;
        q->heap[i] = q->heap[up];
        i = up;
    }
    q->heap[i] = q->nst++;
}

static int above(const search *q, size_t a, size_t b)
{
    const state *x = &q->st[a], *y = &q->st[b];
    return x->key > y->key || (x->key == y->key && a < b);
}

static size_t pop(search *q)
{
    size_t top = q->heap[0], last = q->heap[--q->nheap], i = 0;
    for (;;) {
        size_t l = 2 * i + 1, r = l + 1, m = i;
        size_t mv = last;
        if (l < q->nheap && above(q, q->heap[l], mv))
            m = l, mv = q->heap[l];
        if (r < q->nheap && above(q, q->heap[r], mv))
            m = r;
        if (m == i)
            break;
        q->heap[i] = q->heap[m];
        i = m;
    }
    if (q->nheap)
        q->heap[i] = last;
    return top;
}

typedef struct kept {
    unsigned *exps;             /* nvars each */
    gs_int coef;
    long double unit;           /* value per unit coefficient */
    size_t found;               /* order of discovery */
} kept;

static long double monomial_value(const unsigned *ex, const long double *vals,
                                  int nvars, int s_var)
{
    long double v = 1;
    int i;
    unsigned k;
    for (i = 0; i < nvars; i++)
        if (i != s_var)
            for (k = 0; k < ex[i]; k++)
                v *= vals[i];
    return v;
}

static int by_value(const void *pa, const void *pb)
{
    const kept *a = pa, *b = pb;
    long double va = fabsl(a->unit * gs_int_get_ld(&a->coef));
    long double vb = fabsl(b->unit * gs_int_get_ld(&b->coef));
    if (va != vb)
        return va > vb ? -1 : 1;
    return a->found < b->found ? -1 : a->found > b->found;
}

void gs_mgraph_dominant(gs_mgraph_terms *t, const gs_mgraph *g, size_t root,
                        int s_var, int power, const long double *vals,
                        long double tol, size_t max_terms)
{
    const gs_polyctx *ctx = g->ctx;
    int nv = ctx->nvars;
    size_t *toff, *eoff = gs_malloc((g->nentries + 1) * sizeof *eoff);
    size_t *off, v, e, i, nk = 0, ak = 0;
    long double *tv, *best, *coef = gs_mgraph_node_coeffs(&off, g, s_var,
                                                          vals);
    int *tdeg;
    unsigned *ex = gs_malloc(((size_t)nv + 1) * sizeof *ex);
    unsigned *acc = gs_malloc(((size_t)nv + 1) * sizeof *acc);
    kept *k = NULL;
    search q;
    gs_int c;
    long double sum = 0, min_unit = INFINITY;
    int finishing = 0;

    memset(t, 0, sizeof *t);
    memset(&q, 0, sizeof q);
    t->power = power;
    t->total = power >= 0 && off[root] + (size_t)power < off[root + 1]
                   ? coef[off[root] + (size_t)power] : 0;
    /* every term of every entry: |value| without s, s-degree */
    eoff[0] = 0;
    for (i = 0; i < g->nentries; i++)
        eoff[i + 1] = eoff[i] + g->entries[i].length;
    tv = gs_malloc((eoff[g->nentries] + 1) * sizeof *tv);
    tdeg = gs_malloc((eoff[g->nentries] + 1) * sizeof *tdeg);
    for (i = 0; i < g->nentries; i++) {
        size_t j;
        for (j = 0; j < g->entries[i].length; j++) {
            gs_poly_get_term_exps(ex, &g->entries[i], j, ctx);
            tv[eoff[i] + j] = fabsl(gs_int_get_ld(&g->entries[i].coeffs[j])
                                    * monomial_value(ex, vals, nv, s_var));
            tdeg[eoff[i] + j] = s_var >= 0 ? (int)ex[s_var] : 0;
        }
    }
    /* best completions per node and s-degree, on the same layout */
    best = gs_calloc(off[g->nnodes] ? off[g->nnodes] : 1, sizeof *best);
    toff = off;
    best[0] = 1;
    for (v = 1; v < g->nnodes; v++)
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            size_t en = g->entry[e], ch = g->child[e], j;
            for (j = eoff[en]; j < eoff[en + 1]; j++) {
                size_t d;
                for (d = 0; d < toff[ch + 1] - toff[ch]; d++) {
                    size_t at = (size_t)tdeg[j] + d;
                    long double x = tv[j] * best[toff[ch] + d];
                    if (at < toff[v + 1] - toff[v]
                        && x > best[toff[v] + at])
                        best[toff[v] + at] = x;
                }
            }
        }
    gs_int_init(&c);
    if (power >= 0 && off[root] + (size_t)power < off[root + 1]
        && best[off[root] + (size_t)power] > 0) {
        state s0;
        s0.node = root;
        s0.parent = NONE;
        s0.edge = s0.term = 0;
        s0.rest = power;
        s0.so_far = 1;
        s0.key = best[off[root] + (size_t)power];
        push(&q, &s0);
    }
    while (q.nheap) {
        size_t id;
        state s;
        if (finishing && q.st[q.heap[0]].key < min_unit * (1 - 1e-12L)) {
            /* the kept coefficients are final; stop if they still meet
               the tolerance (later paths can move the sum back) */
            if (fabsl(t->total - sum) <= tol * fabsl(t->total)
                || (max_terms && nk >= max_terms))
                break;
            finishing = 0;
        }
        id = pop(&q);
        s = q.st[id];
        if (s.node == 0) {
            /* a complete path: its monomial and coefficient */
            size_t p = id, m;
            int neg = 0;
            memset(acc, 0, (size_t)nv * sizeof *acc);
            gs_int_set_si(&c, 1);
            for (; q.st[p].parent != NONE; p = q.st[p].parent) {
                const state *x = &q.st[q.st[p].parent];
                uint32_t ed = q.st[p].edge, tm = q.st[p].term;
                const gs_poly *en = &g->entries[g->entry[ed]];
                int w;
                (void)x;
                gs_poly_get_term_exps(ex, en, tm, ctx);
                for (w = 0; w < nv; w++)
                    acc[w] += ex[w];
                gs_int_mul(&c, &c, &en->coeffs[tm]);
                neg ^= g->neg[ed];
            }
            if (neg)
                gs_int_neg(&c, &c);
            for (m = 0; m < nk; m++)
                if (memcmp(k[m].exps, acc, (size_t)nv * sizeof *acc) == 0)
                    break;
            if (m == nk) {
                if (nk == ak) {
                    ak = ak ? 2 * ak : 16;
                    k = gs_reallocarray(k, ak, sizeof *k);
                }
                k[m].exps = gs_malloc(((size_t)nv + 1) * sizeof *acc);
                memcpy(k[m].exps, acc, (size_t)nv * sizeof *acc);
                gs_int_init(&k[m].coef);
                k[m].unit = monomial_value(acc, vals, nv, s_var);
                k[m].found = m;
                if (fabsl(k[m].unit) < min_unit)
                    min_unit = fabsl(k[m].unit);
                nk++;
            }
            gs_int_add(&k[m].coef, &k[m].coef, &c);
            sum += gs_int_get_ld(&c) * k[m].unit;
            if (!finishing
                && (fabsl(t->total - sum) <= tol * fabsl(t->total)
                    || (max_terms && nk >= max_terms)))
                finishing = 1;
            continue;
        }
        for (e = g->first[s.node]; e < g->first[s.node + 1]; e++) {
            size_t en = g->entry[e], ch = g->child[e], j;
            for (j = eoff[en]; j < eoff[en + 1]; j++) {
                state n2;
                int r = s.rest - tdeg[j];
                if (r < 0 || (size_t)r >= toff[ch + 1] - toff[ch]
                    || best[toff[ch] + (size_t)r] <= 0 || tv[j] <= 0)
                    continue;
                n2.node = ch;
                n2.parent = id;
                n2.edge = (uint32_t)e;
                n2.term = (uint32_t)(j - eoff[en]);
                n2.rest = r;
                n2.so_far = s.so_far * tv[j];
                n2.key = n2.so_far * best[toff[ch] + (size_t)r];
                push(&q, &n2);
            }
        }
    }
    t->complete = q.nheap == 0;
    /* zero sums dropped, the rest in decreasing |value| */
    for (i = 0, v = 0; i < nk; i++) {
        if (gs_int_is_zero(&k[i].coef)) {
            gs_int_clear(&k[i].coef);
            free(k[i].exps);
            continue;
        }
        k[v++] = k[i];
    }
    nk = v;
    if (nk)
        qsort(k, nk, sizeof *k, by_value);
    t->count = nk;
    t->term = gs_malloc((nk ? nk : 1) * sizeof *t->term);
    t->value = gs_malloc((nk ? nk : 1) * sizeof *t->value);
    sum = 0;
    for (i = 0; i < nk; i++) {
        gs_poly_init(&t->term[i]);
        gs_poly_set_term(&t->term[i], &k[i].coef, k[i].exps, ctx);
        t->value[i] = gs_int_get_ld(&k[i].coef) * k[i].unit;
        sum += t->value[i];
        gs_int_clear(&k[i].coef);
        free(k[i].exps);
    }
    t->rest = t->total - sum;
    free(k);
    gs_int_clear(&c);
    free(q.st);
    free(q.heap);
    free(best);
    free(coef);
    free(off);
    free(tv);
    free(tdeg);
    free(eoff);
    free(ex);
    free(acc);
}

void gs_mgraph_terms_clear(gs_mgraph_terms *t)
{
    size_t i;
    for (i = 0; t->term && i < t->count; i++)
        gs_poly_clear(&t->term[i]);
    free(t->term);
    free(t->value);
    memset(t, 0, sizeof *t);
}
