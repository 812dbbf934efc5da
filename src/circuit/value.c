/* value.c - the values a circuit holds: monomials (exact element values)
 * and value expression trees, their storage and arithmetic.  expr.c
 * parses them, eval.c evaluates them.  See LICENSE.
 */
#include "circuit/circuit.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <stdlib.h>
#include <string.h>

/* ---- monomials ---- */

void gs_monomial_init(gs_monomial *m)
{
    gs_rat_init(&m->coeff);
    gs_rat_set_si(&m->coeff, 1, 1);
    m->n = 0;
    m->sym = NULL;
    m->exp = NULL;
}

void gs_monomial_clear(gs_monomial *m)
{
    gs_rat_clear(&m->coeff);
    gs_free(m->sym);
    gs_free(m->exp);
    m->n = 0;
    m->sym = m->exp = NULL;
}

void gs_monomial_set(gs_monomial *r, const gs_monomial *a)
{
    if (r == a)
        return;
    gs_rat_set(&r->coeff, &a->coeff);
    gs_free(r->sym);
    gs_free(r->exp);
    r->n = a->n;
    r->sym = gs_malloc((size_t)a->n * sizeof *r->sym);
    r->exp = gs_malloc((size_t)a->n * sizeof *r->exp);
    if (a->n > 0) {
        memcpy(r->sym, a->sym, (size_t)a->n * sizeof *r->sym);
        memcpy(r->exp, a->exp, (size_t)a->n * sizeof *r->exp);
    }
}

void gs_monomial_mul_sym(gs_monomial *r, int sym, int exp)
{
    int i = 0, j;
    while (i < r->n && r->sym[i] < sym)
        i++;
    if (i < r->n && r->sym[i] == sym) {
        r->exp[i] += exp;
        if (r->exp[i] == 0) {           /* cancelled: close the gap */
            for (j = i; j + 1 < r->n; j++) {
                r->sym[j] = r->sym[j + 1];
                r->exp[j] = r->exp[j + 1];
            }
            r->n--;
        }
        return;
    }
    if (exp == 0)
        return;
    r->sym = gs_reallocarray(r->sym, (size_t)r->n + 1, sizeof *r->sym);
    r->exp = gs_reallocarray(r->exp, (size_t)r->n + 1, sizeof *r->exp);
    for (j = r->n; j > i; j--) {
        r->sym[j] = r->sym[j - 1];
        r->exp[j] = r->exp[j - 1];
    }
    r->sym[i] = sym;
    r->exp[i] = exp;
    r->n++;
}

void gs_monomial_mul(gs_monomial *r, const gs_monomial *a,
                     const gs_monomial *b)
{
    gs_monomial t;
    int i;
    gs_monomial_init(&t);
    gs_monomial_set(&t, a);
    gs_rat_mul(&t.coeff, &t.coeff, &b->coeff);
    for (i = 0; i < b->n; i++)
        gs_monomial_mul_sym(&t, b->sym[i], b->exp[i]);
    gs_monomial_clear(r);
    *r = t;
}

int gs_monomial_pow_si(gs_monomial *r, const gs_monomial *a, long e)
{
    int i;
    if (e < 0 && gs_rat_is_zero(&a->coeff))
        return GS_EDIVZERO;
    gs_monomial_set(r, a);
    gs_rat_pow_si(&r->coeff, &r->coeff, e);
    for (i = 0; i < r->n; i++)
        r->exp[i] = (int)(r->exp[i] * e);
    if (e == 0) {
        r->n = 0;
    }
    return GS_OK;
}

int gs_monomial_equal(const gs_monomial *a, const gs_monomial *b)
{
    int i;
    if (a->n != b->n || !gs_rat_equal(&a->coeff, &b->coeff))
        return 0;
    for (i = 0; i < a->n; i++)
        if (a->sym[i] != b->sym[i] || a->exp[i] != b->exp[i])
            return 0;
    return 1;
}

char *gs_monomial_get_str(const gs_monomial *m, const gs_symtab *st)
{
    char *out, *cf;
    int i, one;
    gs_rat unit;
    gs_rat_init(&unit);
    gs_rat_set_si(&unit, 1, 1);
    one = gs_rat_equal(&m->coeff, &unit);
    gs_rat_clear(&unit);
    cf = gs_rat_get_str(&m->coeff);
    out = gs_strdup(one && m->n > 0 ? "" : cf);
    gs_free(cf);
    for (i = 0; i < m->n; i++) {
        const char *name = gs_symtab_name(st, m->sym[i]);
        const char *sep = (i == 0 && one) ? "" : "*";
        char *next = m->exp[i] == 1
                     ? gs_asprintf("%s%s%s", out, sep, name)
                     : gs_asprintf("%s%s%s^%d", out, sep, name, m->exp[i]);
        gs_free(out);
        out = next;
    }
    return out;
}

/* ---- expressions ---- */

void gs_expr_free(gs_expr *e)
{
    if (e == NULL)
        return;
    gs_expr_free(e->lhs);
    gs_expr_free(e->rhs);
    gs_rat_clear(&e->num);
    gs_free(e->func);
    gs_free(e);
}
