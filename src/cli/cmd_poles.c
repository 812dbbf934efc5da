/* cmd_poles.c - the `poles` command: poles, zeros, w0, Q, stability.
 * See LICENSE.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "base/mem.h"
#include "numeric/roots.h"
#include "algebra/sqfree.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static const gs_cli_opt poles_spec[] = {
    {"set", 1, 1}, {"only", 1, 0}, {"format", 1, 0}, {"cancel-tol", 1, 0},
    {"limit", 1, 1}, {"max-terms", 1, 0}, {"max-memory", 1, 0}, {"help", 0, 0}, {NULL, 0, 0}
};

static const char *const stability_word[] = {
    "stable", "marginally stable", "unstable"
};

/* High-frequency behaviour: H ~ hf * s^(degN - degD) as s -> inf. */
static long double hf_gain(const gs_tfn *h, int *order)
{
    *order = h->num_deg - h->den_deg;
    if (h->num_deg < 0)
        return 0;
    return h->num[h->num_deg] / h->den[h->den_deg];
}

/* Print one row: the root r, its multiplicity, residual and a note. */
static void print_root_row(FILE *out, long double complex r, int mult,
                           long double res, const char *note)
{
    gs_pz_info pz;
    gs_pz_describe(&pz, r);
    fprintf(out, "    %-14.6Lg %-14.6Lg %-12.6Lg ", creall(r), cimagl(r),
            pz.f0);
    if (pz.kind == GS_PZ_COMPLEX)
        fprintf(out, "%-10.4Lg %-10.4Lg ", pz.q, pz.zeta);
    else
        fprintf(out, "%-10s %-10s ", "-", "-");
    fprintf(out, "%4d %9.2Lg%s%s\n", mult, res,
            pz.rhp ? "  right half plane" : "", note);
}

/* The roots, a cluster that gs_roots_mult found to be one root of
   multiplicity m printed once, at the mean of its m members (the mean of
   a cluster is far more accurate than any member: the errors of the
   members of an m-fold root spread on a circle about it).  exact_deg
   (NULL when unknown) holds the degrees of the squarefree factorisation
   of the exact polynomial: a cluster of m is confirmed when the exact
   polynomial has a factor of multiplicity m. */
static void print_root_rows(FILE *out, const char *what,
                            const long double complex *r, int n,
                            const int *mult, const long double *res,
                            const long *exact_deg, int maxm)
{
    int i, k;
    unsigned char *used;
    if (n == 0) {
        fprintf(out, "  %s: none\n", what);
        return;
    }
    used = gs_calloc((size_t)n, 1);
    fprintf(out, "  %s:\n", what);
    /* the root r = re + j im in rad/s, its natural frequency |r|/2pi in
       Hz: each column says its unit */
    fprintf(out, "    %-14s %-14s %-12s %-10s %-10s %4s %9s\n",
            "re (rad/s)", "im (rad/s)", "|r|/2pi (Hz)", "Q", "zeta", "mult",
            "residual");
    for (i = 0; i < n; i++) {
        int m = mult[i], got = 1;
        long double complex sum = r[i];
        long double worst = res[i];
        const char *note = "";
        if (used[i])
            continue;
        used[i] = 1;
        /* the m - 1 nearest roots of the same cluster size */
        while (got < m) {
            int best = -1;
            for (k = 0; k < n; k++)
                if (!used[k] && mult[k] == m
                    && (best < 0
                        || cabsl(r[k] - r[i]) < cabsl(r[best] - r[i])))
                    best = k;
            if (best < 0)
                break;
            used[best] = 1;
            sum += r[best];
            if (res[best] > worst)
                worst = res[best];
            got++;
        }
        if (got > 1 && exact_deg != NULL)
            note = exact_deg[got < maxm ? got : maxm] > 0
                   ? "  exact multiple root"
                   : "  numeric cluster (no repeated factor)";
        print_root_row(out, sum / got, got, worst, note);
    }
    gs_free(used);
}

enum { MAX_MULT = 32 };

/* The squarefree factorisation of p in s into deg (GS_OK), when any root
   is in a cluster and p is small enough for the gcds to be cheap. */
static const long *exact_degrees(long *deg, const gs_poly *p,
                                 const int *mult, int n, const gs_tf *tf)
{
    int i, any = 0;
    for (i = 0; i < n; i++)
        any |= mult[i] > 1;
    if (!any || p->length > 2000)
        return NULL;
    return gs_poly_sqfree_degrees(deg, MAX_MULT, p, tf->s_var, 20000,
                                  tf->ctx) == GS_OK ? deg : NULL;
}

static void print_text(FILE *out, const char *name, const gs_tfn *h,
                       long double tol, const gs_unit_info *u,
                       const gs_tf *tf)
{
    long dnum[MAX_MULT + 1], dden[MAX_MULT + 1];
    const long *en = exact_degrees(dnum, &tf->num, h->zero_mult, h->nzeros,
                                   tf);
    const long *ed = exact_degrees(dden, &tf->den, h->pole_mult, h->npoles,
                                   tf);
    gs_pz_pair pairs[16];
    int order, i, n;
    long double hf = hf_gain(h, &order), dc = gs_tfn_dc_gain(h);
    fprintf(out, "%s: %d pole%s, %d zero%s, %s\n", name, h->npoles,
            h->npoles == 1 ? "" : "s", h->nzeros, h->nzeros == 1 ? "" : "s",
            stability_word[gs_tfn_stability(h)]);
    if (u->is_gain) {
        fprintf(out, "  DC gain      %.10Lg", dc);
        if (isfinite(dc) && dc != 0)
            fprintf(out, " (%.4Lf dB)", 20 * log10l(fabsl(dc)));
        fprintf(out, "\n  HF gain      %.10Lg", hf);
        if (order != 0)
            fprintf(out, " * s^%d", order);
        fputc('\n', out);
    } else {
        /* an impedance (or a trans-ratio) has a value in its unit, no
           gain: |Z| in dB is relative to 1 ohm */
        fprintf(out, "  DC value     %.10Lg %s", dc, u->unit);
        if (isfinite(dc) && dc != 0)
            fprintf(out, " (%.4Lf %s)", 20 * log10l(fabsl(dc)), u->db);
        fprintf(out, "\n  HF value     %.10Lg %s", hf, u->unit);
        if (order != 0)
            fprintf(out, " * s^%d", order);
        fputc('\n', out);
    }
    print_root_rows(out, "poles", h->poles, h->npoles, h->pole_mult,
                    h->pole_res, ed, MAX_MULT);
    print_root_rows(out, "zeros", h->zeros, h->nzeros, h->zero_mult,
                    h->zero_res, en, MAX_MULT);
    n = gs_pz_cancellations(pairs, 16, h, tol);
    for (i = 0; i < n && i < 16; i++)
        fprintf(out, "  near-cancellation: pole %d and zero %d, relative "
                "distance %.3Lg\n", pairs[i].pole + 1, pairs[i].zero + 1,
                pairs[i].rel_dist);
}

static void json_roots(FILE *out, const char *key,
                       const long double complex *r, int n, const int *mult,
                       const long double *res)
{
    int i;
    fprintf(out, "  \"%s\": [", key);
    for (i = 0; i < n; i++) {
        gs_pz_info pz;
        gs_pz_describe(&pz, r[i]);
        fprintf(out, "%s\n    {\"re\": %.17Lg, \"im\": %.17Lg, "
                "\"w0\": %.17Lg, \"f0_hz\": %.17Lg, ", i ? "," : "",
                creall(r[i]), cimagl(r[i]), pz.w0, pz.f0);
        if (pz.kind == GS_PZ_COMPLEX && isfinite(pz.q))
            fprintf(out, "\"q\": %.17Lg, \"zeta\": %.17Lg, ", pz.q, pz.zeta);
        fprintf(out, "\"rhp\": %s, \"multiplicity\": %d, "
                "\"residual\": %.3Lg}", pz.rhp ? "true" : "false", mult[i],
                res[i]);
    }
    fprintf(out, "%s]", n ? "\n  " : "");
}

static void json_number(FILE *out, long double v)
{
    if (isfinite(v))
        fprintf(out, "%.17Lg", v);
    else
        fputs("null", out);
}

static void print_json(FILE *out, const char *name, const gs_tfn *h)
{
    int order;
    long double hf = hf_gain(h, &order);
    fprintf(out, "{\n  \"name\": \"%s\",\n  \"stability\": \"%s\",\n"
            "  \"dc_gain\": ", name, stability_word[gs_tfn_stability(h)]);
    json_number(out, gs_tfn_dc_gain(h));
    fputs(",\n  \"hf_gain\": ", out);
    json_number(out, hf);
    fprintf(out, ",\n  \"hf_order\": %d,\n", order);
    json_roots(out, "poles", h->poles, h->npoles, h->pole_mult, h->pole_res);
    fputs(",\n", out);
    json_roots(out, "zeros", h->zeros, h->nzeros, h->zero_mult, h->zero_res);
    fputs("\n}", out);
}

static int poles_one(const gs_job *j, size_t i, int json, long double tol,
                     FILE *out, FILE *err)
{
    int dn, dd, rc;
    long double *cn = gs_job_coeffs(j, &j->tf[i].num, &dn);
    long double *cd = gs_job_coeffs(j, &j->tf[i].den, &dd);
    gs_tfn h;
    rc = gs_tfn_init(&h, cn, dn, cd, dd);
    if (rc == GS_EINVAL) {
        fprintf(err, "gainsmith poles: error: %s: the denominator is zero "
                "or not finite with these values\n", j->tf[i].name);
    } else {
        if (rc == GS_ERANGE)
            fprintf(err, "gainsmith poles: warning: %s: the root search did "
                    "not converge; the roots shown are the best found\n",
                    j->tf[i].name);
        gs_unit_info u;
        gs_job_unit(&u, j, i);
        if (json)
            print_json(out, j->tf[i].name, &h);
        else
            print_text(out, j->tf[i].name, &h, tol, &u, &j->tf[i]);
    }
    gs_tfn_clear(&h);
    gs_free(cn);
    gs_free(cd);
    return rc == GS_EINVAL ? 1 : 0;
}

int gs_cmd_poles(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    size_t i;
    long double tol = 1e-3L;
    int status, json = 0, partial = 0;
    const char *fmt, *t;

    gs_job_init(&j);
    status = gs_cli_parse(&cl, argc, argv, poles_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("poles"), out);
        goto done;
    }
    fmt = status == 0 ? gs_cli_get(&cl, "format", 0) : NULL;
    if (fmt && strcmp(fmt, "json") && strcmp(fmt, "text")) {
        fprintf(err, "gainsmith poles: error: --format expects text or json"
                ", got '%s'\n", fmt);
        status = 2;
    }
    json = fmt && strcmp(fmt, "json") == 0;
    if (status == 0 && (t = gs_cli_get(&cl, "cancel-tol", 0)))
        status = gs_cli_real(&tol, t, NULL, "poles", "cancel-tol", err);
    if (status == 0)
        status = gs_cmd_derive_some(&j, &cl, "poles", &partial, err);
    if (status == 0)
        status = gs_cmd_bind(&j, &cl, err);
    if (json && status == 0)
        fputs("[\n", out);
    for (i = 0; status == 0 && i < j.ntf; i++) {
        status = poles_one(&j, i, json, tol, out, err);
        if (json)
            fputs(i + 1 < j.ntf ? ",\n" : "\n", out);
    }
    if (json && status == 0)
        fputs("]\n", out);
    if (status == 0 && partial)
        status = 1;
done:
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
