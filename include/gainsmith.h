/* gainsmith.h - public interface of the gainsmith library. See LICENSE.
 *
 * gainsmith derives exact small-signal transfer functions of analog
 * circuits.  This header holds the status codes shared by every module and
 * the version.  Internal modules live in src/ behind headers of their own.
 */
#ifndef GAINSMITH_H
#define GAINSMITH_H

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

#endif
