/* gainsmith.h - public interface of the gainsmith library. See LICENSE.
 *
 * gainsmith derives exact small-signal transfer functions of analog
 * circuits.  This header is the whole public interface: the status
 * codes, the version, and the calls that derive, inspect and evaluate
 * results (docs/library.md describes every call with an example).
 * Internal modules live in src/ behind headers of their own.
 *
 * Thread safety: the library is reentrant and keeps no global state;
 * any number of threads may derive at the same time, each with its own
 * results, and several threads may call the functions that take a
 * const gs_result * on the same result at once; only gs_result_free
 * must wait until no other thread uses it (`make check-thread` runs
 * both under ThreadSanitizer).
 */
#ifndef GAINSMITH_H
#define GAINSMITH_H

#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Marks the calls of this interface: the shared library is built with
   every other symbol hidden, so that only these are its ABI. */
#if defined(__GNUC__) || defined(__clang__)
#define GS_API __attribute__((visibility("default")))
#else
#define GS_API
#endif

/* The version of this header; gs_version() is the library's, which
   differs from it only when a program runs against another build of the
   shared library than the one it was compiled with. */
#define GS_VERSION_MAJOR 0
#define GS_VERSION_MINOR 1
#define GS_VERSION_PATCH 0
#define GS_VERSION "0.1.0"
/* MAJOR * 10000 + MINOR * 100 + PATCH, for #if comparisons */
#define GS_VERSION_NUMBER \
    (GS_VERSION_MAJOR * 10000 + GS_VERSION_MINOR * 100 + GS_VERSION_PATCH)

/* "0.1.0": the version of the library linked in; static storage. */
GS_API const char *gs_version(void);

/* Status codes.  Every function that reads user input or can fail
   returns one of these. */
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
    GS_EUNBOUND,    /* a symbol has no numeric value */
    GS_ENOMEM       /* memory ran out (or the allocation hook refused) */
};

/* A short English phrase for a status code ("syntax error"); never NULL. */
GS_API const char *gs_strerror(int code);

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
 * A gs_result is an object with identity: the gs_derive_* calls make it,
 * gs_result_free frees it (NULL is fine).  Every char * returned is the
 * caller's to free(); every const char * and const struct pointer is
 * owned by the result and lives until gs_result_free.  The library never
 * prints and never exits.  When memory runs out in a call, everything the
 * call allocated is freed and it fails as its comment says (GS_ENOMEM,
 * or NULL where it returns a pointer); what existed before the call is
 * unchanged, and a result stays usable.  Every call that takes a result and an index
 * checks both: a NULL pointer or an index out of range gives NULL, 0 or
 * GS_EINVAL as its comment says, never a crash.
 */
typedef struct gs_result gs_result;

/* How the determinants are computed; the result is the same, only the
   work differs. */
typedef enum gs_method {
    GS_METHOD_AUTO = 0,  /* minors unless the expansion would be too large */
    GS_METHOD_MINORS,    /* expansion in minors, no division */
    GS_METHOD_BAREISS    /* fraction-free elimination (Bareiss 1968) */
} gs_method;

/* A limit taken after the derivation: symbol -> infinity or -> 0. */
typedef struct gs_sym_limit {
    const char *symbol;     /* a symbol of the circuit, e.g. "rds" */
    int to_infinity;        /* 1: symbol -> infinity; 0: symbol -> 0 */
} gs_sym_limit;

/* Options of a derivation.  Always start from gs_options_init, which sets
   the defaults below, so that a program keeps compiling and behaving the
   same when later versions add fields. */
typedef struct gs_options {
    const char *only;       /* derive only the output of this name;
                               default NULL: every output of the file */
    size_t max_terms;       /* work budget: GS_EBUDGET when an intermediate
                               polynomial grows past this many terms, or
                               the minors kept at once past 8 * max_terms
                               in all; 0: no limit; default
                               GS_DEFAULT_MAX_TERMS, which under
                               GS_METHOD_AUTO also refuses an expansion
                               whose graph of minors counts more paths */
    gs_method method;       /* default GS_METHOD_AUTO */
    const gs_sym_limit *limits; /* nlimits limits, applied in order;
                               default NULL, 0; borrowed for the call */
    size_t nlimits;
    size_t max_bytes;       /* memory budget: GS_EBUDGET when the
                               polynomials the determinant method keeps at
                               once would take more bytes; 0: no limit;
                               default GS_DEFAULT_MAX_BYTES */
    int (*alloc_hook)(void *arg, size_t bytes);
                            /* asked before each allocation the derivation
                               makes, with its size: a nonzero return makes
                               that allocation fail as if memory had run
                               out, so the call frees what it had and
                               returns GS_ENOMEM (for hard caps of one's
                               own, and for testing); the memory itself
                               always comes from malloc; default NULL */
    void *alloc_hook_arg;   /* passed to alloc_hook; default NULL */
} gs_options;

/* The default budgets, the same as the command line's. */
#define GS_DEFAULT_MAX_TERMS ((size_t)2000000)
#define GS_DEFAULT_MAX_BYTES ((size_t)1 << (sizeof(size_t) > 4 ? 32 : 30))

/* o = the defaults: only NULL, the default budgets, GS_METHOD_AUTO, no
   limits, no allocation hook.  NULL is ignored. */
GS_API void gs_options_init(gs_options *o);

/* Parse the circuit file at path ("-" is standard input) and derive every
 * transfer and impedance it asks for, or only the one named `only` (NULL
 * for all), exactly and in lowest terms.  On GS_OK *out holds the results.
 * Whatever the outcome, *messages (if messages is not NULL) gets the
 * diagnostics as text, "FILE:LINE:COL: error: ..." lines, or NULL when
 * there were none.  Returns GS_OK, GS_ESYNTAX or GS_EINVAL (bad input),
 * GS_EIO, GS_ESINGULAR, GS_EBUDGET or GS_ENOMEM; *out is NULL on
 * failure.  The same as gs_derive_file_opts with the default options and `only`. */
GS_API int gs_derive_file(gs_result **out, const char *path,
                          const char *only, char **messages);

/* The same with options (NULL: the defaults).  A limit on a symbol the
   circuit does not have is GS_EINVAL; a limit that is infinite is
   GS_ERANGE; a budget exceeded is GS_EBUDGET.  out NULL or path NULL is
   GS_EINVAL. */
GS_API int gs_derive_file_opts(gs_result **out, const char *path,
                               const gs_options *opts, char **messages);

/* The same for a circuit held in a string; name (NULL: "<string>") is
   the file name the messages give. */
GS_API int gs_derive_string(gs_result **out, const char *text,
                            const char *name, const gs_options *opts,
                            char **messages);

/* Number of outputs derived; 0 for NULL. */
GS_API size_t gs_result_count(const gs_result *r);
/* The output's name ("Av"); owned by r; NULL when r is NULL or i is out
   of range. */
GS_API const char *gs_result_name(const gs_result *r, size_t i);
/* "Av = (N)/(D)" grouped by powers of s, as `gainsmith derive` prints
   it (docs/output.md); a new string; NULL on a bad argument or when
   memory runs out. */
GS_API char *gs_result_text(const gs_result *r, size_t i);
/* One JSON object (docs/json.md); a new string; NULL on a bad argument
   or when memory runs out. */
GS_API char *gs_result_json(const gs_result *r, size_t i);
GS_API void gs_result_free(gs_result *r);

/* --- The result as data ---------------------------------------------
 *
 * H = N/D with N and D polynomials in s whose coefficients are
 * polynomials in the circuit's symbols with exact rational coefficients
 * (in lowest terms the library gives integers, so den is "1" today; a
 * program should still read it).  Read-only views owned by the result.
 */

/* c * symbols[0]^exps[0] * ... * symbols[nfactors-1]^exps[nfactors-1] */
typedef struct gs_term {
    const char *num;            /* the coefficient's numerator, exact
                                   decimal with sign: "-3" */
    const char *den;            /* its denominator, positive: "1" */
    size_t nfactors;            /* 0 for a constant term */
    const char *const *symbols; /* nfactors symbol names, in the canonical
                                   order of docs/output.md */
    const unsigned *exps;       /* their exponents, each >= 1 */
} gs_term;

/* The coefficient of s^power: a sum of nterms terms. */
typedef struct gs_coeff {
    unsigned power;
    size_t nterms;              /* >= 1 */
    const gs_term *terms;
} gs_coeff;

/* A polynomial in s: its nonzero coefficients in ascending powers. */
typedef struct gs_polynomial {
    long degree;                /* in s; -1 for the zero polynomial */
    size_t ncoeffs;             /* number of nonzero coefficients */
    const gs_coeff *coeffs;     /* ncoeffs of them, power ascending */
} gs_polynomial;

enum { GS_NUMERATOR = 0, GS_DENOMINATOR = 1 };

/* N (part GS_NUMERATOR) or D (GS_DENOMINATOR) of output i; owned by r.
   NULL when r is NULL, i out of range or part neither, or when memory
   runs out making it (the first request for it makes it). */
GS_API const gs_polynomial *gs_result_poly(const gs_result *r, size_t i,
                                          int part);

/* The symbols of output i other than s, in the canonical order of
   docs/output.md: how many (0 on a bad argument), and the k-th name,
   owned by r (NULL when r is NULL or i or k is out of range). */
GS_API size_t gs_result_nsymbols(const gs_result *r, size_t i);
GS_API const char *gs_result_symbol(const gs_result *r, size_t i,
                                    size_t k);

/* --- Numbers ---------------------------------------------------------
 *
 * H(s) of output i at the complex s = s_re + j s_im, with the circuit's
 * numbers: its value and bias lines, then the nbind pairs names[k] =
 * values[k] (names may be NULL when nbind is 0), which override them.
 * An override replaces that symbol's number only: a value line computed
 * from it keeps the number the file gave it.  *re, *im get H; *messages
 * (if not NULL) gets the diagnostics or NULL.  Returns GS_OK; GS_EINVAL
 * for a NULL pointer, an index out of range or a name the circuit does
 * not have; GS_EUNBOUND (with the missing symbols named) when a symbol
 * of H has no number; GS_EDIVZERO when D is zero there; GS_ENOMEM when
 * memory runs out.  Computed in
 * long double from the exact N and D; r is not changed. */
/* The number the circuit's value or bias lines give symbol: GS_OK;
   GS_EUNBOUND when they give it none; GS_EINVAL for a NULL pointer or a
   symbol the circuit does not have. */
GS_API int gs_result_value(double *value, const gs_result *r,
                           const char *symbol);

GS_API int gs_result_eval(double *re, double *im, const gs_result *r,
                          size_t i, double s_re, double s_im,
                          const char *const *names, const double *values,
                          size_t nbind, char **messages);

#ifdef __cplusplus
}
#endif

#endif
