/* cmd_noise.c - the `noise` command: noise densities, their transfers
 * and the integrated noise of a circuit (docs/noise.md). See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "analysis/noise.h"
#include "base/mem.h"
#include "numeric/spectrum.h"
#include "algebra/sym.h"
#include "output/formula.h"
#include "output/svg.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

static const gs_cli_opt noise_spec[] = {
    {"only", 1, 0}, {"format", 1, 0}, {"at", 1, 1}, {"band", 1, 0},
    {"source-resistor", 1, 0}, {"csv", 1, 0}, {"svg", 1, 0}, {"from", 1, 0},
    {"to", 1, 0}, {"points", 1, 0}, {"set", 1, 1}, {"max-terms", 1, 0}, {"max-memory", 1, 0},
    {"help", 0, 0}, {NULL, 0, 0}
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
        free(lo);
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
    o->csv = gs_cli_get(cl, "csv", 0);
    o->svg = gs_cli_get(cl, "svg", 0);
    o->rs = gs_cli_get(cl, "source-resistor", 0);
    return 0;
}

static int wants_numbers(const nopts *o)
{
    return o->nat || o->has_band || o->csv || o->svg || o->rs;
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

/* The densities as LaTeX equations: S_out as the sum (three terms a
   line, in multline* when longer), S_in, and each S_k. */
static void print_latex_densities(FILE *out, const gs_job *j,
                                  const gs_noise *n, size_t i)
{
    const gs_noise_target *t = &n->target[i];
    const gs_tf *tf = tf_for(j, t->out);
    int long_sum = n->nsrc > 3;
    size_t k;
    char *h, *tex;
    fputs(long_sum ? "\\begin{multline*}\n" : "\\begin{equation}\n", out);
    fputs("S_{\\mathrm{out}} = ", out);
    for (k = 0; k < n->nsrc; k++) {
        h = h_name(n->src[k].name);
        tex = gs_sym_latex_name(h);
        fprintf(out, "%s\\left|%s\\right|^{2} ", k == 0 ? ""
                : k % 3 == 0 ? "\\\\\n+ " : "+ ", tex);
        latex_s(out, n->src[k].name);
        fputc(' ', out);
        free(tex);
        free(h);
    }
    fprintf(out, "\\quad \\mathrm{%s^2/Hz}\n", gs_noise_unit(j->c, t->out, 0));
    fputs(long_sum ? "\\end{multline*}\n" : "\\end{equation}\n", out);
    tex = gs_sym_latex_name(gs_tf_name(tf));
    fprintf(out, "\\begin{equation}\nS_{\\mathrm{in}} = \\frac{S_{\\mathrm"
            "{out}}}{\\left|%s\\right|^{2}} \\quad \\mathrm{%s^2/Hz}\n"
            "\\end{equation}\n", tex, gs_noise_unit(j->c, t->out, 1));
    free(tex);
    for (k = 0; k < n->nsrc; k++) {
        tex = gs_formula_latex(n->src[k].density);
        fputs("\\begin{equation}\n", out);
        latex_s(out, n->src[k].name);
        fprintf(out, " = %s \\quad \\mathrm{%s}\n\\end{equation}\n",
                tex ? tex : "?", n->src[k].unit);
        free(tex);
    }
}

/* The symbolic densities: S_out as the sum, each S_k and each H_k. */
static void print_symbolic(FILE *out, const gs_job *j, const gs_noise *n,
                           size_t i, const char *format)
{
    const gs_noise_target *t = &n->target[i];
    const gs_tf *tf = tf_for(j, t->out);
    const char *c = strcmp(format, "latex") == 0 ? "% " : "";
    size_t k;
    char *h;
    fprintf(out, "%snoise of %s = %s, at its output\n", c, gs_tf_name(tf),
            tf->description ? tf->description : "");
    if (*c) {
        print_latex_densities(out, j, n, i);
        fprintf(out, "%% with k = 1.380649e-23 J/K, q = 1.602176634e-19 C, "
                "T in K, f in Hz, s = j*2*pi*f\n");
        print_tf(out, tf, format);
        for (k = 0; k < n->nsrc; k++)
            print_tf(out, tf_for(j, t->first + k), format);
        return;
    }
    fprintf(out, "%sS_out = ", c);
    for (k = 0; k < n->nsrc; k++) {
        h = h_name(n->src[k].name);
        fprintf(out, "%s|%s|^2*S_%s", k ? " + " : "", h, n->src[k].name);
        free(h);
    }
    fprintf(out, "   (%s^2/Hz)\n", gs_noise_unit(j->c, t->out, 0));
    fprintf(out, "%sS_in = S_out/|%s|^2   (%s^2/Hz)\n", c, gs_tf_name(tf),
            gs_noise_unit(j->c, t->out, 1));
    for (k = 0; k < n->nsrc; k++)
        fprintf(out, "%sS_%s = %s   (%s)\n", c, n->src[k].name,
                n->src[k].density, n->src[k].unit);
    fprintf(out, "%swith k = 1.380649e-23 J/K, q = 1.602176634e-19 C, "
            "T in K, f in Hz, s = j*2*pi*f\n", c);
    print_tf(out, tf, format);
    for (k = 0; k < n->nsrc; k++)
        print_tf(out, tf_for(j, t->first + k), format);
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
    free(r);
    free(part);
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
    free(r);
}

static void json_num(FILE *out, long double v)
{
    if (isfinite(v))
        fprintf(out, "%.10Lg", v);
    else
        fputs("null", out);
}

static void json_str(FILE *out, const char *s)
{
    fputc('"', out);
    for (; *s; s++) {
        if (*s == '"' || *s == '\\')
            fputc('\\', out);
        fputc(*s, out);
    }
    fputc('"', out);
}

static void print_json(FILE *out, const gs_job *j, const gs_noise *n,
                       const gs_noise_num *nn, const nopts *o)
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
        json_str(out, gs_tf_name(tf));
        fputs(", \"band\": [", out);
        json_num(out, o->f1);
        fputs(", ", out);
        json_num(out, o->f2);
        fputs("], \"temperature\": ", out);
        json_num(out, nn->t);
        fprintf(out, ", \"output_unit\": \"%s\", \"input_unit\": \"%s\", "
                "\"output_rms\": ", gs_noise_unit(j->c, n->target[i].out, 0),
                gs_noise_unit(j->c, n->target[i].out, 1));
        json_num(out, sqrtl(tot));
        fputs(", \"input_rms\": ", out);
        json_num(out, sqrtl(in));
        if (o->rs_src >= 0) {
            fputs(", \"noise_figure_db\": ", out);
            json_num(out, 10 * log10l(tot / part[o->rs_src]));
        }
        fputs(", \"sources\": [", out);
        for (k = 0; k < n->nsrc; k++) {
            const gs_noise_src *s = &n->src[r[k]];
            char *h = h_name(s->name);
            fputs(k ? ", {\"name\": " : "{\"name\": ", out);
            json_str(out, s->name);
            fputs(", \"density\": ", out);
            json_str(out, s->density);
            fputs(", \"output_rms\": ", out);
            json_num(out, sqrtl(part[r[k]]));
            fputs(", \"transfer\": ", out);
            gs_print_json(out, tf_for(j, n->target[i].first + r[k]),
                          tf->s_var);
            fputc('}', out);
            free(h);
        }
        fputs("]}", out);
        free(r);
    }
    fputs("]\n", out);
    free(part);
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
            free(labels[i]);
        free(labels);
        free(y);
        free(tr);
    } else if (o->svg && status == 0) {
        status = 2;
    }
    free(freq);
    free(outd);
    free(ind);
    free(part);
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
            free(h);
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

int gs_cmd_noise(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    gs_noise n;
    gs_noise_num nn;
    nopts o;
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
    if (status == 0 && json)
        print_json(out, &j, &n, &nn, &o);
    for (i = 0; status == 0 && !json && i < n.ntarget; i++) {
        print_symbolic(out, &j, &n, i, o.format);
        for (k = 0; k < o.nat; k++)
            print_spot(out, &j, &n, &nn, i, o.at[k], &o);
        if (o.has_band) {
            long double *part = gs_calloc(n.nsrc, sizeof *part), tot, in;
            gs_noise_band(&tot, &in, part, &nn, i, o.f1, o.f2);
            print_band(out, &j, &n, part, tot, in, i, &o, nn.t);
            free(part);
        }
    }
    if (status == 0 && !json && (o.nat || o.has_band))
        fputs("note: small-signal white-plus-flicker noise models at one "
              "operating point\n      and one temperature "
              "(docs/noise.md)\n", out);
    if (status == 0 && (o.csv || o.svg))
        status = spectrum(&j, &n, &nn, &o, err);
done:
    free(o.at);
    gs_noise_num_clear(&nn);
    gs_noise_clear(&n);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
