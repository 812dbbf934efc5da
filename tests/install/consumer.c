/* consumer.c - a program outside the tree, built against an installed
 * gainsmith with pkg-config (tests/install_check.sh).  See LICENSE.
 */
#include <gainsmith.h>

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int main(void)
{
    static const char circuit[] =
        "vsource   vin  in   gnd\n"
        "resistor  R    in   out\n"
        "capacitor C    out  gnd\n"
        "value     R = 1k\n"
        "value     C = 1u\n"
        "transfer  H = v(out) / vin\n";
    gs_result *r = NULL;
    char *messages = NULL, *text;
    double re, im;
    int rc = gs_derive_string(&r, circuit, "rc.gsc", NULL, &messages);
    if (messages)
        fputs(messages, stderr);
    free(messages);
    if (rc != GS_OK)
        return 1;
    if (strcmp(gs_version(), GS_VERSION) != 0)
        return 1;
    text = gs_result_text(r, 0);
    puts(text);
    free(text);
    rc = gs_result_eval(&re, &im, r, 0, 0.0, 1000.0, NULL, NULL, 0, NULL);
    printf("%s H(j1000) = %.6f%+.6fj\n", gs_strerror(rc), re, im);
    gs_result_free(r);
    return 0;
}
