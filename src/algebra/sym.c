/* sym.c - interned symbols. See LICENSE. */
#include "algebra/sym.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

typedef struct symbol {
    char *name;
    int base;       /* reciprocal: id of the base; else -1 */
    int recip;      /* id of this symbol's reciprocal, or -1 if none yet */
} symbol;

struct gs_symtab {
    symbol *v;
    int n, alloc;
    int *slots;     /* open-addressing hash of ids, -1 empty */
    size_t nslots;  /* power of two */
};

static size_t hash_name(const char *s)
{
    size_t h = 1469598103934665603u;  /* FNV-1a */
    while (*s)
        h = (h ^ (unsigned char)*s++) * 1099511628211u;
    return h;
}

gs_symtab *gs_symtab_new(void)
{
    gs_symtab *st = gs_calloc(1, sizeof *st);
    size_t i;
    st->nslots = 64;
    st->slots = gs_malloc(st->nslots * sizeof *st->slots);
    for (i = 0; i < st->nslots; i++)
        st->slots[i] = -1;
    return st;
}

void gs_symtab_free(gs_symtab *st)
{
    int i;
    if (st == NULL)
        return;
    for (i = 0; i < st->n; i++)
        gs_free(st->v[i].name);
    gs_free(st->v);
    gs_free(st->slots);
    gs_free(st);
}

static size_t find_slot(const gs_symtab *st, const char *name)
{
    size_t mask = st->nslots - 1;
    size_t i = hash_name(name) & mask;
    while (st->slots[i] >= 0 && strcmp(st->v[st->slots[i]].name, name) != 0)
        i = (i + 1) & mask;
    return i;
}

static void grow_slots(gs_symtab *st)
{
    size_t i;
    int k;
    gs_free(st->slots);
    st->nslots *= 2;
    st->slots = gs_malloc(st->nslots * sizeof *st->slots);
    for (i = 0; i < st->nslots; i++)
        st->slots[i] = -1;
    for (k = 0; k < st->n; k++)
        st->slots[find_slot(st, st->v[k].name)] = k;
}

static int add_symbol(gs_symtab *st, const char *name, int base)
{
    int id;
    if (st->n == st->alloc) {
        st->alloc = st->alloc ? 2 * st->alloc : 16;
        st->v = gs_reallocarray(st->v, (size_t)st->alloc, sizeof *st->v);
    }
    id = st->n++;
    st->v[id].name = gs_strdup(name);
    st->v[id].base = base;
    st->v[id].recip = -1;
    if (2 * (size_t)st->n > st->nslots)
        grow_slots(st);
    else
        st->slots[find_slot(st, name)] = id;
    return id;
}

int gs_symtab_find(const gs_symtab *st, const char *name)
{
    return st->slots[find_slot(st, name)];
}

int gs_symtab_intern(gs_symtab *st, const char *name)
{
    int id = gs_symtab_find(st, name);
    return id >= 0 ? id : add_symbol(st, name, -1);
}

int gs_symtab_recip(gs_symtab *st, int base)
{
    char *name;
    int id;
    if (st->v[base].base >= 0)
        return st->v[base].base;
    if (st->v[base].recip >= 0)
        return st->v[base].recip;
    name = gs_asprintf("1/%s", st->v[base].name);
    id = add_symbol(st, name, base);
    gs_free(name);
    st->v[base].recip = id;
    return id;
}

int gs_symtab_find_recip(const gs_symtab *st, int base)
{
    if (st->v[base].base >= 0)
        return st->v[base].base;
    return st->v[base].recip;
}

int gs_symtab_count(const gs_symtab *st)
{
    return st->n;
}

const char *gs_symtab_name(const gs_symtab *st, int id)
{
    return st->v[id].name;
}

int gs_symtab_is_recip(const gs_symtab *st, int id)
{
    return st->v[id].base >= 0;
}

int gs_symtab_base(const gs_symtab *st, int id)
{
    return st->v[id].base;
}

static const char *const greek[] = {
    "alpha", "beta", "gamma", "delta", "epsilon", "zeta", "eta", "theta",
    "kappa", "lambda", "mu", "nu", "xi", "pi", "rho", "sigma", "tau",
    "phi", "chi", "psi", "omega", "Gamma", "Delta", "Theta", "Lambda",
    "Xi", "Pi", "Sigma", "Phi", "Psi", "Omega"
};

/* length of a Greek letter name that starts `name`, or 0 */
static size_t greek_prefix(const char *name)
{
    size_t i, best = 0;
    for (i = 0; i < sizeof greek / sizeof greek[0]; i++) {
        size_t n = strlen(greek[i]);
        if (n > best && strncmp(name, greek[i], n) == 0)
            best = n;
    }
    return best;
}

/* append `text` to buf (capacity tracked by the caller's estimate) */
static char *append(char *p, const char *text, size_t n)
{
    memcpy(p, text, n);
    return p + n;
}

char *gs_sym_latex_name(const char *name)
{
    size_t len = strlen(name), body = greek_prefix(name);
    char *out = gs_malloc(2 * len + 16), *p = out;
    const char *sub;

    if (body > 0) {
        *p++ = '\\';
        p = append(p, name, body);
    } else {
        body = len > 0 ? 1 : 0;
        p = append(p, name, body);
    }
    sub = name + body;
    if (*sub == '_')
        sub++;
    if (*sub != '\0') {
        p = append(p, "_{", 2);
        for (; *sub; sub++) {
            if (*sub == '_')
                *p++ = ',';
            else
                *p++ = *sub;
        }
        *p++ = '}';
    } else if (body > 0 && name[0] != '\0' && greek_prefix(name) > 0) {
        p = append(p, "{}", 2);     /* keep "\beta x" from gluing */
    }
    *p = '\0';
    return out;
}


char *gs_symtab_latex(const gs_symtab *st, int id)
{
    char *inner, *out;
    if (st->v[id].base < 0)
        return gs_sym_latex_name(st->v[id].name);
    inner = gs_sym_latex_name(st->v[st->v[id].base].name);
    out = gs_asprintf("\\frac{1}{%s}", inner);
    gs_free(inner);
    return out;
}
