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

/* --- Placing annotation labels ------------------------------------------ */

/* A label's box is estimated from its text as the legend sizes its
   column: CHAR_W per character (a code point of UTF-8) at 11 px, plus
   LABEL_PAD on each side for the white halo; from LABEL_ASC above the
   baseline to LABEL_DESC below it. */
#define LABEL_ASC 9.0
#define LABEL_DESC 3.0
#define LABEL_PAD 1.5
#define LABEL_GAP 1.0           /* between a label and one it moved past */
#define MAX_BOXES 96

typedef struct box {
    double x0, y0, x1, y1;
} box;

/* The boxes already taken on one page, in drawing order.  Each plot
   starts empty, so the placement depends only on the plot's data. */
typedef struct placer {
    box b[MAX_BOXES];
    int n;
} placer;

static size_t utf8_chars(const char *s)
{
    size_t n = 0;
    for (; *s; s++)
        n += ((unsigned char)*s & 0xC0) != 0x80;
    return n;
}

static box label_box(double x, double y, const char *anchor, const char *s)
{
    double w = CHAR_W * (double)utf8_chars(s) + 2 * LABEL_PAD;
    double x0 = strcmp(anchor, "start") == 0 ? x - LABEL_PAD
                : strcmp(anchor, "middle") == 0 ? x - w / 2
                : x + LABEL_PAD - w;
    return (box){x0, y - LABEL_ASC, x0 + w, y + LABEL_DESC};
}

static int boxes_meet(const box *a, const box *b)
{
    return a->x0 < b->x1 && b->x0 < a->x1 && a->y0 < b->y1 && b->y0 < a->y1;
}

static int box_free(const placer *pl, const box *b)
{
    for (int i = 0; i < pl->n; i++)
        if (boxes_meet(&pl->b[i], b))
            return 0;
    return 1;
}

static void take_box(placer *pl, box b)
{
    if (pl->n < MAX_BOXES)
        pl->b[pl->n++] = b;
}

/* Baselines to try for a label wanted at y, nearest first (downwards
   first at equal distance): y itself, and just below and just above each
   box already placed, LABEL_GAP clear of it.  Returns how
   many went into c (room for 2 MAX_BOXES + 1). */
static int baselines(double *c, const placer *pl, double y)
{
    int n = 0;
    c[n++] = y;
    for (int i = 0; i < pl->n; i++) {
        c[n++] = pl->b[i].y1 + LABEL_GAP + LABEL_ASC;
        c[n++] = pl->b[i].y0 - LABEL_GAP - LABEL_DESC;
    }
    /* insertion sort: stable, so the order is the same on every run */
    for (int i = 1; i < n; i++) {
        double v = c[i], dv = fabs(v - y);
        int k = i;
        while (k > 0) {
            double du = fabs(c[k - 1] - y);
            if (du < dv || (du == dv && (c[k - 1] >= y || v < y)))
                break;
            c[k] = c[k - 1];
            k--;
        }
        c[k] = v;
    }
    return n;
}

/* Where a label with its box from bx0 to bx1 (bx0 <= x <= bx1 for the
   anchor x) may slide sideways to: just clear of the left or the right
   side of each box placed, or against the panel's sides x0 and x1,
   nearest the wanted x first.  Returns how many anchor positions went
   into c (room for 2 MAX_BOXES + 2). */
static int slides(double *c, const placer *pl, double x, double bx0,
                  double bx1, double x0, double x1)
{
    int n = 0;
    c[n++] = x0 + (x - bx0);
    c[n++] = x1 - (bx1 - x);
    for (int i = 0; i < pl->n; i++) {
        c[n++] = pl->b[i].x1 + LABEL_GAP + (x - bx0);
        c[n++] = pl->b[i].x0 - LABEL_GAP - (bx1 - x);
    }
    for (int i = 1; i < n; i++) {
        double v = c[i], dv = fabs(v - x);
        int k = i;
        while (k > 0 && fabs(c[k - 1] - x) > dv) {
            c[k] = c[k - 1];
            k--;
        }
        c[k] = v;
    }
    return n;
}

/* b within [x0, x1] x [y0, y1], give or take rounding (a box slid
   against a side may come out a few ulps past it) */
static int inside(const box *b, double x0, double y0, double x1, double y1)
{
    const double e = 1e-6;
    return b->x0 >= x0 - e && b->x1 <= x1 + e && b->y0 >= y0 - e
           && b->y1 <= y1 + e;
}

/* A label for a mark at pixel x, the baseline wanted at y: beside the
   mark, gap pixels to its right (start) or, with prefer_end, to its left.
   Where that box would meet one already placed, or leave the panel
   [x0, x1] x [y0, y1], it goes to the other side of the mark, or moves
   down (or up) just past the box in its way, nearest place first, until
   a free place is found.  When no row beside the mark is free, the label
   slides sideways along the rows, nearest first, until it clears the
   boxes in its way; a page too crowded for any of that keeps the first
   place inside the panel. */
static void place_label(FILE *f, placer *pl, double x0, double y0, double x1,
                        double y1, double x, double y, double gap,
                        int prefer_end, const char *colour, const char *s)
{
    double c[2 * MAX_BOXES + 1], sx[2 * MAX_BOXES + 2];
    int n = baselines(c, pl, y), have_first = 0;
    double fx = x + gap, fy = y;
    const char *fa = prefer_end ? "end" : "start";
    for (int k = 0; k < n; k++) {
        for (int side = 0; side < 2; side++) {
            int end = side ? !prefer_end : prefer_end;
            double xk = end ? x - gap : x + gap;
            const char *a = end ? "end" : "start";
            box b = label_box(xk, c[k], a, s);
            if (!inside(&b, x0, y0, x1, y1))
                continue;
            if (!have_first) {
                have_first = 1;
                fx = xk;
                fy = c[k];
                fa = a;
            }
            if (box_free(pl, &b)) {
                take_box(pl, b);
                label(f, xk, c[k], a, colour, s);
                return;
            }
        }
    }
    box b0 = label_box(fx, fy, fa, s);
    int m = slides(sx, pl, fx, b0.x0, b0.x1, x0, x1);
    for (int k = 0; k < n; k++)
        for (int j = 0; j < m; j++) {
            box b = label_box(sx[j], c[k], fa, s);
            if (inside(&b, x0, y0, x1, y1) && box_free(pl, &b)) {
                take_box(pl, b);
                label(f, sx[j], c[k], fa, colour, s);
                return;
            }
        }
    take_box(pl, b0);
    label(f, fx, fy, fa, colour, s);
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

/* place_label inside a panel */
static void panel_label(FILE *f, placer *pl, const panel *pn, double x,
                        double y, double gap, int prefer_end,
                        const char *colour, const char *s)
{
    place_label(f, pl, pn->x, pn->y, pn->x + pn->w, pn->y + pn->h, x, y,
                gap, prefer_end, colour, s);
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

/* Keys of the legend after the traces' lines: which root markers the
   plot draws */
enum { KEY_POLE = 1, KEY_ZERO = 2, KEY_RHP_POLE = 4, KEY_RHP_ZERO = 8 };

/* The legend's rectangle at the top right of p: one row per labelled
   trace, then one per key of pz.  Returns the number of rows (0: no
   legend). */
static size_t legend_rect(box *r, const panel *p, const gs_plot *pl, int pz)
{
    size_t rows = 0, wide = 8;
    for (size_t i = 0; i < pl->ntraces; i++)
        if (pl->traces[i].label != NULL) {
            rows++;
            wide = strlen(pl->traces[i].label) > wide
                   ? strlen(pl->traces[i].label) : wide;
        }
    for (int k = 0; k < 4; k++)
        rows += (size_t)((pz >> k) & 1);
    double w = 44 + CHAR_W * (double)(wide < 40 ? wide : 40);
    double h = 8 + 16 * (double)rows, x = p->x + p->w - w - 8;
    *r = (box){x, p->y + 8, x + w, p->y + 8 + h};
    return rows;
}

/* A root's marker: x for a pole, o for a zero; a root in the right half
   plane has its marker in an open square as well, so it stands out in
   black and white too. */
static void root_marker(FILE *f, double x, double y, int zero, int rhp,
                        const char *c)
{
    if (rhp) {
        fputs("<rect x=\"", f);
        put(f, x - 4.5);
        fputs("\" y=\"", f);
        put(f, y - 4.5);
        fprintf(f, "\" width=\"9\" height=\"9\" fill=\"#ffffff\" "
                "stroke=\"%s\" stroke-width=\"1.2\"/>\n", c);
    }
    if (zero)
        circle(f, x, y, rhp ? 2.5 : 3.5, c, "#ffffff");
    else
        cross(f, x, y, rhp ? 2.5 : 3.5, c);
}

/* Legend box at the top right of p: one line sample per labelled trace,
   then the keys of the root markers in pz (KEY_*). */
static void legend(FILE *f, const panel *p, const gs_plot *pl, int pz)
{
    static const char *const keys[4] = {"pole", "zero", "RHP pole",
                                        "RHP zero"};
    box r;
    if (legend_rect(&r, p, pl, pz) == 0)
        return;
    double x = r.x0;
    fputs("<rect x=\"", f);
    put(f, x);
    fputs("\" y=\"", f);
    put(f, r.y0);
    fputs("\" width=\"", f);
    put(f, r.x1 - r.x0);
    fputs("\" height=\"", f);
    put(f, r.y1 - r.y0);
    fputs("\" fill=\"#ffffff\" stroke=\"#808080\" stroke-width=\"0.8\"/>\n", f);
    double ry = r.y0 + 14;
    for (size_t i = 0; i < pl->ntraces; i++) {
        if (pl->traces[i].label == NULL)
            continue;
        line(f, x + 8, ry - 4, x + 36, ry - 4, colours[i % NSTYLES], 1.6,
             dashes[i % NSTYLES]);
        text(f, x + 42, ry, "start", "font-size=\"11\"",
             pl->traces[i].label);
        ry += 16;
    }
    for (int k = 0; k < 4; k++) {
        if (!((pz >> k) & 1))
            continue;
        root_marker(f, x + 22, ry - 4, k & 1, k >= 2, "#000000");
        text(f, x + 42, ry, "start", "font-size=\"11\"", keys[k]);
        ry += 16;
    }
}

/* The legend's rectangle is taken before any label is placed, so no
   label hides under it */
static void legend_reserve(placer *pc, const panel *p, const gs_plot *pl,
                           int pz)
{
    box r;
    if (legend_rect(&r, p, pl, pz) > 0)
        take_box(pc, r);
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

/* The legend's keys (KEY_*) shifted up by NEED_KEYS */
enum { NEED_0DB = 1, NEED_180 = 2, NEED_KEYS = 2 };

/* A root in the right half plane.  A pair on the imaginary axis comes out
   of the root finder with a real part of round-off size, either sign; the
   margin of 1e-6 of |r| keeps it with the left half plane (a real RHP pair
   that close to the axis would have Q above 5e5). */
static int is_rhp(long double complex r)
{
    return creall(r) > 1e-6L * cabsl(r);
}

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
        for (int k = 0; k < m->npoles; k++)
            need |= (is_rhp(m->poles[k]) ? KEY_RHP_POLE : KEY_POLE)
                    << NEED_KEYS;
        for (int k = 0; k < m->nzeros; k++)
            need |= (is_rhp(m->zeros[k]) ? KEY_RHP_ZERO : KEY_ZERO)
                    << NEED_KEYS;
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

/* A root's frequency |r| / 2 pi, or 0 when the marker is not drawn: the
   twin of a pair (the one after a root of the same magnitude), or off
   the axis */
static long double root_hz(const panel *pn, const long double complex *r,
                           int k)
{
    long double fr = cabsl(r[k]) / (2 * 3.14159265358979323846L);
    long double lf = fr > 0 ? log10l(fr) : -INFINITY;
    if ((k > 0 && cabsl(r[k]) == cabsl(r[k - 1])
         && is_rhp(r[k]) == is_rhp(r[k - 1]))
        || lf < pn->ax.lo || lf > pn->ax.hi)
        return 0;
    return fr;
}

/* x and o for each trace's poles and zeros at |p| / 2 pi, one row each;
   those in the right half plane boxed */
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
                long double fr = root_hz(pn, r, k);
                if (fr > 0)
                    root_marker(f, amap(&pn->ax, fr), y, pass,
                                is_rhp(r[k]), c);
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

/* Baseline wanted for a label of a point at pixel y: above it, or below
   it when that would leave the panel */
static double label_y(const panel *pn, double y)
{
    double above = y - 6;
    return above - LABEL_ASC >= pn->y ? above : y + 6 + LABEL_ASC;
}

/* A dot at (f, v) on pn with a dashed drop line to the panel's bottom and
   a label "what VALUE Hz" */
static void freq_point(FILE *f, placer *pl, const panel *pn, long double fr,
                       long double v, const char *what, const char *c)
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
    panel_label(f, pl, pn, x, label_y(pn, y), 6, 0, c, b);
}

/* A bar at f from v0 to v1 with end ticks, labelled */
static void freq_bar(FILE *f, placer *pl, const panel *pn, long double fr,
                     long double v0, long double v1, const char *s,
                     const char *c)
{
    double x = x_at(pn, fr);
    if (x < 0 || !isfinite(v0) || !isfinite(v1))
        return;
    double y0 = clampy(pn, amap(&pn->ay, v0));
    double y1 = clampy(pn, amap(&pn->ay, v1));
    line(f, x, y0, x, y1, c, 1.4, NULL);
    line(f, x - 4, y0, x + 4, y0, c, 1.4, NULL);
    line(f, x - 4, y1, x + 4, y1, c, 1.4, NULL);
    panel_label(f, pl, pn, x, (y0 + y1) / 2 + 4, 7, 0, c, s);
}

/* Each root of the right half plane named with its frequency ("RHP zero
   1.59 GHz") at the bottom of the magnitude panel, above its marker in
   the strip: such a root adds phase lag where a left-half-plane one of
   the same magnitude would add lead, which a designer must not miss */
static void rhp_labels(FILE *f, placer *pl, const panel *mag,
                       const gs_plot_marks *m, const char *c)
{
    char b[96], num[48];
    for (int pass = 0; pass < 2; pass++) {
        const long double complex *r = pass ? m->zeros : m->poles;
        int n = pass ? m->nzeros : m->npoles;
        for (int k = 0; k < n; k++) {
            long double fr = root_hz(mag, r, k);
            if (!(fr > 0) || !is_rhp(r[k]))
                continue;
            snprintf(b, sizeof b, "RHP %s %s", pass ? "zero" : "pole",
                     gs_si_format(num, sizeof num, fr, 3, "Hz"));
            panel_label(f, pl, mag, amap(&mag->ax, fr),
                        mag->y + mag->h - LABEL_DESC - 2, 5, 0, c, b);
        }
    }
}

static void bode_marks(FILE *f, placer *pl, const panel *mag,
                       const panel *ph, const gs_plot_trace *t, int i)
{
    const gs_plot_marks *m = t->marks;
    const char *c = colours[i % NSTYLES];
    char b[64], num[48];

    if (m->has_bw)
        freq_point(f, pl, mag, m->bw_hz,
                   interp(t->x, t->y, t->n, m->bw_hz, 1), "-3 dB", c);
    if (m->has_unity)
        freq_point(f, pl, mag, m->unity_hz, 0, "0 dB", c);
    if (m->has_gm) {
        snprintf(b, sizeof b, "GM %s dB",
                 gs_fixed_format(num, sizeof num, m->gm_db, 1));
        freq_bar(f, pl, mag, m->gm_hz, -m->gm_db, 0, b, c);
    }
    if (m->has_pm) {
        snprintf(b, sizeof b, "PM %s\xc2\xb0",
                 gs_fixed_format(num, sizeof num, m->pm_deg, 1));
        freq_bar(f, pl, ph, m->pm_hz, m->pm_deg - 180, -180, b, c);
    }
    rhp_labels(f, pl, mag, m, c);
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
    placer pl;
    pl.n = 0;
    legend_reserve(&pl, mag, p, need >> NEED_KEYS);
    for (size_t i = 0; i < p->ntraces; i++)
        if (p->traces[i].marks != NULL)
            bode_marks(out, &pl, mag, ph, &p->traces[i], (int)i);
    legend(out, mag, p, need >> NEED_KEYS);
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

/* The time axis over [lo, hi]: snapped out to its grid step, except that
   it ends at the last sample when the step would carry it past, so every
   trace that reaches the last sample reaches the axis end.  Sampling to
   gs_svg_step_axis_end makes the two the same. */
static void time_axis(axis *a, long double *step, long double lo,
                      long double hi)
{
    long double dhi = hi;
    int spread = hi > lo;
    widen(&lo, &hi, 1);
    *a = (axis){lo, hi, 0, 0, 0};
    *step = nice_step(hi - lo, 8);
    snap(a, *step);
    if (spread && a->hi > dhi)
        a->hi = dhi;
}

long double gs_svg_step_axis_end(long double t_end)
{
    long double end = t_end, step;
    axis a;
    if (!(t_end > 0) || !isfinite(t_end))
        return t_end;
    /* the snapped end of [0, end] is a grid step of a span that grew by
       less than one step; a second round settles it (a third at most,
       when the longer span picks a coarser step) */
    for (int k = 0; k < 4; k++) {
        time_axis(&a, &step, 0, end);
        long double up = ceill(end / step - 1e-9L) * step;
        if (up <= end)
            break;
        end = up;
    }
    return end;
}

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
    time_axis(&pn->ax, &pn->xstep, xlo, xhi);
    widen(&ylo, &yhi, 1);
    pn->ay = (axis){ylo, yhi, 0, 0, 0};
    pn->ystep = nice_step(yhi - ylo, 8);
    snap(&pn->ay, pn->ystep);
    return GS_OK;
}

/* A dot at (t, v), labelled */
static void time_point(FILE *f, placer *pl, const panel *pn, long double t,
                       long double v, const char *s, const char *c)
{
    if (t < pn->ax.lo || t > pn->ax.hi || !isfinite(v))
        return;
    double x = amap(&pn->ax, t), y = clampy(pn, amap(&pn->ay, v));
    circle(f, x, y, 3, c, "#ffffff");
    if (s != NULL)
        panel_label(f, pl, pn, x, label_y(pn, y), 7, 0, c, s);
}

static void step_marks(FILE *f, placer *pl, const panel *pn,
                       const gs_step_metrics *m, int i)
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
    panel_label(f, pl, pn, pn->x + pn->w, label_y(pn, y), 6, 1, c, b);
    if (m->has_rise) {
        time_point(f, pl, pn, m->t10, 0.1L * yf, NULL, c);
        snprintf(b, sizeof b, "rise %s", gs_si_format(num, sizeof num,
                                                      m->rise_time, 3, "s"));
        time_point(f, pl, pn, m->t90, 0.9L * yf, b, c);
    }
    if (m->has_overshoot && m->overshoot_pct > 0) {
        snprintf(b, sizeof b, "overshoot %s %%",
                 gs_fixed_format(num, sizeof num, m->overshoot_pct, 1));
        time_point(f, pl, pn, m->peak_time, m->peak_value, b, c);
    }
    if (m->has_settling && m->settling_time > 0
        && m->settling_time <= pn->ax.hi) {
        double x = amap(&pn->ax, m->settling_time);
        line(f, x, pn->y, x, pn->y + pn->h, c, 0.9, "3 3");
        snprintf(b, sizeof b, "settled (1 %%) %s",
                 gs_si_format(num, sizeof num, m->settling_time, 3, "s"));
        panel_label(f, pl, pn, x, pn->y + pn->h - 8, 5, 0, c, b);
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
    placer pl;
    pl.n = 0;
    legend_reserve(&pl, &pn, p, 0);
    for (size_t i = 0; i < p->ntraces; i++)
        if (p->traces[i].metrics != NULL)
            step_marks(out, &pl, &pn, p->traces[i].metrics, (int)i);
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
