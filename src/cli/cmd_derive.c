/* cmd_derive.c - the `derive` and `eval` commands. See LICENSE. */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "analysis/job.h"
#include "base/mem.h"
#include "numeric/roots.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static const gs_cli_opt derive_spec[] = {
    {"only", 1, 0}, {"limit", 1, 1}, {"format", 1, 0}, {"collect", 1, 0},
    {"out", 1, 0}, {"in", 1, 0},
    {"max-terms", 1, 0}, {"max-memory", 1, 0}, {"method", 1, 0}, {"pivot", 1, 0}, {"stats", 0, 0},
    {"help", 0, 0}, {NULL, 0, 0}
};

static const gs_cli_opt eval_spec[] = {
    {"only", 1, 0}, {"limit", 1, 1}, {"set", 1, 1}, {"at", 1, 1},
    {"out", 1, 0}, {"in", 1, 0},
    {"max-terms", 1, 0}, {"max-memory", 1, 0}, {"help", 0, 0}, {NULL, 0, 0}
};

/* The one FILE argument. */
static int file_arg(const char **path, const gs_cli *cl, const char *cmd,
                    FILE *err)
{
    if (cl->npos != 1) {
        fprintf(err, "gainsmith %s: error: %s\n", cmd,
                cl->npos ? "give one circuit file" : "no circuit file given");
        fprintf(err, "gainsmith %s: hint: usage: gainsmith %s FILE "
                "[options]; 'gainsmith help %s' for more\n", cmd, cmd, cmd);
        return 2;
    }
    *path = cl->pos[0];
    return 0;
}

static int parse_limits(gs_limit **out, const gs_cli *cl, const gs_job *j,
                        const char *cmd, FILE *err)
{
    size_t i, n = gs_cli_count(cl, "limit");
    gs_limit *l = gs_calloc(n ? n : 1, sizeof *l);
    for (i = 0; i < n; i++) {
        const char *t = gs_cli_get(cl, "limit", i), *eq = strchr(t, '=');
        char *name = eq ? gs_strndup(t, (size_t)(eq - t)) : gs_strdup(t);
        int sym = gs_symtab_find(j->c->syms, name);
        if (eq == NULL || (strcmp(eq + 1, "inf") && strcmp(eq + 1, "0"))) {
            fprintf(err, "gainsmith %s: error: --limit '%s' is not "
                    "SYM=inf or SYM=0\n", cmd, t);
            gs_free(name);
            gs_free(l);
            return 2;
        }
        if (sym < 0 || gs_symtab_is_recip(j->c->syms, sym)) {
            fprintf(err, "gainsmith %s: error: --limit: the circuit has no "
                    "symbol '%s'\n", cmd, name);
            gs_free(name);
            gs_free(l);
            return 2;
        }
        l[i].sym = sym;
        l[i].to_inf = strcmp(eq + 1, "inf") == 0;
        gs_free(name);
    }
    *out = l;
    return 0;
}

static int parse_pivot(gs_pivot_rule *rule, const char *text, FILE *err)
{
    if (text == NULL || strcmp(text, "minwork") == 0)
        *rule = GS_PIVOT_MINWORK;
    else if (strcmp(text, "markowitz") == 0)
        *rule = GS_PIVOT_MARKOWITZ;
    else if (strcmp(text, "minterms") == 0)
        *rule = GS_PIVOT_MINTERMS;
    else if (strcmp(text, "natural") == 0)
        *rule = GS_PIVOT_NATURAL;
    else {
        fprintf(err, "gainsmith derive: error: --pivot expects minwork, "
                "markowitz, minterms or natural, got '%s'\n", text);
        return 2;
    }
    return 0;
}

/* --method; --pivot alone implies bareiss, the only method it steers */
static int parse_method(gs_det_method *method, const gs_cli *cl, FILE *err)
{
    const char *text = gs_cli_get(cl, "method", 0);
    if (text == NULL)
        *method = gs_cli_count(cl, "pivot") ? GS_DET_BAREISS : GS_DET_AUTO;
    else if (strcmp(text, "auto") == 0)
        *method = GS_DET_AUTO;
    else if (strcmp(text, "minors") == 0)
        *method = GS_DET_MINORS;
    else if (strcmp(text, "bareiss") == 0)
        *method = GS_DET_BAREISS;
    else {
        fprintf(err, "gainsmith derive: error: --method expects auto, "
                "minors or bareiss, got '%s'\n", text);
        return 2;
    }
    return 0;
}

/* --out EXPR --in SRC: an output given on the command line, named "H"
   (or --only's name), which then is the only one derived. */
static int adhoc_transfer(gs_job *j, const gs_cli *cl, const char *cmd,
                          gs_diag *d, FILE *err, int *status)
{
    const char *out = gs_cli_get(cl, "out", 0), *in = gs_cli_get(cl, "in", 0);
    if (out == NULL && in == NULL)
        return GS_OK;
    if (out == NULL || in == NULL) {
        fprintf(err, "gainsmith %s: error: --out and --in go together\n",
                cmd);
        *status = 2;
        return GS_EINVAL;
    }
    gs_circuit_clear_outputs(j->c);     /* only the command line's */
    return gs_job_add_transfer(j, gs_cli_get(cl, "only", 0)
                                  ? gs_cli_get(cl, "only", 0) : "H",
                               out, in, d);
}

static int numbers_only(const char *cmd)
{
    static const char *const numeric[] = {"eval", "poles", "bode", "step",
                                          "check", "approx"};
    size_t i;
    for (i = 0; i < sizeof numeric / sizeof numeric[0]; i++)
        if (strcmp(cmd, numeric[i]) == 0)
            return 1;
    return 0;
}

int gs_cmd_budget(gs_derive_opts *o, const gs_cli *cl, const char *cmd,
                  FILE *err)
{
    if (gs_cli_has(cl, "max-terms")) {
        if (gs_cli_size(&o->elim.max_terms, gs_cli_get(cl, "max-terms", 0),
                        cmd, "max-terms", err))
            return 2;
        o->terms_given = 1;
    }
    if (gs_cli_has(cl, "max-memory")
        && gs_cli_bytes(&o->elim.max_bytes, gs_cli_get(cl, "max-memory", 0),
                        cmd, "max-memory", err))
        return 2;
    return 0;
}

int gs_cmd_derive_some(gs_job *j, const gs_cli *cl, const char *cmd,
                       int *partial, FILE *err)
{
    int status = gs_cmd_load_and_derive(j, cl, cmd, err);
    *partial = status == 1 && j->partial;
    return *partial ? 0 : status;
}

int gs_cmd_load_and_derive(gs_job *j, const gs_cli *cl, const char *cmd,
                           FILE *err)
{
    gs_derive_opts o;
    gs_limit *limits = NULL;
    const char *path = NULL;
    gs_diag d;
    int rc, status;

    if ((status = file_arg(&path, cl, cmd, err)) != 0)
        return status;
    gs_derive_opts_default(&o);
    if (gs_cmd_budget(&o, cl, cmd, err))
        return 2;
    if (gs_cli_count(cl, "pivot") &&
        parse_pivot(&o.elim.pivot, gs_cli_get(cl, "pivot", 0), err))
        return 2;
    if (parse_method(&o.method, cl, err))
        return 2;
    if (isatty(fileno(err)))
        o.elim.progress = err;
    gs_diag_init(&d);
    d.max_errors = 20;
    rc = gs_job_load(j, path, &d);
    if (rc == GS_OK && (status = parse_limits(&limits, cl, j, cmd, err)))
        rc = GS_EINVAL;
    if (rc == GS_OK)
        rc = adhoc_transfer(j, cl, cmd, &d, err, &status);
    /* The numeric commands can take their numbers from the graph of
       minors when the expansion is over budget, and approx its dominant
       terms; derive and the other symbolic analyses (sens, noise, report)
       need the expanded N and D. */
    j->graph_ok = numbers_only(cmd);
    if (rc == GS_OK) {
        o.limits = limits;
        o.nlimits = gs_cli_count(cl, "limit");
        rc = gs_job_derive(j, gs_cli_get(cl, "only", 0), &o, &d);
    }
    gs_diag_print(err, &d);
    gs_diag_clear(&d);
    gs_free(limits);
    if (status)
        return status;
    return gs_job_exit_status(rc);
}

static int collect_var(int *var, const gs_cli *cl, const gs_job *j,
                       FILE *err)
{
    const char *name = gs_cli_get(cl, "collect", 0);
    *var = j->c->s_sym;
    if (name == NULL)
        return 0;
    *var = gs_symtab_find(j->c->syms, name);
    if (*var < 0) {
        fprintf(err, "gainsmith derive: error: --collect: the circuit has "
                "no symbol '%s'\n", name);
        return 2;
    }
    return 0;
}

static int print_results(const gs_job *j, const char *format, int var,
                         FILE *out, FILE *err)
{
    size_t i;
    static const char *const formats[] = {
        "text", "pretty", "latex", "c", "json", NULL
    };
    int f;
    for (f = 0; formats[f]; f++)
        if (strcmp(format, formats[f]) == 0)
            break;
    if (formats[f] == NULL) {
        fprintf(err, "gainsmith derive: error: unknown format '%s'\n",
                format);
        fprintf(err, "gainsmith derive: hint: formats are text, pretty, "
                "latex, c and json\n");
        return 2;
    }
    if (f == 4)
        fputs("[\n", out);
    for (i = 0; i < j->ntf; i++) {
        switch (f) {
        case 0: gs_print_text(out, &j->tf[i], var); break;
        case 1: gs_print_pretty(out, &j->tf[i], var); break;
        case 2: gs_print_latex(out, &j->tf[i], var); break;
        case 3: gs_print_c(out, &j->tf[i]); break;
        default:
            gs_print_json(out, &j->tf[i], var);
            fputs(i + 1 < j->ntf ? ",\n" : "\n", out);
            break;
        }
        if ((f == 1 || f == 3) && i + 1 < j->ntf)
            fputc('\n', out);
    }
    if (f == 4)
        fputs("]\n", out);
    return 0;
}

/* --stats: how each derivation went, one machine-readable line each */
static void print_stats(const gs_job *j, FILE *err)
{
    size_t i;
    for (i = 0; i < j->ntf; i++) {
        const gs_derive_stats *st = &j->stats[i];
        int minors = st->method == GS_DET_MINORS;
        fprintf(err, "stats %s terms_N=%zu terms_D=%zu unknowns=%d "
                "method=%s minors=%zu products=%zu max_entry_terms=%zu "
                "big_divisions=%zu gcd_terms=%zu\n",
                j->tf[i].name, j->tf[i].num.length, j->tf[i].den.length,
                st->unknowns, minors ? "minors" : "bareiss",
                minors ? st->minors.minors : 0,
                minors ? st->minors.products : 0,
                minors ? st->minors.max_minor_terms
                       : st->elim.max_entry_terms,
                st->elim.big_divisions, st->gcd_terms);
        if (st->graph_nodes)
            fprintf(err, "graph %s nodes=%zu edges=%zu paths_N=%.17g "
                    "paths_D=%.17g\n", j->tf[i].name, st->graph_nodes,
                    st->graph_edges, st->graph_paths_n, st->graph_paths_d);
    }
}

int gs_cmd_derive(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    int status, var = 0, partial;
    const char *format;

    gs_job_init(&j);
    status = gs_cli_parse(&cl, argc, argv, derive_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("derive"), out);
    } else if (status == 0) {
        format = gs_cli_get(&cl, "format", 0);
        /* outputs left out for an infinite limit: the others are printed,
           and the status stays 1 */
        status = gs_cmd_derive_some(&j, &cl, "derive", &partial, err);
        if (status == 0)
            status = collect_var(&var, &cl, &j, err);
        if (status == 0)
            status = print_results(&j, format ? format : "text", var, out,
                                   err);
        if (status == 0 && gs_cli_has(&cl, "stats"))
            print_stats(&j, err);
        if (status == 0 && partial)
            status = 1;
    }
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}

static void print_coeffs(FILE *out, const char *label, const long double *c,
                         int deg)
{
    int k;
    fprintf(out, "  %-12s", label);
    for (k = deg; k >= 0; k--)
        fprintf(out, "  s^%d: %.10Lg", k, c[k]);
    if (deg < 0)
        fputs("  0", out);
    fputc('\n', out);
}

static void print_point(FILE *out, const char *label, long double complex h,
                        const gs_unit_info *u)
{
    long double mag = cabsl(h);
    fprintf(out, "  %-12s  %.10Lg", label, creall(h));
    if (cimagl(h) != 0)
        fprintf(out, " %c %.10Lgj", cimagl(h) < 0 ? '-' : '+',
                fabsl(cimagl(h)));
    if (mag > 0 && u->is_gain)
        fprintf(out, "   |H| %.10Lg = %.4Lf dB   phase %.3Lf deg", mag,
                20 * log10l(mag), cargl(h) * 180 / acosl(-1));
    else if (mag > 0)   /* in the output's own unit, dB relative to 1 of it */
        fprintf(out, "   |H| %.10Lg %s = %.4Lf %s   phase %.3Lf deg", mag,
                u->unit, 20 * log10l(mag), u->db,
                cargl(h) * 180 / acosl(-1));
    fputc('\n', out);
}

/* The degree of c[0..deg] once zero leading coefficients are dropped;
   -1 for the zero polynomial. */
static int trim_zeros(const long double *c, int deg)
{
    while (deg >= 0 && c[deg] == 0)
        deg--;
    return deg;
}

/* H at s -> 0: the ratio of the lowest nonzero coefficients, 0 when N
   vanishes to a higher order than D, infinite when D does. */
static void print_dc(FILE *out, const long double *cn, int dn,
                     const long double *cd, int dd, const gs_unit_info *u)
{
    int ln = 0, ld = 0;
    while (ld <= dd && cd[ld] == 0)
        ld++;
    while (ln <= dn && cn[ln] == 0)
        ln++;
    if (dn < 0 || ln > ld)
        print_point(out, "DC", 0, u);
    else if (ln == ld)
        print_point(out, "DC", cn[ln] / cd[ld], u);
    else
        fprintf(out, "  %-12s  infinite (pole at s = 0)\n", "DC");
}

static int eval_one(const gs_job *j, size_t i, const gs_cli *cl, FILE *out,
                    FILE *err)
{
    const gs_tf *tf = &j->tf[i];
    int dn, dd;
    long double *cn = gs_job_coeffs(j, &tf->num, &dn);
    long double *cd = gs_job_coeffs(j, &tf->den, &dd);
    size_t k;
    int status = 0;
    gs_unit_info u;

    gs_job_unit(&u, j, i);
    dd = trim_zeros(cd, dd);
    dn = trim_zeros(cn, dn);
    if (dd < 0) {
        /* One behaviour for every numeric command: an error, never a
           number.  0/0 is not "infinite": say which it is. */
        fprintf(err, "gainsmith eval: error: %s: the denominator is zero "
                "with these values%s\n", tf->name,
                dn < 0 ? " and so is the numerator (0/0: the values leave "
                         "the result undetermined)" : "");
        fprintf(err, "gainsmith eval: hint: check the value lines and "
                "--set for values that cancel (R2 = -R1, a zero R)\n");
        gs_free(cn);
        gs_free(cd);
        return 1;
    }
    fprintf(out, "%s\n", tf->name);
    print_dc(out, cn, dn, cd, dd, &u);
    for (k = 0; k < gs_cli_count(cl, "at") && status == 0; k++) {
        long double f;
        char label[64];
        status = gs_cli_real(&f, gs_cli_get(cl, "at", k), "Hz", "eval",
                             "at", err);
        if (status == 0) {
            long double complex s = 2 * acosl(-1) * f * I;
            long double complex ds = gs_roots_horner(cd, dd, s);
            long double complex h = gs_roots_horner(cn, dn, s) / ds;
            snprintf(label, sizeof label, "at %.6Lg Hz", f);
            if (ds == 0 || !isfinite(creall(h)) || !isfinite(cimagl(h)))
                fprintf(out, "  %-12s  infinite (a pole on the jw axis "
                        "at this frequency)\n", label);
            else
                print_point(out, label, h, &u);
        }
    }
    print_coeffs(out, "numerator", cn, dn);
    print_coeffs(out, "denominator", cd, dd);
    gs_free(cn);
    gs_free(cd);
    return status;
}

/* The numbers the outputs use, with where they came from when not from
   a value line. */
static void print_values(FILE *out, const gs_job *j)
{
    int nv = j->ctx->nvars, v;
    unsigned char *used = gs_job_used_symbols(j);
    fputs("values\n", out);
    for (v = 0; v < nv; v++) {
        if (!used[v] || v == j->c->s_sym)
            continue;
        fprintf(out, "  %-12s  %.10Lg", gs_symtab_name(j->c->syms, v),
                j->vals[v]);
        if (j->origin[v])
            fprintf(out, "  (%s)", j->origin[v]);
        fputc('\n', out);
    }
    gs_free(used);
}

int gs_cmd_bind(gs_job *j, const gs_cli *cl, FILE *err)
{
    size_t i, nset = gs_cli_count(cl, "set");
    char **sets = gs_malloc((nset ? nset : 1) * sizeof *sets);
    gs_diag d;
    int rc;
    for (i = 0; i < nset; i++)
        sets[i] = (char *)gs_cli_get(cl, "set", i);
    gs_diag_init(&d);
    rc = gs_job_bind(j, sets, nset, &d);
    gs_diag_print(err, &d);
    gs_diag_clear(&d);
    gs_free(sets);
    return gs_job_exit_status(rc);
}

int gs_cmd_eval(int argc, char **argv, FILE *out, FILE *err)
{
    gs_cli cl;
    gs_job j;
    size_t i;
    int status, partial;

    gs_job_init(&j);
    status = gs_cli_parse(&cl, argc, argv, eval_spec, err);
    if (status == 0 && gs_cli_has(&cl, "help")) {
        fputs(gs_cmd_help_text("eval"), out);
    } else if (status == 0) {
        status = gs_cmd_derive_some(&j, &cl, "eval", &partial, err);
        if (status == 0)
            status = gs_cmd_bind(&j, &cl, err);
        if (status == 0)
            print_values(out, &j);
        for (i = 0; status == 0 && i < j.ntf; i++)
            status = eval_one(&j, i, &cl, out, err);
        if (status == 0 && partial)
            status = 1;
    }
    gs_cli_clear(&cl);
    gs_job_clear(&j);
    return status;
}
