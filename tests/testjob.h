/* testjob.h - the step the analysis tests share: a circuit file read,
 * every output derived with the default options and the file's values
 * bound.  See LICENSE.
 */
#ifndef GS_TESTJOB_H
#define GS_TESTJOB_H

#include <stdio.h>

#include "analysis/job.h"

/* GS_OK, or the first error code with the messages on stderr. */
static inline int test_job_load(gs_job *j, const char *path)
{
    gs_derive_opts o;
    gs_diag d;
    int rc;
    gs_derive_opts_default(&o);
    gs_diag_init(&d);
    rc = gs_job_load(j, path, &d);
    if (rc == GS_OK)
        rc = gs_job_derive(j, NULL, &o, &d);
    if (rc == GS_OK)
        rc = gs_job_bind(j, NULL, 0, &d);
    gs_diag_print(stderr, &d);
    gs_diag_clear(&d);
    return rc;
}

#endif
