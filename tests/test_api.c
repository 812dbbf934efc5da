/* test_api.c - the public interface, used as a program outside would.
 * See LICENSE.
 */
#include "check.h"
#include "gainsmith.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void test_derive_example(void)
{
    gs_result *r = NULL;
    char *messages = NULL, *text, *json;
    int rc = gs_derive_file(&r, "examples/inverting_amp.gsc", NULL,
                            &messages);
    CHECK(rc == GS_OK);
    CHECK(messages == NULL);
    CHECK(gs_result_count(r) == 1);
    CHECK(strcmp(gs_result_name(r, 0), "Av") == 0);
    text = gs_result_text(r, 0);
    /* Inverting amplifier with finite open-loop gain A:
       -A R2 / (R1 + R2 + A R1) (Sedra & Smith, Microelectronic Circuits,
       ch. 2, from memory); the term order is docs/output.md's. */
    CHECK_MSG(strcmp(text, "Av = (-R2*A)/(R1*A + R1 + R2)") == 0, "%s",
              text);
    json = gs_result_json(r, 0);
    CHECK(json[0] == '{' && strstr(json, "\"name\": \"Av\"") != NULL);
    free(text);
    free(json);
    gs_result_free(r);
}

static void test_errors(void)
{
    gs_result *r = (gs_result *)1;
    char *messages = NULL;
    int rc = gs_derive_file(&r, "tests/cli/err_unknown_statement.gsc", NULL,
                            &messages);
    CHECK(rc == GS_ESYNTAX);
    CHECK(r == NULL);
    CHECK(messages && strstr(messages, ":3:1: error: unknown statement "
                                       "'resistr'") != NULL);
    free(messages);
    rc = gs_derive_file(&r, "tests/cli/no-such-file.gsc", NULL, &messages);
    CHECK(rc == GS_EIO && r == NULL && messages != NULL);
    free(messages);
    rc = gs_derive_file(&r, "examples/cs_degen.gsc", "Nope", NULL);
    CHECK(rc == GS_EINVAL && r == NULL);
    gs_result_free(NULL);
    CHECK(strcmp(gs_strerror(GS_ESINGULAR), "singular system") == 0);
}

int main(void)
{
    test_derive_example();
    test_errors();
    return check_report("api");
}
