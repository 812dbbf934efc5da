/* cmd_check.c - the `check` command: exact expression vs numeric solve.
 * See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "base/mem.h"
#include "numeric/numsolve.h"
#include "numeric/roots.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static const gs_cli_opt check_spec[] = {
    {"set", 1, 1}, {"tol", 1, 0}, {"from", 1, 0}, {"to", 1, 0},
    {"points", 1, 0}, {"only", 1, 0}, {"max-terms", 1, 0}, {"max-memory", 1, 0}, {"help", 0, 0},
    {NULL, 0, 0}
};

typedef struct check_opts {
    long double tol, from, to;
    size_t points;
} check_opts;

static int parse_check_opts(check_opts *o, const gs_cli *cl, FILE *err)
{
    const char *t;
    o->tol = 1e-9L;
    o->from = 1e-2L;
    o->to = 1e10L;
    o->points = 61;
    if ((t = gs_cli_get(cl, "tol", 0))
        && gs_cli_real(&o->tol, t, NULL, "check", "tol", err))
        return 2;
    if ((t = gs_cli_get(cl, "from", 0))
        && gs_cli_real(&o->from, t, "Hz", "check", "from", err))
        return 2;
    if ((t = gs_cli_get(cl, "to", 0))
        && gs_cli_real(&o->to, t, "Hz", "check", "to", err))
        return 2;
    if ((t = gs_cli_get(cl, "points", 0))
        && gs_cli_size(&o->points, t, "check", "points", err))
        return 2;
    if (o->points > 100000) {      /* each point is a full numeric solve */
        fprintf(err, "gainsmith check: error: --points takes at most "
                "100000, got %zu\n", o->points);
        return 2;
    }
    if (o->from <= 0 || o->to < o->from || o->points < 1 || o->tol <= 0) {
        fprintf(err, "gainsmith check: error: need 0 < --from <= --to, "
                "--points >= 1 and --tol > 0\n");
        return 2;
    }
    return 0;
}

/* Worst relative disagreement over the sweep, for output i. */
static int check_one(const gs_job *j, size_t i, const check_opts *o,
                     FILE *out, gs_diag *d)
{
    const gs_tf *tf = &j->tf[i];
    int dn, dd, rc = GS_OK;
    long double *cn = gs_job_coeffs(j, &tf->num, &dn);
    long double *cd = gs_job_coeffs(j, &tf->den, &dd);
    long double worst = 0, worst_f = o->from, pi2 = 2 * acosl(-1);
    size_t k;
    for (k = 0; k < o->points && rc == GS_OK; k++) {
        long double f = o->points == 1 ? o->from
            : o->from * powl(o->to / o->from, (long double)k
                                              / (long double)(o->points - 1));
        long double complex s = pi2 * f * I, hs, hn;
        long double err;
        hs = gs_roots_horner(cn, dn, s) / gs_roots_horner(cd, dd, s);
        rc = gs_numsolve(&hn, j->c, j->out_index[i], j->vals, s, d);
        if (rc != GS_OK)
            break;
        err = cabsl(hs - hn) / (cabsl(hn) > 1e-300L ? cabsl(hn) : 1);
        if (!(err <= worst)) {      /* also catches NaN */
            worst = err;
            worst_f = f;
        }
    }
    if (rc == GS_OK)
        fprintf(out, "%s: worst relative error %.3Lg at %.6Lg Hz over %zu "
                "points (%.6Lg Hz to %.6Lg Hz): %s\n", tf->name, worst,
                worst_f, o->points, o->from, o->to,
                worst <= o->tol ? "ok" : "MISMATCH");
    free(cn);
    free(cd);
    if (rc != GS_OK)
        return rc;
    return worst <= o->tol ? GS_OK : GS_ERANGE;
}

int gs_cmd_check(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    gs_diag d;
    check_opts o;
    size_t i;
    int status, rc = GS_OK, worst_rc = GS_OK;

    gs_job_init(&j);
    gs_diag_init(&d);
    status = gs_cli_parse(&cl, argc, argv, check_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("check"), out);
        goto done;
    }
    if (status == 0)
        status = parse_check_opts(&o, &cl, err);
    if (status == 0)
        status = gs_cmd_load_and_derive(&j, &cl, "check", err);
    if (status != 0)
        goto done;
    status = gs_cmd_bind(&j, &cl, err);
    if (status != 0)
        goto done;
    for (i = 0; rc == GS_OK && i < j.ntf; i++) {
        int r = check_one(&j, i, &o, out, &d);
        if (r == GS_ESINGULAR)
            rc = r;
        else if (r != GS_OK)
            worst_rc = r;
    }
    gs_diag_print(err, &d);
    status = rc != GS_OK ? gs_job_exit_status(rc) : worst_rc != GS_OK;
done:
    gs_diag_clear(&d);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
