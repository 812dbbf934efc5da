/* job.h - one run over a circuit file: parse, derive, bind values.
 * See LICENSE.
 *
 * The commands that analyse a circuit share these steps; a gs_job holds
 * what they produce.  The caller owns the struct (gs_job_init /
 * gs_job_clear); the job owns everything it points to.
 */
#ifndef GS_JOB_H
#define GS_JOB_H

#include "circuit/circuit.h"
#include "analysis/derive.h"
#include "base/diag.h"
#include "analysis/tf.h"

typedef struct gs_job {
    gs_circuit *c;
    gs_polyctx *ctx;
    size_t ntf;
    gs_tf *tf;              /* derived outputs, in file order */
    size_t *out_index;      /* tf[i] is c->outputs[out_index[i]] */
    gs_derive_stats *stats; /* how each derivation went */
    long double *vals;      /* per symbol, after gs_job_bind */
    unsigned char *set;     /* per symbol: 1 when bound */
    char **origin;          /* per symbol: "bias M1", "--set", or NULL for
                               a value line (owned strings) */
} gs_job;

void gs_job_init(gs_job *j);
void gs_job_clear(gs_job *j);

/* Parse the file ("-" is standard input) and make the polynomial context.
   GS_OK, or the parser's code with messages in d. */
int gs_job_load(gs_job *j, const char *path, gs_diag *d);
/* The same for a circuit held in text; name is the file name messages
   give. */
int gs_job_load_string(gs_job *j, const char *name, const char *text,
                       gs_diag *d);

/* Add an output "NAME = OUT / SRC" given on the command line, as if the
   file had a transfer line: OUT is v(a), v(a, b) or i(ELEMENT), SRC an
   independent source.  GS_OK, or GS_ESYNTAX / GS_EINVAL with a message
   in d that names the option. */
int gs_job_add_transfer(gs_job *j, const char *name, const char *out,
                        const char *src, gs_diag *d);

/* Derive every output, or only the one named `only` (NULL for all). */
int gs_job_derive(gs_job *j, const char *only, const gs_derive_opts *o,
                  gs_diag *d);

/* Bind numbers: value lines, bias lines, and the overrides "SYM=EXPR"
   (sets[0 .. nsets-1]), which win over both and feed the values that
   depend on them.  A symbol given by a value line and by a bias line is an
   error.  Then every symbol of every derived output other
   than s must have a value: the missing ones are named in one error. */
int gs_job_bind(gs_job *j, char *const *sets, size_t nsets, gs_diag *d);

/* used[v] = 1 for every symbol v that occurs in a derived output (s
   included); a new array of ctx->nvars flags the caller frees. */
unsigned char *gs_job_used_symbols(const gs_job *j);

/* Numeric coefficients of p in powers of s (ascending: out[k] is the
   coefficient of s^k, deg+1 entries, allocated, caller frees), from the
   bound values.  *deg gets the degree (-1 for p = 0). */
long double *gs_job_coeffs(const gs_job *j, const gs_poly *p, int *deg);

/* Exit status for a library status code: 2 for bad input, 1 otherwise. */
int gs_job_exit_status(int rc);

#endif
