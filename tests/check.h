/* check.h - a tiny unit-test harness. See LICENSE.
 *
 * CHECK(cond) counts a pass or prints "file:line: check failed: cond" and
 * counts a failure.  CHECK_MSG adds a printf-style explanation (print the
 * seed and the inputs of a random case there).  A test file's main() calls
 * its test functions and ends with `return check_report("name");`, which
 * prints "name: N passed, N failed" and returns nonzero on any failure.
 */
#ifndef GS_CHECK_H
#define GS_CHECK_H

#include <stdio.h>

static int check_passed_, check_failed_;

#define CHECK(cond) CHECK_MSG(cond, "%s", "")

#define CHECK_MSG(cond, ...)                                              \
    do {                                                                  \
        if (cond) {                                                       \
            check_passed_++;                                              \
        } else {                                                          \
            check_failed_++;                                              \
            fprintf(stderr, "%s:%d: check failed: %s ", __FILE__,         \
                    __LINE__, #cond);                                     \
            fprintf(stderr, __VA_ARGS__);                                 \
            fputc('\n', stderr);                                          \
        }                                                                 \
    } while (0)

static inline int check_report(const char *name)
{
    printf("%s: %d passed, %d failed\n", name, check_passed_, check_failed_);
    return check_failed_ != 0;
}

#endif
