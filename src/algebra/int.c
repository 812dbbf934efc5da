/* int.c - arbitrary-precision signed integers. See LICENSE.
 *
 * Small values (|v| <= INT64_MAX) live inline in the struct; larger ones
 * own a little-endian array of 32-bit limbs, with 64-bit intermediates for
 * every limb operation.  The limb routines work on magnitudes ("mag_*");
 * the public functions look at the operands through read-only views that
 * give small values a two-limb array on the stack, so one code path serves
 * every mix of small and big operands.  Results are written into a buffer
 * that is either the output's own (when that is safe) or a fresh one, and
 * gs_int_set_mag() then installs it, dropping back to the inline form
 * whenever the value fits.  Division, gcd and lcm are in int_div.c, and
 * int_impl.h holds what the two files share.
 */
#include "algebra/int.h"
#include "algebra/int_impl.h"

#include <float.h>
#include <inttypes.h>
#include <limits.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"

/* Checked 64-bit arithmetic: compiler builtins where known to exist.
   Defining GS_PORTABLE_INT selects the plain C fallbacks (for tests). */
#if defined(GS_PORTABLE_INT)
/* neither builtins nor a 128-bit type */
#elif defined(__GNUC__) && !defined(__clang__) && __GNUC__ >= 5
#define GS_HAVE_OVERFLOW_BUILTINS 1
#elif defined(__has_builtin)
#if __has_builtin(__builtin_add_overflow) \
    && __has_builtin(__builtin_mul_overflow)
#define GS_HAVE_OVERFLOW_BUILTINS 1
#endif
#endif

#if defined(__SIZEOF_INT128__) && !defined(GS_PORTABLE_INT)
#define GS_HAVE_INT128 1
__extension__ typedef __int128 i128;
__extension__ typedef unsigned __int128 u128;
#endif

/* Stack room for products in addmul before falling back to the heap. */
#define ADDMUL_STACK 16
/* Operand size (limbs) from which Karatsuba beats schoolbook.  On x86-64
   thresholds from 24 to 48 limbs timed within noise of each other; common
   practice puts it at 20 to 40 limbs.  May be set with -D for tuning. */
#ifndef KARATSUBA_MIN
#define KARATSUBA_MIN 32
#endif

/* ---- bits and words ----------------------------------------------------- */

/* *s = a + b when the sum is a small value (in [-INT64_MAX, INT64_MAX]). */
static int add_small(int64_t *s, int64_t a, int64_t b)
{
#ifdef GS_HAVE_OVERFLOW_BUILTINS
    return !__builtin_add_overflow(a, b, s) && *s != INT64_MIN;
#else
    if ((b > 0 && a > INT64_MAX - b) || (b < 0 && a < -INT64_MAX - b))
        return 0;
    *s = a + b;
    return 1;
#endif
}

/* *p = a * b when the product is a small value. */
static int mul_small(int64_t *p, int64_t a, int64_t b)
{
#ifdef GS_HAVE_OVERFLOW_BUILTINS
    return !__builtin_mul_overflow(a, b, p) && *p != INT64_MIN;
#else
    uint64_t ua = uabs64(a), ub = uabs64(b), m;
    if (ua != 0 && ub > (uint64_t)INT64_MAX / ua)
        return 0;
    m = ua * ub;
    *p = (a < 0) != (b < 0) ? -(int64_t)m : (int64_t)m;
    return 1;
#endif
}

/* ---- magnitudes --------------------------------------------------------- */

/* r = a + b with an >= bn; r has room for an + 1 limbs and may be a or b
   (limb i is read before it is written).  Returns the length. */
static size_t mag_add(limb *r, const limb *a, size_t an, const limb *b,
                      size_t bn)
{
    dlimb c = 0;
    size_t i;
    for (i = 0; i < bn; i++) {
        c += (dlimb)a[i] + b[i];
        r[i] = (limb)c;
        c >>= LIMB_BITS;
    }
    for (; i < an; i++) {
        c += a[i];
        r[i] = (limb)c;
        c >>= LIMB_BITS;
    }
    r[an] = (limb)c;
    return an + (c != 0);
}

/* r = a - b with a >= b; r may be a or b.  Returns the normalized length. */
size_t gs_int_mag_sub(limb *r, const limb *a, size_t an, const limb *b,
                      size_t bn)
{
    limb borrow = 0;
    size_t i;
    for (i = 0; i < bn; i++) {
        dlimb t = (dlimb)a[i] - b[i] - borrow;
        r[i] = (limb)t;
        borrow = (limb)(t >> 63);
    }
    for (; i < an; i++) {
        dlimb t = (dlimb)a[i] - borrow;
        r[i] = (limb)t;
        borrow = (limb)(t >> 63);
    }
    return mag_norm(r, an);
}

/* d[0..n) += 1; d has room for n + 1 limbs.  Returns the length. */
size_t gs_int_mag_inc(limb *d, size_t n)
{
    size_t i;
    for (i = 0; i < n; i++)
        if (++d[i] != 0)
            return n;
    d[n] = 1;
    return n + 1;
}

/* r[0..an+bn) = a * b by the schoolbook method; r overlaps neither. */
static void mag_mul_school(limb *r, const limb *a, size_t an, const limb *b,
                           size_t bn)
{
    size_t i, j;
    memset(r, 0, (an + bn) * sizeof *r);
    for (i = 0; i < an; i++) {
        dlimb c = 0, ai = a[i];
        if (ai == 0)
            continue;
        for (j = 0; j < bn; j++) {
            c += ai * b[j] + r[i + j];
            r[i + j] = (limb)c;
            c >>= LIMB_BITS;
        }
        r[i + bn] = (limb)c;
    }
}

/* r[0..rn) += t[0..tn) for tn <= rn, when the sum is known to fit. */
static void mag_add_into(limb *r, size_t rn, const limb *t, size_t tn)
{
    dlimb c = 0;
    size_t i;
    for (i = 0; i < tn; i++) {
        c += (dlimb)r[i] + t[i];
        r[i] = (limb)c;
        c >>= LIMB_BITS;
    }
    for (; c != 0 && i < rn; i++) {
        c += r[i];
        r[i] = (limb)c;
        c >>= LIMB_BITS;
    }
}

static void mag_mul(limb *r, const limb *a, size_t an, const limb *b,
                    size_t bn);

/* r[0..2n) = a * b for two n-limb operands, Karatsuba (Knuth, TAOCP vol. 2,
   4.3.3): with a = a1 B^h + a0 and b likewise, a*b = z2 B^2h + z1 B^h + z0
   where z1 = (a0 + a1)(b0 + b1) - z2 - z0.  r overlaps neither. */
static void mag_mul_kara(limb *r, const limb *a, const limb *b, size_t n)
{
    size_t h = n / 2, hi = n - h, sn, tn, pn;
    limb *s = gs_malloc((4 * hi + 4) * sizeof *s);
    limb *t = s + hi + 1, *p = t + hi + 1;
    size_t a0 = mag_norm(a, h), b0 = mag_norm(b, h);

    /* s = a0 + a1, t = b0 + b1 (a1, b1 have hi >= h limbs) */
    sn = mag_add(s, a + h, hi, a, a0);
    tn = mag_add(t, b + h, hi, b, b0);
    mag_mul(r, a, a0, b, b0);                  /* z0 into r[0..2h) */
    memset(r + a0 + b0, 0, (2 * h - a0 - b0) * sizeof *r);
    mag_mul(r + 2 * h, a + h, hi, b + h, hi);  /* z2 into r[2h..2n) */
    sn = mag_norm(s, sn);
    tn = mag_norm(t, tn);
    memset(p, 0, (2 * hi + 2) * sizeof *p);
    if (sn && tn)
        mag_mul(p, s, sn, t, tn);
    pn = mag_norm(p, 2 * hi + 2);
    pn = gs_int_mag_sub(p, p, pn, r, mag_norm(r, 2 * h));
    pn = gs_int_mag_sub(p, p, pn, r + 2 * h, mag_norm(r + 2 * h, 2 * hi));
    mag_add_into(r + h, 2 * n - h, p, pn);
    gs_free(s);
}

/* r[0..an+bn) = a * b; r overlaps neither; an, bn > 0.  Unbalanced
   operands are cut into pieces of the shorter one's length. */
static void mag_mul(limb *r, const limb *a, size_t an, const limb *b,
                    size_t bn)
{
    limb *t;
    size_t k;
    if (an < bn) {
        const limb *x = a;
        size_t xn = an;
        a = b;
        an = bn;
        b = x;
        bn = xn;
    }
    if (bn == 0) {
        memset(r, 0, an * sizeof *r);
        return;
    }
    if (bn < KARATSUBA_MIN) {
        mag_mul_school(r, a, an, b, bn);
        return;
    }
    if (an == bn) {
        mag_mul_kara(r, a, b, an);
        return;
    }
    /* a = sum of bn-limb pieces; add each piece's product in place. */
    t = gs_malloc(2 * bn * sizeof *t);
    memset(r, 0, (an + bn) * sizeof *r);
    for (k = 0; k < an; k += bn) {
        size_t pn = an - k < bn ? an - k : bn;
        mag_mul(t, a + k, pn, b, bn);
        mag_add_into(r + k, an + bn - k, t, mag_norm(t, pn + bn));
    }
    gs_free(t);
}

/* q = a / d, returns a mod d; q may be a. */
limb gs_int_mag_divrem_1(limb *q, const limb *a, size_t n, limb d)
{
    dlimb r = 0;
    while (n-- > 0) {
        dlimb t = (r << LIMB_BITS) | a[n];
        q[n] = (limb)(t / d);
        r = t % d;
    }
    return (limb)r;
}

/* r = a << s, for 0 <= s < 32, n limbs out plus the carry returned. */
static limb mag_shl_small(limb *r, const limb *a, size_t n, unsigned s)
{
    limb carry = 0;
    size_t i;
    if (s == 0) {
        memmove(r, a, n * sizeof *r);
        return 0;
    }
    for (i = 0; i < n; i++) {
        limb x = a[i];
        r[i] = (x << s) | carry;
        carry = x >> (LIMB_BITS - s);
    }
    return carry;
}

/* r = a >> s, for 0 <= s < 32; r may be a. */
static void mag_shr_small(limb *r, const limb *a, size_t n, unsigned s)
{
    size_t i;
    if (s == 0) {
        memmove(r, a, n * sizeof *r);
        return;
    }
    for (i = 0; i < n; i++) {
        limb hi = i + 1 < n ? a[i + 1] << (LIMB_BITS - s) : 0;
        r[i] = (a[i] >> s) | hi;
    }
}

/* One step of algorithm D: divide w[0..n] by the normalized v[0..n), which
   is known to give a one-limb quotient; leaves the remainder in w.
   Steps D3 (estimate qhat from the top limbs, corrected at most twice
   by the test against v[n-2]), D4 (multiply and subtract), D5/D6 (add
   back in the rare case qhat was still one too large). */
static limb knuth_step(limb *w, const limb *v, size_t n)
{
    dlimb num = ((dlimb)w[n] << LIMB_BITS) | w[n - 1];
    dlimb qhat = num / v[n - 1], rhat = num % v[n - 1];
    dlimb carry = 0, t;
    limb borrow = 0;
    size_t i;

    while (qhat > LIMB_MAX
           || qhat * v[n - 2] > ((rhat << LIMB_BITS) | w[n - 2])) {
        qhat--;
        rhat += v[n - 1];
        if (rhat > LIMB_MAX)
            break;
    }
    for (i = 0; i < n; i++) {
        dlimb p = qhat * v[i] + carry;
        carry = p >> LIMB_BITS;
        t = (dlimb)w[i] - (limb)p - borrow;
        w[i] = (limb)t;
        borrow = (limb)(t >> 63);
    }
    t = (dlimb)w[n] - carry - borrow;
    w[n] = (limb)t;
    if (t >> 63) {
        dlimb c = 0;
        qhat--;
        for (i = 0; i < n; i++) {
            c += (dlimb)w[i] + v[i];
            w[i] = (limb)c;
            c >>= LIMB_BITS;
        }
        w[n] += (limb)c;
    }
    return (limb)qhat;
}

/* q[0..un-n] = u / v and r[0..n) = u mod v for un >= n >= 2, v[n-1] != 0
   (Knuth, TAOCP vol. 2, 4.3.1, algorithm D).  Outputs overlap no input. */
void gs_int_mag_divrem_knuth(limb *q, limb *r, const limb *u, size_t un,
                             const limb *v, size_t n)
{
    unsigned s = clz32(v[n - 1]);
    limb *vn = gs_malloc((n + un + 1) * sizeof *vn);
    limb *w = vn + n;
    size_t j;

    mag_shl_small(vn, v, n, s);                /* D1: normalize */
    w[un] = mag_shl_small(w, u, un, s);
    for (j = un - n + 1; j-- > 0;)             /* D2..D7 */
        q[j] = knuth_step(w + j, vn, n);
    mag_shr_small(r, w, n, s);                 /* D8: unnormalize */
    gs_free(vn);
}

/* a mod m for 0 < m < 2^63. */
uint64_t gs_int_mag_mod_u64(const limb *d, size_t n, uint64_t m)
{
    uint64_t r = 0;
    if (m <= LIMB_MAX) {
        while (n-- > 0)
            r = ((r << LIMB_BITS) | d[n]) % m;
        return r;
    }
    while (n-- > 0) {
#ifdef GS_HAVE_INT128
        r = (uint64_t)((((u128)r << LIMB_BITS) | d[n]) % m);
#else
        int b;
        for (b = LIMB_BITS - 1; b >= 0; b--) {    /* r < m < 2^63 */
            r = (r << 1) | ((d[n] >> b) & 1u);
            if (r >= m)
                r -= m;
        }
#endif
    }
    return r;
}

/* ---- views and results -------------------------------------------------- */

/* A buffer of at least need limbs for a result bound for r: r's own when
   reuse is allowed and it is large enough, else a fresh one. */
static limb *result_buf(gs_int *r, size_t need, size_t *cap, int reuse)
{
    if (reuse && r->alloc != 0 && (size_t)r->alloc >= need) {
        *cap = (size_t)r->alloc;
        return r->u.d;
    }
    *cap = need;
    return gs_reallocarray(NULL, need, sizeof(limb));
}

/* r = +-buf[0..n), taking ownership of buf (cap limbs, possibly r's own
   array); returns to the inline form when the value fits. */
void gs_int_set_mag(gs_int *r, limb *buf, size_t n, size_t cap, int neg)
{
    n = mag_norm(buf, n);
    if (n <= 2) {
        uint64_t m = n == 0 ? 0 : n == 1 ? buf[0]
                   : buf[0] | (uint64_t)buf[1] << LIMB_BITS;
        if (m <= INT64_MAX) {
            if (r->alloc == 0 || r->u.d != buf)
                gs_free(buf);
            set_small(r, neg ? -(int64_t)m : (int64_t)m);
            return;
        }
    }
    if (r->alloc != 0 && r->u.d != buf)
        gs_free(r->u.d);
    r->u.d = buf;
    r->alloc = (int32_t)cap;
    r->size = neg ? -(int32_t)n : (int32_t)n;
}

void gs_int_set_u64(gs_int *r, uint64_t m, int neg)
{
    size_t cap;
    limb *buf;
    if (m <= INT64_MAX) {
        set_small(r, neg ? -(int64_t)m : (int64_t)m);
        return;
    }
    buf = result_buf(r, 2, &cap, 1);
    buf[0] = (limb)m;
    buf[1] = (limb)(m >> LIMB_BITS);
    gs_int_set_mag(r, buf, 2, cap, neg);
}

/* r = +-|a| (a view, possibly of r itself) */
void gs_int_set_view(gs_int *r, const mview *a, int neg)
{
    size_t cap;
    limb *buf;
    if (a->n <= 2) {
        uint64_t m = a->n == 0 ? 0 : a->n == 1 ? a->d[0]
                   : a->d[0] | (uint64_t)a->d[1] << LIMB_BITS;
        gs_int_set_u64(r, m, neg);
        return;
    }
    buf = result_buf(r, a->n, &cap, 1);
    memmove(buf, a->d, a->n * sizeof *buf);
    gs_int_set_mag(r, buf, a->n, cap, neg);
}

/* r = a + (bneg ? -|b| : |b|).  r's array is written in place when big
   enough, which is safe even if a or b is a view of r (limb i is read
   before it is written). */
static void addsub(gs_int *r, const mview *a, const mview *b, int bneg)
{
    const mview *x = a, *y = b;
    int xneg = a->neg, yneg = bneg;
    size_t cap, n;
    limb *buf;
    if (mag_cmp(a->d, a->n, b->d, b->n) < 0) {
        x = b;
        y = a;
        xneg = bneg;
        yneg = a->neg;
    }
    buf = result_buf(r, x->n + 1, &cap, 1);
    if (xneg == yneg)
        n = mag_add(buf, x->d, x->n, y->d, y->n);
    else
        n = gs_int_mag_sub(buf, x->d, x->n, y->d, y->n);
    gs_int_set_mag(r, buf, n, cap, xneg);
}

/* r = a * b; reuse says r is neither a nor b, so its array may be
   written while the views are read. */
static void mul_views(gs_int *r, const mview *a, const mview *b, int reuse)
{
    size_t cap, n = a->n + b->n;
    limb *buf;
    if (a->n == 0 || b->n == 0) {
        set_small(r, 0);
        return;
    }
    buf = result_buf(r, n, &cap, reuse);
    mag_mul(buf, a->d, a->n, b->d, b->n);
    gs_int_set_mag(r, buf, n, cap, a->neg != b->neg);
}

/* r += (neg ? -1 : 1) t in place, for big r with at least as many limbs
   as t (the usual shape of a sum of products), when r's array has room
   for a carry and a difference keeps r's sign; the carry or borrow
   usually dies after a few limbs.  Returns 0 when it does not apply. */
static int accumulate(gs_int *r, const limb *t, size_t tn, int neg)
{
    size_t n = (size_t)(r->size < 0 ? -(int64_t)r->size : r->size), i;
    limb *d = r->u.d;
    int rneg = r->size < 0;
    if (r->size == 0 || tn > n)
        return 0;
    if (rneg == neg ? (size_t)r->alloc <= n
                    : tn == n && mag_cmp(d, n, t, tn) < 0)
        return 0;
    if (rneg == neg) {
        dlimb c = 0;
        for (i = 0; i < tn; i++) {
            c += (dlimb)d[i] + t[i];
            d[i] = (limb)c;
            c >>= LIMB_BITS;
        }
        for (; c != 0 && i < n; i++)
            c = (d[i] = d[i] + 1) == 0;
        if (c != 0)
            d[n++] = 1;
    } else {
        limb borrow = 0;
        for (i = 0; i < tn; i++) {
            dlimb x = (dlimb)d[i] - t[i] - borrow;
            d[i] = (limb)x;
            borrow = (limb)(x >> 63);
        }
        for (; borrow != 0 && i < n; i++)
            borrow = d[i]-- == 0;
    }
    gs_int_set_mag(r, d, n, (size_t)r->alloc, rneg);
    return 1;
}

/* r += (neg ? -1 : 1) |a b| */
static void addmul_views(gs_int *r, const mview *a, const mview *b, int neg)
{
    limb stack[ADDMUL_STACK];
    limb *t;
    size_t tn = a->n + b->n;
    mview vr, vp;
    if (a->n == 0 || b->n == 0)
        return;
    t = tn <= ADDMUL_STACK ? stack : gs_reallocarray(NULL, tn, sizeof *t);
    mag_mul(t, a->d, a->n, b->d, b->n);
    vp.d = t;
    vp.n = mag_norm(t, tn);
    vp.neg = neg;
    if (!accumulate(r, t, vp.n, neg)) {
        view_of(&vr, r);
        addsub(r, &vr, &vp, neg);
    }
    if (t != stack)
        gs_free(t);
}

/* ---- basics ------------------------------------------------------------- */

void gs_int_init(gs_int *a)
{
    a->size = 0;
    a->alloc = 0;
    a->u.v = 0;
}

void gs_int_clear(gs_int *a)
{
    if (a->alloc != 0)
        gs_free(a->u.d);
    gs_int_init(a);
}

void gs_int_set(gs_int *r, const gs_int *a)
{
    mview va;
    if (r == a)
        return;
    if (a->size == 0) {
        set_small(r, a->u.v);
        return;
    }
    view_of(&va, a);
    gs_int_set_view(r, &va, va.neg);
}

void gs_int_set_si(gs_int *r, int64_t v)
{
    if (v == INT64_MIN)
        gs_int_set_u64(r, (uint64_t)1 << 63, 1);
    else
        set_small(r, v);
}

void gs_int_set_ui(gs_int *r, uint64_t v)
{
    gs_int_set_u64(r, v, 0);
}

void gs_int_swap(gs_int *a, gs_int *b)
{
    gs_int t = *a;
    *a = *b;
    *b = t;
}

int gs_int_fits_si(const gs_int *a)
{
    /* the only big value that fits is INT64_MIN = -2^63 */
    return a->size == 0 || (a->size == -2 && a->u.d[1] == 0x80000000u
                            && a->u.d[0] == 0);
}

int64_t gs_int_get_si(const gs_int *a)
{
    return a->size == 0 ? a->u.v : INT64_MIN;
}

int gs_int_sgn(const gs_int *a)
{
    if (a->size == 0)
        return (a->u.v > 0) - (a->u.v < 0);
    return a->size > 0 ? 1 : -1;
}

int gs_int_is_zero(const gs_int *a)
{
    return a->size == 0 && a->u.v == 0;
}

int gs_int_is_one(const gs_int *a)
{
    return a->size == 0 && a->u.v == 1;
}

int gs_int_cmpabs(const gs_int *a, const gs_int *b)
{
    mview va, vb;
    if (a->size == 0 && b->size == 0) {
        uint64_t x = uabs64(a->u.v), y = uabs64(b->u.v);
        return (x > y) - (x < y);
    }
    view_of(&va, a);
    view_of(&vb, b);
    return mag_cmp(va.d, va.n, vb.d, vb.n);
}

int gs_int_cmp(const gs_int *a, const gs_int *b)
{
    int sa, sb;
    if (a->size == 0 && b->size == 0)
        return (a->u.v > b->u.v) - (a->u.v < b->u.v);
    sa = gs_int_sgn(a);
    sb = gs_int_sgn(b);
    if (sa != sb)
        return sa < sb ? -1 : 1;
    return sa * gs_int_cmpabs(a, b);
}

int gs_int_cmp_si(const gs_int *a, int64_t b)
{
    if (a->size == 0)
        return (a->u.v > b) - (a->u.v < b);
    if (a->size > 0)
        return 1;
    /* a < -INT64_MAX; only a = INT64_MIN equals b = INT64_MIN */
    return gs_int_fits_si(a) && b == INT64_MIN ? 0 : -1;
}

int gs_int_equal(const gs_int *a, const gs_int *b)
{
    if (a->size != b->size)
        return 0;
    if (a->size == 0)
        return a->u.v == b->u.v;
    return memcmp(a->u.d, b->u.d,
                  (size_t)(a->size < 0 ? -a->size : a->size) * sizeof(limb))
           == 0;
}

size_t gs_int_bits(const gs_int *a)
{
    mview va;
    view_of(&va, a);
    return mag_bits(va.d, va.n);
}

/* splitmix64's finalizer (Steele, Lea and Flood, OOPSLA 2014) */
static uint64_t mix64(uint64_t x)
{
    x ^= x >> 30;
    x *= 0xbf58476d1ce4e5b9u;
    x ^= x >> 27;
    x *= 0x94d049bb133111ebu;
    x ^= x >> 31;
    return x;
}

uint64_t gs_int_hash(const gs_int *a)
{
    uint64_t h;
    size_t i, n;
    if (a->size == 0)
        return mix64((uint64_t)a->u.v);
    n = (size_t)(a->size < 0 ? -a->size : a->size);
    h = (uint64_t)(int64_t)a->size;
    for (i = 0; i < n; i++)
        h = mix64(h ^ a->u.d[i]);
    return h;
}

/* ---- arithmetic --------------------------------------------------------- */

void gs_int_neg(gs_int *r, const gs_int *a)
{
    gs_int_set(r, a);
    if (r->size == 0)
        r->u.v = -r->u.v;
    else
        r->size = -r->size;
}

void gs_int_abs(gs_int *r, const gs_int *a)
{
    gs_int_set(r, a);
    if (r->size == 0)
        r->u.v = r->u.v < 0 ? -r->u.v : r->u.v;
    else if (r->size < 0)
        r->size = -r->size;
}

void gs_int_add(gs_int *r, const gs_int *a, const gs_int *b)
{
    mview va, vb;
    int64_t s;
    if (a->size == 0 && b->size == 0 && add_small(&s, a->u.v, b->u.v)) {
        set_small(r, s);
        return;
    }
    view_of(&va, a);
    view_of(&vb, b);
    addsub(r, &va, &vb, vb.neg);
}

void gs_int_sub(gs_int *r, const gs_int *a, const gs_int *b)
{
    mview va, vb;
    int64_t s;
    if (a->size == 0 && b->size == 0 && add_small(&s, a->u.v, -b->u.v)) {
        set_small(r, s);
        return;
    }
    view_of(&va, a);
    view_of(&vb, b);
    addsub(r, &va, &vb, !vb.neg);
}

void gs_int_add_si(gs_int *r, const gs_int *a, int64_t b)
{
    mview va, vb;
    int64_t s;
    if (a->size == 0 && add_small(&s, a->u.v, b)) {
        set_small(r, s);
        return;
    }
    view_of(&va, a);
    view_u64(&vb, uabs64(b), b < 0);
    addsub(r, &va, &vb, vb.neg);
}

void gs_int_mul(gs_int *r, const gs_int *a, const gs_int *b)
{
    mview va, vb;
    int64_t p;
    if (a->size == 0 && b->size == 0 && mul_small(&p, a->u.v, b->u.v)) {
        set_small(r, p);
        return;
    }
    view_of(&va, a);
    view_of(&vb, b);
    mul_views(r, &va, &vb, r != a && r != b);
}

void gs_int_mul_si(gs_int *r, const gs_int *a, int64_t b)
{
    mview va, vb;
    int64_t p;
    if (a->size == 0 && mul_small(&p, a->u.v, b)) {
        set_small(r, p);
        return;
    }
    view_of(&va, a);
    view_u64(&vb, uabs64(b), b < 0);
    mul_views(r, &va, &vb, r != a);
}

#ifdef GS_HAVE_INT128
/* r = t, for small r and |t| < 2^127 */
static void set_i128(gs_int *r, i128 t)
{
    u128 m = t < 0 ? -(u128)t : (u128)t;
    limb *buf = gs_malloc(4 * sizeof *buf);
    buf[0] = (limb)m;
    buf[1] = (limb)(m >> 32);
    buf[2] = (limb)(m >> 64);
    buf[3] = (limb)(m >> 96);
    gs_int_set_mag(r, buf, 4, 4, t < 0);
}
#endif

/* r +-= a*b for three small values; returns 0 when the general path must
   do it.  With a 128-bit type the result is always produced here. */
static int addmul_small(gs_int *r, int64_t a, int64_t b, int sub)
{
#ifdef GS_HAVE_INT128
    i128 t = (i128)a * b;
    t = sub ? (i128)r->u.v - t : (i128)r->u.v + t;
    if (t >= -(i128)INT64_MAX && t <= (i128)INT64_MAX) {
        r->u.v = (int64_t)t;
        return 1;
    }
    set_i128(r, t);
    return 1;
#else
    int64_t p, s;
    if (mul_small(&p, a, b) && add_small(&s, r->u.v, sub ? -p : p)) {
        r->u.v = s;
        return 1;
    }
    return 0;
#endif
}

/* |x y| for words x, y into t[0..4), returning the length */
static size_t mul_words(limb *t, uint64_t x, uint64_t y)
{
#ifdef GS_HAVE_INT128
    u128 p = (u128)x * y;
    t[0] = (limb)p;
    t[1] = (limb)(p >> 32);
    t[2] = (limb)(p >> 64);
    t[3] = (limb)(p >> 96);
#else
    limb xs[2], ys[2];
    xs[0] = (limb)x;
    xs[1] = (limb)(x >> LIMB_BITS);
    ys[0] = (limb)y;
    ys[1] = (limb)(y >> LIMB_BITS);
    mag_mul_school(t, xs, 2, ys, 2);
#endif
    return mag_norm(t, 4);
}

/* r +-= a b, sub selecting the sign, past the all-small case */
static void addmul(gs_int *r, const gs_int *a, const gs_int *b, int sub)
{
    mview va, vb;
    if (a->size == 0 && b->size == 0) {
        limb t[4];
        size_t tn;
        int neg = (a->u.v < 0) != (b->u.v < 0) ? !sub : sub;
        tn = mul_words(t, uabs64(a->u.v), uabs64(b->u.v));
        if (tn != 0 && !accumulate(r, t, tn, neg)) {
            mview vr, vp;
            vp.d = t;
            vp.n = tn;
            vp.neg = neg;
            view_of(&vr, r);
            addsub(r, &vr, &vp, neg);
        }
        return;
    }
    view_of(&va, a);
    view_of(&vb, b);
    addmul_views(r, &va, &vb, (va.neg != vb.neg) != sub);
}

void gs_int_addmul(gs_int *r, const gs_int *a, const gs_int *b)
{
    if (r->size == 0 && a->size == 0 && b->size == 0
        && addmul_small(r, a->u.v, b->u.v, 0))
        return;
    addmul(r, a, b, 0);
}

void gs_int_submul(gs_int *r, const gs_int *a, const gs_int *b)
{
    if (r->size == 0 && a->size == 0 && b->size == 0
        && addmul_small(r, a->u.v, b->u.v, 1))
        return;
    addmul(r, a, b, 1);
}

void gs_int_mul_2exp(gs_int *r, const gs_int *a, unsigned long e)
{
    mview va;
    size_t words = e / LIMB_BITS, n, cap;
    unsigned bits = (unsigned)(e % LIMB_BITS);
    limb *buf;
    if (gs_int_is_zero(a)) {
        set_small(r, 0);
        return;
    }
    if (a->size == 0 && e < 63) {
        uint64_t m = uabs64(a->u.v);
        if (m <= (uint64_t)INT64_MAX >> e) {
            set_small(r, a->u.v < 0 ? -(int64_t)(m << e) : (int64_t)(m << e));
            return;
        }
    }
    view_of(&va, a);
    n = va.n + words + 1;
    buf = result_buf(r, n, &cap, r != a);
    memset(buf, 0, words * sizeof *buf);
    buf[n - 1] = mag_shl_small(buf + words, va.d, va.n, bits);
    gs_int_set_mag(r, buf, n, cap, va.neg);
}

void gs_int_pow_ui(gs_int *r, const gs_int *a, unsigned long e)
{
    gs_int base, acc;
    if (e == 0 || gs_int_is_one(a)) {
        set_small(r, 1);
        return;
    }
    if (a->size == 0 && (a->u.v == 0 || a->u.v == -1)) {
        set_small(r, a->u.v == 0 ? 0 : (e & 1) ? -1 : 1);
        return;
    }
    gs_int_init(&base);
    gs_int_init(&acc);
    gs_int_set(&base, a);
    set_small(&acc, 1);
    for (;;) {                      /* right-to-left binary powering */
        if (e & 1)
            gs_int_mul(&acc, &acc, &base);
        e >>= 1;
        if (e == 0)
            break;
        gs_int_mul(&base, &base, &base);
    }
    gs_int_swap(r, &acc);
    gs_int_clear(&acc);
    gs_int_clear(&base);
}

/* ---- conversions -------------------------------------------------------- */

static int bit_at(const limb *d, size_t k)
{
    return (int)((d[k / LIMB_BITS] >> (k % LIMB_BITS)) & 1u);
}

/* any of bits [0, k) set? */
static int bits_below(const limb *d, size_t k)
{
    size_t w = k / LIMB_BITS, i;
    unsigned b = (unsigned)(k % LIMB_BITS);
    for (i = 0; i < w; i++)
        if (d[i] != 0)
            return 1;
    return b != 0 && (d[w] & (((limb)1 << b) - 1)) != 0;
}

/* |a| rounded to prec bits, ties to even, as an integer-valued long double
   s with |a| ~ s 2^e.  sticky says the true value is a little above |a|
   (then |a| must have more than prec bits).  Every partial sum below is
   an integer under 2^prec, hence exact. */
static long double mag_round(long *e, const limb *d, size_t n, unsigned prec,
                             int sticky)
{
    size_t len = mag_bits(d, n), sh, k;
    long double x = 0;
    if (len <= prec) {
        for (k = n; k-- > 0;)
            x = x * 4294967296.0L + d[k];
        *e = 0;
        return x;
    }
    sh = len - prec;
    for (k = (prec + LIMB_BITS - 1) / LIMB_BITS; k-- > 0;)
        x = x * 4294967296.0L + limb_at(d, n, sh + k * LIMB_BITS);
    if (bit_at(d, sh - 1)
        && (sticky || bits_below(d, sh - 1) || (limb_at(d, n, sh) & 1u)))
        x += 1;
    *e = sh > LONG_MAX ? LONG_MAX : (long)sh;
    return x;
}

static int clamp_int(long e)
{
    return e > INT_MAX ? INT_MAX : e < INT_MIN ? INT_MIN : (int)e;
}

long double gs_int_round_2exp(long *e, const gs_int *a, unsigned prec,
                              int sticky)
{
    mview va;
    view_of(&va, a);
    return mag_round(e, va.d, va.n, prec, sticky);
}

double gs_int_get_d(const gs_int *a)
{
    long e = 0;
    double x;
    if (a->size == 0)
        return (double)a->u.v;
    x = (double)gs_int_round_2exp(&e, a, DBL_MANT_DIG, 0);
    x = ldexp(x, clamp_int(e));
    return a->size < 0 ? -x : x;
}

long double gs_int_get_ld(const gs_int *a)
{
    long e = 0;
    long double x;
    if (a->size == 0)
        return (long double)a->u.v;
    x = gs_int_round_2exp(&e, a, LDBL_MANT_DIG, 0);
    x = ldexpl(x, clamp_int(e));
    return a->size < 0 ? -x : x;
}

long double gs_int_get_ld_2exp(long *e, const gs_int *a)
{
    long sh;
    int ex;
    long double x, m;
    if (gs_int_is_zero(a)) {
        *e = 0;
        return 0;
    }
    x = gs_int_round_2exp(&sh, a, LDBL_MANT_DIG, 0);
    m = frexpl(x, &ex);                 /* x = m 2^ex, 0.5 <= m < 1 */
    *e = sh + ex;
    return gs_int_sgn(a) < 0 ? -m : m;
}

/* ---- text --------------------------------------------------------------- */

#define CHUNK 1000000000u    /* 10^9, the largest power of ten in a limb */

int gs_int_set_str(gs_int *r, const char *s)
{
    const char *p = s;
    int neg = 0;
    size_t len, n = 0, cap, i;
    limb *buf;
    if (*p == '-' || *p == '+')
        neg = *p++ == '-';
    len = strspn(p, "0123456789");
    if (len == 0 || p[len] != '\0')
        return GS_ESYNTAX;
    if (len <= 18) {
        int64_t v = 0;
        for (i = 0; i < len; i++)
            v = v * 10 + (p[i] - '0');
        set_small(r, neg ? -v : v);
        return GS_OK;
    }
    /* each chunk of up to 9 digits adds at most one limb */
    cap = len / 9 + 2;
    buf = gs_reallocarray(NULL, cap, sizeof *buf);
    for (i = 0; i < len;) {
        size_t k = i == 0 ? (len - 1) % 9 + 1 : 9, j;
        dlimb c = 0, scale = 1;
        for (j = 0; j < k; j++) {
            c = c * 10 + (dlimb)(p[i + j] - '0');
            scale *= 10;
        }
        for (j = 0; j < n; j++) {     /* buf = buf * 10^k + chunk */
            c += (dlimb)buf[j] * scale;
            buf[j] = (limb)c;
            c >>= LIMB_BITS;
        }
        if (c != 0)
            buf[n++] = (limb)c;
        i += k;
    }
    gs_int_set_mag(r, buf, n, cap, neg);
    return GS_OK;
}

char *gs_int_get_str(const gs_int *a)
{
    mview va;
    limb *t, *chunks;
    size_t n, nc = 0, len;
    char *s, *p;
    if (a->size == 0)
        return gs_asprintf("%" PRId64, a->u.v);
    view_of(&va, a);
    n = va.n;
    t = gs_reallocarray(NULL, n, sizeof *t);
    memcpy(t, va.d, n * sizeof *t);
    /* 10^9 > 2^29, so each chunk takes at least 29 bits away */
    chunks = gs_reallocarray(NULL, n * LIMB_BITS / 29 + 2, sizeof *chunks);
    while (n > 0) {
        chunks[nc++] = gs_int_mag_divrem_1(t, t, n, CHUNK);
        n = mag_norm(t, n);
    }
    s = gs_malloc(nc * 9 + 2);
    p = s;
    if (va.neg)
        *p++ = '-';
    len = (size_t)sprintf(p, "%" PRIu32, chunks[--nc]);
    p += len;
    while (nc-- > 0) {
        sprintf(p, "%09" PRIu32, chunks[nc]);
        p += 9;
    }
    gs_free(chunks);
    gs_free(t);
    return s;
}
