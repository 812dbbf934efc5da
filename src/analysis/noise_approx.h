/* noise_approx.h - short forms of a noise analysis, with a measured
 * error.  See LICENSE; docs/noise.md, "Short forms".
 *
 * The output density is S_out = sum_k |H_k(j w)|^2 S_k, a sum of positive
 * parts.  If every part is replaced by one within a factor r of it, the
 * sum stays within the factor r, whatever the parts' sizes; so the short
 * density is built from
 *  - each transfer H_k simplified by approx (approx.h) over one band to a
 *    third of the tolerance (the magnitude error in dB of H_k is the error
 *    in dB of |H_k|^2 S_k, so the thirds add up the same way);
 *  - the sources whose parts together stay below a third of the tolerance
 *    at every frequency of the band left out, the smallest first;
 *  - the target's own transfer H simplified to a third, for the
 *    input-referred S_in = S_out / |H|^2.
 * The errors of S_out and S_in are then measured on the band's grid at
 * the nominal values against the exact densities, never only bounded.
 */
#ifndef GS_NOISE_APPROX_H
#define GS_NOISE_APPROX_H

#include <stddef.h>

#include "analysis/approx.h"
#include "analysis/job.h"
#include "analysis/noise.h"
#include "base/diag.h"

typedef struct gs_noise_short {
    size_t nsrc;
    gs_approx_result *h;        /* h[k].h: the short transfer of source k */
    unsigned char *kept;        /* 1: source k is in the short density */
    long double *max_share;     /* its largest share of S_out on the grid */
    long double dropped_share;  /* the largest share of all left out */
    gs_approx_result target;    /* the short H of the transfer itself */
    long double f_lo, f_hi;     /* the band, Hz */
    int npoints;                /* grid points over it */
    long double tol_db;         /* the tolerance asked for */
    long double err_out_db;     /* worst |10 log10(short / exact)| of S_out */
    long double err_in_db;      /* the same of S_in */
    int met;                    /* both within tol_db */
} gs_noise_short;

void gs_noise_short_init(gs_noise_short *s);
void gs_noise_short_clear(gs_noise_short *s);

/* The short form of target i of n in job j (derived and bound, with nn
   made from it) under o: the band is o's (0 and 0: approx's automatic
   band of the target's transfer), the tolerance o->tol_db; phase is not
   asked for (a density has none).  GS_OK with s->met telling whether the
   measured errors are within it; an error code with a message in d when
   a transfer cannot be simplified. */
int gs_noise_short_make(gs_noise_short *s, const gs_noise *n,
                        const gs_noise_num *nn, const gs_job *j, size_t i,
                        const gs_approx_opts *o, gs_diag *d);

/* The index in j->tf of output `out` of the circuit, or j->ntf. */
size_t gs_noise_tf_index(const gs_job *j, size_t out);

#endif
