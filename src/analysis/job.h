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
#include "analysis/mgraph.h"
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
    int graph_ok;           /* set before gs_job_derive: an output whose
                               expansion exceeds the budget is kept as its
                               graph of minors, for the numbers */
    gs_mgraph **graph;      /* per output: that graph, or NULL */
    int partial;            /* after gs_job_derive: 1 when it returned
                               GS_ERANGE for outputs left out, and tf holds
                               every other output (at least one) */
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

/* Derive every output, or only the one named `only` (NULL for all).
   An output with no finite limit under o's limits is left out (its
   message in d) and the others derived: GS_ERANGE at the end, with
   j->partial set when some were derived.  Any other error stops the run
   and is returned at once. */
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
   bound values.  *deg gets the degree (-1 for p = 0).  For the num or
   den of an output held as a graph, they come from the graph (the same
   ratio, before any common factor is cancelled). */
long double *gs_job_coeffs(const gs_job *j, const gs_poly *p, int *deg);

/* What an output is measured in, from what it is: a transfer of v() over
   a vsource is V/V and of i() over an isource A/A (gains, in dB); v()
   over an isource is a transimpedance, V/A, and i() over a vsource a
   transadmittance, A/V; an impedance is in ohms.  Magnitudes of the last
   three are in dB relative to 1 of their unit (dBΩ, dBS), and figures
   that belong to gains (unity-gain frequency, -3 dB bandwidth, margins)
   mean nothing for them. */
typedef struct gs_unit_info {
    const char *unit;       /* "V/V", "A/A", "V/A", "A/V", "Ω" (UTF-8) */
    const char *db;         /* "dB", "dBΩ", "dBS" */
    const char *word;       /* "gain", "transimpedance", "transadmittance",
                               "impedance" */
    int is_gain;            /* 1 for V/V and A/A */
} gs_unit_info;

/* The unit of the derived output tf[i]. */
void gs_job_unit(gs_unit_info *u, const gs_job *j, size_t i);

/* Exit status for a library status code: 2 for bad input, 1 otherwise. */
int gs_job_exit_status(int rc);

#endif
