/* parse.h - internals shared by the circuit-language parser's files.
 * See LICENSE.
 *
 * parse.c reads statements and resolves names once the whole file is
 * read (an element may be named before the line that defines it);
 * parse_dev.c expands mosfet and bjt lines and records bias lines;
 * expr.c parses element values (monomials) and value expressions;
 * eval.c evaluates them; check.c holds gs_circuit_check.
 */
#ifndef GS_PARSE_H
#define GS_PARSE_H

#include <stddef.h>

#include "circuit/circuit.h"
#include "base/diag.h"
#include "circuit/lex.h"

/* What a name in the element namespace stands for. */
enum { GS_NAME_ELEM, GS_NAME_DEVICE, GS_NAME_BAD };

/* A name used before it can be looked up: resolved after the last line. */
typedef enum gs_ref_kind {
    GS_REF_CTRL,        /* elems[index].ctrl */
    GS_REF_SOURCE,      /* outputs[index].in */
    GS_REF_PROBE,       /* outputs[index].out.elem */
    GS_REF_NODE,        /* a node of outputs[index]: see field */
    GS_REF_BIAS         /* biases[index].device */
} gs_ref_kind;

enum { GS_FIELD_OUT_A, GS_FIELD_OUT_B, GS_FIELD_A, GS_FIELD_B };

typedef struct gs_ref {
    gs_ref_kind kind;
    size_t index;
    int field;          /* GS_REF_NODE: GS_FIELD_* */
    char *name;         /* owned */
    size_t off;         /* where it was written */
} gs_ref;

/* A noise parameter (nthermal=, kf=, ...) on a bias line: bound as a
   value once the line's device is known to be a mosfet. */
typedef struct gs_bias_noise {
    size_t bias;        /* index into biases[] */
    int key;            /* which parameter (parse_dev.c's noise_keys) */
    size_t key_off, val_off;
} gs_bias_noise;

typedef struct gs_parser {
    gs_circuit *c;
    gs_diag *d;
    gs_lexer lx;
    gs_cursor cur;          /* the statement being parsed */
    gs_symtab *nodes;       /* node name -> node id ("gnd" is 0) */
    gs_symtab *names;       /* element and device names -> ids below */
    int *name_kind;         /* per name id: GS_NAME_* */
    int *name_index;        /*   element or device index */
    size_t *name_off;       /*   where it was defined */
    size_t names_alloc;
    gs_ref *refs;
    size_t nrefs, refs_alloc;
    char **dev_body;        /* per device: its b node as written, or NULL */
    gs_bias_noise *bias_noise;
    size_t nbias_noise;
    size_t title_off;       /* where the title line is */
    size_t nodes_alloc, elems_alloc, outputs_alloc, devices_alloc,
           biases_alloc;
} gs_parser;

/* Register t's text as a new element or device name: reports a duplicate
   ("first defined at"), a reserved or dotted name, and returns the name
   id or -1.  The caller sets name_kind/name_index. */
int gs_parser_new_name(gs_parser *p, const gs_token *t);
/* Set what name id stands for, growing the per-name arrays. */
void gs_parser_set_name(gs_parser *p, int id, int kind, int index,
                        size_t off);
/* The node written at t (created on first mention), or -1 after an
   "expected WHAT" message.  gs_parser_check_node only checks the syntax
   (GS_OK or GS_ESYNTAX, reported). */
int gs_parser_node(gs_parser *p, const gs_token *t, const char *what);
int gs_parser_check_node(gs_parser *p, const gs_token *t, const char *what);
/* A new element named `name`, value 1, nodes -1, ctrl -1, device -1;
   the pointer is good until the next element is added. */
gs_element *gs_parser_add_element(gs_parser *p, gs_elem_kind kind,
                                  const char *name, size_t off);
/* Record a name to resolve once the file is read. */
void gs_parser_add_ref(gs_parser *p, gs_ref_kind kind, size_t index,
                       int field, const gs_token *t);
/* Report the error at t with the usage line of a statement as hint. */
void gs_parser_expected(gs_parser *p, const gs_token *t, const char *what,
                        const char *form);
/* A zero value: "the value of resistor 'R1' is zero" at off. */
void gs_parser_zero_value(gs_parser *p, gs_elem_kind kind, const char *name,
                          size_t off);

/* resolve.c: look up every recorded gs_ref. */
void gs_parser_resolve(gs_parser *p);

/* parse_dev.c */
int gs_parse_device(gs_parser *p, int is_bjt);
int gs_parse_bias(gs_parser *p);
void gs_parser_finish_devices(gs_parser *p);
/* After gs_parser_resolve: bind the noise parameters of the bias lines
   of mosfets as values KEY_NAME (origin "bias NAME") and take them off
   the lines, which then hold operating-point figures only. */
void gs_parser_bias_noise(gs_parser *p);

/* expr.c: the symbol written at t (reports s, pi, inf and dotted names),
   or -1. */
int gs_parse_symbol(gs_cursor *cur, const gs_token *t, gs_circuit *c);
/* An element value: a product and quotient of numbers and symbols with
   integer powers and parentheses; stops before the first token that
   cannot continue it.  GS_OK or GS_ESYNTAX (reported; m unchanged). */
int gs_parse_monomial(gs_monomial *m, gs_cursor *cur, gs_circuit *c);
/* A value expression, stopping likewise.  GS_OK or GS_ESYNTAX (*out =
   NULL). */
int gs_parse_expr(gs_expr **out, gs_cursor *cur, gs_circuit *c);

#endif
