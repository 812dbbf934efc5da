/* main.c - the gainsmith command: a thin front end over the library.
 * See LICENSE.
 */
#include "cli/cmd.h"
#include "base/diag.h"
#include "gainsmith.h"

#include <stdio.h>
#include <string.h>

typedef struct command {
    const char *name;
    int (*run)(int argc, char **argv, FILE *out, FILE *err);
} command;

static const command commands[] = {
    {"derive", gs_cmd_derive},
    {"eval", gs_cmd_eval},
    {"poles", gs_cmd_poles},
    {"bode", gs_cmd_bode},
    {"step", gs_cmd_step},
    {"check", gs_cmd_check},
    {"extract", gs_cmd_extract},
    {"sens", gs_cmd_sens},
    {"report", gs_cmd_report},
    {"noise", gs_cmd_noise},
    {"approx", gs_cmd_approx},
};

#define NCOMMANDS (sizeof commands / sizeof commands[0])

static int help(int argc, char **argv)
{
    const char *text;
    if (argc < 3) {
        fputs(gs_cmd_help_text(NULL), stdout);
        return 0;
    }
    text = gs_cmd_help_text(argv[2]);
    if (text == NULL) {
        fprintf(stderr, "gainsmith help: error: no command '%s'\n", argv[2]);
        fprintf(stderr, "gainsmith help: hint: 'gainsmith help' lists the "
                "commands\n");
        return 2;
    }
    fputs(text, stdout);
    return 0;
}

int main(int argc, char **argv)
{
    size_t i;
    int status;
    if (argc < 2 || strcmp(argv[1], "--help") == 0
        || strcmp(argv[1], "-h") == 0) {
        fputs(gs_cmd_help_text(NULL), argc < 2 ? stderr : stdout);
        return argc < 2 ? 2 : 0;
    }
    if (strcmp(argv[1], "--version") == 0) {
        printf("gainsmith %s\n", GS_VERSION);
        return 0;
    }
    if (strcmp(argv[1], "help") == 0)
        return help(argc, argv);
    for (i = 0; i < NCOMMANDS; i++) {
        if (strcmp(argv[1], commands[i].name) == 0) {
            status = commands[i].run(argc - 1, argv + 1, stdout, stderr);
            if (fflush(stdout) != 0) {
                perror("gainsmith: standard output");
                return 2;
            }
            return status;
        }
    }
    fprintf(stderr, "gainsmith: error: unknown command '%s'\n", argv[1]);
    {
        const char *names[NCOMMANDS + 2], *best;
        for (i = 0; i < NCOMMANDS; i++)
            names[i] = commands[i].name;
        names[NCOMMANDS] = "help";
        names[NCOMMANDS + 1] = NULL;
        best = gs_closest_word(argv[1], names);
        if (best)
            fprintf(stderr, "gainsmith: hint: did you mean '%s'?\n", best);
        else
            fprintf(stderr, "gainsmith: hint: 'gainsmith help' lists the "
                    "commands\n");
    }
    return 2;
}
