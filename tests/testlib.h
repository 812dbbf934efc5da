/* testlib.h - what the unit tests share besides check.h: one seeded
 * random generator.  See LICENSE.
 *
 * Every random test draws from base/rng.h's splitmix64 through these, so
 * a seed gives the same cases on every C library (libc rand() does not)
 * and a failure can be replayed from the seed it prints.
 */
#ifndef GS_TESTLIB_H
#define GS_TESTLIB_H

#include <stdint.h>

#include "base/rng.h"

/* uniform in [0, 1), 53 random bits */
static inline long double test_unit(gs_rng *r)
{
    return (long double)(gs_rng_next(r) >> 11) / 9007199254740992.0L;
}

/* uniform in [0, n), n >= 1 */
static inline unsigned test_below(gs_rng *r, unsigned n)
{
    return (unsigned)gs_rng_below(r, n);
}

#endif
