/* elim.c - fraction-free elimination of a bordered MNA matrix.
 * See LICENSE.
 */
#include "analysis/elim.h"
#include "algebra/sym.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

typedef struct elim {
    gs_mna *m;
    const gs_polyctx *ctx;
    int n;                  /* pivots come from rows/cols 0 .. n-1 */
    unsigned char *row_on;  /* n+1 flags: still active */
    unsigned char *col_on;
    int *last;              /* step a row was last brought up to date */
    gs_poly *dets;          /* dets[k] = pivot of step k, dets[0] = 1 */
    int *rowcount, *colcount;
    gs_poly t1, t2;
    int overflow_var;       /* the symbol of a GS_ERANGE, for the message */
    size_t live;            /* storage of the live entries (max_bytes) */
    double work;            /* term pairs x words multiplied so far */
    int over_what;          /* what a GS_EBUDGET exceeded: OVER_... */
    size_t over_size;       /* and the size it reached */
} elim;

enum { OVER_ENTRY, OVER_PRODUCT, OVER_MEMORY, OVER_WORK };

void gs_elim_opts_default(gs_elim_opts *o)
{
    o->max_terms = 0;
    o->max_bytes = 0;
    o->pivot = GS_PIVOT_MINWORK;
    o->progress = NULL;
}

static gs_poly *at(elim *e, int i, int j)
{
    return GS_MNA_AT(e->m, i, j);
}

static void count_nonzeros(elim *e)
{
    int i, j;
    for (i = 0; i <= e->n; i++)
        e->rowcount[i] = e->colcount[i] = 0;
    for (i = 0; i <= e->n; i++) {
        if (!e->row_on[i])
            continue;
        for (j = 0; j <= e->n; j++)
            if (e->col_on[j] && !gs_poly_is_zero(at(e, i, j))) {
                e->rowcount[i]++;
                e->colcount[j]++;
            }
    }
}

/* Terms the products of a step on pivot (r, c) would touch: for every
   row i the pivot column reaches and every column j of the pivot row or
   of row i, |p| |S_ij| + |S_ic| |T_rj|, plus a stale pivot row's
   rescaling.  A size estimate of the work, not of the result. */
static unsigned long long step_work(elim *e, int r, int c, int k)
{
    unsigned long long w = 0, lp = at(e, r, c)->length;
    int i, j;
    if (e->last[r] != k - 1)
        for (j = 0; j <= e->n; j++)
            if (e->col_on[j])
                w += at(e, r, j)->length * e->dets[k - 1].length;
    for (i = 0; i <= e->n; i++) {
        unsigned long long lic;
        if (i == r || !e->row_on[i] || gs_poly_is_zero(at(e, i, c)))
            continue;
        lic = at(e, i, c)->length;
        for (j = 0; j <= e->n; j++) {
            if (j == c || !e->col_on[j])
                continue;
            w += lp * at(e, i, j)->length + lic * at(e, r, j)->length;
        }
    }
    return w;
}

/* Cost of pivoting on (i, j) under the rule; smaller is better.  A stale
   row costs a rescaling first, so it loses ties. */
static void pivot_cost(unsigned long long cost[3], elim *e, int i, int j,
                       int k, gs_pivot_rule rule)
{
    unsigned long long fill = (unsigned long long)(e->rowcount[i] - 1)
                            * (unsigned long long)(e->colcount[j] - 1);
    unsigned long long terms = at(e, i, j)->length;
    unsigned long long stale = e->last[i] != k - 1;
    switch (rule) {
    case GS_PIVOT_MINWORK:
        /* a one-term pivot makes every later division by it a cheap
           monomial division: preferred unless 4 times the work */
        cost[0] = step_work(e, i, j, k) * (terms > 1 ? 4 : 1);
        cost[1] = fill;
        cost[2] = terms;
        break;
    case GS_PIVOT_MINTERMS:
        cost[0] = terms; cost[1] = fill; cost[2] = stale;
        break;
    case GS_PIVOT_NATURAL:
        cost[0] = (unsigned long long)j; cost[1] = (unsigned long long)i;
        cost[2] = 0;
        break;
    default:
        cost[0] = fill; cost[1] = stale; cost[2] = terms;
        break;
    }
}

static int less3(const unsigned long long a[3], const unsigned long long b[3])
{
    if (a[0] != b[0])
        return a[0] < b[0];
    if (a[1] != b[1])
        return a[1] < b[1];
    return a[2] < b[2];
}

static int choose_pivot(int *pr, int *pc, elim *e, int k, gs_pivot_rule rule)
{
    unsigned long long best[3] = {0, 0, 0}, cost[3];
    int i, j, found = 0;
    count_nonzeros(e);
    for (j = 0; j < e->n; j++) {
        if (!e->col_on[j])
            continue;
        for (i = 0; i < e->n; i++) {
            if (!e->row_on[i] || gs_poly_is_zero(at(e, i, j)))
                continue;
            pivot_cost(cost, e, i, j, k, rule);
            if (!found || less3(cost, best)) {
                memcpy(best, cost, sizeof best);
                *pr = i;
                *pc = j;
                found = 1;
            }
        }
    }
    return found;
}

/* r = r * dets[k-1] / dets[last] for every active entry of row r */
static int refresh_row(elim *e, int r, int k)
{
    int j, l = e->last[r];
    if (l == k - 1)
        return GS_OK;
    for (j = 0; j <= e->n; j++) {
        gs_poly *x = at(e, r, j);
        if (!e->col_on[j] || gs_poly_is_zero(x))
            continue;
        if (!gs_poly_mul_fits(&e->overflow_var, x, &e->dets[k - 1], e->ctx))
            return GS_ERANGE;
        gs_poly_mul(x, x, &e->dets[k - 1], e->ctx);
        if (l > 0 && gs_poly_divexact(x, x, &e->dets[l], e->ctx) != GS_OK)
            return GS_EINEXACT;
    }
    e->last[r] = k - 1;
    return GS_OK;
}

/* Row i against pivot row r, pivot column c, at step k. */
/* GS_EBUDGET when the product t1 at hand, before its exact division,
   holds too many terms or would take the storage past the budget. */
static int product_over(elim *e, const gs_elim_opts *o)
{
    size_t extra;
    if (o->max_terms && e->t1.length > o->max_terms * GS_ELIM_PRODUCT_FACTOR) {
        e->over_what = OVER_PRODUCT;
        e->over_size = e->t1.length + 1;
        return GS_EBUDGET;
    }
    if (!o->max_bytes)
        return GS_OK;
    extra = gs_poly_storage(&e->t1, e->ctx) + gs_poly_storage(&e->t2, e->ctx);
    if (e->live + extra > o->max_bytes) {
        e->over_what = OVER_MEMORY;
        e->over_size = e->live + extra;
        return GS_EBUDGET;
    }
    return GS_OK;
}

/* r = a * b, stopped as soon as it holds more terms than a product may
   (the budget is found while the terms are made, not after). */
static int mul_within(elim *e, gs_poly *r, const gs_poly *a, const gs_poly *b,
                      const gs_elim_opts *o)
{
    size_t cap = o->max_terms * GS_ELIM_PRODUCT_FACTOR;
    double limit = (double)o->max_terms * GS_WORK_PER_TERM;
    e->work += (double)a->length * (double)b->length * e->ctx->nwords;
    if (o->max_terms && e->work > limit) {     /* before the work is done */
        e->over_what = OVER_WORK;
        return GS_EBUDGET;
    }
    if (gs_poly_mul_cap(r, a, b, cap, e->ctx) == GS_OK)
        return GS_OK;
    e->over_what = OVER_PRODUCT;
    e->over_size = cap + 1;
    return GS_EBUDGET;
}

static int update_row(elim *e, int i, int r, int c, int k,
                      const gs_elim_opts *o, gs_elim_stats *st)
{
    const gs_poly *p = &e->dets[k];
    gs_poly *sic = at(e, i, c);
    int j, l = e->last[i];
    for (j = 0; j <= e->n; j++) {
        gs_poly *sij = at(e, i, j), *trj = at(e, r, j);
        if (j == c || !e->col_on[j])
            continue;
        if (gs_poly_is_zero(trj) && gs_poly_is_zero(sij))
            continue;
        if (!gs_poly_mul_fits(&e->overflow_var, p, sij, e->ctx)
            || !gs_poly_mul_fits(&e->overflow_var, sic, trj, e->ctx))
            return GS_ERANGE;   /* before the product: no room for a carry */
        if (mul_within(e, &e->t1, p, sij, o) != GS_OK)
            return GS_EBUDGET;
        if (!gs_poly_is_zero(trj)) {
            if (mul_within(e, &e->t2, sic, trj, o) != GS_OK)
                return GS_EBUDGET;
            gs_poly_sub(&e->t1, &e->t1, &e->t2, e->ctx);
        }
        if (product_over(e, o) != GS_OK)
            return GS_EBUDGET;
        if (o->max_bytes)
            e->live -= gs_poly_storage(sij, e->ctx);
        if (l > 0 && !gs_poly_is_const(&e->dets[l], e->ctx)) {
            st->big_divisions++;
            /* the division's work: about a term pair per quotient term
               and divisor term, the quotient no longer than t1 */
            e->work += (double)e->t1.length * (double)e->dets[l].length
                       * e->ctx->nwords;
            if (o->max_terms
                && e->work > (double)o->max_terms * GS_WORK_PER_TERM) {
                e->over_what = OVER_WORK;
                return GS_EBUDGET;
            }
        }
        if (l > 0 && gs_poly_divexact(sij, &e->t1, &e->dets[l], e->ctx)
                         != GS_OK)
            return GS_EINEXACT;     /* cannot happen: Bareiss is exact */
        if (l == 0)
            gs_poly_swap(sij, &e->t1);
        if (o->max_bytes)
            e->live += gs_poly_storage(sij, e->ctx);
        if (sij->length > st->max_entry_terms)
            st->max_entry_terms = sij->length;
        if (o->max_terms && sij->length > o->max_terms) {
            e->over_what = OVER_ENTRY;
            e->over_size = sij->length;
            return GS_EBUDGET;
        }
    }
    gs_poly_zero(sic);
    e->last[i] = k;
    return GS_OK;
}

static void elim_init(elim *e, gs_mna *m, const gs_polyctx *ctx)
{
    int i, n = m->n;
    e->m = m;
    e->ctx = ctx;
    e->n = n;
    e->overflow_var = 0;
    e->live = 0;
    e->work = 0;
    e->over_what = OVER_ENTRY;
    e->over_size = 0;
    e->row_on = gs_malloc((size_t)n + 1);
    e->col_on = gs_malloc((size_t)n + 1);
    memset(e->row_on, 1, (size_t)n + 1);
    memset(e->col_on, 1, (size_t)n + 1);
    e->last = gs_calloc((size_t)n + 1, sizeof *e->last);
    e->rowcount = gs_malloc(((size_t)n + 1) * sizeof *e->rowcount);
    e->colcount = gs_malloc(((size_t)n + 1) * sizeof *e->colcount);
    e->dets = gs_malloc(((size_t)n + 1) * sizeof *e->dets);
    for (i = 0; i <= n; i++)
        gs_poly_init(&e->dets[i]);
    gs_poly_set_si(&e->dets[0], 1, ctx);
    gs_poly_init(&e->t1);
    gs_poly_init(&e->t2);
}

static void elim_clear(elim *e)
{
    int i;
    for (i = 0; i <= e->n; i++)
        gs_poly_clear(&e->dets[i]);
    gs_free(e->dets);
    gs_free(e->row_on);
    gs_free(e->col_on);
    gs_free(e->last);
    gs_free(e->rowcount);
    gs_free(e->colcount);
    gs_poly_clear(&e->t1);
    gs_poly_clear(&e->t2);
}

static void report_singular(const elim *e, gs_diag *d)
{
    char buf[512];
    size_t len = 0;
    int j;
    buf[0] = '\0';
    for (j = 0; j < e->n && len + 40 < sizeof buf; j++) {
        if (!e->col_on[j])
            continue;
        len += (size_t)snprintf(buf + len, sizeof buf - len, "%s%s",
                                len ? ", " : "", e->m->unknown_name[j]);
    }
    gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                "check for a node joined only by current sources or "
                "capacitors to nothing else, or a short across a source",
                "the circuit equations are singular: %s %s not determined",
                buf, strchr(buf, ',') ? "are" : "is");
}

static void report_overflow(const elim *e, int k, gs_diag *d)
{
    gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                "lower the powers in the element values, or bind the "
                "symbol to a number",
                "exponent overflow at elimination step %d of %d: the power "
                "of '%s' would exceed %d", k, e->n,
                gs_symtab_name(e->ctx->syms, e->overflow_var),
                GS_POLY_MAX_EXP);
}

static void report_budget(const elim *e, int k, const gs_elim_opts *o,
                          gs_diag *d)
{
    const char *hint = "raise the budget with --max-terms (0: none), or bind "
                       "some symbols to numbers";
    if (e->over_what == OVER_MEMORY)
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                    "raise it with --max-memory, or try approx, eval or "
                    "bode, which need no expansion",
                    "memory budget exceeded at elimination step %d of %d: "
                    "the entries would take %zu bytes (budget %zu)", k, e->n,
                    e->over_size, o->max_bytes);
    else if (e->over_what == OVER_WORK)
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, hint,
                    "work budget exceeded at elimination step %d of %d: "
                    "the products would multiply %.3g term pairs (budget "
                    "%d x %zu)", k, e->n, e->work, GS_WORK_PER_TERM,
                    o->max_terms);
    else if (e->over_what == OVER_PRODUCT)
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, hint,
                    "term budget exceeded at elimination step %d of %d: a "
                    "product passed %zu terms before its exact division "
                    "(budget %d x %zu)", k, e->n, e->over_size - 1,
                    GS_ELIM_PRODUCT_FACTOR, o->max_terms);
    else
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, hint,
                    "term budget exceeded at elimination step %d of %d: an "
                    "entry reached %zu terms (budget %zu)", k, e->n,
                    e->over_size, o->max_terms);
}

/* The storage of every entry still in play and of the pivots kept. */
static size_t live_storage(const elim *e)
{
    size_t bytes = 0;
    int i, j;
    for (i = 0; i <= e->n; i++) {
        bytes += gs_poly_storage(&e->dets[i], e->ctx);
        if (!e->row_on[i])
            continue;
        for (j = 0; j <= e->n; j++)
            if (e->col_on[j])
                bytes += gs_poly_storage(at((elim *)e, i, j), e->ctx);
    }
    return bytes;
}

static int step(elim *e, int k, const gs_elim_opts *o, gs_elim_stats *st,
                gs_diag *d)
{
    int r = 0, c = 0, i, rc;
    if (!choose_pivot(&r, &c, e, k, o->pivot)) {
        report_singular(e, d);
        return GS_ESINGULAR;
    }
    if ((rc = refresh_row(e, r, k)) != GS_OK) {
        if (rc == GS_ERANGE)
            report_overflow(e, k, d);
        return rc;
    }
    gs_poly_set(&e->dets[k], at(e, r, c), e->ctx);
    e->row_on[r] = 0;
    if (o->max_bytes)
        e->live = live_storage(e);
    for (i = 0; i <= e->n && rc == GS_OK; i++)
        if (e->row_on[i] && !gs_poly_is_zero(at(e, i, c)))
            rc = update_row(e, i, r, c, k, o, st);
    e->col_on[c] = 0;
    if (rc == GS_ERANGE)
        report_overflow(e, k, d);
    if (rc == GS_EBUDGET)
        report_budget(e, k, o, d);
    return rc;
}

int gs_elim_bordered(gs_poly *det_a, gs_poly *det_m, gs_mna *m,
                     const gs_polyctx *ctx, const gs_elim_opts *o,
                     gs_elim_stats *stats, gs_diag *d)
{
    elim e;
    gs_elim_stats local;
    int k, rc = GS_OK, n = m->n;
    gs_poly *corner;

    if (stats == NULL)
        stats = &local;
    memset(stats, 0, sizeof *stats);
    elim_init(&e, m, ctx);
    for (k = 1; k <= n && rc == GS_OK; k++) {
        if (o->progress)
            fprintf(o->progress, "\relimination step %d/%d", k, n);
        rc = step(&e, k, o, stats, d);
        stats->steps = k;
    }
    if (o->progress)
        fputc('\n', o->progress);
    if (rc == GS_OK) {
        corner = at(&e, n, n);
        rc = refresh_row(&e, n, n + 1);
        gs_poly_swap(det_m, corner);     /* no copies: both may be big */
        gs_poly_swap(det_a, &e.dets[n]);
    }
    elim_clear(&e);
    return rc;
}
