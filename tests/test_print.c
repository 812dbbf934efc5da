/* test_print.c - tests of the text, 2-D, LaTeX, C and JSON printers.
 * See LICENSE.
 *
 * Golden strings fix the formats of docs/output.md byte for byte on
 * textbook transfer functions; a JSON checker written from the RFC 8259
 * grammar validates every JSON object; generated C is compiled with the
 * system compiler and run (skipped, loudly, without one).  The LaTeX of
 * every case is written to test_print.tex beside this program, for
 * tests/latex_check.sh to build with pdflatex.
 */
#include "check.h"
#include "testlib.h"
#include "gainsmith.h"
#include "base/mem.h"
#include "base/strbuf.h"
#include "analysis/tf.h"
#include "output/json.h"

#include <inttypes.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

typedef struct fix {
    gs_symtab *st;
    gs_polyctx *ctx;
    int s;
    FILE *tex;              /* the LaTeX document, NULL if not writable */
} fix;

/* Symbols in this order, so the canonical order reads naturally. */
static const char *const names[] = {
    "s", "gm", "Cgd", "CL", "C", "R", "RD", "RS", "C1", "C2", "R1", "R2",
    "rds", "Cgs_M1", "beta"
};
#define NNAMES ((int)(sizeof names / sizeof names[0]))

static void fix_init(fix *f, const char *argv0)
{
    int i;
    f->st = gs_symtab_new();
    for (i = 0; i < NNAMES; i++)
        gs_symtab_intern(f->st, names[i]);
    gs_symtab_recip(f->st, gs_symtab_find(f->st, "R"));  /* "1/R" */
    f->ctx = gs_polyctx_new(f->st, gs_symtab_count(f->st));
    f->s = 0;
    f->tex = NULL;
    if (argv0 != NULL) {
        const char *slash = strrchr(argv0, '/');
        size_t dir = slash != NULL ? (size_t)(slash - argv0 + 1) : 0;
        char *path = malloc(dir + 32);
        memcpy(path, argv0, dir);
        strcpy(path + dir, "test_print.tex");
        f->tex = fopen(path, "w");
        free(path);
    }
    if (f->tex != NULL)
        fputs("\\documentclass{article}\n\\usepackage{amsmath}\n"
              "\\begin{document}\n", f->tex);
}

static void fix_clear(fix *f)
{
    if (f->tex != NULL) {
        fputs("\\end{document}\n", f->tex);
        fclose(f->tex);
    }
    gs_polyctx_free(f->ctx);
    gs_symtab_free(f->st);
}

/* p = terms separated by '|', each "COEF NAME NAME^K ...":
   "-1 gm RD | 1 gm RS | 1" is -gm*RD + gm*RS + 1. */
static void poly_from(gs_poly *p, const fix *f, const char *spec)
{
    char *copy = strdup(spec), *save = NULL, *tok;
    unsigned *exps = calloc((size_t)f->ctx->nvars, sizeof *exps);
    int first = 1;
    gs_int c;
    gs_int_init(&c);
    gs_poly_zero(p);
    for (tok = strtok_r(copy, " ", &save); tok != NULL;
         tok = strtok_r(NULL, " ", &save)) {
        if (strcmp(tok, "|") == 0) {
            gs_poly_push_term(p, &c, exps, f->ctx);
            memset(exps, 0, (size_t)f->ctx->nvars * sizeof *exps);
            first = 1;
        } else if (first) {
            gs_int_set_str(&c, tok);
            first = 0;
        } else {
            char *hat = strchr(tok, '^');
            if (hat != NULL)
                *hat = '\0';
            exps[gs_symtab_find(f->st, tok)] +=
                hat != NULL ? (unsigned)atoi(hat + 1) : 1u;
        }
    }
    gs_poly_push_term(p, &c, exps, f->ctx);
    gs_poly_canonicalise(p, f->ctx);
    gs_int_clear(&c);
    free(exps);
    free(copy);
}

static void tf_from(gs_tf *tf, const fix *f, const char *name,
                    const char *num, const char *den)
{
    gs_tf_init(tf, f->ctx, f->s);
    gs_tf_set_name(tf, name);
    poly_from(&tf->num, f, num);
    poly_from(&tf->den, f, den);
}

typedef void (*printer)(FILE *, const gs_tf *, int);

static char *capture(printer fn, const gs_tf *tf, int cv);

/* The text of the same N and D reached another way: N = (N + D) - D and
   D = (D + N) - N, so the printer sees polynomials with other storage
   and history.  The text depends on the values only, so it must be the
   text of tf; it differs if printing reads anything else, or if a sum
   leaves a polynomial in a form that is not canonical. */
static char *text_via_sums(const gs_tf *tf, int cv, const fix *f)
{
    gs_tf u;
    char *t;
    gs_tf_init(&u, f->ctx, f->s);
    gs_tf_set_name(&u, gs_tf_name(tf));
    gs_poly_add(&u.num, &tf->num, &tf->den, f->ctx);
    gs_poly_sub(&u.num, &u.num, &tf->den, f->ctx);
    gs_poly_add(&u.den, &tf->den, &tf->num, f->ctx);
    gs_poly_sub(&u.den, &u.den, &tf->num, f->ctx);
    t = capture(gs_print_text, &u, cv);
    gs_tf_clear(&u);
    return t;
}

/* What fn prints, as a new string (through a temporary file: C11). */
static char *capture(printer fn, const gs_tf *tf, int cv)
{
    FILE *m = tmpfile();
    char *buf;
    long len;
    fn(m, tf, cv);
    len = ftell(m);
    rewind(m);
    buf = calloc((size_t)len + 1, 1);
    if (fread(buf, 1, (size_t)len, m) != (size_t)len)
        buf[0] = '\0';
    fclose(m);
    return buf;
}

static void print_c_cv(FILE *out, const gs_tf *tf, int cv)
{
    (void)cv;
    gs_print_c(out, tf);
}

/* ---- a JSON checker, from the grammar of RFC 8259 ---- */

static void js_ws(const char **p)
{
    while (**p == ' ' || **p == '\t' || **p == '\n' || **p == '\r')
        (*p)++;
}

static int js_value(const char **p, int depth);

static int js_string(const char **p)
{
    const char *s = *p;
    if (*s++ != '"')
        return 0;
    while (*s != '"') {
        if ((unsigned char)*s < 0x20)
            return 0;
        if (*s == '\\') {
            s++;
            if (*s == 'u') {
                int i;
                for (i = 1; i <= 4; i++)
                    if (strchr("0123456789abcdefABCDEF", s[i]) == NULL
                        || s[i] == '\0')
                        return 0;
                s += 4;
            } else if (strchr("\"\\/bfnrt", *s) == NULL || *s == '\0') {
                return 0;
            }
        }
        s++;
    }
    *p = s + 1;
    return 1;
}

static int js_number(const char **p)
{
    const char *s = *p;
    if (*s == '-')
        s++;
    if (*s == '0')
        s++;
    else if (*s >= '1' && *s <= '9')
        while (*s >= '0' && *s <= '9')
            s++;
    else
        return 0;
    if (*s == '.') {
        if (*++s < '0' || *s > '9')
            return 0;
        while (*s >= '0' && *s <= '9')
            s++;
    }
    if (*s == 'e' || *s == 'E') {
        s++;
        if (*s == '+' || *s == '-')
            s++;
        if (*s < '0' || *s > '9')
            return 0;
        while (*s >= '0' && *s <= '9')
            s++;
    }
    *p = s;
    return 1;
}

/* array or object: open, values (with keys for objects), close */
static int js_compound(const char **p, int depth, char close)
{
    (*p)++;
    js_ws(p);
    if (**p == close) {
        (*p)++;
        return 1;
    }
    for (;;) {
        if (close == '}') {
            if (!js_string(p))
                return 0;
            js_ws(p);
            if (*(*p)++ != ':')
                return 0;
        }
        if (!js_value(p, depth + 1))
            return 0;
        if (**p == ',') {
            (*p)++;
            js_ws(p);
            continue;
        }
        if (*(*p)++ != close)
            return 0;
        return 1;
    }
}

static int js_value(const char **p, int depth)
{
    int ok;
    if (depth > 64)
        return 0;
    js_ws(p);
    if (**p == '{' || **p == '[')
        ok = js_compound(p, depth, **p == '{' ? '}' : ']');
    else if (**p == '"')
        ok = js_string(p);
    else if (strncmp(*p, "true", 4) == 0 || strncmp(*p, "null", 4) == 0)
        ok = (*p += 4, 1);
    else if (strncmp(*p, "false", 5) == 0)
        ok = (*p += 5, 1);
    else
        ok = js_number(p);
    js_ws(p);
    return ok;
}

static int json_valid(const char *text)
{
    const char *p = text;
    return js_value(&p, 0) && *p == '\0';
}

/* ---- golden cases ---- */

typedef struct golden {
    const char *source;     /* where the closed form comes from */
    const char *name, *num, *den;
    int collect;            /* index into names[], or -1 */
    const char *text, *pretty, *latex;
} golden;

static const golden goldens[] = {
    /* Razavi, Design of Analog CMOS Integrated Circuits, ch. 3:
       degenerated common-source gain -gm*RD/(1 + gm*RS) (from memory) */
    { "degenerated CS", "Av", "-1 gm RD", "1 gm RS | 1", 0,
      "Av = (-gm*RD)/(gm*RS + 1)\n",
      "       -gm*RD\n"
      "Av = -----------\n"
      "      gm*RS + 1\n",
      "\\begin{equation}\n"
      "A_{v} = \\frac{-g_{m}\\,R_{D}}{g_{m}\\,R_{S} + 1}\n"
      "\\end{equation}\n" },
    /* first-order RC low-pass 1/(1 + s*R*C), any circuits textbook */
    { "RC low-pass", "H", "1", "1 C R s | 1", 0,
      "H = (1)/(C*R*s + 1)\n",
      "         1\n"
      "H = -----------\n"
      "     C*R*s + 1\n",
      "\\begin{equation}\n"
      "H = \\frac{1}{C\\,R\\,s + 1}\n"
      "\\end{equation}\n" },
    /* two-section RC ladder, unloaded: 1/(s^2*R1*R2*C1*C2
       + s*(R1*C1 + R1*C2 + R2*C2) + 1), any circuits textbook */
    { "RC ladder", "H2", "1", "1 C1 C2 R1 R2 s^2 | 1 C1 R1 s | 1 C2 R1 s"
      " | 1 C2 R2 s | 1", 0,
      "H2 = (1)/(C1*C2*R1*R2*s^2 + (C1*R1 + C2*R1 + C2*R2)*s + 1)\n",
      "                             1\n"
      "H2 = -------------------------------------------------\n"
      "      C1*C2*R1*R2*s^2 + (C1*R1 + C2*R1 + C2*R2)*s + 1\n",
      "\\begin{equation}\n"
      "H_{2} = \\frac{1}{C_{1}\\,C_{2}\\,R_{1}\\,R_{2}\\,s^{2} + \\left( "
      "C_{1}\\,R_{1} + C_{2}\\,R_{1} + C_{2}\\,R_{2} \\right) s + 1}\n"
      "\\end{equation}\n" },
    /* Razavi, ch. 6: common-source stage with Cgd, ideal input source,
       (Cgd*s - gm)*RD/(1 + s*RD*(Cgd + CL)) (from memory) */
    { "CS with Cgd", "Av", "1 Cgd RD s | -1 gm RD", "1 Cgd RD s | 1 CL RD s"
      " | 1", 0,
      "Av = (Cgd*RD*s - gm*RD)/((Cgd*RD + CL*RD)*s + 1)\n",
      "         Cgd*RD*s - gm*RD\n"
      "Av = ------------------------\n"
      "      (Cgd*RD + CL*RD)*s + 1\n",
      "\\begin{equation}\n"
      "A_{v} = \\frac{C_{gd}\\,R_{D}\\,s - g_{m}\\,R_{D}}{\\left( C_{gd}\\,"
      "R_{D} + C_{L}\\,R_{D} \\right) s + 1}\n"
      "\\end{equation}\n" },
    /* the degenerated CS gain grouped by powers of gm (--collect gm) */
    { "CS by gm", "Av", "-1 gm RD", "1 gm RS | 1", 1,
      "Av = (-RD*gm)/(RS*gm + 1)\n",
      "       -RD*gm\n"
      "Av = -----------\n"
      "      RS*gm + 1\n",
      "\\begin{equation}\n"
      "A_{v} = \\frac{-R_{D}\\,g_{m}}{R_{S}\\,g_{m} + 1}\n"
      "\\end{equation}\n" },
    /* format rules of docs/output.md: a negative group keeps its sign
       outside the parentheses; unit coefficients print bare */
    { "signs", "G", "-1 C1 R1 s^2 | -1 C2 R2 s^2 | -1 s | -1",
      "2 s^3 | -1 s | 3 rds", 0,
      "G = (-(C1*R1 + C2*R2)*s^2 - s - 1)/(2*s^3 - s + 3*rds)\n",
      "     -(C1*R1 + C2*R2)*s^2 - s - 1\n"
      "G = ------------------------------\n"
      "          2*s^3 - s + 3*rds\n",
      "\\begin{equation}\n"
      "G = \\frac{-\\left( C_{1}\\,R_{1} + C_{2}\\,R_{2} \\right) s^{2} - s"
      " - 1}{2\\,s^{3} - s + 3\\,r_{ds}}\n"
      "\\end{equation}\n" },
    /* ungrouped (collect -1), powers, Greek and subscripted names */
    { "ungrouped", "Zout", "1 beta^2 Cgs_M1 s | 1 rds", "1 gm rds | 1", -1,
      "Zout = (s*Cgs_M1*beta^2 + rds)/(gm*rds + 1)\n",
      "        s*Cgs_M1*beta^2 + rds\n"
      "Zout = -----------------------\n"
      "             gm*rds + 1\n",
      "\\begin{equation}\n"
      "Z_{out} = \\frac{s\\,C_{gs,M1}\\,\\beta^{2} + r_{ds}}{g_{m}\\,r_{ds}"
      " + 1}\n"
      "\\end{equation}\n" },
    /* 2^70 = 1180591620717411303424 (exact power of two), a zero
       numerator, a reciprocal symbol */
    { "big", "B", "1180591620717411303424 gm", "-7 1/R | 1", 0,
      "B = (1180591620717411303424*gm)/(-7*(1/R) + 1)\n",
      "     1180591620717411303424*gm\n"
      "B = ---------------------------\n"
      "           -7*(1/R) + 1\n",
      "\\begin{equation}\n"
      "B = \\frac{1180591620717411303424\\,g_{m}}{-7\\,{\\frac{1}{R}} + 1}\n"
      "\\end{equation}\n" },
    /* a denominator of 1 is not printed, in any form */
    { "zero", "Z", "0", "1", 0,
      "Z = 0\n",
      "Z = 0\n",
      "\\begin{equation}\n"
      "Z = 0\n"
      "\\end{equation}\n" },
};
#define NGOLDEN (sizeof goldens / sizeof goldens[0])

static void check_golden(fix *f, const golden *g)
{
    gs_tf tf;
    char *t, *p, *l, *again;
    tf_from(&tf, f, g->name, g->num, g->den);
    t = capture(gs_print_text, &tf, g->collect);
    p = capture(gs_print_pretty, &tf, g->collect);
    l = capture(gs_print_latex, &tf, g->collect);
    CHECK_MSG(strcmp(t, g->text) == 0, "%s: text\n%s", g->source, t);
    CHECK_MSG(strcmp(p, g->pretty) == 0, "%s: pretty\n%s", g->source, p);
    CHECK_MSG(strcmp(l, g->latex) == 0, "%s: latex\n%s", g->source, l);
    again = text_via_sums(&tf, g->collect, f);
    CHECK_MSG(strcmp(t, again) == 0, "%s: by sums\n%s", g->source, again);
    if (f->tex != NULL)
        fputs(l, f->tex);
    free(t);
    free(p);
    free(l);
    free(again);
    gs_tf_clear(&tf);
}

static void test_goldens(fix *f)
{
    size_t i;
    for (i = 0; i < NGOLDEN; i++)
        check_golden(f, &goldens[i]);
}

/* The JSON of the degenerated CS gain (Razavi, ch. 3), exactly. */
static void test_json_golden(fix *f)
{
    gs_tf tf;
    char *j;
    tf_from(&tf, f, "Av", "-1 gm RD", "1 gm RS | 1");
    gs_tf_set_description(&tf, "v(out) / v(\"in\")\\");
    j = capture(gs_print_json, &tf, f->s);
    CHECK(json_valid(j));
    CHECK_MSG(strcmp(j, "{\"name\": \"Av\", \"kind\": \"transfer\", "
              "\"description\": \"v(out) / v(\\\"in\\\")\\\\\", "
              "\"s\": \"s\", \"collect\": \"s\", "
              "\"symbols\": [\"gm\", \"RD\", \"RS\"], "
              "\"num\": [{\"power\": 0, \"terms\": [{\"coeff\": \"-1\", "
              "\"exps\": {\"gm\": 1, \"RD\": 1}}]}], "
              "\"den\": [{\"power\": 0, \"terms\": [{\"coeff\": \"1\", "
              "\"exps\": {\"gm\": 1, \"RS\": 1}}, {\"coeff\": \"1\", "
              "\"exps\": {}}]}], "
              "\"text\": \"Av = (-gm*RD)/(gm*RS + 1)\"}") == 0, "%s", j);
    free(j);
    gs_tf_clear(&tf);
}

/* JSON of every golden, with the RC low-pass grouped by s: the groups
   come highest power first and the kind follows tf->kind. */
static void test_json_structure(fix *f)
{
    gs_tf tf;
    char *j;
    size_t i;
    for (i = 0; i < NGOLDEN; i++) {
        tf_from(&tf, f, goldens[i].name, goldens[i].num, goldens[i].den);
        tf.kind = i % 2 ? GS_TF_IMPEDANCE : GS_TF_TRANSFER;
        j = capture(gs_print_json, &tf, goldens[i].collect);
        CHECK_MSG(json_valid(j), "%s", j);
        CHECK(strstr(j, i % 2 ? "\"kind\": \"impedance\""
                              : "\"kind\": \"transfer\"") != NULL);
        free(j);
        gs_tf_clear(&tf);
    }
    tf_from(&tf, f, "H", "1", "1 C R s | 1");
    j = capture(gs_print_json, &tf, f->s);
    CHECK(strstr(j, "\"den\": [{\"power\": 1, \"terms\": [{\"coeff\": \"1\","
                    " \"exps\": {\"C\": 1, \"R\": 1}}]}, {\"power\": 0,")
          != NULL);
    CHECK(strstr(j, "\"symbols\": [\"C\", \"R\"]") != NULL);
    free(j);
    j = capture(gs_print_json, &tf, -1);
    CHECK(strstr(j, "\"collect\": null") != NULL);
    CHECK(strstr(j, "\"den\": [{\"power\": 0, \"terms\": [{\"coeff\": \"1\","
                    " \"exps\": {\"s\": 1, \"C\": 1, \"R\": 1}}") != NULL);
    free(j);
    gs_tf_clear(&tf);
}

/* Escaping: a name with a quote, a control character, UTF-8 (kept) and
   a stray byte (replaced), RFC 8259 section 7. */
static void test_json_escape(fix *f)
{
    gs_tf tf;
    char *j;
    tf_from(&tf, f, "a\"b\x01\xce\xbc\xff", "1", "1");
    j = capture(gs_print_json, &tf, f->s);
    CHECK_MSG(json_valid(j), "%s", j);
    CHECK(strstr(j, "\"name\": \"a\\\"b\\u0001\xce\xbc\\ufffd\"") != NULL);
    CHECK(!json_valid("{\"a\": }"));        /* the checker does reject */
    CHECK(!json_valid("{\"a\": \"\x01\"}"));
    CHECK(json_valid("[1, -0.5e+3, true, null, {\"k\": []}]"));
    free(j);
    gs_tf_clear(&tf);
}

/* The "text" field is written as it is made, in 64 KiB pieces through
   the escaping writer: it must be gs_json_string of gs_tf_get_str, for
   a name that needs escapes and for a side of 6,435 terms (C(15, 8),
   the monomials of degree 8 in 8 symbols: stars and bars), whose text
   spans several pieces. */
static void test_json_text_streamed(fix *f)
{
    static const char *const cases[][3] = {
        { "a\"b\x01\xce\xbc\xff", "gm*RD", "1 + s*C*RD" },
        { "Hbig", "(s + gm + Cgd + CL + C + RD + RS + C1)^8", "1 + s*C1" },
    };
    size_t i;
    for (i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        gs_tf tf;
        char *j, *line, *want, *field;
        FILE *m = tmpfile();
        long len;
        gs_tf_init(&tf, f->ctx, f->s);
        gs_tf_set_name(&tf, cases[i][0]);
        CHECK(gs_poly_set_str(&tf.num, cases[i][1], f->ctx) == GS_OK);
        CHECK(gs_poly_set_str(&tf.den, cases[i][2], f->ctx) == GS_OK);
        j = capture(gs_print_json, &tf, f->s);
        line = gs_tf_get_str(&tf, f->s);
        fputs(", \"text\": ", m);
        gs_json_string(m, line);
        fputc('}', m);
        len = ftell(m);
        rewind(m);
        want = calloc((size_t)len + 1, 1);
        CHECK(fread(want, 1, (size_t)len, m) == (size_t)len);
        fclose(m);
        field = strstr(j, ", \"text\": ");
        CHECK_MSG(field != NULL && strcmp(field, want) == 0
                  && json_valid(j), "case %zu", i);
        CHECK_MSG(i == 0 || strlen(line) > 2 * 65536, "%zu", strlen(line));
        free(want);
        free(line);
        free(j);
        gs_tf_clear(&tf);
    }
}

/* ---- C output ---- */

static int have_cc(void)
{
    return system("cc --version >/dev/null 2>&1") == 0;
}

/* The C member name of variable v, as docs/output.md says it is mangled
   (only the reciprocal case occurs among the test's names). */
static char *member(const fix *f, int v)
{
    int base = gs_symtab_base(f->st, v);
    if (base >= 0)
        return gs_asprintf("inv_%s", gs_symtab_name(f->st, base));
    return strdup(gs_symtab_name(f->st, v));
}

/* main() lines that evaluate tf at vals and print the value */
static void write_call(FILE *src, const gs_tf *tf, const double complex *vals,
                       const fix *f)
{
    unsigned char *used = calloc((size_t)f->ctx->nvars, 2);
    int v;
    fprintf(src, "    {\n        struct %s_params p;\n"
            "        double complex h;\n"
            "        memset(&p, 0, sizeof p);\n", gs_tf_name(tf));
    gs_poly_used_vars(used, &tf->num, f->ctx);
    gs_poly_used_vars(used + f->ctx->nvars, &tf->den, f->ctx);
    for (v = 0; v < f->ctx->nvars; v++) {
        char *m;
        if (v == f->s || !(used[v] || used[f->ctx->nvars + v]))
            continue;
        m = member(f, v);
        fprintf(src, "        p.%s = %.17g;\n", m, creal(vals[v]));
        free(m);
    }
    fprintf(src, "        h = %s(%.17g + %.17g*I, &p);\n"
            "        printf(\"%%.17g %%.17g\\n\", creal(h), cimag(h));\n"
            "    }\n", gs_tf_name(tf), creal(vals[f->s]), cimag(vals[f->s]));
    free(used);
}

/* Writes the functions of tfs[0..n) and a main that prints each at vals
   into a scratch directory, compiles it with cc (warnings are errors)
   and runs it; got[i] is the i-th value.  0 on success. */
static int run_c(double complex *got, const gs_tf *tfs, size_t n,
                 const double complex *vals, const fix *f)
{
    char dir[] = "/tmp/gs_print_XXXXXX", cmd[256];
    size_t i;
    int rc = -1;
    FILE *src, *res;
    if (mkdtemp(dir) == NULL)
        return -1;
    snprintf(cmd, sizeof cmd, "%s/h.c", dir);
    src = fopen(cmd, "w");
    if (src != NULL) {
        for (i = 0; i < n; i++)
            gs_print_c(src, &tfs[i]);
        fputs("#include <stdio.h>\n#include <string.h>\n\n"
              "int main(void)\n{\n", src);
        for (i = 0; i < n; i++)
            write_call(src, &tfs[i], vals, f);
        fputs("    return 0;\n}\n", src);
        fclose(src);
        snprintf(cmd, sizeof cmd, "cd %s && cc -std=c99 -Wall -Wextra "
                 "-pedantic -Werror -o h h.c -lm && ./h >out.txt", dir);
        rc = system(cmd) == 0 ? 0 : -1;
    }
    snprintf(cmd, sizeof cmd, "%s/out.txt", dir);
    res = rc == 0 ? fopen(cmd, "r") : NULL;
    for (i = 0; res != NULL && i < n; i++) {
        double re, im;
        if (fscanf(res, "%lf %lf", &re, &im) != 2)
            rc = -1;
        got[i] = re + im * I;
    }
    if (res != NULL)
        fclose(res);
    if (rc != 0)
        fprintf(stderr, "test_print: C output kept in %s\n", dir);
    else {
        snprintf(cmd, sizeof cmd, "rm -rf %s", dir);
        rc = system(cmd) == 0 ? 0 : -1;
    }
    return rc;
}

/* Values for the symbols: positive reals near 1, s off the real axis. */
static void point(double complex *vals, const fix *f)
{
    int v;
    for (v = 0; v < f->ctx->nvars; v++)
        vals[v] = 0.5 + 0.125 * v;
    vals[f->s] = 0.3 + 1.1 * I;
}

/* N(s)/D(s) from the generated C against gs_poly_eval_c, a separate
   term-by-term evaluation; Horner and the term sum round differently,
   so agreement is to a relative 1e-12, common practice for a handful of
   double operations. */
static void check_c_values(const gs_tf *tfs, size_t n, const fix *f,
                           const char *what)
{
    double complex *vals = calloc((size_t)f->ctx->nvars, sizeof *vals);
    double complex *got = calloc(n, sizeof *got);
    size_t i;
    point(vals, f);
    CHECK_MSG(run_c(got, tfs, n, vals, f) == 0, "%s: compile or run", what);
    for (i = 0; i < n; i++) {
        double complex want = gs_poly_eval_c(&tfs[i].num, vals, f->ctx)
                              / gs_poly_eval_c(&tfs[i].den, vals, f->ctx);
        CHECK_MSG(cabs(got[i] - want) <= 1e-12 * (1 + cabs(want)),
                  "%s %zu: %.17g%+.17gi, want %.17g%+.17gi", what, i,
                  creal(got[i]), cimag(got[i]), creal(want), cimag(want));
    }
    free(vals);
    free(got);
}

/* The C of the degenerated CS gain (Razavi, ch. 3), byte for byte. */
static void test_c_golden(fix *f)
{
    gs_tf tf;
    char *c;
    tf_from(&tf, f, "Av", "-1 gm RD", "1 gm RS | 1");
    gs_tf_set_description(&tf, "v(out) / vin");
    c = capture(print_c_cv, &tf, 0);
    CHECK_MSG(strcmp(c,
        "/* Av = v(out) / vin (transfer), generated by gainsmith.\n"
        "   N(s)/D(s), each by Horner's rule in s. */\n"
        "#include <complex.h>\n\n"
        "struct Av_params {\n"
        "    double gm;\n    double RD;\n    double RS;\n};\n\n"
        "double complex Av(double complex s, const struct Av_params *p);\n\n"
        "double complex Av(double complex s, const struct Av_params *p)\n"
        "{\n"
        "    double complex n, d;\n\n"
        "    (void)s;\n"
        "    n = -p->gm*p->RD;\n"
        "    d = p->gm*p->RS + 1.0;\n"
        "    return n / d;\n"
        "}\n") == 0, "%s", c);
    free(c);
    gs_tf_clear(&tf);
    /* RC low-pass: Horner in s, 1/(C*R*s + 1) */
    tf_from(&tf, f, "H", "1", "1 C R s | 1");
    c = capture(print_c_cv, &tf, 0);
    CHECK_MSG(strstr(c, "    n = 1.0;\n    d = p->C*p->R;\n"
                        "    d = d*s + 1.0;\n") != NULL, "%s", c);
    free(c);
    gs_tf_clear(&tf);
}

/* Mangling: a transfer named like a keyword, a reciprocal member. */
static void test_c_names(fix *f)
{
    gs_tf tf;
    char *c;
    tf_from(&tf, f, "double", "1 1/R", "1 s");
    c = capture(print_c_cv, &tf, 0);
    CHECK_MSG(strstr(c, "struct double__params {\n    double inv_R;  "
                        "/* 1/R */\n};") != NULL, "%s", c);
    CHECK(strstr(c, "double complex double_(double complex s") != NULL);
    free(c);
    gs_tf_clear(&tf);
}

static void test_c_compiles(fix *f)
{
    gs_tf tfs[NGOLDEN];
    size_t i;
    if (!have_cc()) {
        printf("*** SKIPPED C compile checks: no 'cc' on PATH ***\n");
        return;
    }
    for (i = 0; i < NGOLDEN; i++) {
        tf_from(&tfs[i], f, goldens[i].name, goldens[i].num, goldens[i].den);
        free(tfs[i].name);
        tfs[i].name = gs_asprintf("%s_%zu", goldens[i].name, i);
    }
    check_c_values(tfs, NGOLDEN, f, "goldens");
    for (i = 0; i < NGOLDEN; i++)
        gs_tf_clear(&tfs[i]);
}

/* ---- random properties ---- */

static uint64_t next(gs_rng *x)
{
    return gs_rng_next(x);
}

/* A random polynomial: nterms terms over the test's ordinary symbols,
   exponents 0..3, coefficients -9..9 with a few past 2^64. */
static void random_poly(gs_poly *p, gs_rng *x, size_t nterms,
                        const fix *f)
{
    unsigned *exps = calloc((size_t)f->ctx->nvars, sizeof *exps);
    size_t t;
    int v;
    gs_int c;
    gs_int_init(&c);
    gs_poly_zero(p);
    for (t = 0; t < nterms; t++) {
        for (v = 0; v < NNAMES; v++)
            exps[v] = next(x) % 4 == 0 ? (unsigned)(next(x) % 4) : 0;
        gs_int_set_si(&c, (int64_t)(next(x) % 19) - 9);
        if (next(x) % 16 == 0)
            gs_int_mul_2exp(&c, &c, 70);
        gs_poly_push_term(p, &c, exps, f->ctx);
    }
    gs_poly_canonicalise(p, f->ctx);
    if (gs_poly_is_zero(p))
        gs_poly_set_si(p, 1, f->ctx);
    gs_int_clear(&c);
    free(exps);
}

/* The numerator of the text form, from "NAME = (N)/(D)", or "NAME = N"
   when the denominator is 1 (docs/output.md). */
static char *text_num(const char *text)
{
    const char *a = strstr(text, " = (") , *b;
    if (a == NULL || (b = strstr(a, ")/(")) == NULL) {
        a = strstr(text, " = ") + 3;
        return strndup(a, strlen(a) - 1);   /* less "\n" */
    }
    a += 4;
    return strndup(a, (size_t)(b - a));
}

/* The denominator of the text form ("1" when it is not printed). */
static char *text_den(const char *text)
{
    const char *a = strstr(text, ")/(");
    if (a == NULL)
        return strdup("1");
    a += 3;
    return strndup(a, strlen(a) - 2);     /* less ")\n" */
}

/* Parsed back by the polynomial module's reader, the text's N or D is
   the polynomial it came from. */
static int reads_back(const char *text, const gs_poly *want, const fix *f)
{
    gs_poly back;
    int ok;
    gs_poly_init(&back);
    ok = gs_poly_set_str(&back, text, f->ctx) == GS_OK
         && gs_poly_equal(&back, want, f->ctx);
    gs_poly_clear(&back);
    return ok;
}

/* The 2-D form: every line within maxcol columns, without trailing
   spaces, and the lines above the rule ("NAME = ---"), joined by single
   spaces, are the numerator num of the one-line form. */
static int pretty_ok(const char *pretty, const char *name, const char *num,
                     size_t maxcol)
{
    char *joined = calloc(strlen(pretty) + 1, 1);
    size_t nlen = strlen(name);
    const char *line, *end;
    int ok = 1, above = 1;
    for (line = pretty; (end = strchr(line, '\n')) != NULL; line = end + 1) {
        const char *p = line;
        ok &= (size_t)(end - line) <= maxcol && end > line && end[-1] != ' ';
        if (strncmp(line, name, nlen) == 0 && strncmp(line + nlen, " = -", 4)
                                              == 0)
            above = 0;
        if (!above)
            continue;
        while (*p == ' ')
            p++;
        if (*joined)
            strcat(joined, " ");
        strncat(joined, p, (size_t)(end - p));
    }
    ok &= *line == '\0' && strcmp(joined, num) == 0;
    free(joined);
    return ok;
}

static void test_random(fix *f, uint64_t seed)
{
    enum { N = 200, NC = 20 };
    gs_tf tfs[NC];
    gs_rng x;
    gs_rng_seed(&x, seed);
    int i;
    for (i = 0; i < N; i++) {
        gs_tf tf;
        char *t, *t2, *j, *p, *num, *den, *l;
        int cv = i % 3 == 2 ? -1 : (int)(next(&x) % 3);
        tf_from(&tf, f, "Hr", "1", "1");
        random_poly(&tf.num, &x, 1 + next(&x) % 12, f);
        random_poly(&tf.den, &x, 1 + next(&x) % 12, f);
        t = capture(gs_print_text, &tf, cv);
        t2 = text_via_sums(&tf, cv, f);
        j = capture(gs_print_json, &tf, cv);
        p = capture(gs_print_pretty, &tf, cv);
        l = capture(gs_print_latex, &tf, cv);
        num = text_num(t);
        den = text_den(t);
        CHECK_MSG(reads_back(num, &tf.num, f) && reads_back(den, &tf.den, f),
                  "seed %llu case %d: %s", (unsigned long long)seed, i, t);
        CHECK_MSG(strcmp(t, t2) == 0, "seed %llu case %d",
                  (unsigned long long)seed, i);
        CHECK_MSG(json_valid(j), "seed %llu case %d: %s",
                  (unsigned long long)seed, i, j);
        {
            /* with a denominator of 1 the pretty form is one wrapped
               line "Hr = N", with no fraction bar (docs/output.md) */
            char *want = strcmp(den, "1") == 0 ? gs_asprintf("Hr = %s", num)
                                               : strdup(num);
            CHECK_MSG(pretty_ok(p, "Hr", want, 79),
                      "seed %llu case %d:\n%s%s",
                      (unsigned long long)seed, i, t, p);
            free(want);
        }
        if (f->tex != NULL && i < 40)
            fputs(l, f->tex);
        free(t), free(t2), free(j), free(p), free(num), free(den), free(l);
        gs_tf_clear(&tf);
    }
    if (!have_cc())
        return;
    for (i = 0; i < NC; i++) {
        tf_from(&tfs[i], f, "Hr", "1", "1");
        free(tfs[i].name);
        tfs[i].name = gs_asprintf("Hr%d", i);
        random_poly(&tfs[i].num, &x, 1 + next(&x) % 12, f);
        random_poly(&tfs[i].den, &x, 1 + next(&x) % 12, f);
    }
    check_c_values(tfs, NC, f, "random");
    for (i = 0; i < NC; i++)
        gs_tf_clear(&tfs[i]);
}

/* A long numerator wraps at term boundaries within 79 columns, and the
   lines put back together are the one-line form (docs/output.md). */
static void test_pretty_wrap(fix *f)
{
    gs_tf tf;
    gs_rng x;
    gs_rng_seed(&x, 12345);
    char *t, *p, *num;
    tf_from(&tf, f, "W", "1", "1 C R s | 1");
    random_poly(&tf.num, &x, 60, f);
    t = capture(gs_print_text, &tf, f->s);
    p = capture(gs_print_pretty, &tf, f->s);
    num = text_num(t);
    CHECK(strlen(num) > 200);
    CHECK_MSG(pretty_ok(p, "W", num, 79), "\n%s", p);
    free(t), free(p), free(num);
    gs_tf_clear(&tf);
}

static void test_tf_lifetime(fix *f)
{
    gs_tf tf;
    gs_tf_init(&tf, f->ctx, f->s);
    CHECK(strcmp(gs_tf_name(&tf), "H") == 0);
    gs_tf_set_name(&tf, "Zin");
    gs_tf_set_name(&tf, "Zout");
    CHECK(strcmp(gs_tf_name(&tf), "Zout") == 0);
    gs_tf_set_description(&tf, "out, gnd");
    CHECK(gs_poly_is_zero(&tf.num) && gs_poly_is_zero(&tf.den));
    gs_tf_clear(&tf);
}

/* The text printer streams through a 64 KiB buffer: a result of a few
   hundred kilobytes prints byte for byte the line gs_tf_get_str makes
   (and reads back as the same polynomials). */
static void test_stream_long(fix *f)
{
    gs_tf tf;
    gs_rng x;
    char *t, *line, *num;
    gs_rng_seed(&x, 77);
    tf_from(&tf, f, "Hlong", "1", "1");
    random_poly(&tf.num, &x, 9000, f);
    random_poly(&tf.den, &x, 7000, f);
    t = capture(gs_print_text, &tf, f->s);
    line = gs_tf_get_str(&tf, f->s);
    CHECK_MSG(strlen(t) > 200000, "%zu bytes", strlen(t));
    CHECK(strlen(t) == strlen(line) + 1 && strncmp(t, line, strlen(line)) == 0
          && t[strlen(line)] == '\n');
    num = text_num(t);
    CHECK(reads_back(num, &tf.num, f));
    free(num);
    free(line);
    free(t);
    gs_tf_clear(&tf);
}

/* Names longer than the block the text printers copy a short name in
   (16 bytes), a reciprocal of one, exponents past 9 and coefficients
   past 2^64: the text reads back as the polynomials it came from (the
   reader of algebra/poly_print.c), and with no collecting variable N is
   the text gs_poly_get_str writes (its own loop over the terms); the
   lines of the 2-D form join back to it. */
static void test_long_names(uint64_t seed)
{
    static const char *const nm[] = {
        "s", "Rload_of_the_second_stage", "C1",
        "gm_input_pair_transconductance", "x"
    };
    enum { NV = 6, CASES = 60 };
    fix g;
    gs_rng x;
    int k, v;
    gs_rng_seed(&x, seed);
    g.st = gs_symtab_new();
    for (v = 0; v < NV - 1; v++)
        gs_symtab_intern(g.st, nm[v]);
    gs_symtab_recip(g.st, 1);                  /* "1/Rload_of_..." */
    g.ctx = gs_polyctx_new(g.st, gs_symtab_count(g.st));
    g.s = 0;
    g.tex = NULL;
    for (k = 0; k < CASES; k++) {
        gs_tf tf;
        gs_poly *side[2];
        unsigned exps[NV];
        int cv = k % 2 ? -1 : 0, j, t;
        char *text, *pretty, *num, *den, *plain;
        gs_int c;
        gs_int_init(&c);
        tf_from(&tf, &g, "Hn", "1", "1");
        side[0] = &tf.num;
        side[1] = &tf.den;
        for (j = 0; j < 2; j++) {
            gs_poly_zero(side[j]);
            for (t = 0; t < 1 + (int)(next(&x) % 20); t++) {
                for (v = 0; v < NV; v++)
                    exps[v] = next(&x) % 3 == 0 ? (unsigned)(next(&x) % 14)
                                                : 0;
                gs_int_set_si(&c, (int64_t)(next(&x) % 2001) - 1000);
                if (next(&x) % 8 == 0)
                    gs_int_mul_2exp(&c, &c, 80);
                gs_poly_push_term(side[j], &c, exps, g.ctx);
            }
            gs_poly_canonicalise(side[j], g.ctx);
            if (gs_poly_is_zero(side[j]))
                gs_poly_set_si(side[j], 3, g.ctx);
        }
        text = capture(gs_print_text, &tf, cv);
        pretty = capture(gs_print_pretty, &tf, cv);
        num = text_num(text);
        den = text_den(text);
        plain = gs_poly_get_str(&tf.num, g.ctx);
        CHECK_MSG(reads_back(num, &tf.num, &g) && reads_back(den, &tf.den, &g),
                  "seed %llu case %d: %s", (unsigned long long)seed, k, text);
        CHECK_MSG(cv == 0 || strcmp(num, plain) == 0,
                  "seed %llu case %d:\n%s\n%s", (unsigned long long)seed, k,
                  num, plain);
        if (strcmp(den, "1") != 0)      /* a term past 79 columns has
                                           a line of its own: no width */
            CHECK_MSG(pretty_ok(pretty, "Hn", num, (size_t)1 << 20),
                      "seed %llu case %d:\n%s", (unsigned long long)seed, k,
                      pretty);
        free(text), free(pretty), free(num), free(den);
        gs_free(plain);
        gs_int_clear(&c);
        gs_tf_clear(&tf);
    }
    gs_polyctx_free(g.ctx);
    gs_symtab_free(g.st);
}

/* The printers' decimal writer against the C library's "%" PRIu64 (C11
   7.21.6.1): the ends of the range, each power of ten and its
   predecessor, and random values of every width, appended one after the
   other into one string. */
static void test_decimal(uint64_t seed)
{
    gs_strbuf b;
    char want[64 * 22 + 22 * 45], *w = want;
    uint64_t p = 1;
    gs_rng x;
    int i;
    gs_rng_seed(&x, seed);
    gs_strbuf_init(&b);
#define ONE(v)                                                          \
    do {                                                                \
        uint64_t v_ = (v);                                              \
        gs_strbuf_add_u64(&b, v_);                                      \
        gs_strbuf_addn(&b, ",", 1);                                     \
        w += sprintf(w, "%" PRIu64 ",", v_);                            \
    } while (0)
    ONE(0);
    ONE(UINT64_MAX);
    for (i = 0; i < 19; i++, p *= 10) {
        ONE(p);
        ONE(p * 10 - 1);
    }
    for (i = 0; i < 64; i++)
        ONE(next(&x) >> i);
#undef ONE
    CHECK_MSG(strcmp(b.p, want) == 0, "seed %llu:\n%s\n%s",
              (unsigned long long)seed, b.p, want);
    gs_strbuf_clear(&b);
}

int main(int argc, char **argv)
{
    uint64_t seed = argc > 1 ? strtoull(argv[1], NULL, 10) : 20240601u;
    fix f;
    fix_init(&f, argv[0]);
    test_tf_lifetime(&f);
    test_decimal(seed);
    test_long_names(seed + 1);
    test_goldens(&f);
    test_json_golden(&f);
    test_json_structure(&f);
    test_json_escape(&f);
    test_json_text_streamed(&f);
    test_c_golden(&f);
    test_c_names(&f);
    test_c_compiles(&f);
    test_pretty_wrap(&f);
    test_random(&f, seed);
    test_stream_long(&f);
    fix_clear(&f);
    return check_report("print");
}
