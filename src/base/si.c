/* si.c - SI prefixes: the one table, scanning and formatting.
 * See LICENSE.
 *
 * The prefixes and their symbols are the BIPM's (SI Brochure, 9th ed.,
 * 2019, table 7).  Numbers are formatted by integer arithmetic on a
 * rounded mantissa, never by printf's %f or %e, so the text does not
 * depend on the C locale.
 */
#include "base/si.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* y (10^-24) .. Y (10^24) by thousands; micro as U+00B5 MICRO SIGN */
static const char *const prefix_text[17] = {
    "y", "z", "a", "f", "p", "n", "\xc2\xb5", "m", "",
    "k", "M", "G", "T", "P", "E", "Z", "Y"
};

const char *gs_si_prefix_text(int p)
{
    return p >= -8 && p <= 8 ? prefix_text[p + 8] : "";
}

/* What input accepts, f .. T: micro as u, U+00B5 MICRO SIGN or U+03BC
   GREEK SMALL LETTER MU. */
static const struct {
    const char *text;
    int exp10;
} prefix_in[] = {
    {"f", -15}, {"p", -12}, {"n", -9}, {"u", -6}, {"\xc2\xb5", -6},
    {"\xce\xbc", -6}, {"m", -3}, {"k", 3}, {"M", 6}, {"G", 9},
    {"T", 12},
};

size_t gs_si_prefix_scan(const char *s, int *exp10)
{
    size_t i;
    for (i = 0; i < sizeof prefix_in / sizeof prefix_in[0]; i++) {
        size_t len = strlen(prefix_in[i].text);
        if (strncmp(s, prefix_in[i].text, len) == 0) {
            *exp10 = prefix_in[i].exp10;
            return len;
        }
    }
    return 0;
}

/* A bounded string being built: appends past the end are dropped. */
typedef struct sbuf {
    char *p;
    size_t n, len;
} sbuf;

static sbuf sb_make(char *p, size_t n)
{
    if (n > 0)
        p[0] = '\0';
    return (sbuf){p, n, 0};
}

static void sb_add(sbuf *b, const char *s)
{
    for (; *s && b->len + 1 < b->n; s++)
        b->p[b->len++] = *s;
    if (b->n > 0)
        b->p[b->len] = '\0';
}

static void sb_addn(sbuf *b, const char *s, size_t k)
{
    for (size_t i = 0; i < k && s[i]; i++) {
        char c[2] = {s[i], '\0'};
        sb_add(b, c);
    }
}

static void sb_zeros(sbuf *b, int k)
{
    while (k-- > 0)
        sb_add(b, "0");
}

/* m * 10^sh as a decimal, m >= 0, trailing fraction zeros dropped */
static void scaled_int(sbuf *b, long long m, int sh)
{
    char d[32];
    int len = snprintf(d, sizeof d, "%lld", m), point = len + sh;

    if (m == 0) {
        sb_add(b, "0");
        return;
    }
    if (sh >= 0) {
        sb_add(b, d);
        sb_zeros(b, sh);
        return;
    }
    while (len > 0 && -sh > 0 && d[len - 1] == '0') {
        d[--len] = '\0';        /* drop trailing fraction zeros */
        sh++;
    }
    if (sh >= 0) {
        sb_add(b, d);
        return;
    }
    if (point <= 0) {
        sb_add(b, "0.");
        sb_zeros(b, -point);
        sb_add(b, d);
    } else {
        sb_addn(b, d, (size_t)point);
        sb_add(b, ".");
        sb_add(b, d + point);
    }
}

static long long pow10ll(int k)
{
    long long r = 1;
    while (k-- > 0)
        r *= 10;
    return r;
}

/* Significant digits of a > 0: a ~ m 10^(e - digits + 1), with
   10^(digits-1) <= m < 10^digits */
static long long mantissa(int *e, long double a, int digits)
{
    *e = (int)floorl(log10l(a));
    long long m = llroundl(a * powl(10, digits - 1 - *e));
    if (m >= pow10ll(digits)) {
        ++*e;
        m = llroundl(a * powl(10, digits - 1 - *e));
    } else if (m < pow10ll(digits - 1)) {
        --*e;
        m = llroundl(a * powl(10, digits - 1 - *e));
    }
    return m;
}

char *gs_si_format(char *buf, size_t n, long double v, int digits,
                   const char *unit)
{
    const char *u = unit != NULL ? unit : "";
    sbuf b = sb_make(buf, n);
    int e, p = 0;

    digits = digits < 1 ? 1 : digits > 6 ? 6 : digits;
    if (!isfinite(v) || v == 0) {
        sb_add(&b, isnan(v) ? "nan" : v == 0 ? "0" : v < 0 ? "-inf" : "inf");
    } else {
        long long m = mantissa(&e, fabsl(v), digits);
        p = e >= 0 ? e / 3 : -((-e + 2) / 3);
        p = p < -8 ? -8 : p > 8 ? 8 : p;
        if (v < 0)
            sb_add(&b, "-");
        scaled_int(&b, m, e - (digits - 1) - 3 * p);
    }
    if (*gs_si_prefix_text(p) || *u)
        sb_add(&b, " ");
    sb_add(&b, gs_si_prefix_text(p));
    sb_add(&b, u);
    return buf;
}

char *gs_fixed_format(char *buf, size_t n, long double v, int dec)
{
    long long m = llroundl(fabsl(v) * (long double)pow10ll(dec));
    sbuf b = sb_make(buf, n);
    if (v < 0 && m != 0)
        sb_add(&b, "-");
    scaled_int(&b, m, -dec);
    return buf;
}
