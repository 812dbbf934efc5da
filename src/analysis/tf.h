/* tf.h - a derived transfer function and its printers. See LICENSE.
 *
 * A gs_tf is one result: H = num/den in lowest terms over Z, with every
 * reciprocal symbol cleared (results read in R, not 1/R), den's leading
 * term (in s, then canonical order) positive.  The caller owns the struct
 * (gs_tf_init / gs_tf_clear); it owns name, description, num and den
 * (heap strings, freed by gs_tf_clear), and borrows the context, which
 * must outlive it.  The output formats are described in docs/output.md.
 */
#ifndef GS_TF_H
#define GS_TF_H

#include <stdio.h>

#include "algebra/poly.h"

typedef enum gs_tf_kind { GS_TF_TRANSFER, GS_TF_IMPEDANCE } gs_tf_kind;

typedef struct gs_tf {
    char *name;                 /* "Av" */
    gs_tf_kind kind;
    gs_poly num, den;
    const gs_polyctx *ctx;      /* borrowed */
    int s_var;                  /* the Laplace variable's id in ctx */
    char *description;          /* "v(out) / vin", may be NULL */
} gs_tf;

/* tf = 0/0 named NULL (printed as "H"), kind transfer, no description. */
void gs_tf_init(gs_tf *tf, const gs_polyctx *ctx, int s_var);
void gs_tf_clear(gs_tf *tf);
/* Replace name / description by a copy of the string (NULL allowed). */
void gs_tf_set_name(gs_tf *tf, const char *name);
void gs_tf_set_description(gs_tf *tf, const char *description);
/* The name the printers use: tf->name, or "H" when it is NULL or empty.
   Borrowed from tf. */
const char *gs_tf_name(const gs_tf *tf);

/* Printers.  collect_var is the symbol to group by (normally s_var; -1
   for none).  Each writes one complete item to out; deterministic. */

/* "Av = (N)/(D)": one line, N and D grouped by powers of collect_var,
   e.g. "Av = (-gm*RD)/(gm*RS + 1)" or "H = (1)/(C*R*s + 1)", in a syntax
   that sympy's sympify reads back (implicit multiplication never used,
   powers as ^, a group as (coef)*s^k). */
void gs_print_text(FILE *out, const gs_tf *tf, int collect_var);
/* That line, without the newline, as a JSON string (gs_json_string's
   escapes), written as it is made. */
void gs_print_text_json(FILE *out, const gs_tf *tf, int collect_var);
/* The same line as gs_print_text without the newline: a new string the
   caller frees. */
char *gs_tf_get_str(const gs_tf *tf, int collect_var);
/* The fraction drawn in 2-D text: numerator centred over a rule over the
   denominator, "Av = " at the rule's height; grouped by powers.  Lines
   are wrapped between terms to stay within 79 columns. */
void gs_print_pretty(FILE *out, const gs_tf *tf, int collect_var);
/* A LaTeX equation environment with \frac, subscripted symbols
   (gs_sym_latex_name), powers of collect_var collected. */
void gs_print_latex(FILE *out, const gs_tf *tf, int collect_var);
/* A self-contained C99 function
   `double complex NAME(double complex s, const struct NAME_params *p)`
   preceded by the struct of its parameters (one double per symbol other
   than s that occurs in num or den, in symbol order; names mangled into
   C identifiers) and #include <complex.h>; N and D by Horner's rule in
   s (the Laplace variable, whatever its name), coefficients the exact
   integers written as double literals. */
void gs_print_c(FILE *out, const gs_tf *tf);
/* One JSON object on one line, with no newline after it, so that a
   caller can join several into an array (docs/json.md): {"name", "kind",
   "description", "s", "collect", "symbols": [...],
   "num": [{"power": k, "terms": [{"coeff": "-3", "exps": {"gm": 1}}]}],
   "den": [...], "text": "..."}.  Coefficients as exact strings. */
void gs_print_json(FILE *out, const gs_tf *tf, int collect_var);

#endif
