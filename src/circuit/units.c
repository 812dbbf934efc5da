/* units.c - numbers with SI prefixes and optional units. See LICENSE. */
#include "circuit/units.h"
#include "gainsmith.h"
#include "base/mem.h"
#include "base/si.h"

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Why a scan failed; gs_units_parse turns each into its own message. */
enum {
    SCAN_OK,
    SCAN_NOT_NUMBER,
    SCAN_UNKNOWN_UNIT,
    SCAN_FRACTION_PREFIX,
    SCAN_CELSIUS_PREFIX,
    SCAN_DIVZERO,
    SCAN_RANGE
};

typedef struct unit_entry {
    const char *text;
    gs_quantity q;
    int celsius;        /* degrees Celsius: offset, and no prefix */
} unit_entry;

/* Longer spellings first where one is a prefix of another ("A/V^2"
   before "A/V" before "A"), although matching is exact anyway. */
static const unit_entry units[] = {
    {"A/V^2", GS_Q_KPARAM, 0},
    {"A/V2", GS_Q_KPARAM, 0},
    {"A/V", GS_Q_CONDUCTANCE, 0},
    {"S", GS_Q_CONDUCTANCE, 0},
    {"A", GS_Q_CURRENT, 0},
    {"V^-1", GS_Q_INV_VOLTAGE, 0},
    {"1/V", GS_Q_INV_VOLTAGE, 0},
    {"/V", GS_Q_INV_VOLTAGE, 0},
    {"V^0.5", GS_Q_SQRT_VOLTAGE, 0},
    {"V^1/2", GS_Q_SQRT_VOLTAGE, 0},
    {"V", GS_Q_VOLTAGE, 0},
    {"Ohm", GS_Q_RESISTANCE, 0},
    {"ohm", GS_Q_RESISTANCE, 0},
    {"Ohms", GS_Q_RESISTANCE, 0},
    {"ohms", GS_Q_RESISTANCE, 0},
    {"\xCE\xA9", GS_Q_RESISTANCE, 0},       /* U+03A9 GREEK CAPITAL OMEGA */
    {"\xE2\x84\xA6", GS_Q_RESISTANCE, 0},   /* U+2126 OHM SIGN */
    {"F/m^2", GS_Q_CAP_AREA, 0},
    {"F/m2", GS_Q_CAP_AREA, 0},
    {"F", GS_Q_CAPACITANCE, 0},
    {"m", GS_Q_LENGTH, 0},              /* after a prefix: see scan_suffix */
    {"Hz", GS_Q_FREQUENCY, 0},
    {"K", GS_Q_TEMPERATURE, 0},
    {"C", GS_Q_TEMPERATURE, 1},
    {"degC", GS_Q_TEMPERATURE, 1},
    {"\xC2\xB0" "C", GS_Q_TEMPERATURE, 1},  /* °C */
};

/* A decimal as written: the mantissa text and the exponent after 'e'. */
typedef struct decimal {
    const char *start;
    size_t len;
    long exp;
} decimal;

/* Scan a decimal at s; returns the characters consumed, 0 for none. */
static size_t scan_decimal(decimal *x, const char *s, int allow_sign)
{
    size_t i = 0, digits = 0;

    if (allow_sign && (s[i] == '+' || s[i] == '-'))
        i++;
    for (; isdigit((unsigned char)s[i]); i++)
        digits++;
    if (s[i] == '.')
        for (i++; isdigit((unsigned char)s[i]); i++)
            digits++;
    if (digits == 0)
        return 0;
    x->start = s;
    x->len = i;
    x->exp = 0;
    if (s[i] == 'e' || s[i] == 'E') {
        size_t j = i + 1;
        int neg = 0;
        long e = 0;
        if (s[j] == '+' || s[j] == '-')
            neg = s[j++] == '-';
        if (!isdigit((unsigned char)s[j]))
            return i;           /* "5e": the 'e' is left for the unit */
        for (; isdigit((unsigned char)s[j]); j++)
            if (e < 1000000)    /* far past any long double exponent */
                e = 10 * e + (s[j] - '0');
        x->exp = neg ? -e : e;
        i = j;
    }
    return i;
}

static int has_nonzero_digit(const decimal *x)
{
    size_t i;
    for (i = 0; i < x->len; i++)
        if (x->start[i] >= '1' && x->start[i] <= '9')
            return 1;
    return 0;
}

/* The decimal times 10^shift, correctly rounded by strtold. */
static int decimal_value(long double *v, const decimal *x, long shift)
{
    char *buf, *end;
    long double r;

    if (x->len > 4096)
        return SCAN_RANGE;
    buf = gs_asprintf("%.*se%ld", (int)x->len, x->start, x->exp + shift);
    errno = 0;
    r = strtold(buf, &end);
    gs_free(buf);
    if (errno == ERANGE || !isfinite(r) || (r == 0 && has_nonzero_digit(x)))
        return SCAN_RANGE;
    *v = r;
    return SCAN_OK;
}

static const unit_entry *match_unit(const char *s)
{
    size_t i;
    for (i = 0; i < sizeof units / sizeof units[0]; i++)
        if (strcmp(s, units[i].text) == 0)
            return &units[i];
    return NULL;
}

/* What follows the number: nothing, a unit, a prefix, or a prefix and a
   unit.  A whole-word unit wins over a prefix ("10F" is ten farads,
   "10f" ten femto), and a lone prefix letter is a prefix ("1m"): so the
   metre, spelt like milli, is a unit only after a prefix ("20um"). */
static int scan_suffix(const char *s, int *exp, const unit_entry **unit)
{
    size_t plen;
    const unit_entry *u;

    while (*s == ' ')
        s++;
    *exp = 0;
    *unit = NULL;
    if (*s == '\0')
        return SCAN_OK;
    if ((u = match_unit(s)) != NULL && u->q != GS_Q_LENGTH) {
        *unit = u;
        return SCAN_OK;
    }
    if ((plen = gs_si_prefix_scan(s, exp)) == 0)
        return SCAN_UNKNOWN_UNIT;
    s += plen;
    if (*s == '\0')
        return SCAN_OK;
    if ((u = match_unit(s)) == NULL)
        return SCAN_UNKNOWN_UNIT;
    *unit = u;
    return u->celsius ? SCAN_CELSIUS_PREFIX : SCAN_OK;
}

/* The whole scan; on success *value is in SI base units. */
static int scan(long double *value, gs_quantity *q, const char *text)
{
    decimal num, den;
    const unit_entry *unit;
    size_t n = scan_decimal(&num, text, 1), m = 0;
    long double a, b = 1;
    int exp, rc;

    if (n == 0)
        return SCAN_NOT_NUMBER;
    if (text[n] == '/' && (m = scan_decimal(&den, text + n + 1, 0)) > 0)
        m++;
    rc = scan_suffix(text + n + m, &exp, &unit);
    if (rc != SCAN_OK)
        return rc;
    if (m > 0 && exp != 0)
        return SCAN_FRACTION_PREFIX;
    if ((rc = decimal_value(&a, &num, exp)) != SCAN_OK)
        return rc;
    if (m > 0) {
        if ((rc = decimal_value(&b, &den, 0)) != SCAN_OK)
            return rc;
        if (b == 0)
            return SCAN_DIVZERO;
        a /= b;
        if (!isfinite(a) || a == 0)
            return SCAN_RANGE;
    }
    if (unit != NULL && unit->celsius)
        a += 273.15L;           /* T/K = t/°C + 273.15, by definition */
    *value = a;
    *q = unit ? unit->q : GS_Q_NUMBER;
    return SCAN_OK;
}

int gs_units_scan(long double *value, gs_quantity *unit, const char *text)
{
    switch (scan(value, unit, text)) {
    case SCAN_OK:
        return GS_OK;
    case SCAN_RANGE:
        return GS_ERANGE;
    default:
        return GS_ESYNTAX;
    }
}

const char *gs_quantity_name(gs_quantity q)
{
    switch (q) {
    case GS_Q_CURRENT:     return "amperes";
    case GS_Q_VOLTAGE:     return "volts";
    case GS_Q_CONDUCTANCE: return "siemens";
    case GS_Q_RESISTANCE:  return "ohms";
    case GS_Q_CAPACITANCE: return "farads";
    case GS_Q_FREQUENCY:   return "hertz";
    case GS_Q_TEMPERATURE: return "a temperature";
    case GS_Q_KPARAM:      return "A/V^2";
    case GS_Q_INV_VOLTAGE: return "1/V";
    case GS_Q_SQRT_VOLTAGE: return "V^0.5";
    case GS_Q_LENGTH:      return "metres";
    case GS_Q_CAP_AREA:    return "F/m^2";
    default:               return "a plain number";
    }
}

const char *gs_quantity_unit(gs_quantity q)
{
    switch (q) {
    case GS_Q_CURRENT:     return "A";
    case GS_Q_VOLTAGE:     return "V";
    case GS_Q_CONDUCTANCE: return "S";
    case GS_Q_RESISTANCE:  return "Ohm";
    case GS_Q_CAPACITANCE: return "F";
    case GS_Q_FREQUENCY:   return "Hz";
    case GS_Q_TEMPERATURE: return "K";
    case GS_Q_KPARAM:      return "A/V^2";
    case GS_Q_INV_VOLTAGE: return "1/V";
    case GS_Q_SQRT_VOLTAGE: return "V^0.5";
    case GS_Q_LENGTH:      return "m";
    case GS_Q_CAP_AREA:    return "F/m^2";
    default:               return "";
    }
}

static const char *example(gs_quantity q)
{
    switch (q) {
    case GS_Q_CURRENT:     return "1mA";
    case GS_Q_VOLTAGE:     return "0.7V";
    case GS_Q_CONDUCTANCE: return "4mS";
    case GS_Q_RESISTANCE:  return "45k";
    case GS_Q_CAPACITANCE: return "2pF";
    case GS_Q_FREQUENCY:   return "300MHz";
    case GS_Q_TEMPERATURE: return "300K or 27C";
    case GS_Q_KPARAM:      return "4.5mA/V^2";
    case GS_Q_INV_VOLTAGE: return "0.04/V";
    case GS_Q_SQRT_VOLTAGE: return "0.4V^0.5";
    case GS_Q_LENGTH:      return "0.5um";
    case GS_Q_CAP_AREA:    return "8mF/m^2";
    default:               return "100";
    }
}

/* The message for a failed scan, at `at`. */
static void report(gs_diag *d, const gs_srcpos *at, int why,
                   const char *what, const char *text, gs_quantity q)
{
    const char *file = at ? at->file : NULL;
    int line = at ? at->line : 0, col = at ? at->col : 0;
    char *hint = gs_asprintf("write %s as a number with an optional SI "
                             "prefix (f p n u m k M G T) and unit, e.g. %s",
                             what, example(q));

    switch (why) {
    case SCAN_NOT_NUMBER:
        gs_diag_add(d, GS_SEV_ERROR, file, line, col, hint,
                    "%s expects a number, got %s", what,
                    *text ? text : "nothing");
        break;
    case SCAN_UNKNOWN_UNIT:
        gs_diag_add(d, GS_SEV_ERROR, file, line, col, hint,
                    "%s expects %s, got %s (unknown unit)", what,
                    gs_quantity_name(q), text);
        break;
    case SCAN_FRACTION_PREFIX:
        gs_diag_add(d, GS_SEV_ERROR, file, line, col,
                    "write the quotient as one decimal, e.g. 22.2u",
                    "%s: a fraction takes no SI prefix, got %s", what, text);
        break;
    case SCAN_CELSIUS_PREFIX:
        gs_diag_add(d, GS_SEV_ERROR, file, line, col, NULL,
                    "%s: degrees Celsius take no SI prefix, got %s", what,
                    text);
        break;
    case SCAN_DIVZERO:
        gs_diag_add(d, GS_SEV_ERROR, file, line, col, NULL,
                    "%s: division by zero in %s", what, text);
        break;
    default:
        gs_diag_add(d, GS_SEV_ERROR, file, line, col, NULL,
                    "%s: %s is out of range", what, text);
        break;
    }
    gs_free(hint);
}

static void report_mismatch(gs_diag *d, const gs_srcpos *at,
                            const char *what, const char *text,
                            gs_quantity want, gs_quantity got)
{
    const char *hint = NULL;

    if (got == GS_Q_TEMPERATURE && want != GS_Q_TEMPERATURE)
        hint = "K is the kelvin (and C degrees Celsius); the prefix kilo "
               "is a lowercase k, as in 45k";
    gs_diag_add(d, GS_SEV_ERROR, at ? at->file : NULL, at ? at->line : 0,
                at ? at->col : 0, hint, "%s expects %s, got %s", what,
                gs_quantity_name(want), text);
}

int gs_units_parse(long double *out, const char *text, gs_quantity q,
                   const char *what, const gs_srcpos *at, gs_diag *d)
{
    long double v;
    gs_quantity got;
    int why = scan(&v, &got, text);

    if (why != SCAN_OK) {
        report(d, at, why, what, text, q);
        return why == SCAN_RANGE ? GS_ERANGE : GS_ESYNTAX;
    }
    if (got != GS_Q_NUMBER && got != q) {
        report_mismatch(d, at, what, text, q, got);
        return GS_EINVAL;
    }
    *out = v;
    return GS_OK;
}

/* Engineering notation: mantissa in [1, 1000) and a prefix f..T. */
static char *format_prefixed(long double v, const char *unit)
{
    long double a = fabsl(v), m;
    char buf[64];
    int e3;

    if (a < 1e-15L || a >= 1e15L)
        return gs_asprintf("%.6Lg %s", v, unit);
    e3 = (int)floorl(log10l(a) / 3);
    if (e3 < -5)
        e3 = -5;
    if (e3 > 4)
        e3 = 4;
    m = v / powl(10, 3 * e3);
    snprintf(buf, sizeof buf, "%.6Lg", m);
    if (fabsl(strtold(buf, NULL)) >= 1000 && e3 < 4) {
        e3++;                   /* 999.9999 rounded up to 1000 */
        m = v / powl(10, 3 * e3);
        snprintf(buf, sizeof buf, "%.6Lg", m);
    }
    if (e3 == 0 && strcmp(unit, "m") == 0) {
        e3 = -1;                /* "1.5 m" would read back as milli */
        m = v * 1000;
        snprintf(buf, sizeof buf, "%.6Lg", m);
    }
    if (e3 == 0)
        return gs_asprintf("%s %s", buf, unit);
    /* micro as u here: these figures are meant to be typed back */
    return gs_asprintf("%s %s%s", buf, e3 == -2 ? "u" : gs_si_prefix_text(e3),
                       unit);
}

char *gs_units_format(long double v, gs_quantity q)
{
    const char *unit = gs_quantity_unit(q);

    if (isinf(v))
        return gs_asprintf("%sinf%s%s", v < 0 ? "-" : "", *unit ? " " : "",
                           unit);
    if (q == GS_Q_NUMBER || q == GS_Q_TEMPERATURE || q == GS_Q_INV_VOLTAGE
        || q == GS_Q_SQRT_VOLTAGE || v == 0 || isnan(v))
        return gs_asprintf("%.6Lg%s%s", v, *unit ? " " : "", unit);
    return format_prefixed(v, unit);
}

gs_numtext gs_units_text(long double v, gs_quantity q)
{
    gs_numtext t;
    char *s = gs_units_format(v, q);
    snprintf(t.s, sizeof t.s, "%s", s);
    gs_free(s);
    return t;
}
