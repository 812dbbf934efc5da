/* int_div.c - division of arbitrary-precision integers: truncated and
 * floored quotients with remainders, exact division, residues modulo a
 * word, gcd and lcm.  The limb routines it builds on are in int.c, shared
 * through int_impl.h.  See LICENSE.
 */
#include "algebra/int.h"
#include "algebra/int_impl.h"

#include <string.h>

#include "gainsmith.h"
#include "base/mem.h"

/* ---- division ----------------------------------------------------------- */

/* |a| = q |b| + r into fresh arrays; q has room for one more limb and r
   for max(|a|, |b|) limbs, so the floor adjustment fits. */
typedef struct {
    limb *q, *r;
    size_t qn, qcap, rn, rcap;
} divres;

static void mag_divmod(divres *res, const mview *a, const mview *b)
{
    size_t n = b->n;
    res->qcap = a->n >= n ? a->n - n + 2 : 1;
    res->rcap = (a->n > n ? a->n : n) + 1;
    res->q = gs_calloc(res->qcap, sizeof(limb));
    res->r = gs_calloc(res->rcap, sizeof(limb));
    res->qn = 0;
    if (mag_cmp(a->d, a->n, b->d, n) < 0) {
        memcpy(res->r, a->d, a->n * sizeof(limb));
        res->rn = a->n;
        return;
    }
    if (n == 1) {
        res->r[0] = gs_int_mag_divrem_1(res->q, a->d, a->n, b->d[0]);
        res->rn = 1;
    } else {
        gs_int_mag_divrem_knuth(res->q, res->r, a->d, a->n, b->d, n);
        res->rn = n;
    }
    res->qn = mag_norm(res->q, a->n - n + 1);
    res->rn = mag_norm(res->r, res->rn);
}

static void install(gs_int *r, limb *buf, size_t n, size_t cap, int neg)
{
    if (r != NULL)
        gs_int_set_mag(r, buf, n, cap, neg);
    else
        gs_free(buf);
}

static void divide_small(gs_int *q, gs_int *r, int64_t x, int64_t y,
                         int floor_div)
{
    int64_t qq = x / y, rr = x % y;    /* no overflow: x != INT64_MIN */
    if (floor_div && rr != 0 && ((rr < 0) != (y < 0))) {
        qq--;                           /* |y| >= 2 so qq > INT64_MIN */
        rr += y;
    }
    if (q != NULL)
        set_small(q, qq);
    if (r != NULL)
        set_small(r, rr);
}

static int divide(gs_int *q, gs_int *r, const gs_int *a, const gs_int *b,
                  int floor_div)
{
    mview va, vb;
    divres d;
    int rneg;
    if (gs_int_is_zero(b))
        return GS_EDIVZERO;
    if (a->size == 0 && b->size == 0) {
        divide_small(q, r, a->u.v, b->u.v, floor_div);
        return GS_OK;
    }
    view_of(&va, a);
    view_of(&vb, b);
    mag_divmod(&d, &va, &vb);
    rneg = va.neg;
    if (floor_div && d.rn != 0 && va.neg != vb.neg) {
        /* floor = trunc - 1, r = a - floor*b = r_t + b: |r| = |b| - |r_t| */
        d.qn = gs_int_mag_inc(d.q, d.qn);
        d.rn = gs_int_mag_sub(d.r, vb.d, vb.n, d.r, d.rn);
        rneg = vb.neg;
    }
    install(q, d.q, d.qn, d.qcap, va.neg != vb.neg);
    install(r, d.r, d.rn, d.rcap, rneg);
    return GS_OK;
}

int gs_int_tdiv_qr(gs_int *q, gs_int *r, const gs_int *a, const gs_int *b)
{
    return divide(q, r, a, b, 0);
}

int gs_int_fdiv_qr(gs_int *q, gs_int *r, const gs_int *a, const gs_int *b)
{
    return divide(q, r, a, b, 1);
}

int gs_int_divexact(gs_int *q, const gs_int *a, const gs_int *b)
{
    mview va, vb;
    divres d;
    if (gs_int_is_zero(b))
        return GS_EDIVZERO;
    if (a->size == 0 && b->size == 0) {
        if (a->u.v % b->u.v != 0)
            return GS_EINEXACT;
        set_small(q, a->u.v / b->u.v);
        return GS_OK;
    }
    view_of(&va, a);
    view_of(&vb, b);
    mag_divmod(&d, &va, &vb);
    gs_free(d.r);
    if (d.rn != 0) {
        gs_free(d.q);
        return GS_EINEXACT;
    }
    gs_int_set_mag(q, d.q, d.qn, d.qcap, va.neg != vb.neg);
    return GS_OK;
}

uint64_t gs_int_mod_ui(const gs_int *a, uint64_t m)
{
    mview va;
    uint64_t r;
    view_of(&va, a);
    r = gs_int_mag_mod_u64(va.d, va.n, m);
    return va.neg && r != 0 ? m - r : r;
}

static unsigned ctz64(uint64_t x)
{
#if defined(__GNUC__) && !defined(GS_PORTABLE_INT)
    return (unsigned)__builtin_ctzll(x);
#else
    unsigned n = 0;
    while (!(x & 1)) {
        x >>= 1;
        n++;
    }
    return n;
#endif
}

/* Binary gcd (Stein 1967; Knuth, TAOCP vol. 2, 4.5.2, algorithm B). */
static uint64_t gcd_u64(uint64_t a, uint64_t b)
{
    unsigned k;
    if (a == 0 || b == 0)
        return a | b;
    k = ctz64(a | b);
    a >>= ctz64(a);
    do {
        b >>= ctz64(b);
        if (a > b) {
            uint64_t t = a;
            a = b;
            b = t;
        }
        b -= a;
    } while (b != 0);
    return a << k;
}

/* bits [s, s + 60) of d[0..n) */
static int64_t bits60(const limb *d, size_t n, size_t s)
{
    uint64_t lo = limb_at(d, n, s), hi = limb_at(d, n, s + LIMB_BITS);
    return (int64_t)(((hi << LIMB_BITS) | lo) & (((uint64_t)1 << 60) - 1));
}

/* out[0..n) = p u - q v for cofactors p, q < 2^31, when the result is
   known to be >= 0; u and v have un, vn <= n limbs. */
static size_t mag_lincomb(limb *out, int64_t p, const limb *u, size_t un,
                          int64_t q, const limb *v, size_t vn, size_t n)
{
    dlimb cp = 0, cq = 0, t;
    limb borrow = 0;
    size_t i;
    for (i = 0; i < n; i++) {
        cp += (dlimb)p * (i < un ? u[i] : 0);
        cq += (dlimb)q * (i < vn ? v[i] : 0);
        t = (dlimb)(limb)cp - (limb)cq - borrow;
        out[i] = (limb)t;
        borrow = (limb)(t >> 63);
        cp >>= LIMB_BITS;
        cq >>= LIMB_BITS;
    }
    return mag_norm(out, n);
}

#define COFACTOR_MAX ((int64_t)1 << 31)

/* The inner loop of Lehmer's gcd on the leading 60 bits x > y of the two
   operands: runs Euclid's algorithm on them while the quotients are
   certain to be those of the full operands, and returns the number of
   steps with their cofactors in m[4] = A, B, C, D.  The stopping test
   (a quotient is trusted while the next cofactor stays below the next
   remainder) is a Collins/Jebelean-style condition (T. Jebelean,
   "Improving the multiprecision Euclidean algorithm", DISCO 1993), in the
   form CPython's integer gcd uses (from memory).  The extra bounds keep
   every product inside 63 bits and the cofactors under 2^31; stopping
   early is always safe, it only makes less progress. */
static int lehmer_steps(int64_t m[4], int64_t x, int64_t y)
{
    int64_t A = 1, B = 0, C = 0, D = 1, q, s, t, u;
    int k;
    for (k = 0;; k++) {
        if (y - C == 0)
            break;
        q = (x + (A - 1)) / (y - C);
        if (q >= COFACTOR_MAX)
            break;
        s = B + q * D;
        t = x - q * y;
        if (s > t)
            break;
        u = A + q * C;
        if (s >= COFACTOR_MAX || u >= COFACTOR_MAX)
            break;
        x = y;
        y = t;
        A = D;
        B = C;
        C = s;
        D = u;
    }
    m[0] = A;
    m[1] = B;
    m[2] = C;
    m[3] = D;
    return k;
}

/* r = a mod b for a >= b, nb > 0, into r (nb limbs), with q (na - nb + 1
   limbs) as scratch.  Returns the length. */
static size_t mag_mod(limb *r, limb *q, const limb *a, size_t na,
                      const limb *b, size_t nb)
{
    if (nb == 1) {
        r[0] = gs_int_mag_divrem_1(q, a, na, b[0]);
        return r[0] != 0;
    }
    gs_int_mag_divrem_knuth(q, r, a, na, b, nb);
    return mag_norm(r, nb);
}

/* gcd(|a|, |b|) for multi-limb operands: Lehmer's algorithm (Knuth,
   TAOCP vol. 2, 4.5.2, algorithm L), replacing a run of single-precision
   Euclid steps by one linear combination of the full operands, with a
   full division whenever the leading parts promise no progress; the
   last 64 bits go to the binary gcd. */
static void gcd_big(gs_int *r, const mview *va, const mview *vb)
{
    size_t n = va->n > vb->n ? va->n : vb->n, na, nb;
    limb *buf = gs_reallocarray(NULL, 4 * n, sizeof *buf);
    limb *a = buf, *b = a + n, *c = b + n, *d = c + n, *t;
    int swap = mag_cmp(va->d, va->n, vb->d, vb->n) < 0;
    na = swap ? vb->n : va->n;
    nb = swap ? va->n : vb->n;
    memcpy(a, swap ? vb->d : va->d, na * sizeof *a);
    memcpy(b, swap ? va->d : vb->d, nb * sizeof *b);
    while (nb > 0 && mag_bits(a, na) > 64) {
        int64_t m[4];
        size_t s = mag_bits(a, na) - 60, nc;
        int k = lehmer_steps(m, bits60(a, na, s), bits60(b, nb, s));
        if (k == 0) {                   /* a, b = b, a mod b */
            nc = mag_mod(c, d, a, na, b, nb);
            t = a, a = b, b = c, c = t;
            na = nb;
            nb = nc;
            continue;
        }
        if (k % 2 == 0) {               /* a, b = A a - B b, D b - C a */
            nc = mag_lincomb(c, m[0], a, na, m[1], b, nb, na);
            nb = mag_lincomb(d, m[3], b, nb, m[2], a, na, na);
        } else {                        /* a, b = A b - B a, D a - C b */
            nc = mag_lincomb(c, m[0], b, nb, m[1], a, na, na);
            nb = mag_lincomb(d, m[3], a, na, m[2], b, nb, na);
        }
        na = nc;
        t = a, a = c, c = t;
        t = b, b = d, d = t;
    }
    if (nb == 0) {
        mview g;
        g.d = a;
        g.n = na;
        gs_int_set_view(r, &g, 0);
    } else {
        uint64_t x = a[0] | (na > 1 ? (uint64_t)a[1] << LIMB_BITS : 0);
        uint64_t y = b[0] | (nb > 1 ? (uint64_t)b[1] << LIMB_BITS : 0);
        gs_int_set_u64(r, gcd_u64(x, y), 0);
    }
    gs_free(buf);
}

void gs_int_gcd(gs_int *r, const gs_int *a, const gs_int *b)
{
    mview va, vb;
    if (a->size == 0 && b->size == 0) {
        gs_int_set_u64(r, gcd_u64(uabs64(a->u.v), uabs64(b->u.v)), 0);
        return;
    }
    view_of(&va, a);
    view_of(&vb, b);
    if (va.n == 0 || vb.n == 0) {       /* gcd(x, 0) = |x| */
        gs_int_set_view(r, va.n == 0 ? &vb : &va, 0);
        return;
    }
    if (a->size == 0 || b->size == 0) { /* one word: reduce the other */
        uint64_t m = uabs64(a->size == 0 ? a->u.v : b->u.v);
        const mview *big = a->size == 0 ? &vb : &va;
        gs_int_set_u64(r, gcd_u64(m, gs_int_mag_mod_u64(big->d, big->n, m)),
                       0);
        return;
    }
    gcd_big(r, &va, &vb);
}

void gs_int_lcm(gs_int *r, const gs_int *a, const gs_int *b)
{
    gs_int g, t;
    if (gs_int_is_zero(a) || gs_int_is_zero(b)) {
        set_small(r, 0);
        return;
    }
    gs_int_init(&g);
    gs_int_init(&t);
    gs_int_gcd(&g, a, b);
    gs_int_divexact(&t, a, &g);
    gs_int_mul(&t, &t, b);
    gs_int_abs(r, &t);
    gs_int_clear(&t);
    gs_int_clear(&g);
}
