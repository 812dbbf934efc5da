/* cli.c - command-line options of the subcommands. See LICENSE. */
#include "cli/cli.h"
#include "base/diag.h"
#include "base/mem.h"
#include "algebra/rat.h"

#include <errno.h>
#include <stdint.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

static int find_opt(const gs_cli *cl, const char *name, size_t len)
{
    size_t i;
    for (i = 0; i < cl->nspec; i++)
        if (strlen(cl->spec[i].name) == len
            && strncmp(cl->spec[i].name, name, len) == 0)
            return (int)i;
    return -1;
}

static void unknown_option(const gs_cli *cl, const char *cmd,
                           const char *arg, size_t len, FILE *err)
{
    const char **names = gs_malloc((cl->nspec + 1) * sizeof *names);
    char *word = gs_strndup(arg, len);
    const char *best;
    size_t i;
    for (i = 0; i < cl->nspec; i++)
        names[i] = cl->spec[i].name;
    names[cl->nspec] = NULL;
    best = gs_closest_word(word, names);
    fprintf(err, "gainsmith %s: error: unknown option '--%s'\n", cmd, word);
    if (best)
        fprintf(err, "gainsmith %s: hint: did you mean '--%s'?\n", cmd,
                best);
    else
        fprintf(err, "gainsmith %s: hint: 'gainsmith help %s' lists the "
                "options\n", cmd, cmd);
    gs_free(word);
    gs_free(names);
}

static void add_value(gs_cli *cl, int k, char *val)
{
    cl->vals[k] = gs_reallocarray(cl->vals[k], cl->count[k] + 1,
                                  sizeof *cl->vals[k]);
    cl->vals[k][cl->count[k]++] = val;
}

static int parse_option(gs_cli *cl, int *i, int argc, char **argv,
                        FILE *err)
{
    const char *cmd = argv[0], *arg = argv[*i] + 2;
    const char *eq = strchr(arg, '=');
    size_t len = eq ? (size_t)(eq - arg) : strlen(arg);
    int k = find_opt(cl, arg, len);
    if (k < 0) {
        unknown_option(cl, cmd, arg, len, err);
        return 2;
    }
    if (cl->count[k] > 0 && !cl->spec[k].repeatable) {
        fprintf(err, "gainsmith %s: error: option '--%s' given twice\n",
                cmd, cl->spec[k].name);
        return 2;
    }
    if (!cl->spec[k].has_arg) {
        if (eq) {
            fprintf(err, "gainsmith %s: error: option '--%s' takes no "
                    "value\n", cmd, cl->spec[k].name);
            return 2;
        }
        add_value(cl, k, argv[*i] + strlen(argv[*i]));
        return 0;
    }
    if (eq) {
        add_value(cl, k, (char *)eq + 1);
        return 0;
    }
    if (*i + 1 >= argc) {
        fprintf(err, "gainsmith %s: error: option '--%s' needs a value\n",
                cmd, cl->spec[k].name);
        return 2;
    }
    add_value(cl, k, argv[++*i]);
    return 0;
}

int gs_cli_parse(gs_cli *cl, int argc, char **argv, const gs_cli_opt *spec,
                 FILE *err)
{
    int i, only_pos = 0;
    size_t n = 0;
    while (spec[n].name)
        n++;
    cl->spec = spec;
    cl->nspec = n;
    cl->npos = 0;
    cl->pos = gs_malloc(((size_t)argc + 1) * sizeof *cl->pos);
    cl->count = gs_calloc(n + 1, sizeof *cl->count);
    cl->vals = gs_calloc(n + 1, sizeof *cl->vals);
    for (i = 1; i < argc; i++) {
        if (!only_pos && strcmp(argv[i], "--") == 0) {
            only_pos = 1;
        } else if (!only_pos && strncmp(argv[i], "--", 2) == 0) {
            if (parse_option(cl, &i, argc, argv, err) != 0)
                return 2;
        } else if (!only_pos && argv[i][0] == '-' && argv[i][1] != '\0') {
            fprintf(err, "gainsmith %s: error: unknown option '%s'\n",
                    argv[0], argv[i]);
            fprintf(err, "gainsmith %s: hint: options are long, as in "
                    "'--format'\n", argv[0]);
            return 2;
        } else {
            cl->pos[cl->npos++] = argv[i];
        }
    }
    return 0;
}

void gs_cli_clear(gs_cli *cl)
{
    size_t i;
    for (i = 0; i < cl->nspec; i++)
        gs_free(cl->vals[i]);
    gs_free(cl->vals);
    gs_free(cl->count);
    gs_free(cl->pos);
    memset(cl, 0, sizeof *cl);
}

size_t gs_cli_count(const gs_cli *cl, const char *name)
{
    int k = find_opt(cl, name, strlen(name));
    return k < 0 ? 0 : cl->count[k];
}

const char *gs_cli_get(const gs_cli *cl, const char *name, size_t i)
{
    int k = find_opt(cl, name, strlen(name));
    if (k < 0 || i >= cl->count[k])
        return NULL;
    return cl->vals[k][i];
}

int gs_cli_has(const gs_cli *cl, const char *name)
{
    return gs_cli_count(cl, name) > 0;
}

int gs_cli_size(size_t *out, const char *text, const char *cmd,
                const char *name, FILE *err)
{
    char *end;
    unsigned long long v;
    errno = 0;
    v = strtoull(text, &end, 10);
    if (text[0] == '\0' || text[0] == '-' || *end != '\0' || errno) {
        fprintf(err, "gainsmith %s: error: --%s expects a whole number, "
                "got '%s'\n", cmd, name, text);
        return 2;
    }
    *out = (size_t)v;
    return 0;
}

int gs_cli_bytes(size_t *out, const char *text, const char *cmd,
                 const char *name, FILE *err)
{
    /* decimal prefixes as everywhere else, and the binary ones that
       memory is usually counted in */
    static const struct { const char *suffix; unsigned long long mul; }
    units[] = {
        {"", 1}, {"B", 1}, {"k", 1000ULL}, {"kB", 1000ULL},
        {"M", 1000000ULL}, {"MB", 1000000ULL}, {"G", 1000000000ULL},
        {"GB", 1000000000ULL}, {"T", 1000000000000ULL},
        {"TB", 1000000000000ULL}, {"KiB", 1ULL << 10}, {"MiB", 1ULL << 20},
        {"GiB", 1ULL << 30}, {"TiB", 1ULL << 40}
    };
    char *end;
    unsigned long long v;
    size_t k;
    errno = 0;
    v = strtoull(text, &end, 10);
    if (text[0] >= '0' && text[0] <= '9' && errno == 0) {
        for (k = 0; k < sizeof units / sizeof units[0]; k++) {
            if (strcmp(end, units[k].suffix) != 0)
                continue;
            if (v > (unsigned long long)SIZE_MAX / units[k].mul)
                break;
            *out = (size_t)(v * units[k].mul);
            return 0;
        }
    }
    fprintf(err, "gainsmith %s: error: --%s expects a size in bytes, got "
            "'%s'\n", cmd, name, text);
    fprintf(err, "gainsmith %s: hint: a whole number with an optional unit: "
            "512M, 4G, 2GiB (0: no limit)\n", cmd);
    return 2;
}

int gs_cli_real(long double *out, const char *text, const char *unit,
                const char *cmd, const char *name, FILE *err)
{
    gs_rat r;
    const char *end;
    int rc;
    gs_rat_init(&r);
    rc = gs_rat_parse(&r, text, &end);
    if (rc == GS_OK && unit && strcmp(end, unit) == 0)
        end += strlen(unit);
    if (rc != GS_OK || *end != '\0') {
        fprintf(err, "gainsmith %s: error: --%s expects a number%s%s, got "
                "'%s'\n", cmd, name, unit ? " in " : "", unit ? unit : "",
                text);
        fprintf(err, "gainsmith %s: hint: numbers take SI prefixes, as in "
                "'10k%s'\n", cmd, unit ? unit : "");
        gs_rat_clear(&r);
        return 2;
    }
    *out = gs_rat_get_ld(&r);
    /* The same range the file parser enforces: no inf, no silent 0. */
    if (!isfinite(*out) || (*out == 0 && !gs_rat_is_zero(&r))) {
        fprintf(err, "gainsmith %s: error: --%s: '%s' is out of range "
                "for a long double\n", cmd, name, text);
        fprintf(err, "gainsmith %s: hint: magnitudes from about 1e-4950 "
                "to 1e4932 are representable\n", cmd);
        gs_rat_clear(&r);
        return 2;
    }
    gs_rat_clear(&r);
    return 0;
}

/* --tol X (dB, phase 10 X degrees), X/Y (dB/degrees) or P% (a relative
   error P: 20 log10(1 + P) dB, asin(P) degrees). */
int gs_cli_tol(long double *tol_db, long double *tol_deg, const char *t,
               const char *cmd, FILE *err)
{
    char *end;
    long double a = strtold(t, &end), b;
    if (end != t && a >= 0 && *end == '%' && end[1] == 0) {
        a /= 100;
        *tol_db = 20 * log10l(1 + a);
        *tol_deg = asinl(a < 1 ? a : 1) * 180
                     / 3.141592653589793238462643383279502884L;
        return 0;
    }
    if (end != t && a >= 0 && *end == 0) {
        *tol_db = a;
        *tol_deg = 10 * a;
        return 0;
    }
    if (end != t && a >= 0 && *end == '/') {
        const char *u = end + 1;
        b = strtold(u, &end);
        if (end != u && b >= 0 && *end == 0) {
            *tol_db = a;
            *tol_deg = b;
            return 0;
        }
    }
    fprintf(err, "gainsmith %s: error: --tol expects DB, DB/DEG or "
            "PERCENT%%, got '%s'\n", cmd, t);
    fprintf(err, "gainsmith %s: hint: e.g. --tol 0.1, --tol 0.1/1 or "
            "--tol 1%%\n", cmd);
    return 2;
}
