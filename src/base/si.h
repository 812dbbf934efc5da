/* si.h - SI prefixes (BIPM, SI Brochure, 9th ed., table 7): the one
 * table, read and written.  See LICENSE.
 */
#ifndef GS_SI_H
#define GS_SI_H

#include <stddef.h>

/* The symbol of the prefix for 10^(3p), p = -8 (y) .. 8 (Y), micro as
   U+00B5 MICRO SIGN; "" for p = 0 and outside the range. */
const char *gs_si_prefix_text(int p);

/* The prefix at s as input writes it (f p n u m k M G T; micro also as
   U+00B5 or U+03BC): its length in bytes, and *exp10 its power of ten;
   0 (and *exp10 untouched) when s does not start with one. */
size_t gs_si_prefix_scan(const char *s, int *exp10);

/* Format v with `digits` significant digits (1..6) and an SI prefix
 * (y .. Y, micro written as the micro sign), then unit: "1.59 kHz", "100 m",
 * "47 nF", "0 s", "-2.2 MV".  Trailing zeros are dropped.  unit may be
 * NULL or "".  Writes at most n bytes including the NUL and returns buf. */
char *gs_si_format(char *buf, size_t n, long double v, int digits,
                   const char *unit);
/* v with dec decimals (0..6), locale-free; "-0" is written "0".  Writes
   at most n bytes including the NUL and returns buf. */
char *gs_fixed_format(char *buf, size_t n, long double v, int dec);

#endif
