/* test_api.c - the public interface, used as a program outside would.
 * See LICENSE.
 */
#include "check.h"
#include "gainsmith.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void test_derive_example(void)
{
    gs_result *r = NULL;
    char *messages = NULL, *text, *json;
    int rc = gs_derive_file(&r, "examples/inverting_amp.gsc", NULL,
                            &messages);
    CHECK(rc == GS_OK);
    CHECK(messages == NULL);
    CHECK(gs_result_count(r) == 1);
    CHECK(strcmp(gs_result_name(r, 0), "Av") == 0);
    text = gs_result_text(r, 0);
    /* Inverting amplifier with finite open-loop gain A:
       -A R2 / (R1 + R2 + A R1) (Sedra & Smith, Microelectronic Circuits,
       ch. 2, from memory); the term order is docs/output.md's. */
    CHECK_MSG(strcmp(text, "Av = (-R2*A)/(R1*A + R1 + R2)") == 0, "%s",
              text);
    json = gs_result_json(r, 0);
    CHECK(json[0] == '{' && strstr(json, "\"name\": \"Av\"") != NULL);
    free(text);
    free(json);
    gs_result_free(r);
}

static void test_errors(void)
{
    gs_result *r = (gs_result *)1;
    char *messages = NULL;
    int rc = gs_derive_file(&r, "tests/cli/err_unknown_statement.gsc", NULL,
                            &messages);
    CHECK(rc == GS_ESYNTAX);
    CHECK(r == NULL);
    CHECK(messages && strstr(messages, ":3:1: error: unknown statement "
                                       "'resistr'") != NULL);
    free(messages);
    rc = gs_derive_file(&r, "tests/cli/no-such-file.gsc", NULL, &messages);
    CHECK(rc == GS_EIO && r == NULL && messages != NULL);
    free(messages);
    rc = gs_derive_file(&r, "examples/cs_degen.gsc", "Nope", NULL);
    CHECK(rc == GS_EINVAL && r == NULL);
    gs_result_free(NULL);
    CHECK(strcmp(gs_strerror(GS_ESINGULAR), "singular system") == 0);
    CHECK(strcmp(gs_strerror(GS_ENOMEM), "out of memory") == 0);
}

/* An RC low-pass held in a string. */
static const char rc_text[] =
    "vsource   vin  in   gnd\n"
    "resistor  R    in   out\n"
    "capacitor C    out  gnd\n"
    "value     R = 1k\n"
    "value     C = 1u\n"
    "transfer  H = v(out) / vin\n";

static void test_version(void)
{
    CHECK(strcmp(gs_version(), GS_VERSION) == 0);
    CHECK(GS_VERSION_NUMBER == GS_VERSION_MAJOR * 10000
                                   + GS_VERSION_MINOR * 100
                                   + GS_VERSION_PATCH);
    {
        char v[32];
        snprintf(v, sizeof v, "%d.%d.%d", GS_VERSION_MAJOR,
                 GS_VERSION_MINOR, GS_VERSION_PATCH);
        CHECK_MSG(strcmp(v, GS_VERSION) == 0, "%s vs %s", v, GS_VERSION);
    }
}

static void test_options_defaults(void)
{
    gs_options o;
    memset(&o, 0xA5, sizeof o);
    gs_options_init(&o);
    CHECK(o.only == NULL && o.max_terms == GS_DEFAULT_MAX_TERMS && o.method == GS_METHOD_AUTO
          && o.limits == NULL && o.nlimits == 0
          && o.max_bytes == GS_DEFAULT_MAX_BYTES);
    gs_options_init(NULL);
}

static void test_structure(void)
{
    gs_result *r = NULL;
    char *messages = NULL;
    const gs_polynomial *n, *d;
    int rc = gs_derive_string(&r, rc_text, "rc.gsc", NULL, &messages);
    CHECK_MSG(rc == GS_OK, "%s", messages ? messages : "");
    free(messages);
    if (rc != GS_OK)
        return;
    /* H = 1/(R C s + 1), the first-order low-pass (any circuits text,
       e.g. Sedra & Smith ch. 1, from memory) */
    n = gs_result_poly(r, 0, GS_NUMERATOR);
    d = gs_result_poly(r, 0, GS_DENOMINATOR);
    CHECK(n && n->degree == 0 && n->ncoeffs == 1);
    CHECK(n && n->coeffs[0].power == 0 && n->coeffs[0].nterms == 1
          && strcmp(n->coeffs[0].terms[0].num, "1") == 0
          && strcmp(n->coeffs[0].terms[0].den, "1") == 0
          && n->coeffs[0].terms[0].nfactors == 0);
    CHECK(d && d->degree == 1 && d->ncoeffs == 2);
    if (d && d->ncoeffs == 2) {
        const gs_term *t = &d->coeffs[1].terms[0];
        CHECK(d->coeffs[0].power == 0 && d->coeffs[0].nterms == 1
              && d->coeffs[0].terms[0].nfactors == 0);
        CHECK(d->coeffs[1].power == 1 && d->coeffs[1].nterms == 1);
        CHECK(strcmp(t->num, "1") == 0 && t->nfactors == 2);
        CHECK(t->nfactors == 2 && strcmp(t->symbols[0], "R") == 0
              && strcmp(t->symbols[1], "C") == 0 && t->exps[0] == 1
              && t->exps[1] == 1);
    }
    /* accessors refuse what is out of range */
    CHECK(gs_result_poly(r, 1, GS_NUMERATOR) == NULL);
    CHECK(gs_result_poly(r, 0, 2) == NULL);
    CHECK(gs_result_poly(NULL, 0, GS_NUMERATOR) == NULL);
    CHECK(gs_result_name(r, 1) == NULL && gs_result_name(NULL, 0) == NULL);
    CHECK(gs_result_text(r, 1) == NULL && gs_result_json(r, 7) == NULL);
    CHECK(gs_result_text(NULL, 0) == NULL && gs_result_json(NULL, 0) == NULL);
    gs_result_free(r);
}

/* Signs and several terms per power: the Sallen-Key example's
   denominator R1 R2 C1 C2 s^2 + (R1 C2 + R2 C2) s + 1, as derive prints
   it (tests/cli goldens). */
static void test_structure_sallen_key(void)
{
    gs_result *r = NULL;
    const gs_polynomial *d;
    int rc = gs_derive_file(&r, "examples/sallen_key.gsc", NULL, NULL);
    CHECK(rc == GS_OK);
    d = gs_result_poly(r, 0, GS_DENOMINATOR);
    CHECK(d && d->degree == 2 && d->ncoeffs == 3);
    if (d && d->ncoeffs == 3) {
        CHECK(d->coeffs[1].power == 1 && d->coeffs[1].nterms == 2);
        CHECK(d->coeffs[2].nterms == 1 && d->coeffs[2].terms[0].nfactors == 4);
        CHECK(strcmp(d->coeffs[1].terms[0].symbols[0], "R1") == 0
              && strcmp(d->coeffs[1].terms[1].symbols[0], "R2") == 0);
    }
    gs_result_free(r);
    /* a negative coefficient: -R2*A over R1*A + R1 + R2 */
    rc = gs_derive_file(&r, "examples/inverting_amp.gsc", NULL, NULL);
    CHECK(rc == GS_OK);
    d = gs_result_poly(r, 0, GS_NUMERATOR);
    CHECK(d && d->ncoeffs == 1 && d->coeffs[0].nterms == 1
          && strcmp(d->coeffs[0].terms[0].num, "-1") == 0
          && d->coeffs[0].terms[0].nfactors == 2);
    gs_result_free(r);
}

static void test_eval(void)
{
    gs_result *r = NULL;
    char *messages = NULL;
    double re = 0, im = 0;
    const char *names[] = {"R", "C"};
    const double vals[] = {2e3, 1e-6};
    int rc = gs_derive_string(&r, rc_text, NULL, NULL, NULL);
    CHECK(rc == GS_OK);
    /* at s = j/(RC) = j 1000: H = 1/(1 + j) = 0.5 - 0.5j (math fact) */
    rc = gs_result_eval(&re, &im, r, 0, 0, 1000, NULL, NULL, 0, &messages);
    CHECK_MSG(rc == GS_OK, "%s", messages ? messages : "");
    CHECK_MSG(fabs(re - 0.5) < 1e-12 && fabs(im + 0.5) < 1e-12, "%g %g", re,
              im);
    free(messages);
    /* at s = 0 the gain is 1 whatever R and C are */
    rc = gs_result_eval(&re, &im, r, 0, 0, 0, names, vals, 2, NULL);
    CHECK(rc == GS_OK && re == 1 && im == 0);
    /* with R = 2k overriding the file, s = j 500 is the corner */
    rc = gs_result_eval(&re, &im, r, 0, 0, 500, names, vals, 2, NULL);
    CHECK_MSG(rc == GS_OK && fabs(re - 0.5) < 1e-12 && fabs(im + 0.5) < 1e-12,
              "%g %g", re, im);
    /* real s = -1/(RC) is the pole */
    rc = gs_result_eval(&re, &im, r, 0, -1000, 0, NULL, NULL, 0, &messages);
    CHECK(rc == GS_EDIVZERO && messages != NULL
          && strstr(messages, "denominator is zero") != NULL);
    free(messages);
    rc = gs_result_eval(&re, &im, r, 0, 0, 1, (const char *[]){"Q"}, vals, 1,
                        &messages);
    CHECK(rc == GS_EINVAL && messages
          && strstr(messages, "no symbol 'Q'") != NULL);
    free(messages);
    CHECK(gs_result_eval(&re, &im, r, 0, 0, 1, NULL, vals, 1, NULL)
          == GS_EINVAL);
    CHECK(gs_result_eval(&re, &im, r, 1, 0, 1, NULL, NULL, 0, NULL)
          == GS_EINVAL);
    CHECK(gs_result_eval(NULL, &im, r, 0, 0, 1, NULL, NULL, 0, NULL)
          == GS_EINVAL);
    CHECK(gs_result_eval(&re, &im, NULL, 0, 0, 1, NULL, NULL, 0, NULL)
          == GS_EINVAL);
    gs_result_free(r);
}

static void test_symbols(void)
{
    gs_result *r = NULL;
    double v = 0;
    int rc = gs_derive_file(&r, "examples/sallen_key.gsc", NULL, NULL);
    CHECK(rc == GS_OK);
    /* H = 1/(R1 R2 C1 C2 s^2 + ...): four symbols besides s, in the
       order the text printer uses */
    CHECK(gs_result_nsymbols(r, 0) == 4);
    CHECK(gs_result_symbol(r, 0, 0) && strcmp(gs_result_symbol(r, 0, 0),
                                              "R1") == 0);
    CHECK(gs_result_symbol(r, 0, 3) && strcmp(gs_result_symbol(r, 0, 3),
                                              "C2") == 0);
    CHECK(gs_result_symbol(r, 0, 4) == NULL);
    CHECK(gs_result_symbol(r, 1, 0) == NULL && gs_result_nsymbols(r, 1) == 0);
    CHECK(gs_result_nsymbols(NULL, 0) == 0);
    /* the file's value line: C1 = 2.2n */
    CHECK(gs_result_value(&v, r, "C1") == GS_OK && v == 2.2e-9);
    CHECK(gs_result_value(&v, r, "Q9") == GS_EINVAL);
    CHECK(gs_result_value(&v, r, "s") == GS_EINVAL);
    CHECK(gs_result_value(NULL, r, "C1") == GS_EINVAL);
    CHECK(gs_result_value(&v, NULL, "C1") == GS_EINVAL);
    CHECK(gs_result_value(&v, r, NULL) == GS_EINVAL);
    gs_result_free(r);
    rc = gs_derive_string(&r, "vsource v a gnd\nresistor R a b\n"
                              "resistor R2 b gnd\ntransfer H = v(b) / v\n",
                          NULL, NULL, NULL);
    CHECK(rc == GS_OK);
    CHECK(gs_result_value(&v, r, "R") == GS_EUNBOUND);
    gs_result_free(r);
}

static void test_eval_unbound(void)
{
    static const char text[] =
        "vsource   vin  in   gnd\n"
        "resistor  R    in   out\n"
        "capacitor C    out  gnd\n"
        "transfer  H = v(out) / vin\n";
    gs_result *r = NULL;
    char *messages = NULL;
    double re, im;
    const char *names[] = {"C"};
    const double vals[] = {1e-6};
    int rc = gs_derive_string(&r, text, NULL, NULL, NULL);
    CHECK(rc == GS_OK);
    rc = gs_result_eval(&re, &im, r, 0, 0, 1, NULL, NULL, 0, &messages);
    CHECK_MSG(rc == GS_EUNBOUND && messages
              && strstr(messages, "no value for symbols R, C") != NULL, "%s",
              messages ? messages : "(none)");
    free(messages);
    rc = gs_result_eval(&re, &im, r, 0, 0, 1, names, vals, 1, &messages);
    CHECK(rc == GS_EUNBOUND && messages
          && strstr(messages, "no value for symbol R\n") != NULL);
    free(messages);
    gs_result_free(r);
}

static void test_options(void)
{
    gs_result *r = NULL;
    gs_options o;
    gs_sym_limit lim = {"A", 1};
    char *text, *messages = NULL;
    int rc;
    gs_options_init(&o);
    o.limits = &lim;
    o.nlimits = 1;
    rc = gs_derive_file_opts(&r, "examples/inverting_amp.gsc", &o, NULL);
    CHECK(rc == GS_OK);
    text = gs_result_text(r, 0);
    /* the ideal inverting amplifier, -R2/R1 (Sedra & Smith ch. 2, from
       memory) */
    CHECK_MSG(text && strcmp(text, "Av = (-R2)/(R1)") == 0, "%s",
              text ? text : "(null)");
    free(text);
    gs_result_free(r);

    lim.symbol = "Rx";
    rc = gs_derive_file_opts(&r, "examples/inverting_amp.gsc", &o, &messages);
    CHECK(rc == GS_EINVAL && r == NULL && messages
          && strstr(messages, "no symbol 'Rx'") != NULL);
    free(messages);
    o.limits = NULL;
    rc = gs_derive_file_opts(&r, "examples/inverting_amp.gsc", &o, NULL);
    CHECK(rc == GS_EINVAL && r == NULL);

    gs_options_init(&o);
    o.method = GS_METHOD_BAREISS;
    rc = gs_derive_file_opts(&r, "examples/sallen_key.gsc", &o, NULL);
    CHECK(rc == GS_OK);
    text = gs_result_text(r, 0);
    /* the same result whatever the method (docs/analysis.md) */
    CHECK(text && strcmp(text, "H = (1)/(R1*R2*C1*C2*s^2 + (R1*C2 + R2*C2)"
                               "*s + 1)") == 0);
    free(text);
    gs_result_free(r);
    o.method = (gs_method)9;
    rc = gs_derive_file_opts(&r, "examples/sallen_key.gsc", &o, NULL);
    CHECK(rc == GS_EINVAL && r == NULL);

    gs_options_init(&o);
    o.max_terms = 1;
    rc = gs_derive_file_opts(&r, "examples/sallen_key.gsc", &o, &messages);
    CHECK(rc == GS_EBUDGET && r == NULL && messages != NULL);
    free(messages);

    gs_options_init(&o);
    o.only = "H";
    rc = gs_derive_file_opts(&r, "examples/sallen_key.gsc", &o, NULL);
    CHECK(rc == GS_OK && gs_result_count(r) == 1);
    gs_result_free(r);
}

static void test_null_arguments(void)
{
    gs_result *r = (gs_result *)1;
    char *messages = (char *)1;
    CHECK(gs_derive_file_opts(&r, NULL, NULL, &messages) == GS_EINVAL);
    CHECK(r == NULL && messages == NULL);
    r = (gs_result *)1;
    CHECK(gs_derive_string(&r, NULL, NULL, NULL, NULL) == GS_EINVAL);
    CHECK(r == NULL);
    CHECK(gs_derive_string(NULL, rc_text, NULL, NULL, NULL) == GS_EINVAL);
    CHECK(gs_derive_file(NULL, "examples/sallen_key.gsc", NULL, NULL)
          == GS_EINVAL);
    CHECK(gs_result_count(NULL) == 0);
}

static void test_string_errors(void)
{
    gs_result *r = NULL;
    char *messages = NULL;
    int rc = gs_derive_string(&r, "resistr R1 a b\n", "bad.gsc", NULL,
                              &messages);
    CHECK(rc == GS_ESYNTAX && r == NULL);
    CHECK_MSG(messages && strstr(messages, "bad.gsc:1:1: error: unknown "
                                           "statement 'resistr'") != NULL,
              "%s", messages ? messages : "(none)");
    free(messages);
}

int main(void)
{
    test_derive_example();
    test_errors();
    test_version();
    test_options_defaults();
    test_structure();
    test_structure_sallen_key();
    test_eval();
    test_eval_unbound();
    test_symbols();
    test_options();
    test_null_arguments();
    test_string_errors();
    return check_report("api");
}
