/* sym.h - interned symbols. See LICENSE.
 *
 * A symbol table maps names to small dense ids (0, 1, 2, ... in the order
 * of first interning) and back.  A symbol may be the *reciprocal* of
 * another: the MNA stamps a resistor R as the conductance symbol 1/R, kept
 * as a symbol of its own so that matrix entries stay polynomials
 * (DESIGN.md).  Reciprocal symbols are named "1/R" and know their base.
 *
 * The table is an object with identity: gs_symtab_new / gs_symtab_free.
 * Names returned are owned by the table and live as long as it does.
 */
#ifndef GS_SYM_H
#define GS_SYM_H

typedef struct gs_symtab gs_symtab;

gs_symtab *gs_symtab_new(void);
void gs_symtab_free(gs_symtab *st);          /* NULL is fine */

/* Id of `name`, creating it if new.  Names are case-sensitive. */
int gs_symtab_intern(gs_symtab *st, const char *name);
/* Id of name if present, else -1. */
int gs_symtab_find(const gs_symtab *st, const char *name);
/* Id of the reciprocal of symbol `base` (created on first use).  The
   reciprocal of a reciprocal is its base. */
int gs_symtab_recip(gs_symtab *st, int base);
/* The same without creating: -1 when the reciprocal was never made. */
int gs_symtab_find_recip(const gs_symtab *st, int base);

int gs_symtab_count(const gs_symtab *st);
const char *gs_symtab_name(const gs_symtab *st, int id);
int gs_symtab_is_recip(const gs_symtab *st, int id);
/* base of a reciprocal symbol, or -1 for an ordinary one */
int gs_symtab_base(const gs_symtab *st, int id);

/* LaTeX form of a plain symbol name, a new string the caller frees:
   the first letter (or a Greek name: alpha, beta, ... lambda) is the
   body, the rest becomes a subscript, an underscore separates subscript
   parts with a comma:  gm -> g_{m}, rds -> r_{ds}, Cgs_M1 -> C_{gs,M1},
   R1 -> R_{1}, beta -> \beta, s -> s. */
char *gs_sym_latex_name(const char *name);
/* The LaTeX name of symbol id of st: a reciprocal symbol as \frac{1}{R}. */
char *gs_symtab_latex(const gs_symtab *st, int id);

#endif
