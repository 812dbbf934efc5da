/* parse_dev.c - mosfet and bjt lines, expanded into elements; bias lines.
 * See LICENSE.
 *
 * A device line stands for its small-signal model, the hybrid-pi form of
 * the textbooks (Sedra and Smith, "Microelectronic Circuits", the MOSFET
 * and BJT small-signal models; Gray, Hurst, Lewis and Meyer, "Analysis
 * and Design of Analog Integrated Circuits", ch. 1): a transconductance
 * gm controlled by v(gate, source) or v(base', emitter), an output
 * resistance, the input resistance rpi of a bjt, the body transconductance
 * gmb of a mosfet, and the device capacitances.  Each part is an ordinary
 * element named DEVICE.PART, added where the device line stands in the
 * fixed order of the tables below.
 */
#include "gainsmith.h"
#include "base/mem.h"
#include "circuit/parse.h"
#include "circuit/units.h"

#include <stdlib.h>
#include <string.h>

/* One parameter of a device and the element it makes. */
typedef struct dev_param {
    const char *key;
    gs_elem_kind kind;
    int node[4];        /* indices into the device's node list, -1 unused */
    int by_default;     /* present with the symbol KEY_DEVICE if not given */
    int inf_ok;         /* KEY=inf leaves the part out */
    int needs_body;     /* mosfet parts that touch b */
} dev_param;

/* mosfet nodes: 0 d, 1 g, 2 s, 3 b */
static const dev_param mos_params[] = {
    {"gm", GS_VCCS, {0, 2, 1, 2}, 1, 0, 0},
    {"rds", GS_RESISTOR, {0, 2, -1, -1}, 1, 1, 0},
    {"gmb", GS_VCCS, {0, 2, 3, 2}, 0, 0, 1},
    {"cgs", GS_CAPACITOR, {1, 2, -1, -1}, 0, 0, 0},
    {"cgd", GS_CAPACITOR, {1, 0, -1, -1}, 0, 0, 0},
    {"cdb", GS_CAPACITOR, {0, 3, -1, -1}, 0, 0, 1},
    {"csb", GS_CAPACITOR, {2, 3, -1, -1}, 0, 0, 1},
};

/* bjt nodes: 0 c, 1 b, 2 e, 3 the intrinsic base b' (b itself unless rb
   is given) */
static const dev_param bjt_params[] = {
    {"gm", GS_VCCS, {0, 2, 3, 2}, 1, 0, 0},
    {"rpi", GS_RESISTOR, {3, 2, -1, -1}, 1, 1, 0},
    {"ro", GS_RESISTOR, {0, 2, -1, -1}, 0, 1, 0},
    {"cpi", GS_CAPACITOR, {3, 2, -1, -1}, 0, 0, 0},
    {"cmu", GS_CAPACITOR, {3, 0, -1, -1}, 0, 0, 0},
    {"rb", GS_RESISTOR, {1, 3, -1, -1}, 0, 0, 0},
};

#define MAX_PARAMS 7

/* The noise parameters a mosfet line may give (docs/noise.md): the
   channel thermal-noise factor (the gamma of 4kT*gamma*gm, named so as
   not to be read as the body-effect gamma of a bias line), the flicker
   coefficient K_f and the Cox, W and L of K_f/(Cox*W*L*f).  Each binds
   the symbol KEY_NAME that the noise analysis reads. */
#define NOISE_KEYS 5
static const char *const noise_keys[NOISE_KEYS] = {
    "nthermal", "kf", "cox", "w", "l"
};
/* Their units on a bias line, where figures are numbers with units
   (units.h): nthermal is a ratio, K_f in V^2*F (the SI unit that makes
   gm^2*K_f/(Cox*W*L*f) a density in A^2/Hz) is written as a bare number,
   Cox in F/m^2, W and L in metres. */
static const gs_quantity noise_units[NOISE_KEYS] = {
    GS_Q_NUMBER, GS_Q_NUMBER, GS_Q_CAP_AREA, GS_Q_LENGTH, GS_Q_LENGTH
};

/* The index of KEY in noise_keys, or -1. */
static int noise_key_index(const char *key)
{
    int i;
    for (i = 0; i < NOISE_KEYS; i++)
        if (strcmp(key, noise_keys[i]) == 0)
            return i;
    return -1;
}

/* What a device line said about each of its parameters. */
typedef struct dev_line {
    const dev_param *params;
    size_t nparams;
    const char *word, *form;
    const gs_token *name;
    const gs_token *node_tok[4];
    int node[4];
    const gs_token *key[MAX_PARAMS];    /* NULL: not given */
    char *raw[MAX_PARAMS];              /* the value as written */
    int inf[MAX_PARAMS];
    gs_monomial val[MAX_PARAMS];
    size_t val_off[MAX_PARAMS];
    /* a mosfet's noise parameters (noise_keys): value expressions that
       bind the symbols KEY_NAME, as value lines would */
    const gs_token *nz_key[NOISE_KEYS];
    gs_expr *nz_expr[NOISE_KEYS];
} dev_line;

static void dev_line_init(dev_line *L, int is_bjt)
{
    size_t i;
    memset(L, 0, sizeof *L);
    L->params = is_bjt ? bjt_params : mos_params;
    L->nparams = is_bjt ? sizeof bjt_params / sizeof bjt_params[0]
                        : sizeof mos_params / sizeof mos_params[0];
    L->word = is_bjt ? "bjt" : "mosfet";
    L->form = is_bjt ? "bjt NAME c b e [gm=..] [rpi=..] [ro=..] [cpi=..] "
                       "[cmu=..] [rb=..]"
                     : "mosfet NAME d g s [b] [gm=..] [rds=..] [gmb=..] "
                       "[cgs=..] [cgd=..] [cdb=..] [csb=..] "
                       "[nthermal=..] [kf=.. cox=.. w=.. l=..]";
    for (i = 0; i < 4; i++)
        L->node[i] = -1;
    for (i = 0; i < MAX_PARAMS; i++)
        gs_monomial_init(&L->val[i]);
}

static void dev_line_clear(dev_line *L)
{
    size_t i;
    for (i = 0; i < MAX_PARAMS; i++) {
        gs_free(L->raw[i]);
        gs_monomial_clear(&L->val[i]);
    }
    for (i = 0; i < NOISE_KEYS; i++)
        gs_expr_free(L->nz_expr[i]);
}

/* Is the cursor at "IDENT =", the start of a parameter? */
static int at_key(const gs_cursor *cur)
{
    const gs_token *t = gs_cur_peek(cur);
    return t->kind == GS_TK_IDENT && t[1].kind == GS_TK_PUNCT
           && t[1].text[0] == '=';
}

/* The tokens [from, to) joined without spaces: a value as written. */
static char *join_tokens(const gs_token *from, const gs_token *to)
{
    size_t n = 1;
    const gs_token *t;
    char *out;
    for (t = from; t < to; t++)
        n += strlen(t->text);
    out = gs_malloc(n);
    out[0] = '\0';
    for (t = from; t < to; t++)
        strcat(out, t->text);
    return out;
}

static int param_index(gs_parser *p, dev_line *L, const gs_token *key)
{
    const char *names[MAX_PARAMS + NOISE_KEYS];
    char *hint, *list;
    size_t i, n = L->nparams;
    for (i = 0; i < L->nparams; i++) {
        names[i] = L->params[i].key;
        if (strcmp(key->text, names[i]) == 0)
            return (int)i;
    }
    if (L->params == mos_params)
        for (i = 0; i < NOISE_KEYS; i++)
            names[n++] = noise_keys[i];
    hint = gs_suggest_hint(key->text, names, n);
    list = gs_asprintf("the %s parameters are %s", L->word, L->nparams == 7
                       ? "gm, rds, gmb, cgs, cgd, cdb and csb, and for its "
                         "noise nthermal, kf, cox, w and l"
                       : "gm, rpi, ro, cpi, cmu and rb");
    gs_cur_error(&p->cur, key, hint ? hint : list, "unknown %s parameter "
                 "'%s'", L->word, key->text);
    gs_free(list);
    gs_free(hint);
    return -1;
}

/* The index of KEY among a mosfet's noise parameters, or -1. */
static int noise_index(const dev_line *L, const char *key)
{
    return L->params == mos_params ? noise_key_index(key) : -1;
}

/* Past the KEY = at the cursor, noted in *seen; an error when *seen
   already holds an earlier one. */
static int take_key(gs_parser *p, const gs_token **seen)
{
    const gs_token *key = gs_cur_peek(&p->cur);
    if (*seen != NULL) {
        gs_cur_error(&p->cur, key, NULL, "parameter '%s' given twice",
                     key->text);
        return GS_ESYNTAX;
    }
    gs_cur_next(&p->cur);
    gs_cur_next(&p->cur);               /* '=' */
    *seen = key;
    return GS_OK;
}

/* A noise parameter KEY=EXPR of a mosfet line: an expression as on a
   value line (its sign is checked where the noise analysis reads it). */
static int parse_noise_param(gs_parser *p, dev_line *L, int k)
{
    if (take_key(p, &L->nz_key[k]) != GS_OK)
        return GS_ESYNTAX;
    return gs_parse_expr(&L->nz_expr[k], &p->cur, p->c) == GS_OK
           ? GS_OK : GS_ESYNTAX;
}

/* Bind KEY_NAME to each noise parameter the line gave, as a value line
   with the origin "mosfet NAME"; a value line for the same symbol is a
   duplicate (reported where the second one is). */
static int add_noise_values(gs_parser *p, dev_line *L)
{
    int k, line, col, sym, prev;
    for (k = 0; k < NOISE_KEYS; k++) {
        char *name, *origin;
        if (L->nz_key[k] == NULL)
            continue;
        name = gs_asprintf("%s_%s", noise_keys[k], L->name->text);
        sym = gs_symtab_intern(p->c->syms, name);
        if ((prev = gs_circuit_find_value(p->c, sym)) >= 0) {
            gs_cur_error(&p->cur, L->nz_key[k], NULL, "duplicate value for "
                         "'%s' (first at %d:%d)", name,
                         p->c->values[prev].line, p->c->values[prev].col);
            gs_free(name);
            return GS_ESYNTAX;
        }
        gs_free(name);
        origin = gs_asprintf("mosfet %s", L->name->text);
        gs_lex_position(&p->lx, L->nz_key[k]->off, &line, &col);
        gs_circuit_add_value(p->c, sym, L->nz_expr[k], origin, line, col);
        L->nz_expr[k] = NULL;           /* the circuit owns it now */
        gs_free(origin);
    }
    return GS_OK;
}

/* One KEY=VALUE of a device line. */
static int parse_param(gs_parser *p, dev_line *L)
{
    const gs_token *key = gs_cur_peek(&p->cur), *start;
    int k;
    if (!at_key(&p->cur)) {
        gs_parser_expected(p, key, "a parameter KEY=VALUE", L->form);
        return GS_ESYNTAX;
    }
    if ((k = noise_index(L, key->text)) >= 0)
        return parse_noise_param(p, L, k);
    if ((k = param_index(p, L, key)) < 0 || take_key(p, &L->key[k]) != GS_OK)
        return GS_ESYNTAX;
    start = gs_cur_peek(&p->cur);
    L->val_off[k] = start->off;
    if (L->params[k].inf_ok && start->kind == GS_TK_IDENT
        && strcmp(start->text, "inf") == 0) {
        gs_cur_next(&p->cur);
        L->inf[k] = 1;
    } else if (gs_parse_monomial(&L->val[k], &p->cur, p->c) != GS_OK) {
        return GS_ESYNTAX;
    }
    L->raw[k] = join_tokens(start, gs_cur_peek(&p->cur));
    return GS_OK;
}

/* The node tokens: d g s [b] or c b e.  Only their syntax is checked
   here; the nodes are made when the parts are. */
static int parse_dev_nodes(gs_parser *p, dev_line *L, int is_bjt)
{
    static const char *const mos_roles[] = {"d", "g", "s", "b"};
    static const char *const bjt_roles[] = {"c", "b", "e"};
    int i, n = 3;
    for (i = 0; i < n; i++) {
        const gs_token *t = gs_cur_next(&p->cur);
        char *what = gs_asprintf("node %s of %s '%s'",
                                 is_bjt ? bjt_roles[i] : mos_roles[i],
                                 L->word, L->name->text);
        if (t->kind == GS_TK_END)
            gs_parser_expected(p, t, what, L->form);
        else if (i < 3)
            L->node[i] = gs_parser_node(p, t, what);
        else if (gs_parser_check_node(p, t, what) == GS_OK)
            L->node[i] = 0;     /* made later, if a part needs it */
        gs_free(what);
        if (t->kind == GS_TK_END || L->node[i] < 0)
            return GS_ESYNTAX;
        L->node_tok[i] = t;
        if (i == 2 && !is_bjt && gs_cur_peek(&p->cur)->kind != GS_TK_END
            && !at_key(&p->cur))
            n = 4;                      /* the body node b */
    }
    return GS_OK;
}

/* The b node of a mosfet, made now that a part needs it, or -1. */
static int body_node(gs_parser *p, dev_line *L, int k)
{
    if (L->node_tok[3] == NULL) {
        gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, L->key[k]->off,
                      "write the body node after s: mosfet NAME d g s b",
                      "'%s' needs the body node b, which mosfet '%s' does "
                      "not have", L->params[k].key, L->name->text);
        return -1;
    }
    return L->node[3];
}

/* Which parts exist, with zero values and missing body nodes reported. */
static int check_params(gs_parser *p, dev_line *L, int *want)
{
    size_t k;
    int rc = GS_OK;
    for (k = 0; k < L->nparams; k++) {
        const dev_param *dp = &L->params[k];
        want[k] = (dp->by_default || L->key[k]) && !L->inf[k];
        if (!want[k] || L->key[k] == NULL)
            continue;
        if (gs_rat_is_zero(&L->val[k].coeff)) {
            char *part = gs_asprintf("%s.%s", L->name->text, dp->key);
            gs_parser_zero_value(p, dp->kind, part, L->val_off[k]);
            gs_free(part);
            rc = GS_ESYNTAX;
        }
        if (dp->needs_body && body_node(p, L, (int)k) < 0)
            rc = GS_ESYNTAX;
    }
    return rc;
}

static void add_part(gs_parser *p, dev_line *L, size_t k, int dev,
                     const int *node)
{
    const dev_param *dp = &L->params[k];
    char *name = gs_asprintf("%s.%s", L->name->text, dp->key);
    gs_element *e = gs_parser_add_element(p, dp->kind, name, L->name->off);
    int i;
    for (i = 0; i < 4; i++)
        e->node[i] = dp->node[i] >= 0 ? node[dp->node[i]] : -1;
    e->device = dev;
    if (L->key[k] != NULL) {
        gs_monomial_set(&e->value, &L->val[k]);
    } else {
        char *sym = gs_asprintf("%s_%s", dp->key, L->name->text);
        gs_monomial_mul_sym(&e->value, gs_symtab_intern(p->c->syms, sym), 1);
        gs_free(sym);
    }
    gs_parser_set_name(p, gs_symtab_intern(p->names, name), GS_NAME_ELEM,
                       (int)p->c->nelems - 1, L->name->off);
    gs_free(name);
}

/* The device record: nodes and parameters as written. */
static int add_device(gs_parser *p, dev_line *L, int is_bjt)
{
    gs_circuit *c = p->c;
    gs_device *dv;
    size_t k, n = 0, a = p->devices_alloc;
    c->devices = gs_grow(c->devices, c->ndevices, &p->devices_alloc,
                         sizeof *c->devices);
    p->dev_body = gs_grow(p->dev_body, c->ndevices, &a, sizeof *p->dev_body);
    p->dev_body[c->ndevices] = !is_bjt && L->node_tok[3]
                               ? gs_strdup(L->node_tok[3]->text) : NULL;
    dv = &c->devices[c->ndevices];
    memset(dv, 0, sizeof *dv);
    dv->name = gs_strdup(L->name->text);
    dv->is_bjt = is_bjt;
    gs_lex_position(&p->lx, L->name->off, &dv->line, &dv->col);
    for (k = 0; k < 4; k++)
        dv->nodes[k] = k < 3 ? L->node[k] : -1;
    for (k = 0; k < L->nparams; k++)
        n += L->key[k] != NULL;
    dv->keys = gs_malloc(n * sizeof *dv->keys);
    dv->vals = gs_malloc(n * sizeof *dv->vals);
    for (k = 0; k < L->nparams; k++) {
        if (L->key[k] == NULL)
            continue;
        dv->keys[dv->nparams] = gs_strdup(L->key[k]->text);
        dv->vals[dv->nparams++] = gs_strdup(L->raw[k]);
    }
    return (int)c->ndevices++;
}

/* The nodes the parts connect to, and the parts, in table order. */
static void expand(gs_parser *p, dev_line *L, int is_bjt, int dev,
                   const int *want)
{
    int node[4];
    size_t k;
    memcpy(node, L->node, sizeof node);
    if (is_bjt) {
        node[3] = node[1];
        if (want[5]) {                  /* rb: the internal base b' */
            char *bi = gs_asprintf("%s.b'", L->name->text);
            gs_token t;
            t.kind = GS_TK_IDENT;
            t.dotted = 0;
            t.off = L->name->off;
            t.text = bi;
            node[3] = gs_parser_node(p, &t, "node");
            gs_free(bi);
        }
    } else if (want[2] || want[5] || want[6]) {
        node[3] = gs_parser_node(p, L->node_tok[3], "node b");
    }
    for (k = 0; k < L->nparams; k++) {
        if (!want[k])
            continue;
        /* with b = s, v(b, s) is 0 and csb is shorted: no such parts */
        if (!is_bjt && (k == 2 || k == 6) && node[3] == node[2])
            continue;
        add_part(p, L, k, dev, node);
    }
}

int gs_parse_device(gs_parser *p, int is_bjt)
{
    dev_line L;
    int id, rc = GS_ESYNTAX, want[MAX_PARAMS], dev;
    dev_line_init(&L, is_bjt);
    L.name = gs_cur_next(&p->cur);
    if (L.name->kind != GS_TK_IDENT) {
        char *what = gs_asprintf("%s name", L.word);
        gs_parser_expected(p, L.name, what, L.form);
        gs_free(what);
    } else if ((id = gs_parser_new_name(p, L.name)) >= 0
               && parse_dev_nodes(p, &L, is_bjt) == GS_OK) {
        rc = GS_OK;
        while (rc == GS_OK && gs_cur_peek(&p->cur)->kind != GS_TK_END)
            rc = parse_param(p, &L);
        if (rc == GS_OK)
            rc = check_params(p, &L, want);
        if (rc == GS_OK)
            rc = add_noise_values(p, &L);
        if (rc == GS_OK) {
            dev = add_device(p, &L, is_bjt);
            expand(p, &L, is_bjt, dev, want);
            gs_parser_set_name(p, id, GS_NAME_DEVICE, dev, L.name->off);
        }
    }
    dev_line_clear(&L);
    return rc;
}

/* Fill in each mosfet's b node, which may be made by a later line. */
void gs_parser_finish_devices(gs_parser *p)
{
    size_t i;
    for (i = 0; i < p->c->ndevices; i++) {
        const char *b = p->dev_body[i];
        if (b != NULL)
            p->c->devices[i].nodes[3] = gs_circuit_find_node(p->c, b);
    }
}

/* ---- bias lines ---- */

static const char bias_form[] = "bias DEVICE KEY=VALUE...";

/* One KEY=VALUE: the value is every token up to the next KEY= or the
   end, as written; the device model reads it. */
static int bias_pair(gs_parser *p, gs_bias *b)
{
    const gs_token *key = gs_cur_peek(&p->cur), *start;
    int i, line, k;
    if (!at_key(&p->cur)) {
        gs_parser_expected(p, key, "a parameter KEY=VALUE", bias_form);
        return GS_ESYNTAX;
    }
    for (i = 0; i < b->nparams; i++) {
        if (strcmp(b->keys[i], key->text) == 0) {
            gs_cur_error(&p->cur, key, NULL, "parameter '%s' given twice",
                         key->text);
            return GS_ESYNTAX;
        }
    }
    gs_cur_next(&p->cur);
    gs_cur_next(&p->cur);
    start = gs_cur_peek(&p->cur);
    while (gs_cur_peek(&p->cur)->kind != GS_TK_END && !at_key(&p->cur))
        gs_cur_next(&p->cur);
    if (gs_cur_peek(&p->cur) == start) {
        gs_parser_expected(p, start, "a value", bias_form);
        return GS_ESYNTAX;
    }
    b->keys = gs_reallocarray(b->keys, (size_t)b->nparams + 1,
                              sizeof *b->keys);
    b->vals = gs_reallocarray(b->vals, (size_t)b->nparams + 1,
                              sizeof *b->vals);
    b->val_col = gs_reallocarray(b->val_col, (size_t)b->nparams + 1,
                                 sizeof *b->val_col);
    b->keys[b->nparams] = gs_strdup(key->text);
    b->vals[b->nparams] = join_tokens(start, gs_cur_peek(&p->cur));
    gs_lex_position(&p->lx, start->off, &line, &b->val_col[b->nparams]);
    b->nparams++;
    if ((k = noise_key_index(key->text)) >= 0) {
        /* whether it is a mosfet's is known once the names resolve */
        p->bias_noise = gs_reallocarray(p->bias_noise, p->nbias_noise + 1,
                                        sizeof *p->bias_noise);
        p->bias_noise[p->nbias_noise].bias = p->c->nbiases;
        p->bias_noise[p->nbias_noise].key = k;
        p->bias_noise[p->nbias_noise].key_off = key->off;
        p->bias_noise[p->nbias_noise].val_off = start->off;
        p->nbias_noise++;
    }
    return GS_OK;
}

static void bias_clear(gs_bias *b)
{
    int i;
    for (i = 0; i < b->nparams; i++) {
        gs_free(b->keys[i]);
        gs_free(b->vals[i]);
    }
    gs_free(b->keys);
    gs_free(b->vals);
    gs_free(b->val_col);
}

int gs_parse_bias(gs_parser *p)
{
    const gs_token *name = gs_cur_next(&p->cur);
    gs_circuit *c = p->c;
    gs_bias b;
    int rc = GS_OK;
    if (name->kind != GS_TK_IDENT || name->dotted
        || (name[1].kind == GS_TK_PUNCT && name[1].text[0] == '=')) {
        gs_parser_expected(p, name, "the name of a mosfet or bjt",
                           bias_form);
        return GS_ESYNTAX;
    }
    memset(&b, 0, sizeof b);
    b.device = -1;
    gs_lex_position(&p->lx, name->off, &b.line, &b.col);
    if (gs_cur_peek(&p->cur)->kind == GS_TK_END) {
        gs_parser_expected(p, gs_cur_peek(&p->cur), "a parameter KEY=VALUE",
                           bias_form);
        rc = GS_ESYNTAX;
    }
    while (rc == GS_OK && gs_cur_peek(&p->cur)->kind != GS_TK_END)
        rc = bias_pair(p, &b);
    if (rc != GS_OK) {
        /* the line is not kept, and neither are its noise parameters */
        while (p->nbias_noise > 0
               && p->bias_noise[p->nbias_noise - 1].bias == c->nbiases)
            p->nbias_noise--;
        bias_clear(&b);
        return rc;
    }
    c->biases = gs_grow(c->biases, c->nbiases, &p->biases_alloc,
                        sizeof *c->biases);
    c->biases[c->nbiases] = b;
    gs_parser_add_ref(p, GS_REF_BIAS, c->nbiases++, 0, name);
    return GS_OK;
}

/* ---- noise parameters on bias lines ---- */

/* The exact value of a figure that gs_units_parse has accepted: the
   decimal with its prefix (gs_rat_parse stops before the unit), or the
   quotient a/b, as a value line would hold it. */
static int exact_figure(gs_rat *r, const char *text)
{
    const char *end;
    gs_rat den;
    int rc;
    if (gs_rat_parse(r, text, &end) != GS_OK)
        return GS_ESYNTAX;
    if (*end != '/')
        return GS_OK;
    gs_rat_init(&den);
    rc = gs_rat_parse(&den, end + 1, &end) == GS_OK ? GS_OK : GS_ESYNTAX;
    if (rc == GS_OK)
        rc = gs_rat_div(r, r, &den) == GS_OK ? GS_OK : GS_ESYNTAX;
    gs_rat_clear(&den);
    return rc;
}

/* A value bound twice: reported where the later of the two is written,
   as two value lines would be. */
static void noise_dup(gs_parser *p, const char *name, const gs_valuedef *v,
                      size_t key_off, int line, int col)
{
    if (v->line < line || (v->line == line && v->col < col))
        gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, key_off, NULL,
                      "duplicate value for '%s' (first at %d:%d)", name,
                      v->line, v->col);
    else
        gs_diag_add(p->d, GS_SEV_ERROR, p->c->file, v->line, v->col, NULL,
                    "duplicate value for '%s' (first at %d:%d)", name, line,
                    col);
}

/* Bind one noise parameter KEY=FIGURE of the bias line of mosfet dv. */
static void bind_bias_noise(gs_parser *p, const gs_bias_noise *bn,
                            const gs_device *dv, const char *key,
                            const char *text)
{
    int k = noise_key_index(key), line, col, sym, prev;
    gs_srcpos at = {p->c->file, 0, 0};
    long double v;
    gs_expr *e;
    char *name, *origin;

    gs_lex_position(&p->lx, bn->val_off, &at.line, &at.col);
    if (gs_units_parse(&v, text, noise_units[k], key, &at, p->d) != GS_OK)
        return;
    /* a noise density is never below zero: each parameter is a positive
       physical figure */
    if (!(v > 0)) {
        gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, bn->val_off,
                      "the noise parameters nthermal, kf, cox, w and l are "
                      "positive figures (docs/noise.md)",
                      "%s must be positive, got %s", key,
                      gs_units_text(v, noise_units[k]).s);
        return;
    }
    e = gs_calloc(1, sizeof *e);
    e->kind = GS_EX_NUM;
    gs_rat_init(&e->num);
    gs_lex_position(&p->lx, bn->key_off, &line, &col);
    e->line = line;
    e->col = col;
    if (exact_figure(&e->num, text) != GS_OK) {
        gs_lex_report(&p->lx, p->d, GS_SEV_ERROR, bn->val_off, NULL,
                      "%s expects a number, got %s", key, text);
        gs_expr_free(e);
        return;
    }
    name = gs_asprintf("%s_%s", key, dv->name);
    sym = gs_symtab_intern(p->c->syms, name);
    if ((prev = gs_circuit_find_value(p->c, sym)) >= 0) {
        noise_dup(p, name, &p->c->values[prev], bn->key_off, line, col);
        gs_expr_free(e);
    } else {
        origin = gs_asprintf("bias %s", dv->name);
        gs_circuit_add_value(p->c, sym, e, origin, line, col);
        gs_free(origin);
    }
    gs_free(name);
}

/* Take the noise parameters off bias line b, leaving its figures. */
static void strip_bias_noise(gs_bias *b)
{
    int i, n = 0;
    for (i = 0; i < b->nparams; i++) {
        if (noise_key_index(b->keys[i]) >= 0) {
            gs_free(b->keys[i]);
            gs_free(b->vals[i]);
            continue;
        }
        b->keys[n] = b->keys[i];
        b->vals[n] = b->vals[i];
        b->val_col[n] = b->val_col[i];
        n++;
    }
    b->nparams = n;
}

void gs_parser_bias_noise(gs_parser *p)
{
    size_t i;
    int j;
    for (i = 0; i < p->nbias_noise; i++) {
        const gs_bias_noise *bn = &p->bias_noise[i];
        const gs_bias *b = &p->c->biases[bn->bias];
        /* a bjt's line keeps them: its figures have none, and the device
           model says so */
        if (b->device < 0 || p->c->devices[b->device].is_bjt)
            continue;
        for (j = 0; j < b->nparams; j++)
            if (strcmp(b->keys[j], noise_keys[bn->key]) == 0)
                bind_bias_noise(p, bn, &p->c->devices[b->device],
                                b->keys[j], b->vals[j]);
    }
    for (i = 0; i < p->nbias_noise; i++) {
        gs_bias *b = &p->c->biases[p->bias_noise[i].bias];
        if (b->device >= 0 && !p->c->devices[b->device].is_bjt)
            strip_bias_noise(b);        /* a second time does nothing */
    }
}
