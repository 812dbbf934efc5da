/* gainsmith.h - public interface of the gainsmith library. See LICENSE.
 *
 * gainsmith derives exact small-signal transfer functions of analog
 * circuits.  This header holds the status codes shared by every module and
 * the version.  Internal modules live in src/ behind headers of their own.
 */
#ifndef GAINSMITH_H
#define GAINSMITH_H

#include <stddef.h>

#define GS_VERSION "0.1.0"

/* Status codes.  Every function that reads user input or can fail for a
   reason other than memory exhaustion returns one of these. */
enum {
    GS_OK = 0,
    GS_ESYNTAX,     /* malformed text (a number, a statement, a file) */
    GS_EINEXACT,    /* a division that was required to be exact is not */
    GS_EDIVZERO,    /* division by zero */
    GS_ERANGE,      /* a value outside what the operation accepts */
    GS_EBUDGET,     /* a work budget (terms, memory) ran out */
    GS_ESINGULAR,   /* the circuit's equations have no unique solution */
    GS_EIO,         /* a file could not be read or written */
    GS_EINVAL,      /* an argument or a circuit that makes no sense */
    GS_EUNBOUND     /* a symbol has no numeric value */
};

/* A short English phrase for a status code ("syntax error"); never NULL. */
const char *gs_strerror(int code);

/* --- Deriving transfer functions ------------------------------------
 *
 * The whole job in four calls:
 *
 *     gs_result *r = NULL;
 *     char *messages = NULL;
 *     int rc = gs_derive_file(&r, "amp.gsc", NULL, &messages);
 *     if (messages)
 *         fputs(messages, stderr);     // errors and warnings, located
 *     free(messages);
 *     if (rc == GS_OK) {
 *         char *text = gs_result_text(r, 0);   // "Av = (...)/(...)"
 *         puts(text);
 *         free(text);
 *     }
 *     gs_result_free(r);
 *
 * A gs_result is an object with identity: gs_derive_file makes it,
 * gs_result_free frees it (NULL is fine).  Every string returned is the
 * caller's to free().  The library never prints and never exits, except
 * on memory exhaustion (one message on stderr, exit status 1).
 */
typedef struct gs_result gs_result;

/* Parse the circuit file at path ("-" is standard input) and derive every
 * transfer and impedance it asks for, or only the one named `only` (NULL
 * for all), exactly and in lowest terms.  On GS_OK *out holds the results.
 * Whatever the outcome, *messages (if messages is not NULL) gets the
 * diagnostics as text, "FILE:LINE:COL: error: ..." lines, or NULL when
 * there were none.  Returns GS_OK, GS_ESYNTAX or GS_EINVAL (bad input),
 * GS_EIO, GS_ESINGULAR or GS_EBUDGET; *out is NULL on failure. */
int gs_derive_file(gs_result **out, const char *path, const char *only,
                   char **messages);

size_t gs_result_count(const gs_result *r);
/* The output's name ("Av"); owned by r. */
const char *gs_result_name(const gs_result *r, size_t i);
/* "Av = (N)/(D)" grouped by powers of s, as `gainsmith derive` prints
   it (docs/output.md); a new string. */
char *gs_result_text(const gs_result *r, size_t i);
/* One JSON object (docs/json.md); a new string. */
char *gs_result_json(const gs_result *r, size_t i);
void gs_result_free(gs_result *r);

#endif
