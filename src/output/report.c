/* report.c - the review document's sections. See LICENSE.
 *
 * The document is the list `sections` below and, per output, the list
 * `out_sections`: each entry writes one section through the format's
 * writer.  New analyses add an entry where the list marks a place.
 */
#include "output/report.h"

#include <ctype.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "analysis/approx.h"
#include "analysis/refcheck.h"
#include "analysis/sens.h"
#include "base/mem.h"
#include "base/si.h"
#include "gainsmith.h"
#include "numeric/freq.h"
#include "numeric/roots.h"
#include "numeric/step.h"
#include "output/svg.h"

/* Terms shown of a long side: the first FOLD_HEAD and last FOLD_TAIL. */
#define FOLD_MAX 12
#define FOLD_HEAD 4
#define FOLD_TAIL 2
/* A root estimate longer than this many characters is named, not
   written out, in the approx section. */
#define EST_MAX 240

typedef struct rctx {
    gs_report_out *o;
    const gs_report_writer *w;
    const gs_job *j;
    size_t i;               /* the output, for out_sections */
    gs_tfn h;
    int have_h;
} rctx;

typedef void (*section_fn)(rctx *r);

int gs_report_format_of(const char *path)
{
    const char *dot = strrchr(path, '.');
    if (dot == NULL)
        return -1;
    if (strcmp(dot, ".html") == 0 || strcmp(dot, ".htm") == 0)
        return GS_REPORT_HTML;
    if (strcmp(dot, ".md") == 0)
        return GS_REPORT_MD;
    if (strcmp(dot, ".tex") == 0)
        return GS_REPORT_TEX;
    return -1;
}

void gs_report_tokens(const char *s,
                      void (*tok)(int kind, const char *text, size_t len,
                                  unsigned power, void *arg),
                      void *arg)
{
    while (*s) {
        const char *b = s;
        if (*s == ' ') {
            s++;
        } else if (strncmp(s, "...", 3) == 0) {
            tok('e', s, 3, 0, arg);
            s += 3;
        } else if (isalpha((unsigned char)*s) || *s == '_') {
            unsigned pw = 0;
            size_t len;
            while (isalnum((unsigned char)*s) || *s == '_')
                s++;
            len = (size_t)(s - b);
            if (*s == '^') {
                pw = (unsigned)strtoul(s + 1, (char **)&s, 10);
            }
            tok('i', b, len, pw, arg);
        } else if (isdigit((unsigned char)*s)) {
            while (isdigit((unsigned char)*s))
                s++;
            tok('n', b, (size_t)(s - b), 0, arg);
        } else {
            tok('o', s, 1, 0, arg);
            s++;
        }
    }
}

/* The text of p, folded to its first and last terms when long; *nterms
   gets the count.  A new string. */
static char *folded(const gs_poly *p, const gs_polyctx *ctx, size_t *nterms)
{
    char *t = gs_poly_get_str(p, ctx), *out, *q;
    size_t n = 1, k, cut1 = 0, cut2 = 0;
    for (q = t; *q; q++)
        if ((q[0] == ' ') && (q[1] == '+' || q[1] == '-') && q[2] == ' ')
            n++;
    *nterms = n;
    if (n <= FOLD_MAX)
        return t;
    for (q = t, k = 1; *q; q++)
        if (q[0] == ' ' && (q[1] == '+' || q[1] == '-') && q[2] == ' ') {
            if (k == FOLD_HEAD)
                cut1 = (size_t)(q - t);
            if (k == n - FOLD_TAIL)
                cut2 = (size_t)(q - t);
            k++;
        }
    out = gs_malloc(strlen(t) + 16);
    memcpy(out, t, cut1);
    strcpy(out + cut1, " + ...");
    strcat(out, t + cut2);
    gs_free(t);
    return out;
}

static char *fmt(const char *f, long double v)
{
    char buf[64];
    snprintf(buf, sizeof buf, f, v);
    return gs_strdup(buf);
}

/* --- whole-document sections ---------------------------------------- */

static void sec_listing(rctx *r)
{
    FILE *in;
    char line[1024], **lines = NULL;
    size_t n = 0;
    r->w->heading(r->o, 2, "Circuit");
    if (strcmp(r->j->c->file, "-") == 0
        || (in = fopen(r->j->c->file, "r")) == NULL) {
        r->w->para(r->o, "(the listing is not available: the circuit was "
                   "read from standard input)");
        return;
    }
    while (fgets(line, sizeof line, in)) {
        line[strcspn(line, "\r\n")] = 0;
        lines = gs_realloc(lines, (n + 1) * sizeof *lines);
        lines[n++] = gs_strdup(line);
    }
    fclose(in);
    r->w->listing(r->o, lines, n);
    while (n)
        gs_free(lines[--n]);
    gs_free(lines);
}

static void sec_values(rctx *r)
{
    const gs_job *j = r->j;
    unsigned char *used = gs_job_used_symbols(j);
    int v, nv = j->ctx->nvars;
    size_t rows = 1;
    char **cells = gs_malloc((size_t)(nv + 1) * 3 * sizeof *cells);
    cells[0] = gs_strdup("symbol");
    cells[1] = gs_strdup("value");
    cells[2] = gs_strdup("from");
    for (v = 0; v < nv; v++) {
        if (!used[v] || v == j->c->s_sym)
            continue;
        cells[rows * 3] = gs_strdup(gs_symtab_name(j->c->syms, v));
        cells[rows * 3 + 1] = fmt("%.6Lg", j->vals[v]);
        cells[rows * 3 + 2] = gs_strdup(j->origin[v] ? j->origin[v]
                                                     : "value line");
        rows++;
    }
    r->w->heading(r->o, 2, "Values");
    r->w->table(r->o, cells, rows, 3);
    for (v = 0; v < (int)rows * 3; v++)
        gs_free(cells[v]);
    gs_free(cells);
    gs_free(used);
}

static void sec_caution(rctx *r)
{
    r->w->heading(r->o, 2, "Caution");
    r->w->para(r->o, "Small-signal results are linear approximations "
               "around one operating point. The device models are "
               "first-order hand-analysis models; short-channel devices "
               "and real parts deviate from them. Verify every design by "
               "simulation and by measurement, use the manufacturer's or "
               "foundry's models for a design that matters, and for "
               "mains-connected or high-voltage equipment defer to the "
               "applicable safety codes and to licensed practice.");
}

/* --- per-output sections --------------------------------------------- */

static void sec_exact(rctx *r)
{
    const gs_tf *tf = &r->j->tf[r->i];
    size_t nn, nd;
    char *n = folded(&tf->num, tf->ctx, &nn), *d = folded(&tf->den,
                                                          tf->ctx, &nd);
    char buf[160];
    r->w->heading(r->o, 3, "Exact result");
    r->w->formula(r->o, gs_tf_name(tf), n, d);
    if (nn > FOLD_MAX || nd > FOLD_MAX) {
        snprintf(buf, sizeof buf, "Folded: the numerator has %zu terms, "
                 "the denominator %zu (gainsmith derive prints them all).",
                 nn, nd);
        r->w->para(r->o, buf);
    }
    gs_free(n);
    gs_free(d);
}

static void sec_dc(rctx *r)
{
    char buf[128];
    long double dc;
    if (!r->have_h)
        return;
    dc = gs_tfn_dc_gain(&r->h);
    if (isfinite(dc) && dc != 0)
        snprintf(buf, sizeof buf, "DC gain: %.10Lg (%.4Lf dB)", dc,
                 20 * log10l(fabsl(dc)));
    else
        snprintf(buf, sizeof buf, "DC gain: %.10Lg", dc);
    r->w->para(r->o, buf);
}

static void pz_rows(char **cells, size_t *rows, const char *what,
                    const long double complex *p, int n)
{
    int k;
    for (k = 0; k < n; k++) {
        gs_pz_info pz;
        char *c = (char *)cells + 0;
        (void)c;
        gs_pz_describe(&pz, p[k]);
        cells[*rows * 5] = gs_strdup(what);
        cells[*rows * 5 + 1] = fmt("%.6Lg", creall(p[k]));
        cells[*rows * 5 + 2] = fmt("%.6Lg", cimagl(p[k]));
        cells[*rows * 5 + 3] = fmt("%.6Lg", pz.f0);
        cells[*rows * 5 + 4] = pz.kind == GS_PZ_COMPLEX
                               ? fmt("%.4Lg", pz.q) : gs_strdup("-");
        (*rows)++;
    }
}

static void sec_pz(rctx *r)
{
    size_t rows = 1, k;
    char **cells;
    static const char *const head[] = {
        "", "re (rad/s)", "im (rad/s)", "|.| (Hz)", "Q"
    };
    if (!r->have_h)
        return;
    cells = gs_malloc((size_t)(1 + r->h.npoles + r->h.nzeros) * 5
                      * sizeof *cells);
    for (k = 0; k < 5; k++)
        cells[k] = gs_strdup(head[k]);
    pz_rows(cells, &rows, "pole", r->h.poles, r->h.npoles);
    pz_rows(cells, &rows, "zero", r->h.zeros, r->h.nzeros);
    r->w->heading(r->o, 3, "Poles and zeros");
    if (rows == 1)
        r->w->para(r->o, "None: the result does not depend on s.");
    else
        r->w->table(r->o, cells, rows, 5);
    for (k = 0; k < rows * 5; k++)
        gs_free(cells[k]);
    gs_free(cells);
}

/* The frequency span of the Bode plot: two decades beyond the roots. */
static void span(long double *lo, long double *hi, const gs_tfn *h)
{
    int k;
    long double a = INFINITY, b = 0, m;
    for (k = 0; k < h->npoles + h->nzeros; k++) {
        m = cabsl(k < h->npoles ? h->poles[k] : h->zeros[k - h->npoles]);
        if (m > 0) {
            a = m < a ? m : a;
            b = m > b ? m : b;
        }
    }
    if (b == 0)
        a = b = 2 * acosl(-1) * 1e3L;
    *lo = powl(10, floorl(log10l(a / (2 * acosl(-1)))) - 2);
    *hi = powl(10, ceill(log10l(b / (2 * acosl(-1)))) + 2);
}

static void emit_svg(rctx *r, int bode, const gs_plot *p, const char *alt)
{
    char *buf = NULL;
    size_t len = 0;
    FILE *m = open_memstream(&buf, &len);
    if (m == NULL)
        return;
    if ((bode ? gs_svg_bode(m, p) : gs_svg_step(m, p)) != GS_OK) {
        fclose(m);
        gs_free(buf);
        return;
    }
    fclose(m);
    r->w->figure(r->o, buf, len, alt);
    gs_free(buf);
}

static void sec_bode(rctx *r)
{
    gs_sweep sw;
    gs_plot_marks mk;
    gs_plot_trace tr;
    gs_plot p;
    long double lo, hi;
    if (!r->have_h)
        return;
    span(&lo, &hi, &r->h);
    gs_sweep_init(&sw);
    gs_sweep_log(&sw, &r->h, lo, hi, gs_sweep_points(lo, hi, 40));
    gs_plot_marks_fill(&mk, &r->h, 0);
    memset(&tr, 0, sizeof tr);
    memset(&p, 0, sizeof p);
    tr.label = gs_tf_name(&r->j->tf[r->i]);
    tr.n = sw.n;
    tr.x = sw.freq;
    tr.y = sw.mag_db;
    tr.y2 = sw.phase_deg;
    tr.marks = &mk;
    p.traces = &tr;
    p.ntraces = 1;
    r->w->heading(r->o, 3, "Bode plot");
    emit_svg(r, 1, &p, "Bode plot: magnitude and phase");
    gs_sweep_clear(&sw);
}

static void sec_step(rctx *r)
{
    gs_step st;
    gs_step_metrics m;
    gs_plot_trace tr;
    gs_plot p;
    enum { NPTS = 400 };
    long double t[NPTS], y[NPTS];
    if (!r->have_h || r->h.num_deg > r->h.den_deg
        || r->j->tf[r->i].kind != GS_TF_TRANSFER)
        return;
    if (gs_step_init(&st, &r->h) == GS_OK) {
        memset(&m, 0, sizeof m);
        gs_step_measure(&m, &st);
        gs_step_table(t, y, NULL, NPTS, &st,
                      gs_svg_step_axis_end(gs_step_span(&st)));
        memset(&tr, 0, sizeof tr);
        memset(&p, 0, sizeof p);
        tr.label = gs_tf_name(&r->j->tf[r->i]);
        tr.n = NPTS;
        tr.x = t;
        tr.y = y;
        tr.metrics = &m;
        p.traces = &tr;
        p.ntraces = 1;
        r->w->heading(r->o, 3, "Step response");
        emit_svg(r, 0, &p, "Step response");
    }
    gs_step_clear(&st);
}

static void sec_sens(rctx *r)
{
    gs_sens s;
    size_t k, rows = 1;
    int v, nv;
    char **cells;
    gs_sens_init(&s);
    if (gs_sens_compute(&s, &r->j->tf[r->i], r->j->vals, NULL, 0) == GS_EINVAL
        || s.n == 0) {
        gs_sens_clear(&s);
        return;
    }
    nv = s.nvars;
    cells = gs_malloc((size_t)(nv + 1) * (s.n + 1) * sizeof *cells);
    cells[0] = gs_strdup("symbol");
    for (k = 0; k < s.n; k++)
        cells[k + 1] = gs_strdup(gs_sens_kind_name(s.fig[k].kind));
    for (v = 0; v < nv; v++) {
        if (!s.used[v])
            continue;
        cells[rows * (s.n + 1)] = gs_strdup(gs_symtab_name(r->j->c->syms,
                                                           v));
        for (k = 0; k < s.n; k++)
            cells[rows * (s.n + 1) + k + 1] = fmt("%.4Lf", s.fig[k].s[v]);
        rows++;
    }
    r->w->heading(r->o, 3, "Sensitivities");
    r->w->para(r->o, "S(Q, x) = (x/Q) dQ/dx of each figure Q (columns) to "
               "each symbol x (rows); see gainsmith sens.");
    r->w->table(r->o, cells, rows, s.n + 1);
    for (k = 0; k < rows * (s.n + 1); k++)
        gs_free(cells[k]);
    gs_free(cells);
    gs_sens_clear(&s);
}

/* A relative error in per cent; one below 1e-12 is rounding of long
   double, whose last bits differ between compilers, so it is not
   printed as a number.  A new string. */
static char *pct(long double rel)
{
    if (rel < 1e-12L)
        return gs_strdup("below 1e-10 %");
    return gs_asprintf("%.3Lg %%", 100 * rel);
}

/* A pole or zero of the exact H in the text of the report. */
static char *root_num(long double complex z)
{
    if (cimagl(z) == 0)
        return gs_asprintf("%.6Lg", creall(z));
    return gs_asprintf("%.6Lg%+.6Lgj", creall(z), cimagl(z));
}

/* One paragraph per pole or zero: its estimate from the coefficients of
   D or N (approx.h), the estimate's value, the exact root and the error. */
static void approx_root(rctx *r, const gs_approx_result *a, size_t i)
{
    const gs_approx_root *x = &a->roots[i];
    const gs_polyctx *ctx = a->ctx;
    size_t nth = i + 1, k;
    char *what, *est = NULL, *v, *e, *t, *pc;
    for (k = 0; k < i; k++)
        if (a->roots[k].is_zero != x->is_zero)
            nth--;
    what = gs_asprintf("%s %zu", x->is_zero ? "Zero" : "Pole", nth);
    e = root_num(x->exact);
    if (x->at_origin) {
        t = gs_asprintf("%s: 0 (exact).", what);
    } else if (x->pair_of >= 0) {
        t = gs_asprintf("%s: the conjugate of the pair above, %s rad/s.",
                        what, e);
    } else if (x->est == GS_APPROX_EST_NONE) {
        t = gs_asprintf("%s: no estimate (separation %.3Lg from its "
                        "neighbours, too close); exact %s rad/s.", what,
                        x->separation, e);
    } else {
        if (x->est == GS_APPROX_EST_REAL) {
            gs_poly n;
            char *f;
            gs_poly_init(&n);
            gs_poly_neg(&n, &x->wn, ctx);
            f = gs_approx_form(&n, &x->wd, GS_FORM_TEXT, ctx);
            est = gs_asprintf("~ %s", f);
            gs_free(f);
            gs_poly_clear(&n);
        } else {
            gs_poly p, q;
            char *w, *qf;
            gs_poly_init(&p);
            gs_poly_init(&q);
            w = gs_approx_form(&x->a0, &x->a2, GS_FORM_TEXT, ctx);
            gs_poly_mul(&p, &x->a0, &x->a2, ctx);
            gs_poly_mul(&q, &x->a1, &x->a1, ctx);
            qf = gs_approx_form(&p, &q, GS_FORM_TEXT, ctx);
            est = gs_asprintf("a complex pair, w0^2 ~ %s, Q ~ sqrt(%s)", w,
                              qf);
            gs_free(w);
            gs_free(qf);
            gs_poly_clear(&p);
            gs_poly_clear(&q);
        }
        v = root_num(x->value);
        pc = pct(x->rel_error);
        if (strlen(est) > EST_MAX) {
            gs_free(est);
            est = gs_asprintf("estimated from the coefficients of %s (a "
                              "long form: gainsmith approx prints it)",
                              x->is_zero ? "N" : "D");
        }
        t = gs_asprintf("%s: %s = %s rad/s; exact %s rad/s, error %s%s.",
                        what, est, v, e, pc, !x->factor ? ""
                        : x->is_zero ? " (a factor of N)"
                                     : " (a factor of D)");
        gs_free(pc);
        gs_free(v);
        gs_free(est);
    }
    r->w->para(r->o, t);
    gs_free(t);
    gs_free(e);
    gs_free(what);
}

/* The short forms of `gainsmith approx` with its defaults: the simplified
   H with its measured errors, the low-frequency gain, the root estimates
   and the conditions they assume.  A form that does not meet the
   tolerance, or values approx cannot use, are stated, not fatal. */
static void sec_approx(rctx *r)
{
    gs_approx_opts o;
    gs_approx_result a;
    gs_diag d;
    int rc;
    size_t k, nn, nd;
    char *t, *n, *dn;
    gs_approx_opts_default(&o);
    gs_approx_result_init(&a);
    gs_diag_init(&d);
    rc = gs_approx_run(&a, r->j, r->i, &o, &d);
    r->w->heading(r->o, 3, "Approximation");
    if (rc != GS_OK) {
        t = gs_asprintf("No short form: %s.", d.n ? d.v[0].message
                                                  : gs_strerror(rc));
        r->w->para(r->o, t);
        gs_free(t);
        goto done;
    }
    if (!a.met) {
        t = gs_asprintf("No short form meets the tolerance (%.3Lg dB, "
                        "%.3Lg deg from %.4Lg Hz to %.4Lg Hz, every "
                        "symbol within +-%.3Lg %%): the best one reached "
                        "is off by %.3Lg dB, %.3Lg deg at the nominal "
                        "values and %.3Lg dB, %.3Lg deg over the "
                        "spread.  The exact result above stands alone.",
                        o.tol_db, o.tol_deg, a.f_lo, a.f_hi,
                        100 * o.spread, a.err_db, a.err_deg, a.spread_db,
                        a.spread_deg);
        r->w->para(r->o, t);
        gs_free(t);
        goto done;
    }
    n = folded(&a.h.num, a.h.ctx, &nn);
    dn = folded(&a.h.den, a.h.ctx, &nd);
    r->w->formula(r->o, gs_tf_name(&a.h), n, dn);
    gs_free(n);
    gs_free(dn);
    t = gs_asprintf("%zu of the %zu terms kept.  Measured from %.4Lg Hz "
                    "to %.4Lg Hz (%d points): error %.3Lg dB, %.3Lg "
                    "deg at the nominal values; %.3Lg dB, %.3Lg "
                    "deg over the spread of every symbol by +-%.3Lg "
                    "%% (%d %s).  Tolerance %.3Lg dB, %.3Lg deg; see "
                    "gainsmith approx.", a.terms_kept, a.terms_exact,
                    a.f_lo, a.f_hi, a.npoints, a.err_db, a.err_deg,
                    a.spread_db, a.spread_deg, 100 * o.spread, a.nspread,
                    a.spread_corners ? "corners" : "seeded points",
                    o.tol_db, o.tol_deg);
    r->w->para(r->o, t);
    gs_free(t);
    n = gs_approx_form(&a.dcn, &a.dcd, GS_FORM_TEXT, a.ctx);
    dn = pct(a.dc_rel_error);
    if (a.dc_order)
        t = gs_asprintf("Low-frequency gain ~ %s * s^%d = %.6Lg (exact "
                        "%.6Lg, error %s).", n, a.dc_order, a.dc_value,
                        a.dc_exact, dn);
    else
        t = gs_asprintf("DC gain ~ %s = %.6Lg (exact %.6Lg, error %s).", n,
                        a.dc_value, a.dc_exact, dn);
    r->w->para(r->o, t);
    gs_free(t);
    gs_free(n);
    gs_free(dn);
    for (k = 0; k < a.nroots; k++)
        approx_root(r, &a, k);
    if (a.ncond) {
        char *c = gs_strdup("Assumes");
        for (k = 0; k < a.ncond; k++) {
            t = gs_asprintf("%s%s %s >> %s (here %.3Lg)", c, k ? "," : "",
                            a.cond[k].lhs, a.cond[k].rhs, a.cond[k].value);
            gs_free(c);
            c = t;
        }
        if (a.ncond_total > a.ncond)
            t = gs_asprintf("%s, and %zu more, each larger.", c,
                            a.ncond_total - a.ncond);
        else
            t = gs_asprintf("%s.", c);
        gs_free(c);
        r->w->para(r->o, t);
        gs_free(t);
    } else {
        r->w->para(r->o, "Assumes nothing beyond the values above.");
    }
done:
    gs_diag_clear(&d);
    gs_approx_result_clear(&a);
}

/* The table of the noise section: per source its density at the spot
   frequency and its rms over the band, each with its share of the
   total power, sorted by the band share. */
static void noise_table(rctx *r, const gs_noise *n, const long double *spot,
                        long double spot_tot, const long double *band,
                        long double band_tot, const char *unit)
{
    static const char *const head[] = {
        "source", "density at the spot", "share", "rms over the band",
        "share"
    };
    char **cells = gs_malloc((n->nsrc + 1) * 5 * sizeof *cells), b[64];
    size_t *rk = gs_noise_ranked(band, n->nsrc);
    char u[32];
    size_t k, row;
    for (k = 0; k < 5; k++)
        cells[k] = gs_strdup(head[k]);
    snprintf(u, sizeof u, "%s/rtHz", unit);
    for (row = 1; row <= n->nsrc; row++) {
        size_t s = rk[row - 1];
        char **c = &cells[row * 5];
        c[0] = gs_strdup(n->src[s].name);
        c[1] = gs_strdup(gs_si_format(b, sizeof b, sqrtl(spot[s]), 4, u));
        c[2] = gs_asprintf("%.2Lf %%", spot_tot > 0
                                       ? 100 * spot[s] / spot_tot : 0);
        c[3] = gs_strdup(gs_si_format(b, sizeof b, sqrtl(band[s]), 4,
                                      unit));
        c[4] = gs_asprintf("%.2Lf %%", band_tot > 0
                                       ? 100 * band[s] / band_tot : 0);
    }
    r->w->table(r->o, cells, n->nsrc + 1, 5);
    for (k = 0; k < (n->nsrc + 1) * 5; k++)
        gs_free(cells[k]);
    gs_free(cells);
    gs_free(rk);
}

/* The noise of this output (noise.h), when the report was given a noise
   analysis with this output among its targets: the output and
   input-referred density at a spot frequency (the geometric centre of
   the Bode plot's span), the rms over that span, and each source's
   share, the table a reviewer reads first. */
static void sec_noise(rctx *r)
{
    const gs_report_noise *z = r->o->noise;
    const gs_circuit *c;
    size_t ti, out = r->j->out_index[r->i];
    long double lo, hi, spot, tot, in, btot, bin, *ps, *pb;
    char b1[64], b2[64], b3[64], b4[64], f1[48], f2[48], f3[48], u[32];
    char *t;
    if (z == NULL || !r->have_h)
        return;
    if (z->skipped) {
        r->w->heading(r->o, 3, "Noise");
        r->w->para(r->o, z->skipped);
        return;
    }
    for (ti = 0; ti < z->n->ntarget; ti++)
        if (z->n->target[ti].out == out)
            break;
    if (ti == z->n->ntarget)
        return;
    c = z->j->c;
    span(&lo, &hi, &r->h);
    spot = sqrtl(lo * hi);
    ps = gs_calloc(z->n->nsrc ? z->n->nsrc : 1, sizeof *ps);
    pb = gs_calloc(z->n->nsrc ? z->n->nsrc : 1, sizeof *pb);
    tot = gs_noise_out_psd(z->nn, ti, spot, ps);
    in = gs_noise_in_psd(z->nn, ti, spot);
    gs_noise_band(&btot, &bin, pb, z->nn, ti, lo, hi);
    r->w->heading(r->o, 3, "Noise");
    snprintf(u, sizeof u, "%s/rtHz", gs_noise_unit(c, out, 0));
    gs_si_format(b1, sizeof b1, sqrtl(tot), 4, u);
    snprintf(u, sizeof u, "%s/rtHz", gs_noise_unit(c, out, 1));
    gs_si_format(b2, sizeof b2, sqrtl(in), 4, u);
    gs_si_format(b3, sizeof b3, sqrtl(btot), 4, gs_noise_unit(c, out, 0));
    gs_si_format(b4, sizeof b4, sqrtl(bin), 4, gs_noise_unit(c, out, 1));
    t = gs_asprintf("At T = %.6Lg K. At the spot frequency %s: output %s, "
                    "input-referred %s. From %s to %s, the span of the "
                    "Bode plot: output %s rms, input-referred %s rms.",
                    z->nn->t, gs_si_format(f3, sizeof f3, spot, 4, "Hz"),
                    b1, b2, gs_si_format(f1, sizeof f1, lo, 4, "Hz"),
                    gs_si_format(f2, sizeof f2, hi, 4, "Hz"), b3, b4);
    r->w->para(r->o, t);
    gs_free(t);
    noise_table(r, z->n, ps, tot, pb, btot, gs_noise_unit(c, out, 0));
    r->w->para(r->o, "Noise results are small-signal white-plus-flicker "
               "models at one operating point and one temperature, the "
               "sources taken as uncorrelated (docs/noise.md).");
    gs_free(ps);
    gs_free(pb);
}

/* The verdict of `gainsmith check` with its defaults: the exact result
   against the reference that bounds its own error (analysis/refcheck.h)
   at 61 log-spaced frequencies from 10 mHz to 10 GHz, relative error at
   most 1e-9. */
static void sec_check(rctx *r)
{
    long double worst = 0, worst_f = 1e-2L;
    char buf[400];
    gs_refcheck chk;
    gs_refcheck_point p;
    size_t nconcl = 0, ninc = 0, nmis = 0;
    int k, rc = GS_OK;
    if (!r->have_h)
        return;
    gs_refcheck_init(&chk, r->j, r->i);
    for (k = 0; k < 61 && rc == GS_OK; k++) {
        long double f = 1e-2L * powl(10, (long double)k / 5);
        rc = gs_refcheck_at(&p, &chk, f, 1e-9L, NULL);
        if (rc != GS_OK)
            break;
        if (p.verdict == GS_RC_INCONCLUSIVE) {
            ninc++;
            continue;
        }
        nconcl++;
        nmis += p.verdict == GS_RC_MISMATCH;
        if (!(p.err <= worst)) {
            worst = p.err;
            worst_f = f;
        }
    }
    gs_refcheck_clear(&chk);
    r->w->heading(r->o, 3, "Check");
    if (rc != GS_OK)
        snprintf(buf, sizeof buf, "The numeric solve failed (%s).",
                 gs_strerror(rc));
    else if (nconcl == 0)
        snprintf(buf, sizeof buf, "Against an independent numeric solve "
                 "at 61 frequencies from 10 mHz to 10 GHz: inconclusive "
                 "at every one, long double cannot resolve the value.");
    else {
        int len = snprintf(buf, sizeof buf, "Against an independent "
                           "numeric solve at 61 frequencies from 10 mHz to "
                           "10 GHz: worst relative error %.3Lg at %.6Lg Hz: "
                           "%s.", worst, worst_f, nmis ? "MISMATCH" : "ok");
        if (ninc && len > 0 && (size_t)len < sizeof buf)
            snprintf(buf + len, sizeof buf - (size_t)len, " Inconclusive "
                     "at %zu of the frequencies, where long double cannot "
                     "resolve the value.", ninc);
    }
    r->w->para(r->o, buf);
}

/* Per output, in this order. */
static const section_fn out_sections[] = {
    sec_exact,
    sec_approx,
    sec_dc,
    sec_pz,
    sec_bode,
    sec_step,
    sec_sens,
    sec_noise,
    sec_check,
};

static void sec_outputs(rctx *r)
{
    size_t i, k;
    for (i = 0; i < r->j->ntf; i++) {
        const gs_tf *tf = &r->j->tf[i];
        int dn, dd;
        long double *cn = gs_job_coeffs(r->j, &tf->num, &dn);
        long double *cd = gs_job_coeffs(r->j, &tf->den, &dd);
        char head[160];
        r->i = i;
        r->have_h = gs_tfn_init(&r->h, cn, dn, cd, dd) != GS_EINVAL;
        snprintf(head, sizeof head, "%s = %s", gs_tf_name(tf),
                 tf->description ? tf->description : "");
        r->w->heading(r->o, 2, head);
        for (k = 0; k < sizeof out_sections / sizeof out_sections[0]; k++)
            out_sections[k](r);
        gs_tfn_clear(&r->h);
        gs_free(cn);
        gs_free(cd);
    }
}

/* The document, in this order. */
static const section_fn sections[] = {
    sec_listing,
    sec_values,
    sec_outputs,
    sec_caution,
};

int gs_report_write(gs_report_out *o, const gs_report_writer *w,
                    const gs_job *j)
{
    rctx r;
    size_t k;
    memset(&r, 0, sizeof r);
    r.o = o;
    r.w = w;
    r.j = j;
    w->begin(o, j->c->title ? j->c->title : j->c->file);
    for (k = 0; k < sizeof sections / sizeof sections[0]; k++)
        sections[k](&r);
    w->end(o);
    return ferror(o->f) ? GS_EIO : GS_OK;
}
