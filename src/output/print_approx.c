/* print_approx.c - printers of a gs_approx_result. See LICENSE. */
#include "output/print_approx.h"

#include "base/mem.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* The estimate of a real root: -wn/wd, written with the sign folded in. */
static char *root_expr(const gs_approx_root *x, int style,
                       const gs_polyctx *ctx)
{
    gs_poly n;
    char *s;
    if (x->est != GS_APPROX_EST_REAL)
        return NULL;
    gs_poly_init(&n);
    gs_poly_neg(&n, &x->wn, ctx);
    s = gs_approx_form(&n, &x->wd, style, ctx);
    gs_poly_clear(&n);
    return s;
}

static void pair_exprs(char **w0sq, char **q, const gs_approx_root *x,
                       int style, const gs_polyctx *ctx)
{
    gs_poly a, b;
    char *t;
    gs_poly_init(&a);
    gs_poly_init(&b);
    *w0sq = gs_approx_form(&x->a0, &x->a2, style, ctx);
    gs_poly_mul(&a, &x->a0, &x->a2, ctx);
    gs_poly_mul(&b, &x->a1, &x->a1, ctx);
    t = gs_approx_form(&a, &b, style, ctx);
    *q = style == GS_FORM_LATEX ? gs_asprintf("\\sqrt{%s}", t)
                                : gs_asprintf("sqrt(%s)", t);
    gs_free(t);
    gs_poly_clear(&a);
    gs_poly_clear(&b);
}

static void put_root_num(FILE *out, long double complex z)
{
    if (cimagl(z) == 0)
        fprintf(out, "%.6Lg", creall(z));
    else
        fprintf(out, "%.6Lg%+.6Lgj", creall(z), cimagl(z));
}

/* K (1 + s/wz ...)/(1 + s/wp ...) over the roots inside the band, when
   each has an estimate (Middlebrook's normalised form); NULL otherwise. */
static char *normalised(const gs_approx_result *r, int style)
{
    const gs_polyctx *ctx = r->ctx;
    char *k = gs_approx_form(&r->dcn, &r->dcd, style, ctx), *part[2];
    size_t i;
    int w, any = 0;
    long double wmax = 2 * 3.141592653589793238462643383279502884L
                       * r->f_hi;
    part[0] = gs_strdup("");
    part[1] = gs_strdup("");
    for (i = 0; i < r->nroots; i++) {
        const gs_approx_root *x = &r->roots[i];
        char *f = NULL, *a, *b, *t;
        gs_poly n;
        if (x->at_origin || x->pair_of >= 0 || cabsl(x->exact) > wmax)
            continue;
        if (x->est == GS_APPROX_EST_NONE) {
            gs_free(k);
            gs_free(part[0]);
            gs_free(part[1]);
            return NULL;
        }
        gs_poly_init(&n);
        if (x->est == GS_APPROX_EST_REAL) {
            int rhp = gs_poly_sgn(&x->wn) * gs_poly_sgn(&x->wd) < 0;
            if (rhp)
                gs_poly_neg(&n, &x->wn, ctx);
            else
                gs_poly_set(&n, &x->wn, ctx);
            a = gs_approx_form(&n, &x->wd, style, ctx);
            f = gs_asprintf("(1 %s s/(%s))", rhp ? "-" : "+", a);
            gs_free(a);
        } else {
            a = gs_approx_form(&x->a1, &x->a0, style, ctx);
            b = gs_approx_form(&x->a2, &x->a0, style, ctx);
            f = gs_asprintf("(1 + s*(%s) + s^2*(%s))", a, b);
            gs_free(a);
            gs_free(b);
        }
        gs_poly_clear(&n);
        w = x->is_zero ? 0 : 1;
        t = gs_asprintf("%s%s%s", part[w], *part[w] ? "*" : "", f);
        gs_free(part[w]);
        part[w] = t;
        gs_free(f);
        any = 1;
    }
    if (!any) {
        gs_free(k);
        gs_free(part[0]);
        gs_free(part[1]);
        return NULL;
    }
    {
        char *t = gs_asprintf("(%s)%s%s%s%s%s", k, r->dc_order ? "*s^" : "",
                              "", *part[0] ? "*" : "", part[0],
                              *part[1] ? "/(" : "");
        char *u = gs_asprintf("%s%s%s", t, part[1], *part[1] ? ")" : "");
        gs_free(t);
        t = u;
        if (r->dc_order) {
            u = gs_asprintf("(%s)*s^%d%s%s%s%s%s", k, r->dc_order,
                            *part[0] ? "*" : "", part[0],
                            *part[1] ? "/(" : "", part[1],
                            *part[1] ? ")" : "");
            gs_free(t);
            t = u;
        }
        gs_free(k);
        gs_free(part[0]);
        gs_free(part[1]);
        return t;
    }
}

void gs_print_approx(FILE *out, const gs_approx_result *r, int style)
{
    const gs_polyctx *ctx = r->ctx;
    const char *name = gs_tf_name(&r->h);
    const char *ll = style == GS_FORM_LATEX ? "% " : "";
    size_t i;
    char *s;
    if (style == GS_FORM_TEXT)
        gs_print_text(out, &r->h, r->s_var);
    else if (style == GS_FORM_PRETTY)
        gs_print_pretty(out, &r->h, r->s_var);
    else
        gs_print_latex(out, &r->h, r->s_var);
    fprintf(out, "%s  %zu of %zu terms; band %.4Lg Hz to %.4Lg Hz, %d "
            "points\n", ll, r->terms_kept, r->terms_exact, r->f_lo, r->f_hi,
            r->npoints);
    fprintf(out, "%s  error at the nominal point: %.3Lg dB, %.3Lg deg\n", ll,
            r->err_db, r->err_deg);
    if (r->nspread)
        fprintf(out, "%s  error over the spread box (%d %s): %.3Lg dB, "
                "%.3Lg deg\n", ll, r->nspread,
                r->spread_corners ? "corners" : "seeded points",
                r->spread_db, r->spread_deg);
    if (!r->met)
        fprintf(out, "%s  the tolerance is NOT met; this is the best form "
                "reached\n", ll);
    s = gs_approx_form(&r->dcn, &r->dcd, style, ctx);
    fprintf(out, "%s%s gain ~ %s", ll, r->dc_order ? "low-frequency" : "DC",
            s);
    if (r->dc_order)
        fprintf(out, " * s^%d", r->dc_order);
    fprintf(out, "\n%s  = %.6Lg (exact %.6Lg, error %.3Lg %%)\n", ll,
            r->dc_value, r->dc_exact, 100 * r->dc_rel_error);
    gs_free(s);
    for (i = 0; i < r->nroots; i++) {
        const gs_approx_root *x = &r->roots[i];
        size_t nth = i + 1, k;
        for (k = 0; k < i; k++)
            if (r->roots[k].is_zero != x->is_zero)
                nth--;
        fprintf(out, "%s%s %zu: ", ll, x->is_zero ? "zero" : "pole", nth);
        if (x->at_origin) {
            fputs("0 (exact)\n", out);
            continue;
        }
        if (x->pair_of >= 0) {
            fputs("conjugate of the pair above: ", out);
            put_root_num(out, x->exact);
            fputc('\n', out);
            continue;
        }
        if (x->est == GS_APPROX_EST_REAL) {
            s = root_expr(x, style, ctx);
            fprintf(out, "~ %s\n", s);
            gs_free(s);
        } else if (x->est == GS_APPROX_EST_PAIR) {
            char *w, *q;
            pair_exprs(&w, &q, x, style, ctx);
            fprintf(out, "complex pair, w0^2 ~ %s, Q ~ %s\n", w, q);
            gs_free(w);
            gs_free(q);
        } else {
            fputs("no estimate (separation ", out);
            fprintf(out, "%.3Lg < %.3Lg); exact ", x->separation, 4.0L);
            put_root_num(out, x->exact);
            fputc('\n', out);
            continue;
        }
        fprintf(out, "%s  = ", ll);
        put_root_num(out, x->value);
        fputs(" (exact ", out);
        put_root_num(out, x->exact);
        fprintf(out, ", error %.3Lg %%, ", 100 * x->rel_error);
        if (x->factor)
            fprintf(out, "a factor of %s)\n", x->is_zero ? "N" : "D");
        else if (fputs("separation ", out), isfinite(x->separation))
            fprintf(out, "%.3Lg)\n", x->separation);
        else
            fputs("none needed)\n", out);
    }
    if ((s = normalised(r, style)) != NULL) {
        fprintf(out, "%snormalised: %s ~ %s\n", ll, name, s);
        gs_free(s);
    }
    if (r->ncond) {
        fprintf(out, "%sassumes", ll);
        for (i = 0; i < r->ncond; i++)
            fprintf(out, "%s %s >> %s (here %.3Lg)", i ? "," : "",
                    r->cond[i].lhs, r->cond[i].rhs, r->cond[i].value);
        if (r->ncond_total > r->ncond)
            fprintf(out, ", and %zu more, each larger",
                    r->ncond_total - r->ncond);
        fputc('\n', out);
    }
}

static void json_str(FILE *out, const char *s)
{
    fputc('"', out);
    for (; s && *s; s++) {
        if (*s == '"' || *s == '\\')
            fputc('\\', out);
        fputc(*s, out);
    }
    fputc('"', out);
}

static void json_num(FILE *out, long double v)
{
    if (isfinite(v))
        fprintf(out, "%.10Lg", v);
    else
        fputs("null", out);
}

static void json_cplx(FILE *out, long double complex z)
{
    fputs("{\"re\": ", out);
    json_num(out, creall(z));
    fputs(", \"im\": ", out);
    json_num(out, cimagl(z));
    fputc('}', out);
}

void gs_print_approx_json(FILE *out, const gs_approx_result *r)
{
    const gs_polyctx *ctx = r->ctx;
    char *s = gs_tf_get_str(&r->h, r->s_var);
    size_t i;
    fputs("{\"name\": ", out);
    json_str(out, gs_tf_name(&r->h));
    fputs(", \"approx\": ", out);
    json_str(out, s);
    gs_free(s);
    fprintf(out, ", \"met\": %s, \"terms\": %zu, \"terms_exact\": %zu",
            r->met ? "true" : "false", r->terms_kept, r->terms_exact);
    fputs(", \"band_hz\": [", out);
    json_num(out, r->f_lo);
    fputs(", ", out);
    json_num(out, r->f_hi);
    fputs("], \"error\": {\"mag_db\": ", out);
    json_num(out, r->err_db);
    fputs(", \"phase_deg\": ", out);
    json_num(out, r->err_deg);
    fputs(", \"spread_mag_db\": ", out);
    json_num(out, r->spread_db);
    fputs(", \"spread_phase_deg\": ", out);
    json_num(out, r->spread_deg);
    fputs("}, \"dc\": {\"expr\": ", out);
    s = gs_approx_form(&r->dcn, &r->dcd, GS_FORM_TEXT, ctx);
    json_str(out, s);
    gs_free(s);
    fprintf(out, ", \"s_order\": %d, \"value\": ", r->dc_order);
    json_num(out, r->dc_value);
    fputs(", \"exact_value\": ", out);
    json_num(out, r->dc_exact);
    fputs(", \"rel_error\": ", out);
    json_num(out, r->dc_rel_error);
    fputs("}, \"roots\": [", out);
    for (i = 0; i < r->nroots; i++) {
        const gs_approx_root *x = &r->roots[i];
        fprintf(out, "%s{\"kind\": \"%s\", \"expr\": ", i ? ", " : "",
                x->is_zero ? "zero" : "pole");
        if (x->at_origin) {
            fputs("\"0\"", out);
        } else if (x->est == GS_APPROX_EST_REAL) {
            s = root_expr(x, GS_FORM_TEXT, ctx);
            json_str(out, s);
            gs_free(s);
        } else if (x->est == GS_APPROX_EST_PAIR) {
            char *w, *q, *t;
            pair_exprs(&w, &q, x, GS_FORM_TEXT, ctx);
            t = gs_asprintf("w0^2 = %s; Q = %s", w, q);
            json_str(out, t);
            gs_free(t);
            gs_free(w);
            gs_free(q);
        } else {
            fputs("null", out);
        }
        fputs(", \"value\": ", out);
        if (x->est != GS_APPROX_EST_NONE || x->at_origin || x->pair_of >= 0)
            json_cplx(out, x->value);
        else
            fputs("null", out);
        fputs(", \"exact\": ", out);
        json_cplx(out, x->exact);
        fputs(", \"rel_error\": ", out);
        if (x->est != GS_APPROX_EST_NONE || x->at_origin || x->pair_of >= 0)
            json_num(out, x->rel_error);
        else
            fputs("null", out);
        fputs(", \"separation\": ", out);
        json_num(out, x->separation);
        fprintf(out, ", \"factor\": %s", x->factor ? "true" : "false");
        fputc('}', out);
    }
    fputs("], \"conditions\": [", out);
    for (i = 0; i < r->ncond; i++) {
        char *t = gs_asprintf("%s >> %s", r->cond[i].lhs, r->cond[i].rhs);
        fputs(i ? ", {\"ratio\": " : "{\"ratio\": ", out);
        json_str(out, t);
        fputs(", \"value\": ", out);
        json_num(out, r->cond[i].value);
        fputc('}', out);
        gs_free(t);
    }
    fputs("], \"normalised\": ", out);
    s = normalised(r, GS_FORM_TEXT);
    if (s)
        json_str(out, s);
    else
        fputs("null", out);
    gs_free(s);
    fprintf(out, ", \"conditions_total\": %zu, \"path\": ", r->ncond_total);
    json_str(out, r->path);
    fputc('}', out);
}
