/* test_svg.c - tests of the SVG plot writer. See LICENSE. */
#include <complex.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "numeric/freq.h"
#include "gainsmith.h"
#include "numeric/roots.h"
#include "numeric/step.h"
#include "output/svg.h"

#define PI_L 3.141592653589793238462643383279502884L

/* --- A small XML well-formedness checker (XML 1.0, W3C Recommendation,
   fifth edition, sections 2.1-2.8 and 3.1, reduced to what an SVG file
   of ours may hold: one declaration, elements, attributes, text). ---- */

static int is_name_char(int c)
{
    return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z')
           || (c >= '0' && c <= '9') || c == '-' || c == '_' || c == ':'
           || c == '.';
}

/* A reference after '&': a predefined entity or a character reference */
static int entity(const char **p)
{
    static const char *const names[5] = {"amp;", "lt;", "gt;", "quot;",
                                         "apos;"};
    const char *s = *p + 1;
    for (int i = 0; i < 5; i++)
        if (strncmp(s, names[i], strlen(names[i])) == 0) {
            *p = s + strlen(names[i]);
            return 1;
        }
    if (*s != '#')
        return 0;
    s++;
    int hex = *s == 'x';
    s += hex;
    const char *start = s;
    while ((*s >= '0' && *s <= '9')
           || (hex && ((*s >= 'a' && *s <= 'f') || (*s >= 'A' && *s <= 'F'))))
        s++;
    if (s == start || *s != ';')
        return 0;
    *p = s + 1;
    return 1;
}

static int valid_utf8(const char *s)
{
    const unsigned char *u = (const unsigned char *)s;
    while (*u) {
        int extra = *u < 0x80 ? 0 : (*u & 0xE0) == 0xC0 ? 1
                    : (*u & 0xF0) == 0xE0 ? 2 : (*u & 0xF8) == 0xF0 ? 3 : -1;
        if (extra < 0)
            return 0;
        u++;
        while (extra-- > 0)
            if ((*u++ & 0xC0) != 0x80)
                return 0;
    }
    return 1;
}

/* Parse a name at *p into buf; returns its length (0: none) */
static size_t name(const char **p, char *buf, size_t n)
{
    size_t k = 0;
    while (is_name_char((unsigned char)**p)) {
        if (k + 1 < n)
            buf[k++] = **p;
        (*p)++;
    }
    buf[k] = '\0';
    return k;
}

/* Attributes up to '>' or '/>': each name="value" or name='value', names
   unique, values free of '<' and of bare '&'. */
static int attributes(const char **p, int *empty)
{
    char seen[64][32];
    int nseen = 0;
    for (;;) {
        while (**p == ' ' || **p == '\n' || **p == '\t')
            (*p)++;
        if (**p == '>' || (**p == '/' && (*p)[1] == '>')) {
            *empty = **p == '/';
            *p += *empty ? 2 : 1;
            return 1;
        }
        char an[32];
        if (name(p, an, sizeof an) == 0 || **p != '=')
            return 0;
        for (int i = 0; i < nseen; i++)
            if (strcmp(seen[i], an) == 0)
                return 0;
        if (nseen < 64)
            strcpy(seen[nseen++], an);
        char q = *++*p;
        if (q != '"' && q != '\'')
            return 0;
        for ((*p)++; **p != q; ) {
            if (**p == '\0' || **p == '<')
                return 0;
            if (**p == '&') {
                if (!entity(p))
                    return 0;
            } else {
                (*p)++;
            }
        }
        (*p)++;
    }
}

/* 1 if doc is well formed: balanced, properly nested tags, one root,
   quoted attributes, '&' and '<' escaped in text. */
static int well_formed(const char *doc)
{
    char stack[64][32];
    int depth = 0, roots = 0;
    const char *p = doc;

    if (!valid_utf8(doc))
        return 0;
    if (strncmp(p, "<?xml ", 6) == 0) {
        p = strstr(p, "?>");
        if (p == NULL)
            return 0;
        p += 2;
    }
    while (*p) {
        if (*p == '&') {
            if (!entity(&p))
                return 0;
            continue;
        }
        if (*p != '<') {
            if (depth == 0 && *p != '\n' && *p != ' ')
                return 0;           /* text outside the root */
            p++;
            continue;
        }
        p++;
        int closing = *p == '/', empty = 0;
        char nm[32];
        p += closing;
        if (name(&p, nm, sizeof nm) == 0)
            return 0;
        if (closing) {
            if (*p++ != '>' || depth == 0 || strcmp(stack[--depth], nm) != 0)
                return 0;
            continue;
        }
        if (!attributes(&p, &empty))
            return 0;
        if (depth == 0)
            roots++;
        if (!empty) {
            if (depth == 64)
                return 0;
            strcpy(stack[depth++], nm);
        }
    }
    return depth == 0 && roots == 1;
}

/* The checker itself must reject what is broken. */
static void test_checker(void)
{
    CHECK(well_formed("<a x=\"1\"><b/>t &amp; u</a>\n"));
    CHECK(!well_formed("<a><b></a></b>"));
    CHECK(!well_formed("<a x=1/>"));
    CHECK(!well_formed("<a>x & y</a>"));
    CHECK(!well_formed("<a x=\"<\"/>"));
    CHECK(!well_formed("<a/><b/>"));
    CHECK(!well_formed("<a x=\"1\" x=\"2\"/>"));
    CHECK(!well_formed("<a>"));
    CHECK(!well_formed("<a>\xff</a>"));
}

/* --- Helpers -------------------------------------------------------------- */

/* Run a writer into memory; the caller frees the text */
static char *render(int (*writer)(FILE *, const gs_plot *), const gs_plot *p,
                    int *rc)
{
    FILE *f = tmpfile();
    char *buf;
    long n;
    if (f == NULL)
        return NULL;
    *rc = writer(f, p);
    n = ftell(f);
    rewind(f);
    buf = malloc((size_t)n + 1);
    if (buf != NULL) {
        size_t got = fread(buf, 1, (size_t)n, f);
        buf[got] = '\0';
    }
    fclose(f);
    return buf;
}

static int count(const char *s, const char *what)
{
    int n = 0;
    for (const char *p = strstr(s, what); p != NULL; p = strstr(p + 1, what))
        n++;
    return n;
}

/* --- Tests ------------------------------------------------------------- */

/* SI prefixes (BIPM, "The International System of Units", 9th ed.,
   table 7); 3 significant digits unless said. */
static void test_si_format(void)
{
    char b[48];
    CHECK(strcmp(gs_si_format(b, sizeof b, 1000, 3, NULL), "1 k") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 1e4L, 3, NULL), "10 k") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 1e8L, 3, NULL), "100 M") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 0.1L, 3, NULL), "100 m") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 1, 3, NULL), "1") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 1591.549L, 3, "Hz"),
                 "1.59 kHz") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 999.96L, 3, "Hz"), "1 kHz") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 4.7e-9L, 3, "F"), "4.7 nF") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, -2.2e6L, 3, "V"), "-2.2 MV") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 0, 3, "s"), "0 s") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 1e-6L, 3, "s"),
                 "1 \xc2\xb5s") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 12345, 4, NULL), "12.35 k") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 2e9L, 3, "Hz"), "2 GHz") == 0);
    CHECK(strcmp(gs_si_format(b, sizeof b, 0.000314159L, 2, NULL),
                 "310 \xc2\xb5") == 0);
    CHECK(strcmp(gs_si_format(b, 4, 123456, 3, "Hz"), "123") == 0);
}

static void rc_trace(gs_tfn *h, gs_sweep *sw, gs_plot_marks *m)
{
    /* RC low-pass, R = 1k, C = 100n: -3 dB at 1/(2 pi RC) = 1.59 kHz */
    const long double num[1] = {1}, den[2] = {1, 1e-4L};
    CHECK(gs_tfn_init(h, num, 0, den, 1) == GS_OK);
    gs_sweep_init(sw);
    CHECK(gs_sweep_log(sw, h, 1, 1e6L, 121) == GS_OK);
    CHECK(gs_plot_marks_fill(m, h, 0) == GS_OK);
    CHECK(m->has_bw && !m->has_pm);
}

/* A one-trace Bode plot: well formed, with the axis titles, SI decade
   labels, the pole marker and the bandwidth annotation. */
static void test_bode_basic(void)
{
    gs_tfn h;
    gs_sweep sw;
    gs_plot_marks m;
    int rc;
    rc_trace(&h, &sw, &m);
    gs_plot_trace t = {"RC & <filter>", sw.n, sw.freq, sw.mag_db,
                       sw.phase_deg, &m, NULL, NULL};
    gs_plot p = {"First-order \"RC\" low-pass", NULL, 0, 0, &t, 1};
    char *doc = render(gs_svg_bode, &p, &rc);
    CHECK(doc != NULL && rc == GS_OK);
    CHECK(well_formed(doc));
    CHECK(strstr(doc, "Frequency (Hz)") != NULL);
    CHECK(strstr(doc, "Magnitude (dB)") != NULL);
    CHECK(strstr(doc, "Phase (\xc2\xb0)") != NULL);
    CHECK(strstr(doc, ">1 k</text>") != NULL);
    CHECK(strstr(doc, ">100 k</text>") != NULL);
    CHECK(strstr(doc, ">1 M</text>") != NULL);
    CHECK(strstr(doc, "-3 dB 1.59 kHz") != NULL);
    CHECK(strstr(doc, "RC &amp; &lt;filter&gt;") != NULL);
    CHECK(strstr(doc, "&quot;RC&quot;") != NULL);
    CHECK(count(doc, "<path ") == 2);
    CHECK(strstr(doc, ">pole</text>") != NULL);
    char *again = render(gs_svg_bode, &p, &rc);
    CHECK(again != NULL && strcmp(doc, again) == 0);    /* deterministic */
    free(again);
    free(doc);
    gs_sweep_clear(&sw);
    gs_tfn_clear(&h);
}

/* Loop gain sqrt 2 / (s (s + 1)): PM = 45 degrees at 1 rad/s (see
   test_freq); plus two more traces overlaid, told apart by dashes. */
static void test_bode_loop_and_traces(void)
{
    const long double n1[1] = {sqrtl(2)}, d1[3] = {0, 1, 1};
    const long double n2[1] = {4}, d2[3] = {0, 1, 1};
    const long double n3[1] = {0.5L}, d3[3] = {0, 1, 1};
    gs_tfn h[3];
    gs_sweep sw[3];
    gs_plot_marks m;
    gs_plot_trace t[3];
    const char *names[3] = {"K = 1.41", "K = 4", "K = 0.5"};
    int rc;
    CHECK(gs_tfn_init(&h[0], n1, 0, d1, 2) == GS_OK);
    CHECK(gs_tfn_init(&h[1], n2, 0, d2, 2) == GS_OK);
    CHECK(gs_tfn_init(&h[2], n3, 0, d3, 2) == GS_OK);
    CHECK(gs_plot_marks_fill(&m, &h[0], 1) == GS_OK);
    CHECK(m.has_pm && fabsl(m.pm_deg - 45) < 1e-12L);
    for (int i = 0; i < 3; i++) {
        gs_sweep_init(&sw[i]);
        CHECK(gs_sweep_log(&sw[i], &h[i], 1e-3L, 10, 200) == GS_OK);
        t[i] = (gs_plot_trace){names[i], sw[i].n, sw[i].freq, sw[i].mag_db,
                               sw[i].phase_deg, i == 0 ? &m : NULL, NULL,
                               NULL};
    }
    gs_plot p = {NULL, NULL, 800, 640, t, 3};
    char *doc = render(gs_svg_bode, &p, &rc);
    CHECK(doc != NULL && rc == GS_OK && well_formed(doc));
    CHECK(strstr(doc, "PM 45\xc2\xb0") != NULL);
    CHECK(strstr(doc, "0 dB 159 mHz") != NULL);
    CHECK(strstr(doc, "stroke-dasharray=\"7 4\" d=") != NULL);
    CHECK(strstr(doc, "stroke-dasharray=\"2 3\" d=") != NULL);
    CHECK(count(doc, "<path ") == 6);
    CHECK(strstr(doc, ">K = 0.5</text>") != NULL);
    CHECK(strstr(doc, "width=\"800\" height=\"640\"") != NULL);
    free(doc);
    for (int i = 0; i < 3; i++) {
        gs_sweep_clear(&sw[i]);
        gs_tfn_clear(&h[i]);
    }
}

/* Bad input is refused; a non-finite point breaks the line. */
static void test_bode_edges(void)
{
    long double f[4] = {1, 10, 100, 1000}, mag[4] = {0, NAN, -20, -40};
    long double ph[4] = {0, -45, -90, -90}, bad[4] = {NAN, NAN, NAN, NAN};
    gs_plot_trace t = {NULL, 4, f, mag, ph, NULL, NULL, NULL};
    gs_plot p = {NULL, NULL, 0, 0, &t, 1};
    int rc;
    char *doc = render(gs_svg_bode, &p, &rc);
    CHECK(rc == GS_OK && doc != NULL && well_formed(doc));
    CHECK(doc != NULL && count(doc, " M") >= 2);
    free(doc);
    gs_plot none = {NULL, NULL, 0, 0, NULL, 0};
    doc = render(gs_svg_bode, &none, &rc);
    CHECK(rc == GS_EINVAL);
    free(doc);
    gs_plot_trace tb = {NULL, 4, f, bad, ph, NULL, NULL, NULL};
    gs_plot pb = {NULL, NULL, 0, 0, &tb, 1};
    doc = render(gs_svg_bode, &pb, &rc);
    CHECK(rc == GS_EINVAL);
    free(doc);
    /* the magnitude axis names the units of its traces: an impedance is
       in dB relative to 1 ohm, not a gain in dB */
    {
        gs_plot_trace two[2] = {
            {"Av", 4, f, mag, ph, NULL, NULL, "dB"},
            {"Zo", 4, f, mag, ph, NULL, NULL, "dB\xce\xa9"}};
        gs_plot pu = {NULL, NULL, 0, 0, two, 2};
        doc = render(gs_svg_bode, &pu, &rc);
        CHECK(rc == GS_OK && doc != NULL
              && strstr(doc, "Magnitude (dB, dB\xce\xa9)") != NULL);
        free(doc);
        pu.traces = two + 1;
        pu.ntraces = 1;
        doc = render(gs_svg_bode, &pu, &rc);
        CHECK(rc == GS_OK && doc != NULL
              && strstr(doc, "Magnitude (dB\xce\xa9)") != NULL
              && strstr(doc, "Magnitude (dB)") == NULL);
        free(doc);
    }
}

/* Step plot of w^2/(s^2 + 2 z w s + w^2), z = 0.5: overshoot
   exp(-pi z / sqrt(1 - z^2)) = 16.3 % (Ogata, "Modern Control
   Engineering", ch. 5), time axis in SI-prefixed seconds. */
static void test_step_plot(void)
{
    long double w = 2 * PI_L * 1e6L, z = 0.5L;
    const long double num[1] = {w * w}, den[3] = {w * w, 2 * z * w, 1};
    long double t[400], y[400];
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    int rc;
    CHECK(gs_tfn_init(&h, num, 0, den, 2) == GS_OK);
    CHECK(gs_step_init(&s, &h) == GS_OK);
    CHECK(gs_step_measure(&m, &s) == GS_OK);
    CHECK(gs_step_table(t, y, NULL, 400, &s, gs_step_span(&s)) == GS_OK);
    gs_plot_trace tr = {"2nd order, zeta = 0.5", 400, t, y, NULL, NULL, &m, NULL};
    gs_plot p = {"Step response", "v(out) (V)", 0, 0, &tr, 1};
    char *doc = render(gs_svg_step, &p, &rc);
    CHECK(doc != NULL && rc == GS_OK && well_formed(doc));
    CHECK(strstr(doc, "Time (s)") != NULL);
    CHECK(strstr(doc, "overshoot 16.3 %") != NULL);
    CHECK(strstr(doc, " n</text>") != NULL);         /* ns tick labels */
    CHECK(strstr(doc, "final 1") != NULL);
    CHECK(strstr(doc, "v(out) (V)") != NULL);
    free(doc);
    gs_step_clear(&s);
    gs_tfn_clear(&h);
}

int main(void)
{
    test_checker();
    test_si_format();
    test_bode_basic();
    test_bode_loop_and_traces();
    test_bode_edges();
    test_step_plot();
    return check_report("svg");
}
