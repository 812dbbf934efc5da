/* tool_print.c - prints random polynomial pairs with their text and JSON
 * forms, for tests/sympy/print_check.py.  See LICENSE.
 *
 * usage: tool_print SEED COUNT
 * Each case is written as
 *     case K
 *     vars NAME...                 the symbols, in id order
 *     num N / den N                then N lines "COEFF E0 E1 ..." (raw
 *                                  terms, independent of any printer)
 *     text VAR LINE                gs_print_text grouped by VAR ("-": none)
 *     json VAR LINE                gs_print_json grouped likewise
 *     end
 */
#include "analysis/tf.h"

#include <stdint.h>
#include <stdlib.h>
#include <string.h>

static const char *const names[] = {
    "s", "gm", "C", "R", "RD", "RS", "Cgd", "CL", "beta", "Cgs_M1", "rds"
};
#define NNAMES ((int)(sizeof names / sizeof names[0]))

static uint64_t next(uint64_t *x)
{
    /* xorshift64* (Vigna 2016) */
    *x ^= *x >> 12;
    *x ^= *x << 25;
    *x ^= *x >> 27;
    return *x * 2685821657736338717u;
}

static void random_poly(gs_poly *p, uint64_t *x, const gs_polyctx *ctx)
{
    unsigned exps[NNAMES];
    size_t t, nterms = 1 + next(x) % 10;
    int v;
    gs_int c;
    gs_int_init(&c);
    gs_poly_zero(p);
    for (t = 0; t < nterms; t++) {
        for (v = 0; v < NNAMES; v++)
            exps[v] = next(x) % 3 == 0 ? (unsigned)(next(x) % 4) : 0;
        gs_int_set_si(&c, (int64_t)(next(x) % 21) - 10);
        if (next(x) % 12 == 0)
            gs_int_mul_2exp(&c, &c, 64 + next(x) % 40);
        gs_poly_push_term(p, &c, exps, ctx);
    }
    gs_poly_canonicalise(p, ctx);
    if (gs_poly_is_zero(p))
        gs_poly_set_si(p, -1, ctx);
    gs_int_clear(&c);
}

static void dump_terms(const char *what, const gs_poly *p,
                       const gs_polyctx *ctx)
{
    unsigned exps[NNAMES];
    size_t i;
    int v;
    printf("%s %zu\n", what, p->length);
    for (i = 0; i < p->length; i++) {
        char *c = gs_int_get_str(&p->coeffs[i]);
        gs_poly_get_term_exps(exps, p, i, ctx);
        printf("%s", c);
        for (v = 0; v < NNAMES; v++)
            printf(" %u", exps[v]);
        putchar('\n');
        free(c);
    }
}

int main(int argc, char **argv)
{
    uint64_t x = argc > 1 ? strtoull(argv[1], NULL, 10) : 1;
    long count = argc > 2 ? strtol(argv[2], NULL, 10) : 100, k;
    static const int collect[] = { 0, 1, 6, -1 };
    gs_symtab *st = gs_symtab_new();
    gs_polyctx *ctx;
    int v;
    size_t i;
    x = x * 2654435761u + 1;    /* any seed, even 0, gives a live state */
    for (v = 0; v < NNAMES; v++)
        gs_symtab_intern(st, names[v]);
    ctx = gs_polyctx_new(st, NNAMES);
    for (k = 0; k < count; k++) {
        gs_tf tf;
        gs_tf_init(&tf, ctx, 0);
        gs_tf_set_name(&tf, k % 2 ? "Av" : "Zout");
        random_poly(&tf.num, &x, ctx);
        random_poly(&tf.den, &x, ctx);
        printf("case %ld\nvars", k);
        for (v = 0; v < NNAMES; v++)
            printf(" %s", names[v]);
        putchar('\n');
        dump_terms("num", &tf.num, ctx);
        dump_terms("den", &tf.den, ctx);
        for (i = 0; i < sizeof collect / sizeof collect[0]; i++) {
            const char *cv = collect[i] >= 0 ? names[collect[i]] : "-";
            printf("text %s ", cv);
            gs_print_text(stdout, &tf, collect[i]);
            printf("json %s ", cv);
            gs_print_json(stdout, &tf, collect[i]);
            putchar('\n');
        }
        printf("end\n");
        gs_tf_clear(&tf);
    }
    gs_polyctx_free(ctx);
    gs_symtab_free(st);
    return 0;
}
