/* main.c - the gainsmith command: a thin front end over the library.
 * See LICENSE.
 */
#include "cli/cmd.h"
#include "base/diag.h"
#include "gainsmith.h"

#include <stdio.h>
#include <string.h>

static int help(int argc, char **argv)
{
    const char *text;
    if (argc < 3) {
        gs_cmd_print_overview(stdout);
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
    const gs_cmd_entry *commands, *c;
    size_t i, ncommands;
    int status;
    if (argc < 2 || strcmp(argv[1], "--help") == 0
        || strcmp(argv[1], "-h") == 0) {
        gs_cmd_print_overview(argc < 2 ? stderr : stdout);
        return argc < 2 ? 2 : 0;
    }
    if (strcmp(argv[1], "--version") == 0) {
        printf("gainsmith %s\n", GS_VERSION);
        return 0;
    }
    if (strcmp(argv[1], "help") == 0)
        return help(argc, argv);
    c = gs_cmd_find(argv[1]);
    if (c != NULL) {
        status = c->run(argc - 1, argv + 1, stdout, stderr);
        if (fflush(stdout) != 0) {
            perror("gainsmith: standard output");
            return 2;
        }
        return status;
    }
    fprintf(stderr, "gainsmith: error: unknown command '%s'\n", argv[1]);
    {
        /* room for the table's names, "help" and the NULL end */
        const char *names[32], *best;
        commands = gs_cmd_table(&ncommands);
        for (i = 0; i < ncommands && i < 30; i++)
            names[i] = commands[i].name;
        names[i] = "help";
        names[i + 1] = NULL;
        best = gs_closest_word(argv[1], names);
        if (best)
            fprintf(stderr, "gainsmith: hint: did you mean '%s'?\n", best);
        else
            fprintf(stderr, "gainsmith: hint: 'gainsmith help' lists the "
                    "commands\n");
    }
    return 2;
}
