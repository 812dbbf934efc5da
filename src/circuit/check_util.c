/* check_util.c - what the structural checks share: union-find, messages
 * at an element, lists of names.  It calls no check (check.c runs them).
 * See LICENSE.
 */
#include "circuit/checker.h"
#include "gainsmith.h"
#include "base/mem.h"

#include <stdlib.h>

/* Names listed in one message before "...". */
#define MAX_LISTED 8

int gs_uf_find(int *parent, int x)
{
    while (parent[x] != x) {
        parent[x] = parent[parent[x]];  /* path halving */
        x = parent[x];
    }
    return x;
}

void gs_uf_union(int *parent, int a, int b)
{
    parent[gs_uf_find(parent, a)] = gs_uf_find(parent, b);
}

void gs_uf_reset(int *parent, int n)
{
    int i;
    for (i = 0; i < n; i++)
        parent[i] = i;
}

int gs_senses_nothing(const gs_element *e)
{
    return (e->kind == GS_VCCS || e->kind == GS_VCVS)
           && e->node[2] == e->node[3];
}

void gs_check_report(const gs_checker *k, int severity, int line, int col,
                     const char *hint, const char *msg)
{
    gs_diag_add(k->d, severity, line > 0 ? k->c->file : NULL, line, col,
                hint, "%s", msg);
}

char *gs_check_list(const char *const *names, size_t n, int quote)
{
    char *out = gs_strdup(""), *next;
    size_t i;
    for (i = 0; i < n && i < MAX_LISTED; i++) {
        next = gs_asprintf(quote ? "%s%s'%s'" : "%s%s%s", out,
                           i ? ", " : "", names[i]);
        gs_free(out);
        out = next;
    }
    if (n > MAX_LISTED) {
        next = gs_asprintf("%s, ...", out);
        gs_free(out);
        out = next;
    }
    return out;
}
