/* circuit.h - the circuit model that the parser builds. See LICENSE.
 *
 * A gs_circuit is what a .gsc file says, after device lines are expanded
 * into primitive elements (DESIGN.md, "The circuit language").  It is an
 * object with identity: gs_circuit_new / gs_circuit_free; it owns every
 * array and string inside it, and its symbol table.
 *
 * Nodes are dense ids; node 0 is the reference (gnd, 0, and every node a
 * `ground` statement names are merged into it).  Elements keep the order
 * of the file; an expanded device contributes its parts in a fixed order
 * right where the device line stands.
 */
#ifndef GS_CIRCUIT_H
#define GS_CIRCUIT_H

#include <stddef.h>

#include "base/diag.h"
#include "algebra/rat.h"
#include "algebra/sym.h"

typedef enum gs_elem_kind {
    GS_RESISTOR,     /* value R: stamps 1/R                                */
    GS_CONDUCTANCE,  /* value G                                            */
    GS_CAPACITOR,    /* value C: stamps s*C                                */
    GS_INDUCTOR,     /* value L: branch current, v = s*L*i                 */
    GS_VSOURCE,      /* amplitude: branch current                          */
    GS_ISOURCE,      /* amplitude: current n[0] -> n[1] through it         */
    GS_VCCS,         /* i(n0->n1) = value * v(n2, n3)                      */
    GS_VCVS,         /* v(n0, n1) = value * v(n2, n3)                      */
    GS_CCCS,         /* i(n0->n1) = value * i(ctrl)                        */
    GS_CCVS,         /* v(n0, n1) = value * i(ctrl)                        */
    GS_OPAMP         /* ideal: v(n1) = v(n2); output n0, no input current */
} gs_elem_kind;

/* "resistor", "vccs", ...: the keyword of the kind */
const char *gs_elem_kind_name(gs_elem_kind k);

/* A value that is a monomial: coeff * prod sym[i]^exp[i] (exp may be
   negative: "R/2" is 1/2 * R^1, "1/G" is G^-1).  The symbols are ids in
   the circuit's table; none is the Laplace variable. */
typedef struct gs_monomial {
    gs_rat coeff;
    int n;
    int *sym;
    int *exp;
} gs_monomial;

void gs_monomial_init(gs_monomial *m);       /* m = 1 */
void gs_monomial_clear(gs_monomial *m);
void gs_monomial_set(gs_monomial *r, const gs_monomial *a);
/* r = r * sym^exp (merging a repeated symbol; a zero exponent drops it) */
void gs_monomial_mul_sym(gs_monomial *r, int sym, int exp);
/* The symbols of a monomial are kept sorted by id, so equal monomials are
   equal structurally.  r may alias a or b. */
void gs_monomial_mul(gs_monomial *r, const gs_monomial *a,
                     const gs_monomial *b);
/* r = a^e.  Returns GS_EDIVZERO (r unchanged) for a zero coefficient and
   e < 0. r may alias a. */
int gs_monomial_pow_si(gs_monomial *r, const gs_monomial *a, long e);
int gs_monomial_equal(const gs_monomial *a, const gs_monomial *b);
/* "3/2*R^2*C^-1" (the coefficient only when not 1, or when there are no
   symbols): a new string the caller frees. */
char *gs_monomial_get_str(const gs_monomial *m, const gs_symtab *st);

typedef struct gs_element {
    gs_elem_kind kind;
    char *name;          /* unique among elements ("M1.gm" for a part of a
                            device M1; see parse_dev.c) */
    int line, col;       /* where the defining text starts: its name in
                            its line (a device part: the device's name) */
    int node[4];         /* n0, n1 and, for VCCS/VCVS, control n2, n3;
                            for OPAMP: out, +, - ; unused: -1 */
    int ctrl;            /* CCCS/CCVS: index of the controlling element,
                            whose current i(ctrl) is meant; else -1 */
    gs_monomial value;   /* the element's value or gain; sources: amplitude */
    int device;          /* index into devices[] it came from, or -1 */
} gs_element;

/* What a transfer or impedance asks for. */
typedef enum gs_probe_kind {
    GS_PROBE_V,          /* v(a) or v(a, b): node voltage difference */
    GS_PROBE_I           /* i(element): current through an element */
} gs_probe_kind;

typedef struct gs_probe {
    gs_probe_kind kind;
    int a, b;            /* nodes for GS_PROBE_V (b = 0 for v(a)) */
    int elem;            /* element for GS_PROBE_I */
} gs_probe;

typedef enum gs_output_kind {
    GS_OUT_TRANSFER,     /* name = probe / source */
    GS_OUT_IMPEDANCE,    /* name = a, b: driving-point impedance */
    GS_OUT_FIGURE,       /* name = an expression in other outputs */
    GS_OUT_LOOP          /* name = the return ratio of controlled source
                            `in` (Bode's definition) */
} gs_output_kind;

struct gs_expr;

typedef struct gs_output {
    gs_output_kind kind;
    char *name;
    int line, col;
    gs_probe out;        /* transfer: the output quantity */
    int in;              /* transfer: index of the independent source */
    int a, b;            /* impedance: the two nodes */
    struct gs_expr *figure;  /* figure: the expression (owned), whose
                                symbols name outputs */
    int loop_part;           /* loop: 0 the return ratio T, 1 the
                                asymptotic gain, 2 the direct feed-through
                                of transfer loop_of */
    int loop_of;             /* with `for`: index of the transfer, else -1 */
    char *loop_for;          /* its name as written (owned), or NULL */
    int for_line, for_col;   /* where */
} gs_output;

/* Expressions of `value` lines: evaluated numerically (long double). */
typedef enum gs_expr_kind {
    GS_EX_NUM, GS_EX_SYM, GS_EX_NEG, GS_EX_ADD, GS_EX_SUB, GS_EX_MUL,
    GS_EX_DIV, GS_EX_POW, GS_EX_CALL
} gs_expr_kind;

typedef struct gs_expr {
    gs_expr_kind kind;
    int line, col;
    gs_rat num;              /* GS_EX_NUM: exact */
    int sym;                 /* GS_EX_SYM: symbol id */
    char *func;              /* GS_EX_CALL: "sqrt", "exp", "log",
                                "log10", "abs"; and "pi", the constant,
                                as a call without an operand */
    struct gs_expr *lhs;     /* operands (unary and call use lhs only) */
    struct gs_expr *rhs;
} gs_expr;

void gs_expr_free(gs_expr *e);   /* the whole tree; NULL is fine */

typedef struct gs_valuedef {
    int sym;                 /* the symbol bound */
    gs_expr *expr;           /* owned */
    char *origin;            /* NULL for a value line; "bias M1" for
                                values set by a bias line (owned) */
    int line, col;
} gs_valuedef;

/* A device line (mosfet/bjt) as written, kept for bias lines and for
   messages; its parts are ordinary elements with device = index here. */
typedef struct gs_device {
    char *name;
    int is_bjt;
    int line, col;
    int nodes[4];            /* mosfet: d g s b; bjt: c b e (-1 unused;
                                a mosfet's b is -1 also when it was
                                written but no part and no other line
                                uses it) */
    int nparams;
    char **keys;             /* parameter names as written: "gm", "rds" */
    char **vals;             /* their text as written */
} gs_device;

/* A bias line: raw key=value pairs; the device module interprets them.
   A mosfet's noise parameters (nthermal=, kf=, ...) are not among them:
   the parser binds them as values (origin "bias NAME") and takes them
   off the line. */
typedef struct gs_bias {
    int device;              /* index into devices[] */
    int line, col;
    int nparams;
    char **keys;
    char **vals;
    int *val_col;            /* column of each value, for messages */
} gs_bias;

typedef struct gs_circuit {
    char *file;              /* name used in messages ("-" is <stdin>) */
    char *title;             /* NULL when none */
    gs_symtab *syms;         /* owned; symbol 0 is "s", the Laplace var */
    int s_sym;               /* id of s (always 0) */

    int nnodes;              /* node 0 is the reference */
    char **node_name;        /* node_name[0] = "gnd" */
    int *node_line, *node_col;  /* first mention */
    size_t nref_alias;       /* names `ground` statements merged into */
    char **ref_alias;        /*   node 0 ("vdd", "vss"), in file order */

    size_t nelems;
    gs_element *elems;
    size_t noutputs;
    gs_output *outputs;
    size_t nvalues;
    gs_valuedef *values;
    size_t ndevices;
    gs_device *devices;
    size_t nbiases;
    gs_bias *biases;
    gs_expr *temperature;    /* a temperature line's expression in kelvin
                                (owned), or NULL: the noise analysis then
                                takes 300 K */
    int temp_line, temp_col; /* where it is written */
} gs_circuit;

gs_circuit *gs_circuit_new(void);
void gs_circuit_free(gs_circuit *c);         /* NULL is fine */

/* Parse a whole file ("-" reads standard input) or a string into c,
   which must be fresh from gs_circuit_new.  The language is described in
   docs/language.md.  Every statement error is reported in d (up to
   d->max_errors), warnings too; names used before their line are looked
   up at the end.  Returns GS_OK, GS_ESYNTAX (some statement was bad),
   GS_EINVAL (the circuit is structurally unsound: gs_circuit_check runs
   only on a file without statement errors) or GS_EIO. */
int gs_parse_file(gs_circuit *c, const char *path, gs_diag *d);
int gs_parse_string(gs_circuit *c, const char *name, const char *text,
                    gs_diag *d);
/* The same for text[0 .. len), which may hold NUL bytes (reported as
   unexpected characters). */
int gs_parse_text(gs_circuit *c, const char *name, const char *text,
                  size_t len, gs_diag *d);

/* Structural checks before any algebra (gs_parse_* runs them): loops of
   voltage-defined elements (opamp outputs and inputs included), loops of
   cccs, cut-sets of current sources, parts with no path to the
   reference, nodes that only sense, transfer inputs that are not
   independent sources, value cycles, and (when nothing else is wrong) MNA
   equations singular by their pattern alone; a node touched by one
   terminal is a warning.  Each error means the MNA matrix is singular for
   every value of the elements.  Returns GS_OK or GS_EINVAL, with messages
   naming the elements. */
int gs_circuit_check(const gs_circuit *c, gs_diag *d);

/* Index of the element, node ("gnd", "0" and every ground alias give 0),
   output or device of that name, or -1. */
int gs_circuit_find_element(const gs_circuit *c, const char *name);
int gs_circuit_find_node(const gs_circuit *c, const char *name);
int gs_circuit_find_output(const gs_circuit *c, const char *name);
/* The index in c->values of the definition of symbol sym, or -1. */
int gs_circuit_find_value(const gs_circuit *c, int sym);
int gs_circuit_find_device(const gs_circuit *c, const char *name);

/* Drop every output (transfer and impedance lines), freeing them. */
void gs_circuit_clear_outputs(gs_circuit *c);

/* Append a value definition (expr is owned from then on; origin may be
   NULL and is copied) and return its index. */
size_t gs_circuit_add_value(gs_circuit *c, int sym, gs_expr *expr,
                            const char *origin, int line, int col);

/* Evaluate every value line into vals[sym] (long double, indexed by symbol
   id, gs_symtab_count entries; set[sym] = 1 where bound).  The arrays are
   the caller's.  Reports cycles, unknown symbols, domain errors (sqrt of a
   negative number, log of zero, division by zero) in d: GS_EINVAL.
   A symbol whose set[] is already 1 on entry keeps the caller's value and
   its value lines are skipped (zero set[] for a plain evaluation).  Values
   are computed in dependency order, so a line may use one further down;
   one bad value does not stop the others, only those that depend on it.
   Expressions are evaluated in long double (C11 7.12). */
int gs_circuit_eval_values(const gs_circuit *c, long double *vals,
                           unsigned char *set, gs_diag *d);
/* Report every cycle among the value definitions (part of
   gs_circuit_check); GS_OK or GS_EINVAL. */
int gs_values_check_cycles(const gs_circuit *c, gs_diag *d);
/* Evaluate one expression given values (set[] marks the bound ones).
   GS_OK, GS_EUNBOUND (a symbol without a value) or GS_EINVAL (a domain
   error or an overflow), with the message in d. */
int gs_expr_eval(long double *out, const gs_expr *e, const gs_circuit *c,
                 const long double *vals, const unsigned char *set,
                 gs_diag *d);
/* Parse a standalone expression ("10k", "sqrt(2*k*id)") for --set; symbol
   names are interned in c's table.  Messages carry no location and start
   with "WHAT: ".  GS_OK (*out is the caller's, gs_expr_free) or
   GS_ESYNTAX (*out = NULL). */
int gs_expr_parse_string(gs_expr **out, gs_circuit *c, const char *text,
                         const char *what, gs_diag *d);

#endif
