/* expr.c - element values (monomials) and value expressions: parsing.
 * See LICENSE.
 *
 * Element values are exact: products and quotients of decimal numbers
 * and symbols with integer powers ("2*Rx", "R/2", "1/(2*R)").
 * Value expressions are numeric: + - * / ^, unary minus, parentheses,
 * the functions sqrt exp log log10 abs, and the constant pi.  Both are
 * parsed by recursive descent, one function per precedence level.
 */
#include "gainsmith.h"
#include "base/mem.h"
#include "circuit/parse.h"

#include <stdlib.h>
#include <string.h>

/* Operators and operands allowed in one value or expression: keeps the
   recursion of the parser, of gs_expr_free and of evaluation shallow. */
#define MAX_PARTS 500
/* Largest power a symbol or number may be raised to, overall. */
#define MAX_EXPONENT 64

static const char *const functions[] = {
    "sqrt", "exp", "log", "log10", "abs"
};
#define NFUNCTIONS (sizeof functions / sizeof functions[0])

static const char inf_hint[] =
    "inf drops a device resistance: rds=inf, ro=inf or rpi=inf";

int gs_parse_symbol(gs_cursor *cur, const gs_token *t, gs_circuit *c)
{
    if (t->dotted) {
        gs_cur_error(cur, t, NULL, "'%s' is not a valid name: dots and "
                     "primes are kept for device parts", t->text);
        return -1;
    }
    if (strcmp(t->text, "s") == 0) {
        gs_cur_error(cur, t, NULL,
                     "'s' is reserved for the Laplace variable");
        return -1;
    }
    if (strcmp(t->text, "pi") == 0) {
        gs_cur_error(cur, t, NULL,
                     "'pi' is a constant and cannot be used as a symbol");
        return -1;
    }
    if (strcmp(t->text, "inf") == 0) {
        gs_cur_error(cur, t, inf_hint, "'inf' is not allowed here");
        return -1;
    }
    return gs_symtab_intern(c->syms, t->text);
}

/* The exact number written at t, or GS_ESYNTAX after "'4.7q' is not a
   number". */
static int gs_parse_number(gs_rat *r, gs_cursor *cur, const gs_token *t)
{
    size_t len = strlen(t->text);
    if (len > GS_RAT_PARSE_MAX_CHARS) {
        /* decimal to binary is quadratic in the digits: the limit keeps a
           file's parse fast, and no value needs more than a few dozen */
        gs_cur_error(cur, t, "write the value with fewer digits, or with an "
                     "exponent (1.5e300)", "a number of %zu characters: "
                     "numbers take at most %d", len, GS_RAT_PARSE_MAX_CHARS);
        return GS_ESYNTAX;
    }
    if (gs_rat_parse(r, t->text, NULL) == GS_OK)
        return GS_OK;
    if (strpbrk(t->text, "eE") != NULL
        && gs_number_is_well_formed(t->text)) {
        gs_cur_error(cur, t, "exponents, with the SI prefix and the digits "
                     "after the point folded in, lie between -10000 and "
                     "10000", "the exponent of '%s' is out of range",
                     t->text);
        return GS_ESYNTAX;
    }
    gs_cur_error(cur, t, "a number is a decimal with an optional exponent "
                 "and SI prefix, such as 4.7k, 2.2n or 1e-3 (prefixes: "
                 "f p n u m k M G T)", "'%s' is not a number", t->text);
    return GS_ESYNTAX;
}

/* Count one more part against MAX_PARTS. */
static int spend(gs_cursor *cur, const gs_token *t)
{
    if (++cur->depth <= MAX_PARTS)
        return GS_OK;
    if (cur->depth == MAX_PARTS + 1)
        gs_cur_error(cur, t, NULL, "expression too large (more than %d "
                     "operators and operands)", MAX_PARTS);
    return GS_ESYNTAX;
}

/* ---- monomials ---- */

static int mono_product(gs_monomial *m, long *mult, gs_cursor *cur,
                        gs_circuit *c);

/* An integer exponent after '^': [+|-] digits. */
static int parse_exponent(long *e, gs_cursor *cur)
{
    const gs_token *t;
    int neg = 0;
    size_t i;
    if (gs_cur_accept(cur, '-'))
        neg = 1;
    else
        gs_cur_accept(cur, '+');
    t = gs_cur_peek(cur);
    for (i = 0; t->kind == GS_TK_NUMBER && t->text[i]; i++)
        if (t->text[i] < '0' || t->text[i] > '9')
            break;
    if (t->kind != GS_TK_NUMBER || t->text[i] != '\0') {
        gs_cur_expected(cur, t, "an integer exponent", NULL);
        return GS_ESYNTAX;
    }
    *e = i > 6 ? MAX_EXPONENT + 1 : strtol(t->text, NULL, 10);
    if (neg)
        *e = -*e;
    gs_cur_next(cur);
    return GS_OK;
}

static int mono_primary(gs_monomial *m, long *mult, gs_cursor *cur,
                        gs_circuit *c)
{
    const gs_token *t = gs_cur_peek(cur);
    int sym;
    if (spend(cur, t) != GS_OK)
        return GS_ESYNTAX;
    *mult = 1;
    if (t->kind == GS_TK_NUMBER) {
        gs_cur_next(cur);
        return gs_parse_number(&m->coeff, cur, t);
    }
    if (t->kind == GS_TK_IDENT) {
        gs_cur_next(cur);
        if ((sym = gs_parse_symbol(cur, t, c)) < 0)
            return GS_ESYNTAX;
        gs_monomial_mul_sym(m, sym, 1);
        return GS_OK;
    }
    if (gs_cur_accept(cur, '(')) {
        int line, col;
        if (mono_product(m, mult, cur, c) != GS_OK)
            return GS_ESYNTAX;
        if (gs_cur_accept(cur, ')'))
            return GS_OK;
        gs_lex_position(cur->lx, t->off, &line, &col);
        gs_cur_error(cur, gs_cur_peek(cur), NULL,
                     "')' expected to close '(' at %d:%d", line, col);
        return GS_ESYNTAX;
    }
    gs_cur_expected(cur, t, "a number or a symbol", NULL);
    return GS_ESYNTAX;
}

/* ['-'] primary ['^' exponent]; *mult is the overall power applied. */
static int mono_factor(gs_monomial *m, long *mult, gs_cursor *cur,
                       gs_circuit *c)
{
    int neg = gs_cur_accept(cur, '-');
    const gs_token *hat;
    long e;
    if (mono_primary(m, mult, cur, c) != GS_OK)
        return GS_ESYNTAX;
    hat = gs_cur_peek(cur);
    if (gs_cur_accept(cur, '^')) {
        if (parse_exponent(&e, cur) != GS_OK)
            return GS_ESYNTAX;
        if (labs(e) > MAX_EXPONENT || *mult * labs(e) > MAX_EXPONENT) {
            gs_cur_error(cur, hat, NULL, "exponent %ld is out of range "
                         "(at most %d)", labs(e) > MAX_EXPONENT ? e
                         : *mult * e, MAX_EXPONENT);
            return GS_ESYNTAX;
        }
        if (gs_monomial_pow_si(m, m, e) != GS_OK) {
            gs_cur_error(cur, hat, NULL, "division by zero");
            return GS_ESYNTAX;
        }
        *mult *= labs(e) > 0 ? labs(e) : 1;
    }
    if (neg)
        gs_rat_neg(&m->coeff, &m->coeff);
    return GS_OK;
}

static int mono_product(gs_monomial *m, long *mult, gs_cursor *cur,
                        gs_circuit *c)
{
    gs_monomial f;
    long fm;
    int rc;
    gs_monomial_init(&f);
    rc = mono_factor(m, mult, cur, c);
    while (rc == GS_OK && (gs_cur_is(cur, '*') || gs_cur_is(cur, '/'))) {
        const gs_token *op = gs_cur_next(cur);
        gs_monomial_clear(&f);
        gs_monomial_init(&f);
        rc = mono_factor(&f, &fm, cur, c);
        if (fm > *mult)
            *mult = fm;
        if (rc == GS_OK && op->text[0] == '/'
            && gs_monomial_pow_si(&f, &f, -1) != GS_OK) {
            gs_cur_error(cur, op, NULL, "division by zero");
            rc = GS_ESYNTAX;
        }
        if (rc == GS_OK)
            gs_monomial_mul(m, m, &f);
    }
    gs_monomial_clear(&f);
    return rc;
}

int gs_parse_monomial(gs_monomial *m, gs_cursor *cur, gs_circuit *c)
{
    gs_monomial t;
    long mult;
    int rc;
    gs_monomial_init(&t);
    cur->depth = 0;
    rc = mono_product(&t, &mult, cur, c);
    if (rc == GS_OK && (gs_cur_is(cur, '+') || gs_cur_is(cur, '-'))) {
        const gs_token *op = gs_cur_peek(cur);
        gs_cur_error(cur, op, "an element value is a product or quotient "
                     "of numbers and symbols; give a sum a name with a "
                     "'value' line", "'%s' is not allowed in an element "
                     "value", op->text);
        rc = GS_ESYNTAX;
    }
    if (rc == GS_OK)
        gs_monomial_set(m, &t);
    gs_monomial_clear(&t);
    return rc;
}

/* ---- expressions ---- */

static gs_expr *new_node(gs_expr_kind kind, const gs_cursor *cur,
                         const gs_token *t)
{
    gs_expr *e = gs_calloc(1, sizeof *e);
    e->kind = kind;
    gs_rat_init(&e->num);
    gs_lex_position(cur->lx, t->off, &e->line, &e->col);
    return e;
}

static gs_expr *binary(gs_expr_kind kind, const gs_cursor *cur,
                       const gs_token *t, gs_expr *lhs, gs_expr *rhs)
{
    gs_expr *e = new_node(kind, cur, t);
    e->lhs = lhs;
    e->rhs = rhs;
    return e;
}

static int ex_sum(gs_expr **out, gs_cursor *cur, gs_circuit *c);
static int ex_unary(gs_expr **out, gs_cursor *cur, gs_circuit *c);

/* ')' to close the '(' at open, or an error. */
static int close_paren(gs_cursor *cur, const gs_token *open)
{
    int line, col;
    if (gs_cur_accept(cur, ')'))
        return GS_OK;
    gs_lex_position(cur->lx, open->off, &line, &col);
    if (cur->lx->what != NULL)
        gs_cur_error(cur, gs_cur_peek(cur), NULL, "')' expected to close "
                     "'('");
    else
        gs_cur_error(cur, gs_cur_peek(cur), NULL, "')' expected to close "
                     "'(' at %d:%d", line, col);
    return GS_ESYNTAX;
}

/* name '(' expr ')' */
static int ex_call(gs_expr **out, gs_cursor *cur, gs_circuit *c,
                   const gs_token *name)
{
    const gs_token *open = gs_cur_next(cur);
    size_t i;
    for (i = 0; i < NFUNCTIONS; i++)
        if (strcmp(name->text, functions[i]) == 0)
            break;
    if (i == NFUNCTIONS) {
        char *hint = gs_suggest_hint(name->text, functions, NFUNCTIONS);
        gs_cur_error(cur, name, hint ? hint : "the functions are sqrt, exp, "
                     "log, log10 and abs", "unknown function '%s'",
                     name->text);
        gs_free(hint);
        return GS_ESYNTAX;
    }
    *out = new_node(GS_EX_CALL, cur, name);
    (*out)->func = gs_strdup(functions[i]);
    if (ex_sum(&(*out)->lhs, cur, c) != GS_OK)
        return GS_ESYNTAX;
    if (gs_cur_is(cur, ',')) {
        gs_cur_error(cur, name, NULL, "function '%s' takes one argument",
                     name->text);
        return GS_ESYNTAX;
    }
    return close_paren(cur, open);
}

static int ex_primary(gs_expr **out, gs_cursor *cur, gs_circuit *c)
{
    const gs_token *t = gs_cur_peek(cur);
    int sym;
    if (spend(cur, t) != GS_OK)
        return GS_ESYNTAX;
    if (t->kind == GS_TK_NUMBER) {
        gs_cur_next(cur);
        *out = new_node(GS_EX_NUM, cur, t);
        return gs_parse_number(&(*out)->num, cur, t);
    }
    if (t->kind == GS_TK_IDENT) {
        gs_cur_next(cur);
        if (gs_cur_is(cur, '('))
            return ex_call(out, cur, c, t);
        if (strcmp(t->text, "pi") == 0) {
            *out = new_node(GS_EX_CALL, cur, t);
            (*out)->func = gs_strdup("pi");
            return GS_OK;
        }
        if ((sym = gs_parse_symbol(cur, t, c)) < 0)
            return GS_ESYNTAX;
        *out = new_node(GS_EX_SYM, cur, t);
        (*out)->sym = sym;
        return GS_OK;
    }
    if (gs_cur_accept(cur, '(')) {
        if (ex_sum(out, cur, c) != GS_OK)
            return GS_ESYNTAX;
        return close_paren(cur, t);
    }
    gs_cur_expected(cur, t, "a number, a symbol or '('", NULL);
    return GS_ESYNTAX;
}

/* primary ['^' unary]: right-associative, and tighter than a unary minus
   on its left (-x^2 is -(x^2)), as in common mathematical notation. */
static int ex_power(gs_expr **out, gs_cursor *cur, gs_circuit *c)
{
    const gs_token *hat;
    gs_expr *rhs = NULL;
    if (ex_primary(out, cur, c) != GS_OK)
        return GS_ESYNTAX;
    hat = gs_cur_peek(cur);
    if (!gs_cur_accept(cur, '^'))
        return GS_OK;
    if (ex_unary(&rhs, cur, c) != GS_OK) {
        gs_expr_free(rhs);
        return GS_ESYNTAX;
    }
    *out = binary(GS_EX_POW, cur, hat, *out, rhs);
    return GS_OK;
}

static int ex_unary(gs_expr **out, gs_cursor *cur, gs_circuit *c)
{
    const gs_token *t = gs_cur_peek(cur);
    gs_expr *arg = NULL;
    if (gs_cur_is(cur, '+')) {
        gs_cur_next(cur);
        return spend(cur, t) == GS_OK ? ex_unary(out, cur, c) : GS_ESYNTAX;
    }
    if (!gs_cur_accept(cur, '-'))
        return ex_power(out, cur, c);
    if (spend(cur, t) != GS_OK || ex_unary(&arg, cur, c) != GS_OK) {
        gs_expr_free(arg);
        return GS_ESYNTAX;
    }
    *out = new_node(GS_EX_NEG, cur, t);
    (*out)->lhs = arg;
    return GS_OK;
}

typedef int (*ex_level)(gs_expr **out, gs_cursor *cur, gs_circuit *c);

/* One left-associative level: next (op next)*, op being a (kind ka) or
   b (kind kb). */
static int ex_left_assoc(gs_expr **out, gs_cursor *cur, gs_circuit *c,
                         ex_level next, char a, gs_expr_kind ka, char b,
                         gs_expr_kind kb)
{
    if (next(out, cur, c) != GS_OK)
        return GS_ESYNTAX;
    while (gs_cur_is(cur, a) || gs_cur_is(cur, b)) {
        const gs_token *op = gs_cur_next(cur);
        gs_expr *rhs = NULL;
        if (next(&rhs, cur, c) != GS_OK) {
            gs_expr_free(rhs);
            return GS_ESYNTAX;
        }
        *out = binary(op->text[0] == a ? ka : kb, cur, op, *out, rhs);
    }
    return GS_OK;
}

static int ex_product(gs_expr **out, gs_cursor *cur, gs_circuit *c)
{
    return ex_left_assoc(out, cur, c, ex_unary, '*', GS_EX_MUL, '/',
                         GS_EX_DIV);
}

static int ex_sum(gs_expr **out, gs_cursor *cur, gs_circuit *c)
{
    return ex_left_assoc(out, cur, c, ex_product, '+', GS_EX_ADD, '-',
                         GS_EX_SUB);
}

int gs_parse_expr(gs_expr **out, gs_cursor *cur, gs_circuit *c)
{
    *out = NULL;
    cur->depth = 0;
    if (ex_sum(out, cur, c) == GS_OK)
        return GS_OK;
    gs_expr_free(*out);
    *out = NULL;
    return GS_ESYNTAX;
}

int gs_expr_parse_string(gs_expr **out, gs_circuit *c, const char *text,
                         const char *what, gs_diag *d)
{
    gs_lexer lx;
    gs_cursor cur;
    int rc = GS_ESYNTAX;

    *out = NULL;
    gs_lex_init(&lx, NULL, what ? what : "value", text, strlen(text));
    gs_lex_run(&lx);
    if (lx.nstmt == 1 && lx.stmt[0].bad) {
        gs_lex_report_bad(&lx, d, &lx.stmt[0]);
    } else if (lx.nstmt != 1) {        /* empty, or more than one line */
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL, "%s: expected one "
                    "expression, found %s", what ? what : "value",
                    lx.nstmt ? "several lines" : "nothing");
    } else {
        gs_cursor_init(&cur, &lx, d, &lx.stmt[0]);
        rc = gs_parse_expr(out, &cur, c);
        if (rc == GS_OK && gs_cur_peek(&cur)->kind != GS_TK_END) {
            gs_cur_error(&cur, gs_cur_peek(&cur), NULL, "unexpected '%s' "
                         "after the expression", gs_cur_peek(&cur)->text);
            gs_expr_free(*out);
            *out = NULL;
            rc = GS_ESYNTAX;
        }
    }
    gs_lex_clear(&lx);
    return rc;
}
