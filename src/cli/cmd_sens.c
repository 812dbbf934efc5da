/* cmd_sens.c - the `sens` command: normalised sensitivities. See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "analysis/sens.h"
#include "base/mem.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static const gs_cli_opt sens_spec[] = {
    {"set", 1, 1}, {"at", 1, 1}, {"only", 1, 0}, {"format", 1, 0},
    {"limit", 1, 1}, {"max-terms", 1, 0}, {"max-memory", 1, 0},
    {"loop", 0, 0}, {"help", 0, 0}, {NULL, 0, 0}
};

/* Below this |S| a symbol is folded into one line of the table. */
#define FOLD 1e-3L

typedef struct row {
    long double s;
    const char *name;
} row;

static int by_size(const void *pa, const void *pb)
{
    const row *a = pa, *b = pb;
    long double x = fabsl(a->s), y = fabsl(b->s);
    if (x != y)
        return x < y ? 1 : -1;
    return strcmp(a->name, b->name);
}

static void fig_head(FILE *out, const gs_sens_fig *f)
{
    fprintf(out, "  %s", gs_sens_kind_name(f->kind));
    if (f->kind == GS_SENS_MAG || f->kind == GS_SENS_PHASE)
        fprintf(out, " %.6Lg Hz", f->freq);
    if (f->kind == GS_SENS_POLE || f->kind == GS_SENS_ZERO)
        fprintf(out, "  %.10Lg rad/s", creall(f->value));
    else if (f->kind == GS_SENS_PHASE)
        fprintf(out, "  %.6Lg deg", creall(f->value) * 180 / acosl(-1));
    else if (f->kind == GS_SENS_PM)
        fprintf(out, "  %.6Lg deg", creall(f->value));
    else if (f->kind == GS_SENS_W0 || f->kind == GS_SENS_ZW0
             || f->kind == GS_SENS_BW || f->kind == GS_SENS_UGF)
        fprintf(out, "  %.10Lg rad/s", creall(f->value));
    else
        fprintf(out, "  %.10Lg", creall(f->value));
    fputc('\n', out);
}

/* Length of the run of links of one figure starting at l[k]. */
static size_t run_len(const gs_bias_link *l, size_t n, size_t k)
{
    size_t m = k + 1;
    while (m < n && l[m].device == l[k].device
           && strcmp(l[m].figure, l[k].figure) == 0)
        m++;
    return m - k;
}

/* The rows of the bias figures under a figure's table: "M1.id". */
static void print_bias_rows(FILE *out, const gs_sens *r,
                            const gs_sens_fig *f, const gs_bias_link *l,
                            size_t nl)
{
    size_t k, m;
    char name[64];
    if (nl == 0)
        return;
    fputs("    through the bias:\n", out);
    for (k = 0; k < nl; k += m) {
        m = run_len(l, nl, k);
        snprintf(name, sizeof name, "%s.%s", l[k].device, l[k].figure);
        fprintf(out, "    %-14s % .6Lf\n", name, gs_sens_chain(r, f, l + k, m));
    }
}

/* The chain each bias row is worked out by, once per output:
   "S(Q, M1.id) = 0.5*S(Q, gm1) - 1*S(Q, ro1)". */
static void print_chains(FILE *out, const gs_bias_link *l, size_t nl,
                         const gs_symtab *st)
{
    size_t k, m, i;
    if (nl == 0)
        return;
    fputs("  bias chains (S of the model's small-signal values to each "
          "figure):\n", out);
    for (k = 0; k < nl; k += m) {
        m = run_len(l, nl, k);
        fprintf(out, "    S(Q, %s.%s) =", l[k].device, l[k].figure);
        for (i = k; i < k + m; i++)
            fprintf(out, i == k ? " %s%.6Lg*S(Q, %s)" : " %s %.6Lg*S(Q, %s)",
                    l[i].s < 0 ? "-" : i == k ? "" : "+", fabsl(l[i].s),
                    gs_symtab_name(st, l[i].sym));
        fputc('\n', out);
    }
}

static void print_fig(FILE *out, const gs_sens *r, const gs_sens_fig *f,
                      const gs_symtab *st)
{
    row *rows = gs_malloc((size_t)(r->nvars ? r->nvars : 1) * sizeof *rows);
    size_t n = 0, i, folded = 0;
    int v;
    for (v = 0; v < r->nvars; v++)
        if (r->used[v]) {
            rows[n].s = f->s[v];
            rows[n++].name = gs_symtab_name(st, v);
        }
    qsort(rows, n, sizeof *rows, by_size);
    fig_head(out, f);
    for (i = 0; i < n; i++) {
        if (isfinite(rows[i].s) && fabsl(rows[i].s) < FOLD) {
            folded++;
            continue;
        }
        fprintf(out, "    %-14s % .6Lf\n", rows[i].name, rows[i].s);
    }
    if (folded)
        fprintf(out, "    (%zu more with |S| < 0.001)\n", folded);
    gs_free(rows);
}

static void json_num(FILE *out, long double v)
{
    if (isfinite(v))
        fprintf(out, "%.17Lg", v);
    else
        fputs("null", out);
}

static void json_fig(FILE *out, const gs_sens *r, const gs_sens_fig *f,
                     const gs_symtab *st, const gs_bias_link *l, size_t nl)
{
    int v, first = 1;
    fprintf(out, "    {\"figure\": \"%s\", ", gs_sens_kind_name(f->kind));
    if (f->kind == GS_SENS_MAG || f->kind == GS_SENS_PHASE)
        fprintf(out, "\"freq_hz\": %.17Lg, ", f->freq);
    fputs("\"value\": ", out);
    if ((f->kind == GS_SENS_POLE || f->kind == GS_SENS_ZERO)) {
        fputs("{\"re\": ", out);
        json_num(out, creall(f->root));
        fputs(", \"im\": ", out);
        json_num(out, cimagl(f->root));
        fputc('}', out);
    } else {
        json_num(out, creall(f->value));
    }
    fputs(", \"sens\": {", out);
    for (v = 0; v < r->nvars; v++)
        if (r->used[v]) {
            fprintf(out, "%s\"%s\": ", first ? "" : ", ",
                    gs_symtab_name(st, v));
            json_num(out, f->s[v]);
            first = 0;
        }
    fputc('}', out);
    if (nl) {
        size_t k, m;
        fputs(", \"bias\": {", out);
        for (k = 0; k < nl; k += m) {
            m = run_len(l, nl, k);
            fprintf(out, "%s\"%s.%s\": ", k ? ", " : "", l[k].device,
                    l[k].figure);
            json_num(out, gs_sens_chain(r, f, l + k, m));
        }
        fputc('}', out);
    }
    fputc('}', out);
}

/* "bias_chain": [{"figure": "M1.id", "value": V, "links": {SYM: S}}] */
static void json_chains(FILE *out, const gs_bias_link *l, size_t nl,
                        const gs_symtab *st)
{
    size_t k, m, i;
    fputs(", \"bias_chain\": [", out);
    for (k = 0; k < nl; k += m) {
        m = run_len(l, nl, k);
        fprintf(out, "%s\n    {\"figure\": \"%s.%s\", \"value\": ",
                k ? "," : "", l[k].device, l[k].figure);
        json_num(out, l[k].value);
        fputs(", \"links\": {", out);
        for (i = k; i < k + m; i++) {
            fprintf(out, "%s\"%s\": ", i > k ? ", " : "",
                    gs_symtab_name(st, l[i].sym));
            json_num(out, l[i].s);
        }
        fputs("}}", out);
    }
    fputs(nl ? "\n  ]" : "]", out);
}

/* tf[i] is the return ratio T of a loopgain line. */
static int is_loop_gain(const gs_job *j, size_t i)
{
    const gs_output *o = &j->c->outputs[j->out_index[i]];
    return o->kind == GS_OUT_LOOP && o->loop_part == 0;
}

static int sens_one(const gs_job *j, size_t i, const long double *at,
                    size_t nat, int loop, int json, FILE *out, FILE *err)
{
    gs_sens r;
    gs_bias_link *l;
    size_t k, nl;
    int rc;
    gs_sens_init(&r);
    gs_sens_bias_links(&l, &nl, j);
    rc = gs_sens_compute_loop(&r, &j->tf[i], j->vals, at, nat,
                              loop && is_loop_gain(j, i));
    if (rc == GS_EINVAL) {
        fprintf(err, "gainsmith sens: error: %s: the denominator is zero "
                "or not finite with these values\n", j->tf[i].name);
    } else if (json) {
        fprintf(out, "  {\"name\": \"%s\", \"figures\": [\n",
                j->tf[i].name);
        for (k = 0; k < r.n; k++) {
            json_fig(out, &r, &r.fig[k], j->c->syms, l, nl);
            fputs(k + 1 < r.n ? ",\n" : "\n", out);
        }
        fputs("  ]", out);
        if (nl)
            json_chains(out, l, nl, j->c->syms);
        fputs("}", out);
    } else {
        fprintf(out, "%s\n", j->tf[i].name);
        for (k = 0; k < r.n; k++) {
            print_fig(out, &r, &r.fig[k], j->c->syms);
            print_bias_rows(out, &r, &r.fig[k], l, nl);
        }
        print_chains(out, l, nl, j->c->syms);
    }
    gs_free(l);
    gs_sens_clear(&r);
    return rc == GS_EINVAL ? 1 : 0;
}

static int read_at(long double **at, size_t *nat, const gs_cli *cl,
                   FILE *err)
{
    size_t i;
    *nat = gs_cli_count(cl, "at");
    *at = gs_malloc((*nat ? *nat : 1) * sizeof **at);
    for (i = 0; i < *nat; i++) {
        if (gs_cli_real(&(*at)[i], gs_cli_get(cl, "at", i), "Hz", "sens",
                        "at", err))
            return 2;
        if (!((*at)[i] > 0)) {
            fprintf(err, "gainsmith sens: error: --at expects a frequency "
                    "above 0 Hz, got '%s'\n", gs_cli_get(cl, "at", i));
            return 2;
        }
    }
    return 0;
}

int gs_cmd_sens(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    long double *at = NULL;
    size_t i, nat = 0, nloop = 0;
    int status, json = 0, loop = 0, partial = 0;
    const char *fmt;

    gs_job_init(&j);
    status = gs_cli_parse(&cl, argc, argv, sens_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("sens"), out);
        goto done;
    }
    fmt = status == 0 ? gs_cli_get(&cl, "format", 0) : NULL;
    if (fmt && strcmp(fmt, "json") && strcmp(fmt, "text")) {
        fprintf(err, "gainsmith sens: error: --format expects text or json"
                ", got '%s'\n", fmt);
        status = 2;
    }
    json = fmt && strcmp(fmt, "json") == 0;
    if (status == 0)
        status = read_at(&at, &nat, &cl, err);
    if (status == 0)
        status = gs_cmd_derive_some(&j, &cl, "sens", &partial, err);
    if (status == 0)
        status = gs_cmd_bind(&j, &cl, err);
    loop = status == 0 && gs_cli_has(&cl, "loop");
    for (i = 0; loop && i < j.ntf; i++)
        nloop += (size_t)is_loop_gain(&j, i);
    if (loop && nloop == 0) {
        fprintf(err, "gainsmith sens: error: --loop: %s has no loopgain "
                "output\ngainsmith sens: hint: add a line 'loopgain T = "
                "SOURCE' naming the controlled source that closes the "
                "loop (docs/language.md)\n", cl.npos ? cl.pos[0]
                                                   : "the file");
        status = 2;
    }
    if (json && status == 0)
        fputs("[\n", out);
    for (i = 0; status == 0 && i < j.ntf; i++) {
        status = sens_one(&j, i, at, nat, loop, json, out, err);
        if (json)
            fputs(i + 1 < j.ntf ? ",\n" : "\n", out);
    }
    if (json && status == 0)
        fputs("]\n", out);
    if (status == 0 && partial)
        status = 1;
done:
    gs_free(at);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
