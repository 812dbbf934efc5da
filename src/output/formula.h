/* formula.h - short text formulas set as LaTeX. See LICENSE.
 *
 * The densities of the noise analysis and similar figures are written as
 * text: products and quotients of numbers and symbol names, with powers
 * and parentheses ("4*k*T/R1", "(1/500)^2*kf_M1/(cox_M1*w_M1*l_M1*f)").
 * gs_formula_latex sets such a text as LaTeX math: a quotient as \frac,
 * a product with thin spaces, a power as a superscript, names as the
 * polynomial printers set them (gs_sym_latex_name).
 */
#ifndef GS_FORMULA_H
#define GS_FORMULA_H

/* The LaTeX of text (a new string the caller frees), or NULL when the
   text is not of that grammar:
     sum     := product (('+' | '-') product)*
     product := power (('*' | '/') power)*
     power   := atom ('^' atom)?
     atom    := NUMBER | NAME | '(' sum ')' | '-' power            */
char *gs_formula_latex(const char *text);

#endif
