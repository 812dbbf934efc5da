/* minors.c - determinants of a bordered MNA matrix by expansion in minors.
 * See LICENSE.
 *
 * The work is split in two.  The plan handles column masks only: level k
 * holds the column sets S of the minors on rows order[k..n-1] that the
 * expansion reaches from the top, pruned where the minor is zero by its
 * structure alone (a remaining row with no entry in S, or a column of S
 * that no remaining row touches).  The row expanded at each level is
 * chosen greedily: the one whose expansion leaves the fewest minors at the
 * next level.  Then the values are computed bottom-up, level n (the empty
 * minor, 1) to level 0, two levels alive at a time.
 */
#include "analysis/minors.h"
#include "analysis/elim.h"
#include "analysis/mgraph.h"
#include "base/mem.h"

#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#define NO_MASK UINT64_MAX      /* never a column set: those have <= 63 bits */
#define NOT_FOUND SIZE_MAX

/* A set of column masks that remembers insertion order, so that plans and
   results do not depend on hashing. */
typedef struct maskset {
    uint64_t *slot_key;     /* cap slots, NO_MASK when free */
    size_t *slot_pos;       /* position in list */
    size_t cap;
    uint64_t *list;
    size_t count, alloc;
} maskset;

/* The matrix seen as n rows by n + 1 columns, in one orientation. */
typedef struct view {
    int n;
    const gs_poly **x;      /* x[r * (n + 1) + j] */
    uint64_t nz[GS_MINORS_MAX_UNKNOWNS];    /* nonzero columns of row r */
    const gs_poly **top;    /* n + 1 entries of the border */
} view;

typedef struct plan {
    int order[GS_MINORS_MAX_UNKNOWNS];
    maskset lv[GS_MINORS_MAX_UNKNOWNS + 1];
    size_t products, minors;
} plan;

static void maskset_init(maskset *s)
{
    memset(s, 0, sizeof *s);
}

static void maskset_clear(maskset *s)
{
    gs_free(s->slot_key);
    gs_free(s->slot_pos);
    gs_free(s->list);
    maskset_init(s);
}

static size_t slot_of(uint64_t key, size_t cap)
{
    return (size_t)((key * 0x9E3779B97F4A7C15ull) >> 17) & (cap - 1);
}

static void maskset_grow(maskset *s)
{
    size_t cap = s->cap ? s->cap * 2 : 64, i;
    gs_free(s->slot_key);
    gs_free(s->slot_pos);
    s->cap = cap;
    s->slot_key = gs_malloc(cap * sizeof *s->slot_key);
    s->slot_pos = gs_malloc(cap * sizeof *s->slot_pos);
    for (i = 0; i < cap; i++)
        s->slot_key[i] = NO_MASK;
    for (i = 0; i < s->count; i++) {
        size_t h = slot_of(s->list[i], cap);
        while (s->slot_key[h] != NO_MASK)
            h = (h + 1) & (cap - 1);
        s->slot_key[h] = s->list[i];
        s->slot_pos[h] = i;
    }
}

static size_t maskset_find(const maskset *s, uint64_t key)
{
    size_t h;
    if (s->cap == 0)
        return NOT_FOUND;
    for (h = slot_of(key, s->cap); s->slot_key[h] != NO_MASK;
         h = (h + 1) & (s->cap - 1))
        if (s->slot_key[h] == key)
            return s->slot_pos[h];
    return NOT_FOUND;
}

static void maskset_add(maskset *s, uint64_t key)
{
    size_t h;
    if (2 * (s->count + 1) > s->cap)
        maskset_grow(s);
    for (h = slot_of(key, s->cap); s->slot_key[h] != NO_MASK;
         h = (h + 1) & (s->cap - 1))
        if (s->slot_key[h] == key)
            return;
    if (s->count == s->alloc) {
        s->alloc = s->alloc ? 2 * s->alloc : 16;
        s->list = gs_realloc(s->list, s->alloc * sizeof *s->list);
    }
    s->slot_key[h] = key;
    s->slot_pos[h] = s->count;
    s->list[s->count++] = key;
}

static int lowest_bit(uint64_t m)
{
    return __builtin_ctzll(m);
}

/* Can the minor on `rows` (a mask of rows) and columns S be nonzero, by
   structure?  Each row needs an entry in S, each column of S an entry in
   one of the rows. */
static int viable(const view *v, uint64_t rows, uint64_t S)
{
    uint64_t reach = 0;
    for (; rows; rows &= rows - 1) {
        uint64_t m = v->nz[lowest_bit(rows)] & S;
        if (m == 0)
            return 0;
        reach |= m;
    }
    return reach == S;
}

/* The next level when row r is expanded from `from`, with `rest` the rows
   left after r.  Returns 1 with *products set; 0 once more than `limit`
   minors appear; -1 once *work (structure tests, shared by all trials)
   passes work_cap. */
static int expand_level(maskset *to, size_t *products, size_t *work,
                        size_t work_cap, const view *v, const maskset *from,
                        int r, uint64_t rest, size_t limit)
{
    size_t i, prods = 0;
    for (i = 0; i < from->count; i++) {
        uint64_t S = from->list[i], cand = S & v->nz[r];
        for (; cand; cand &= cand - 1) {
            uint64_t child = S & ~(cand & -cand);
            if (++*work > work_cap)
                return -1;
            if (!viable(v, rest, child))
                continue;
            prods++;
            maskset_add(to, child);
            if (to->count > limit)
                return 0;
        }
    }
    *products = prods;
    return 1;
}

static void plan_clear(plan *p, int n)
{
    int k;
    for (k = 0; k <= n; k++)
        maskset_clear(&p->lv[k]);
}

/* Greedy row order.  Returns GS_OK, or GS_ERANGE when the plan needs
   more than max_products products or its own search would cost more
   than a few times that (a matrix too dense to expand; elimination is
   then tried without much time lost). */
static int make_plan(plan *p, const view *v, size_t max_products)
{
    size_t work = 0, work_cap = max_products ? 8 * max_products : SIZE_MAX;
    int n = v->n, k, r;
    uint64_t rows = (1ull << n) - 1;
    uint64_t full = (1ull << n << 1) - 1;      /* n + 1 <= 64 columns */
    maskset trial;
    size_t budget = max_products ? max_products : SIZE_MAX;

    for (k = 0; k <= n; k++)
        maskset_init(&p->lv[k]);
    p->products = 0;
    p->minors = 0;
    for (r = 0; r <= n; r++)
        if ((r == n || !gs_poly_is_zero(v->top[r]))
            && viable(v, rows, full & ~(1ull << r)))
            maskset_add(&p->lv[0], full & ~(1ull << r));
    p->minors = p->lv[0].count;
    for (k = 0; k < n; k++) {
        int best = -1;
        size_t best_count = SIZE_MAX, best_prods = 0;
        maskset_init(&trial);
        for (r = 0; r < n; r++) {
            size_t prods, limit;
            uint64_t rest = rows & ~(1ull << r);
            int got;
            if (!(rows >> r & 1))
                continue;
            /* every minor comes from at least one product, so the
               products left also bound the minors of the next level */
            limit = budget - p->products;
            if (best_count < limit)
                limit = best_count;
            got = expand_level(&trial, &prods, &work, work_cap, v,
                               &p->lv[k], r, rest, limit);
            if (got < 0) {
                maskset_clear(&trial);
                return GS_ERANGE;
            }
            if (got == 0) {
                maskset_clear(&trial);
                continue;
            }
            if (trial.count < best_count
                || (trial.count == best_count && prods < best_prods)) {
                best = r;
                best_count = trial.count;
                best_prods = prods;
                maskset_clear(&p->lv[k + 1]);
                p->lv[k + 1] = trial;
                maskset_init(&trial);
            } else {
                maskset_clear(&trial);
            }
        }
        if (best < 0 || p->products + best_prods > budget)
            return GS_ERANGE;
        p->order[k] = best;
        p->products += best_prods;
        p->minors += best_count;
        rows &= ~(1ull << best);
    }
    return GS_OK;
}

static void view_init(view *v, const gs_mna *m, int transposed)
{
    int n = m->n, r, j;
    v->n = n;
    v->x = gs_malloc((size_t)n * ((size_t)n + 1) * sizeof *v->x);
    v->top = gs_malloc(((size_t)n + 1) * sizeof *v->top);
    for (r = 0; r < n; r++) {
        v->nz[r] = 0;
        for (j = 0; j <= n; j++) {
            const gs_poly *e = transposed ? GS_MNA_AT(m, j, r)
                                          : GS_MNA_AT(m, r, j);
            v->x[(size_t)r * ((size_t)n + 1) + (size_t)j] = e;
            if (!gs_poly_is_zero(e))
                v->nz[r] |= 1ull << j;
        }
    }
    for (j = 0; j <= n; j++)
        v->top[j] = transposed ? GS_MNA_AT(m, j, n) : GS_MNA_AT(m, n, j);
}

static void view_clear(view *v)
{
    gs_free(v->x);
    gs_free(v->top);
}

static void free_values(gs_poly *vals, size_t count)
{
    size_t i;
    for (i = 0; vals && i < count; i++)
        gs_poly_clear(&vals[i]);
    gs_free(vals);
}

/* Sizes watched during an evaluation: the largest minor, and the terms
   of all the minors alive at once (this level's and the next's). */
typedef struct watch {
    size_t big, alive, bytes;
    size_t max_terms, max_alive, max_bytes;    /* 0: unlimited */
    double work, max_work;  /* term pairs x words (elim.h's rule) */
    int overflow_var;       /* a symbol whose power would not fit, or -1 */
} watch;

static int over(const watch *w)
{
    return w->overflow_var >= 0
           || (w->max_terms && w->big > w->max_terms)
           || (w->max_alive && w->alive > w->max_alive)
           || (w->max_bytes && w->bytes > w->max_bytes)
           || (w->max_work > 0 && w->work > w->max_work);
}

static void watch_start(watch *w, const gs_minors_opts *o)
{
    w->big = w->alive = w->bytes = 0;
    w->max_terms = o->max_terms;
    w->max_alive = o->max_terms * GS_MINORS_KEPT_FACTOR;
    w->max_bytes = o->max_bytes;
    w->work = 0;
    w->max_work = (double)o->max_terms * GS_WORK_PER_TERM;
    w->overflow_var = -1;
}

/* Does every product of a row entry and a minor of the level below fit
   the exponent fields?  A cheap bound first: the row's highest powers plus
   the level's, one pass over each, each power bounded by the OR of its
   exponents (below twice it; a pass as quick as reading the memory).
   Only when that bound fails is each product checked on its own (in
   eval_level), so a circuit whose powers come near the limit without
   passing it is never refused. */
static int level_fits(const view *v, int r, const gs_poly *next,
                      size_t count, const gs_polyctx *ctx)
{
    size_t nv = (size_t)ctx->nvars + 1, i;
    unsigned *top = gs_calloc(nv, sizeof *top);
    unsigned *deg = gs_calloc(nv, sizeof *deg);
    unsigned *row = gs_calloc(nv, sizeof *row);
    int j, var, ok = 1;
    for (j = 0; j <= v->n; j++) {
        gs_poly_degree_bounds(deg, v->x[(size_t)r * ((size_t)v->n + 1)
                                        + (size_t)j], ctx);
        for (var = 0; var < ctx->nvars; var++)
            if (deg[var] > row[var])
                row[var] = deg[var];
    }
    for (i = 0; i < count; i++) {
        gs_poly_degree_bounds(deg, &next[i], ctx);
        for (var = 0; var < ctx->nvars; var++)
            if (deg[var] > top[var])
                top[var] = deg[var];
    }
    for (var = 0; var < ctx->nvars && ok; var++)
        ok = top[var] + row[var] <= GS_POLY_MAX_EXP;
    gs_free(top);
    gs_free(deg);
    gs_free(row);
    return ok;
}

/* How many products of level k take each minor of level k + 1:
   uses[i] for next[i], the count its storage is let go after. */
static void count_uses(unsigned *uses, const plan *p, const view *v, int k,
                       const gs_poly *next)
{
    const maskset *lv = &p->lv[k], *below = &p->lv[k + 1];
    int r = p->order[k];
    size_t i;
    memset(uses, 0, (below->count ? below->count : 1) * sizeof *uses);
    for (i = 0; i < lv->count; i++) {
        uint64_t S = lv->list[i], cand = S & v->nz[r];
        for (; cand; cand &= cand - 1) {
            size_t at = maskset_find(below, S & ~(cand & -cand));
            if (at != NOT_FOUND && !gs_poly_is_zero(&next[at]))
                uses[at]++;
        }
    }
}

/* acc = (neg ? -1 : 1) e m for a one-term entry e, taking m's storage:
   a monomial times a polynomial keeps its term order, so the terms are
   scaled where they lie.  A row that meets a column set in one place (a
   voltage source's branch row has a lone entry 1) makes a minor of one
   product, and a copy there would hold a large minor twice. */
static void take_scaled(gs_poly *acc, gs_poly *m, const gs_poly *e, int neg,
                        const gs_polyctx *ctx)
{
    gs_int c;
    int w, ones = 1;
    gs_poly_swap(acc, m);
    for (w = 0; w < ctx->nwords; w++)
        ones &= e->exps[w] == 0;
    if (!ones)
        gs_poly_mul_monomial(acc, acc, e->exps, ctx);
    gs_int_init(&c);
    gs_int_set(&c, &e->coeffs[0]);
    if (neg)
        gs_int_neg(&c, &c);
    gs_poly_mul_int(acc, acc, &c, ctx);
    gs_int_clear(&c);
}

/* Values of level k from those of level k + 1, vals[0 .. count-1] all
   initialised; stops early (the rest zero) once a size in w is over, or
   a product would overflow an exponent (w->overflow_var).  A minor of
   level k + 1 is let go after its last product, and one whose only
   product is with a one-term entry becomes the value it makes, so that
   the two levels alive at once hold no minor twice. */
static void eval_level(gs_poly *vals, const plan *p, const view *v, int k,
                       gs_poly *next, watch *w, const gs_polyctx *ctx)
{
    const maskset *lv = &p->lv[k], *below = &p->lv[k + 1];
    const gs_poly *ea[GS_MINORS_MAX_UNKNOWNS + 1];
    const gs_poly *mb[GS_MINORS_MAX_UNKNOWNS + 1];
    size_t mat[GS_MINORS_MAX_UNKNOWNS + 1];
    int neg[GS_MINORS_MAX_UNKNOWNS + 1];
    int r = p->order[k], fits;
    unsigned *uses = gs_malloc((below->count ? below->count : 1)
                               * sizeof *uses);
    size_t i;
    for (i = 0; i < lv->count; i++)
        gs_poly_init(&vals[i]);
    fits = level_fits(v, r, next, below->count, ctx);
    count_uses(uses, p, v, k, next);
    for (i = 0; i < below->count; i++) {
        w->alive += next[i].length;
        if (w->max_bytes)
            w->bytes += gs_poly_storage(&next[i], ctx);
    }
    for (i = 0; i < lv->count && !over(w); i++) {
        uint64_t S = lv->list[i], cand = S & v->nz[r];
        gs_poly *acc = &vals[i];
        size_t np = 0, k2, held = 0;
        for (; cand; cand &= cand - 1) {
            uint64_t bit = cand & -cand;
            size_t at = maskset_find(below, S & ~bit);
            int j = lowest_bit(bit);
            if (at == NOT_FOUND || gs_poly_is_zero(&next[at]))
                continue;
            ea[np] = v->x[(size_t)r * ((size_t)v->n + 1) + (size_t)j];
            mb[np] = &next[at];
            mat[np] = at;
            neg[np++] = __builtin_popcountll(S & (bit - 1)) & 1;
        }
        for (k2 = 0; k2 < np; k2++) {
            w->work += (double)ea[k2]->length * (double)mb[k2]->length
                       * ctx->nwords;
            if (!fits && !gs_poly_mul_fits(&w->overflow_var, ea[k2],
                                           mb[k2], ctx))
                break;
        }
        if (over(w))
            break;          /* before the work is done */
        if (np == 1 && ea[0]->length == 1 && uses[mat[0]] == 1) {
            /* counted once already, as a minor of the level below */
            held = next[mat[0]].length;
            if (w->max_bytes)
                w->bytes -= gs_poly_storage(&next[mat[0]], ctx);
            take_scaled(acc, &next[mat[0]], ea[0], neg[0], ctx);
            uses[mat[0]] = 0;
        } else {
            gs_poly_sum_of_products(acc, ea, mb, neg, np, ctx);
        }
        for (k2 = 0; k2 < np; k2++)
            if (uses[mat[k2]] > 0 && --uses[mat[k2]] == 0) {
                gs_poly_clear(&next[mat[k2]]);
                gs_poly_init(&next[mat[k2]]);
            }
        w->alive += acc->length - held;
        if (w->max_bytes)
            w->bytes += gs_poly_storage(acc, ctx);
        if (acc->length > w->big)
            w->big = acc->length;
    }
    gs_free(uses);
}

static void report_overflow(gs_diag *d, const gs_polyctx *ctx, int var,
                            int level, int n)
{
    gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                "lower the powers in the element values, or bind the "
                "symbol to a number",
                "exponent overflow at expansion level %d of %d: the power "
                "of '%s' would exceed %d", level, n,
                gs_symtab_name(ctx->syms, var), GS_POLY_MAX_EXP);
}

static void report_budget(gs_diag *d, const watch *w, int level, int n)
{
    const char *hint = "raise the budget with --max-terms (0: none), or bind "
                       "some symbols to numbers";
    if (w->max_work > 0 && w->work > w->max_work)
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, hint,
                    "work budget exceeded at expansion level %d of %d: the "
                    "products would multiply %.3g term pairs (budget %d x "
                    "%zu)", level, n, w->work, GS_WORK_PER_TERM,
                    w->max_terms);
    else if (w->max_bytes && w->bytes > w->max_bytes)
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                    "raise it with --max-memory, or try approx, eval or "
                    "bode, which need no expansion",
                    "memory budget exceeded at expansion level %d of %d: "
                    "the minors kept at once reached %zu bytes (budget "
                    "%zu)", level, n, w->bytes, w->max_bytes);
    else if (w->max_terms && w->big > w->max_terms)
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, hint,
                    "term budget exceeded at expansion level %d of %d: a "
                    "minor reached %zu terms (budget %zu)", level, n,
                    w->big, w->max_terms);
    else
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, hint,
                    "term budget exceeded at expansion level %d of %d: the "
                    "minors kept at once reached %zu terms (budget %d x "
                    "%zu)", level, n, w->alive, GS_MINORS_KEPT_FACTOR,
                    w->max_terms);
}

/* Run the plan; on GS_OK *top holds level 0's values (p->lv[0] order). */
static int evaluate(gs_poly **top, const plan *p, const view *v,
                    const gs_polyctx *ctx, const gs_minors_opts *o,
                    gs_minors_stats *st, gs_diag *d)
{
    int n = v->n, k;
    gs_poly *next, *vals;
    watch w;

    watch_start(&w, o);
    next = gs_malloc((p->lv[n].count ? p->lv[n].count : 1) * sizeof *next);
    if (p->lv[n].count) {
        gs_poly_init(&next[0]);
        gs_poly_set_si(&next[0], 1, ctx);       /* the empty minor */
    }
    for (k = n - 1; k >= 0; k--) {
        if (o->progress)
            fprintf(o->progress, "\rexpansion level %d/%d", n - k, n);
        vals = gs_malloc((p->lv[k].count ? p->lv[k].count : 1)
                         * sizeof *vals);
        w.alive = 0;
        w.bytes = 0;
        eval_level(vals, p, v, k, next, &w, ctx);
        free_values(next, p->lv[k + 1].count);
        next = vals;
        if (w.big > st->max_minor_terms)
            st->max_minor_terms = w.big;
        if (over(&w)) {
            if (o->progress)
                fputc('\n', o->progress);
            free_values(next, p->lv[k].count);
            if (w.overflow_var >= 0) {
                report_overflow(d, ctx, w.overflow_var, n - k, n);
                st->exp_overflow = 1;
                return GS_ERANGE;
            }
            report_budget(d, &w, n - k, n);
            return GS_EBUDGET;
        }
    }
    if (o->progress)
        fputc('\n', o->progress);
    *top = next;
    return GS_OK;
}

/* det A and det M from level 0's values; 0, or 1 + the symbol whose
   power in a product of the border would overflow (nothing assembled). */
static int assemble(gs_poly *det_a, gs_poly *det_m, const plan *p,
                    const view *v, gs_poly *top, const gs_polyctx *ctx)
{
    int n = v->n, j, var = 0;
    uint64_t full = (1ull << n << 1) - 1;
    gs_poly t;
    size_t at = maskset_find(&p->lv[0], full & ~(1ull << n));
    for (j = 0; j <= n; j++) {
        size_t aj = j == n ? at : maskset_find(&p->lv[0],
                                               full & ~(1ull << j));
        if (aj != NOT_FOUND && !gs_poly_mul_fits(&var, v->top[j], &top[aj],
                                                 ctx))
            return var + 1;
    }
    gs_poly_zero(det_a);
    if (at != NOT_FOUND)
        gs_poly_swap(det_a, &top[at]);
    gs_poly_zero(det_m);
    gs_poly_init(&t);
    for (j = 0; j <= n; j++) {
        if (gs_poly_is_zero(v->top[j]))
            continue;
        at = maskset_find(&p->lv[0], full & ~(1ull << j));
        if (at == NOT_FOUND)
            continue;
        gs_poly_mul(&t, v->top[j], j == n ? det_a : &top[at], ctx);
        if ((n + j) & 1)
            gs_poly_sub(det_m, det_m, &t, ctx);
        else
            gs_poly_add(det_m, det_m, &t, ctx);
    }
    gs_poly_clear(&t);
    return 0;
}

/* ---- past one word of columns: the graph of minors ------------------ */

/* Node v's value from its children's, under the watch: the exponent check
   on every product first, then the sum of the products. */
static void eval_node(gs_poly *val, const gs_mgraph *g, size_t v,
                      const gs_poly *vals, const gs_poly **ea,
                      const gs_poly **mb, int *neg, watch *w)
{
    size_t e, np = 0, k;
    for (e = g->first[v]; e < g->first[v + 1]; e++) {
        const gs_poly *c = &vals[g->child[e]];
        if (gs_poly_is_zero(c))
            continue;
        ea[np] = &g->entries[g->entry[e]];
        mb[np] = c;
        neg[np++] = g->neg[e];
    }
    for (k = 0; k < np; k++) {
        w->work += (double)ea[k]->length * (double)mb[k]->length
                   * g->ctx->nwords;
        if (!gs_poly_mul_fits(&w->overflow_var, ea[k], mb[k], g->ctx))
            return;
    }
    if (!over(w))
        gs_poly_sum_of_products(val, ea, mb, neg, np, g->ctx);
}

/* The nodes below the two roots: reach[v] = 1, and last[v] the last of
   its parents in node order, after which its value is let go. */
static void graph_reach(unsigned char *reach, size_t *last,
                        const gs_mgraph *g, size_t top)
{
    size_t v, e;
    for (v = top + 1; v-- > 0;) {
        last[v] = NOT_FOUND;
        if (v == g->root_d || v == g->root_m)
            reach[v] = 1;
    }
    for (v = top + 1; v-- > 0;)
        if (reach[v])
            for (e = g->first[v]; e < g->first[v + 1]; e++)
                reach[g->child[e]] = 1;
    for (v = 0; v <= top; v++)
        if (reach[v])
            for (e = g->first[v]; e < g->first[v + 1]; e++)
                last[g->child[e]] = v;
}

static void watch_value(watch *w, const gs_poly *p, const gs_polyctx *ctx,
                        int sign)
{
    size_t bytes = w->max_bytes ? gs_poly_storage(p, ctx) : 0;
    if (sign > 0) {
        w->alive += p->length;
        w->bytes += bytes;
        if (p->length > w->big)
            w->big = p->length;
    } else {
        w->alive -= p->length;
        w->bytes -= bytes;
    }
}

/* Node v's value when it is one product of a one-term entry and a child
   whose last parent it is (not a root): the child's storage, scaled in
   place (take_scaled), so that a large minor is never held twice.
   Returns 0, with nothing done, otherwise. */
static int take_lone_child(gs_poly *vals, const gs_mgraph *g, size_t v,
                           const size_t *last, watch *w)
{
    size_t e, at = NOT_FOUND, c;
    const gs_poly *entry = NULL;
    int neg = 0;
    for (e = g->first[v]; e < g->first[v + 1]; e++) {
        if (gs_poly_is_zero(&vals[g->child[e]]))
            continue;
        if (at != NOT_FOUND)
            return 0;
        at = e;
    }
    if (at == NOT_FOUND)
        return 0;
    c = g->child[at];
    entry = &g->entries[g->entry[at]];
    neg = g->neg[at];
    if (entry->length != 1 || last[c] != v || c == g->root_d
        || c == g->root_m)
        return 0;
    w->work += (double)vals[c].length * g->ctx->nwords;
    if (!gs_poly_mul_fits(&w->overflow_var, entry, &vals[c], g->ctx))
        return 1;
    if (over(w))
        return 1;
    watch_value(w, &vals[c], g->ctx, -1);
    take_scaled(&vals[v], &vals[c], entry, neg, g->ctx);
    return 1;
}

/* Expand the roots D and M of g children first, each value let go after
   its last parent, with the budgets of the level expansion: the terms of
   one minor and of all kept at once, their storage, the work, and the
   exponents before every product.  The level in a message is the node's
   (the rows expanded below it). */
static int expand_graph(gs_poly *det_a, gs_poly *det_m, const gs_mgraph *g,
                        const gs_minors_opts *o, gs_minors_stats *st,
                        gs_diag *d)
{
    size_t top = g->root_m == SIZE_MAX || g->root_m < g->root_d
                 ? g->root_d : g->root_m, v, e;
    gs_poly *vals = gs_malloc((top + 1) * sizeof *vals);
    size_t *last = gs_malloc((top + 1) * sizeof *last);
    unsigned char *reach = gs_calloc(top + 1, 1);
    const gs_poly **ea = gs_malloc(((size_t)g->n + 2) * sizeof *ea);
    const gs_poly **mb = gs_malloc(((size_t)g->n + 2) * sizeof *mb);
    int *neg = gs_malloc(((size_t)g->n + 2) * sizeof *neg), shown = 0;
    int rc = GS_OK, lvl = 0;
    watch w;

    watch_start(&w, o);
    graph_reach(reach, last, g, top);
    for (v = 0; v <= top; v++)
        gs_poly_init(&vals[v]);
    gs_poly_set_si(&vals[0], 1, g->ctx);        /* the empty minor */
    for (v = 1; v <= top && rc == GS_OK; v++) {
        if (!reach[v])
            continue;
        lvl = g->level[v];
        if (o->progress && lvl > shown)
            fprintf(o->progress, "\rexpansion level %d/%d", shown = lvl,
                    g->n);
        if (!take_lone_child(vals, g, v, last, &w))
            eval_node(&vals[v], g, v, vals, ea, mb, neg, &w);
        watch_value(&w, &vals[v], g->ctx, 1);
        if (over(&w))
            rc = w.overflow_var >= 0 ? GS_ERANGE : GS_EBUDGET;
        for (e = g->first[v]; e < g->first[v + 1]; e++) {
            size_t c = g->child[e];
            if (last[c] == v && c != g->root_d && c != g->root_m) {
                watch_value(&w, &vals[c], g->ctx, -1);
                gs_poly_clear(&vals[c]);
                gs_poly_init(&vals[c]);
                last[c] = NOT_FOUND;
            }
        }
    }
    if (o->progress)
        fputc('\n', o->progress);
    st->max_minor_terms = w.big;
    if (rc == GS_ERANGE) {
        report_overflow(d, g->ctx, w.overflow_var, lvl, g->n);
        st->exp_overflow = 1;
    } else if (rc == GS_EBUDGET)
        report_budget(d, &w, lvl, g->n);
    else {
        gs_poly_swap(det_a, &vals[g->root_d]);
        if (g->root_m != SIZE_MAX)
            gs_poly_swap(det_m, &vals[g->root_m]);
        else
            gs_poly_zero(det_m);
    }
    free_values(vals, top + 1);
    gs_free(last);
    gs_free(reach);
    gs_free(ea);
    gs_free(mb);
    gs_free(neg);
    return rc;
}

/* Past GS_MINORS_MAX_UNKNOWNS a column set no longer fits one word: the
   graph of minors, whose column sets take as many words as they need,
   holds the same expansion, and its two roots are expanded instead.  The
   product budget is its edge count. */
static int graph_bordered(gs_poly *det_a, gs_poly *det_m, const gs_mna *m,
                          const gs_polyctx *ctx, const gs_minors_opts *o,
                          gs_minors_stats *st, gs_diag *d)
{
    gs_mgraph g;
    int rc = gs_mgraph_build(&g, m, GS_MGRAPH_ORDER_GREEDY, o->max_bytes,
                             ctx);
    if (rc == GS_EBUDGET)
        gs_mgraph_refused(d, o->max_bytes);
    if (rc == GS_OK) {
        st->minors = g.nnodes;
        st->products = g.nedges;
        st->transposed = g.transposed;
        if (g.root_d == SIZE_MAX)
            rc = GS_ESINGULAR;
        else if (o->max_products && g.nedges > o->max_products)
            rc = GS_ERANGE;
        else
            rc = expand_graph(det_a, det_m, &g, o, st, d);
    }
    if (rc == GS_OK && gs_poly_is_zero(det_a))
        rc = GS_ESINGULAR;
    gs_mgraph_clear(&g);
    return rc;
}

void gs_minors_opts_default(gs_minors_opts *o)
{
    o->max_terms = 0;
    o->max_products = 200000;
    o->max_bytes = 0;
    o->progress = NULL;
}

int gs_minors_bordered(gs_poly *det_a, gs_poly *det_m, const gs_mna *m,
                       const gs_polyctx *ctx, const gs_minors_opts *o,
                       gs_minors_stats *stats, gs_diag *d)
{
    gs_minors_stats local;
    view v[2];
    plan p[2];
    int rc[2], pick, t, n = m->n;
    gs_poly *top = NULL;

    if (stats == NULL)
        stats = &local;
    memset(stats, 0, sizeof *stats);
    if (n < 1)
        return GS_ERANGE;
    if (n > GS_MINORS_MAX_UNKNOWNS)
        return graph_bordered(det_a, det_m, m, ctx, o, stats, d);
    for (t = 0; t < 2; t++) {
        view_init(&v[t], m, t);
        rc[t] = make_plan(&p[t], &v[t], o->max_products);
    }
    if (rc[0] != GS_OK && rc[1] != GS_OK)
        pick = -1;
    else if (rc[0] != GS_OK)
        pick = 1;
    else if (rc[1] != GS_OK)
        pick = 0;
    else
        pick = p[1].products < p[0].products;
    if (pick >= 0) {
        stats->minors = p[pick].minors;
        stats->products = p[pick].products;
        stats->transposed = pick;
        rc[pick] = evaluate(&top, &p[pick], &v[pick], ctx, o, stats, d);
        if (rc[pick] == GS_OK) {
            int bad = assemble(det_a, det_m, &p[pick], &v[pick], top, ctx);
            free_values(top, p[pick].lv[0].count);
            if (bad) {
                report_overflow(d, ctx, bad - 1, n, n);
                stats->exp_overflow = 1;
                rc[pick] = GS_ERANGE;
            } else if (gs_poly_is_zero(det_a))
                rc[pick] = GS_ESINGULAR;
        }
    }
    for (t = 0; t < 2; t++) {
        plan_clear(&p[t], n);
        view_clear(&v[t]);
    }
    return pick < 0 ? GS_ERANGE : rc[pick];
}
