/* cmd_approx.c - the `approx` command: short forms with a measured error.
 * See LICENSE; docs/approx.md.
 */
#include "cli/cli.h"
#include "base/mem.h"
#include "cli/cmd.h"
#include "analysis/approx.h"
#include "analysis/job.h"
#include "output/print_approx.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static const gs_cli_opt approx_spec[] = {
    {"tol", 1, 0}, {"band", 1, 0}, {"spread", 1, 0}, {"only", 1, 0},
    {"set", 1, 1}, {"format", 1, 0}, {"max-terms", 1, 0}, {"max-memory", 1, 0}, {"stats", 0, 0},
    {"help", 0, 0}, {NULL, 0, 0}
};

static int parse_band(gs_approx_opts *o, const char *t, FILE *err)
{
    const char *colon = strchr(t, ':');
    char lo[64];
    if (colon && (size_t)(colon - t) < sizeof lo) {
        memcpy(lo, t, (size_t)(colon - t));
        lo[colon - t] = 0;
        if (gs_cli_real(&o->f_lo, lo, "Hz", "approx", "band", err))
            return 2;
        if (gs_cli_real(&o->f_hi, colon + 1, "Hz", "approx", "band", err))
            return 2;
        if (o->f_lo > 0 && o->f_hi > o->f_lo)
            return 0;
    }
    fprintf(err, "gainsmith approx: error: --band expects F1:F2 with "
            "0 < F1 < F2, got '%s'\n", t);
    return 2;
}

/* approx's own errors carry no place in the file: one line each, with
   the output's name, and the hint where there is one. */
static void print_failure(FILE *err, const char *file, const char *name,
                          const gs_diag *d)
{
    size_t k;
    for (k = 0; k < d->n; k++) {
        fprintf(err, "%s: %s: %s: %s\n", file, name,
                d->v[k].severity == GS_SEV_ERROR ? "error" : "note",
                d->v[k].message);
        if (d->v[k].hint)
            fprintf(err, "%s: %s: hint: %s\n", file, name, d->v[k].hint);
    }
}

int gs_cmd_approx(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    gs_approx_opts o;
    size_t i;
    int status, style = GS_FORM_TEXT, json = 0, unmet = 0;
    const char *fmt, *t;
    FILE *doc = out;
    char *doc_buf = NULL;
    size_t doc_len = 0;

    gs_job_init(&j);
    gs_approx_opts_default(&o);
    status = gs_cli_parse(&cl, argc, argv, approx_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("approx"), out);
        goto done;
    }
    fmt = status == 0 ? gs_cli_get(&cl, "format", 0) : NULL;
    if (fmt) {
        if (strcmp(fmt, "json") == 0)
            json = 1;
        else if (strcmp(fmt, "pretty") == 0)
            style = GS_FORM_PRETTY;
        else if (strcmp(fmt, "latex") == 0)
            style = GS_FORM_LATEX;
        else if (strcmp(fmt, "text")) {
            fprintf(err, "gainsmith approx: error: --format expects text, "
                    "pretty, latex or json, got '%s'\n", fmt);
            status = 2;
        }
    }
    if (status == 0 && (t = gs_cli_get(&cl, "tol", 0)))
        status = gs_cli_tol(&o.tol_db, &o.tol_deg, t, "approx", err);
    if (status == 0 && (t = gs_cli_get(&cl, "band", 0)))
        status = parse_band(&o, t, err);
    if (status == 0 && (t = gs_cli_get(&cl, "spread", 0))) {
        long double p;
        status = gs_cli_real(&p, t, "%", "approx", "spread", err);
        if (status == 0 && (p < 0 || p >= 100)) {
            fprintf(err, "gainsmith approx: error: --spread expects a "
                    "percentage from 0 to below 100, got '%s'\n", t);
            status = 2;
        }
        o.spread = p / 100;
    }
    if (status == 0)
        status = gs_cmd_load_and_derive(&j, &cl, "approx", err);
    if (status == 0)
        status = gs_cmd_bind(&j, &cl, err);
    /* a JSON document is written whole or not at all: held until every
       output is done, so that an error leaves no half array on stdout */
    if (json && status == 0) {
        doc = open_memstream(&doc_buf, &doc_len);
        if (doc == NULL)        /* no room to hold it: written as it goes */
            doc = out;
    }
    if (json && status == 0)
        fputs("[\n", doc);
    for (i = 0; status == 0 && i < j.ntf; i++) {
        gs_approx_result r;
        gs_diag d;
        int rc;
        gs_diag_init(&d);
        gs_approx_result_init(&r);
        rc = gs_approx_run(&r, &j, i, &o, &d);
        if (rc != GS_OK) {
            print_failure(err, j.c->file ? j.c->file : "<stdin>",
                          j.tf[i].name, &d);
            status = 1;
        } else {
            if (json)
                gs_print_approx_json(doc, &r);
            else
                gs_print_approx(doc, &r, style);
            if (json)
                fputs(i + 1 < j.ntf ? ",\n" : "\n", doc);
            if (!r.met) {
                fprintf(err, "gainsmith approx: error: %s: the tolerance "
                        "could not be met; the best form reached is "
                        "shown\n", j.tf[i].name);
                unmet = 1;
            }
            if (gs_cli_has(&cl, "stats")) {
                fprintf(err, "approx %s: path=%s terms_exact=%zu "
                        "terms_kept=%zu eps=%.3Lg points=%d spread_points=%d",
                        j.tf[i].name, r.path, r.terms_exact, r.terms_kept,
                        r.eps, r.npoints, r.nspread);
                /* the graph path: terms listed, how far generated, the
                   graph's size */
                if (j.graph && j.graph[i])
                    fprintf(err, " gen_tol=%.3Lg graph_nodes=%zu "
                            "graph_edges=%zu%s", r.gen_tol,
                            j.graph[i]->nnodes, j.graph[i]->nedges,
                            r.search_bounded ? " search_bounded=1" : "");
                fputc('\n', err);
            }
        }
        gs_approx_result_clear(&r);
        gs_diag_clear(&d);
    }
    if (json && status == 0)
        fputs("]\n", doc);
    if (doc != out) {
        fclose(doc);
        if (status == 0 || unmet)
            fwrite(doc_buf, 1, doc_len, out);
        gs_free(doc_buf);
    }
    if (status == 0 && unmet)
        status = 1;
done:
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
