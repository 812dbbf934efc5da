/* api.c - the public interface of include/gainsmith.h. See LICENSE. */
#include "gainsmith.h"
#include "analysis/job.h"
#include "base/mem.h"

#include <stdio.h>
#include <stdlib.h>

struct gs_result {
    gs_job job;
};

/* Diagnostics as one string, or NULL when there are none. */
static char *diag_text(const gs_diag *d)
{
    char *buf = NULL;
    size_t len = 0;
    FILE *f;
    if (d->n == 0)
        return NULL;
    f = open_memstream(&buf, &len);
    if (f == NULL)
        return NULL;
    gs_diag_print(f, d);
    fclose(f);
    return buf;
}

int gs_derive_file(gs_result **out, const char *path, const char *only,
                   char **messages)
{
    gs_result *r = gs_calloc(1, sizeof *r);
    gs_derive_opts o;
    gs_diag d;
    int rc;

    gs_diag_init(&d);
    gs_job_init(&r->job);
    gs_derive_opts_default(&o);
    rc = gs_job_load(&r->job, path, &d);
    if (rc == GS_OK)
        rc = gs_job_derive(&r->job, only, &o, &d);
    if (messages)
        *messages = diag_text(&d);
    gs_diag_clear(&d);
    if (rc != GS_OK) {
        gs_result_free(r);
        r = NULL;
    }
    *out = r;
    return rc;
}

size_t gs_result_count(const gs_result *r)
{
    return r ? r->job.ntf : 0;
}

const char *gs_result_name(const gs_result *r, size_t i)
{
    return r->job.tf[i].name;
}

char *gs_result_text(const gs_result *r, size_t i)
{
    return gs_tf_get_str(&r->job.tf[i], r->job.c->s_sym);
}

char *gs_result_json(const gs_result *r, size_t i)
{
    char *buf = NULL;
    size_t len = 0;
    FILE *f = open_memstream(&buf, &len);
    if (f == NULL)
        return gs_strdup("");
    gs_print_json(f, &r->job.tf[i], r->job.c->s_sym);
    fclose(f);
    return buf;
}

void gs_result_free(gs_result *r)
{
    if (r == NULL)
        return;
    gs_job_clear(&r->job);
    free(r);
}
