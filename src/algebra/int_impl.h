/* int_impl.h - internal to the integers (int.c, int_div.c): the limb
 * representation, the read-only views, the small helpers both files
 * use, and the magnitude and result routines of int.c that division
 * calls.  Nothing else includes it.  See LICENSE.
 *
 * The small helpers are defined here as plain static functions, as they
 * were in int.c, so the compiler inlines them as it did there; each is
 * used by both files (an unused one would be a warning).
 */
#ifndef GS_INT_IMPL_H
#define GS_INT_IMPL_H

#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>

#include "algebra/int.h"
#include "base/mem.h"

typedef uint32_t limb;
typedef uint64_t dlimb;
#define LIMB_BITS 32
#define LIMB_MAX UINT32_MAX

/* A read-only look at a magnitude and its sign.  Small values are spread
   into buf; a view must not be copied (d may point into it). */
typedef struct {
    const limb *d;
    size_t n;
    int neg;
    limb buf[2];
} mview;

/* ---- bits and words ----------------------------------------------------- */

static unsigned clz32(limb x)
{
#if defined(__GNUC__) && !defined(GS_PORTABLE_INT)
    return x ? (unsigned)__builtin_clz(x) : 32u;
#else
    unsigned n = 0;
    if (x == 0)
        return 32;
    while (!(x & 0x80000000u)) {
        x <<= 1;
        n++;
    }
    return n;
#endif
}

static uint64_t uabs64(int64_t v)
{
    return v < 0 ? 0 - (uint64_t)v : (uint64_t)v;
}

/* ---- magnitudes --------------------------------------------------------- */

static size_t mag_norm(const limb *d, size_t n)
{
    while (n > 0 && d[n - 1] == 0)
        n--;
    return n;
}

static int mag_cmp(const limb *a, size_t an, const limb *b, size_t bn)
{
    if (an != bn)
        return an < bn ? -1 : 1;
    while (an-- > 0)
        if (a[an] != b[an])
            return a[an] < b[an] ? -1 : 1;
    return 0;
}

static size_t mag_bits(const limb *d, size_t n)
{
    return n == 0 ? 0 : LIMB_BITS * n - clz32(d[n - 1]);
}

/* bits [s, s + 32) of d[0..n) */
static limb limb_at(const limb *d, size_t n, size_t s)
{
    size_t w = s / LIMB_BITS;
    unsigned b = (unsigned)(s % LIMB_BITS);
    limb lo = w < n ? d[w] >> b : 0;
    limb hi = b != 0 && w + 1 < n ? d[w + 1] << (LIMB_BITS - b) : 0;
    return lo | hi;
}

/* ---- views and results -------------------------------------------------- */

static void view_u64(mview *w, uint64_t m, int neg)
{
    w->buf[0] = (limb)m;
    w->buf[1] = (limb)(m >> LIMB_BITS);
    w->n = w->buf[1] ? 2 : w->buf[0] ? 1 : 0;
    w->d = w->buf;
    w->neg = neg;
}

static void view_of(mview *w, const gs_int *a)
{
    if (a->size == 0) {
        view_u64(w, uabs64(a->u.v), a->u.v < 0);
    } else {
        w->d = a->u.d;
        w->n = (size_t)(a->size < 0 ? -(int64_t)a->size : a->size);
        w->neg = a->size < 0;
    }
}

static void set_small(gs_int *r, int64_t v)
{
    if (r->alloc != 0)
        gs_free(r->u.d);
    r->size = 0;
    r->alloc = 0;
    r->u.v = v;
}

/* ---- in int.c: magnitudes and results that division uses ---------------- */

/* r = a - b with a >= b; r may be a or b.  Returns the normalized length. */
size_t gs_int_mag_sub(limb *r, const limb *a, size_t an, const limb *b,
                      size_t bn);
/* d[0..n) += 1; d has room for n + 1 limbs.  Returns the length. */
size_t gs_int_mag_inc(limb *d, size_t n);
/* q = a / d, returns a mod d; q may be a. */
limb gs_int_mag_divrem_1(limb *q, const limb *a, size_t n, limb d);
/* q[0..un-n] = u / v and r[0..n) = u mod v for un >= n >= 2, v[n-1] != 0
   (Knuth's algorithm D).  Outputs overlap no input. */
void gs_int_mag_divrem_knuth(limb *q, limb *r, const limb *u, size_t un,
                             const limb *v, size_t n);
/* a mod m for 0 < m < 2^63. */
uint64_t gs_int_mag_mod_u64(const limb *d, size_t n, uint64_t m);
/* r = +-buf[0..n), taking ownership of buf (cap limbs, possibly r's own
   array); back to the inline form when the value fits. */
void gs_int_set_mag(gs_int *r, limb *buf, size_t n, size_t cap, int neg);
/* r = +-m */
void gs_int_set_u64(gs_int *r, uint64_t m, int neg);
/* r = +-|a| (a view, possibly of r itself) */
void gs_int_set_view(gs_int *r, const mview *a, int neg);

#endif
