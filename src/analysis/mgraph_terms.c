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
 *
 * Paths that cancel are pruned before they are taken.  In nodal analysis
 * a diagonal entry is a sum of conductances, so many paths pick one
 * conductance twice (G1 from two diagonal entries) and cancel against
 * the off-diagonal products; a search that takes them finds nothing for
 * a long time.  The argument that removes them: every element's stamp is
 * of rank one (an admittance y between nodes a, b adds y (e_a - e_b)
 * (e_a - e_b)^T, a transconductance gm (e_a - e_b)(e_c - e_d)^T), and by
 * the matrix determinant lemma det(B + x u v^T) = det B + x v^T adj(B) u
 * the determinant is then of degree at most 1 in x.  In general: write
 * the matrix as B + x X with B and X free of x (every entry of degree at
 * most 1 in x); if X has rank one (all its 2x2 minors vanish, tested
 * exactly) the determinant, and every minor of it, has degree <= 1 in x.
 * So every monomial with x^2 has the exact coefficient 0: its paths sum
 * to zero among themselves, and dropping all of them changes no other
 * monomial's coefficient.  Exponents only grow along a path, so a
 * partial path that has used such an x twice is dropped with all its
 * completions.  The bound best[] ignores the rule and so stays an upper
 * bound: complete paths still come out in decreasing |value|.
 *
 * The second rule removes the cancelling cycles.  With the degree-one
 * variables x_i of rank-one matrices u_i v_i^T and A0 the matrix with
 * all of them set to 0, the coefficient of the product of a set S of
 * them is, by the Cauchy-Binet formula, a sum of products
 * det(U_S[R, :]) det(V_S[C, :]) det(A0[not R, not C]) over row and
 * column sets R, C of size |S|.  If the u_i of S are linearly dependent,
 * every such minor of U_S vanishes, and the coefficient with it.  When u
 * is c (e_a - e_b) or c e_a (an element between nodes a and b, or from a
 * to ground), dependence is a cycle among the edges (a, b) in the graph
 * of the rows with a virtual ground; the same holds for v over the
 * columns.  So a partial path whose degree-one variables close a cycle in
 * either graph (union-find over the path's edges) is dropped with its
 * completions: for a network of admittances the terms left are exactly
 * the spanning trees (Kirchhoff's matrix-tree theorem), with
 * transconductances the common trees of the two graphs (the two-graph
 * method of Mayeda; Chen, "Applied Graph Theory", from memory).  For N =
 * c0 D - M the paths through c0 use the rows and columns of A, the others
 * those of the bordered matrix.
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
    size_t tj;                  /* the term's index over all entries */
    int rest;                   /* s-degree still to pick */
    int full;                   /* 1: in det M (the bordered matrix), 0:
                                   in det A (D, or N's c0 D) */
    long double so_far, key;
} state;

typedef struct search {
    state *st;
    size_t nst, ast;
    size_t *heap;               /* max-heap of state ids by key */
    size_t nheap, aheap;
    uint64_t *used;             /* w words a state: the degree-one
                                   variables its partial path holds */
    size_t w;
} search;

static void push(search *q, const state *s, const uint64_t *used)
{
    size_t i;
    if (q->nst == q->ast) {
        q->ast = q->ast ? 2 * q->ast : 256;
        q->st = gs_reallocarray(q->st, q->ast, sizeof *q->st);
        if (q->w)
            q->used = gs_reallocarray(q->used, q->ast * q->w,
                                      sizeof *q->used);
    }
    q->st[q->nst] = *s;
    if (q->w)
        memcpy(q->used + q->nst * q->w, used, q->w * sizeof *used);
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

/* Cells of the root's matrix: the n x n of A for D, else the bordered
   (n + 1) x (n + 1) (entries are numbered r * (n + 1) + j, the border
   row r = n). */
static int root_dim(const gs_mgraph *g, size_t root)
{
    return root == g->root_d ? g->n : g->n + 1;
}

/* X_ij, the coefficient of x^1 in cell (i, j), from the cells that hold
   x (cell[k], coefficient x1[k]); NULL for zero. */
static const gs_poly *coef_at(const size_t *cell, const gs_poly *x1,
                              size_t m, size_t at)
{
    size_t k;
    for (k = 0; k < m; k++)
        if (cell[k] == at)
            return &x1[k];
    return NULL;
}

/* 1 when the matrix X of x's coefficients (cells cell[0 .. m-1]) has rank
   at most one: with the pivot X_pq = x1[0], every X_ij X_pq = X_iq X_pj
   over the rows and columns that hold x (exact products). */
static int rank_one(const size_t *cell, const gs_poly *x1, size_t m,
                    int n, const gs_polyctx *ctx)
{
    size_t w = (size_t)n + 1, p = cell[0] / w, q = cell[0] % w, a, b;
    int ok = 1;
    gs_poly l, r;
    gs_poly_init(&l);
    gs_poly_init(&r);
    for (a = 0; a < m && ok; a++)
        for (b = 0; b < m && ok; b++) {
            size_t i = cell[a] / w, j = cell[b] % w;
            const gs_poly *xij = coef_at(cell, x1, m, i * w + j);
            const gs_poly *xiq = coef_at(cell, x1, m, i * w + q);
            const gs_poly *xpj = coef_at(cell, x1, m, p * w + j);
            if (xij)
                gs_poly_mul(&l, xij, &x1[0], ctx);
            else
                gs_poly_zero(&l);
            if (xiq && xpj)
                gs_poly_mul(&r, xiq, xpj, ctx);
            else
                gs_poly_zero(&r);
            ok = gs_poly_equal(&l, &r, ctx);
        }
    gs_poly_clear(&l);
    gs_poly_clear(&r);
    return ok;
}

void gs_mgraph_linear_vars(unsigned char *lin, const gs_mgraph *g,
                           size_t root)
{
    const gs_polyctx *ctx = g->ctx;
    int nv = ctx->nvars, dim = root_dim(g, root), v, i, j;
    size_t w = (size_t)g->n + 1, *cell, m;
    unsigned *deg = gs_malloc(((size_t)nv + 1) * sizeof *deg);
    gs_poly *x1 = gs_malloc((w * w + 1) * sizeof *x1);
    cell = gs_malloc((w * w + 1) * sizeof *cell);
    for (v = 0; v < nv; v++)
        lin[v] = 1;
    for (i = 0; i < dim; i++)
        for (j = 0; j < dim; j++) {
            gs_poly_degrees(deg, &g->entries[(size_t)i * w + (size_t)j],
                            ctx);
            for (v = 0; v < nv; v++)
                if (deg[v] > 1)
                    lin[v] = 0;
        }
    /* N = c0 D - M: c0 must be free of x */
    if (root == g->root_n) {
        gs_poly_degrees(deg, &g->entries[g->nentries - 1], ctx);
        for (v = 0; v < nv; v++)
            if (deg[v] > 0)
                lin[v] = 0;
    }
    for (v = 0; v < nv; v++) {
        if (!lin[v])
            continue;
        m = 0;
        for (i = 0; i < dim; i++)
            for (j = 0; j < dim; j++) {
                size_t at = (size_t)i * w + (size_t)j;
                if (gs_poly_degree(&g->entries[at], v, ctx) != 1)
                    continue;
                gs_poly_init(&x1[m]);
                gs_poly_coeff_var(&x1[m], &g->entries[at], v, 1, ctx);
                cell[m++] = at;
            }
        if (m > 1)
            lin[v] = (unsigned char)rank_one(cell, x1, m, g->n, ctx);
        while (m)
            gs_poly_clear(&x1[--m]);
    }
    gs_free(deg);
    gs_free(x1);
    gs_free(cell);
}

/* The incidence edges of the degree-one variables in the cells of a
   dim x dim region (the n x n of A, or the bordered n + 1): when x's
   coefficient matrix X = u v^T has u = c (e_a - e_b) or c e_a (rows a, b;
   b = the virtual ground dim + 1 for e_a alone), re[2x], re[2x+1] = a, b,
   else -1; ce the same for v over the columns.  A two-terminal element
   and a transconductance give both. */
static void incidence(int *re, int *ce, const gs_mgraph *g, int dim,
                      const unsigned char *lin)
{
    const gs_polyctx *ctx = g->ctx;
    int nv = ctx->nvars, v, i, j, side;
    size_t w = (size_t)g->n + 1;
    gs_poly x1, x2, sum;
    gs_poly_init(&x1);
    gs_poly_init(&x2);
    gs_poly_init(&sum);
    for (v = 0; v < nv; v++) {
        re[2 * v] = re[2 * v + 1] = ce[2 * v] = ce[2 * v + 1] = -1;
        if (!lin[v])
            continue;
        for (side = 0; side < 2; side++) {
            /* side 0: the rows (u), over a pivot column; 1: the columns */
            int at[3], m = 0, piv = -1, k, ok;
            for (i = 0; i < dim && piv < 0; i++)
                for (j = 0; j < dim && piv < 0; j++)
                    if (gs_poly_degree(&g->entries[(size_t)i * w
                                                   + (size_t)j], v, ctx) == 1)
                        piv = side ? i : j;
            if (piv < 0)
                break;
            for (k = 0; k < dim && m < 3; k++) {
                size_t cell = side ? (size_t)piv * w + (size_t)k
                                   : (size_t)k * w + (size_t)piv;
                if (gs_poly_degree(&g->entries[cell], v, ctx) == 1)
                    at[m++] = k;
            }
            ok = m == 1;
            if (m == 2) {
                size_t c0 = side ? (size_t)piv * w + (size_t)at[0]
                                 : (size_t)at[0] * w + (size_t)piv;
                size_t c1 = side ? (size_t)piv * w + (size_t)at[1]
                                 : (size_t)at[1] * w + (size_t)piv;
                gs_poly_coeff_var(&x1, &g->entries[c0], v, 1, ctx);
                gs_poly_coeff_var(&x2, &g->entries[c1], v, 1, ctx);
                gs_poly_add(&sum, &x1, &x2, ctx);
                ok = gs_poly_is_zero(&sum);
            }
            if (!ok)
                continue;
            (side ? ce : re)[2 * v] = at[0];
            (side ? ce : re)[2 * v + 1] = m == 2 ? at[1] : dim + 1;
        }
    }
    gs_poly_clear(&x1);
    gs_poly_clear(&x2);
    gs_poly_clear(&sum);
}

static int uf_find(int *par, int a)
{
    while (par[a] != a)
        a = par[a] = par[par[a]];
    return a;
}

/* Join a and b; 0 when they were joined already (a cycle). */
static int uf_join(int *par, int a, int b)
{
    a = uf_find(par, a);
    b = uf_find(par, b);
    if (a == b)
        return 0;
    par[a] = b;
    return 1;
}

typedef struct kept {
    unsigned *exps;             /* nvars each */
    gs_int coef;
    long double unit;           /* value per unit coefficient */
    int nv;                     /* exps' length, for the sort */
} kept;

/* The order of kept terms: decreasing |value| at vals, ties by the
   exponent vectors compared variable by variable in the context's order,
   the larger exponent first (documented in mgraph.h). */

static int exps_cmp(const unsigned *a, const unsigned *b, int nv)
{
    int i;
    for (i = 0; i < nv; i++)
        if (a[i] != b[i])
            return a[i] > b[i] ? -1 : 1;
    return 0;
}

/* Monomials met so far, by hash of the exponents (open addressing). */
typedef struct index {
    size_t *slot, cap;
} index;

static size_t exps_hash(const unsigned *e, int nv)
{
    uint64_t h = 0xcbf29ce484222325ull;
    int i;
    for (i = 0; i < nv; i++)
        h = (h ^ e[i]) * 0x100000001b3ull;
    return (size_t)(h ^ (h >> 29));
}

/* The kept term with exponents e, or nk (not there yet: the slot for it
   is *at). */
static size_t index_find(size_t *at, const index *x, const kept *k,
                         size_t nk, const unsigned *e, int nv)
{
    size_t h = exps_hash(e, nv) & (x->cap - 1);
    for (; x->slot[h] != NONE; h = (h + 1) & (x->cap - 1))
        if (memcmp(k[x->slot[h]].exps, e, (size_t)nv * sizeof *e) == 0)
            return x->slot[h];
    *at = h;
    return nk;
}

static void index_grow(index *x, const kept *k, size_t nk, int nv)
{
    size_t i, h;
    gs_free(x->slot);
    x->cap = x->cap ? 2 * x->cap : 64;
    x->slot = gs_malloc(x->cap * sizeof *x->slot);
    for (i = 0; i < x->cap; i++)
        x->slot[i] = NONE;
    for (i = 0; i < nk; i++) {
        h = exps_hash(k[i].exps, nv) & (x->cap - 1);
        while (x->slot[h] != NONE)
            h = (h + 1) & (x->cap - 1);
        x->slot[h] = i;
    }
}

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
    return exps_cmp(a->exps, b->exps, a->nv);
}

void gs_mgraph_dominant(gs_mgraph_terms *t, const gs_mgraph *g, size_t root,
                        int s_var, int power, const long double *vals,
                        long double tol, size_t max_terms)
{
    gs_mgraph_dominant_within(t, g, root, s_var, power, vals, tol, max_terms,
                              GS_MGRAPH_SEARCH_BYTES);
}

void gs_mgraph_dominant_within(gs_mgraph_terms *t, const gs_mgraph *g,
                               size_t root, int s_var, int power,
                               const long double *vals, long double tol,
                               size_t max_terms, size_t max_bytes)
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
    int finishing = 0, *bit = gs_malloc(((size_t)nv + 1) * sizeof *bit);
    unsigned char *lin = gs_malloc((size_t)nv + 1);
    uint64_t *tmask, *nu;
    int *inc[4], *uf, *uf2, *tl;
    size_t nlin = 0, wd, slot = 0, *tloff, c0cell = g->nentries - 1;
    size_t max_states, *foff;
    int *fv;
    unsigned *fe;
    index ix = {NULL, 0};

    memset(t, 0, sizeof *t);
    memset(&q, 0, sizeof q);
    /* the variables of degree <= 1 in the root, one bit each */
    gs_mgraph_linear_vars(lin, g, root);
    for (i = 0; i < (size_t)nv; i++)
        bit[i] = lin[i] ? (int)nlin++ : -1;
    /* their incidence edges in A and in the bordered matrix */
    {
        int *ed = gs_malloc(8 * ((size_t)nv + 1) * sizeof *ed);
        size_t nn = (size_t)g->n + 3;
        inc[0] = ed;
        inc[1] = ed + 2 * ((size_t)nv + 1);
        inc[2] = ed + 4 * ((size_t)nv + 1);
        inc[3] = ed + 6 * ((size_t)nv + 1);
        incidence(inc[0], inc[1], g, g->n, lin);
        if (root != g->root_d)
            incidence(inc[2], inc[3], g, g->n + 1, lin);
        else
            memcpy(inc[2], inc[0], 4 * ((size_t)nv + 1) * sizeof *ed);
        uf = gs_malloc(4 * nn * sizeof *uf);
        uf2 = gs_malloc(2 * nn * sizeof *uf2);
    }
    wd = (nlin + 63) / 64;
    q.w = wd;
    nu = gs_calloc(wd + 1, sizeof *nu);
    t->power = power;
    t->total = power >= 0 && off[root] + (size_t)power < off[root + 1]
                   ? coef[off[root] + (size_t)power] : 0;
    /* every term of every entry: |value| without s, s-degree */
    eoff[0] = 0;
    for (i = 0; i < g->nentries; i++)
        eoff[i + 1] = eoff[i] + g->entries[i].length;
    tv = gs_malloc((eoff[g->nentries] + 1) * sizeof *tv);
    tdeg = gs_malloc((eoff[g->nentries] + 1) * sizeof *tdeg);
    tmask = gs_calloc((eoff[g->nentries] + 1) * wd + 1, sizeof *tmask);
    tloff = gs_calloc(eoff[g->nentries] + 2, sizeof *tloff);
    tl = gs_malloc(((size_t)nv + 1) * (eoff[g->nentries] + 1) * sizeof *tl);
    /* every term's factors, (variable, exponent) pairs from foff[j] on:
       a complete path's monomial is then the sum of a few lists instead
       of one unpacking over every variable for each of its edges */
    foff = gs_calloc(eoff[g->nentries] + 2, sizeof *foff);
    fv = gs_malloc(((size_t)nv + 1) * (eoff[g->nentries] + 1) * sizeof *fv);
    fe = gs_malloc(((size_t)nv + 1) * (eoff[g->nentries] + 1) * sizeof *fe);
    for (i = 0; i < g->nentries; i++) {
        size_t j;
        for (j = 0; j < g->entries[i].length; j++) {
            int w2, bad = 0;
            gs_poly_get_term_exps(ex, &g->entries[i], j, ctx);
            tv[eoff[i] + j] = fabsl(gs_int_get_ld(&g->entries[i].coeffs[j])
                                    * monomial_value(ex, vals, nv, s_var));
            tdeg[eoff[i] + j] = s_var >= 0 ? (int)ex[s_var] : 0;
            tloff[eoff[i] + j + 1] = tloff[eoff[i] + j];
            foff[eoff[i] + j + 1] = foff[eoff[i] + j];
            for (w2 = 0; w2 < nv; w2++)
                if (ex[w2]) {
                    size_t f = foff[eoff[i] + j + 1]++;
                    fv[f] = w2;
                    fe[f] = ex[w2];
                }
            for (w2 = 0; w2 < nv; w2++)
                if (bit[w2] >= 0 && ex[w2]) {
                    tmask[(eoff[i] + j) * wd + (size_t)bit[w2] / 64] |=
                        1ull << (bit[w2] % 64);
                    bad |= ex[w2] > 1;
                    tl[tloff[eoff[i] + j + 1]++] = w2;
                }
            /* a term that alone holds x^2 can be on no surviving path */
            if (bad)
                tv[eoff[i] + j] = 0;
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
        s0.tj = 0;
        s0.full = root != g->root_d;
        s0.rest = power;
        s0.so_far = 1;
        s0.key = best[off[root] + (size_t)power];
        push(&q, &s0, nu);
    }
    max_states = max_bytes
                 / (sizeof *q.st + sizeof *q.heap + wd * sizeof *q.used);
    while (q.nheap) {
        size_t id;
        state s;
        if (q.nst > max_states) {
            /* Past the search's budget: keep the monomials no path still
               in the heap can reach (a path's bound is at least its
               value, and its value at least its monomial's unit), whose
               coefficients are final; the others may be partial. */
            long double top = q.st[q.heap[0]].key;
            for (i = 0; i < nk; i++)
                if (fabsl(k[i].unit) * (1 - 1e-12L) <= top)
                    gs_int_set_si(&k[i].coef, 0);
            t->budget = 1;
            break;
        }
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
            int neg = 0, w;
            memset(acc, 0, (size_t)nv * sizeof *acc);
            gs_int_set_si(&c, 1);
            for (; q.st[p].parent != NONE; p = q.st[p].parent) {
                uint32_t ed = q.st[p].edge, tm = q.st[p].term;
                const gs_poly *en = &g->entries[g->entry[ed]];
                size_t tj = q.st[p].tj, f;
                for (f = foff[tj]; f < foff[tj + 1]; f++)
                    acc[fv[f]] += fe[f];
                gs_int_mul(&c, &c, &en->coeffs[tm]);
                neg ^= g->neg[ed];
            }
            if (neg)
                gs_int_neg(&c, &c);
            for (w = 0; w < nv && !t->overflow; w++)
                if (acc[w] > GS_POLY_MAX_EXP)
                    t->overflow = w + 1;
            if (t->overflow)
                break;      /* a term no polynomial can hold */
            if (2 * (nk + 1) > ix.cap)
                index_grow(&ix, k, nk, nv);
            m = index_find(&slot, &ix, k, nk, acc, nv);
            if (m == nk) {
                ix.slot[slot] = nk;
                if (nk == ak) {
                    ak = ak ? 2 * ak : 16;
                    k = gs_reallocarray(k, ak, sizeof *k);
                }
                k[m].exps = gs_malloc(((size_t)nv + 1) * sizeof *acc);
                memcpy(k[m].exps, acc, (size_t)nv * sizeof *acc);
                gs_int_init(&k[m].coef);
                k[m].nv = nv;
                k[m].unit = monomial_value(acc, vals, nv, s_var);
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
        /* the forests of the prefix's incidence edges, rows and columns,
           in A (uf[0], uf[1]) and in the bordered matrix (uf[2], uf[3]) */
        {
            size_t nn = (size_t)g->n + 3, p2, z;
            for (z = 0; z < 4 * nn; z++)
                uf[z] = (int)(z % nn);
            for (p2 = id; q.st[p2].parent != NONE; p2 = q.st[p2].parent) {
                size_t tj = q.st[p2].tj, a;
                int reg = 2 * q.st[p2].full;
                for (a = tloff[tj]; a < tloff[tj + 1]; a++) {
                    int v2 = tl[a], sd;
                    for (sd = 0; sd < 2; sd++)
                        if (inc[reg + sd][2 * v2] >= 0)
                            uf_join(uf + (size_t)(reg + sd) * nn,
                                    inc[reg + sd][2 * v2],
                                    inc[reg + sd][2 * v2 + 1]);
                }
            }
        }
        for (e = g->first[s.node]; e < g->first[s.node + 1]; e++) {
            size_t en = g->entry[e], ch = g->child[e], j;
            int full = s.full && en != c0cell;
            for (j = eoff[en]; j < eoff[en + 1]; j++) {
                state n2;
                int r = s.rest - tdeg[j], twice = 0;
                size_t b;
                if (r < 0 || (size_t)r >= toff[ch + 1] - toff[ch]
                    || best[toff[ch] + (size_t)r] <= 0 || tv[j] <= 0)
                    continue;
                /* a degree-one variable taken twice: the path cancels */
                for (b = 0; b < wd; b++) {
                    uint64_t have = q.used[id * wd + b];
                    twice |= (have & tmask[j * wd + b]) != 0;
                    nu[b] = have | tmask[j * wd + b];
                }
                if (twice)
                    continue;
                /* a cycle among the incidence edges: the monomial's
                   vectors u (or v) are dependent, its coefficient 0 */
                if (tloff[j + 1] > tloff[j]) {
                    size_t nn = (size_t)g->n + 3, a;
                    int reg = 2 * full, sd, cyc = 0;
                    memcpy(uf2, uf + (size_t)reg * nn, 2 * nn * sizeof *uf2);
                    for (a = tloff[j]; a < tloff[j + 1] && !cyc; a++)
                        for (sd = 0; sd < 2 && !cyc; sd++) {
                            const int *ie = inc[reg + sd] + 2 * tl[a];
                            if (ie[0] >= 0
                                && !uf_join(uf2 + (size_t)sd * nn, ie[0],
                                            ie[1]))
                                cyc = 1;
                        }
                    if (cyc)
                        continue;
                }
                n2.node = ch;
                n2.parent = id;
                n2.edge = (uint32_t)e;
                n2.term = (uint32_t)(j - eoff[en]);
                n2.tj = j;
                n2.full = full;
                n2.rest = r;
                n2.so_far = s.so_far * tv[j];
                n2.key = n2.so_far * best[toff[ch] + (size_t)r];
                push(&q, &n2, nu);
            }
        }
    }
    t->complete = q.nheap == 0 && !t->overflow;
    /* on overflow no term is kept: the caller reports, nothing to print */
    for (i = 0; t->overflow && i < nk; i++)
        gs_int_set_si(&k[i].coef, 0);
    /* zero sums dropped, the rest in decreasing |value| */
    for (i = 0, v = 0; i < nk; i++) {
        if (gs_int_is_zero(&k[i].coef)) {
            gs_int_clear(&k[i].coef);
            gs_free(k[i].exps);
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
        gs_free(k[i].exps);
    }
    t->rest = t->total - sum;
    gs_free(k);
    gs_int_clear(&c);
    gs_free(q.st);
    gs_free(q.heap);
    gs_free(q.used);
    gs_free(ix.slot);
    gs_free(inc[0]);
    gs_free(uf);
    gs_free(uf2);
    gs_free(tl);
    gs_free(tloff);
    gs_free(foff);
    gs_free(fv);
    gs_free(fe);
    gs_free(nu);
    gs_free(tmask);
    gs_free(bit);
    gs_free(lin);
    gs_free(best);
    gs_free(coef);
    gs_free(off);
    gs_free(tv);
    gs_free(tdeg);
    gs_free(eoff);
    gs_free(ex);
    gs_free(acc);
}

void gs_mgraph_terms_clear(gs_mgraph_terms *t)
{
    size_t i;
    for (i = 0; t->term && i < t->count; i++)
        gs_poly_clear(&t->term[i]);
    gs_free(t->term);
    gs_free(t->value);
    memset(t, 0, sizeof *t);
}
