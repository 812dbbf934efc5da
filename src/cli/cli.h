/* cli.h - command-line options of the subcommands. See LICENSE.
 *
 * Options are long only: "--name VALUE" or "--name=VALUE"; "--" ends the
 * options; "-" alone is a positional argument (standard input).  A spec
 * lists the options a command takes; parsing reports unknown options with
 * a did-you-mean hint, missing values and repeats of single options.
 */
#ifndef GS_CLI_H
#define GS_CLI_H

#include <stddef.h>
#include <stdio.h>

typedef struct gs_cli_opt {
    const char *name;     /* without the dashes: "format" */
    int has_arg;
    int repeatable;
} gs_cli_opt;

typedef struct gs_cli {
    const gs_cli_opt *spec;
    size_t nspec;
    size_t npos;
    char **pos;           /* borrowed from argv */
    size_t *count;        /* per spec entry */
    char ***vals;         /* per spec entry: count values (borrowed) */
} gs_cli;

/* Parse argv[1 ..] (argv[0] is the command).  On error prints
   "gainsmith CMD: error: ..." to err and returns 2; else 0.  cl is the
   caller's and must be cleared with gs_cli_clear either way. */
int gs_cli_parse(gs_cli *cl, int argc, char **argv, const gs_cli_opt *spec,
                 FILE *err);
void gs_cli_clear(gs_cli *cl);

size_t gs_cli_count(const gs_cli *cl, const char *name);
/* The value of the i-th occurrence (0-based), or NULL if absent; for a
   flag without argument, "" when given. */
const char *gs_cli_get(const gs_cli *cl, const char *name, size_t i);
int gs_cli_has(const gs_cli *cl, const char *name);

/* Helpers for option values: a non-negative whole number / a real number
   with optional SI prefix and unit suffix (e.g. "1k", "10kHz").  Return 0
   on success, else print a message about option `name` and return 2. */
int gs_cli_size(size_t *out, const char *text, const char *cmd,
                const char *name, FILE *err);
/* A size in bytes: a whole number with an optional B, k/M/G/T (powers
   of 1000, optionally followed by B) or KiB/MiB/GiB/TiB. */
int gs_cli_bytes(size_t *out, const char *text, const char *cmd,
                 const char *name, FILE *err);
int gs_cli_real(long double *out, const char *text, const char *unit,
                const char *cmd, const char *name, FILE *err);
/* --tol X (dB, phase 10 X degrees), X/Y (dB/degrees) or P% (a relative
   error P: 20 log10(1 + P) dB, asin(P) degrees) into *tol_db, *tol_deg;
   0, or 2 with the message on err under the command's name. */
int gs_cli_tol(long double *tol_db, long double *tol_deg, const char *t,
               const char *cmd, FILE *err);

#endif
