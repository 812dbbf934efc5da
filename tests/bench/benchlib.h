/* benchlib.h - the clock, the comparison and the median that every
 * benchmark program and the timer share.  See LICENSE.
 */
#ifndef GS_BENCHLIB_H
#define GS_BENCHLIB_H

#include <stdlib.h>
#include <time.h>

/* Seconds on the monotonic clock (not the wall clock, which can jump). */
static inline double bench_now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* qsort's comparison of doubles, increasing. */
static inline int bench_cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

/* The median of v[0 .. n-1] (n >= 1; v is sorted in place): the middle
   one, or the mean of the two middle ones for even n. */
static inline double bench_median(double *v, int n)
{
    qsort(v, (size_t)n, sizeof v[0], bench_cmp_double);
    if (n % 2 == 1)
        return v[n / 2];
    return (v[n / 2 - 1] + v[n / 2]) / 2;
}

#endif
