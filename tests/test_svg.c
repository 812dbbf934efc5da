/* test_svg.c - tests of the SVG plot writer. See LICENSE. */
#include <complex.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "testlib.h"
#include "analysis/job.h"
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


/* --- Reading labels back out of a plot ---------------------------------- */

/* One <text> element: where it is anchored, how, and what it says */
typedef struct text_el {
    double x, y, size;
    char anchor[8];
    char s[128];
    int halo;                   /* an annotation label (white halo) */
    int rotated;
} text_el;

/* The value of attribute nm in the tag [tag, end) into buf; 0 if absent */
static int attr(const char *tag, const char *end, const char *nm, char *buf,
                size_t n)
{
    char key[40];
    snprintf(key, sizeof key, " %s=\"", nm);
    const char *a = strstr(tag, key);
    if (a == NULL || a >= end)
        return 0;
    a += strlen(key);
    size_t k = 0;
    while (a < end && *a != '"' && k + 1 < n)
        buf[k++] = *a++;
    buf[k] = '\0';
    return 1;
}

static double num_attr(const char *tag, const char *end, const char *nm,
                       double dflt)
{
    char b[48];
    return attr(tag, end, nm, b, sizeof b) ? strtod(b, NULL) : dflt;
}

/* Text content with the five XML entities undone */
static void unescape(char *dst, size_t n, const char *src, const char *end)
{
    static const char *const ent[5] = {"&amp;", "&lt;", "&gt;", "&quot;",
                                       "&#39;"};
    static const char chr[5] = {'&', '<', '>', '"', '\''};
    size_t k = 0;
    while (src < end && k + 1 < n) {
        int hit = -1;
        for (int i = 0; i < 5 && hit < 0; i++)
            if (strncmp(src, ent[i], strlen(ent[i])) == 0)
                hit = i;
        if (hit >= 0) {
            dst[k++] = chr[hit];
            src += strlen(ent[hit]);
        } else {
            dst[k++] = *src++;
        }
    }
    dst[k] = '\0';
}

/* Every <text> of doc, up to max; returns how many */
static int texts(const char *doc, text_el *t, int max)
{
    int n = 0;
    for (const char *p = strstr(doc, "<text "); p != NULL && n < max;
         p = strstr(p + 1, "<text ")) {
        const char *gt = strchr(p, '>'), *close = strstr(p, "</text>");
        if (gt == NULL || close == NULL)
            break;
        text_el *e = &t[n++];
        e->x = num_attr(p, gt, "x", 0);
        e->y = num_attr(p, gt, "y", 0);
        e->size = num_attr(p, gt, "font-size", 12);
        if (!attr(p, gt, "text-anchor", e->anchor, sizeof e->anchor))
            strcpy(e->anchor, "start");
        e->halo = strstr(p, "paint-order=\"stroke\"") != NULL
                  && strstr(p, "paint-order=\"stroke\"") < gt;
        e->rotated = strstr(p, "transform=") != NULL
                     && strstr(p, "transform=") < gt;
        unescape(e->s, sizeof e->s, gt + 1, close);
    }
    return n;
}

typedef struct bx {
    double x0, y0, x1, y1;
} bx;

/* A label's box by the rule svg.c places labels with: 6.2 px a character
   (a UTF-8 code point) at 11 px plus 1.5 px of halo each side, 9 px above
   the baseline to 3 px below it */
static bx box_of(const text_el *e)
{
    size_t chars = 0;
    for (const char *c = e->s; *c; c++)
        chars += ((unsigned char)*c & 0xC0) != 0x80;
    double w = 6.2 * (double)chars + 3;
    double x0 = strcmp(e->anchor, "start") == 0 ? e->x - 1.5
                : strcmp(e->anchor, "middle") == 0 ? e->x - w / 2
                : e->x + 1.5 - w;
    return (bx){x0, e->y - 9, x0 + w, e->y + 3};
}

/* Boxes meet when they overlap by more than the 0.005 px a coordinate
   may have lost to its two written decimals */
static int meet(bx a, bx b)
{
    const double e = 0.02;
    return a.x0 + e < b.x1 && b.x0 + e < a.x1 && a.y0 + e < b.y1
           && b.y0 + e < a.y1;
}

/* The legend's rectangle (the one rect stroked #808080); 0 if none */
static int legend_box(const char *doc, bx *b)
{
    const char *p = strstr(doc, "stroke=\"#808080\"");
    if (p == NULL)
        return 0;
    while (p > doc && strncmp(p, "<rect ", 6) != 0)
        p--;
    const char *gt = strchr(p, '>');
    double x = num_attr(p, gt, "x", 0), y = num_attr(p, gt, "y", 0);
    *b = (bx){x, y, x + num_attr(p, gt, "width", 0),
              y + num_attr(p, gt, "height", 0)};
    return 1;
}

/* Overlaps among the annotation labels of doc, and between them and the
   legend; prints each pair under tag.  Returns how many labels there
   were in *nlabels. */
static int overlaps(const char *doc, const char *tag, int *nlabels)
{
    static text_el t[512];
    int n = texts(doc, t, 512), bad = 0, labels = 0;
    bx leg;
    int has_leg = legend_box(doc, &leg);
    for (int i = 0; i < n; i++) {
        if (!t[i].halo)
            continue;
        labels++;
        bx a = box_of(&t[i]);
        if (has_leg && meet(a, leg)) {
            fprintf(stderr, "%s: \"%s\" meets the legend\n", tag, t[i].s);
            bad++;
        }
        for (int k = i + 1; k < n; k++)
            if (t[k].halo && meet(a, box_of(&t[k]))) {
                fprintf(stderr, "%s: \"%s\" meets \"%s\"\n", tag, t[i].s,
                        t[k].s);
                bad++;
            }
    }
    *nlabels = labels;
    return bad;
}

/* The text of the label that starts with prefix, or NULL */
static const text_el *find_label(const char *doc, const char *prefix)
{
    static text_el t[512];
    int n = texts(doc, t, 512);
    for (int i = 0; i < n; i++)
        if (t[i].halo && strncmp(t[i].s, prefix, strlen(prefix)) == 0)
            return &t[i];
    return NULL;
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

/* The step of w^2/(s^2 + 2 z w s + w^2), w = 2 pi 1 MHz, z = 0.5, into
   h and s with its metrics in m: the second-order response the step
   tests plot. */
static void second_order_step(gs_tfn *h, gs_step *s, gs_step_metrics *m)
{
    long double w = 2 * PI_L * 1e6L, z = 0.5L;
    const long double num[1] = {w * w}, den[3] = {w * w, 2 * z * w, 1};
    CHECK(gs_tfn_init(h, num, 0, den, 2) == GS_OK);
    CHECK(gs_step_init(s, h) == GS_OK);
    CHECK(gs_step_measure(m, s) == GS_OK);
}

/* Step plot of w^2/(s^2 + 2 z w s + w^2), z = 0.5: overshoot
   exp(-pi z / sqrt(1 - z^2)) = 16.3 % (Ogata, "Modern Control
   Engineering", ch. 5), time axis in SI-prefixed seconds. */
static void test_step_plot(void)
{
    long double t[400], y[400];
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    int rc;
    second_order_step(&h, &s, &m);
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


/* A Bode plot of the transfer functions h[0..n) swept over [lo, hi]
   with their marks, w x h pixels (0: the default); the caller frees */
static char *bode_of(gs_tfn *h, int n, int loop, long double lo,
                     long double hi, int w, int ht)
{
    gs_sweep sw[6];
    gs_plot_marks m[6];
    gs_plot_trace t[6];
    static const char *const names[6] = {"H1", "H2", "H3", "H4", "H5",
                                         "H6"};
    int rc;
    for (int i = 0; i < n; i++) {
        gs_sweep_init(&sw[i]);
        CHECK(gs_sweep_log(&sw[i], &h[i], lo, hi, 300) == GS_OK);
        gs_plot_marks_fill(&m[i], &h[i], loop);
        t[i] = (gs_plot_trace){names[i], sw[i].n, sw[i].freq, sw[i].mag_db,
                               sw[i].phase_deg, &m[i], NULL, NULL};
    }
    gs_plot p = {"Close marks", NULL, w, ht, t, (size_t)n};
    char *doc = render(gs_svg_bode, &p, &rc);
    CHECK(doc != NULL && rc == GS_OK && well_formed(doc));
    for (int i = 0; i < n; i++)
        gs_sweep_clear(&sw[i]);
    return doc;
}

/* Labels of marks at nearly one frequency: no two boxes meet, and none
   meets the legend. */
static void test_labels_apart(void)
{
    const long double w0 = 2 * PI_L * 1e6L;
    gs_tfn h[3];
    int labels = 0;
    char *doc;

    /* K / (1 + s/w0) with K = 1.5: -3 dB at w0, |H| = 1 at
       w0 sqrt(K^2 - 1) = 1.118 w0 (first-order magnitude, any circuits
       text), so the -3 dB and 0 dB points are 12 % and 0.5 dB apart; three
       such traces (K = 1.5, 1.55, 1.6) put six labels in one spot */
    for (int i = 0; i < 3; i++) {
        const long double num[1] = {1.5L + 0.05L * i}, den[2] = {1, 1 / w0};
        CHECK(gs_tfn_init(&h[i], num, 0, den, 1) == GS_OK);
    }
    doc = bode_of(h, 1, 0, 1e4L, 1e8L, 0, 0);
    CHECK(doc != NULL && overlaps(doc, "bw-unity", &labels) == 0);
    CHECK(labels == 2);
    free(doc);
    doc = bode_of(h, 3, 0, 1e4L, 1e8L, 0, 0);
    CHECK(doc != NULL && overlaps(doc, "bw-unity x3", &labels) == 0);
    CHECK(labels == 6);
    free(doc);
    /* the same on a small page, where rows run out above the points */
    doc = bode_of(h, 3, 0, 1e4L, 1e8L, 420, 300);
    CHECK(doc != NULL && overlaps(doc, "small page", &labels) == 0);
    CHECK(labels == 6);
    free(doc);
    for (int i = 0; i < 3; i++)
        gs_tfn_clear(&h[i]);

    /* (1 - s/z) / ((1 - s/p)(1 + s/q)): an RHP pole p at 1 MHz, an RHP
       zero 5 % above it, and an LHP pole q 2 % above it; |1 - jw/z| and
       |1 - jw/p| nearly cancel, so the -3 dB point falls by q too */
    {
        long double p1 = w0, z = 1.05L * w0, q = 1.02L * w0;
        const long double num[2] = {1, -1 / z};
        const long double den[3] = {1, 1 / q - 1 / p1, -1 / (p1 * q)};
        CHECK(gs_tfn_init(&h[0], num, 1, den, 2) == GS_OK);
        doc = bode_of(h, 1, 0, 1e4L, 1e8L, 0, 0);
        CHECK(doc != NULL && overlaps(doc, "rhp pair", &labels) == 0);
        CHECK(labels == 3);
        CHECK(doc != NULL && find_label(doc, "RHP pole 1 MHz") != NULL);
        CHECK(doc != NULL && find_label(doc, "RHP zero 1.05 MHz") != NULL);
        /* |H|^2 = 1/2 with x = (w/p)^2, z and q in units of p:
           x^2/q^2 + x (1 + 1/q^2 - 2/z^2) - 1 = 0, its positive root */
        {
            long double zn = 1.05L, qn = 1.02L, a = 1 / (qn * qn);
            long double bq = 1 + a - 2 / (zn * zn);
            long double x = (-bq + sqrtl(bq * bq + 4 * a)) / (2 * a);
            char want[64], fb[48];
            snprintf(want, sizeof want, "-3 dB %s",
                     gs_si_format(fb, sizeof fb, 1e6L * sqrtl(x), 3,
                                  "Hz"));
            const text_el *e = doc != NULL ? find_label(doc, "-3 dB")
                                           : NULL;
            CHECK_MSG(e != NULL && strcmp(e->s, want) == 0, "want %s",
                      want);
        }
        free(doc);
        gs_tfn_clear(&h[0]);
    }

    /* a loop gain K / (s (1 + s/p1)(1 + s/p2)), p1 and p2 5 % apart: the
       phase reaches -180 degrees at sqrt(p1 p2) (Ogata, "Modern Control
       Engineering", ch. 7, from memory), close to the unity-gain point */
    {
        long double p1 = w0, p2 = 1.05L * w0, k = 1.2L * w0;
        const long double num[1] = {k};
        const long double den[4] = {0, 1, 1 / p1 + 1 / p2, 1 / (p1 * p2)};
        CHECK(gs_tfn_init(&h[0], num, 0, den, 3) == GS_OK);
        doc = bode_of(h, 1, 1, 1e4L, 1e8L, 0, 0);
        CHECK(doc != NULL && overlaps(doc, "margins", &labels) == 0);
        CHECK(labels >= 3);
        CHECK(doc != NULL && find_label(doc, "GM ") != NULL);
        CHECK(doc != NULL && find_label(doc, "PM ") != NULL);
        free(doc);
        gs_tfn_clear(&h[0]);
    }
}

/* Random close marks, seeded: one to four traces of
   K (1 -+ s/z) / ((1 + s/p1)(1 -+ s/p2)), the roots within half a decade
   of each other, some loop gains: never an overlap. */
static void test_labels_random(void)
{
    gs_rng r;
    const uint64_t seed = 20261203;
    gs_rng_seed(&r, seed);
    for (int c = 0; c < 40; c++) {
        gs_tfn h[4];
        int n = 1 + (int)test_below(&r, 4), loop = test_below(&r, 3) == 0;
        long double f0 = 1e5L * powl(10, 2 * test_unit(&r));
        for (int i = 0; i < n; i++) {
            long double w = 2 * PI_L * f0;
            long double z = w * powl(10, test_unit(&r) - 0.5L);
            long double p1 = w * powl(10, test_unit(&r) - 0.5L);
            long double p2 = w * powl(10, test_unit(&r) - 0.5L);
            long double sz = test_below(&r, 2) ? -1 : 1;
            long double sp = test_below(&r, 2) ? -1 : 1;
            long double k = 0.5L + 20 * test_unit(&r);
            const long double num[2] = {k, sz * k / z};
            const long double den[3] = {1, 1 / p1 + sp / p2,
                                        sp / (p1 * p2)};
            CHECK(gs_tfn_init(&h[i], num, 1, den, 2) == GS_OK);
        }
        /* a small page for one or two traces: four traces' sixteen
           labels and legend do not fit a 388 x 111 px magnitude panel */
        int small = n <= 2 && test_below(&r, 2);
        char *doc = bode_of(h, n, loop, f0 / 1e3L, f0 * 1e3L,
                            small ? 480 : 0, small ? 360 : 0);
        int labels = 0;
        int bad = doc != NULL ? overlaps(doc, "random", &labels) : 1;
        CHECK_MSG(bad == 0, "seed %llu case %d", (unsigned long long)seed,
                  c);
        free(doc);
        for (int i = 0; i < n; i++)
            gs_tfn_clear(&h[i]);
    }
}

/* The common-source stage with source resistance RS, load RD and CL, and
   Cgs, Cgd: H(s) = (s Cgd - gm) RD / (1 + b s + a s^2) with
   b = RS (1 + gm RD) Cgd + RS Cgs + RD (Cgd + CL) and
   a = RS RD (Cgs Cgd + Cgs CL + Cgd CL); its zero is in the right half
   plane at +gm/Cgd (Razavi, "Design of Analog CMOS Integrated Circuits",
   frequency-response chapter, from memory).  The same with the
   numerator's sign of s flipped has its zero at -gm/Cgd instead. */
static void cs_stage(gs_tfn *h, int rhp)
{
    const long double gm = 5e-3L, rs = 1e3L, rd = 5e3L;
    const long double cgs = 200e-15L, cgd = 100e-15L, cl = 50e-15L;
    const long double num[2] = {-gm * rd, (rhp ? 1 : -1) * cgd * rd};
    const long double den[3] = {
        1, rs * (1 + gm * rd) * cgd + rs * cgs + rd * (cgd + cl),
        rs * rd * (cgs * cgd + cgs * cl + cgd * cl)};
    CHECK(gs_tfn_init(h, num, 1, den, 2) == GS_OK);
}

/* The first element opened by open whose tag holds has, or NULL */
static const char *tag_with(const char *doc, const char *open,
                            const char *has)
{
    for (const char *p = strstr(doc, open); p != NULL;
         p = strstr(p + 1, open)) {
        const char *h = strstr(p, has), *end = strchr(p, '>');
        if (h != NULL && end != NULL && h < end)
            return p;
    }
    return NULL;
}

/* A right-half-plane zero is drawn apart from a left-half-plane one of
   the same magnitude: boxed in the strip, keyed "RHP zero" in the
   legend, and named with its frequency, gm/Cgd / 2 pi = 7.96 GHz. */
static void test_rhp_zero(void)
{
    gs_tfn h[2];
    cs_stage(&h[0], 1);
    cs_stage(&h[1], 0);
    CHECK(h[0].nzeros == 1 && creall(h[0].zeros[0]) > 0);
    CHECK(h[1].nzeros == 1 && creall(h[1].zeros[0]) < 0);
    char *rhp = bode_of(&h[0], 1, 0, 1e6L, 1e12L, 0, 0);
    char *lhp = bode_of(&h[1], 1, 0, 1e6L, 1e12L, 0, 0);
    CHECK(rhp != NULL && lhp != NULL);
    if (rhp != NULL && lhp != NULL) {
        CHECK(find_label(rhp, "RHP zero 7.96 GHz") != NULL);
        CHECK(find_label(lhp, "RHP zero") == NULL);
        CHECK(strstr(rhp, ">RHP zero</text>") != NULL);
        CHECK(strstr(rhp, ">zero</text>") == NULL);
        CHECK(strstr(lhp, ">zero</text>") != NULL);
        CHECK(strstr(lhp, ">RHP zero</text>") == NULL);
        /* the same place on the axis, a different marker: an open square
           (9 px, x its left side) round the root against the plain
           3.5 px circle; the strip is drawn before the legend's keys */
        CHECK(count(rhp, "width=\"9\" height=\"9\"") == 2);  /* + key */
        CHECK(count(lhp, "width=\"9\" height=\"9\"") == 0);
        const char *sq = tag_with(rhp, "<rect ", "width=\"9\"");
        const char *ci = tag_with(lhp, "<circle ", "r=\"3.5\"");
        CHECK(sq != NULL && ci != NULL);
        if (sq != NULL && ci != NULL) {
            double xs = num_attr(sq, strchr(sq, '>'), "x", -1) + 4.5;
            double xc = num_attr(ci, strchr(ci, '>'), "cx", -2);
            CHECK_MSG(fabs(xs - xc) < 0.02, "square at %g, circle at %g",
                      xs, xc);
        }
    }
    free(rhp);
    free(lhp);
    gs_tfn_clear(&h[0]);
    gs_tfn_clear(&h[1]);
}


/* The same stage as a circuit, derived exactly and bound (RD = 6k in
   parallel with ro = 30k is the closed form's 5k): the plot of the
   derived transfer function names the same right-half-plane zero, and
   agrees with the closed form's plot label for label. */
static void test_rhp_zero_derived(void)
{
    static const char circuit[] =
        "vsource    vin   a    gnd\n"
        "resistor   RS    a    g\n"
        "mosfet     M1    d    g    gnd  gm=gm1 rds=ro1\n"
        "capacitor  Cgs   g    gnd\n"
        "capacitor  Cgd   g    d\n"
        "resistor   RD    d    gnd\n"
        "capacitor  CL    d    gnd\n"
        "value      RS  = 1k\n"
        "value      gm1 = 5m\n"
        "value      Cgs = 200f\n"
        "value      Cgd = 100f\n"
        "value      RD  = 6k\n"
        "value      ro1 = 30k\n"
        "value      CL  = 50f\n"
        "transfer   Av  = v(d) / vin\n";
    gs_job j;
    gs_derive_opts o;
    gs_diag d;
    gs_tfn h[2];
    int rc, dn, dd;
    gs_job_init(&j);
    gs_derive_opts_default(&o);
    gs_diag_init(&d);
    rc = gs_job_load_string(&j, "cs.gsc", circuit, &d);
    if (rc == GS_OK)
        rc = gs_job_derive(&j, NULL, &o, &d);
    if (rc == GS_OK)
        rc = gs_job_bind(&j, NULL, 0, &d);
    if (rc != GS_OK)
        gs_diag_print(stderr, &d);
    CHECK(rc == GS_OK && j.ntf == 1);
    if (rc == GS_OK && j.ntf == 1) {
        long double *cn = gs_job_coeffs(&j, &j.tf[0].num, &dn);
        long double *cd = gs_job_coeffs(&j, &j.tf[0].den, &dd);
        CHECK(gs_tfn_init(&h[0], cn, dn, cd, dd) == GS_OK);
        free(cn);
        free(cd);
        /* the zero at +gm/Cgd = 5e10 rad/s */
        CHECK(h[0].nzeros == 1
              && cabsl(h[0].zeros[0] - 5e10L) < 1e-9L * 5e10L);
        cs_stage(&h[1], 1);
        char *a = bode_of(&h[0], 1, 0, 1e6L, 1e12L, 0, 0);
        char *b = bode_of(&h[1], 1, 0, 1e6L, 1e12L, 0, 0);
        CHECK(a != NULL && find_label(a, "RHP zero 7.96 GHz") != NULL);
        if (a != NULL && b != NULL) {
            static text_el ta[64], tb[64];
            int na = texts(a, ta, 64), nb = texts(b, tb, 64);
            CHECK(na == nb);
            for (int i = 0; i < na && i < nb; i++)
                if (ta[i].halo)
                    CHECK_MSG(strcmp(ta[i].s, tb[i].s) == 0, "%s / %s",
                              ta[i].s, tb[i].s);
        }
        free(a);
        free(b);
        gs_tfn_clear(&h[0]);
        gs_tfn_clear(&h[1]);
    }
    gs_diag_clear(&d);
    gs_job_clear(&j);
}

/* The x of the last point of the first trace's path */
static double path_end_x(const char *doc)
{
    const char *p = strstr(doc, "<path clip-path=");
    const char *d = p != NULL ? strstr(p, " d=\"") : NULL;
    const char *end = d != NULL ? strchr(d + 4, '"') : NULL;
    if (end == NULL)
        return -1;
    const char *last = NULL;
    for (const char *q = d; q != NULL && q < end; q = strstr(q + 1, " L"))
        last = q;
    return last != NULL && last < end ? strtod(last + 2, NULL) : -1;
}

/* The right side of the first panel's frame */
static double frame_right(const char *doc)
{
    const char *p = tag_with(doc, "<rect ", "fill=\"none\" stroke=\"#000000\"");
    if (p == NULL)
        return -2;
    const char *gt = strchr(p, '>');
    return num_attr(p, gt, "x", 0) + num_attr(p, gt, "width", 0);
}

/* The step trace runs to the right end of the time axis: with samples
   to an end off the grid (3.7 us where the ticks are 0.5 us apart) the
   axis ends at the last sample; sampled to gs_svg_step_axis_end it ends
   on the tick 4 us. */
static void test_step_axis_end(void)
{
    long double t[300], y[300];
    gs_tfn h;
    gs_step s;
    gs_step_metrics m;
    int rc;
    second_order_step(&h, &s, &m);
    /* ticks by the 1-2-5 rule, at most 8 intervals (common practice):
       3.7 us / 8 = 0.46 us -> 0.5 us, so the axis ends at 4 us */
    long double end = gs_svg_step_axis_end(3.7e-6L);
    CHECK_MSG(fabsl(end - 4e-6L) < 1e-18L, "end %Lg", end);
    CHECK(gs_svg_step_axis_end(4e-6L) == 4e-6L);
    CHECK(gs_svg_step_axis_end(-1) == -1);
    for (int pass = 0; pass < 2; pass++) {
        long double te = pass ? end : 3.7e-6L;
        CHECK(gs_step_table(t, y, NULL, 300, &s, te) == GS_OK);
        gs_plot_trace tr = {"H", 300, t, y, NULL, NULL, &m, NULL};
        gs_plot p = {NULL, NULL, 0, 0, &tr, 1};
        char *doc = render(gs_svg_step, &p, &rc);
        CHECK(doc != NULL && rc == GS_OK && well_formed(doc));
        if (doc == NULL)
            continue;
        double xe = path_end_x(doc), xr = frame_right(doc);
        CHECK_MSG(fabs(xe - xr) < 0.01, "pass %d: trace ends at %g, axis "
                  "at %g", pass, xe, xr);
        /* the axis ends on a labelled tick only when sampled to it */
        char want[80];
        snprintf(want, sizeof want, "<text x=\"%g\" y=", xr);
        const char *tick = strstr(doc, want);
        CHECK(pass ? tick != NULL && strstr(tick, ">4 \xc2\xb5</text>")
                         == strchr(tick, '>')
                   : tick == NULL);
        free(doc);
    }
    gs_step_clear(&s);
    gs_tfn_clear(&h);
}

/* Two step responses of nearly one damping (zeta = 0.5 and 0.52): their
   final values, rise times, overshoot peaks and settling times all land
   together, and no two labels meet. */
static void test_step_labels_apart(void)
{
    long double w = 2 * PI_L * 1e6L;
    long double t[2][400], y[2][400];
    gs_tfn h[2];
    gs_step s[2];
    gs_step_metrics m[2];
    gs_plot_trace tr[2];
    int rc, labels = 0;
    for (int i = 0; i < 2; i++) {
        long double z = 0.5L + 0.02L * i;
        const long double num[1] = {w * w}, den[3] = {w * w, 2 * z * w, 1};
        CHECK(gs_tfn_init(&h[i], num, 0, den, 2) == GS_OK);
        CHECK(gs_step_init(&s[i], &h[i]) == GS_OK);
        CHECK(gs_step_measure(&m[i], &s[i]) == GS_OK);
        CHECK(gs_step_table(t[i], y[i], NULL, 400, &s[i], 2e-6L) == GS_OK);
        tr[i] = (gs_plot_trace){i ? "zeta 0.52" : "zeta 0.5", 400, t[i],
                                y[i], NULL, NULL, &m[i], NULL};
    }
    gs_plot p = {"Two steps", NULL, 0, 0, tr, 2};
    char *doc = render(gs_svg_step, &p, &rc);
    CHECK(doc != NULL && rc == GS_OK && well_formed(doc));
    CHECK(doc != NULL && overlaps(doc, "step", &labels) == 0);
    CHECK(labels == 8);     /* final, rise, overshoot, settled, twice */
    free(doc);
    for (int i = 0; i < 2; i++) {
        gs_step_clear(&s[i]);
        gs_tfn_clear(&h[i]);
    }
}

int main(void)
{
    test_checker();
    test_si_format();
    test_bode_basic();
    test_bode_loop_and_traces();
    test_bode_edges();
    test_step_plot();
    test_labels_apart();
    test_labels_random();
    test_rhp_zero();
    test_rhp_zero_derived();
    test_step_axis_end();
    test_step_labels_apart();
    return check_report("svg");
}
