/* cmd_plot.c - the `bode` and `step` commands. See LICENSE. */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "numeric/freq.h"
#include "analysis/job.h"
#include "base/mem.h"
#include "numeric/roots.h"
#include "numeric/step.h"
#include "output/svg.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

static const gs_cli_opt bode_spec[] = {
    {"from", 1, 0}, {"to", 1, 0}, {"points", 1, 0}, {"per-decade", 1, 0},
    {"csv", 1, 0}, {"svg", 1, 0}, {"loop", 0, 0}, {"set", 1, 1},
    {"only", 1, 0}, {"limit", 1, 1}, {"max-terms", 1, 0}, {"max-memory", 1, 0}, {"help", 0, 0},
    {NULL, 0, 0}
};

static const gs_cli_opt step_spec[] = {
    {"until", 1, 0}, {"points", 1, 0}, {"csv", 1, 0}, {"svg", 1, 0},
    {"set", 1, 1}, {"only", 1, 0}, {"limit", 1, 1}, {"max-terms", 1, 0}, {"max-memory", 1, 0},
    {"help", 0, 0}, {NULL, 0, 0}
};

/* Numeric H = N/D of every output, with poles and zeros. */
static int make_tfns(gs_tfn **out, const gs_job *j, const char *cmd,
                     FILE *err)
{
    gs_tfn *h = gs_calloc(j->ntf ? j->ntf : 1, sizeof *h);
    size_t i;
    int status = 0;
    for (i = 0; i < j->ntf; i++) {
        int dn, dd, rc;
        long double *cn = gs_job_coeffs(j, &j->tf[i].num, &dn);
        long double *cd = gs_job_coeffs(j, &j->tf[i].den, &dd);
        rc = gs_tfn_init(&h[i], cn, dn, cd, dd);
        if (rc == GS_EINVAL && status == 0) {
            fprintf(err, "gainsmith %s: error: %s: the denominator is zero "
                    "or not finite with these values\n", cmd,
                    j->tf[i].name);
            status = 1;
        }
        gs_free(cn);
        gs_free(cd);
    }
    *out = h;
    return status;
}

static void free_tfns(gs_tfn *h, size_t n)
{
    size_t i;
    for (i = 0; i < n; i++)
        gs_tfn_clear(&h[i]);
    gs_free(h);
}

/* Open an output file, refusing to write over the circuit file. */
static FILE *open_output(const char *path, const char *input,
                         const char *cmd, FILE *err)
{
    struct stat a, b;
    FILE *f;
    if (strcmp(input, "-") != 0 && stat(path, &a) == 0
        && stat(input, &b) == 0 && a.st_dev == b.st_dev
        && a.st_ino == b.st_ino) {
        fprintf(err, "gainsmith %s: error: refusing to write over the "
                "input file '%s'\n", cmd, path);
        return NULL;
    }
    f = fopen(path, "w");
    if (f == NULL)
        fprintf(err, "gainsmith %s: error: cannot write '%s'\n", cmd, path);
    return f;
}

static int close_output(FILE *f, const char *path, const char *cmd,
                        FILE *err)
{
    if (fclose(f) != 0) {
        fprintf(err, "gainsmith %s: error: writing '%s' failed\n", cmd,
                path);
        return 2;
    }
    return 0;
}

typedef struct sweep_opts {
    long double from, to;
    size_t points;
} sweep_opts;

static int parse_sweep(sweep_opts *o, const gs_cli *cl, FILE *err)
{
    const char *t;
    long double per = 0;
    if (!gs_cli_has(cl, "from") || !gs_cli_has(cl, "to")) {
        fprintf(err, "gainsmith bode: error: --from and --to are required\n"
                "gainsmith bode: hint: frequencies in Hz, e.g. --from 10 "
                "--to 100M\n");
        return 2;
    }
    if (gs_cli_real(&o->from, gs_cli_get(cl, "from", 0), "Hz", "bode",
                    "from", err)
        || gs_cli_real(&o->to, gs_cli_get(cl, "to", 0), "Hz", "bode", "to",
                       err))
        return 2;
    if (!(o->from > 0 && o->to > o->from)) {
        fprintf(err, "gainsmith bode: error: need 0 < --from < --to\n");
        return 2;
    }
    o->points = 201;
    if ((t = gs_cli_get(cl, "points", 0))
        && gs_cli_size(&o->points, t, "bode", "points", err))
        return 2;
    if ((t = gs_cli_get(cl, "per-decade", 0))) {
        if (gs_cli_real(&per, t, NULL, "bode", "per-decade", err))
            return 2;
        o->points = gs_sweep_points(o->from, o->to, per);
    }
    if (o->points < 2 || o->points > 10000000) {
        fprintf(err, "gainsmith bode: error: the sweep needs 2 to 10000000 "
                "points\n");
        return 2;
    }
    return 0;
}

/* -0 (a delay of a flat response, computed as minus a zero slope)
   printed as 0 */
static long double unsigned_zero(long double v)
{
    return v == 0 ? 0 : v;
}

/* One CSV for every output: freq_Hz, then per output its three columns. */
static void write_bode_csv(FILE *f, const gs_job *j, const gs_sweep *sw)
{
    size_t i, k;
    fputs("freq_Hz", f);
    for (i = 0; i < j->ntf; i++) {
        /* the magnitude's unit in ASCII: dB, dBohm or dBS */
        gs_unit_info u;
        gs_job_unit(&u, j, i);
        fprintf(f, ",%s_mag_%s,%s_phase_deg,%s_group_delay_s",
                j->tf[i].name, u.is_gain ? "dB" : strcmp(u.db, "dBS") == 0
                ? "dBS" : "dBohm", j->tf[i].name, j->tf[i].name);
    }
    fputc('\n', f);
    for (k = 0; k < sw[0].n; k++) {
        fprintf(f, "%.10Lg", sw[0].freq[k]);
        for (i = 0; i < j->ntf; i++)
            fprintf(f, ",%.10Lg,%.10Lg,%.10Lg", unsigned_zero(sw[i].mag_db[k]),
                    unsigned_zero(sw[i].phase_deg[k]),
                    unsigned_zero(sw[i].delay_s[k]));
        fputc('\n', f);
    }
}

static void print_bode_summary(FILE *out, const char *name,
                               const gs_plot_marks *m, int loop,
                               const gs_unit_info *u)
{
    char b1[48];
    fprintf(out, "%s\n", name);
    if (!u->is_gain) {
        /* |Z| = 1 ohm or a fall of 3 dB from DC is no property of an
           impedance: only gains get those figures */
        fprintf(out, "  magnitude in %s (re 1 %s); no bandwidth or unity-gain "
                "figure for %s %s\n", u->db, u->unit,
                u->word[0] == 'i' ? "an" : "a", u->word);
        return;
    }
    fprintf(out, "  -3 dB bandwidth   %s\n", m->has_bw
            ? gs_si_format(b1, sizeof b1, m->bw_hz, 4, "Hz") : "none");
    fprintf(out, "  unity gain        %s\n", m->has_unity
            ? gs_si_format(b1, sizeof b1, m->unity_hz, 4, "Hz") : "none");
    if (!loop)
        return;
    if (m->has_pm)
        fprintf(out, "  phase margin      %.2Lf deg at %s\n", m->pm_deg,
                gs_si_format(b1, sizeof b1, m->pm_hz, 4, "Hz"));
    else
        fputs("  phase margin      none (|L| never crosses 0 dB)\n", out);
    if (m->has_gm)
        fprintf(out, "  gain margin       %.2Lf dB at %s\n", m->gm_db,
                gs_si_format(b1, sizeof b1, m->gm_hz, 4, "Hz"));
    else
        fputs("  gain margin       none (the phase never reaches -180 "
              "deg)\n", out);
}

static int bode_outputs(const gs_job *j, const gs_tfn *h, const gs_cli *cl,
                        const sweep_opts *so, FILE *out, FILE *err)
{
    size_t i, n = j->ntf;
    gs_sweep *sw = gs_calloc(n, sizeof *sw);
    gs_plot_marks *marks = gs_calloc(n, sizeof *marks);
    gs_plot_trace *tr = gs_calloc(n, sizeof *tr);
    char **labels = gs_calloc(n, sizeof *labels);
    int loop = gs_cli_has(cl, "loop"), status = 0, mixed = 0;
    const char *csv = gs_cli_get(cl, "csv", 0);
    const char *svg = gs_cli_get(cl, "svg", 0);
    FILE *fcsv = NULL, *fsvg = NULL;

    /* traces of different units on one axis: each legend entry says its
       own */
    for (i = 1; i < n; i++) {
        gs_unit_info u0, ui;
        gs_job_unit(&u0, j, 0);
        gs_job_unit(&ui, j, i);
        mixed |= strcmp(u0.db, ui.db) != 0;
    }
    /* open the files first: a refusal costs no work and prints nothing */
    if (csv && (fcsv = open_output(csv, j->c->file, "bode", err)) == NULL)
        status = 2;
    if (svg && status == 0
        && (fsvg = open_output(svg, j->c->file, "bode", err)) == NULL)
        status = 2;
    for (i = 0; i < n && status == 0; i++) {
        gs_sweep_init(&sw[i]);
        gs_sweep_log(&sw[i], &h[i], so->from, so->to, so->points);
        gs_unit_info u;
        gs_job_unit(&u, j, i);
        gs_plot_marks_fill(&marks[i], &h[i], loop);
        if (!u.is_gain)
            marks[i].has_bw = marks[i].has_unity = marks[i].has_pm
                = marks[i].has_gm = 0;
        tr[i].db_unit = u.db;
        labels[i] = mixed ? gs_asprintf("%s (%s)", j->tf[i].name, u.db)
                          : gs_strdup(j->tf[i].name);
        tr[i].label = labels[i];
        tr[i].n = sw[i].n;
        tr[i].x = sw[i].freq;
        tr[i].y = sw[i].mag_db;
        tr[i].y2 = sw[i].phase_deg;
        tr[i].marks = &marks[i];
        print_bode_summary(out, j->tf[i].name, &marks[i], loop, &u);
    }
    if (fcsv && status == 0)
        write_bode_csv(fcsv, j, sw);
    if (fsvg && status == 0) {
        gs_plot p;
        memset(&p, 0, sizeof p);
        p.title = j->c->title;
        p.traces = tr;
        p.ntraces = n;
        gs_svg_bode(fsvg, &p);
    }
    if (fcsv && close_output(fcsv, csv, "bode", err))
        status = 2;
    if (fsvg && close_output(fsvg, svg, "bode", err))
        status = 2;
    if (!csv && !svg && status == 0)
        write_bode_csv(out, j, sw);
    for (i = 0; i < n; i++) {
        gs_sweep_clear(&sw[i]);
        gs_free(labels[i]);
    }
    gs_free(labels);
    gs_free(sw);
    gs_free(marks);
    gs_free(tr);
    return status;
}

/* Front half shared by bode and step: options, derive, bind, numbers;
   *partial as gs_cmd_derive_some sets it. */
static int prepare(gs_job *j, gs_tfn **h, const gs_cli *cl, const char *cmd,
                   int *partial, FILE *err)
{
    int status = gs_cmd_derive_some(j, cl, cmd, partial, err);
    if (status == 0)
        status = gs_cmd_bind(j, cl, err);
    if (status == 0)
        status = make_tfns(h, j, cmd, err);
    return status;
}

int gs_cmd_bode(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    gs_tfn *h = NULL;
    sweep_opts so;
    int status, partial = 0;

    gs_job_init(&j);
    status = gs_cli_parse(&cl, argc, argv, bode_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help"))
        fputs(gs_cmd_help_text("bode"), out);
    else {
        if (status == 0)
            status = parse_sweep(&so, &cl, err);
        if (status == 0)
            status = prepare(&j, &h, &cl, "bode", &partial, err);
        if (status == 0)
            status = bode_outputs(&j, h, &cl, &so, out, err);
        if (status == 0 && partial)
            status = 1;
    }
    if (h)
        free_tfns(h, j.ntf);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}

static void print_step_summary(FILE *out, const char *name,
                               const gs_step_metrics *m)
{
    char b[48];
    fprintf(out, "%s\n", name);
    if (m->has_final)
        fprintf(out, "  final value       %.10Lg\n", m->final_value);
    else
        fputs("  final value       none (not every pole is in the left "
              "half plane)\n", out);
    if (m->has_rise)
        fprintf(out, "  rise time 10-90%%  %s\n",
                gs_si_format(b, sizeof b, m->rise_time, 4, "s"));
    /* the peak is of the magnitude |y|, which for an inverting stage is
       the response's most negative value; without overshoot |y| never
       passes |final value| and there is no peak to show */
    if (m->has_overshoot && m->overshoot_pct > 0)
        fprintf(out, "  overshoot         %.4Lg %% (peak |y| %.6Lg at %s)\n",
                m->overshoot_pct, fabsl(m->peak_value),
                gs_si_format(b, sizeof b, m->peak_time, 4, "s"));
    else if (m->has_overshoot)
        fputs("  overshoot         0 % (|y| never exceeds its final "
              "value)\n", out);
    if (m->has_settling)
        fprintf(out, "  settling (1 %%)    %s\n",
                gs_si_format(b, sizeof b, m->settling_time, 4, "s"));
}

static int step_one(const gs_job *j, size_t i, const gs_tfn *h,
                    const gs_cli *cl, long double until, size_t points,
                    FILE *out, FILE *err)
{
    gs_step st;
    gs_step_metrics m;
    const char *csv = gs_cli_get(cl, "csv", 0);
    const char *svg = gs_cli_get(cl, "svg", 0);
    long double t_end;
    int status = 0, rc;
    FILE *f;

    rc = gs_step_init(&st, h);
    if (rc != GS_OK) {
        fprintf(err, "gainsmith step: error: %s: no partial-fraction "
                "expansion (%s)\n", j->tf[i].name, gs_strerror(rc));
        gs_step_clear(&st);
        return 1;
    }
    memset(&m, 0, sizeof m);
    gs_step_measure(&m, &st);
    print_step_summary(out, j->tf[i].name, &m);
    t_end = until > 0 ? until : gs_step_span(&st);
    if (csv && (f = open_output(csv, j->c->file, "step", err))) {
        gs_step_write_csv(f, &st, t_end, points);
        status = close_output(f, csv, "step", err);
    } else if (csv) {
        status = 2;
    }
    if (svg && status == 0 && (f = open_output(svg, j->c->file, "step",
                                               err))) {
        long double *t = gs_calloc(points, sizeof *t);
        long double *y = gs_calloc(points, sizeof *y);
        gs_plot_trace tr;
        gs_plot p;
        /* the automatic span is carried to the axis's next grid step,
           so the trace reaches the axis end; a span the user gave is
           kept, and the axis ends at it */
        gs_step_table(t, y, NULL, points, &st,
                      until > 0 ? t_end : gs_svg_step_axis_end(t_end));
        memset(&tr, 0, sizeof tr);
        memset(&p, 0, sizeof p);
        tr.label = j->tf[i].name;
        tr.n = points;
        tr.x = t;
        tr.y = y;
        tr.metrics = &m;
        p.title = j->c->title;
        p.traces = &tr;
        p.ntraces = 1;
        gs_svg_step(f, &p);
        status = close_output(f, svg, "step", err);
        gs_free(t);
        gs_free(y);
    } else if (svg && status == 0) {
        status = 2;
    }
    gs_step_clear(&st);
    return status;
}

int gs_cmd_step(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    gs_tfn *h = NULL;
    long double until = 0;
    size_t points = 1001, i;
    const char *t;
    int status, partial = 0;

    gs_job_init(&j);
    status = gs_cli_parse(&cl, argc, argv, step_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("step"), out);
        goto done;
    }
    if (status == 0 && (t = gs_cli_get(&cl, "until", 0)))
        status = gs_cli_real(&until, t, "s", "step", "until", err);
    if (status == 0 && (t = gs_cli_get(&cl, "points", 0)))
        status = gs_cli_size(&points, t, "step", "points", err);
    if (status == 0 && (points < 2 || (gs_cli_has(&cl, "until")
                                       && !(until > 0)))) {
        fprintf(err, "gainsmith step: error: need --points >= 2 and "
                "--until > 0\n");
        status = 2;
    }
    if (status == 0 && points > 10000000) {     /* the cap bode has */
        fprintf(err, "gainsmith step: error: --points takes at most "
                "10000000, got %zu\n", points);
        status = 2;
    }
    if (status == 0)
        status = prepare(&j, &h, &cl, "step", &partial, err);
    if (status == 0 && j.ntf > 1
        && (gs_cli_has(&cl, "csv") || gs_cli_has(&cl, "svg"))) {
        fprintf(err, "gainsmith step: error: the file has %zu outputs; "
                "--csv and --svg take one\n", j.ntf);
        fprintf(err, "gainsmith step: hint: choose one with --only NAME\n");
        status = 2;
    }
    for (i = 0; status == 0 && i < j.ntf; i++)
        status = step_one(&j, i, &h[i], &cl, until, points, out, err);
    if (status == 0 && partial)
        status = 1;
done:
    if (h)
        free_tfns(h, j.ntf);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
