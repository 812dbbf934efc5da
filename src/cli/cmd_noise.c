/* cmd_noise.c - the `noise` command: noise densities, their transfers
 * and the integrated noise of a circuit (docs/noise.md). See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "analysis/noise.h"
#include "analysis/noise_approx.h"
#include "base/mem.h"
#include "numeric/spectrum.h"
#include "algebra/sym.h"
#include "output/formula.h"
#include "output/json.h"
#include "output/svg.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

static const gs_cli_opt noise_spec[] = {
    {"only", 1, 0}, {"format", 1, 0}, {"at", 1, 1}, {"band", 1, 0},
    {"source-resistor", 1, 0}, {"csv", 1, 0}, {"svg", 1, 0}, {"from", 1, 0},
    {"to", 1, 0}, {"points", 1, 0}, {"set", 1, 1}, {"max-terms", 1, 0},
    {"max-memory", 1, 0}, {"approx", 0, 0}, {"tol", 1, 0}, {"help", 0, 0},
    {NULL, 0, 0}
};

typedef struct nopts {
    const char *format;
    size_t nat;
    long double *at;
    int has_band;
    long double f1, f2;
    long double from, to;
    size_t points;
    const char *csv, *svg, *rs;
    int rs_src;                 /* index of the source resistor's noise */
    int approx;                 /* --approx: the short forms */
    gs_approx_opts ao;          /* their tolerance and band */
} nopts;

static int bad(FILE *err, const char *msg, const char *hint)
{
    fprintf(err, "gainsmith noise: error: %s\n", msg);
    if (hint)
        fprintf(err, "gainsmith noise: hint: %s\n", hint);
    return 2;
}

static int parse_opts(nopts *o, const gs_cli *cl, FILE *err)
{
    const char *t;
    size_t i;
    memset(o, 0, sizeof *o);
    o->rs_src = -1;
    gs_approx_opts_default(&o->ao);
    o->format = gs_cli_get(cl, "format", 0);
    if (o->format == NULL)
        o->format = "text";
    if (strcmp(o->format, "text") && strcmp(o->format, "pretty")
        && strcmp(o->format, "latex") && strcmp(o->format, "json"))
        return bad(err, "--format takes text, pretty, latex or json",
                   "the spectrum goes to --csv FILE or --svg FILE");
    o->nat = gs_cli_count(cl, "at");
    o->at = gs_calloc(o->nat ? o->nat : 1, sizeof *o->at);
    for (i = 0; i < o->nat; i++) {
        if (gs_cli_real(&o->at[i], gs_cli_get(cl, "at", i), "Hz", "noise",
                        "at", err))
            return 2;
        if (!(o->at[i] > 0))
            return bad(err, "--at needs a frequency above 0 Hz", NULL);
    }
    if ((t = gs_cli_get(cl, "band", 0))) {
        const char *colon = strchr(t, ':');
        char *lo = colon ? gs_strndup(t, (size_t)(colon - t)) : NULL;
        int r = colon == NULL
             || gs_cli_real(&o->f1, lo, "Hz", "noise", "band", err)
             || gs_cli_real(&o->f2, colon + 1, "Hz", "noise", "band", err);
        gs_free(lo);
        if (r || !(o->f1 > 0 && o->f2 > o->f1))
            return bad(err, "--band needs F1:F2 with 0 < F1 < F2",
                       "e.g. --band 10:100k (hertz)");
        o->has_band = 1;
    }
    if (strcmp(o->format, "json") == 0 && !o->has_band)
        return bad(err, "--format json needs --band F1:F2",
                   "the JSON reports the noise integrated over the band");
    o->from = o->has_band ? o->f1 : 1;
    o->to = o->has_band ? o->f2 : 1e9L;
    if ((t = gs_cli_get(cl, "from", 0))
        && gs_cli_real(&o->from, t, "Hz", "noise", "from", err))
        return 2;
    if ((t = gs_cli_get(cl, "to", 0))
        && gs_cli_real(&o->to, t, "Hz", "noise", "to", err))
        return 2;
    if (!(o->from > 0 && o->to > o->from))
        return bad(err, "need 0 < --from < --to", NULL);
    o->points = 201;
    if ((t = gs_cli_get(cl, "points", 0))
        && gs_cli_size(&o->points, t, "noise", "points", err))
        return 2;
    if (o->points < 2 || o->points > 10000000)
        return bad(err, "the spectrum needs 2 to 10000000 points", NULL);
    /* the short form holds over the band, else over the spectrum's span
       (flicker noise makes the low end matter, which approx's own band,
       set by the poles and zeros, would leave out) */
    o->ao.f_lo = o->has_band ? o->f1 : o->from;
    o->ao.f_hi = o->has_band ? o->f2 : o->to;
    o->approx = gs_cli_has(cl, "approx");
    if ((t = gs_cli_get(cl, "tol", 0)) && !o->approx)
        return bad(err, "--tol goes with --approx",
                   "e.g. --approx --tol 0.5 (dB)");
    if (t && gs_cli_tol(&o->ao.tol_db, &o->ao.tol_deg, t, "noise", err))
        return 2;
    o->csv = gs_cli_get(cl, "csv", 0);
    o->svg = gs_cli_get(cl, "svg", 0);
    o->rs = gs_cli_get(cl, "source-resistor", 0);
    return 0;
}

static int wants_numbers(const nopts *o)
{
    return o->nat || o->has_band || o->csv || o->svg || o->rs || o->approx;
}

/* "H_M1_channel" for the source M1.channel */
static char *h_name(const char *src)
{
    char *r = gs_asprintf("H_%s", src), *p;
    for (p = r; *p; p++)
        if (*p == '.' || *p == '\'')
            *p = '_';
    return r;
}

static const gs_tf *tf_for(const gs_job *j, size_t out)
{
    size_t i;
    for (i = 0; i < j->ntf; i++)
        if (j->out_index[i] == out)
            return &j->tf[i];
    return NULL;
}

static void print_tf(FILE *out, const gs_tf *tf, const char *format)
{
    int var = tf->s_var;
    if (strcmp(format, "pretty") == 0)
        gs_print_pretty(out, tf, var);
    else if (strcmp(format, "latex") == 0)
        gs_print_latex(out, tf, var);
    else
        gs_print_text(out, tf, var);
}

/* S_{NAME} for a source name ("M1.channel"), upright, _ escaped. */
static void latex_s(FILE *out, const char *name)
{
    fputs("S_{\\mathrm{", out);
    for (; *name; name++) {
        if (*name == '_')
            fputs("\\_", out);
        else
            fputc(*name, out);
    }
    fputs("}}", out);
}

/* Is source k in the density printed (every one, or the short form's)? */
static int shown(const gs_noise_short *sh, size_t k)
{
    return sh == NULL || sh->kept[k];
}

/* The densities as LaTeX equations: S_out as the sum (three terms a
   line, in multline* when longer), S_in, and each S_k; with sh, the
   short form's sources and \approx. */
static void print_latex_densities(FILE *out, const gs_job *j,
                                  const gs_noise *n, size_t i,
                                  const gs_noise_short *sh)
{
    const gs_noise_target *t = &n->target[i];
    const gs_tf *tf = tf_for(j, t->out);
    const char *eq = sh ? "\\approx" : "=";
    size_t k, m = 0;
    int long_sum;
    char *h, *tex;
    for (k = 0; k < n->nsrc; k++)
        m += (size_t)shown(sh, k);
    long_sum = m > 3;
    fputs(long_sum ? "\\begin{multline*}\n" : "\\begin{equation}\n", out);
    fprintf(out, "S_{\\mathrm{out}} %s ", eq);
    for (k = 0, m = 0; k < n->nsrc; k++) {
        if (!shown(sh, k))
            continue;
        h = h_name(n->src[k].name);
        tex = gs_sym_latex_name(h);
        fprintf(out, "%s\\left|%s\\right|^{2} ", m == 0 ? ""
                : m % 3 == 0 ? "\\\\\n+ " : "+ ", tex);
        latex_s(out, n->src[k].name);
        fputc(' ', out);
        gs_free(tex);
        gs_free(h);
        m++;
    }
    fprintf(out, "\\quad \\mathrm{%s^2/Hz}\n", gs_noise_unit(j->c, t->out, 0));
    fputs(long_sum ? "\\end{multline*}\n" : "\\end{equation}\n", out);
    tex = gs_sym_latex_name(gs_tf_name(tf));
    fprintf(out, "\\begin{equation}\nS_{\\mathrm{in}} %s \\frac{S_{\\mathrm"
            "{out}}}{\\left|%s\\right|^{2}} \\quad \\mathrm{%s^2/Hz}\n"
            "\\end{equation}\n", eq, tex, gs_noise_unit(j->c, t->out, 1));
    gs_free(tex);
    for (k = 0; k < n->nsrc; k++) {
        if (!shown(sh, k))
            continue;
        tex = gs_formula_latex(n->src[k].density);
        fputs("\\begin{equation}\n", out);
        latex_s(out, n->src[k].name);
        fprintf(out, " = %s \\quad \\mathrm{%s}\n\\end{equation}\n",
                tex ? tex : "?", n->src[k].unit);
        gs_free(tex);
    }
}

/* What the short form left out, how many terms each transfer kept, the
   band and the measured errors; lines start with c. */
static void print_short_summary(FILE *out, const gs_noise *n,
                                const gs_noise_short *sh, const char *c)
{
    char f1[48], f2[48];
    size_t k, left = 0;
    for (k = 0; k < n->nsrc; k++)
        if (!sh->kept[k]) {
            if (left == 0)
                fprintf(out, "%s  left out:", c);
            fprintf(out, "%s %s", left ? "," : "", n->src[k].name);
            left++;
        }
    if (left)
        fprintf(out, " (together at most %.3Lg %% of S_out in the band)\n",
                100 * sh->dropped_share);
    fprintf(out, "%s  terms kept: %s %zu of %zu", c,
            gs_tf_name(&sh->target.h), sh->target.terms_kept,
            sh->target.terms_exact);
    for (k = 0; k < n->nsrc; k++)
        if (sh->kept[k])
            fprintf(out, ", %s %zu of %zu", gs_tf_name(&sh->h[k].h),
                    sh->h[k].terms_kept, sh->h[k].terms_exact);
    fprintf(out, "\n%s  band %s to %s, %d points; measured error at the "
            "nominal point: S_out %.3Lg dB, S_in %.3Lg dB (tolerance %.3Lg "
            "dB)\n", c, gs_si_format(f1, sizeof f1, sh->f_lo, 4, "Hz"),
            gs_si_format(f2, sizeof f2, sh->f_hi, 4, "Hz"), sh->npoints,
            sh->err_out_db, sh->err_in_db, sh->tol_db);
    if (!sh->met)
        fprintf(out, "%s  the tolerance is NOT met; this is the best form "
                "reached\n", c);
}

/* The symbolic densities: S_out as the sum, each S_k and each H_k; with
   sh, the short form: its sources, \~ and the short transfers. */
static void print_symbolic(FILE *out, const gs_job *j, const gs_noise *n,
                           size_t i, const char *format,
                           const gs_noise_short *sh)
{
    const gs_noise_target *t = &n->target[i];
    const gs_tf *tf = tf_for(j, t->out);
    const char *c = strcmp(format, "latex") == 0 ? "% " : "";
    const char *eq = sh ? "~" : "=";
    size_t k, m;
    char *h;
    fprintf(out, "%snoise of %s = %s, at its output%s\n", c, gs_tf_name(tf),
            tf->description ? tf->description : "",
            sh ? ", short form" : "");
    if (*c) {
        print_latex_densities(out, j, n, i, sh);
        fprintf(out, "%% with k = 1.380649e-23 J/K, q = 1.602176634e-19 C, "
                "T in K, f in Hz, s = j*2*pi*f\n");
    } else {
        fprintf(out, "S_out %s ", eq);
        for (k = 0, m = 0; k < n->nsrc; k++) {
            if (!shown(sh, k))
                continue;
            h = h_name(n->src[k].name);
            fprintf(out, "%s|%s|^2*S_%s", m++ ? " + " : "", h,
                    n->src[k].name);
            gs_free(h);
        }
        fprintf(out, "   (%s^2/Hz)\n", gs_noise_unit(j->c, t->out, 0));
        fprintf(out, "S_in %s S_out/|%s|^2   (%s^2/Hz)\n", eq,
                gs_tf_name(tf), gs_noise_unit(j->c, t->out, 1));
        for (k = 0; k < n->nsrc; k++)
            if (shown(sh, k))
                fprintf(out, "S_%s = %s   (%s)\n", n->src[k].name,
                        n->src[k].density, n->src[k].unit);
        fputs("with k = 1.380649e-23 J/K, q = 1.602176634e-19 C, "
              "T in K, f in Hz, s = j*2*pi*f\n", out);
    }
    print_tf(out, sh ? &sh->target.h : tf, format);
    for (k = 0; k < n->nsrc; k++)
        if (shown(sh, k))
            print_tf(out, sh ? &sh->h[k].h : tf_for(j, t->first + k),
                     format);
    if (sh)
        print_short_summary(out, n, sh, c);
}

static void print_share(FILE *out, const char *name, long double v,
                        long double total, const char *unit)
{
    char b[64];
    fprintf(out, "    %-22s %-18s %7.3Lf %%\n", name,
            gs_si_format(b, sizeof b, v, 4, unit),
            total > 0 ? 100 * v * v / total : 0);
}

static void print_nf(FILE *out, long double total, long double from_rs,
                     const char *what)
{
    if (from_rs > 0)
        fprintf(out, "  noise figure %s  %.4Lf dB\n", what,
                10 * log10l(total / from_rs));
}

static void print_spot(FILE *out, const gs_job *j, const gs_noise *n,
                       const gs_noise_num *nn, size_t i, long double f,
                       const nopts *o)
{
    long double *part = gs_calloc(n->nsrc, sizeof *part), tot, in;
    char b[64], u[32], fu[48];
    size_t *r;
    size_t k;
    tot = gs_noise_out_psd(nn, i, f, part);
    in = gs_noise_in_psd(nn, i, f);
    r = gs_noise_ranked(part, n->nsrc);
    snprintf(u, sizeof u, "%s/rtHz", gs_noise_unit(j->c, n->target[i].out, 0));
    fprintf(out, "%s at %s (T = %.6Lg K)\n",
            gs_tf_name(tf_for(j, n->target[i].out)),
            gs_si_format(fu, sizeof fu, f, 6, "Hz"), nn->t);
    fprintf(out, "  output          %s\n",
            gs_si_format(b, sizeof b, sqrtl(tot), 6, u));
    snprintf(u, sizeof u, "%s/rtHz", gs_noise_unit(j->c, n->target[i].out, 1));
    fprintf(out, "  input-referred  %s\n",
            gs_si_format(b, sizeof b, sqrtl(in), 6, u));
    snprintf(u, sizeof u, "%s/rtHz", gs_noise_unit(j->c, n->target[i].out, 0));
    fputs("  sources at the output, largest first:\n", out);
    for (k = 0; k < n->nsrc; k++)
        print_share(out, n->src[r[k]].name, sqrtl(part[r[k]]), tot, u);
    if (o->rs_src >= 0)
        print_nf(out, tot, part[o->rs_src], "(spot)");
    gs_free(r);
    gs_free(part);
}

static void print_band(FILE *out, const gs_job *j, const gs_noise *n,
                       const long double *part, long double tot,
                       long double in, size_t i, const nopts *o,
                       long double t)
{
    char b[64], f1[48], f2[48];
    const char *u = gs_noise_unit(j->c, n->target[i].out, 0);
    size_t *r = gs_noise_ranked(part, n->nsrc);
    size_t k;
    fprintf(out, "%s from %s to %s (T = %.6Lg K)\n",
            gs_tf_name(tf_for(j, n->target[i].out)),
            gs_si_format(f1, sizeof f1, o->f1, 6, "Hz"),
            gs_si_format(f2, sizeof f2, o->f2, 6, "Hz"), t);
    fprintf(out, "  output rms          %s\n",
            gs_si_format(b, sizeof b, sqrtl(tot), 6, u));
    fprintf(out, "  input-referred rms  %s\n",
            gs_si_format(b, sizeof b, sqrtl(in), 6,
                         gs_noise_unit(j->c, n->target[i].out, 1)));
    fputs("  sources at the output, largest first:\n", out);
    for (k = 0; k < n->nsrc; k++)
        print_share(out, n->src[r[k]].name, sqrtl(part[r[k]]), tot, u);
    if (o->rs_src >= 0)
        print_nf(out, tot, part[o->rs_src], "(band)");
    gs_free(r);
}

static void json_num(FILE *out, long double v)
{
    if (isfinite(v))
        fprintf(out, "%.10Lg", v);
    else
        fputs("null", out);
}

/* , "key": number */
static void json_field(FILE *out, const char *key, long double v)
{
    fprintf(out, ", \"%s\": ", key);
    json_num(out, v);
}

/* , "key": [a, b] */
static void json_pair(FILE *out, const char *key, long double a,
                      long double b)
{
    fprintf(out, ", \"%s\": [", key);
    json_num(out, a);
    fputs(", ", out);
    json_num(out, b);
    fputc(']', out);
}

/* "short": the short form's band, tolerance, errors and each kept
   source's short transfer, in the object of target i. */
static void json_short(FILE *out, const gs_noise *n,
                       const gs_noise_short *sh)
{
    size_t k, m = 0;
    fprintf(out, ", \"short\": {\"met\": %s", sh->met ? "true" : "false");
    json_pair(out, "band", sh->f_lo, sh->f_hi);
    json_field(out, "tolerance_db", sh->tol_db);
    json_field(out, "output_error_db", sh->err_out_db);
    json_field(out, "input_error_db", sh->err_in_db);
    fputs(", \"transfer\": ", out);
    gs_print_json(out, &sh->target.h, sh->target.h.s_var);
    fputs(", \"sources\": [", out);
    for (k = 0; k < n->nsrc; k++) {
        if (!sh->kept[k])
            continue;
        fputs(m++ ? ", {\"name\": " : "{\"name\": ", out);
        gs_json_string(out, n->src[k].name);
        fputs(", \"transfer\": ", out);
        gs_print_json(out, &sh->h[k].h, sh->h[k].h.s_var);
        fputc('}', out);
    }
    fputs("], \"left_out\": [", out);
    for (k = 0, m = 0; k < n->nsrc; k++)
        if (!sh->kept[k]) {
            fputs(m++ ? ", " : "", out);
            gs_json_string(out, n->src[k].name);
        }
    fputs("]}", out);
}

static void print_json(FILE *out, const gs_job *j, const gs_noise *n,
                       const gs_noise_num *nn, const nopts *o,
                       const gs_noise_short *sh)
{
    long double *part = gs_calloc(n->nsrc, sizeof *part), tot, in;
    size_t i, k;
    size_t *r;
    fputc('[', out);
    for (i = 0; i < n->ntarget; i++) {
        const gs_tf *tf = tf_for(j, n->target[i].out);
        gs_noise_band(&tot, &in, part, nn, i, o->f1, o->f2);
        r = gs_noise_ranked(part, n->nsrc);
        fputs(i ? ",\n {\"name\": " : "{\"name\": ", out);
        gs_json_string(out, gs_tf_name(tf));
        json_pair(out, "band", o->f1, o->f2);
        json_field(out, "temperature", nn->t);
        fprintf(out, ", \"output_unit\": \"%s\", \"input_unit\": \"%s\"",
                gs_noise_unit(j->c, n->target[i].out, 0),
                gs_noise_unit(j->c, n->target[i].out, 1));
        json_field(out, "output_rms", sqrtl(tot));
        json_field(out, "input_rms", sqrtl(in));
        if (o->rs_src >= 0)
            json_field(out, "noise_figure_db",
                       10 * log10l(tot / part[o->rs_src]));
        fputs(", \"sources\": [", out);
        for (k = 0; k < n->nsrc; k++) {
            const gs_noise_src *s = &n->src[r[k]];
            char *h = h_name(s->name);
            fputs(k ? ", {\"name\": " : "{\"name\": ", out);
            gs_json_string(out, s->name);
            fputs(", \"density\": ", out);
            gs_json_string(out, s->density);
            json_field(out, "output_rms", sqrtl(part[r[k]]));
            fputs(", \"transfer\": ", out);
            gs_print_json(out, tf_for(j, n->target[i].first + r[k]),
                          tf->s_var);
            fputc('}', out);
            gs_free(h);
        }
        fputc(']', out);
        if (sh)
            json_short(out, n, &sh[i]);
        fputc('}', out);
        gs_free(r);
    }
    fputs("]\n", out);
    gs_free(part);
}

static FILE *open_file(const char *path, const char *input, FILE *err)
{
    struct stat a, b;
    FILE *f;
    if (strcmp(input, "-") != 0 && stat(path, &a) == 0
        && stat(input, &b) == 0 && a.st_dev == b.st_dev
        && a.st_ino == b.st_ino) {
        fprintf(err, "gainsmith noise: error: refusing to write over the "
                "input file '%s'\n", path);
        return NULL;
    }
    if ((f = fopen(path, "w")) == NULL)
        fprintf(err, "gainsmith noise: error: cannot write '%s'\n", path);
    return f;
}

static long double db(long double psd)
{
    return psd > 0 ? 10 * log10l(psd) : -INFINITY;
}

/* The spectrum: per target the output and input-referred densities (in
   unit/sqrt(Hz) and dB of it) and each source's part at the output. */
static int spectrum(const gs_job *j, const gs_noise *n,
                    const gs_noise_num *nn, const nopts *o, FILE *err)
{
    size_t np = o->points, nt = n->ntarget, i, k, p;
    long double *freq = gs_calloc(np, sizeof *freq);
    long double *outd = gs_calloc(np * nt, sizeof *outd);
    long double *ind = gs_calloc(np * nt, sizeof *ind);
    long double *part = gs_calloc(np * nt * n->nsrc, sizeof *part);
    long double lf = log10l(o->from), lt = log10l(o->to);
    int status = 0;
    FILE *f;
    for (p = 0; p < np; p++) {
        freq[p] = powl(10, lf + (lt - lf) * (long double)p
                                 / (long double)(np - 1));
        if (p == np - 1)
            freq[p] = o->to;
        if (p == 0)
            freq[p] = o->from;
        for (i = 0; i < nt; i++) {
            long double *pt = &part[(p * nt + i) * n->nsrc];
            outd[p * nt + i] = gs_noise_out_psd(nn, i, freq[p], pt);
            ind[p * nt + i] = outd[p * nt + i]
                            / gs_spectrum_term(&nn->in[i], freq[p]);
        }
    }
    if (o->csv && (f = open_file(o->csv, j->c->file, err)) != NULL) {
        fputs("freq_Hz", f);
        for (i = 0; i < nt; i++) {
            const char *nm = gs_tf_name(tf_for(j, n->target[i].out));
            fprintf(f, ",%s_out_%s_rtHz,%s_out_dB,%s_in_%s_rtHz,%s_in_dB",
                    nm, gs_noise_unit(j->c, n->target[i].out, 0), nm, nm,
                    gs_noise_unit(j->c, n->target[i].out, 1), nm);
            for (k = 0; k < n->nsrc; k++)
                fprintf(f, ",%s_%s_rtHz", nm, n->src[k].name);
        }
        fputc('\n', f);
        for (p = 0; p < np; p++) {
            fprintf(f, "%.10Lg", freq[p]);
            for (i = 0; i < nt; i++) {
                fprintf(f, ",%.10Lg,%.10Lg,%.10Lg,%.10Lg",
                        sqrtl(outd[p * nt + i]), db(outd[p * nt + i]),
                        sqrtl(ind[p * nt + i]), db(ind[p * nt + i]));
                for (k = 0; k < n->nsrc; k++)
                    fprintf(f, ",%.10Lg",
                            sqrtl(part[(p * nt + i) * n->nsrc + k]));
            }
            fputc('\n', f);
        }
        if (fclose(f) != 0)
            status = bad(err, "writing the CSV file failed", NULL);
    } else if (o->csv) {
        status = 2;
    }
    if (o->svg && status == 0
        && (f = open_file(o->svg, j->c->file, err)) != NULL) {
        gs_plot_trace *tr = gs_calloc(2 * nt, sizeof *tr);
        long double *y = gs_calloc(2 * nt * np, sizeof *y);
        char **labels = gs_calloc(2 * nt, sizeof *labels);
        gs_plot pl;
        for (i = 0; i < nt; i++) {
            const char *nm = gs_tf_name(tf_for(j, n->target[i].out));
            for (p = 0; p < np; p++) {
                y[(2 * i) * np + p] = db(outd[p * nt + i]);
                y[(2 * i + 1) * np + p] = db(ind[p * nt + i]);
            }
            labels[2 * i] = gs_asprintf("%s output", nm);
            labels[2 * i + 1] = gs_asprintf("%s input-referred", nm);
            for (k = 0; k < 2; k++) {
                tr[2 * i + k].label = labels[2 * i + k];
                tr[2 * i + k].n = np;
                tr[2 * i + k].x = freq;
                tr[2 * i + k].y = &y[(2 * i + k) * np];
            }
        }
        memset(&pl, 0, sizeof pl);
        pl.title = j->c->title;
        pl.ylabel = "Noise density (dB re 1 unit/\xe2\x88\x9aHz)";
        pl.traces = tr;
        pl.ntraces = 2 * nt;
        if (gs_svg_spectrum(f, &pl) != GS_OK)
            status = bad(err, "nothing finite to plot", NULL);
        if (fclose(f) != 0)
            status = bad(err, "writing the SVG file failed", NULL);
        for (i = 0; i < 2 * nt; i++)
            gs_free(labels[i]);
        gs_free(labels);
        gs_free(y);
        gs_free(tr);
    } else if (o->svg && status == 0) {
        status = 2;
    }
    gs_free(freq);
    gs_free(outd);
    gs_free(ind);
    gs_free(part);
    return status;
}

/* Load, add the noise sources, derive each target and its transfers. */
static int load(gs_job *j, gs_noise *n, const gs_cli *cl, nopts *o,
                FILE *err)
{
    gs_derive_opts dopt;
    gs_diag d;
    size_t i, k;
    int rc;
    if (cl->npos != 1) {
        fprintf(err, "gainsmith noise: error: %s\n",
                cl->npos ? "give one circuit file" : "no circuit file given");
        fprintf(err, "gainsmith noise: hint: usage: gainsmith noise FILE "
                "[options]; 'gainsmith help noise' for more\n");
        return 2;
    }
    gs_derive_opts_default(&dopt);
    if (gs_cmd_budget(&dopt, cl, "noise", err))
        return 2;
    gs_diag_init(&d);
    d.max_errors = 20;
    rc = gs_job_load(j, cl->pos[0], &d);
    if (rc == GS_OK)
        rc = gs_noise_setup(n, j->c, gs_cli_get(cl, "only", 0), &d);
    if (rc == GS_OK && o->rs) {
        for (k = 0; k < n->nsrc; k++)
            if (strcmp(n->src[k].name, o->rs) == 0
                && n->src[k].kind == GS_NZ_RESISTOR)
                o->rs_src = (int)k;
        if (o->rs_src < 0) {
            gs_diag_print(err, &d);
            gs_diag_clear(&d);
            fprintf(err, "gainsmith noise: error: --source-resistor '%s' "
                    "is not a resistor of the circuit\n", o->rs);
            fprintf(err, "gainsmith noise: hint: name the resistor of the "
                    "signal source, drawn in the circuit\n");
            return 2;
        }
    }
    for (i = 0; rc == GS_OK && i < n->ntarget; i++) {
        const gs_noise_target *t = &n->target[i];
        rc = gs_job_derive(j, j->c->outputs[t->out].name, &dopt, &d);
        for (k = 0; rc == GS_OK && k < n->nsrc; k++) {
            char *h = h_name(n->src[k].name);
            rc = gs_job_derive(j, j->c->outputs[t->first + k].name, &dopt,
                               &d);
            if (rc == GS_OK)
                gs_tf_set_name(&j->tf[j->ntf - 1], h);
            gs_free(h);
        }
    }
    gs_diag_print(err, &d);
    gs_diag_clear(&d);
    return gs_job_exit_status(rc);
}

static int numbers(const gs_job *j, const gs_noise *n, gs_noise_num *nn,
                   const gs_cli *cl, FILE *err)
{
    gs_diag d;
    int rc, status = gs_cmd_bind((gs_job *)j, cl, err);
    if (status)
        return status;
    gs_diag_init(&d);
    rc = gs_noise_num_make(nn, n, j, &d);
    gs_diag_print(err, &d);
    gs_diag_clear(&d);
    return gs_job_exit_status(rc);
}

/* The short forms of every target (--approx), in a new array. */
static int make_short(gs_noise_short **sh, const gs_job *j,
                      const gs_noise *n, const gs_noise_num *nn,
                      const nopts *o, FILE *err)
{
    size_t i;
    int rc = GS_OK;
    gs_diag d;
    gs_diag_init(&d);
    *sh = gs_calloc(n->ntarget ? n->ntarget : 1, sizeof **sh);
    for (i = 0; i < n->ntarget; i++)
        gs_noise_short_init(&(*sh)[i]);
    for (i = 0; i < n->ntarget && rc == GS_OK; i++)
        rc = gs_noise_short_make(&(*sh)[i], n, nn, j, i, &o->ao, &d);
    gs_diag_print(err, &d);
    gs_diag_clear(&d);
    return gs_job_exit_status(rc);
}

int gs_cmd_noise(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    gs_noise n;
    gs_noise_num nn;
    nopts o;
    gs_noise_short *sh = NULL;
    size_t i, k;
    int status, json;

    gs_job_init(&j);
    gs_noise_init(&n);
    memset(&nn, 0, sizeof nn);
    memset(&o, 0, sizeof o);
    status = gs_cli_parse(&cl, argc, argv, noise_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("noise"), out);
        goto done;
    }
    if (status == 0)
        status = parse_opts(&o, &cl, err);
    if (status == 0)
        status = load(&j, &n, &cl, &o, err);
    json = status == 0 && strcmp(o.format, "json") == 0;
    if (status == 0 && wants_numbers(&o))
        status = numbers(&j, &n, &nn, &cl, err);
    if (status == 0 && o.approx)
        status = make_short(&sh, &j, &n, &nn, &o, err);
    if (status == 0 && json)
        print_json(out, &j, &n, &nn, &o, sh);
    for (i = 0; status == 0 && !json && i < n.ntarget; i++) {
        print_symbolic(out, &j, &n, i, o.format, sh ? &sh[i] : NULL);
        for (k = 0; k < o.nat; k++)
            print_spot(out, &j, &n, &nn, i, o.at[k], &o);
        if (o.has_band) {
            long double *part = gs_calloc(n.nsrc, sizeof *part), tot, in;
            gs_noise_band(&tot, &in, part, &nn, i, o.f1, o.f2);
            print_band(out, &j, &n, part, tot, in, i, &o, nn.t);
            gs_free(part);
        }
    }
    if (status == 0 && !json && (o.nat || o.has_band))
        fputs("note: small-signal white-plus-flicker noise models at one "
              "operating point\n      and one temperature "
              "(docs/noise.md)\n", out);
    if (status == 0 && (o.csv || o.svg))
        status = spectrum(&j, &n, &nn, &o, err);
    for (i = 0; sh && i < n.ntarget; i++) {
        if (status == 0 && !sh[i].met) {
            fprintf(err, "gainsmith noise: error: %s: the short form is not "
                    "within the tolerance; the best one reached is shown\n",
                    gs_tf_name(tf_for(&j, n.target[i].out)));
            status = 1;
        }
        gs_noise_short_clear(&sh[i]);
    }
    gs_free(sh);
done:
    gs_free(o.at);
    gs_noise_num_clear(&nn);
    gs_noise_clear(&n);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
