/* cmd.h - the subcommands of the gainsmith command. See LICENSE.
 *
 * Each command is a function of one shape: it takes the arguments after
 * the command name (argv[0] is the command name itself), writes results to
 * out and diagnostics to err, and returns the exit status: 0 success,
 * 1 the analysis failed, 2 bad input or usage.  Only src/main.c turns that
 * into the process's exit status.
 */
#ifndef GS_CMD_H
#define GS_CMD_H

#include <stdio.h>

struct gs_cli;
struct gs_job;

int gs_cmd_derive(int argc, char **argv, FILE *out, FILE *err);
int gs_cmd_eval(int argc, char **argv, FILE *out, FILE *err);
int gs_cmd_poles(int argc, char **argv, FILE *out, FILE *err);
int gs_cmd_bode(int argc, char **argv, FILE *out, FILE *err);
int gs_cmd_step(int argc, char **argv, FILE *out, FILE *err);
int gs_cmd_check(int argc, char **argv, FILE *out, FILE *err);
/* gainsmith sens FILE: normalised sensitivities (cmd_sens.c). */
int gs_cmd_sens(int argc, char **argv, FILE *out, FILE *err);
/* gainsmith report FILE -o DOC: the review document (cmd_report.c). */
int gs_cmd_report(int argc, char **argv, FILE *out, FILE *err);
/* gainsmith extract mos|bjt --KEY=VAL...: device figures to model
   parameters (cmd_extract.c, docs/devices.md). */
int gs_cmd_extract(int argc, char **argv, FILE *out, FILE *err);
/* gainsmith noise FILE: noise densities, their transfers and integrated
   noise (cmd_noise.c, docs/noise.md). */
int gs_cmd_noise(int argc, char **argv, FILE *out, FILE *err);

/* gainsmith approx FILE: short forms with a measured error
   (cmd_approx.c, docs/approx.md). */
int gs_cmd_approx(int argc, char **argv, FILE *out, FILE *err);
/* The budget options --max-terms and --max-memory of cl into o (the
   defaults when absent).  Returns an exit status (2 on a bad value). */
struct gs_derive_opts;
int gs_cmd_budget(struct gs_derive_opts *o, const struct gs_cli *cl,
                  const char *cmd, FILE *err);
/* The steps derive, eval and check share (cmd_derive.c): read the file
   argument and the derive options of cl, parse and derive into j.
   Returns an exit status; messages go to err prefixed by cmd.  Status 1
   with j->partial set: outputs with no finite limit were left out and j
   holds the others (use gs_cmd_derive_some). */
int gs_cmd_load_and_derive(struct gs_job *j, const struct gs_cli *cl,
                           const char *cmd, FILE *err);
/* gs_cmd_load_and_derive for a command that goes on with the outputs it
   has: status 0 with *partial = 1 when outputs with no finite limit were
   left out (their errors already on err); the command runs on the
   others and returns 1 at the end. */
int gs_cmd_derive_some(struct gs_job *j, const struct gs_cli *cl,
                       const char *cmd, int *partial, FILE *err);

/* Bind the numbers of j from its value lines and the --set options of cl;
   prints diagnostics to err; returns an exit status. */
int gs_cmd_bind(struct gs_job *j, const struct gs_cli *cl, FILE *err);

/* The manual text of `extract` (cmd_extract.c). */
extern const char gs_cmd_extract_help_text[];
const char *gs_cmd_extract_help(void);

/* One command of the table in help.c, the single list of commands. */
typedef struct gs_cmd_entry {
    const char *name;       /* "derive" */
    const char *summary;    /* its line in the overview */
    int (*run)(int argc, char **argv, FILE *out, FILE *err);
    const char *help;       /* its manual text (gainsmith help NAME) */
} gs_cmd_entry;

/* The table and its length in *n, in the order the overview lists it. */
const gs_cmd_entry *gs_cmd_table(size_t *n);
/* The entry of name, or NULL when there is no such command (or NULL). */
const gs_cmd_entry *gs_cmd_find(const char *name);
/* The overview (gainsmith help): usage, the table's commands, help. */
void gs_cmd_print_overview(FILE *out);

/* The manual text of a command ("derive"), or NULL when unknown. */
const char *gs_cmd_help_text(const char *command);

#endif
