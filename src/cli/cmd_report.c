/* cmd_report.c - the `report` command: the review document. See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "analysis/noise.h"
#include "analysis/refcheck.h"
#include "base/mem.h"
#include "output/report.h"

#include <stdlib.h>
#include <string.h>

static const gs_cli_opt report_spec[] = {
    {"output", 1, 0}, {"set", 1, 1}, {"only", 1, 0}, {"limit", 1, 1},
    {"max-terms", 1, 0}, {"max-memory", 1, 0}, {"help", 0, 0}, {NULL, 0, 0}
};

static const gs_report_writer *writer_of(int format)
{
    if (format == GS_REPORT_HTML)
        return &gs_report_html;
    if (format == GS_REPORT_MD)
        return &gs_report_md;
    return &gs_report_tex;
}

/* The noise analysis of the report: the file loaded a second time with
   the noise sources' transfers added (noise.h), derived and bound as the
   job was.  `pub` is what the document reads. */
typedef struct report_noise {
    gs_job j;
    gs_noise n;
    gs_noise_num nn;
    gs_report_noise pub;
    char *why;
} report_noise;

static void report_noise_init(report_noise *rn)
{
    gs_job_init(&rn->j);
    gs_noise_init(&rn->n);
    memset(&rn->nn, 0, sizeof rn->nn);
    memset(&rn->pub, 0, sizeof rn->pub);
    rn->why = NULL;
}

static void report_noise_clear(report_noise *rn)
{
    gs_noise_num_clear(&rn->nn);
    gs_noise_clear(&rn->n);
    gs_job_clear(&rn->j);
    gs_free(rn->why);
}

/* Derive every target and the transfer from each source to it. */
static int noise_derive(report_noise *rn, const gs_derive_opts *o,
                        gs_diag *d)
{
    size_t i, k;
    int rc = GS_OK;
    for (i = 0; rc == GS_OK && i < rn->n.ntarget; i++) {
        const gs_noise_target *t = &rn->n.target[i];
        rc = gs_job_derive(&rn->j, rn->j.c->outputs[t->out].name, o, d);
        for (k = 0; rc == GS_OK && k < rn->n.nsrc; k++)
            rc = gs_job_derive(&rn->j,
                               rn->j.c->outputs[t->first + k].name, o, d);
    }
    return rc;
}

/* The values bound as the job's were; what gs_cmd_bind says went to
   the user already, when the job was bound, so it is dropped here. */
static int noise_bind(report_noise *rn, const gs_cli *cl)
{
    char *buf = NULL;
    size_t len = 0;
    FILE *quiet = open_memstream(&buf, &len);
    int status;
    if (quiet == NULL)
        return 1;
    status = gs_cmd_bind(&rn->j, cl, quiet);
    fclose(quiet);
    gs_free(buf);
    return status;
}

/* Make the noise analysis, or say in pub.skipped why there is none.
   Returns the struct the document reads, or NULL for no noise section
   (the circuit has no noise source). */
static const gs_report_noise *noise_make(report_noise *rn, const gs_cli *cl,
                                         const char *file, FILE *err)
{
    gs_derive_opts o;
    gs_diag d;
    int rc;
    if (strcmp(file, "-") == 0 || gs_cli_has(cl, "limit")) {
        rn->pub.skipped = strcmp(file, "-") == 0
            ? "Not computed: the circuit was read from standard input, "
              "which can be read once; run gainsmith noise on a file."
            : "Not computed under --limit: gainsmith noise derives its "
              "transfers without limits, so its figures would not be "
              "those of this document.";
        return &rn->pub;
    }
    gs_derive_opts_default(&o);
    if (gs_cmd_budget(&o, cl, "report", err))
        return NULL;
    gs_diag_init(&d);
    rc = gs_job_load(&rn->j, file, &d);
    if (rc == GS_OK
        && gs_noise_setup(&rn->n, rn->j.c, gs_cli_get(cl, "only", 0), &d)
           != GS_OK) {
        gs_diag_clear(&d);      /* no noise source: no section */
        return NULL;
    }
    if (rc == GS_OK)
        rc = noise_derive(rn, &o, &d);
    if (rc == GS_OK && noise_bind(rn, cl) != 0)
        rc = GS_EUNBOUND;
    if (rc == GS_OK)
        rc = gs_noise_num_make(&rn->nn, &rn->n, &rn->j, &d);
    gs_diag_clear(&d);
    if (rc != GS_OK) {
        rn->why = gs_asprintf("Not computed: %s; gainsmith noise on the "
                              "file says where.", gs_strerror(rc));
        rn->pub.skipped = rn->why;
        return &rn->pub;
    }
    rn->pub.n = &rn->n;
    rn->pub.nn = &rn->nn;
    rn->pub.j = &rn->j;
    return &rn->pub;
}

static int write_report(const gs_job *j, const char *path,
                        const gs_report_noise *noise, FILE *out, FILE *err)
{
    gs_report_out o;
    int format = gs_report_format_of(path), rc;
    if (strcmp(path, j->c->file) == 0) {
        fprintf(err, "gainsmith report: error: '%s' is the input file; "
                "it is never written over\n", path);
        return 2;
    }
    o.f = fopen(path, "w");
    o.path = path;
    o.nfig = 0;
    o.noise = noise;
    if (o.f == NULL) {
        fprintf(err, "gainsmith report: error: cannot write '%s'\n", path);
        return 2;
    }
    rc = gs_report_write(&o, writer_of(format), j);
    if (fclose(o.f) != 0 || rc != GS_OK) {
        fprintf(err, "gainsmith report: error: writing '%s' failed\n", path);
        return 1;
    }
    fprintf(out, "wrote %s\n", path);
    return 0;
}

int gs_cmd_report(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    report_noise rn;
    int status, i, partial = 0;
    const char *path = NULL;
    char **args = gs_malloc((size_t)(argc + 1) * sizeof *args);

    /* -o is the one short option: the document's name */
    for (i = 0; i < argc; i++)
        args[i] = strcmp(argv[i], "-o") == 0 ? "--output" : argv[i];
    args[argc] = NULL;
    gs_job_init(&j);
    report_noise_init(&rn);
    status = gs_cli_parse(&cl, argc, args, report_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("report"), out);
        goto done;
    }
    if (status == 0 && (path = gs_cli_get(&cl, "output", 0)) == NULL) {
        fprintf(err, "gainsmith report: error: -o FILE is required\n"
                "gainsmith report: hint: the extension picks the format: "
                ".html, .md or .tex\n");
        status = 2;
    }
    if (status == 0 && gs_report_format_of(path) < 0) {
        fprintf(err, "gainsmith report: error: '%s': the name must end in "
                ".html, .md or .tex\n", path);
        status = 2;
    }
    if (status == 0)
        status = gs_cmd_derive_some(&j, &cl, "report", &partial, err);
    if (status == 0)
        status = gs_cmd_bind(&j, &cl, err);
    if (status == 0)        /* for the check section, as check does */
        gs_refcheck_generic_values(&j, NULL);
    if (status == 0)
        status = write_report(&j, path,
                              noise_make(&rn, &cl, cl.pos[0], err),
                              out, err);
    if (status == 0 && partial)
        status = 1;
done:
    report_noise_clear(&rn);
    gs_free(args);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
