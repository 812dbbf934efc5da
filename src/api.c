/* api.c - the public interface of include/gainsmith.h. See LICENSE.
 *
 * A gs_result is a gs_job after derivation plus what the accessors hand
 * out: the numbers of the circuit's value lines, bound once at the end of
 * the derivation, and the structural views of N and D, each made on its
 * first request (for a large result about 60 % of the derivation's time:
 * tests/bench/bench_api.c).  A view is published with one atomic
 * compare-and-swap: a thread that loses the race frees its own copy and
 * takes the winner's, so several threads may read one result at once
 * without a lock, and what a caller was given never changes.
 */
#include "gainsmith.h"
#include "analysis/job.h"
#include "base/mem.h"
#include "base/strbuf.h"

#include <stdatomic.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* N or D of one output, grouped by powers of s, with the storage its
   const pointers point into. */
typedef struct view {
    gs_polynomial poly;
    gs_coeff *coeffs;
    gs_term *terms;
    const char **syms;      /* all terms' symbol names, one block */
    unsigned *exps;         /* all terms' exponents, one block */
    char *digits;           /* every term's coefficient, NUL after each */
    size_t nterms;
} view;

struct gs_result {
    gs_job job;
    _Atomic(view *) *views; /* 2 per output: N, D; NULL until asked for */
    int **syms;             /* per output: its symbols other than s */
    size_t *nsyms;
    int bind_rc;            /* how binding the file's numbers went */
    char *bind_messages;    /* its messages when bind_rc is not GS_OK */
};

static const char one[] = "1";

const char *gs_version(void)
{
    return GS_VERSION;
}

void gs_options_init(gs_options *o)
{
    if (o == NULL)
        return;
    memset(o, 0, sizeof *o);
    o->only = NULL;
    o->limits = NULL;
    o->method = GS_METHOD_AUTO;
    o->max_terms = GS_DEFAULT_MAX_TERMS;
    o->max_bytes = GS_DEFAULT_MAX_BYTES;
}

/* A stream into memory whose stream and buffer are dropped if the call
   runs out of memory while it is open; a block of its own, since the
   drop runs after the frames that opened it are gone. */
typedef struct memtext {
    FILE *f;
    char *buf;
    size_t len;
    int closed;
    gs_mem_cleanup *drop;
} memtext;

static void memtext_drop(void *arg)
{
    memtext *m = arg;
    if (!m->closed)
        fclose(m->f);
    gs_free(m->buf);       /* libc's, not a gs_ block */
}

static memtext *memtext_open(void)
{
    memtext *m = gs_calloc(1, sizeof *m);
    m->f = open_memstream(&m->buf, &m->len);
    if (m->f == NULL)
        gs_mem_exhausted(0);
    m->drop = gs_mem_defer(memtext_drop, m);
    return m;
}

/* The text written, as a block of the call's own (so that a failure
   later in the call frees it too). */
static char *memtext_close(memtext *m)
{
    char *text;
    fclose(m->f);
    m->closed = 1;      /* the buffer is still dropped if the copy fails */
    text = gs_strndup(m->buf ? m->buf : "", m->len);
    gs_mem_undefer(m->drop);
    gs_free(m->buf);
    gs_free(m);
    return text;
}

/* Diagnostics as one string, or NULL when there are none. */
static char *diag_text(const gs_diag *d)
{
    memtext *m;
    if (d->n == 0)
        return NULL;
    m = memtext_open();
    gs_diag_print(m->f, d);
    return memtext_close(m);
}

/* What a call that ran out of memory says, in memory of the caller's;
   NULL if even that cannot be had. */
static char *nomem_text(size_t bytes)
{
    const char *fmt = "error: out of memory (asked for %zu bytes); the call "
                      "freed what it had allocated\n";
    int n = snprintf(NULL, 0, fmt, bytes);
    char *p = n > 0 ? malloc((size_t)n + 1) : NULL;
    if (p != NULL)
        snprintf(p, (size_t)n + 1, fmt, bytes);
    return p;
}

static void view_clear(view *v)
{
    gs_free(v->digits);
    gs_free(v->syms);
    gs_free(v->exps);
    gs_free(v->terms);
    gs_free(v->coeffs);
}

/* Term k's coefficient in decimal, appended with its NUL to b; a
   machine-word value without an allocation of its own. */
static void add_digits(gs_strbuf *b, const gs_int *c)
{
    if (gs_int_is_small(c)) {
        int64_t x = gs_int_get_si(c);
        if (x < 0)
            gs_strbuf_add(b, "-");
        /* |x| <= INT64_MAX for a small value (int.h) */
        gs_strbuf_add_u64(b, x < 0 ? (uint64_t)-x : (uint64_t)x);
    } else {
        char *t = gs_int_get_str(c);
        gs_strbuf_add(b, t);
        gs_free(t);
    }
    gs_strbuf_addn(b, "", 1);
}

/* v = p grouped by powers of s: the terms of each power keep the
   canonical order, and each term's symbols are those of nonzero
   exponent other than s, in symbol order.  The coefficients' digits go
   into one block, each term's factors come straight from the packed
   words (gs_poly_term_factors): a view of a 75,000-term result took
   0.039 s with a string and a full unpacking a term. */
static void view_make(view *v, const gs_poly *p, const gs_job *j)
{
    const gs_polyctx *ctx = j->ctx;
    int s = j->c->s_sym, nv = ctx->nvars, f, nfac;
    long deg = gs_poly_degree(p, s, ctx), pw;
    size_t n = p->length, k, nf = 0, *count, *start, *at, nc = 0;
    int *vars = gs_malloc(((size_t)nv + 1) * sizeof *vars);
    unsigned *ex = gs_malloc(((size_t)nv + 1) * sizeof *ex);
    gs_strbuf digits;
    memset(v, 0, sizeof *v);
    v->nterms = n;
    v->poly.degree = deg;
    count = gs_calloc((size_t)(deg + 1 > 0 ? deg + 1 : 1), sizeof *count);
    start = gs_calloc((size_t)(deg + 2 > 0 ? deg + 2 : 1), sizeof *start);
    at = gs_malloc((n ? n : 1) * sizeof *at);
    gs_strbuf_init(&digits);
    for (k = 0; k < n; k++) {
        count[gs_poly_exp_get(p->exps + k * (size_t)ctx->nwords, s)]++;
        nf += (size_t)gs_poly_term_factors(vars, ex, p, k, s, ctx);
        at[k] = digits.n;
        add_digits(&digits, &p->coeffs[k]);
    }
    for (pw = 0; pw <= deg; pw++) {
        start[pw + 1] = start[pw] + count[pw];
        nc += count[pw] != 0;
    }
    v->coeffs = gs_calloc(nc, sizeof *v->coeffs);
    v->terms = gs_calloc(n, sizeof *v->terms);
    v->syms = gs_calloc(nf, sizeof *v->syms);
    v->exps = gs_calloc(nf, sizeof *v->exps);
    v->digits = digits.p;       /* taken: it moves no more */
    nc = 0;
    for (pw = 0; pw <= deg; pw++) {
        if (count[pw] == 0)
            continue;
        v->coeffs[nc].power = (unsigned)pw;
        v->coeffs[nc].nterms = count[pw];
        v->coeffs[nc].terms = v->terms + start[pw];
        nc++;
    }
    nf = 0;
    for (k = 0; k < n; k++) {
        unsigned ps = gs_poly_exp_get(p->exps + k * (size_t)ctx->nwords, s);
        gs_term *t = &v->terms[start[ps]++];
        t->num = v->digits + at[k];
        t->den = one;
        t->symbols = v->syms + nf;
        t->exps = v->exps + nf;
        nfac = gs_poly_term_factors(vars, ex, p, k, s, ctx);
        for (f = 0; f < nfac; f++) {
            v->syms[nf] = gs_symtab_name(j->c->syms, vars[f]);
            v->exps[nf++] = ex[f];
        }
        t->nfactors = (size_t)nfac;
    }
    v->poly.ncoeffs = nc;
    v->poly.coeffs = v->coeffs;
    gs_free(at);
    gs_free(start);
    gs_free(count);
    gs_free(vars);
    gs_free(ex);
}

/* The options in the engine's terms; the limits' symbols looked up. */
static int engine_opts(gs_derive_opts *o, gs_limit **limits,
                       const gs_options *opts, const gs_job *j, gs_diag *d)
{
    size_t i;
    gs_derive_opts_default(o);
    *limits = NULL;
    if (opts == NULL)
        return GS_OK;
    o->elim.max_terms = opts->max_terms;
    o->elim.max_bytes = opts->max_bytes;
    o->terms_given = opts->max_terms != GS_DEFAULT_MAX_TERMS;
    switch (opts->method) {
    case GS_METHOD_AUTO:
        o->method = GS_DET_AUTO;
        break;
    case GS_METHOD_MINORS:
        o->method = GS_DET_MINORS;
        break;
    case GS_METHOD_BAREISS:
        o->method = GS_DET_BAREISS;
        break;
    default:
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0,
                    "use GS_METHOD_AUTO, GS_METHOD_MINORS or "
                    "GS_METHOD_BAREISS", "options: no method %d",
                    (int)opts->method);
        return GS_EINVAL;
    }
    if (opts->nlimits == 0)
        return GS_OK;
    if (opts->limits == NULL) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "options: nlimits is %zu but limits is NULL",
                    opts->nlimits);
        return GS_EINVAL;
    }
    *limits = gs_calloc(opts->nlimits, sizeof **limits);
    for (i = 0; i < opts->nlimits; i++) {
        const char *name = opts->limits[i].symbol;
        int sym = name ? gs_symtab_find(j->c->syms, name) : -1;
        if (sym < 0 || gs_symtab_is_recip(j->c->syms, sym)) {
            gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                        "limit: the circuit has no symbol '%s'",
                        name ? name : "(null)");
            return GS_EINVAL;
        }
        (*limits)[i].sym = sym;
        (*limits)[i].to_inf = opts->limits[i].to_infinity != 0;
    }
    o->limits = *limits;
    o->nlimits = opts->nlimits;
    return GS_OK;
}

/* The symbols of output i other than s, in symbol order. */
static void find_symbols(gs_result *r, size_t i)
{
    const gs_job *j = &r->job;
    int nv = j->ctx->nvars, v;
    unsigned char *used = gs_calloc((size_t)nv, 1);
    unsigned char *tmp = gs_calloc((size_t)nv, 1);
    gs_poly_used_vars(used, &j->tf[i].num, j->ctx);
    gs_poly_used_vars(tmp, &j->tf[i].den, j->ctx);
    r->syms[i] = gs_calloc((size_t)nv, sizeof **r->syms);
    for (v = 0; v < nv; v++)
        if ((used[v] | tmp[v]) && v != j->c->s_sym)
            r->syms[i][r->nsyms[i]++] = v;
    gs_free(tmp);
    gs_free(used);
}

/* What the accessors read, made once at the end of the derivation. */
static void finish_result(gs_result *r)
{
    size_t i;
    gs_diag d;
    r->syms = gs_calloc(r->job.ntf, sizeof *r->syms);
    r->nsyms = gs_calloc(r->job.ntf, sizeof *r->nsyms);
    for (i = 0; i < r->job.ntf; i++)
        find_symbols(r, i);
    r->views = gs_calloc(2 * r->job.ntf, sizeof *r->views);
    for (i = 0; i < 2 * r->job.ntf; i++)
        atomic_init(&r->views[i], NULL);
    /* The file's numbers; a symbol without one is reported by
       gs_result_eval only if the output evaluated uses it. */
    gs_diag_init(&d);
    r->bind_rc = gs_job_bind(&r->job, NULL, 0, &d);
    if (r->bind_rc != GS_OK && r->bind_rc != GS_EUNBOUND)
        r->bind_messages = diag_text(&d);
    gs_diag_clear(&d);
}

/* One derivation's arguments and what it hands back. */
typedef struct derive_call {
    const char *path, *text, *name;
    const gs_options *opts;
    gs_result *result;      /* on GS_OK */
    char *messages;         /* the diagnostics, or NULL */
} derive_call;

/* Load (from path or from text), derive, finish; run under a guard, so
   nothing is published until the end. */
static int derive_guarded(void *arg)
{
    derive_call *call = arg;
    gs_result *r;
    gs_derive_opts o;
    gs_limit *limits = NULL;
    gs_diag d;
    int rc;
    r = gs_calloc(1, sizeof *r);
    gs_diag_init(&d);
    gs_job_init(&r->job);
    if (call->path)
        rc = gs_job_load(&r->job, call->path, &d);
    else
        rc = gs_job_load_string(&r->job, call->name ? call->name
                                                    : "<string>",
                                call->text, &d);
    if (rc == GS_OK)
        rc = engine_opts(&o, &limits, call->opts, &r->job, &d);
    if (rc == GS_OK)
        rc = gs_job_derive(&r->job, call->opts ? call->opts->only : NULL,
                           &o, &d);
    gs_free(limits);
    if (rc == GS_OK)
        finish_result(r);
    call->messages = diag_text(&d);
    gs_diag_clear(&d);
    if (rc != GS_OK)
        gs_result_free(r);
    else
        call->result = r;
    return rc;
}

static int derive(gs_result **out, const char *path, const char *text,
                  const char *name, const gs_options *opts,
                  char **messages)
{
    derive_call call = {path, text, name, opts, NULL, NULL};
    size_t failed = 0;
    int rc;
    if (messages)
        *messages = NULL;
    if (out == NULL)
        return GS_EINVAL;
    *out = NULL;
    if (path == NULL && text == NULL)
        return GS_EINVAL;
    rc = gs_mem_run(derive_guarded, &call, opts ? opts->alloc_hook : NULL,
                    opts ? opts->alloc_hook_arg : NULL, &failed);
    if (rc == GS_ENOMEM) {
        if (messages)
            *messages = nomem_text(failed);
        return rc;
    }
    if (messages)
        *messages = call.messages;
    else
        gs_free(call.messages);
    *out = call.result;
    return rc;
}

int gs_derive_file(gs_result **out, const char *path, const char *only,
                   char **messages)
{
    gs_options o;
    gs_options_init(&o);
    o.only = only;
    return derive(out, path, NULL, NULL, &o, messages);
}

int gs_derive_file_opts(gs_result **out, const char *path,
                        const gs_options *opts, char **messages)
{
    if (path == NULL) {
        if (messages)
            *messages = NULL;
        if (out)
            *out = NULL;
        return GS_EINVAL;
    }
    return derive(out, path, NULL, NULL, opts, messages);
}

int gs_derive_string(gs_result **out, const char *text, const char *name,
                     const gs_options *opts, char **messages)
{
    if (text == NULL) {
        if (messages)
            *messages = NULL;
        if (out)
            *out = NULL;
        return GS_EINVAL;
    }
    return derive(out, NULL, text, name, opts, messages);
}

static int in_range(const gs_result *r, size_t i)
{
    return r != NULL && i < r->job.ntf;
}

size_t gs_result_count(const gs_result *r)
{
    return r ? r->job.ntf : 0;
}

const char *gs_result_name(const gs_result *r, size_t i)
{
    return in_range(r, i) ? gs_tf_name(&r->job.tf[i]) : NULL;
}

/* A call on a result that makes one thing, and its arguments. */
typedef struct result_call {
    const gs_result *r;
    size_t i;
    int part;
    void *made;
} result_call;

static int text_guarded(void *arg)
{
    result_call *call = arg;
    const gs_job *j = &call->r->job;
    call->made = gs_tf_get_str(&j->tf[call->i], j->c->s_sym);
    return GS_OK;
}

static int json_guarded(void *arg)
{
    result_call *call = arg;
    const gs_job *j = &call->r->job;
    memtext *m = memtext_open();
    gs_print_json(m->f, &j->tf[call->i], j->c->s_sym);
    call->made = memtext_close(m);
    return GS_OK;
}

/* call->made = the view, made and published unless another thread was
   first; publishing is the last step, so a failure before it leaves the
   result as it was. */
static int view_guarded(void *arg)
{
    result_call *call = arg;
    const gs_result *r = call->r;
    _Atomic(view *) *slot = &r->views[2 * call->i + (size_t)call->part];
    view *v = atomic_load(slot), *expected = NULL;
    if (v == NULL) {
        v = gs_malloc(sizeof *v);
        view_make(v, call->part == GS_NUMERATOR ? &r->job.tf[call->i].num
                                                : &r->job.tf[call->i].den,
                  &r->job);
        if (!atomic_compare_exchange_strong(slot, &expected, v)) {
            view_clear(v);      /* another thread was first */
            gs_free(v);
            v = expected;
        }
    }
    call->made = v;
    return GS_OK;
}

/* fn on output i of r under a guard: what it made, or NULL. */
static void *result_run(int (*fn)(void *), const gs_result *r, size_t i,
                        int part)
{
    result_call call = {r, i, part, NULL};
    if (gs_mem_run(fn, &call, NULL, NULL, NULL) != GS_OK)
        return NULL;
    return call.made;
}

char *gs_result_text(const gs_result *r, size_t i)
{
    if (!in_range(r, i))
        return NULL;
    return result_run(text_guarded, r, i, 0);
}

char *gs_result_json(const gs_result *r, size_t i)
{
    if (!in_range(r, i))
        return NULL;
    return result_run(json_guarded, r, i, 0);
}

const gs_polynomial *gs_result_poly(const gs_result *r, size_t i, int part)
{
    view *v;
    if (!in_range(r, i) || (part != GS_NUMERATOR && part != GS_DENOMINATOR))
        return NULL;
    v = result_run(view_guarded, r, i, part);
    return v ? &v->poly : NULL;
}

size_t gs_result_nsymbols(const gs_result *r, size_t i)
{
    return in_range(r, i) ? r->nsyms[i] : 0;
}

const char *gs_result_symbol(const gs_result *r, size_t i, size_t k)
{
    if (!in_range(r, i) || k >= r->nsyms[i])
        return NULL;
    return gs_symtab_name(r->job.c->syms, r->syms[i][k]);
}

int gs_result_value(double *value, const gs_result *r, const char *symbol)
{
    int sym;
    if (value == NULL || r == NULL || symbol == NULL)
        return GS_EINVAL;
    sym = gs_symtab_find(r->job.c->syms, symbol);
    if (sym < 0 || sym == r->job.c->s_sym
        || gs_symtab_is_recip(r->job.c->syms, sym))
        return GS_EINVAL;
    if (r->job.set == NULL || !r->job.set[sym])
        return GS_EUNBOUND;
    *value = (double)r->job.vals[sym];
    return GS_OK;
}

/* Symbols of output i other than s without a number in set[]: one error
   naming them all.  GS_OK or GS_EUNBOUND. */
static int check_unbound(const gs_result *r, size_t i,
                         const unsigned char *set, gs_diag *d)
{
    const gs_job *j = &r->job;
    size_t nmissing = 0, k;
    char *list = gs_strdup(""), *next;
    for (k = 0; k < r->nsyms[i]; k++) {
        int v = r->syms[i][k];
        if (set[v])
            continue;
        next = gs_asprintf("%s%s%s", list, nmissing ? ", " : "",
                           gs_symtab_name(j->c->syms, v));
        gs_free(list);
        list = next;
        nmissing++;
    }
    if (nmissing)
        gs_diag_add(d, GS_SEV_ERROR, j->c->file, 0, 0,
                    "add 'value NAME = ...' lines to the circuit, or pass "
                    "NAME and its value to gs_result_eval",
                    "no value for %s %s", nmissing > 1 ? "symbols" : "symbol",
                    list);
    gs_free(list);
    return nmissing ? GS_EUNBOUND : GS_OK;
}

/* vals/set: the file's numbers with the overrides on top. */
static int apply_overrides(long double *vals, unsigned char *set,
                           const gs_result *r, const char *const *names,
                           const double *values, size_t nbind, gs_diag *d)
{
    const gs_job *j = &r->job;
    size_t k;
    if (nbind && (names == NULL || values == NULL)) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "gs_result_eval: nbind is %zu but names or values is "
                    "NULL", nbind);
        return GS_EINVAL;
    }
    for (k = 0; k < nbind; k++) {
        int sym = names[k] ? gs_symtab_find(j->c->syms, names[k]) : -1;
        if (sym < 0 || sym == j->c->s_sym
            || gs_symtab_is_recip(j->c->syms, sym)) {
            gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                        "gs_result_eval: the circuit has no symbol '%s'",
                        names[k] ? names[k] : "(null)");
            return GS_EINVAL;
        }
        vals[sym] = values[k];
        set[sym] = 1;
    }
    return GS_OK;
}

/* H(s) once every symbol has a number. */
static int eval_at(double *re, double *im, const gs_result *r, size_t i,
                   const long double *vals, long double complex s,
                   gs_diag *d)
{
    const gs_job *j = &r->job;
    int nv = j->ctx->nvars, v;
    long double complex *cv = gs_calloc((size_t)nv, sizeof *cv);
    long double complex n, den, h;
    for (v = 0; v < nv; v++)
        cv[v] = vals[v];
    cv[j->c->s_sym] = s;
    n = gs_poly_eval_lc(&j->tf[i].num, cv, j->ctx);
    den = gs_poly_eval_lc(&j->tf[i].den, cv, j->ctx);
    gs_free(cv);
    if (den == 0) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "%s: the denominator is zero at s = %Lg%+Lgj",
                    gs_tf_name(&j->tf[i]), creall(s), cimagl(s));
        return GS_EDIVZERO;
    }
    h = n / den;
    *re = (double)creall(h);
    *im = (double)cimagl(h);
    return GS_OK;
}

typedef struct eval_call {
    const gs_result *r;
    size_t i;
    long double complex s;
    const char *const *names;
    const double *values;
    size_t nbind;
    int want_messages;
    double re, im;
    char *messages;
} eval_call;

static int eval_guarded(void *arg)
{
    eval_call *call = arg;
    const gs_result *r = call->r;
    size_t nv = (size_t)r->job.ctx->nvars;
    long double *vals = gs_calloc(nv, sizeof *vals);
    unsigned char *set = gs_calloc(nv, 1);
    gs_diag d;
    int rc;
    memcpy(vals, r->job.vals, nv * sizeof *vals);
    memcpy(set, r->job.set, nv);
    gs_diag_init(&d);
    rc = apply_overrides(vals, set, r, call->names, call->values,
                         call->nbind, &d);
    if (rc == GS_OK)
        rc = check_unbound(r, call->i, set, &d);
    if (rc == GS_OK)
        rc = eval_at(&call->re, &call->im, r, call->i, vals, call->s, &d);
    if (call->want_messages)
        call->messages = diag_text(&d);
    gs_diag_clear(&d);
    gs_free(set);
    gs_free(vals);
    return rc;
}

int gs_result_eval(double *re, double *im, const gs_result *r, size_t i,
                   double s_re, double s_im, const char *const *names,
                   const double *values, size_t nbind, char **messages)
{
    eval_call call;
    size_t failed = 0;
    int rc;
    if (messages)
        *messages = NULL;
    if (re == NULL || im == NULL || !in_range(r, i))
        return GS_EINVAL;
    if (r->bind_rc != GS_OK && r->bind_rc != GS_EUNBOUND) {
        if (messages && r->bind_messages) {
            *messages = strdup(r->bind_messages);
            if (*messages == NULL)
                return GS_ENOMEM;
        }
        return r->bind_rc;
    }
    memset(&call, 0, sizeof call);
    call.r = r;
    call.i = i;
    call.s = (long double)s_re + (long double)s_im * I;
    call.names = names;
    call.values = values;
    call.nbind = nbind;
    call.want_messages = messages != NULL;
    rc = gs_mem_run(eval_guarded, &call, NULL, NULL, &failed);
    if (rc == GS_ENOMEM) {
        if (messages)
            *messages = nomem_text(failed);
        return rc;
    }
    if (messages)
        *messages = call.messages;
    if (rc == GS_OK) {
        *re = call.re;
        *im = call.im;
    }
    return rc;
}

void gs_result_free(gs_result *r)
{
    size_t i;
    if (r == NULL)
        return;
    if (r->views)
        for (i = 0; i < 2 * r->job.ntf; i++) {
            view *v = atomic_load(&r->views[i]);
            if (v) {
                view_clear(v);
                gs_free(v);
            }
        }
    gs_free((void *)r->views);
    if (r->syms)
        for (i = 0; i < r->job.ntf; i++)
            gs_free(r->syms[i]);
    gs_free(r->syms);
    gs_free(r->nsyms);
    gs_free(r->bind_messages);
    gs_job_clear(&r->job);
    gs_free(r);
}
