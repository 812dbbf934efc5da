/* noise.c - the noise sources of a circuit and the transfers from them.
 * See LICENSE.  The models and their sources are listed in noise.h.
 */
#include "analysis/noise.h"
#include "base/mem.h"
#include "gainsmith.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

void gs_noise_init(gs_noise *n)
{
    memset(n, 0, sizeof *n);
}

void gs_noise_clear(gs_noise *n)
{
    size_t i;
    for (i = 0; i < n->nsrc; i++) {
        gs_free(n->src[i].name);
        gs_free(n->src[i].density);
        gs_free(n->src[i].unit);
    }
    gs_free(n->src);
    gs_free(n->target);
    memset(n, 0, sizeof *n);
}

/* The part name after the device's: "gm" for "M1.gm", or NULL. */
static const char *part_of(const gs_circuit *c, const gs_element *e)
{
    size_t len;
    if (e->device < 0)
        return NULL;
    len = strlen(c->devices[e->device].name);
    if (strncmp(e->name, c->devices[e->device].name, len) != 0
        || e->name[len] != '.')
        return NULL;
    return e->name + len + 1;
}

/* Is the symbol KEY_DEVICE bound by a value line? */
static int has_value_line(const gs_circuit *c, const char *key,
                          const char *dev)
{
    char *name = gs_asprintf("%s_%s", key, dev);
    int sym = gs_symtab_find(c->syms, name);
    gs_free(name);
    return sym >= 0 && gs_circuit_find_value(c, sym) >= 0;
}

static void add_src(gs_noise *n, gs_noise_kind kind, const char *name,
                    int elem, int device, int from, int to, char *density)
{
    gs_noise_src *s;
    n->src = gs_reallocarray(n->src, n->nsrc + 1, sizeof *n->src);
    s = &n->src[n->nsrc++];
    s->kind = kind;
    s->name = gs_strdup(name);
    s->elem = elem;
    s->device = device;
    s->from = from;
    s->to = to;
    s->injector = -1;
    s->density = density;
    s->unit = gs_strdup("A^2/Hz");
}

/* "(x)" when the monomial's text is more than one word, else "x". */
static char *wrapped(const gs_monomial *m, const gs_symtab *st)
{
    char *t = gs_monomial_get_str(m, st), *r;
    if (strpbrk(t, "*/^") == NULL && t[0] != '-')
        return t;
    r = gs_asprintf("(%s)", t);
    gs_free(t);
    return r;
}

static void collect(gs_noise *n, const gs_circuit *c)
{
    size_t k;
    for (k = 0; k < c->nelems; k++) {
        const gs_element *e = &c->elems[k];
        const char *part = part_of(c, e), *dev;
        char *v, *name;
        int ek = (int)k;
        if (e->device >= 0 && part == NULL)
            continue;
        dev = e->device >= 0 ? c->devices[e->device].name : NULL;
        v = wrapped(&e->value, c->syms);
        if (e->kind == GS_RESISTOR
            && (part == NULL || strcmp(part, "rb") == 0)) {
            add_src(n, GS_NZ_RESISTOR, e->name, ek, e->device, e->node[0],
                    e->node[1], gs_asprintf("4*k*T/%s", v));
        } else if (e->kind == GS_CONDUCTANCE && part == NULL) {
            add_src(n, GS_NZ_CONDUCTANCE, e->name, ek, -1, e->node[0],
                    e->node[1], gs_asprintf("4*k*T*%s", v));
        } else if (part && strcmp(part, "gm") == 0
                   && !c->devices[e->device].is_bjt) {
            name = gs_asprintf("%s.channel", dev);
            add_src(n, GS_NZ_CHANNEL, name, ek, e->device, e->node[0],
                    e->node[1], gs_asprintf("4*k*T*nthermal_%s*%s", dev, v));
            gs_free(name);
            if (has_value_line(c, "kf", dev)) {
                name = gs_asprintf("%s.flicker", dev);
                add_src(n, GS_NZ_FLICKER, name, ek, e->device, e->node[0],
                        e->node[1], gs_asprintf("%s^2*kf_%s/(cox_%s*w_%s*"
                                                "l_%s*f)", v, dev, dev, dev,
                                                dev));
                gs_free(name);
            }
        } else if (part && strcmp(part, "gm") == 0) {
            name = gs_asprintf("%s.collector", dev);
            add_src(n, GS_NZ_COLLECTOR, name, ek, e->device, e->node[0],
                    e->node[1], gs_asprintf("2*k*T*%s", v));
            gs_free(name);
        } else if (part && strcmp(part, "rpi") == 0) {
            name = gs_asprintf("%s.base", dev);
            add_src(n, GS_NZ_BASE, name, ek, e->device, e->node[0],
                    e->node[1], gs_asprintf("2*k*T/%s", v));
            gs_free(name);
        }
        gs_free(v);
    }
}

static int add_injector(gs_circuit *c, const gs_noise_src *s)
{
    gs_element *e;
    c->elems = gs_reallocarray(c->elems, c->nelems + 1, sizeof *c->elems);
    e = &c->elems[c->nelems];
    memset(e, 0, sizeof *e);
    e->kind = GS_ISOURCE;
    e->name = gs_asprintf("%s:noise", s->name);
    e->line = c->elems[s->elem].line;
    e->col = c->elems[s->elem].col;
    e->node[0] = s->from;
    e->node[1] = s->to;
    e->node[2] = e->node[3] = -1;
    e->ctrl = -1;
    e->device = -1;
    gs_monomial_init(&e->value);
    return (int)c->nelems++;
}

static void add_transfer(gs_circuit *c, size_t target, const gs_noise_src *s)
{
    gs_output *o, *t;
    c->outputs = gs_reallocarray(c->outputs, c->noutputs + 1,
                                 sizeof *c->outputs);
    t = &c->outputs[target];
    o = &c->outputs[c->noutputs++];
    memset(o, 0, sizeof *o);
    o->kind = GS_OUT_TRANSFER;
    o->name = gs_asprintf("%s:%s", t->name, s->name);
    o->line = t->line;
    o->col = t->col;
    o->out = t->out;
    o->in = s->injector;
    o->a = o->b = -1;
}

int gs_noise_setup(gs_noise *n, gs_circuit *c, const char *only,
                   gs_diag *d)
{
    size_t i, k, nout = c->noutputs;
    size_t *pick = gs_malloc((nout ? nout : 1) * sizeof *pick), npick = 0;

    for (i = 0; i < nout; i++) {
        const gs_output *o = &c->outputs[i];
        if (only ? strcmp(o->name, only) == 0 : o->kind == GS_OUT_TRANSFER)
            pick[npick++] = i;
    }
    if (only && npick == 1 && c->outputs[pick[0]].kind != GS_OUT_TRANSFER) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, c->outputs[pick[0]].line,
                    c->outputs[pick[0]].col, "noise is analysed at the "
                    "output of a transfer line", "'%s' is an impedance, "
                    "not a transfer", only);
        gs_free(pick);
        return GS_EINVAL;
    }
    if (npick == 0) {
        if (only)
            gs_diag_add(d, GS_SEV_ERROR, c->file, 0, 0, NULL,
                        "no transfer named '%s'", only);
        else
            gs_diag_add(d, GS_SEV_ERROR, c->file, 0, 0, "add a line such "
                        "as 'transfer Av = v(out) / vin': noise is found "
                        "at its output and referred to its input",
                        "the file asks for no transfer");
        gs_free(pick);
        return GS_EINVAL;
    }
    collect(n, c);
    if (n->nsrc == 0) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, 0, 0, "resistors, "
                    "conductances, mosfets and bjts make noise; sources "
                    "and ideal controlled sources do not",
                    "the circuit has no noise source");
        gs_free(pick);
        return GS_EINVAL;
    }
    for (k = 0; k < n->nsrc; k++)
        n->src[k].injector = add_injector(c, &n->src[k]);
    n->target = gs_calloc(npick, sizeof *n->target);
    n->ntarget = npick;
    for (i = 0; i < npick; i++) {
        n->target[i].out = pick[i];
        n->target[i].first = c->noutputs;
        for (k = 0; k < n->nsrc; k++)
            add_transfer(c, pick[i], &n->src[k]);
    }
    gs_free(pick);
    return GS_OK;
}

int gs_noise_temperature(long double *t, const gs_circuit *c,
                         const long double *vals, const unsigned char *set,
                         gs_diag *d)
{
    int rc;
    if (c->temperature == NULL) {
        *t = GS_NOISE_DEFAULT_T;
        return GS_OK;
    }
    rc = gs_expr_eval(t, c->temperature, c, vals, set, d);
    if (rc == GS_OK && !(*t > 0 && isfinite(*t))) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, c->temp_line, c->temp_col,
                    "a temperature is in kelvin, above 0",
                    "the temperature is %Lg K", *t);
        rc = GS_EINVAL;
    }
    return rc == GS_OK ? GS_OK : GS_EINVAL;
}

static int mono_value(long double *v, const gs_monomial *m,
                      const gs_circuit *c, const long double *vals,
                      const unsigned char *set, const gs_element *e,
                      gs_diag *d)
{
    int i;
    *v = gs_rat_get_ld(&m->coeff);
    for (i = 0; i < m->n; i++) {
        if (!set[m->sym[i]]) {
            gs_diag_add(d, GS_SEV_ERROR, c->file, e->line, e->col,
                        "bind it with a value line or --set",
                        "the noise of '%s' needs a value for '%s'", e->name,
                        gs_symtab_name(c->syms, m->sym[i]));
            return GS_EUNBOUND;
        }
        *v *= powl(vals[m->sym[i]], (long double)m->exp[i]);
    }
    return GS_OK;
}

/* The value of KEY_DEVICE, or dflt when it has none (dflt < 0: needed). */
static int param(long double *v, const char *key, const gs_noise_src *s,
                 const gs_circuit *c, const long double *vals,
                 const unsigned char *set, long double dflt, gs_diag *d)
{
    const gs_device *dv = &c->devices[s->device];
    char *name = gs_asprintf("%s_%s", key, dv->name);
    int sym = gs_symtab_find(c->syms, name), rc = GS_OK;
    if (sym >= 0 && set[sym])
        *v = vals[sym];
    else if (dflt >= 0)
        *v = dflt;
    else {
        gs_diag_add(d, GS_SEV_ERROR, c->file, dv->line, dv->col,
                    "flicker noise needs kf, cox, w and l of the device",
                    "the flicker noise of '%s' needs a value for '%s'",
                    dv->name, name);
        rc = GS_EUNBOUND;
    }
    /* every one of them is a positive physical figure; a zero or
       negative one would give a density below zero */
    if (rc == GS_OK && !(*v > 0 && isfinite(*v))) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, dv->line, dv->col,
                    "the noise parameters nthermal, kf, cox, w and l are "
                    "positive figures (docs/noise.md)",
                    "the noise of '%s' needs '%s' above 0, got %Lg",
                    dv->name, name, *v);
        rc = GS_ERANGE;
    }
    gs_free(name);
    return rc;
}

int gs_noise_density(long double *white, long double *flicker,
                     const gs_noise_src *s, const gs_circuit *c,
                     const long double *vals, const unsigned char *set,
                     long double t, gs_diag *d)
{
    const gs_element *e = &c->elems[s->elem];
    long double v, g, kf, cox, w, l, kt = GS_BOLTZMANN * t;
    int rc = mono_value(&v, &e->value, c, vals, set, e, d);
    *white = *flicker = 0;
    if (rc != GS_OK)
        return rc;
    switch (s->kind) {
    case GS_NZ_RESISTOR:
        *white = 4 * kt / v;
        break;
    case GS_NZ_CONDUCTANCE:
        *white = 4 * kt * v;
        break;
    case GS_NZ_CHANNEL:
        rc = param(&g, "nthermal", s, c, vals, set, 2.0L / 3.0L, d);
        *white = 4 * kt * g * v;
        break;
    case GS_NZ_FLICKER:
        rc = param(&kf, "kf", s, c, vals, set, -1, d);
        if (rc == GS_OK)
            rc = param(&cox, "cox", s, c, vals, set, -1, d);
        if (rc == GS_OK)
            rc = param(&w, "w", s, c, vals, set, -1, d);
        if (rc == GS_OK)
            rc = param(&l, "l", s, c, vals, set, -1, d);
        if (rc == GS_OK)
            *flicker = v * v * kf / (cox * w * l);
        break;
    case GS_NZ_COLLECTOR:
        *white = 2 * kt * v;        /* 2q IC with IC = gm kT/q */
        break;
    case GS_NZ_BASE:
        *white = 2 * kt / v;        /* 2q IB with IB = kT/(q rpi) */
        break;
    }
    return rc;
}

/* ---- numbers ---- */

static const gs_tf *tf_of(const gs_job *j, size_t out)
{
    size_t i;
    for (i = 0; i < j->ntf; i++)
        if (j->out_index[i] == out)
            return &j->tf[i];
    return NULL;
}

static void coeffs(gs_noise_num *nn, const gs_job *j, const gs_tf *tf,
                   gs_noise_term *t)
{
    long double *cn = gs_job_coeffs(j, &tf->num, &t->dn);
    long double *cd = gs_job_coeffs(j, &tf->den, &t->dd);
    nn->coef = gs_reallocarray(nn->coef, nn->ncoef + 2, sizeof *nn->coef);
    nn->coef[nn->ncoef++] = cn;
    nn->coef[nn->ncoef++] = cd;
    t->num = cn;
    t->den = cd;
}

int gs_noise_num_make(gs_noise_num *nn, const gs_noise *n, const gs_job *j,
                      gs_diag *d)
{
    size_t i, k;
    long double *white, *flick;
    int rc;
    memset(nn, 0, sizeof *nn);
    rc = gs_noise_temperature(&nn->t, j->c, j->vals, j->set, d);
    if (rc != GS_OK)
        return rc;
    nn->nsrc = n->nsrc;
    nn->ntarget = n->ntarget;
    white = gs_calloc(n->nsrc, sizeof *white);
    flick = gs_calloc(n->nsrc, sizeof *flick);
    for (k = 0; k < n->nsrc; k++) {
        int r = gs_noise_density(&white[k], &flick[k], &n->src[k], j->c,
                                 j->vals, j->set, nn->t, d);
        if (r != GS_OK)
            rc = r;
    }
    nn->term = gs_calloc(n->ntarget * n->nsrc, sizeof *nn->term);
    nn->in = gs_calloc(n->ntarget, sizeof *nn->in);
    for (i = 0; i < n->ntarget && rc == GS_OK; i++) {
        const gs_tf *tf = tf_of(j, n->target[i].out);
        if (tf == NULL) {
            rc = GS_EINVAL;
            break;
        }
        coeffs(nn, j, tf, &nn->in[i]);
        nn->in[i].white = 1;
        for (k = 0; k < n->nsrc; k++) {
            gs_noise_term *t = &nn->term[i * n->nsrc + k];
            tf = tf_of(j, n->target[i].first + k);
            if (tf == NULL) {
                rc = GS_EINVAL;
                break;
            }
            coeffs(nn, j, tf, t);
            t->white = white[k];
            t->flicker = flick[k];
        }
    }
    gs_free(white);
    gs_free(flick);
    return rc;
}

void gs_noise_num_clear(gs_noise_num *nn)
{
    size_t i;
    for (i = 0; i < nn->ncoef; i++)
        gs_free(nn->coef[i]);
    gs_free(nn->coef);
    gs_free(nn->term);
    gs_free(nn->in);
    memset(nn, 0, sizeof *nn);
}

long double gs_noise_out_psd(const gs_noise_num *nn, size_t i, long double f,
                             long double *part)
{
    long double sum = 0, v;
    size_t k;
    for (k = 0; k < nn->nsrc; k++) {
        v = gs_spectrum_term(&nn->term[i * nn->nsrc + k], f);
        if (part)
            part[k] = v;
        sum += v;
    }
    return sum;
}

long double gs_noise_in_psd(const gs_noise_num *nn, size_t i, long double f)
{
    return gs_noise_out_psd(nn, i, f, NULL)
         / gs_spectrum_term(&nn->in[i], f);
}

typedef struct band_arg {
    const gs_noise_num *nn;
    size_t i;
    const gs_noise_term *t;     /* one term, or NULL for the input */
} band_arg;

static long double term_fn(const void *arg, long double f)
{
    const band_arg *a = arg;
    return gs_spectrum_term(a->t, f);
}

static long double in_fn(const void *arg, long double f)
{
    const band_arg *a = arg;
    return gs_noise_in_psd(a->nn, a->i, f);
}

void gs_noise_band(long double *out, long double *in, long double *part,
                   const gs_noise_num *nn, size_t i, long double f1,
                   long double f2)
{
    band_arg a;
    long double sum = 0, v;
    size_t k;
    a.nn = nn;
    a.i = i;
    for (k = 0; k < nn->nsrc; k++) {
        a.t = &nn->term[i * nn->nsrc + k];
        v = gs_spectrum_integrate(term_fn, &a, f1, f2, 1e-13L);
        if (part)
            part[k] = v;
        sum += v;
    }
    *out = sum;
    a.t = NULL;
    *in = gs_spectrum_integrate(in_fn, &a, f1, f2, 1e-13L);
}

const char *gs_noise_unit(const gs_circuit *c, size_t out, int input)
{
    if (input)
        return c->elems[c->outputs[out].in].kind == GS_ISOURCE ? "A" : "V";
    return c->outputs[out].out.kind == GS_PROBE_I ? "A" : "V";
}

/* qsort's comparison sees only the indices; the values ride along. */
typedef struct ranked_entry {
    size_t k;
    long double v;
} ranked_entry;

static int by_size(const void *a, const void *b)
{
    const ranked_entry *x = a, *y = b;
    if (x->v != y->v)
        return x->v < y->v ? 1 : -1;
    return x->k < y->k ? -1 : x->k > y->k;
}

size_t *gs_noise_ranked(const long double *part, size_t n)
{
    ranked_entry *e = gs_calloc(n ? n : 1, sizeof *e);
    size_t *r = gs_calloc(n ? n : 1, sizeof *r), k;
    for (k = 0; k < n; k++) {
        e[k].k = k;
        e[k].v = part[k];
    }
    qsort(e, n, sizeof *e, by_size);
    for (k = 0; k < n; k++)
        r[k] = e[k].k;
    gs_free(e);
    return r;
}
