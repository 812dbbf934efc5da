/* tool_poly.c - a line-oriented driver of the polynomial module, for the
 * cross-check against sympy (tests/sympy/poly_check.py).  See LICENSE.
 *
 * Reads commands from stdin, one per line, and answers each with one line
 * on stdout.  Arguments are separated by ';'.
 *
 *   vars x y 1/R             symbols of the context (1/R: a reciprocal)
 *   print P                  P in canonical form
 *   add P ; Q    sub P ; Q   sum and difference
 *   mul P ; Q                product (also mulheap, muldense, mulbig,
 *                            mulmid: a forced method or accumulator, see
 *                            gs_poly_mul_method)
 *   pow P ; n                P^n
 *   div P ; Q                exact quotient, or "inexact" (also divheap,
 *                            divdense, divbig: gs_poly_divexact_method)
 *   content P    prim P      content and primitive part
 *   diff P ; x               derivative in x
 *   coeff P ; x ; k          coefficient of x^k
 *   subst P ; x ; Q          P with x replaced by Q
 *   substrat P ; x ; p/q     "scale ; R" with R = scale * P(p/q)
 *   limit N ; D ; x ; inf|zero   "RN ; RD", or "infinite"
 *   gcd P ; Q                the gcd (poly_gcd.c)
 *   degree P ; x             degree in x
 *
 * A malformed command or argument answers "error: ..." and the tool goes
 * on with the next line.
 */
#include "gainsmith.h"
#include "algebra/poly.h"
#include "algebra/rat.h"
#include "algebra/sym.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MAX_ARGS 4

typedef struct tool {
    gs_symtab *st;
    gs_polyctx *ctx;
    gs_poly arg[MAX_ARGS], r, s;
    char *word[MAX_ARGS];   /* raw argument text, trimmed */
    int nargs;
} tool;

static char *trim(char *s)
{
    char *e;
    while (*s == ' ' || *s == '\t')
        s++;
    e = s + strlen(s);
    while (e > s && (e[-1] == ' ' || e[-1] == '\t' || e[-1] == '\n'
                     || e[-1] == '\r'))
        *--e = '\0';
    return s;
}

/* "vars x y 1/R": a fresh symbol table and context */
static void set_vars(tool *t, char *list)
{
    char *tok;
    int k;
    for (k = 0; k < MAX_ARGS; k++)
        gs_poly_clear(&t->arg[k]);
    gs_poly_clear(&t->r);
    gs_poly_clear(&t->s);
    gs_polyctx_free(t->ctx);
    gs_symtab_free(t->st);
    t->st = gs_symtab_new();
    for (tok = strtok(list, " \t"); tok != NULL; tok = strtok(NULL, " \t")) {
        if (strncmp(tok, "1/", 2) == 0)
            gs_symtab_recip(t->st, gs_symtab_intern(t->st, tok + 2));
        else
            gs_symtab_intern(t->st, tok);
    }
    t->ctx = gs_polyctx_new(t->st, gs_symtab_count(t->st));
    for (k = 0; k < MAX_ARGS; k++)
        gs_poly_init(&t->arg[k]);
    gs_poly_init(&t->r);
    gs_poly_init(&t->s);
    puts("ok");
}

static int var_of(const tool *t, const char *name)
{
    int id = gs_symtab_find(t->st, name);
    return id >= 0 && id < t->ctx->nvars ? id : -1;
}

static void put_poly(const tool *t, const gs_poly *p)
{
    gs_poly_print(stdout, p, t->ctx);
    putchar('\n');
}

/* Split the arguments at ';' and parse those in the bit mask polys as
   polynomials (argument k into arg[k]). */
static int get_args(tool *t, char *rest, unsigned polys)
{
    int k;
    char *p = rest;
    t->nargs = 0;
    while (p != NULL && t->nargs < MAX_ARGS) {
        char *semi = strchr(p, ';');
        if (semi != NULL)
            *semi = '\0';
        t->word[t->nargs++] = trim(p);
        p = semi != NULL ? semi + 1 : NULL;
    }
    if (p != NULL)
        return GS_ESYNTAX;
    for (k = 0; k < t->nargs; k++) {
        int rc = (polys >> k) & 1
            ? gs_poly_set_str(&t->arg[k], t->word[k], t->ctx) : GS_OK;
        if (rc != GS_OK)
            return rc;
    }
    return GS_OK;
}

static void do_div(tool *t, int method)
{
    int rc = gs_poly_divexact_method(&t->r, &t->arg[0], &t->arg[1], method,
                                     t->ctx);
    if (rc == GS_OK)
        put_poly(t, &t->r);
    else
        puts(rc == GS_EINEXACT ? "inexact" : gs_strerror(rc));
}

static void do_content(tool *t)
{
    gs_int c;
    char *s;
    gs_int_init(&c);
    gs_poly_content(&c, &t->arg[0]);
    s = gs_int_get_str(&c);
    puts(s);
    free(s);
    gs_int_clear(&c);
}

/* "p/q" or "p" into v */
static int parse_ratio(gs_rat *v, char *text)
{
    gs_int p, q;
    char *slash = strchr(text, '/');
    int rc;
    gs_int_init(&p);
    gs_int_init(&q);
    gs_int_set_si(&q, 1);
    if (slash != NULL)
        *slash = '\0';
    rc = gs_int_set_str(&p, trim(text));
    if (rc == GS_OK && slash != NULL)
        rc = gs_int_set_str(&q, trim(slash + 1));
    if (rc == GS_OK)
        rc = gs_rat_set_int_int(v, &p, &q);
    gs_int_clear(&p);
    gs_int_clear(&q);
    return rc;
}

static void do_substrat(tool *t, int x)
{
    gs_rat v;
    gs_int scale;
    char *s;
    gs_rat_init(&v);
    gs_int_init(&scale);
    if (parse_ratio(&v, t->word[2]) != GS_OK) {
        puts("error: bad rational");
    } else {
        gs_poly_subst_rat(&t->r, &scale, &t->arg[0], x, &v, t->ctx);
        s = gs_int_get_str(&scale);
        printf("%s ; ", s);
        free(s);
        put_poly(t, &t->r);
    }
    gs_int_clear(&scale);
    gs_rat_clear(&v);
}

static void do_limit(tool *t, int x)
{
    int rc = gs_poly_limit_ratio(&t->r, &t->s, &t->arg[0], &t->arg[1], x,
                                 strcmp(t->word[3], "inf") == 0, t->ctx);
    if (rc == GS_ERANGE) {
        puts("infinite");
    } else if (rc != GS_OK) {
        puts(gs_strerror(rc));
    } else {
        gs_poly_print(stdout, &t->r, t->ctx);
        fputs(" ; ", stdout);
        put_poly(t, &t->s);
    }
}

enum {
    OP_PRINT, OP_ADD, OP_SUB, OP_MUL, OP_MULHEAP, OP_MULDENSE, OP_MULBIG,
    OP_MULMID, OP_POW, OP_DIV, OP_DIVHEAP, OP_DIVDENSE, OP_DIVBIG, OP_CONTENT, OP_PRIM,
    OP_DIFF, OP_COEFF, OP_SUBST, OP_SUBSTRAT, OP_LIMIT, OP_GCD, OP_DEGREE,
    NOPS
};

/* name, bit mask of the polynomial arguments, number of arguments,
   position of the variable argument (-1: none); in the enum's order */
static const struct opdef {
    const char *name;
    unsigned polys;
    int nargs, varpos;
} ops[NOPS] = {
    { "print", 1, 1, -1 },     { "add", 3, 2, -1 },
    { "sub", 3, 2, -1 },       { "mul", 3, 2, -1 },
    { "mulheap", 3, 2, -1 },   { "muldense", 3, 2, -1 },
    { "mulbig", 3, 2, -1 },    { "mulmid", 3, 2, -1 },
    { "pow", 1, 2, -1 },
    { "div", 3, 2, -1 },       { "divheap", 3, 2, -1 },
    { "divdense", 3, 2, -1 },  { "divbig", 3, 2, -1 },
    { "content", 1, 1, -1 },
    { "prim", 1, 1, -1 },      { "diff", 1, 2, 1 },
    { "coeff", 1, 3, 1 },      { "subst", 5, 3, 1 },
    { "substrat", 1, 3, 1 },   { "limit", 3, 4, 2 },
    { "gcd", 3, 2, -1 },       { "degree", 1, 2, 1 },
};

/* The single dispatch on the op: one short case per op. */
static void run_op(tool *t, int op, int x)
{
    gs_poly *a = &t->arg[0], *b = &t->arg[1], *r = &t->r;
    const gs_polyctx *c = t->ctx;
    switch (op) {
    case OP_PRINT: put_poly(t, a); return;
    case OP_ADD: gs_poly_add(r, a, b, c); break;
    case OP_SUB: gs_poly_sub(r, a, b, c); break;
    case OP_MUL: gs_poly_mul(r, a, b, c); break;
    case OP_MULHEAP: gs_poly_mul_method(r, a, b, GS_POLY_MUL_HEAP, c); break;
    case OP_MULDENSE:
        gs_poly_mul_method(r, a, b, GS_POLY_MUL_DENSE, c);
        break;
    case OP_MULBIG:
        gs_poly_mul_method(r, a, b, GS_POLY_MUL_BIGACC, c);
        break;
    case OP_MULMID:
        gs_poly_mul_method(r, a, b, GS_POLY_MUL_DENSE | GS_POLY_MUL_MIDACC, c);
        break;
    case OP_POW:
        gs_poly_pow_ui(r, a, strtoul(t->word[1], NULL, 10), c);
        break;
    case OP_DIV: do_div(t, GS_POLY_MUL_AUTO); return;
    case OP_DIVHEAP: do_div(t, GS_POLY_MUL_HEAP); return;
    case OP_DIVDENSE: do_div(t, GS_POLY_MUL_DENSE); return;
    case OP_DIVBIG: do_div(t, GS_POLY_MUL_BIGACC); return;
    case OP_CONTENT: do_content(t); return;
    case OP_PRIM: gs_poly_primitive(r, a, c); break;
    case OP_DIFF: gs_poly_derivative(r, a, x, c); break;
    case OP_COEFF:
        gs_poly_coeff_var(r, a, x, (unsigned)strtoul(t->word[2], NULL, 10),
                          c);
        break;
    case OP_SUBST: gs_poly_subst(r, a, x, &t->arg[2], c); break;
    case OP_SUBSTRAT: do_substrat(t, x); return;
    case OP_LIMIT: do_limit(t, x); return;
    case OP_GCD: gs_poly_gcd(r, a, b, c); break;
    case OP_DEGREE: printf("%ld\n", gs_poly_degree(a, x, c)); return;
    default: return;
    }
    put_poly(t, r);
}

static void command(tool *t, char *line)
{
    char *name = trim(line), *rest;
    int op, rc, x;
    if (*name == '\0')
        return;
    rest = name + strcspn(name, " \t");
    if (*rest != '\0')
        *rest++ = '\0';
    if (strcmp(name, "vars") == 0) {
        set_vars(t, rest);
        return;
    }
    for (op = 0; op < NOPS && strcmp(ops[op].name, name) != 0; op++)
        ;
    if (op == NOPS || t->ctx == NULL) {
        printf("error: unknown command '%s' or no vars yet\n", name);
        return;
    }
    rc = get_args(t, rest, ops[op].polys);
    if (rc == GS_OK && t->nargs != ops[op].nargs)
        rc = GS_ESYNTAX;
    x = rc == GS_OK && ops[op].varpos >= 0
        ? var_of(t, t->word[ops[op].varpos]) : 0;
    if (rc == GS_OK && x < 0)
        rc = GS_EINVAL;
    if (rc != GS_OK)
        printf("error: %s\n", gs_strerror(rc));
    else
        run_op(t, op, x);
}

int main(void)
{
    tool t;
    char *line = NULL;
    size_t cap = 0;
    int k;
    memset(&t, 0, sizeof t);
    for (k = 0; k < MAX_ARGS; k++)
        gs_poly_init(&t.arg[k]);
    gs_poly_init(&t.r);
    gs_poly_init(&t.s);
    while (getline(&line, &cap, stdin) > 0) {
        command(&t, line);
        fflush(stdout);
    }
    free(line);
    for (k = 0; k < MAX_ARGS; k++)
        gs_poly_clear(&t.arg[k]);
    gs_poly_clear(&t.r);
    gs_poly_clear(&t.s);
    gs_polyctx_free(t.ctx);
    gs_symtab_free(t.st);
    return 0;
}
