/* print_approx.h - printers of a gs_approx_result. See LICENSE.
 *
 * text: the simplified H (sympy-readable), its measured errors, the
 * low-frequency gain in its design-oriented form, every pole and zero
 * with its estimate and error, the conditions, and the normalised form
 * when every root of the simplified H has an estimate.  pretty and latex
 * draw H in 2-D text / LaTeX and write the forms in that style.  json:
 * one object (docs/json.md).  All deterministic.
 */
#ifndef GS_PRINT_APPROX_H
#define GS_PRINT_APPROX_H

#include <stdio.h>

#include "analysis/approx.h"

/* style: GS_FORM_TEXT, GS_FORM_PRETTY or GS_FORM_LATEX */
void gs_print_approx(FILE *out, const gs_approx_result *r, int style);
void gs_print_approx_json(FILE *out, const gs_approx_result *r);

#endif
