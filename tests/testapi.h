/* testapi.h - what the tests of the public interface share: a result's
 * outputs as one text.  Public calls only, so that a test built against
 * the installed header alone can use it.  See LICENSE.
 */
#ifndef GS_TESTAPI_H
#define GS_TESTAPI_H

#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"

/* Every output's gs_result_text, one a line, in a new string. */
static inline char *test_result_texts(const gs_result *r)
{
    size_t i, len = 0;
    char *all = calloc(1, 1);
    for (i = 0; i < gs_result_count(r); i++) {
        char *t = gs_result_text(r, i);
        size_t n = strlen(t);
        all = realloc(all, len + n + 2);
        memcpy(all + len, t, n);
        all[len + n] = '\n';
        all[len + n + 1] = '\0';
        len += n + 1;
        free(t);
    }
    return all;
}

#endif
