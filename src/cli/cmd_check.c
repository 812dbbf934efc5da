/* cmd_check.c - the `check` command: exact expression vs numeric solve.
 * See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "base/mem.h"
#include "analysis/refcheck.h"

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

/* The inconclusive points printed one by one before "and N more". */
#define SHOW_INCONCLUSIVE 3

/* Words of the trade for a reference that could not be computed at f. */
static void reference_failed(const gs_job *j, size_t i, int rc,
                             const gs_numexact_why *why, long double f,
                             const int *generic, size_t ngeneric,
                             gs_diag *d)
{
    const gs_circuit *c = j->c;
    const gs_output *o = &c->outputs[j->out_index[i]];
    char hint[400] = "";
    size_t k, len = 0;
    if (rc == GS_EDIVZERO && why->zero_elem >= 0) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, o->line, o->col,
                    "to check near the short, give it a small nonzero "
                    "value with --set",
                    "%s: the value %s = 0 makes the %s of %s %s infinite, "
                    "which the numeric solve cannot stamp", o->name,
                    why->zero_sym >= 0
                        ? gs_symtab_name(c->syms, why->zero_sym) : "its value",
                    c->elems[why->zero_elem].kind == GS_RESISTOR
                        ? "conductance" : "value",
                    gs_elem_kind_name(c->elems[why->zero_elem].kind),
                    c->elems[why->zero_elem].name);
        return;
    }
    if (rc != GS_ESINGULAR && rc != GS_EDIVZERO && rc != GS_ERANGE) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, o->line, o->col, NULL,
                    "%s: the numeric solve cannot compute this output (%s)",
                    o->name, gs_strerror(rc));
        return;
    }
    if (rc == GS_ERANGE) {
        gs_diag_add(d, GS_SEV_ERROR, c->file, o->line, o->col, NULL,
                    "%s: a value is not a finite number, so the numeric "
                    "solve cannot run", o->name);
        return;
    }
    len = (size_t)snprintf(hint, sizeof hint, "with these values the MNA "
                           "matrix is singular: look for values that "
                           "cancel (such as R2 = -R1)");
    for (k = 0; k < ngeneric && len < sizeof hint - 80; k++)
        len += (size_t)snprintf(hint + len, sizeof hint - len,
                                "%s %s had no value and got %.3Lg",
                                k ? "," : ";",
                                gs_symtab_name(c->syms, generic[k]),
                                j->vals[generic[k]]);
    gs_diag_add(d, GS_SEV_ERROR, c->file, o->line, o->col, hint,
                "%s: the circuit's equations have no unique solution at "
                "%.6Lg Hz", o->name, f);
}

/* The verdicts over the sweep, for output i: printed, and GS_OK (every
   point agrees, or agrees or is inconclusive), GS_ERANGE (a mismatch, or
   no point conclusive) or the reference's failure. */
static int check_one(const gs_job *j, size_t i, const check_opts *o,
                     const int *generic, size_t ngeneric, FILE *out,
                     gs_diag *d)
{
    const gs_tf *tf = &j->tf[i];
    gs_refcheck r;
    gs_refcheck_point p;
    gs_numexact_why why;
    long double worst = 0, worst_f = o->from;
    long double *incf = gs_malloc((o->points + 1) * sizeof *incf);
    long double *incb = gs_malloc((o->points + 1) * sizeof *incb);
    long double *ince = gs_malloc((o->points + 1) * sizeof *ince);
    size_t k, nagree = 0, ninc = 0, nmis = 0;
    int rc = GS_OK;
    gs_refcheck_init(&r, j, i);
    for (k = 0; k < o->points && rc == GS_OK; k++) {
        long double f = o->points == 1 ? o->from
            : o->from * powl(o->to / o->from, (long double)k
                                              / (long double)(o->points - 1));
        rc = gs_refcheck_at(&p, &r, f, o->tol, &why);
        if (rc != GS_OK) {
            reference_failed(j, i, rc, &why, f, generic, ngeneric, d);
            break;
        }
        if (p.verdict == GS_RC_INCONCLUSIVE) {
            incf[ninc] = f;
            ince[ninc] = p.err;
            incb[ninc++] = p.bound;
            continue;
        }
        if (p.verdict == GS_RC_AGREE)
            nagree++;
        else
            nmis++;
        if (!(p.err <= worst)) {    /* also catches NaN */
            worst = p.err;
            worst_f = f;
        }
    }
    gs_refcheck_clear(&r);
    if (rc == GS_OK && nagree + nmis == 0)
        fprintf(out, "%s: inconclusive at all %zu points (%.6Lg Hz to "
                "%.6Lg Hz): long double cannot resolve the value there\n",
                tf->name, o->points, o->from, o->to);
    else if (rc == GS_OK) {
        fprintf(out, "%s: worst relative error %.3Lg at %.6Lg Hz over ",
                tf->name, worst, worst_f);
        if (ninc)
            fprintf(out, "%zu of ", nagree + nmis);
        fprintf(out, "%zu points (%.6Lg Hz to %.6Lg Hz): %s\n", o->points,
                o->from, o->to, nmis ? "MISMATCH" : "ok");
    }
    for (k = 0; rc == GS_OK && k < ninc && k < SHOW_INCONCLUSIVE
                && nagree + nmis; k++)
        fprintf(out, "%s: inconclusive at %.6Lg Hz: relative error %.3Lg, "
                "within the %.3Lg that rounding in long double can account "
                "for there\n", tf->name, incf[k], ince[k], incb[k]);
    if (rc == GS_OK && ninc > SHOW_INCONCLUSIVE && nagree + nmis)
        fprintf(out, "%s: inconclusive at %zu more points\n", tf->name,
                ninc - SHOW_INCONCLUSIVE);
    gs_free(incf);
    gs_free(incb);
    gs_free(ince);
    if (rc != GS_OK)
        return rc;
    return nmis || nagree == 0 ? GS_ERANGE : GS_OK;
}

/* Notes for the symbols that got a generic value. */
static void note_generic(const gs_job *j, const int *syms, size_t n,
                         gs_diag *d)
{
    size_t k, e;
    for (k = 0; k < n; k++) {
        const gs_element *at = NULL;
        int i;
        for (e = 0; e < j->c->nelems && !at; e++)
            for (i = 0; i < j->c->elems[e].value.n; i++)
                if (j->c->elems[e].value.sym[i] == syms[k])
                    at = &j->c->elems[e];
        gs_diag_add(d, GS_SEV_NOTE, j->c->file, at ? at->line : 0,
                    at ? at->col : 0, NULL,
                    "no value for %s, which cancels out of the outputs "
                    "checked: the numeric solve gives it the generic value "
                    "%.3Lg",
                    gs_symtab_name(j->c->syms, syms[k]), j->vals[syms[k]]);
    }
}

int gs_cmd_check(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    gs_diag d;
    check_opts o;
    size_t i, ngeneric = 0;
    int *generic = NULL;
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
    ngeneric = gs_refcheck_generic_values(&j, &generic);
    note_generic(&j, generic, ngeneric, &d);
    for (i = 0; rc == GS_OK && i < j.ntf; i++) {
        int r = check_one(&j, i, &o, generic, ngeneric, out, &d);
        if (r == GS_ERANGE)
            worst_rc = r;
        else if (r != GS_OK)
            rc = r;
    }
    gs_diag_print(err, &d);
    /* a reference that cannot be computed is a failed analysis */
    status = rc != GS_OK || worst_rc != GS_OK;
done:
    gs_free(generic);
    gs_diag_clear(&d);
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
