/* rng.h - one small seeded random generator, a value that travels in
 * arguments (no global state), with the same sequence on every C
 * library.  See LICENSE.
 */
#ifndef GS_RNG_H
#define GS_RNG_H

#include <stdint.h>

/* splitmix64 (Steele, Lea and Flood, "Fast splittable pseudorandom number
   generators", OOPSLA 2014): tiny, and good enough to pick primes and
   evaluation points. */
typedef struct gs_rng {
    uint64_t s;
} gs_rng;

void gs_rng_seed(gs_rng *r, uint64_t seed);
uint64_t gs_rng_next(gs_rng *r);
/* uniform in [0, n) for n >= 1 (rejection, no modulo bias) */
uint64_t gs_rng_below(gs_rng *r, uint64_t n);

#endif
