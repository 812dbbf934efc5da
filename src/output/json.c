/* json.c - JSON strings (RFC 8259). See LICENSE. */
#include "output/json.h"

#include <string.h>

/* Length of the valid UTF-8 sequence at s, of avail bytes (RFC 3629,
   section 4), or 0. */
static size_t utf8_len(const unsigned char *s, size_t avail)
{
    size_t n, i;
    unsigned char lo = 0x80, hi = 0xBF;
    if (s[0] >= 0xC2 && s[0] <= 0xDF)
        n = 2;
    else if (s[0] >= 0xE0 && s[0] <= 0xEF)
        n = 3;
    else if (s[0] >= 0xF0 && s[0] <= 0xF4)
        n = 4;
    else
        return 0;
    if (n > avail)
        return 0;
    if (s[0] == 0xE0)
        lo = 0xA0;
    else if (s[0] == 0xED)
        hi = 0x9F;
    else if (s[0] == 0xF0)
        lo = 0x90;
    else if (s[0] == 0xF4)
        hi = 0x8F;
    if (s[1] < lo || s[1] > hi)
        return 0;
    for (i = 2; i < n; i++)
        if (s[i] < 0x80 || s[i] > 0xBF)
            return 0;
    return n;
}

void gs_json_put_escaped(FILE *out, const char *str, size_t len)
{
    const unsigned char *s = (const unsigned char *)str, *end = s + len;
    while (s < end) {
        const unsigned char *run = s;
        size_t n;
        while (s < end && *s >= 0x20 && *s < 0x80 && *s != '"' && *s != '\\')
            s++;
        if (s > run)            /* the plain bytes at once */
            fwrite(run, 1, (size_t)(s - run), out);
        if (s == end)
            break;
        if (*s == '"' || *s == '\\') {
            fputc('\\', out);
            fputc(*s++, out);
        } else if (*s == '\n') {
            fputs("\\n", out);
            s++;
        } else if (*s == '\t') {
            fputs("\\t", out);
            s++;
        } else if (*s < 0x20) {
            fprintf(out, "\\u%04x", (unsigned)*s++);
        } else if ((n = utf8_len(s, (size_t)(end - s))) > 0) {
            fwrite(s, 1, n, out);
            s += n;
        } else {
            fputs("\\ufffd", out);
            s++;
        }
    }
}

void gs_json_string(FILE *out, const char *str)
{
    fputc('"', out);
    gs_json_put_escaped(out, str, strlen(str));
    fputc('"', out);
}
