/* test_commands.c - the table of commands (src/cli/help.c) against the
 * manual: every command has its manual text, a section of man/gainsmith.1
 * and one of docs/commands.md, and the overview lists each.  Run from the
 * top of the source tree (tests/run_tests.sh does).  See LICENSE.
 */
#include "check.h"
#include "cli/cmd.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Whether the file at path has a line equal to want (without newline). */
static int has_line(const char *path, const char *want)
{
    char line[512];
    int found = 0;
    FILE *f = fopen(path, "r");
    if (f == NULL)
        return 0;
    while (!found && fgets(line, sizeof line, f)) {
        line[strcspn(line, "\n")] = '\0';
        found = strcmp(line, want) == 0;
    }
    fclose(f);
    return found;
}

static void test_every_command_documented(void)
{
    size_t i, n;
    const gs_cmd_entry *t = gs_cmd_table(&n);
    char want[128];
    CHECK(n > 0);
    for (i = 0; i < n; i++) {
        /* the manual text starts with its own usage line */
        snprintf(want, sizeof want, "usage: gainsmith %s ", t[i].name);
        CHECK_MSG(t[i].help && strncmp(t[i].help, want, strlen(want)) == 0,
                  "%s: no manual text", t[i].name);
        CHECK_MSG(t[i].run != NULL, "%s: no handler", t[i].name);
        CHECK_MSG(t[i].summary && t[i].summary[0] != '\0',
                  "%s: no summary", t[i].name);
        CHECK(gs_cmd_find(t[i].name) == &t[i]);
        CHECK(gs_cmd_help_text(t[i].name) == t[i].help);
        snprintf(want, sizeof want, ".SS %s", t[i].name);
        CHECK_MSG(has_line("man/gainsmith.1", want),
                  "%s: no section in man/gainsmith.1", t[i].name);
        snprintf(want, sizeof want, "## %s", t[i].name);
        CHECK_MSG(has_line("docs/commands.md", want),
                  "%s: no section in docs/commands.md", t[i].name);
    }
    CHECK(gs_cmd_find("no-such-command") == NULL);
    CHECK(gs_cmd_find(NULL) == NULL);
}

/* The overview has one line per command of the table. */
static void test_overview_lists_table(void)
{
    size_t i, n;
    const gs_cmd_entry *t = gs_cmd_table(&n);
    char *buf = NULL, want[160];
    size_t len = 0;
    FILE *f = open_memstream(&buf, &len);
    CHECK(f != NULL);
    if (f == NULL)
        return;
    gs_cmd_print_overview(f);
    fclose(f);
    for (i = 0; i < n; i++) {
        snprintf(want, sizeof want, "\n  %-9s %s\n", t[i].name,
                 t[i].summary);
        CHECK_MSG(strstr(buf, want) != NULL, "%s: not in the overview",
                  t[i].name);
    }
    free(buf);
}

int main(void)
{
    test_every_command_documented();
    test_overview_lists_table();
    return check_report("commands");
}
