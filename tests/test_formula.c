/* test_formula.c - text formulas set as LaTeX (output/formula.h).
 * See LICENSE.
 *
 * The expected strings are the standard LaTeX of each formula, written
 * by hand: a quotient as \frac, a product with thin spaces \, and a
 * power as a superscript, names as the polynomial printers set them
 * (kf_M1 as k_{f,M1}) (Lamport, "LaTeX: A Document Preparation
 * System", the math chapter, from memory); tests/latex_check.sh
 * compiles the noise densities set this way with pdflatex.
 */
#include "check.h"
#include "output/formula.h"

#include <stdlib.h>
#include <string.h>

static void same(const char *text, const char *want)
{
    char *got = gs_formula_latex(text);
    CHECK_MSG(got != NULL && strcmp(got, want) == 0, "%s: got %s, want %s",
              text, got ? got : "(null)", want);
    free(got);
}

static void refused(const char *text)
{
    char *got = gs_formula_latex(text);
    CHECK_MSG(got == NULL, "%s: got %s", text, got ? got : "");
    free(got);
}

int main(void)
{
    /* the resistor's thermal noise as a current, 4kT/R */
    same("4*k*T/R1", "\\frac{4\\,k\\,T}{R_{1}}");
    same("4*k*T*G", "4\\,k\\,T\\,G");
    /* a parenthesised fraction is a factor without parentheses, and
       one raised to a power keeps them */
    same("4*k*T*nthermal_M1*(1/500)",
         "4\\,k\\,T\\,n_{thermal,M1}\\,\\frac{1}{500}");
    same("(1/500)^2*kf_M1/(cox_M1*w_M1*l_M1*f)",
         "\\frac{\\left(\\frac{1}{500}\\right)^{2}\\,k_{f,M1}}"
         "{c_{ox,M1}\\,w_{M1}\\,l_{M1}\\,f}");
    /* a sum as a factor or a base is parenthesised */
    same("(a + b)*c", "\\left(a + b\\right)\\,c");
    same("(a - b)^2", "\\left(a - b\\right)^{2}");
    same("-x/y", "\\frac{-x}{y}");
    same("2e-25/f", "\\frac{2e-25}{f}");
    refused("4*k*");
    refused("(a + b");
    refused("a b");
    return check_report("formula");
}
