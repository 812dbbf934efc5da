/* svg.c - Bode and step-response plots as SVG. See LICENSE.
 *
 * The page is laid out by hand in pixels: panels are rectangles with an
 * axis mapping on each side, every trace is one <path> clipped to its
 * panel, and each number goes through a locale-free formatter.  Text is
 * escaped for XML (&, <, >, quotes) and control characters are dropped.
 */
#include "output/svg.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "numeric/freq.h"
#include "gainsmith.h"
#include "base/mem.h"

#define NSTYLES 6
#define FONT "Helvetica, Arial, sans-serif"
#define MAX_DB_SPAN 240         /* magnitude axis depth, dB */
#define CHAR_W 6.2              /* rough width of a character at 11 px */

/* Colours that stay apart in grey, and dash patterns for black and white */
static const char *const colours[NSTYLES] = {
    "#1f4e9c", "#b03a2e", "#2e7d32", "#6a1b9a", "#c65a00", "#37474f"
};
static const char *const dashes[NSTYLES] = {
    NULL, "7 4", "2 3", "10 3 2 3", "5 2 1 2", "1 3"
};

/* --- Numbers ------------------------------------------------------------ */

/* A pixel coordinate with two decimals */
static void put(FILE *f, double v)
{
    char b[48];
    fputs(gs_fixed_format(b, sizeof b, v, 2), f);
}

static void put_esc(FILE *f, const char *s)
{
    for (; *s; s++) {
        switch (*s) {
        case '&': fputs("&amp;", f); break;
        case '<': fputs("&lt;", f); break;
        case '>': fputs("&gt;", f); break;
        case '"': fputs("&quot;", f); break;
        case '\'': fputs("&#39;", f); break;
        default:
            if ((unsigned char)*s >= 0x20 || *s == '\t' || *s == '\n')
                fputc(*s, f);
        }
    }
}

/* --- Drawing primitives ------------------------------------------------ */

static void line(FILE *f, double x1, double y1, double x2, double y2,
                 const char *stroke, double width, const char *dash)
{
    fputs("<line x1=\"", f);
    put(f, x1);
    fputs("\" y1=\"", f);
    put(f, y1);
    fputs("\" x2=\"", f);
    put(f, x2);
    fputs("\" y2=\"", f);
    put(f, y2);
    fprintf(f, "\" stroke=\"%s\" stroke-width=\"", stroke);
    put(f, width);
    if (dash != NULL)
        fprintf(f, "\" stroke-dasharray=\"%s", dash);
    fputs("\"/>\n", f);
}

/* Text at (x, y); anchor "start", "middle" or "end"; attrs may be "" */
static void text(FILE *f, double x, double y, const char *anchor,
                 const char *attrs, const char *s)
{
    fputs("<text x=\"", f);
    put(f, x);
    fputs("\" y=\"", f);
    put(f, y);
    fprintf(f, "\" text-anchor=\"%s\"%s%s>", anchor, *attrs ? " " : "",
            attrs);
    put_esc(f, s);
    fputs("</text>\n", f);
}

/* An annotation label: small, on a white halo so grid lines do not cut
   through it */
static void label(FILE *f, double x, double y, const char *anchor,
                  const char *colour, const char *s)
{
    char attrs[160];
    snprintf(attrs, sizeof attrs, "font-size=\"11\" fill=\"%s\" stroke="
             "\"#ffffff\" stroke-width=\"3\" paint-order=\"stroke\"", colour);
    text(f, x, y, anchor, attrs, s);
}

static void circle(FILE *f, double x, double y, double r, const char *stroke,
                   const char *fill)
{
    fputs("<circle cx=\"", f);
    put(f, x);
    fputs("\" cy=\"", f);
    put(f, y);
    fputs("\" r=\"", f);
    put(f, r);
    fprintf(f, "\" fill=\"%s\" stroke=\"%s\" stroke-width=\"1.2\"/>\n",
            fill, stroke);
}

static void cross(FILE *f, double x, double y, double r, const char *stroke)
{
    line(f, x - r, y - r, x + r, y + r, stroke, 1.4, NULL);
    line(f, x - r, y + r, x + r, y - r, stroke, 1.4, NULL);
}

/* --- Axes and panels ---------------------------------------------------- */

typedef struct axis {
    long double lo, hi;     /* data range; log10 of it on a log axis */
    int log;
    double p0, p1;          /* pixels of lo and hi */
} axis;

typedef struct panel {
    double x, y, w, h;
    axis ax, ay;
    long double xstep, ystep;   /* grid steps of linear axes */
    int id;                     /* clip path number */
} panel;

static double amap(const axis *a, long double v)
{
    if (a->log)
        v = log10l(v);
    return a->p0 + (a->p1 - a->p0) * (double)((v - a->lo) / (a->hi - a->lo));
}

static void set_axes(panel *p)
{
    p->ax.p0 = p->x;
    p->ax.p1 = p->x + p->w;
    p->ay.p0 = p->y + p->h;
    p->ay.p1 = p->y;
}

/* The smallest 1, 2, 5 x 10^k step giving at most max ticks over span */
static long double nice_step(long double span, int max)
{
    long double base = powl(10, floorl(log10l(span / max)));
    static const int mult[4] = {1, 2, 5, 10};
    for (int i = 0; i < 4; i++)
        if (span / (base * mult[i]) <= max)
            return base * mult[i];
    return base * 10;
}

/* Round lo down and hi up to multiples of step */
static void snap(axis *a, long double step)
{
    a->lo = floorl(a->lo / step + 1e-9L) * step;
    a->hi = ceill(a->hi / step - 1e-9L) * step;
    if (a->hi <= a->lo)
        a->hi = a->lo + step;
}

/* x="" y="" width="" height="" of the panel's rectangle, open at both
   ends: the caller writes what comes before and after. */
static void rect_geometry(FILE *f, const panel *p)
{
    fputs("x=\"", f);
    put(f, p->x);
    fputs("\" y=\"", f);
    put(f, p->y);
    fputs("\" width=\"", f);
    put(f, p->w);
    fputs("\" height=\"", f);
    put(f, p->h);
}

static void frame(FILE *f, const panel *p)
{
    fputs("<rect ", f);
    rect_geometry(f, p);
    fputs("\" fill=\"none\" stroke=\"#000000\" stroke-width=\"1\"/>\n", f);
}

static void clip_def(FILE *f, const panel *p)
{
    fprintf(f, "<clipPath id=\"clip%d\"><rect ", p->id);
    rect_geometry(f, p);
    fputs("\"/></clipPath>\n", f);
}

/* Vertical grid of a log axis: decades dark, 2..9 light when there is
   room; decade labels (SI) under the panel if labels is set. */
static void log_grid(FILE *f, const panel *p, int labels)
{
    double dec_px = p->w / (double)(p->ax.hi - p->ax.lo);
    int every = dec_px >= 42 ? 1 : (int)ceil(42 / dec_px);
    char b[48];

    for (long k = (long)floorl(p->ax.lo); k <= (long)ceill(p->ax.hi); k++)
        for (int d = 1; d <= 9; d++) {
            long double v = k + log10l(d);
            if (v < p->ax.lo - 1e-9L || v > p->ax.hi + 1e-9L
                || (d > 1 && dec_px < 40))
                continue;
            double x = amap(&(axis){p->ax.lo, p->ax.hi, 0, p->ax.p0,
                                    p->ax.p1}, v);
            line(f, x, p->y, x, p->y + p->h, d == 1 ? "#a8a8a8" : "#e0e0e0",
                 d == 1 ? 0.8 : 0.6, NULL);
            if (labels && d == 1 && k % every == 0)
                text(f, x, p->y + p->h + 15, "middle", "",
                     gs_si_format(b, sizeof b, powl(10, k), 3, NULL));
        }
}

/* Tick label of a linear axis: SI-prefixed, or plain decimals */
static void tick_text(char *b, size_t n, long double v, long double step,
                      int si)
{
    if (fabsl(v) < step * 1e-6L)
        v = 0;
    if (si) {
        gs_si_format(b, n, v, 3, NULL);
        return;
    }
    int dec = (int)ceill(-log10l(step) - 1e-9L);
    gs_fixed_format(b, n, v, dec < 0 ? 0 : dec > 6 ? 6 : dec);
}

/* Horizontal grid of a linear y axis with labels on the left */
static void lin_grid_y(FILE *f, const panel *p, long double step, int si)
{
    char b[48];
    for (long double v = p->ay.lo; v <= p->ay.hi + step * 1e-6L; v += step) {
        double y = amap(&p->ay, v);
        line(f, p->x, y, p->x + p->w, y, "#d4d4d4", 0.7, NULL);
        tick_text(b, sizeof b, v, step, si);
        text(f, p->x - 6, y + 4, "end", "", b);
    }
}

/* Vertical grid of a linear x axis with labels below */
static void lin_grid_x(FILE *f, const panel *p, long double step)
{
    char b[48];
    for (long double v = p->ax.lo; v <= p->ax.hi + step * 1e-6L; v += step) {
        double x = amap(&p->ax, v);
        line(f, x, p->y, x, p->y + p->h, "#d4d4d4", 0.7, NULL);
        tick_text(b, sizeof b, v, step, 1);
        text(f, x, p->y + p->h + 15, "middle", "", b);
    }
}

static void y_title(FILE *f, const panel *p, const char *s)
{
    char attrs[96];
    double x = p->x - 56, y = p->y + p->h / 2;
    snprintf(attrs, sizeof attrs, "transform=\"rotate(-90 %d %d)\"",
             (int)lround(x), (int)lround(y));
    text(f, (int)lround(x), (int)lround(y), "middle", attrs, s);
}

/* --- Traces ------------------------------------------------------------- */

/* One trace as a path; a point that is not finite (or not positive on a
   log axis) ends a run. */
static void trace_path(FILE *f, const panel *p, const long double *x,
                       const long double *y, size_t n, int style)
{
    int pen = 0;
    fprintf(f, "<path clip-path=\"url(#clip%d)\" fill=\"none\" stroke=\"%s\""
            " stroke-width=\"1.6\" stroke-linejoin=\"round\"", p->id,
            colours[style % NSTYLES]);
    if (dashes[style % NSTYLES] != NULL)
        fprintf(f, " stroke-dasharray=\"%s\"", dashes[style % NSTYLES]);
    fputs(" d=\"", f);
    for (size_t i = 0; i < n; i++) {
        if (!isfinite(x[i]) || !isfinite(y[i]) || (p->ax.log && x[i] <= 0)) {
            pen = 0;
            continue;
        }
        fputs(pen ? " L" : " M", f);
        put(f, amap(&p->ax, x[i]));
        fputc(' ', f);
        put(f, amap(&p->ay, y[i]));
        pen = 1;
    }
    fputs("\"/>\n", f);
}

/* y at xv by linear interpolation (in log x when logx); NAN outside */
static long double interp(const long double *x, const long double *y,
                          size_t n, long double xv, int logx)
{
    for (size_t i = 0; i + 1 < n; i++) {
        if (!(x[i] <= xv && xv <= x[i + 1]))
            continue;
        long double a = logx ? log10l(x[i]) : x[i];
        long double b = logx ? log10l(x[i + 1]) : x[i + 1];
        long double v = logx ? log10l(xv) : xv;
        long double t = b > a ? (v - a) / (b - a) : 0;
        return y[i] + t * (y[i + 1] - y[i]);
    }
    return NAN;
}

/* Legend box at the top right of p: one line sample per labelled trace,
   then the pole key (pz & 1) and the zero key (pz & 2). */
static void legend(FILE *f, const panel *p, const gs_plot *pl, int pz)
{
    size_t rows = 0, wide = 8;
    for (size_t i = 0; i < pl->ntraces; i++)
        if (pl->traces[i].label != NULL) {
            rows++;
            wide = strlen(pl->traces[i].label) > wide
                   ? strlen(pl->traces[i].label) : wide;
        }
    size_t keys = (size_t)((pz & 1) + ((pz >> 1) & 1));
    if (rows + keys == 0)
        return;
    double w = 44 + CHAR_W * (double)(wide < 40 ? wide : 40);
    double h = 8 + 16 * (double)(rows + keys), x = p->x + p->w - w - 8;
    double y = p->y + 8;
    fputs("<rect x=\"", f);
    put(f, x);
    fputs("\" y=\"", f);
    put(f, y);
    fputs("\" width=\"", f);
    put(f, w);
    fputs("\" height=\"", f);
    put(f, h);
    fputs("\" fill=\"#ffffff\" stroke=\"#808080\" stroke-width=\"0.8\"/>\n", f);
    double ry = y + 14;
    for (size_t i = 0; i < pl->ntraces; i++) {
        if (pl->traces[i].label == NULL)
            continue;
        line(f, x + 8, ry - 4, x + 36, ry - 4, colours[i % NSTYLES], 1.6,
             dashes[i % NSTYLES]);
        text(f, x + 42, ry, "start", "font-size=\"11\"",
             pl->traces[i].label);
        ry += 16;
    }
    if (pz & 1) {
        cross(f, x + 22, ry - 4, 3.5, "#000000");
        text(f, x + 42, ry, "start", "font-size=\"11\"", "pole");
        ry += 16;
    }
    if (pz & 2) {
        circle(f, x + 22, ry - 4, 3.5, "#000000", "#ffffff");
        text(f, x + 42, ry, "start", "font-size=\"11\"", "zero");
    }
}

/* --- Document ----------------------------------------------------------- */

static void begin(FILE *f, int w, int h, const char *title)
{
    fputs("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n", f);
    fprintf(f, "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" "
            "height=\"%d\" viewBox=\"0 0 %d %d\" font-family=\"%s\" "
            "font-size=\"12\">\n", w, h, w, h, FONT);
    if (title != NULL) {
        fputs("<title>", f);
        put_esc(f, title);
        fputs("</title>\n", f);
    }
    fprintf(f, "<rect x=\"0\" y=\"0\" width=\"%d\" height=\"%d\" "
            "fill=\"#ffffff\"/>\n", w, h);
    if (title != NULL)
        text(f, w / 2.0, 22, "middle", "font-size=\"14\"", title);
}

static int finish(FILE *f)
{
    fputs("</svg>\n", f);
    return ferror(f) ? GS_EIO : GS_OK;
}

static int check_plot(const gs_plot *p, int bode)
{
    if (p == NULL || p->traces == NULL || p->ntraces == 0)
        return GS_EINVAL;
    for (size_t i = 0; i < p->ntraces; i++) {
        const gs_plot_trace *t = &p->traces[i];
        if (t->n == 0 || t->x == NULL || t->y == NULL
            || (bode && t->y2 == NULL))
            return GS_EINVAL;
    }
    return GS_OK;
}

/* Finite range of v[] over every trace (which = 0: x, 1: y, 2: y2), at
   points whose x is finite (and positive when pos).  Returns 0 if
   nothing was finite. */
static int data_range(long double *lo, long double *hi, const gs_plot *p,
                      int which, int pos)
{
    *lo = INFINITY;
    *hi = -INFINITY;
    for (size_t i = 0; i < p->ntraces; i++) {
        const gs_plot_trace *t = &p->traces[i];
        const long double *v = which == 0 ? t->x : which == 1 ? t->y : t->y2;
        for (size_t k = 0; k < t->n; k++)
            if (isfinite(v[k]) && isfinite(t->x[k])
                && (!pos || t->x[k] > 0)) {
                *lo = fminl(*lo, v[k]);
                *hi = fmaxl(*hi, v[k]);
            }
    }
    return *lo <= *hi;
}

/* Widen a degenerate range to a usable one */
static void widen(long double *lo, long double *hi, long double by)
{
    if (*hi - *lo < by * 1e-9L) {
        *lo -= by;
        *hi += by;
    }
}

/* --- Bode plot ---------------------------------------------------------- */

enum { NEED_0DB = 1, NEED_180 = 2, NEED_POLES = 4, NEED_ZEROS = 8 };

static int marks_need(const gs_plot *p)
{
    int need = 0;
    for (size_t i = 0; i < p->ntraces; i++) {
        const gs_plot_marks *m = p->traces[i].marks;
        if (m == NULL)
            continue;
        if (m->has_unity || m->has_gm)
            need |= NEED_0DB;
        if (m->has_pm)
            need |= NEED_180;
        if (m->npoles > 0)
            need |= NEED_POLES;
        if (m->nzeros > 0)
            need |= NEED_ZEROS;
    }
    return need;
}

/* The phase grid step: 5 .. 720 degrees, at most 8 intervals */
static long double phase_step(long double span)
{
    static const int steps[10] = {5, 10, 15, 30, 45, 90, 180, 360, 720, 1440};
    for (int i = 0; i < 10; i++)
        if (span / steps[i] <= 8)
            return steps[i];
    return nice_step(span, 8);
}

static int bode_ranges(panel *mag, panel *ph, const gs_plot *p, int need)
{
    long double xlo, xhi, mlo, mhi, plo, phi;

    if (!data_range(&xlo, &xhi, p, 0, 1) || !data_range(&mlo, &mhi, p, 1, 1)
        || !data_range(&plo, &phi, p, 2, 1))
        return GS_EINVAL;
    xlo = log10l(xlo);
    xhi = log10l(xhi);
    widen(&xlo, &xhi, 0.5L);
    mag->ax = ph->ax = (axis){xlo, xhi, 1, 0, 0};
    if (need & NEED_0DB) {
        mlo = fminl(mlo, 0);
        mhi = fmaxl(mhi, 0);
    }
    mlo = fmaxl(mlo, mhi - MAX_DB_SPAN);
    widen(&mlo, &mhi, 10);
    mag->ay = (axis){mlo, mhi, 0, 0, 0};
    mag->ystep = nice_step(mhi - mlo, 8);
    snap(&mag->ay, mag->ystep);
    if (need & NEED_180) {
        plo = fminl(plo, -180);
        phi = fmaxl(phi, -180);
    }
    widen(&plo, &phi, 45);
    ph->ay = (axis){plo, phi, 0, 0, 0};
    ph->ystep = phase_step(phi - plo);
    snap(&ph->ay, ph->ystep);
    return GS_OK;
}

/* Rows of the pole-zero strip: one per trace with poles or zeros */
static int strip_rows(const gs_plot *p)
{
    int rows = 0;
    for (size_t i = 0; i < p->ntraces; i++) {
        const gs_plot_marks *m = p->traces[i].marks;
        rows += m != NULL && (m->npoles > 0 || m->nzeros > 0);
    }
    return rows;
}

static void bode_layout(panel *mag, panel *ph, double *strip_y,
                        const gs_plot *p, int w, int h)
{
    int rows = strip_rows(p);
    double top = p->title != NULL ? 38 : 14, left = 74, right = 18;
    double bottom = 48, strip = rows ? 10 + 12.0 * rows : 0;
    double avail = h - top - bottom - strip - 14;

    mag->x = ph->x = left;
    mag->w = ph->w = w - left - right;
    mag->y = top;
    mag->h = floor(avail * 0.55);
    *strip_y = mag->y + mag->h + 7;
    ph->y = mag->y + mag->h + 14 + strip;
    ph->h = avail - mag->h;
    mag->id = 0;
    ph->id = 1;
    set_axes(mag);
    set_axes(ph);
}

/* x and o for each trace's poles and zeros at |p| / 2 pi, one row each */
static void pz_strip(FILE *f, const panel *pn, double y0, const gs_plot *p)
{
    int row = 0;
    for (size_t i = 0; i < p->ntraces; i++) {
        const gs_plot_marks *m = p->traces[i].marks;
        if (m == NULL || (m->npoles == 0 && m->nzeros == 0))
            continue;
        double y = y0 + 5 + 12.0 * row++;
        const char *c = colours[i % NSTYLES];
        for (int pass = 0; pass < 2; pass++) {
            const long double complex *r = pass ? m->zeros : m->poles;
            int n = pass ? m->nzeros : m->npoles;
            for (int k = 0; k < n; k++) {
                long double fr = cabsl(r[k]) / (2 * 3.14159265358979323846L);
                long double lf = fr > 0 ? log10l(fr) : -INFINITY;
                if ((k > 0 && cabsl(r[k]) == cabsl(r[k - 1]))
                    || lf < pn->ax.lo || lf > pn->ax.hi)
                    continue;       /* a pair's twin, or off the axis */
                double x = amap(&pn->ax, fr);
                if (pass)
                    circle(f, x, y, 3.5, c, "#ffffff");
                else
                    cross(f, x, y, 3.5, c);
            }
        }
    }
}

/* The pixel x of f on pn, or -1 if f is off the axis */
static double x_at(const panel *pn, long double f)
{
    if (!(f > 0) || log10l(f) < pn->ax.lo || log10l(f) > pn->ax.hi)
        return -1;
    return amap(&pn->ax, f);
}

static double clampy(const panel *pn, double y)
{
    return y < pn->y ? pn->y : y > pn->y + pn->h ? pn->y + pn->h : y;
}

/* Baseline of a label for a point at pixel y: above it, one row higher
   per trace, or below it when that would leave the panel */
static double label_y(const panel *pn, double y, int row)
{
    double above = y - 6 - 13.0 * row;
    return above >= pn->y + 12 ? above : y + 15 + 13.0 * row;
}

/* A dot at (f, v) on pn with a dashed drop line to the panel's bottom and
   a label "what VALUE Hz" */
static void freq_point(FILE *f, const panel *pn, long double fr,
                       long double v, const char *what, const char *c,
                       int row)
{
    char b[96], num[48];
    double x = x_at(pn, fr);
    if (x < 0 || !isfinite(v))
        return;
    double y = clampy(pn, amap(&pn->ay, v));
    line(f, x, y, x, pn->y + pn->h, c, 0.9, "3 3");
    circle(f, x, y, 3, c, "#ffffff");
    snprintf(b, sizeof b, "%s %s", what,
             gs_si_format(num, sizeof num, fr, 3, "Hz"));
    int right = x > pn->x + pn->w - 130;
    label(f, right ? x - 6 : x + 6, label_y(pn, y, row), right ? "end"
          : "start", c, b);
}

/* A bar at f from v0 to v1 with end ticks, labelled */
static void freq_bar(FILE *f, const panel *pn, long double fr, long double v0,
                     long double v1, const char *s, const char *c, int row)
{
    double x = x_at(pn, fr);
    if (x < 0 || !isfinite(v0) || !isfinite(v1))
        return;
    double y0 = clampy(pn, amap(&pn->ay, v0));
    double y1 = clampy(pn, amap(&pn->ay, v1));
    line(f, x, y0, x, y1, c, 1.4, NULL);
    line(f, x - 4, y0, x + 4, y0, c, 1.4, NULL);
    line(f, x - 4, y1, x + 4, y1, c, 1.4, NULL);
    int right = x > pn->x + pn->w - 100;
    label(f, right ? x - 7 : x + 7, (y0 + y1) / 2 + 4 + 13.0 * row,
          right ? "end" : "start", c, s);
}

static void bode_marks(FILE *f, const panel *mag, const panel *ph,
                       const gs_plot_trace *t, int i)
{
    const gs_plot_marks *m = t->marks;
    const char *c = colours[i % NSTYLES];
    char b[64], num[48];

    if (m->has_bw)
        freq_point(f, mag, m->bw_hz, interp(t->x, t->y, t->n, m->bw_hz, 1),
                   "-3 dB", c, i);
    if (m->has_unity)
        freq_point(f, mag, m->unity_hz, 0, "0 dB", c, i);
    if (m->has_gm) {
        snprintf(b, sizeof b, "GM %s dB",
                 gs_fixed_format(num, sizeof num, m->gm_db, 1));
        freq_bar(f, mag, m->gm_hz, -m->gm_db, 0, b, c, i);
    }
    if (m->has_pm) {
        snprintf(b, sizeof b, "PM %s\xc2\xb0",
                 gs_fixed_format(num, sizeof num, m->pm_deg, 1));
        freq_bar(f, ph, m->pm_hz, m->pm_deg - 180, -180, b, c, i);
    }
}

static void ref_line(FILE *f, const panel *pn, long double v,
                     const char *dash)
{
    if (v < pn->ay.lo || v > pn->ay.hi)
        return;
    double y = amap(&pn->ay, v);
    line(f, pn->x, y, pn->x + pn->w, y, "#606060", 1, dash);
}

/* Everything inside the page: grids, traces, frames, marks, legend */
static void bode_body(FILE *out, const panel *mag, const panel *ph,
                      double strip_y, const gs_plot *p, int need)
{
    fputs("<defs>\n", out);
    clip_def(out, mag);
    clip_def(out, ph);
    fputs("</defs>\n", out);
    log_grid(out, mag, 0);
    log_grid(out, ph, 1);
    lin_grid_y(out, mag, mag->ystep, 0);
    lin_grid_y(out, ph, ph->ystep, 0);
    if (need & NEED_0DB)
        ref_line(out, mag, 0, NULL);
    if (need & NEED_180)
        ref_line(out, ph, -180, "6 3");
    for (size_t i = 0; i < p->ntraces; i++) {
        const gs_plot_trace *t = &p->traces[i];
        trace_path(out, mag, t->x, t->y, t->n, (int)i);
        trace_path(out, ph, t->x, t->y2, t->n, (int)i);
    }
    frame(out, mag);
    frame(out, ph);
    pz_strip(out, mag, strip_y, p);
    for (size_t i = 0; i < p->ntraces; i++)
        if (p->traces[i].marks != NULL)
            bode_marks(out, mag, ph, &p->traces[i], (int)i);
    legend(out, mag, p, ((need & NEED_POLES) ? 1 : 0)
                        | ((need & NEED_ZEROS) ? 2 : 0));
    {
        /* the units of the traces, each once, in trace order: an
           impedance drawn with a gain makes "Magnitude (dB, dBΩ)" */
        char title[128] = "Magnitude (";
        size_t k, used = strlen(title);
        for (size_t i = 0; i < p->ntraces; i++) {
            const char *u = p->traces[i].db_unit ? p->traces[i].db_unit
                                                 : "dB";
            for (k = 0; k < i; k++) {
                const char *v = p->traces[k].db_unit
                                ? p->traces[k].db_unit : "dB";
                if (strcmp(u, v) == 0)
                    break;
            }
            if (k < i || used + strlen(u) + 4 >= sizeof title)
                continue;
            if (i > 0)
                used += (size_t)snprintf(title + used, sizeof title - used,
                                         ", ");
            used += (size_t)snprintf(title + used, sizeof title - used,
                                     "%s", u);
        }
        snprintf(title + used, sizeof title - used, ")");
        y_title(out, mag, title);
    }
    y_title(out, ph, "Phase (\xc2\xb0)");
    text(out, ph->x + ph->w / 2, ph->y + ph->h + 36, "middle", "",
         "Frequency (Hz)");
}

int gs_svg_bode(FILE *out, const gs_plot *p)
{
    panel mag, ph;
    double strip_y;
    int w, h, need, rc = check_plot(p, 1);

    if (rc != GS_OK)
        return rc;
    w = p->width > 0 ? p->width : 760;
    h = p->height > 0 ? p->height : 600;
    need = marks_need(p);
    bode_layout(&mag, &ph, &strip_y, p, w, h);
    if (bode_ranges(&mag, &ph, p, need) != GS_OK)
        return GS_EINVAL;
    set_axes(&mag);
    set_axes(&ph);
    begin(out, w, h, p->title);
    bode_body(out, &mag, &ph, strip_y, p, need);
    return finish(out);
}
/* --- Step plot ---------------------------------------------------------- */

static int step_ranges(panel *pn, const gs_plot *p)
{
    long double xlo, xhi, ylo, yhi;

    if (!data_range(&xlo, &xhi, p, 0, 0) || !data_range(&ylo, &yhi, p, 1, 0))
        return GS_EINVAL;
    xlo = fminl(xlo, 0);
    ylo = fminl(ylo, 0);
    yhi = fmaxl(yhi, 0);
    for (size_t i = 0; i < p->ntraces; i++) {
        const gs_step_metrics *m = p->traces[i].metrics;
        if (m != NULL && m->has_final && isfinite(m->final_value)) {
            ylo = fminl(ylo, m->final_value);
            yhi = fmaxl(yhi, m->final_value);
        }
    }
    widen(&xlo, &xhi, 1);
    widen(&ylo, &yhi, 1);
    pn->ax = (axis){xlo, xhi, 0, 0, 0};
    pn->xstep = nice_step(xhi - xlo, 8);
    snap(&pn->ax, pn->xstep);
    pn->ay = (axis){ylo, yhi, 0, 0, 0};
    pn->ystep = nice_step(yhi - ylo, 8);
    snap(&pn->ay, pn->ystep);
    return GS_OK;
}

/* A dot at (t, v), labelled */
static void time_point(FILE *f, const panel *pn, long double t, long double v,
                       const char *s, const char *c, int row)
{
    if (t < pn->ax.lo || t > pn->ax.hi || !isfinite(v))
        return;
    double x = amap(&pn->ax, t), y = clampy(pn, amap(&pn->ay, v));
    circle(f, x, y, 3, c, "#ffffff");
    if (s != NULL) {
        int right = x > pn->x + pn->w - 140;
        label(f, right ? x - 7 : x + 7, label_y(pn, y, row),
              right ? "end" : "start", c, s);
    }
}

static void step_marks(FILE *f, const panel *pn, const gs_step_metrics *m,
                       int i)
{
    const char *c = colours[i % NSTYLES];
    char b[96], num[48];
    long double yf = m->final_value;

    if (!m->has_final)
        return;
    double y = clampy(pn, amap(&pn->ay, yf));
    line(f, pn->x, y, pn->x + pn->w, y, c, 0.9, "6 3");
    snprintf(b, sizeof b, "final %s", gs_si_format(num, sizeof num, yf, 4,
                                                   NULL));
    label(f, pn->x + pn->w - 6, y - 5 - 13.0 * i, "end", c, b);
    if (m->has_rise) {
        time_point(f, pn, m->t10, 0.1L * yf, NULL, c, i);
        snprintf(b, sizeof b, "rise %s", gs_si_format(num, sizeof num,
                                                      m->rise_time, 3, "s"));
        time_point(f, pn, m->t90, 0.9L * yf, b, c, i);
    }
    if (m->has_overshoot && m->overshoot_pct > 0) {
        snprintf(b, sizeof b, "overshoot %s %%",
                 gs_fixed_format(num, sizeof num, m->overshoot_pct, 1));
        time_point(f, pn, m->peak_time, m->peak_value, b, c, i);
    }
    if (m->has_settling && m->settling_time > 0
        && m->settling_time <= pn->ax.hi) {
        double x = amap(&pn->ax, m->settling_time);
        line(f, x, pn->y, x, pn->y + pn->h, c, 0.9, "3 3");
        snprintf(b, sizeof b, "settled (1 %%) %s",
                 gs_si_format(num, sizeof num, m->settling_time, 3, "s"));
        label(f, x + 5, pn->y + pn->h - 8 - 13.0 * i, "start", c, b);
    }
}

int gs_svg_step(FILE *out, const gs_plot *p)
{
    panel pn;
    int w, h, rc = check_plot(p, 0);

    if (rc != GS_OK)
        return rc;
    w = p->width > 0 ? p->width : 760;
    h = p->height > 0 ? p->height : 420;
    pn.x = 74;
    pn.y = p->title != NULL ? 38 : 14;
    pn.w = w - pn.x - 18;
    pn.h = h - pn.y - 48;
    pn.id = 0;
    if (step_ranges(&pn, p) != GS_OK)
        return GS_EINVAL;
    set_axes(&pn);
    begin(out, w, h, p->title);
    fputs("<defs>\n", out);
    clip_def(out, &pn);
    fputs("</defs>\n", out);
    lin_grid_x(out, &pn, pn.xstep);
    long double big = fmaxl(fabsl(pn.ay.lo), fabsl(pn.ay.hi));
    lin_grid_y(out, &pn, pn.ystep, big >= 1e4L || pn.ystep < 1e-3L);
    ref_line(out, &pn, 0, NULL);
    for (size_t i = 0; i < p->ntraces; i++)
        trace_path(out, &pn, p->traces[i].x, p->traces[i].y, p->traces[i].n,
                   (int)i);
    frame(out, &pn);
    for (size_t i = 0; i < p->ntraces; i++)
        if (p->traces[i].metrics != NULL)
            step_marks(out, &pn, p->traces[i].metrics, (int)i);
    legend(out, &pn, p, 0);
    y_title(out, &pn, p->ylabel != NULL ? p->ylabel : "Output");
    text(out, pn.x + pn.w / 2, pn.y + pn.h + 36, "middle", "", "Time (s)");
    return finish(out);
}

/* --- Marks from a transfer function -------------------------------------- */

int gs_plot_marks_fill(gs_plot_marks *m, const gs_tfn *h, int loop_gain)
{
    gs_margins mg;
    int rc = GS_OK;

    memset(m, 0, sizeof *m);
    m->poles = h->poles;
    m->npoles = h->npoles;
    m->zeros = h->zeros;
    m->nzeros = h->nzeros;
    m->has_bw = gs_freq_bandwidth(&m->bw_hz, h) == GS_OK;
    m->has_unity = gs_freq_unity_gain(&m->unity_hz, h) == GS_OK;
    if (loop_gain) {
        rc = gs_freq_margins(&mg, h);
        m->has_pm = mg.has_pm;
        m->pm_deg = mg.pm_deg;
        m->pm_hz = mg.pm_hz;
        m->has_gm = mg.has_gm;
        m->gm_db = mg.gm_db;
        m->gm_hz = mg.gm_hz;
    }
    return rc;
}

/* --- Noise spectra --------------------------------------------------------- */

int gs_svg_spectrum(FILE *out, const gs_plot *p)
{
    panel pn;
    long double xlo, xhi, ylo, yhi;
    int w, h, rc = check_plot(p, 0);

    if (rc != GS_OK)
        return rc;
    if (!data_range(&xlo, &xhi, p, 0, 1) || !data_range(&ylo, &yhi, p, 1, 1))
        return GS_EINVAL;
    w = p->width > 0 ? p->width : 760;
    h = p->height > 0 ? p->height : 420;
    pn.x = 74;
    pn.y = p->title != NULL ? 38 : 14;
    pn.w = w - pn.x - 18;
    pn.h = h - pn.y - 48;
    pn.id = 0;
    xlo = log10l(xlo);
    xhi = log10l(xhi);
    widen(&xlo, &xhi, 0.5L);
    pn.ax = (axis){xlo, xhi, 1, 0, 0};
    ylo = fmaxl(ylo, yhi - MAX_DB_SPAN);
    widen(&ylo, &yhi, 10);
    pn.ay = (axis){ylo, yhi, 0, 0, 0};
    pn.ystep = nice_step(yhi - ylo, 8);
    snap(&pn.ay, pn.ystep);
    set_axes(&pn);
    begin(out, w, h, p->title);
    fputs("<defs>\n", out);
    clip_def(out, &pn);
    fputs("</defs>\n", out);
    log_grid(out, &pn, 1);
    lin_grid_y(out, &pn, pn.ystep, 0);
    for (size_t i = 0; i < p->ntraces; i++)
        trace_path(out, &pn, p->traces[i].x, p->traces[i].y, p->traces[i].n,
                   (int)i);
    frame(out, &pn);
    legend(out, &pn, p, 0);
    y_title(out, &pn, p->ylabel != NULL ? p->ylabel : "Density (dB)");
    text(out, pn.x + pn.w / 2, pn.y + pn.h + 36, "middle", "",
         "Frequency (Hz)");
    return finish(out);
}
