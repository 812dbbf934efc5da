/* cmd_report.c - the `report` command: the review document. See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
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

static int write_report(const gs_job *j, const char *path, FILE *out,
                        FILE *err)
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
    int status, i;
    const char *path = NULL;
    char **args = gs_malloc((size_t)(argc + 1) * sizeof *args);

    /* -o is the one short option: the document's name */
    for (i = 0; i < argc; i++)
        args[i] = strcmp(argv[i], "-o") == 0 ? "--output" : argv[i];
    args[argc] = NULL;
    gs_job_init(&j);
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
        status = gs_cmd_load_and_derive(&j, &cl, "report", err);
    if (status == 0)
        status = gs_cmd_bind(&j, &cl, err);
    if (status == 0)
        status = write_report(&j, path, out, err);
done:
    free(args);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
