/* test_units.c - unit tests of numbers with SI prefixes and units.
 * See LICENSE.
 *
 * Prefix values are those of the SI Brochure (BIPM, 9th edition, 2019,
 * table 7); the Celsius offset 273.15 K is the definition of the degree
 * Celsius (same brochure, 2.3.1).  Parsed values are compared with
 * strtold (C11 7.22.1.3, correctly rounded for decimal input in glibc)
 * of the same decimal with the prefix folded into the exponent.
 */
#include "check.h"
#include "testlib.h"
#include "gainsmith.h"
#include "circuit/units.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* An emulator may carry out long double arithmetic without an
   infinity; the checks of infinite values say so when skipped. */
static int has_inf(void)
{
    volatile long double z = 0;
    if (isinf(1 / z))
        return 1;
    printf("units: long double has no infinity at run time; the checks of "
           "infinite values are skipped\n");
    return 0;
}

static long double scan_ok(const char *text, gs_quantity want_unit)
{
    long double v = -12345;
    gs_quantity q = (gs_quantity)-1;
    int rc = gs_units_scan(&v, &q, text);
    CHECK_MSG(rc == GS_OK, "scan '%s' -> %d", text, rc);
    CHECK_MSG(q == want_unit, "scan '%s': unit %d, want %d", text, (int)q,
              (int)want_unit);
    return v;
}

/* exact: both sides are the correctly rounded long double of a decimal */
static void check_exact(const char *text, const char *decimal,
                        gs_quantity unit)
{
    long double v = scan_ok(text, unit), w = strtold(decimal, NULL);
    CHECK_MSG(v == w, "'%s' = %.21Lg, want %s", text, v, decimal);
}

static void test_prefixes(void)
{
    /* SI Brochure table 7: f 1e-15 ... T 1e12 */
    check_exact("1f", "1e-15", GS_Q_NUMBER);
    check_exact("1p", "1e-12", GS_Q_NUMBER);
    check_exact("2.2n", "2.2e-9", GS_Q_NUMBER);
    check_exact("200u", "200e-6", GS_Q_NUMBER);
    check_exact("200\xC2\xB5", "200e-6", GS_Q_NUMBER);  /* micro sign */
    check_exact("200\xCE\xBC", "200e-6", GS_Q_NUMBER);  /* Greek mu */
    check_exact("10m", "10e-3", GS_Q_NUMBER);
    check_exact("45k", "45e3", GS_Q_NUMBER);
    check_exact("4.7k", "4700", GS_Q_NUMBER);
    check_exact("3M", "3e6", GS_Q_NUMBER);
    check_exact("1.5G", "1.5e9", GS_Q_NUMBER);
    check_exact("2T", "2e12", GS_Q_NUMBER);
    check_exact("1e-3", "0.001", GS_Q_NUMBER);
    check_exact("1.5E+2", "150", GS_Q_NUMBER);
    check_exact("-0.5", "-0.5", GS_Q_NUMBER);
    check_exact("+.5", "0.5", GS_Q_NUMBER);
    check_exact("7.", "7", GS_Q_NUMBER);
    check_exact("1e3k", "1e6", GS_Q_NUMBER);
}

static void test_units(void)
{
    check_exact("10mS", "0.01", GS_Q_CONDUCTANCE);
    check_exact("200uS", "200e-6", GS_Q_CONDUCTANCE);
    check_exact("4mA/V", "4e-3", GS_Q_CONDUCTANCE);
    check_exact("4.5mA/V^2", "4.5e-3", GS_Q_KPARAM);
    check_exact("4.5mA/V2", "4.5e-3", GS_Q_KPARAM);
    check_exact("0.7V", "0.7", GS_Q_VOLTAGE);
    check_exact("1mA", "1e-3", GS_Q_CURRENT);
    check_exact("45kOhm", "45e3", GS_Q_RESISTANCE);
    check_exact("45kohm", "45e3", GS_Q_RESISTANCE);
    check_exact("45 kohms", "45e3", GS_Q_RESISTANCE);
    check_exact("45k\xCE\xA9", "45e3", GS_Q_RESISTANCE);     /* Ω */
    check_exact("45k\xE2\x84\xA6", "45e3", GS_Q_RESISTANCE); /* ohm sign */
    check_exact("10F", "10", GS_Q_CAPACITANCE);   /* F farad, f femto */
    check_exact("10f", "10e-15", GS_Q_NUMBER);
    check_exact("10fF", "10e-15", GS_Q_CAPACITANCE);
    check_exact("2MHz", "2e6", GS_Q_FREQUENCY);
    check_exact("300K", "300", GS_Q_TEMPERATURE); /* K kelvin, k kilo */
    check_exact("0.04/V", "0.04", GS_Q_INV_VOLTAGE);
    check_exact("0.04 1/V", "0.04", GS_Q_INV_VOLTAGE);
    check_exact("40mV^-1", "0.04", GS_Q_INV_VOLTAGE);
    check_exact("0.4V^0.5", "0.4", GS_Q_SQRT_VOLTAGE);
    check_exact("0.4V^1/2", "0.4", GS_Q_SQRT_VOLTAGE);
    /* the metre (SI Brochure table 2) after a prefix; alone, m is the
       prefix milli, as in "10m" above */
    check_exact("20um", "20e-6", GS_Q_LENGTH);
    check_exact("0.5um", "0.5e-6", GS_Q_LENGTH);
    check_exact("180nm", "180e-9", GS_Q_LENGTH);
    check_exact("10mm", "10e-3", GS_Q_LENGTH);
    check_exact("0.5 um", "0.5e-6", GS_Q_LENGTH);
    check_exact("1 m", "1e-3", GS_Q_NUMBER);
    check_exact("8mF/m^2", "8e-3", GS_Q_CAP_AREA);
    check_exact("8mF/m2", "8e-3", GS_Q_CAP_AREA);
    check_exact("8F/m^2", "8", GS_Q_CAP_AREA);
}

static void test_fraction_and_celsius(void)
{
    long double v;

    /* 1/45: the quotient of two exact decimals, rounded once more */
    v = scan_ok("1/45", GS_Q_NUMBER);
    CHECK(v == 1.0L / 45.0L);
    v = scan_ok("1/45V^-1", GS_Q_INV_VOLTAGE);
    CHECK(v == 1.0L / 45.0L);
    /* definition of the degree Celsius: T/K = t/°C + 273.15 */
    v = scan_ok("27C", GS_Q_TEMPERATURE);
    CHECK(fabsl(v - 300.15L) < 1e-15L);
    v = scan_ok("27degC", GS_Q_TEMPERATURE);
    CHECK(fabsl(v - 300.15L) < 1e-15L);
    v = scan_ok("-273.15\xC2\xB0" "C", GS_Q_TEMPERATURE);
    CHECK(fabsl(v) < 1e-15L);
}

static void test_scan_errors(void)
{
    long double v = 7;
    gs_quantity q;

    CHECK(gs_units_scan(&v, &q, "") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "abc") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "inf") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "nan") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "0x10") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "-") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, ".") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "5e") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "10xS") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "10mg") == GS_ESYNTAX);  /* no gram */
    CHECK(gs_units_scan(&v, &q, "10F/m") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "1/45k") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "27mC") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "1/0") == GS_ESYNTAX);
    CHECK(gs_units_scan(&v, &q, "1e999999") == GS_ERANGE);
    CHECK(gs_units_scan(&v, &q, "1e-999999") == GS_ERANGE);
    CHECK(v == 7);      /* unchanged on error */
}

/* gs_units_parse and its message; returns the code. */
static int parse_msg(const char *text, gs_quantity q, const char *what,
                     const char *want_msg, const char *want_hint)
{
    gs_diag d;
    gs_srcpos at = {"amp.gsc", 3, 14};
    long double v = 99;
    int rc;

    gs_diag_init(&d);
    rc = gs_units_parse(&v, text, q, what, &at, &d);
    CHECK_MSG(d.n == 1 && d.nerrors == 1, "'%s': %zu messages", text, d.n);
    if (d.n == 1) {
        CHECK_MSG(strcmp(d.v[0].message, want_msg) == 0, "'%s': got '%s'",
                  text, d.v[0].message);
        CHECK(d.v[0].line == 3 && d.v[0].col == 14);
        CHECK(strcmp(d.v[0].file, "amp.gsc") == 0);
        if (want_hint)
            CHECK_MSG(d.v[0].hint && strcmp(d.v[0].hint, want_hint) == 0,
                      "'%s': hint '%s'", text,
                      d.v[0].hint ? d.v[0].hint : "(none)");
    }
    CHECK(v == 99);
    gs_diag_clear(&d);
    return rc;
}

static void test_parse_messages(void)
{
    gs_diag d;
    long double v = 0;

    CHECK(parse_msg("10mA", GS_Q_CONDUCTANCE, "--gm",
                    "--gm expects siemens, got 10mA", NULL) == GS_EINVAL);
    CHECK(parse_msg("1K", GS_Q_RESISTANCE, "--ro",
                    "--ro expects ohms, got 1K",
                    "K is the kelvin (and C degrees Celsius); the prefix "
                    "kilo is a lowercase k, as in 45k") == GS_EINVAL);
    CHECK(parse_msg("100V", GS_Q_NUMBER, "beta",
                    "beta expects a plain number, got 100V", NULL)
          == GS_EINVAL);
    CHECK(parse_msg("2mS", GS_Q_KPARAM, "k",
                    "k expects A/V^2, got 2mS", NULL) == GS_EINVAL);
    CHECK(parse_msg("20uF", GS_Q_LENGTH, "w",
                    "w expects metres, got 20uF", NULL) == GS_EINVAL);
    CHECK(parse_msg("8mF", GS_Q_CAP_AREA, "cox",
                    "cox expects F/m^2, got 8mF", NULL) == GS_EINVAL);
    CHECK(parse_msg("1um", GS_Q_CAPACITANCE, "cmu",
                    "cmu expects farads, got 1um", NULL) == GS_EINVAL);
    CHECK(parse_msg("abc", GS_Q_CURRENT, "id", "id expects a number, got abc",
                    "write id as a number with an optional SI prefix (f p n "
                    "u m k M G T) and unit, e.g. 1mA") == GS_ESYNTAX);
    CHECK(parse_msg("", GS_Q_VOLTAGE, "vds",
                    "vds expects a number, got nothing", NULL) == GS_ESYNTAX);
    CHECK(parse_msg("10xS", GS_Q_CONDUCTANCE, "--gm",
                    "--gm expects siemens, got 10xS (unknown unit)", NULL)
          == GS_ESYNTAX);
    CHECK(parse_msg("1/45k", GS_Q_INV_VOLTAGE, "lambda",
                    "lambda: a fraction takes no SI prefix, got 1/45k",
                    "write the quotient as one decimal, e.g. 22.2u")
          == GS_ESYNTAX);
    CHECK(parse_msg("27mC", GS_Q_TEMPERATURE, "--temp",
                    "--temp: degrees Celsius take no SI prefix, got 27mC",
                    NULL) == GS_ESYNTAX);
    CHECK(parse_msg("1/0", GS_Q_NUMBER, "beta",
                    "beta: division by zero in 1/0", NULL) == GS_ESYNTAX);
    CHECK(parse_msg("1e99999", GS_Q_CURRENT, "id",
                    "id: 1e99999 is out of range", NULL) == GS_ERANGE);
    /* a bare number fits every quantity; no location is fine */
    gs_diag_init(&d);
    CHECK(gs_units_parse(&v, "300", GS_Q_TEMPERATURE, "--temp", NULL, &d)
          == GS_OK && v == 300 && d.n == 0);
    CHECK(gs_units_parse(&v, "2m", GS_Q_KPARAM, "k", NULL, &d) == GS_OK);
    CHECK(v == strtold("2e-3", NULL));
    CHECK(gs_units_parse(&v, "5", GS_Q_NUMBER, "--x", NULL, &d) == GS_OK);
    CHECK(gs_units_parse(&v, "5V", GS_Q_NUMBER, "--x", NULL, &d)
          == GS_EINVAL);
    CHECK(d.n == 1 && d.v[0].line == 0 && d.v[0].file == NULL);
    gs_diag_clear(&d);
}

static void check_format(long double v, gs_quantity q, const char *want)
{
    char *s = gs_units_format(v, q);
    CHECK_MSG(strcmp(s, want) == 0, "format %.21Lg: '%s', want '%s'", v, s,
              want);
    free(s);
}

static void test_format(void)
{
    /* kT/q at 300 K from the CODATA 2018 exact constants: 25.852 mV */
    check_format(0.025851999786435532L, GS_Q_VOLTAGE, "25.852 mV");
    check_format(25000, GS_Q_RESISTANCE, "25 kOhm");
    check_format(0.0045L, GS_Q_KPARAM, "4.5 mA/V^2");
    check_format(40e-6L, GS_Q_CONDUCTANCE, "40 uS");
    check_format(-1.5e-12L, GS_Q_CAPACITANCE, "-1.5 pF");
    check_format(2.5e9L, GS_Q_FREQUENCY, "2.5 GHz");
    check_format(999999.7L, GS_Q_RESISTANCE, "1 MOhm");  /* rounds up */
    check_format(0.04L, GS_Q_INV_VOLTAGE, "0.04 1/V");
    check_format(300, GS_Q_TEMPERATURE, "300 K");
    check_format(100, GS_Q_NUMBER, "100");
    check_format(0, GS_Q_CONDUCTANCE, "0 S");
    check_format(1e-18L, GS_Q_CAPACITANCE, "1e-18 F");
    check_format(20e-6L, GS_Q_LENGTH, "20 um");
    check_format(1.5L, GS_Q_LENGTH, "1500 mm");   /* not "1.5 m": milli */
    check_format(8e-3L, GS_Q_CAP_AREA, "8 mF/m^2");
    if (has_inf()) {
        check_format(INFINITY, GS_Q_RESISTANCE, "inf Ohm");
        check_format(-INFINITY, GS_Q_NUMBER, "-inf");
    }
    CHECK(strcmp(gs_quantity_name(GS_Q_CONDUCTANCE), "siemens") == 0);
    CHECK(strcmp(gs_quantity_unit(GS_Q_RESISTANCE), "Ohm") == 0);
}

/* Seeded random: mantissa and prefix against strtold, and format then
   scan back to six significant digits. */
static void test_random(void)
{
    static const char *const pre[] = {"f", "p", "n", "u", "m", "", "k",
                                      "M", "G", "T"};
    static const int pexp[] = {-15, -12, -9, -6, -3, 0, 3, 6, 9, 12};
    unsigned seed = 20240611u;
    char text[64], dec[64];
    int i;
    gs_rng r;

    gs_rng_seed(&r, seed);
    for (i = 0; i < 2000; i++) {
        long m = (long)test_below(&r, 1000000);
        long f = (long)test_below(&r, 1000);
        int p = (int)test_below(&r, 10);
        long double v, w, back;
        gs_quantity q;
        char *s;

        snprintf(text, sizeof text, "%ld.%03ld%sS", m, f, pre[p]);
        snprintf(dec, sizeof dec, "%ld.%03lde%d", m, f, pexp[p]);
        v = scan_ok(text, GS_Q_CONDUCTANCE);
        w = strtold(dec, NULL);
        CHECK_MSG(v == w, "seed %u case %d: '%s' -> %.21Lg, want %.21Lg",
                  seed, i, text, v, w);
        if (v == 0)
            continue;
        s = gs_units_format(v, GS_Q_CONDUCTANCE);
        CHECK_MSG(gs_units_scan(&back, &q, s) == GS_OK
                  && q == GS_Q_CONDUCTANCE
                  && fabsl(back - v) <= 5e-6L * fabsl(v),
                  "seed %u case %d: '%s' formats as '%s'", seed, i, text, s);
        free(s);
    }
}

int main(void)
{
    test_prefixes();
    test_units();
    test_fraction_and_celsius();
    test_scan_errors();
    test_parse_messages();
    test_format();
    test_random();
    return check_report("units");
}
