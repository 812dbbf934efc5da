/* checker.h - internals shared by the structural checks (check*.c):
 * the helpers of check_util.c and the checks of check_parts.c and
 * check_rank.c, which check.c's gs_circuit_check runs.  See LICENSE.
 */
#ifndef GS_CHECKER_H
#define GS_CHECKER_H

#include <stddef.h>

#include "circuit/circuit.h"
#include "base/diag.h"

typedef struct gs_checker {
    const gs_circuit *c;
    gs_diag *d;
    int *parent;            /* union-find over nodes, for one check */
    unsigned char *flagged; /* per node: already named in an error */
} gs_checker;

/* Union-find with path halving (Tarjan and van Leeuwen, J. ACM 31,
   1984). */
int gs_uf_find(int *parent, int x);
void gs_uf_union(int *parent, int a, int b);
void gs_uf_reset(int *parent, int n);

/* A message at line:col of the circuit's file (no place for line 0). */
void gs_check_report(const gs_checker *k, int severity, int line, int col,
                     const char *hint, const char *msg);
/* "'a', 'b', ..." (quote 1) or "a, b, ..." of up to 8 names, then ", ...";
   a new string. */
char *gs_check_list(const char *const *names, size_t n, int quote);

/* A vccs or vcvs whose two control terminals are one node senses 0. */
int gs_senses_nothing(const gs_element *e);

/* check_parts.c: parts of the circuit that nothing ties to gnd, and
   nodes with one connection (warnings). */
void gs_check_parts(gs_checker *k);
void gs_check_single(const gs_checker *k);
/* check_rank.c: equations singular by their pattern of nonzeros alone. */
void gs_check_rank(const gs_checker *k);

#endif
