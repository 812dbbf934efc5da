/* cmd_extract.c - the `extract` command: device figures to model
 * parameters. See LICENSE.
 *
 * `gainsmith extract mos|bjt --KEY=VAL...` reads a few figures of an
 * operating point, solves the first-order model's equations for its
 * parameters (device.h, docs/devices.md), shows the equations used and
 * the values, and for a MOSFET carries them to another operating point.
 */
#include "cli/cli.h"
#include "cli/cmd.h"
#include "circuit/device.h"
#include "gainsmith.h"
#include "base/mem.h"
#include "circuit/units.h"
#include "output/json.h"

#include <math.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>

/* A figure formatted for a message (units.h). */
static gs_numtext fmt(long double v, gs_quantity q)
{
    return gs_units_text(v, q);
}

#define WORD (-1)           /* an option whose value is a keyword */

const char gs_cmd_extract_help_text[] =
"usage: gainsmith extract mos --id=I --gm=G [--gds=G | --lambda=L] [--vds=V]\n"
"                             [--vth=V | --vgs=V] [CARRY] [COMMON]\n"
"       gainsmith extract mos --id1=I --vgs1=V --id2=I --vgs2=V\n"
"                             [--lambda=L] [--vds=V] [CARRY] [COMMON]\n"
"       gainsmith extract bjt --ic=I [--gm=G] [--temp=T] [--beta=B]\n"
"                             [--ro=R | --va=V] [--vce=V]\n"
"                             [--early=full|plain] [--ft=F [--cmu=C]]\n"
"                             [COMMON]\n"
"CARRY:  --at-id=I --at-vds=V  or  --at-vgs=V --at-vds=V\n"
"COMMON: --type=nmos|pmos (mos), --type=npn|pnp (bjt), --format=text|json\n"
"\n"
"Turns the figures of one operating point (a datasheet, a measurement, a\n"
"hand calculation) into the parameters of a first-order hand-analysis\n"
"model, shows the equations it used, and for a MOSFET carries the model\n"
"to another operating point.\n"
"\n"
"mos, one point in saturation (long-channel square law with\n"
"channel-length modulation; Vov = VGS - Vth, K = uCox*W/L with the 1/2\n"
"in the formula -- some textbooks fold the 1/2 into K):\n"
"  ID  = (K/2)*Vov^2*(1 + lambda*VDS)\n"
"  gm  = K*Vov*(1 + lambda*VDS)       so  Vov = 2*ID/gm\n"
"  gds = lambda*(K/2)*Vov^2           so  lambda = gds/(ID - gds*VDS)\n"
"  and K = 2*ID/(Vov^2*(1 + lambda*VDS)).  Without --gds or --lambda,\n"
"  lambda = 0 and rds is infinite.  --gds or a nonzero --lambda needs\n"
"  --vds; --vds also checks saturation (VDS >= Vov).  --vth gives VGS,\n"
"  --vgs gives Vth.\n"
"mos, two points in saturation at the same VDS (sqrt(ID) is linear in\n"
"  VGS): Vth and K; lambda = 0 unless --lambda (with --vds) is given.\n"
"CARRY: gm, gds, rds and the region at another point, from its drain\n"
"  current or its VGS (which needs the threshold); a point in triode\n"
"  is reported with a warning and the triode small-signal values, a\n"
"  point at or below threshold is an error.\n"
"bjt, forward active (hybrid-pi):\n"
"  VT  = k*T/q with k = 1.380649e-23 J/K, q = 1.602176634e-19 C\n"
"        (exact SI values), T = 300 K unless --temp (300K, 27C)\n"
"  gm  = IC/VT (unless --gm is given), rpi = beta/gm,\n"
"  re  = alpha/gm with alpha = beta/(beta + 1)\n"
"  ro  = (VA + VCE)/IC, or VA/IC with --early=plain; --ro gives VA,\n"
"        --va gives ro\n"
"  Cpi + Cmu = gm/(2*pi*fT), and Cpi = gm/(2*pi*fT) - Cmu with --cmu\n"
"  A VCE below 0.2 V (common practice) is reported as saturation.\n"
"\n"
"Figures take an SI prefix (f p n u m k M G T; m is milli, M mega) and\n"
"an optional unit that must fit the figure: --id=1mA --gm=4mS\n"
"--k=4.5mA/V^2 --lambda=0.04/V --ro=45k --temp=300K.  A capital K is the\n"
"kelvin, not kilo.  --type=pmos (pnp) reads voltages and currents as\n"
"magnitudes; the small-signal values are the same as an NMOS's (NPN's).\n"
"--format=json prints the same results as one JSON object for scripts.\n"
"\n"
"Exit status: 0 done (warnings go to stderr); 1 the figures are valid\n"
"but put the device where the model used does not apply (triode where\n"
"saturation is needed, cut off at the new point); 2 bad usage, or a\n"
"figure outside the model's physical range (gm or ID not positive,\n"
"gds*VDS >= ID, a temperature at or below 0 K, ...).\n"
"\n"
"These are first-order hand-analysis models: short-channel devices and\n"
"real parts deviate from them.  For a design that matters, use the\n"
"manufacturer's or foundry's models and measurements.\n"
"\n"
"example:\n"
"  gainsmith extract mos --id=1m --vds=2 --gm=4m --gds=40u --vth=0.5 \\\n"
"      --at-id=2m --at-vds=2\n";

const char *gs_cmd_extract_help(void)
{
    return gs_cmd_extract_help_text;
}

/* ---- options ---- */

typedef struct figspec {
    const char *name;
    int q;                  /* gs_quantity, or WORD */
    const char *words[3];   /* WORD: the keywords, NULL-terminated */
} figspec;

typedef struct fig {
    int given;
    long double v;          /* WORD: the index of the keyword */
    const char *text;
} fig;

enum { O_FORMAT, O_TYPE };  /* both tables start with these */

enum { M_ID = 2, M_VDS, M_GM, M_GDS, M_LAMBDA, M_VTH, M_VGS, M_ID1,
       M_VGS1, M_ID2, M_VGS2, M_AT_ID, M_AT_VGS, M_AT_VDS, M_COUNT };

static const figspec mos_figs[M_COUNT] = {
    {"format", WORD, {"text", "json", NULL}},
    {"type", WORD, {"nmos", "pmos", NULL}},
    {"id", GS_Q_CURRENT, {NULL}}, {"vds", GS_Q_VOLTAGE, {NULL}},
    {"gm", GS_Q_CONDUCTANCE, {NULL}}, {"gds", GS_Q_CONDUCTANCE, {NULL}},
    {"lambda", GS_Q_INV_VOLTAGE, {NULL}}, {"vth", GS_Q_VOLTAGE, {NULL}},
    {"vgs", GS_Q_VOLTAGE, {NULL}}, {"id1", GS_Q_CURRENT, {NULL}},
    {"vgs1", GS_Q_VOLTAGE, {NULL}}, {"id2", GS_Q_CURRENT, {NULL}},
    {"vgs2", GS_Q_VOLTAGE, {NULL}}, {"at-id", GS_Q_CURRENT, {NULL}},
    {"at-vgs", GS_Q_VOLTAGE, {NULL}}, {"at-vds", GS_Q_VOLTAGE, {NULL}},
};

enum { B_IC = 2, B_GM, B_BETA, B_RO, B_VA, B_VCE, B_TEMP, B_FT, B_CMU,
       B_EARLY, B_COUNT };

static const figspec bjt_figs[B_COUNT] = {
    {"format", WORD, {"text", "json", NULL}},
    {"type", WORD, {"npn", "pnp", NULL}},
    {"ic", GS_Q_CURRENT, {NULL}}, {"gm", GS_Q_CONDUCTANCE, {NULL}},
    {"beta", GS_Q_NUMBER, {NULL}}, {"ro", GS_Q_RESISTANCE, {NULL}},
    {"va", GS_Q_VOLTAGE, {NULL}}, {"vce", GS_Q_VOLTAGE, {NULL}},
    {"temp", GS_Q_TEMPERATURE, {NULL}}, {"ft", GS_Q_FREQUENCY, {NULL}},
    {"cmu", GS_Q_CAPACITANCE, {NULL}},
    {"early", WORD, {"full", "plain", NULL}},
};

#define MAX_FIGS 16

/* Usage errors: the command line does not say what to do (exit 2). */
#if defined(__GNUC__)
__attribute__((format(printf, 3, 4)))
#endif
static int usage(gs_diag *d, const char *hint, const char *f, ...);

static int read_word(fig *g, const figspec *s, gs_diag *d)
{
    int i;
    for (i = 0; s->words[i]; i++) {
        if (strcmp(g->text, s->words[i]) == 0) {
            g->v = i;
            return GS_OK;
        }
    }
    return usage(d, NULL, "--%s expects %s or %s, got %s", s->name,
                 s->words[0], s->words[1], g->text);
}

/* Every option's figure, reporting every bad one. */
static int read_figs(fig *f, const figspec *fs, size_t n, const gs_cli *cl,
                     gs_diag *d)
{
    size_t i;
    int rc = GS_OK, r;
    char what[32];

    memset(f, 0, n * sizeof *f);
    for (i = 0; i < n; i++) {
        if (!gs_cli_has(cl, fs[i].name))
            continue;
        f[i].given = 1;
        f[i].text = gs_cli_get(cl, fs[i].name, 0);
        snprintf(what, sizeof what, "--%s", fs[i].name);
        r = fs[i].q == WORD ? read_word(&f[i], &fs[i], d)
                            : gs_units_parse(&f[i].v, f[i].text,
                                             (gs_quantity)fs[i].q, what,
                                             NULL, d);
        if (r != GS_OK)
            rc = GS_ESYNTAX;
    }
    return rc;
}

/* ---- the report: what was given, what was solved, printed as text or
   JSON from one description ---- */

typedef struct item {
    const char *key;        /* JSON key */
    const char *label;      /* text label */
    const char *word;       /* a word value (the region), or NULL */
    long double v;
    gs_quantity q;
    const char *how;        /* the formula, or NULL */
} item;

typedef struct section {
    const char *key;        /* JSON key: "given", "solved", "at" */
    const char *title;      /* text heading */
    item items[16];
    int n;
} section;

typedef struct report {
    const char *device;     /* "mos", "bjt" */
    const char *type;       /* "nmos", ... */
    const char *fit;        /* "point", "two-point", "forward-active" */
    const char *model;
    const char *eq[6];
    int neq;
    section sec[3];
    int nsec;
    char note[4][160];
    int nnote;
} report;

static section *add_section(report *r, const char *key, const char *title)
{
    section *s = &r->sec[r->nsec++];
    s->key = key;
    s->title = title;
    s->n = 0;
    return s;
}

static void add(section *s, const char *key, const char *label,
                long double v, gs_quantity q, const char *how)
{
    item *it = &s->items[s->n++];
    it->key = key;
    it->label = label;
    it->word = NULL;
    it->v = v;
    it->q = q;
    it->how = how;
}

static void add_word(section *s, const char *key, const char *word)
{
    add(s, key, key, 0, GS_Q_NUMBER, NULL);
    s->items[s->n - 1].word = word;
}

static void add_note(report *r, const char *text)
{
    snprintf(r->note[r->nnote++], sizeof r->note[0], "%s", text);
}

static void print_item(FILE *out, const item *it)
{
    char *v = it->word ? gs_strdup(it->word) : gs_units_format(it->v, it->q);
    if (it->how)
        fprintf(out, "  %-8s = %-18s %s\n", it->label, v, it->how);
    else
        fprintf(out, "  %-8s = %s\n", it->label, v);
    gs_free(v);
}

static void print_text(FILE *out, const report *r)
{
    int i, j;

    fprintf(out, "model: %s (%s)\n", r->model, r->type);
    for (i = 0; i < r->neq; i++)
        fprintf(out, "  %s\n", r->eq[i]);
    for (i = 0; i < r->nsec; i++) {
        fprintf(out, "%s:\n", r->sec[i].title);
        for (j = 0; j < r->sec[i].n; j++)
            print_item(out, &r->sec[i].items[j]);
    }
    for (i = 0; i < r->nnote; i++)
        fprintf(out, "note: %s\n", r->note[i]);
}

static void json_item(FILE *out, const item *it, int last)
{
    fprintf(out, "    \"%s\": ", it->key);
    if (it->word)
        gs_json_string(out, it->word);
    else if (isfinite(it->v))
        fprintf(out, "%.17Lg", it->v);
    else
        fputs("null", out);     /* an infinite rds: JSON has no inf */
    fputs(last ? "\n" : ",\n", out);
}

static void json_strings(FILE *out, const char *key, const char *const *v,
                         size_t n, int last)
{
    size_t i;
    fprintf(out, "  \"%s\": [", key);
    for (i = 0; i < n; i++) {
        fputs(i ? ", " : "", out);
        gs_json_string(out, v[i]);
    }
    fputs(last ? "]\n" : "],\n", out);
}

static void print_json(FILE *out, const report *r, const gs_diag *d)
{
    const char *notes[4], **warns = gs_malloc((d->n + 1) * sizeof *warns);
    size_t i, nw = 0;
    int s, j;

    for (i = 0; i < d->n; i++)
        if (d->v[i].severity == GS_SEV_WARNING)
            warns[nw++] = d->v[i].message;
    fprintf(out, "{\n  \"device\": \"%s\",\n  \"type\": \"%s\",\n"
            "  \"fit\": \"%s\",\n  \"model\": ", r->device, r->type, r->fit);
    gs_json_string(out, r->model);
    fputs(",\n", out);
    json_strings(out, "equations", r->eq, (size_t)r->neq, 0);
    for (s = 0; s < r->nsec; s++) {
        fprintf(out, "  \"%s\": {\n", r->sec[s].key);
        for (j = 0; j < r->sec[s].n; j++)
            json_item(out, &r->sec[s].items[j], j == r->sec[s].n - 1);
        fputs("  },\n", out);
    }
    for (j = 0; j < r->nnote; j++)
        notes[j] = r->note[j];
    json_strings(out, "notes", notes, (size_t)r->nnote, 0);
    json_strings(out, "warnings", warns, nw, 1);
    fputs("}\n", out);
    gs_free(warns);
}

static void print_diag(FILE *err, const gs_diag *d)
{
    static const char *const sev[] = {"error", "warning", "note"};
    size_t i;

    for (i = 0; i < d->n; i++) {
        const gs_diag_entry *e = &d->v[i];
        fprintf(err, "gainsmith extract: %s: %s\n", sev[e->severity],
                e->message);
        if (e->hint)
            fprintf(err, "gainsmith extract: hint: %s\n", e->hint);
    }
}

/* ---- messages ---- */


static int usage(gs_diag *d, const char *hint, const char *f, ...)
{
    va_list ap;
    char *msg;

    va_start(ap, f);
    msg = gs_vasprintf(f, ap);
    va_end(ap);
    gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, hint, "%s", msg);
    gs_free(msg);
    return GS_ESYNTAX;
}

/* "--a, --b and --c" of the options in idx[] that are not given. */
static int missing(const fig *f, const figspec *fs, const int *idx, int n,
                   const char *what, gs_diag *d)
{
    char list[200] = "";
    int i, k = 0, m = 0;

    for (i = 0; i < n; i++)
        m += !f[idx[i]].given;
    for (i = 0; i < n; i++) {
        if (f[idx[i]].given)
            continue;
        k++;
        if (k > 1)
            strncat(list, k == m ? " and " : ", ",
                    sizeof list - strlen(list) - 1);
        strncat(list, "--", sizeof list - strlen(list) - 1);
        strncat(list, fs[idx[i]].name, sizeof list - strlen(list) - 1);
    }
    if (m == 0)
        return GS_OK;
    return usage(d, "'gainsmith extract --help' lists the options",
                 "%s needs %s", what, list);
}

static int exit_status(int rc)
{
    if (rc == GS_OK)
        return 0;
    return rc == GS_EINVAL ? 1 : 2;
}

/* ---- mos ---- */

static long double mag(const fig *f, int neg_ok)
{
    return neg_ok ? fabsl(f->v) : f->v;
}

static const char *region_name(gs_mos_region r)
{
    switch (r) {
    case GS_MOS_SAT:    return "saturation";
    case GS_MOS_TRIODE: return "triode";
    default:            return "cut-off";
    }
}

static void mos_model(report *r, int pmos)
{
    r->device = "mos";
    r->type = pmos ? "pmos" : "nmos";
    r->model = "long-channel square-law MOSFET, first-order hand analysis";
    r->eq[r->neq++] = "ID  = (K/2)*Vov^2*(1 + lambda*VDS),  Vov = VGS - Vth,"
                      "  K = uCox*W/L";
    r->eq[r->neq++] = "gm  = dID/dVGS = K*Vov*(1 + lambda*VDS) = 2*ID/Vov";
    r->eq[r->neq++] = "gds = dID/dVDS = lambda*(K/2)*Vov^2,  rds = 1/gds";
}

/* gm, gds, rds and the intrinsic gain of op into s. */
static void small_signal(section *s, const gs_mos_op *op, const char *gm,
                         const char *gds, const char *rds)
{
    long double r = op->gds > 0 ? 1 / op->gds : INFINITY;

    add(s, gm, gm, op->gm, GS_Q_CONDUCTANCE, NULL);
    add(s, gds, gds, op->gds, GS_Q_CONDUCTANCE, NULL);
    add(s, rds, rds, r, GS_Q_RESISTANCE, "rds = 1/gds");
    if (op->region == GS_MOS_SAT)
        add(s, "gm_rds", "gm*rds", op->gm * r, GS_Q_NUMBER,
            "gm*rds = 2*(1 + lambda*VDS)/(lambda*Vov)");
    else
        add(s, "gm_rds", "gm*rds", op->gm * r, GS_Q_NUMBER, NULL);
}

/* The carry options must name one new point completely. */
static int carry_usage(const gs_mos_op *m, const fig *f, int pmos,
                       gs_diag *d)
{
    int by_id = f[M_AT_ID].given, by_vgs = f[M_AT_VGS].given;

    if (by_id && by_vgs)
        return usage(d, NULL, "give --at-id or --at-vgs, not both: one "
                     "fixes the other");
    if (!by_id && !by_vgs)
        return usage(d, NULL, "--at-vds needs --at-id or --at-vgs");
    if (!f[M_AT_VDS].given)
        return usage(d, NULL, "--at-%s needs --at-vds", by_id ? "id" : "vgs");
    if (by_vgs && !m->has_vth)
        return usage(d, "give --vth (or --vgs) at the first point, or "
                     "carry by current with --at-id",
                     "--at-vgs needs the threshold Vth");
    if (by_id && !(mag(&f[M_AT_ID], pmos) > 0)) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "--at-id must be positive, got %s",
                    fmt(f[M_AT_ID].v, GS_Q_CURRENT).s);
        return GS_ERANGE;
    }
    return GS_OK;
}

static void carry_report(report *r, const gs_mos_op *m, const gs_mos_op *p,
                         const fig *f)
{
    section *s = add_section(r, "at", "at the new point");

    add(s, "vds", "VDS", p->vds, GS_Q_VOLTAGE, "(given)");
    if (m->has_vth)
        add(s, "vgs", "VGS", m->vth + p->vov, GS_Q_VOLTAGE,
            f[M_AT_VGS].given ? "(given)" : "VGS = Vth + Vov");
    add(s, "id", "ID", p->id, GS_Q_CURRENT,
        f[M_AT_ID].given ? "(given)" : NULL);
    add(s, "vov", "Vov", p->vov, GS_Q_VOLTAGE, NULL);
    add_word(s, "region", region_name(p->region));
    small_signal(s, p, "gm", "gds", "rds");
}

/* The model m at the point --at-id/--at-vgs with --at-vds. */
static int mos_carry(report *r, const gs_mos_op *m, const fig *f, int pmos,
                     gs_diag *d)
{
    long double vds = mag(&f[M_AT_VDS], pmos);
    gs_mos_op p;
    int rc;

    if (!f[M_AT_ID].given && !f[M_AT_VGS].given && !f[M_AT_VDS].given)
        return GS_OK;
    if ((rc = carry_usage(m, f, pmos, d)) != GS_OK)
        return rc;
    if (f[M_AT_ID].given)
        rc = gs_mos_at_id(&p, m->k, m->lambda, mag(&f[M_AT_ID], pmos), vds,
                          NULL, d);
    else
        rc = gs_mos_at_vov(&p, m->k, m->lambda,
                           mag(&f[M_AT_VGS], pmos) - m->vth, vds, NULL, d);
    if (rc != GS_OK)
        return rc;
    if (p.region == GS_MOS_CUTOFF) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "at VGS = %s the device is cut off (VGS <= Vth = %s): "
                    "it has no small-signal gain",
                    fmt(mag(&f[M_AT_VGS], pmos), GS_Q_VOLTAGE).s,
                    fmt(m->vth, GS_Q_VOLTAGE).s);
        return GS_EINVAL;
    }
    if (p.region == GS_MOS_TRIODE)
        gs_diag_add(d, GS_SEV_WARNING, NULL, 0, 0, NULL,
                    "the new point is in triode, not in saturation (VDS = "
                    "%s < Vov = %s): the triode small-signal values are "
                    "shown", fmt(p.vds, GS_Q_VOLTAGE).s,
                    fmt(p.vov, GS_Q_VOLTAGE).s);
    carry_report(r, m, &p, f);
    return GS_OK;
}

static void mos_point_given(report *r, const gs_mos_op *op, const fig *f,
                            int pmos)
{
    section *g = add_section(r, "given", "given");

    add(g, "id", "ID", mag(&f[M_ID], pmos), GS_Q_CURRENT, NULL);
    if (f[M_VDS].given)
        add(g, "vds", "VDS", op->vds, GS_Q_VOLTAGE, NULL);
    add(g, "gm", "gm", f[M_GM].v, GS_Q_CONDUCTANCE, NULL);
    if (f[M_GDS].given)
        add(g, "gds", "gds", f[M_GDS].v, GS_Q_CONDUCTANCE, NULL);
    if (f[M_LAMBDA].given)
        add(g, "lambda", "lambda", f[M_LAMBDA].v, GS_Q_INV_VOLTAGE, NULL);
    if (f[M_VTH].given)
        add(g, "vth", "Vth", op->vth, GS_Q_VOLTAGE, NULL);
    if (f[M_VGS].given)
        add(g, "vgs", "VGS", op->vgs, GS_Q_VOLTAGE, NULL);
}

static void mos_point_report(report *r, const gs_mos_op *op, const fig *f,
                             int pmos)
{
    section *s;

    r->fit = "point";
    mos_point_given(r, op, f, pmos);
    s = add_section(r, "solved", "solved");
    add(s, "vov", "Vov", op->vov, GS_Q_VOLTAGE, "Vov = 2*ID/gm");
    if (f[M_GDS].given)
        add(s, "lambda", "lambda", op->lambda, GS_Q_INV_VOLTAGE,
            "lambda = gds/(ID - gds*VDS)");
    else if (!f[M_LAMBDA].given)
        add(s, "lambda", "lambda", 0, GS_Q_INV_VOLTAGE, "(assumed)");
    add(s, "k", "K", op->k, GS_Q_KPARAM,
        "K = 2*ID/(Vov^2*(1 + lambda*VDS))");
    if (f[M_VTH].given)
        add(s, "vgs", "VGS", op->vgs, GS_Q_VOLTAGE, "VGS = Vth + Vov");
    if (f[M_VGS].given)
        add(s, "vth", "Vth", op->vth, GS_Q_VOLTAGE, "Vth = VGS - Vov");
    add_word(s, "region", f[M_VDS].given ? "saturation"
                                         : "saturation (assumed)");
    if (!f[M_GDS].given)
        add(s, "gds", "gds", op->gds, GS_Q_CONDUCTANCE,
            "gds = lambda*(K/2)*Vov^2");
    add(s, "rds", "rds", op->gds > 0 ? 1 / op->gds : INFINITY,
        GS_Q_RESISTANCE, "rds = 1/gds");
    add(s, "gm_rds", "gm*rds", op->gds > 0 ? op->gm / op->gds : INFINITY,
        GS_Q_NUMBER, "gm*rds = 2*(1 + lambda*VDS)/(lambda*Vov)");
    if (!f[M_GDS].given && !f[M_LAMBDA].given)
        add_note(r, "neither --gds nor --lambda is given: lambda = 0, so "
                    "rds is infinite");
    if (!f[M_VDS].given)
        add_note(r, "no --vds: saturation (VDS >= Vov) is assumed, not "
                    "checked");
}

static int mos_point(report *r, const fig *f, int pmos, gs_diag *d)
{
    static const int need[] = {M_ID, M_GM};
    long double vds = mag(&f[M_VDS], pmos);
    gs_mos_op op;
    int rc = missing(f, mos_figs, need, 2, "the one-point fit", d);

    if (rc != GS_OK)
        return rc;
    if (f[M_VTH].given && f[M_VGS].given)
        return usage(d, NULL, "give --vth or --vgs, not both: VGS = Vth + "
                     "2*ID/gm fixes one from the other");
    rc = gs_mos_fit_point(&op, mag(&f[M_ID], pmos), f[M_GM].v,
                          f[M_GDS].given ? &f[M_GDS].v : NULL,
                          f[M_LAMBDA].given ? &f[M_LAMBDA].v : NULL,
                          f[M_VDS].given ? &vds : NULL, NULL, d);
    if (rc != GS_OK)
        return rc;
    if (f[M_VTH].given || f[M_VGS].given) {
        op.has_vth = 1;
        op.vth = f[M_VTH].given ? mag(&f[M_VTH], pmos)
                                : mag(&f[M_VGS], pmos) - op.vov;
        op.vgs = op.vth + op.vov;
    }
    mos_point_report(r, &op, f, pmos);
    return mos_carry(r, &op, f, pmos, d);
}

static void mos_two_report(report *r, const gs_mos_op *p1,
                           const gs_mos_op *p2, const fig *f, int pmos)
{
    section *g = add_section(r, "given", "given");
    section *s = add_section(r, "solved", "solved");

    r->fit = "two-point";
    add(g, "id1", "ID1", mag(&f[M_ID1], pmos), GS_Q_CURRENT, NULL);
    add(g, "vgs1", "VGS1", mag(&f[M_VGS1], pmos), GS_Q_VOLTAGE, NULL);
    add(g, "id2", "ID2", mag(&f[M_ID2], pmos), GS_Q_CURRENT, NULL);
    add(g, "vgs2", "VGS2", mag(&f[M_VGS2], pmos), GS_Q_VOLTAGE, NULL);
    if (f[M_VDS].given)
        add(g, "vds", "VDS", p1->vds, GS_Q_VOLTAGE, NULL);
    add(g, "lambda", "lambda", p1->lambda, GS_Q_INV_VOLTAGE,
        f[M_LAMBDA].given ? NULL : "(assumed)");
    add(s, "vth", "Vth", p1->vth, GS_Q_VOLTAGE,
        "Vth = VGS1 - sqrt(ID1)*(VGS2 - VGS1)/(sqrt(ID2) - sqrt(ID1))");
    add(s, "k", "K", p1->k, GS_Q_KPARAM,
        "K = 2*ID1/((VGS1 - Vth)^2*(1 + lambda*VDS))");
    add(s, "vov1", "Vov1", p1->vov, GS_Q_VOLTAGE, "Vov1 = VGS1 - Vth");
    add(s, "vov2", "Vov2", p2->vov, GS_Q_VOLTAGE, "Vov2 = VGS2 - Vth");
    add(s, "gm1", "gm1", p1->gm, GS_Q_CONDUCTANCE, "gm1 = 2*ID1/Vov1");
    add(s, "gm2", "gm2", p2->gm, GS_Q_CONDUCTANCE, "gm2 = 2*ID2/Vov2");
    add(s, "rds1", "rds1", p1->gds > 0 ? 1 / p1->gds : INFINITY,
        GS_Q_RESISTANCE, "rds1 = 1/(lambda*(K/2)*Vov1^2)");
    add(s, "rds2", "rds2", p2->gds > 0 ? 1 / p2->gds : INFINITY,
        GS_Q_RESISTANCE, "rds2 = 1/(lambda*(K/2)*Vov2^2)");
    add_word(s, "region", f[M_VDS].given ? "saturation"
                                         : "saturation (assumed)");
    if (!f[M_VDS].given)
        add_note(r, "no --vds: saturation (VDS >= Vov) is assumed at both "
                    "points, not checked");
}

static int mos_two(report *r, const fig *f, int pmos, gs_diag *d)
{
    static const int need[] = {M_ID1, M_VGS1, M_ID2, M_VGS2};
    long double vds = mag(&f[M_VDS], pmos);
    gs_mos_op p1, p2;
    int rc = missing(f, mos_figs, need, 4, "the two-point fit", d);

    if (rc != GS_OK)
        return rc;
    rc = gs_mos_fit_two(&p1, mag(&f[M_ID1], pmos), mag(&f[M_VGS1], pmos),
                        mag(&f[M_ID2], pmos), mag(&f[M_VGS2], pmos),
                        f[M_LAMBDA].given ? f[M_LAMBDA].v : 0,
                        f[M_VDS].given ? &vds : NULL, NULL, d);
    if (rc != GS_OK)
        return rc;
    gs_mos_at_vov(&p2, p1.k, p1.lambda, mag(&f[M_VGS2], pmos) - p1.vth,
                  p1.vds, NULL, d);
    p2.region = GS_MOS_SAT;     /* checked by gs_mos_fit_two, or assumed */
    gs_mos_eval(&p2);
    mos_two_report(r, &p1, &p2, f, pmos);
    return mos_carry(r, &p1, f, pmos, d);
}

static int extract_mos(report *r, const fig *f, gs_diag *d)
{
    int pmos = f[O_TYPE].given && f[O_TYPE].v == 1;
    int one = f[M_ID].given || f[M_GM].given || f[M_GDS].given
              || f[M_VTH].given || f[M_VGS].given;
    int two = f[M_ID1].given || f[M_VGS1].given || f[M_ID2].given
              || f[M_VGS2].given;

    mos_model(r, pmos);
    if (one && two)
        return usage(d, NULL, "the one-point figures (--id, --gm, --gds, "
                     "--vth, --vgs) and the two-point figures (--id1, "
                     "--vgs1, --id2, --vgs2) do not mix");
    if (!one && !two)
        return usage(d, "'gainsmith extract --help' lists the options",
                     "extract mos needs --id and --gm (one point), or "
                     "--id1, --vgs1, --id2 and --vgs2 (two points)");
    if (pmos)
        add_note(r, "type pmos: the magnitudes |VGS|, |VDS|, |Vth|, |ID| "
                    "are used");
    return one ? mos_point(r, f, pmos, d) : mos_two(r, f, pmos, d);
}

/* ---- bjt ---- */

static void bjt_model(report *r, int pnp)
{
    r->device = "bjt";
    r->type = pnp ? "pnp" : "npn";
    r->fit = "forward-active";
    r->model = "BJT hybrid-pi in forward active, first-order hand analysis";
    r->eq[r->neq++] = "VT = k*T/q,  gm = IC/VT";
    r->eq[r->neq++] = "rpi = beta/gm,  re = alpha/gm,  alpha = beta/(beta + 1)";
    r->eq[r->neq++] = "ro = (VA + VCE)/IC  (--early=plain: ro = VA/IC)";
    r->eq[r->neq++] = "Cpi + Cmu = gm/(2*pi*fT)";
}

/* The figures that must come together, or not at all. */
static int bjt_usage(const fig *f, int plain, gs_diag *d)
{
    static const int need[] = {B_IC};
    int rc = missing(f, bjt_figs, need, 1, "extract bjt", d);

    if (rc != GS_OK)
        return rc;
    if (f[B_RO].given && f[B_VA].given)
        return usage(d, NULL, "give --ro or --va, not both: ro = (VA + "
                     "VCE)/IC fixes one from the other");
    if ((f[B_RO].given || f[B_VA].given) && !plain && !f[B_VCE].given)
        return usage(d, "or give --early=plain for ro = VA/IC",
                     "--%s needs --vce: ro = (VA + VCE)/IC",
                     f[B_RO].given ? "ro" : "va");
    if (f[B_CMU].given && !f[B_FT].given)
        return usage(d, NULL, "--cmu is used only with --ft: Cpi = "
                     "gm/(2*pi*fT) - Cmu");
    return GS_OK;
}

static void bjt_given(report *r, const fig *f, int pnp)
{
    section *g = add_section(r, "given", "given");
    static const char *const label[B_COUNT] = {
        NULL, NULL, "IC", "gm", "beta", "ro", "VA", "VCE", "T", "fT", "Cmu",
        NULL
    };
    int i;

    for (i = B_IC; i < B_EARLY; i++)
        if (f[i].given)
            add(g, bjt_figs[i].name, label[i],
                i == B_IC || i == B_VA || i == B_VCE ? mag(&f[i], pnp)
                                                     : f[i].v,
                (gs_quantity)bjt_figs[i].q, NULL);
}

/* gm from IC and VT, or as given (then IC/gm is shown beside VT). */
static int bjt_gm(section *s, const fig *f, long double ic,
                  long double *gm, gs_diag *d)
{
    long double t = f[B_TEMP].given ? f[B_TEMP].v : GS_TEMP_DEFAULT, vt;
    int rc = gs_thermal_voltage(&vt, t, NULL, d);

    if (rc != GS_OK || (rc = gs_bjt_gm(gm, ic, vt, NULL, d)) != GS_OK)
        return rc;
    add(s, "vt", "VT", vt, GS_Q_VOLTAGE, f[B_TEMP].given
        ? "VT = k*T/q" : "VT = k*T/q at T = 300 K");
    if (!f[B_GM].given) {
        add(s, "gm", "gm", *gm, GS_Q_CONDUCTANCE, "gm = IC/VT");
        return GS_OK;
    }
    if (!(f[B_GM].v > 0) || isinf(f[B_GM].v)) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, NULL,
                    "gm must be positive, got %s",
                    fmt(f[B_GM].v, GS_Q_CONDUCTANCE).s);
        return GS_ERANGE;
    }
    *gm = f[B_GM].v;
    add(s, "ic_over_gm", "IC/gm", ic / *gm, GS_Q_VOLTAGE,
        "compare with VT: equal in the ideal model");
    return GS_OK;
}

static int bjt_solve(report *r, const fig *f, int pnp, int plain,
                     gs_diag *d)
{
    section *s = add_section(r, "solved", "solved");
    long double ic = mag(&f[B_IC], pnp), vce = mag(&f[B_VCE], pnp);
    long double gm, rpi, re, ro, va, cpi;
    int rc = bjt_gm(s, f, ic, &gm, d);

    if (rc == GS_OK && f[B_BETA].given
        && (rc = gs_bjt_rpi(&rpi, &re, f[B_BETA].v, gm, NULL, d)) == GS_OK) {
        add(s, "alpha", "alpha", f[B_BETA].v / (f[B_BETA].v + 1),
            GS_Q_NUMBER, "alpha = beta/(beta + 1)");
        add(s, "rpi", "rpi", rpi, GS_Q_RESISTANCE, "rpi = beta/gm");
        add(s, "re", "re", re, GS_Q_RESISTANCE, "re = alpha/gm");
    }
    if (rc == GS_OK && f[B_RO].given
        && (rc = gs_bjt_va(&va, f[B_RO].v, vce, ic, plain, NULL, d))
               == GS_OK)
        add(s, "va", "VA", va, GS_Q_VOLTAGE,
            plain ? "VA = ro*IC" : "VA = ro*IC - VCE");
    if (rc == GS_OK && f[B_VA].given
        && (rc = gs_bjt_ro(&ro, mag(&f[B_VA], pnp), vce, ic, plain, NULL,
                           d)) == GS_OK)
        add(s, "ro", "ro", ro, GS_Q_RESISTANCE,
            plain ? "ro = VA/IC" : "ro = (VA + VCE)/IC");
    if (rc == GS_OK && (f[B_RO].given || f[B_VA].given))
        add(s, "gm_ro", "gm*ro", gm * (f[B_RO].given ? f[B_RO].v : ro),
            GS_Q_NUMBER, "the intrinsic gain");
    if (rc == GS_OK && f[B_FT].given) {
        rc = gs_bjt_cpi(&cpi, gm, f[B_FT].v,
                        f[B_CMU].given ? f[B_CMU].v : 0, NULL, d);
        if (rc == GS_OK)
            add(s, "cpi_cmu", "Cpi+Cmu", cpi + (f[B_CMU].given
                                                ? f[B_CMU].v : 0),
                GS_Q_CAPACITANCE, "Cpi + Cmu = gm/(2*pi*fT)");
        if (rc == GS_OK && f[B_CMU].given)
            add(s, "cpi", "Cpi", cpi, GS_Q_CAPACITANCE,
                "Cpi = gm/(2*pi*fT) - Cmu");
    }
    return rc;
}

static int extract_bjt(report *r, const fig *f, gs_diag *d)
{
    int pnp = f[O_TYPE].given && f[O_TYPE].v == 1;
    int plain = f[B_EARLY].given && f[B_EARLY].v == 1, rc;
    long double vce = mag(&f[B_VCE], pnp);

    bjt_model(r, pnp);
    if ((rc = bjt_usage(f, plain, d)) != GS_OK)
        return rc;
    if (f[B_VCE].given && !(vce >= 0)) {
        gs_diag_add(d, GS_SEV_ERROR, NULL, 0, 0, "a PNP takes --type=pnp; "
                    "its figures are then read as magnitudes",
                    "VCE must not be negative, got %s",
                    fmt(vce, GS_Q_VOLTAGE).s);
        return GS_ERANGE;
    }
    bjt_given(r, f, pnp);
    if ((rc = bjt_solve(r, f, pnp, plain, d)) != GS_OK)
        return rc;
    if (f[B_VCE].given && gs_bjt_saturated(vce))
        gs_diag_add(d, GS_SEV_WARNING, NULL, 0, 0, NULL,
                    "VCE = %s is below %s: the transistor is saturated, "
                    "where the forward-active figures do not hold",
                    fmt(vce, GS_Q_VOLTAGE).s,
                    fmt(GS_VCE_SAT, GS_Q_VOLTAGE).s);
    if (f[B_FT].given && !f[B_CMU].given)
        add_note(r, "no --cmu: only the sum Cpi + Cmu follows from fT");
    if (pnp)
        add_note(r, "type pnp: the magnitudes |IC|, |VCE|, |VA| are used");
    return GS_OK;
}

/* ---- the command ---- */

static int run(int argc, char **argv, const figspec *fs, size_t n,
               int (*fn)(report *, const fig *, gs_diag *), FILE *out,
               FILE *err)
{
    gs_cli_opt opts[MAX_FIGS + 2];
    fig f[MAX_FIGS];
    gs_cli cl;
    gs_diag d;
    report r;
    size_t i;
    int rc;

    for (i = 0; i < n; i++) {
        opts[i].name = fs[i].name;
        opts[i].has_arg = 1;
        opts[i].repeatable = 0;
    }
    opts[n].name = "help";
    opts[n].has_arg = opts[n].repeatable = 0;
    opts[n + 1].name = NULL;
    if (gs_cli_parse(&cl, argc, argv, opts, err) != 0) {
        gs_cli_clear(&cl);
        return 2;
    }
    if (gs_cli_has(&cl, "help")) {
        gs_cli_clear(&cl);
        fputs(gs_cmd_extract_help_text, out);
        return 0;
    }
    gs_diag_init(&d);
    memset(&r, 0, sizeof r);
    rc = cl.npos > 1 ? usage(&d, "options are written --NAME=VALUE",
                             "unexpected argument '%s'", cl.pos[1])
                     : read_figs(f, fs, n, &cl, &d);
    if (rc == GS_OK)
        rc = fn(&r, f, &d);
    print_diag(err, &d);
    if (rc == GS_OK && f[O_FORMAT].given && f[O_FORMAT].v == 1)
        print_json(out, &r, &d);
    else if (rc == GS_OK)
        print_text(out, &r);
    gs_diag_clear(&d);
    gs_cli_clear(&cl);
    return exit_status(rc);
}

int gs_cmd_extract(int argc, char **argv, FILE *out, FILE *err)
{
    const char *dev = argc > 1 ? argv[1] : "";

    if (strcmp(dev, "--help") == 0 || strcmp(dev, "-h") == 0) {
        fputs(gs_cmd_extract_help_text, out);
        return 0;
    }
    if (strcmp(dev, "mos") == 0)
        return run(argc, argv, mos_figs, M_COUNT, extract_mos, out, err);
    if (strcmp(dev, "bjt") == 0)
        return run(argc, argv, bjt_figs, B_COUNT, extract_bjt, out, err);
    if (*dev == '\0')
        fputs("gainsmith extract: error: extract needs a device: mos or "
              "bjt\n", err);
    else
        fprintf(err, "gainsmith extract: error: unknown device '%s': "
                "expected mos or bjt\n", dev);
    fputs("gainsmith extract: hint: 'gainsmith extract --help' shows the "
          "usage\n", err);
    return 2;
}
