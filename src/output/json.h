/* json.h - the one JSON string writer, for every JSON the program
 * prints.  See LICENSE.
 */
#ifndef GS_JSON_H
#define GS_JSON_H

#include <stddef.h>
#include <stdio.h>

/* Write str as a JSON string (RFC 8259, section 7), quotes included:
   '"' and '\' are escaped, newline and tab as \n and \t, other
   control characters as \u00XX; bytes that are not valid UTF-8 (RFC
   3629, section 4) become U+FFFD, so the output is always valid JSON. */
void gs_json_string(FILE *out, const char *str);
/* The inside of such a string, for the len bytes at str, without the
   quotes: for text written in pieces (each piece whole UTF-8). */
void gs_json_put_escaped(FILE *out, const char *str, size_t len);

#endif
