/* test_elim.c - elimination and expansion in minors against the
 * matrix-tree theorem.
 * See LICENSE.
 *
 * Kirchhoff's matrix-tree theorem: the determinant of the reduced nodal
 * admittance matrix of a network of distinct conductances is the sum,
 * over the spanning trees of the graph, of the product of their
 * conductances, each with coefficient +1.  The number of spanning trees is
 * counted independently here, as the determinant of the unweighted reduced
 * Laplacian (computed in floating point; the counts stay far below 2^53),
 * and for complete graphs by Cayley's formula n^(n-2).
 */
#include "check.h"
#include "testlib.h"
#include "circuit/circuit.h"
#include "analysis/elim.h"
#include "analysis/minors.h"
#include "analysis/mna.h"
#include "algebra/poly.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MAXN 9

static gs_rng rng_state;

static unsigned rnd(unsigned n)
{
    return test_below(&rng_state, n);
}

/* Spanning trees of the graph with adjacency counts adj (node 0 is the
   reference), by the determinant of the reduced Laplacian. */
static double count_trees(int n, int adj[MAXN][MAXN])
{
    double a[MAXN][MAXN], det = 1;
    int i, j, k;
    for (i = 1; i < n; i++)
        for (j = 1; j < n; j++) {
            a[i][j] = 0;
            if (i == j) {
                for (k = 0; k < n; k++)
                    a[i][j] += k != i ? adj[i][k] : 0;
            } else {
                a[i][j] = -adj[i][j];
            }
        }
    for (k = 1; k < n; k++) {
        int p = k;
        for (i = k + 1; i < n; i++)
            if (fabs(a[i][k]) > fabs(a[p][k]))
                p = i;
        if (a[p][k] == 0)
            return 0;
        if (p != k) {
            for (j = 1; j < n; j++) {
                double t = a[k][j];
                a[k][j] = a[p][j];
                a[p][j] = t;
            }
            det = -det;
        }
        det *= a[k][k];
        for (i = k + 1; i < n; i++) {
            double f = a[i][k] / a[k][k];
            for (j = k; j < n; j++)
                a[i][j] -= f * a[k][j];
        }
    }
    return det;
}

/* Pivot rules 0 .. 3 eliminate; BY_MINORS expands in minors. */
#define BY_MINORS (GS_PIVOT_NATURAL + 1)

static int determinants(gs_poly *da, gs_poly *dm, gs_mna *m,
                        const gs_polyctx *ctx, int rule, gs_diag *d)
{
    gs_elim_opts o;
    gs_minors_opts mo;
    if (rule == BY_MINORS) {
        gs_minors_opts_default(&mo);
        mo.max_products = 0;
        return gs_minors_bordered(da, dm, m, ctx, &mo, NULL, d);
    }
    gs_elim_opts_default(&o);
    o.pivot = (gs_pivot_rule)rule;
    return gs_elim_bordered(da, dm, m, ctx, &o, NULL, d);
}

/* Eliminate the nodal matrix of the circuit text; check the determinant
   has `trees` terms, all +1 or all -1. */
static int check_kirchhoff(const char *text, double trees, int rule)
{
    gs_circuit *c = gs_circuit_new();
    gs_polyctx *ctx;
    gs_diag d;
    gs_mna m;
    gs_poly da, dm;
    size_t i;
    int ok = 0;

    gs_diag_init(&d);
    if (gs_parse_string(c, "graph.gsc", text, &d) != GS_OK) {
        gs_diag_print(stderr, &d);
        gs_diag_clear(&d);
        gs_circuit_free(c);
        return 0;
    }
    gs_mna_intern_symbols(c);
    ctx = gs_polyctx_new(c->syms, gs_symtab_count(c->syms));
    gs_poly_init(&da);
    gs_poly_init(&dm);
    memset(&m, 0, sizeof m);
    if (gs_mna_build(&m, c, 0, ctx, &d) == GS_OK
        && determinants(&da, &dm, &m, ctx, rule, &d) == GS_OK) {
        ok = fabs(trees - floor(trees + 0.5)) < 1e-6
             && (double)da.length == floor(trees + 0.5);
        for (i = 0; i < da.length; i++)
            ok = ok && gs_int_cmp_si(&da.coeffs[i],
                                     gs_poly_sgn(&da)) == 0;
        if (!ok)
            fprintf(stderr, "determinant has %zu terms, %g trees\n",
                    da.length, trees);
    }
    gs_mna_clear(&m);
    gs_poly_clear(&da);
    gs_poly_clear(&dm);
    gs_polyctx_free(ctx);
    gs_circuit_free(c);
    gs_diag_clear(&d);
    return ok;
}

static char *node_name(char *buf, int k)
{
    if (k == 0)
        strcpy(buf, "gnd");
    else
        sprintf(buf, "n%d", k);
    return buf;
}

/* A random connected graph on n nodes: a random tree plus extra edges;
   no parallel edges, so each tree is a distinct monomial. */
static char *random_network(int n, int adj[MAXN][MAXN])
{
    char *text = malloc(8192), a[16], b[16];
    size_t len = 0;
    int i, j, e = 0, extra = (int)rnd((unsigned)(n * 2)) + 1;
    memset(adj, 0, sizeof(int) * MAXN * MAXN);
    for (i = 1; i < n; i++) {
        j = (int)rnd((unsigned)i);
        adj[i][j] = adj[j][i] = 1;
    }
    for (; extra > 0; extra--) {
        i = (int)rnd((unsigned)n);
        j = (int)rnd((unsigned)n);
        if (i != j)
            adj[i][j] = adj[j][i] = 1;
    }
    for (i = 0; i < n; i++)
        for (j = i + 1; j < n; j++)
            if (adj[i][j])
                len += (size_t)sprintf(text + len, "conductance G%d %s %s\n",
                                       ++e, node_name(a, i),
                                       node_name(b, j));
    sprintf(text + len, "impedance Z = n1, gnd\n");
    return text;
}

static void test_random_networks(void)
{
    int adj[MAXN][MAXN], round, rule;
    for (round = 0; round < 60; round++) {
        unsigned long long seed = 1000 + (unsigned long long)round;
        int n = 2 + (int)((seed * 7) % (MAXN - 1));
        char *text;
        gs_rng_seed(&rng_state, seed);
        text = random_network(n, adj);
        for (rule = 0; rule <= BY_MINORS; rule++)
            if (rule != GS_PIVOT_NATURAL || n <= 7)  /* natural is slow */
                CHECK_MSG(check_kirchhoff(text, count_trees(n, adj), rule),
                          "seed %llu rule %d:\n%s", seed, rule, text);
        free(text);
    }
}

static void test_complete_graphs(void)
{
    int n, i, j, e;
    /* Cayley's formula: K_n has n^(n-2) spanning trees. */
    for (n = 2; n <= 7; n++) {
        char *text = malloc(8192), a[16], b[16];
        size_t len = 0;
        e = 0;
        for (i = 0; i < n; i++)
            for (j = i + 1; j < n; j++)
                len += (size_t)sprintf(text + len, "conductance G%d %s %s\n",
                                       ++e, node_name(a, i),
                                       node_name(b, j));
        sprintf(text + len, "impedance Z = n1, gnd\n");
        CHECK_MSG(check_kirchhoff(text, pow(n, n - 2), 0), "K_%d", n);
        CHECK_MSG(check_kirchhoff(text, pow(n, n - 2), BY_MINORS),
                  "K_%d by minors", n);
        free(text);
    }
}

int main(void)
{
    test_complete_graphs();
    test_random_networks();
    return check_report("elim");
}
