/* rng.c - splitmix64; see rng.h.  See LICENSE. */
#include "base/rng.h"

void gs_rng_seed(gs_rng *r, uint64_t seed)
{
    r->s = seed;
}

uint64_t gs_rng_next(gs_rng *r)
{
    uint64_t z = (r->s += 0x9E3779B97F4A7C15u);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9u;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBu;
    return z ^ (z >> 31);
}

uint64_t gs_rng_below(gs_rng *r, uint64_t n)
{
    /* reject the top partial copy of [0, n) so every value is as likely */
    uint64_t limit = UINT64_MAX - UINT64_MAX % n;
    uint64_t v;
    do {
        v = gs_rng_next(r);
    } while (v >= limit);
    return v % n;
}
