/* mgraph.c - the graph of shared minors: building, counting, numbers.
 * See LICENSE.
 *
 * Building is the plan of minors.c with wide masks: level k holds the
 * column sets of the minors on the rows not yet expanded, each once,
 * pruned where the minor is zero by structure (a remaining row with no
 * entry in the set, or a column of the set no remaining row touches).
 * Each expansion step records its edges instead of multiplying.  A last
 * pass from the empty minor up drops the minors none of whose paths
 * reach it.  Evaluation in any number system is then one loop over the
 * nodes in id order, since children have smaller ids.
 */
#include "analysis/mgraph.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

#define NONE SIZE_MAX

/* A level: column sets of w words each, in insertion order, hashed. */
typedef struct level {
    uint64_t *keys;         /* count * w words */
    size_t count, alloc;
    size_t *slot;           /* cap entries, NONE when free */
    size_t cap;
    /* edges from this level to the next, in parent order */
    size_t *e_parent, *e_child;
    uint32_t *e_cell;
    unsigned char *e_neg;
    size_t nedges, ealloc;
} level;

typedef struct view {
    int n, w;               /* w: words per column set (n + 1 columns) */
    const gs_poly **x;      /* x[r * (n + 1) + j], rows of A (or A^T) */
    uint64_t *nz;           /* nz[r * w ..]: nonzero columns of row r */
    const gs_poly **top;    /* the border, n + 1 entries */
} view;

static uint64_t hash_key(const uint64_t *k, int w)
{
    uint64_t h = 0x9E3779B97F4A7C15ull;
    int i;
    for (i = 0; i < w; i++)
        h = (h ^ k[i]) * 0xBF58476D1CE4E5B9ull;
    return h ^ (h >> 31);
}

static void level_init(level *l)
{
    memset(l, 0, sizeof *l);
}

static void level_clear(level *l)
{
    gs_free(l->keys);
    gs_free(l->slot);
    gs_free(l->e_parent);
    gs_free(l->e_child);
    gs_free(l->e_cell);
    gs_free(l->e_neg);
    level_init(l);
}

static void level_rehash(level *l, int w)
{
    size_t cap = l->cap ? 2 * l->cap : 64, i;
    gs_free(l->slot);
    l->cap = cap;
    l->slot = gs_malloc(cap * sizeof *l->slot);
    for (i = 0; i < cap; i++)
        l->slot[i] = NONE;
    for (i = 0; i < l->count; i++) {
        size_t h = (size_t)hash_key(l->keys + i * (size_t)w, w) & (cap - 1);
        while (l->slot[h] != NONE)
            h = (h + 1) & (cap - 1);
        l->slot[h] = i;
    }
}

/* Index of key in l, added when new. */
static size_t level_add(level *l, const uint64_t *key, int w)
{
    size_t h, i;
    if (2 * (l->count + 1) > l->cap)
        level_rehash(l, w);
    for (h = (size_t)hash_key(key, w) & (l->cap - 1); l->slot[h] != NONE;
         h = (h + 1) & (l->cap - 1)) {
        i = l->slot[h];
        if (memcmp(l->keys + i * (size_t)w, key, (size_t)w * 8) == 0)
            return i;
    }
    if (l->count == l->alloc) {
        l->alloc = l->alloc ? 2 * l->alloc : 16;
        l->keys = gs_reallocarray(l->keys, l->alloc * (size_t)w, 8);
    }
    memcpy(l->keys + l->count * (size_t)w, key, (size_t)w * 8);
    l->slot[h] = l->count;
    return l->count++;
}

static void level_edge(level *l, size_t parent, size_t child, uint32_t cell,
                       int neg)
{
    if (l->nedges == l->ealloc) {
        l->ealloc = l->ealloc ? 2 * l->ealloc : 64;
        l->e_parent = gs_reallocarray(l->e_parent, l->ealloc,
                                      sizeof *l->e_parent);
        l->e_child = gs_reallocarray(l->e_child, l->ealloc,
                                     sizeof *l->e_child);
        l->e_cell = gs_reallocarray(l->e_cell, l->ealloc, sizeof *l->e_cell);
        l->e_neg = gs_reallocarray(l->e_neg, l->ealloc, 1);
    }
    l->e_parent[l->nedges] = parent;
    l->e_child[l->nedges] = child;
    l->e_cell[l->nedges] = cell;
    l->e_neg[l->nedges++] = (unsigned char)neg;
}

static int popcount_below(const uint64_t *S, int j)
{
    int c = 0, i;
    for (i = 0; i < j / 64; i++)
        c += __builtin_popcountll(S[i]);
    if (j % 64)
        c += __builtin_popcountll(S[j / 64] & ((1ull << (j % 64)) - 1));
    return c;
}

/* Each row left (rows[0 .. nrows-1]) has an entry in S, and every column
   of S is reached by one of them. */
static int viable(const view *v, const int *rows, int nrows,
                  const uint64_t *S, uint64_t *reach)
{
    int i, k, w = v->w;
    for (k = 0; k < w; k++)
        reach[k] = 0;
    for (i = 0; i < nrows; i++) {
        const uint64_t *z = v->nz + (size_t)rows[i] * (size_t)w;
        uint64_t any = 0;
        for (k = 0; k < w; k++) {
            uint64_t m = z[k] & S[k];
            any |= m;
            reach[k] |= m;
        }
        if (any == 0)
            return 0;
    }
    for (k = 0; k < w; k++)
        if (reach[k] != S[k])
            return 0;
    return 1;
}

/* Bytes a column set of w words and an edge take while the graph is
   built, doubling slack included: a key and its hash slots, and an
   edge's parent, child, cell and sign. */
#define EDGE_BYTES (2 * (2 * sizeof(size_t) + 5))
static size_t set_bytes(int w)
{
    return 2 * ((size_t)w * 8 + 2 * sizeof(size_t));
}

/* Expand row r from `from` into `to` (rows[] the rows left after r);
   with record, edges go into from.  Stops (returns 0) once to has more
   than limit sets, or once to's sets and the new edges would take more
   than max_bytes; else 1. */
static int expand(level *to, level *from, const view *v, int r,
                  const int *rows, int nrows, int record, size_t limit,
                  size_t max_bytes, uint64_t *tmp)
{
    int w = v->w, n = v->n;
    uint64_t *child = tmp, *reach = tmp + w;
    const uint64_t *z = v->nz + (size_t)r * (size_t)w;
    size_t i;
    for (i = 0; i < from->count; i++) {
        const uint64_t *S = from->keys + i * (size_t)w;
        int k;
        for (k = 0; k < w; k++) {
            uint64_t cand = S[k] & z[k];
            for (; cand; cand &= cand - 1) {
                int j = k * 64 + __builtin_ctzll(cand);
                size_t at;
                memcpy(child, S, (size_t)w * 8);
                child[k] &= ~(cand & -cand);
                if (!viable(v, rows, nrows, child, reach))
                    continue;
                at = level_add(to, child, w);
                if (to->count > limit
                    || (max_bytes != NONE
                        && to->count * set_bytes(w)
                               + from->nedges * EDGE_BYTES > max_bytes))
                    return 0;
                if (record)
                    level_edge(from, i, at,
                               (uint32_t)((size_t)r * (size_t)(n + 1)
                                          + (size_t)j),
                               popcount_below(S, j) & 1);
            }
        }
    }
    return 1;
}

/* Live entries of row r within the columns still in play. */
static int row_weight(const view *v, int r, const uint64_t *live)
{
    int k, c = 0;
    for (k = 0; k < v->w; k++)
        c += __builtin_popcountll(v->nz[(size_t)r * (size_t)v->w + (size_t)k]
                                  & live[k]);
    return c;
}

static void view_init(view *v, const gs_mna *m, int transposed)
{
    int n = m->n, r, j;
    v->n = n;
    v->w = (n + 1 + 63) / 64;
    v->x = gs_malloc((size_t)n * ((size_t)n + 1) * sizeof *v->x);
    v->top = gs_malloc(((size_t)n + 1) * sizeof *v->top);
    v->nz = gs_calloc((size_t)n * (size_t)v->w, 8);
    for (r = 0; r < n; r++)
        for (j = 0; j <= n; j++) {
            const gs_poly *e = transposed ? GS_MNA_AT(m, j, r)
                                          : GS_MNA_AT(m, r, j);
            v->x[(size_t)r * ((size_t)n + 1) + (size_t)j] = e;
            if (!gs_poly_is_zero(e))
                v->nz[(size_t)r * (size_t)v->w + (size_t)(j / 64)] |=
                    1ull << (j % 64);
        }
    for (j = 0; j <= n; j++)
        v->top[j] = transposed ? GS_MNA_AT(m, j, n) : GS_MNA_AT(m, n, j);
}

static void view_clear(view *v)
{
    gs_free(v->x);
    gs_free(v->top);
    gs_free(v->nz);
}

/* Work allowed for trying every row at one level before the cheaper
   rule takes over (set tests, each of n words at most). */
#define GREEDY_WORK 4000000u

/* Levels 0 .. n of one orientation, taking at most max_bytes (NONE: no
   limit) by set_bytes and EDGE_BYTES.  Returns the levels (n + 1), or
   NULL past max_bytes. */
static level *plan_levels(const view *v, gs_mgraph_order order,
                          size_t max_bytes)
{
    size_t used;
    int over = 0;
    int n = v->n, w = v->w, k, i, j, nrows = n;
    level *lv = gs_malloc(((size_t)n + 1) * sizeof *lv);
    int *rows = gs_malloc(((size_t)n + 1) * sizeof *rows);
    int *rest = gs_malloc(((size_t)n + 1) * sizeof *rest);
    uint64_t *tmp = gs_malloc(3 * (size_t)w * 8);
    uint64_t *full = gs_calloc((size_t)w, 8);
    uint64_t *live = gs_calloc((size_t)w, 8);

    for (k = 0; k <= n; k++)
        level_init(&lv[k]);
    for (i = 0; i < n; i++)
        rows[i] = i;
    for (j = 0; j <= n; j++)
        full[j / 64] |= 1ull << (j % 64);
    for (j = 0; j <= n; j++) {
        uint64_t *S = tmp + 2 * w;
        if (j < n && gs_poly_is_zero(v->top[j]))
            continue;
        memcpy(S, full, (size_t)w * 8);
        S[j / 64] &= ~(1ull << (j % 64));
        if (viable(v, rows, nrows, S, tmp))
            level_add(&lv[0], S, w);
    }
    used = lv[0].count * set_bytes(w);
    for (k = 0; k < n && !over; k++) {
        int pick = 0, best_w = -1;
        size_t best = NONE;
        /* columns still in play: the union of this level's sets */
        memset(live, 0, (size_t)w * 8);
        for (i = 0; i < (int)lv[k].count; i++)
            for (j = 0; j < w; j++)
                live[j] |= lv[k].keys[(size_t)i * (size_t)w + (size_t)j];
        if (order == GS_MGRAPH_ORDER_GREEDY
            && (double)lv[k].count * nrows * nrows * w * 4 < GREEDY_WORK) {
            for (i = 0; i < nrows; i++) {
                level trial;
                int m = 0, t;
                for (t = 0; t < nrows; t++)
                    if (t != i)
                        rest[m++] = rows[t];
                level_init(&trial);
                if (expand(&trial, &lv[k], v, rows[i], rest, m, 0,
                           best == NONE ? NONE : best, NONE, tmp)
                    && (best == NONE || trial.count < best)) {
                    best = trial.count;
                    pick = i;
                }
                level_clear(&trial);
            }
        } else if (order != GS_MGRAPH_ORDER_NATURAL) {
            for (i = 0; i < nrows; i++) {
                int wt = row_weight(v, rows[i], live);
                if (best_w < 0 || wt < best_w) {
                    best_w = wt;
                    pick = i;
                }
            }
        }
        {
            int r = rows[pick], m = 0, t;
            for (t = 0; t < nrows; t++)
                if (t != pick)
                    rest[m++] = rows[t];
            memcpy(rows, rest, (size_t)m * sizeof *rows);
            nrows = m;
            over = !expand(&lv[k + 1], &lv[k], v, r, rows, nrows, 1, NONE,
                           max_bytes == NONE ? NONE
                           : used < max_bytes ? max_bytes - used : 0, tmp);
            used += lv[k + 1].count * set_bytes(w)
                    + lv[k].nedges * EDGE_BYTES;
        }
    }
    gs_free(rows);
    gs_free(rest);
    gs_free(tmp);
    gs_free(full);
    gs_free(live);
    if (over) {
        for (k = 0; k <= n; k++)
            level_clear(&lv[k]);
        gs_free(lv);
        return NULL;
    }
    return lv;
}

static int is_full_but(const uint64_t *S, int n, int w, int j)
{
    int k;
    for (k = 0; k <= n; k++) {
        int in = (int)(S[k / 64] >> (k % 64) & 1);
        if (in != (k != j))
            return 0;
    }
    (void)w;
    return 1;
}

/* Levels -> g: live nodes numbered from the empty minor up, the roots. */
static void assemble(gs_mgraph *g, level *lv, const view *v,
                     const gs_mna *m)
{
    int n = v->n, w = v->w, k, j;
    size_t **id = gs_malloc(((size_t)n + 1) * sizeof *id);
    size_t next = 0, e, ne = 0, i, cells = (size_t)(n + 1) * (size_t)(n + 1);
    size_t *top_node = gs_malloc(((size_t)n + 1) * sizeof *top_node);

    /* liveness from the bottom: the empty minor, then any node with an
       edge into a live one */
    for (k = n; k >= 0; k--) {
        id[k] = gs_malloc((lv[k].count ? lv[k].count : 1) * sizeof *id[k]);
        for (i = 0; i < lv[k].count; i++)
            id[k][i] = k == n ? 0 : NONE;
        if (k == n)
            continue;
        for (e = 0; e < lv[k].nedges; e++)
            if (id[k + 1][lv[k].e_child[e]] != NONE) {
                id[k][lv[k].e_parent[e]] = 1;
                ne++;
            }
    }
    /* numbering and edges, children first */
    g->first = gs_malloc(16 * sizeof *g->first);
    {
        size_t cap = 16, ecap = ne + 2 * ((size_t)n + 2);
        g->child = gs_malloc(ecap * sizeof *g->child);
        g->entry = gs_malloc(ecap * sizeof *g->entry);
        g->neg = gs_malloc(ecap);
        g->level = gs_malloc(16 * sizeof *g->level);
        g->nedges = 0;
        for (k = n; k >= 0; k--) {
            size_t ei = 0;
            for (i = 0; i < lv[k].count; i++) {
                if (id[k][i] == NONE)
                    continue;
                if (next + 2 >= cap) {
                    cap *= 2;
                    g->first = gs_reallocarray(g->first, cap,
                                               sizeof *g->first);
                    g->level = gs_reallocarray(g->level, cap,
                                               sizeof *g->level);
                }
                id[k][i] = next;
                g->first[next] = g->nedges;
                g->level[next] = n - k;
                /* the edges of parent i are contiguous, in order */
                while (ei < lv[k].nedges && lv[k].e_parent[ei] < i)
                    ei++;
                for (; k < n && ei < lv[k].nedges
                       && lv[k].e_parent[ei] == i; ei++) {
                    size_t c = id[k + 1][lv[k].e_child[ei]];
                    if (c == NONE)
                        continue;
                    g->child[g->nedges] = (uint32_t)c;
                    g->entry[g->nedges] = lv[k].e_cell[ei];
                    g->neg[g->nedges++] = lv[k].e_neg[ei];
                }
                next++;
            }
        }
        g->nnodes = next;
        /* the roots M and N over level 0 */
        for (j = 0; j <= n; j++)
            top_node[j] = NONE;
        g->root_d = NONE;
        for (i = 0; i < lv[0].count; i++) {
            if (id[0][i] == NONE)
                continue;
            for (j = 0; j <= n; j++)
                if (is_full_but(lv[0].keys + i * (size_t)w, n, w, j))
                    top_node[j] = id[0][i];
        }
        g->root_d = top_node[n];
        for (k = 0; k < 2; k++) {
            size_t node = g->nnodes++;
            if (g->nnodes + 1 >= cap) {
                cap *= 2;
                g->first = gs_reallocarray(g->first, cap, sizeof *g->first);
                g->level = gs_reallocarray(g->level, cap, sizeof *g->level);
            }
            g->first[node] = g->nedges;
            g->level[node] = n + 1;
            if (k == 1 && g->root_d != NONE) {
                g->child[g->nedges] = (uint32_t)g->root_d;
                g->entry[g->nedges] = (uint32_t)(cells);
                g->neg[g->nedges++] = 0;
            }
            for (j = 0; j <= n; j++) {
                if (top_node[j] == NONE || gs_poly_is_zero(v->top[j]))
                    continue;
                g->child[g->nedges] = (uint32_t)top_node[j];
                g->entry[g->nedges] = (uint32_t)((size_t)n * (size_t)(n + 1)
                                                 + (size_t)j);
                /* det M term (-1)^(n+j); N takes it with the other sign */
                g->neg[g->nedges++] = (unsigned char)(((n + j) & 1) ^ k);
            }
            if (k == 0)
                g->root_m = node;
            else
                g->root_n = node;
        }
        g->first[g->nnodes] = g->nedges;
    }
    /* the entries: the view's cells, its border, c0 */
    g->nentries = cells + 1;
    g->entries = gs_malloc(g->nentries * sizeof *g->entries);
    for (i = 0; i < g->nentries; i++) {
        const gs_poly *src = i < (size_t)n * (size_t)(n + 1) ? v->x[i]
                             : i < cells ? v->top[i - (size_t)n * (size_t)(n + 1)]
                                         : &m->c0;
        gs_poly_init(&g->entries[i]);
        gs_poly_set(&g->entries[i], src, g->ctx);
    }
    for (k = 0; k <= n; k++)
        gs_free(id[k]);
    gs_free(id);
    gs_free(top_node);
}

int gs_mgraph_build(gs_mgraph *g, const gs_mna *m, gs_mgraph_order order,
                    size_t max_bytes, const gs_polyctx *ctx)
{
    gs_mgraph cand[2];
    int t, n = m->n, pick, built[2] = {0, 0};
    for (t = 0; t < 2; t++) {
        view v;
        level *lv;
        int k;
        memset(&cand[t], 0, sizeof cand[t]);
        cand[t].ctx = ctx;
        cand[t].n = n;
        cand[t].transposed = t;
        gs_rat_init(&cand[t].scale);
        gs_rat_set(&cand[t].scale, &m->scale);
        view_init(&v, m, t);
        lv = plan_levels(&v, order, max_bytes ? max_bytes : NONE);
        if (lv != NULL) {
            assemble(&cand[t], lv, &v, m);
            for (k = 0; k <= n; k++)
                level_clear(&lv[k]);
            gs_free(lv);
            built[t] = 1;
        }
        view_clear(&v);
    }
    if (!built[0] && !built[1]) {
        gs_mgraph_clear(&cand[1]);
        *g = cand[0];
        return GS_EBUDGET;
    }
    pick = !built[0] || (built[1] && cand[1].nedges < cand[0].nedges);
    *g = cand[pick];
    gs_mgraph_clear(&cand[!pick]);
    return g->root_d == NONE ? GS_ESINGULAR : GS_OK;
}

void gs_mgraph_refused(gs_diag *d, size_t max_bytes)
{
    gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                "a network in which most nodes connect to most others has "
                "exponentially many minors: split it, or raise the budget "
                "with --max-memory",
                "memory budget exceeded building the graph of minors "
                "(budget %zu bytes): the circuit's nodes are too densely "
                "connected", max_bytes);
}

void gs_mgraph_clear(gs_mgraph *g)
{
    size_t i;
    for (i = 0; g->entries && i < g->nentries; i++)
        gs_poly_clear(&g->entries[i]);
    gs_free(g->entries);
    gs_free(g->first);
    gs_free(g->child);
    gs_free(g->entry);
    gs_free(g->neg);
    gs_free(g->level);
    gs_rat_clear(&g->scale);
    memset(g, 0, sizeof *g);
}

void gs_mgraph_count_paths(gs_int *r, const gs_mgraph *g, size_t root)
{
    gs_int *c;
    gs_int t;
    size_t v, e;
    gs_int_set_si(r, 0);
    if (root == NONE)
        return;
    c = gs_malloc((root + 1) * sizeof *c);
    gs_int_init(&t);
    for (v = 0; v <= root; v++) {
        gs_int_init(&c[v]);
        if (v == 0)
            gs_int_set_si(&c[v], 1);
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            gs_int_set_ui(&t, g->entries[g->entry[e]].length);
            gs_int_addmul(&c[v], &t, &c[g->child[e]]);
        }
    }
    gs_int_set(r, &c[root]);
    for (v = 0; v <= root; v++)
        gs_int_clear(&c[v]);
    gs_free(c);
    gs_int_clear(&t);
}

void gs_mgraph_eval_lc(long double complex *num, long double complex *den,
                       const gs_mgraph *g, const long double complex *vals)
{
    long double complex *x = gs_malloc(g->nentries * sizeof *x);
    long double complex *val = gs_malloc(g->nnodes * sizeof *val);
    size_t v, e;
    long double sc = gs_rat_get_ld(&g->scale);
    for (v = 0; v < g->nentries; v++)
        x[v] = gs_poly_is_zero(&g->entries[v])
                   ? 0 : gs_poly_eval_lc(&g->entries[v], vals, g->ctx);
    for (v = 0; v < g->nnodes; v++) {
        long double complex acc = v == 0 ? 1 : 0;
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            long double complex p = x[g->entry[e]] * val[g->child[e]];
            acc = g->neg[e] ? acc - p : acc + p;
        }
        val[v] = acc;
    }
    *num = sc * val[g->root_n];
    *den = val[g->root_d];
    gs_free(x);
    gs_free(val);
}

static void poly_eval_rat(gs_rat *r, const gs_poly *a, const gs_rat *vals,
                          const gs_polyctx *ctx)
{
    unsigned *ex = gs_malloc(((size_t)ctx->nvars + 1) * sizeof *ex);
    gs_rat t, p;
    size_t i;
    int v;
    gs_rat_init(&t);
    gs_rat_init(&p);
    gs_rat_set_si(r, 0, 1);
    for (i = 0; i < a->length; i++) {
        gs_rat_set_int(&t, &a->coeffs[i]);
        gs_poly_get_term_exps(ex, a, i, ctx);
        for (v = 0; v < ctx->nvars; v++)
            if (ex[v]) {
                gs_rat_pow_si(&p, &vals[v], (long)ex[v]);
                gs_rat_mul(&t, &t, &p);
            }
        gs_rat_add(r, r, &t);
    }
    gs_rat_clear(&t);
    gs_rat_clear(&p);
    gs_free(ex);
}

void gs_mgraph_eval_rat(gs_rat *num, gs_rat *den, const gs_mgraph *g,
                        const gs_rat *vals)
{
    gs_rat *x = gs_malloc(g->nentries * sizeof *x);
    gs_rat *val = gs_malloc(g->nnodes * sizeof *val);
    gs_rat p;
    size_t v, e;
    gs_rat_init(&p);
    for (v = 0; v < g->nentries; v++) {
        gs_rat_init(&x[v]);
        poly_eval_rat(&x[v], &g->entries[v], vals, g->ctx);
    }
    for (v = 0; v < g->nnodes; v++) {
        gs_rat_init(&val[v]);
        if (v == 0)
            gs_rat_set_si(&val[v], 1, 1);
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            gs_rat_mul(&p, &x[g->entry[e]], &val[g->child[e]]);
            if (g->neg[e])
                gs_rat_sub(&val[v], &val[v], &p);
            else
                gs_rat_add(&val[v], &val[v], &p);
        }
    }
    gs_rat_mul(num, &g->scale, &val[g->root_n]);
    gs_rat_set(den, &val[g->root_d]);
    for (v = 0; v < g->nentries; v++)
        gs_rat_clear(&x[v]);
    for (v = 0; v < g->nnodes; v++)
        gs_rat_clear(&val[v]);
    gs_free(x);
    gs_free(val);
    gs_rat_clear(&p);
}

/* Numeric coefficients in s of every entry: off[i] .. off[i+1]-1 in c. */
static long double *entry_coeffs(size_t **off_out, const gs_mgraph *g,
                                 int s_var, const long double *vals)
{
    size_t *off = gs_malloc((g->nentries + 1) * sizeof *off), i;
    long double *c;
    gs_poly cf;
    off[0] = 0;
    for (i = 0; i < g->nentries; i++) {
        long d = s_var < 0 ? (gs_poly_is_zero(&g->entries[i]) ? -1 : 0)
                           : gs_poly_degree(&g->entries[i], s_var, g->ctx);
        off[i + 1] = off[i] + (size_t)(d + 1);
    }
    c = gs_calloc(off[g->nentries] ? off[g->nentries] : 1, sizeof *c);
    gs_poly_init(&cf);
    for (i = 0; i < g->nentries; i++) {
        size_t k;
        for (k = 0; k < off[i + 1] - off[i]; k++) {
            if (s_var < 0) {        /* no variable split off */
                c[off[i]] = gs_poly_eval_ld(&g->entries[i], vals, g->ctx);
                continue;
            }
            gs_poly_coeff_var(&cf, &g->entries[i], s_var, (unsigned)k,
                              g->ctx);
            c[off[i] + k] = gs_poly_eval_ld(&cf, vals, g->ctx);
        }
    }
    gs_poly_clear(&cf);
    *off_out = off;
    return c;
}

static long double *take(const long double *src, size_t len, int *deg)
{
    long double *out;
    int d = (int)len - 1;
    while (d >= 0 && src[d] == 0)
        d--;
    out = gs_calloc((size_t)(d >= 0 ? d + 1 : 1), sizeof *out);
    if (d >= 0)
        memcpy(out, src, (size_t)(d + 1) * sizeof *out);
    *deg = d;
    return out;
}

/* The numeric polynomial in s of every node: node v's coefficients at
   c[off[v] .. off[v+1]-1], ascending.  Both arrays new. */
long double *gs_mgraph_node_coeffs(size_t **off_out, const gs_mgraph *g,
                                   int s_var, const long double *vals)
{
    size_t *eoff, *off = gs_malloc((g->nnodes + 1) * sizeof *off), v, e;
    long double *ec = entry_coeffs(&eoff, g, s_var, vals), *c;
    /* degree bound of each node: the largest along its edges */
    off[0] = 0;
    for (v = 0; v < g->nnodes; v++) {
        size_t len = v == 0 ? 1 : 0;
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            size_t ch = g->child[e], le = eoff[g->entry[e] + 1]
                                          - eoff[g->entry[e]];
            size_t l = le + (off[ch + 1] - off[ch]) - 1;
            if (le && off[ch + 1] > off[ch] && l > len)
                len = l;
        }
        off[v + 1] = off[v] + len;
    }
    c = gs_calloc(off[g->nnodes] ? off[g->nnodes] : 1, sizeof *c);
    c[0] = 1;
    for (v = 1; v < g->nnodes; v++) {
        long double *acc = c + off[v];
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            const long double *a = ec + eoff[g->entry[e]];
            const long double *b = c + off[g->child[e]];
            size_t la = eoff[g->entry[e] + 1] - eoff[g->entry[e]];
            size_t lb = off[g->child[e] + 1] - off[g->child[e]], i, k;
            for (i = 0; i < la; i++)
                for (k = 0; k < lb; k++)
                    acc[i + k] += g->neg[e] ? -a[i] * b[k] : a[i] * b[k];
        }
    }
    gs_free(ec);
    gs_free(eoff);
    *off_out = off;
    return c;
}

void gs_mgraph_coeffs_ld(long double **cn, int *dn, long double **cd,
                         int *dd, const gs_mgraph *g, int s_var,
                         const long double *vals)
{
    size_t *off, v;
    long double *c = gs_mgraph_node_coeffs(&off, g, s_var, vals);
    long double sc = gs_rat_get_ld(&g->scale);
    *cn = take(c + off[g->root_n], off[g->root_n + 1] - off[g->root_n], dn);
    for (v = 0; (int)v <= *dn; v++)
        (*cn)[v] *= sc;
    *cd = take(c + off[g->root_d], off[g->root_d + 1] - off[g->root_d], dd);
    gs_free(c);
    gs_free(off);
}

int gs_mgraph_expand(gs_poly *r, const gs_mgraph *g, size_t root,
                     size_t max_terms)
{
    gs_poly *val;
    const gs_poly **ea, **mb;
    int *neg, rc = GS_OK;
    size_t v, e, *last;
    gs_poly_zero(r);
    if (root == NONE)
        return GS_OK;
    val = gs_malloc((root + 1) * sizeof *val);
    last = gs_calloc(root + 1, sizeof *last);
    ea = gs_malloc(((size_t)g->n + 2) * sizeof *ea);
    mb = gs_malloc(((size_t)g->n + 2) * sizeof *mb);
    neg = gs_malloc(((size_t)g->n + 2) * sizeof *neg);
    /* the last parent of each node, to free it once used up */
    for (v = 0; v <= root; v++)
        for (e = g->first[v]; e < g->first[v + 1]; e++)
            last[g->child[e]] = v;
    for (v = 0; v <= root; v++) {
        size_t np = 0;
        gs_poly_init(&val[v]);
        if (v == 0) {
            gs_poly_set_si(&val[v], 1, g->ctx);
            continue;
        }
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            ea[np] = &g->entries[g->entry[e]];
            mb[np] = &val[g->child[e]];
            neg[np++] = g->neg[e];
        }
        if (rc == GS_OK)
            gs_poly_sum_of_products(&val[v], ea, mb, neg, np, g->ctx);
        if (max_terms && val[v].length > max_terms)
            rc = GS_EBUDGET;
        for (e = g->first[v]; e < g->first[v + 1]; e++)
            if (last[g->child[e]] == v) {
                gs_poly_clear(&val[g->child[e]]);
                last[g->child[e]] = NONE;       /* freed */
            }
    }
    if (rc == GS_OK)
        gs_poly_swap(r, &val[root]);
    /* what no parent up to root used up: the root and nodes other roots
       share */
    for (v = 0; v <= root; v++)
        if (last[v] != NONE)
            gs_poly_clear(&val[v]);
    gs_free(val);
    gs_free(last);
    gs_free(ea);
    gs_free(mb);
    gs_free(neg);
    return rc;
}

void gs_mgraph_fill_recips(long double *vals, const gs_symtab *st,
                           int nvars)
{
    int v;
    for (v = 0; v < nvars; v++)
        if (gs_symtab_is_recip(st, v)) {
            int b = gs_symtab_base(st, v);
            vals[v] = b >= 0 && b < nvars && vals[b] != 0 ? 1 / vals[b] : 0;
        }
}
