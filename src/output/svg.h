/* svg.h - Bode and step-response plots as SVG. See LICENSE.
 *
 * The plots are plain and print well in black and white: traces differ
 * by dash pattern as well as colour, grids are light grey, text is black
 * on white.  A Bode plot has a magnitude panel over a phase panel on one
 * logarithmic frequency axis with decade and 2..9 sub-decade grid lines;
 * between them a strip marks the poles (x) and zeros (o) of each trace at
 * |p| / 2 pi, those in the right half plane in an open square and named
 * on the magnitude panel ("RHP zero 1.59 GHz").  Annotation labels are
 * placed so that no two of them, nor a label and the legend, overlap.
 * Tick labels use SI prefixes (100 m, 1, 10 k, 2 G) and the unit is in
 * the axis title.  Numbers are written without the C library's
 * locale, so the file is the same whatever LC_NUMERIC says.
 */
#ifndef GS_SVG_H
#define GS_SVG_H

#include <complex.h>
#include <stddef.h>
#include <stdio.h>

#include "base/si.h"
#include "numeric/roots.h"
#include "numeric/step.h"

/* What a Bode trace can have marked.  Arrays are borrowed. */
typedef struct gs_plot_marks {
    const long double complex *poles;   /* drawn as x at |p| / 2 pi */
    int npoles;
    const long double complex *zeros;   /* drawn as o */
    int nzeros;
    int has_bw;                 /* -3 dB bandwidth */
    long double bw_hz;
    int has_unity;              /* unity-gain (0 dB) frequency */
    long double unity_hz;
    int has_pm;                 /* phase margin, for a loop gain */
    long double pm_deg, pm_hz;
    int has_gm;                 /* gain margin, for a loop gain */
    long double gm_db, gm_hz;
} gs_plot_marks;

/* One trace.  Arrays are borrowed and hold n points; x ascending. */
typedef struct gs_plot_trace {
    const char *label;          /* legend text (UTF-8), may be NULL */
    size_t n;
    const long double *x;       /* frequency in Hz, or time in s */
    const long double *y;       /* magnitude in dB, or the response */
    const long double *y2;      /* phase in degrees (Bode only) */
    const gs_plot_marks *marks;         /* Bode; may be NULL */
    const gs_step_metrics *metrics;     /* step; may be NULL */
    const char *db_unit;        /* Bode: the magnitude's unit, "dB" for a
                                   gain, "dB\u03a9" for an impedance (UTF-8);
                                   NULL is "dB".  The magnitude axis is
                                   titled with the units of its traces */
} gs_plot_trace;

typedef struct gs_plot {
    const char *title;          /* may be NULL */
    const char *ylabel;         /* step plot's y axis title; NULL: "Output" */
    int width, height;          /* pixels; 0 picks 760 x 600 (Bode) or
                                   760 x 420 (step) */
    const gs_plot_trace *traces;
    size_t ntraces;             /* 1 or more; up to 6 get distinct styles,
                                   then the styles repeat */
} gs_plot;

/* Write a Bode plot.  Non-finite points break a trace; values outside a
 * panel are clipped; the magnitude axis spans at most 240 dB below the
 * highest value.  Annotations: -3 dB bandwidth and unity-gain frequency on
 * the magnitude panel, gain margin as a bar from the magnitude to 0 dB,
 * phase margin as a bar from the phase to -180 degrees.  Returns GS_OK,
 * GS_EINVAL (no traces, a trace without points, or nothing finite to
 * draw), or GS_EIO on a write error. */
int gs_svg_bode(FILE *out, const gs_plot *p);

/* Write a step-response plot: one panel, linear time axis in seconds.
 * With metrics: the final value, the 10 % and 90 % points, the overshoot
 * peak and the 1 % settling time are marked.  The time axis ends at a
 * grid step, or at the last sample when the step would pass it, so a
 * trace always runs to the axis end.  Returns as gs_svg_bode. */
int gs_svg_step(FILE *out, const gs_plot *p);

/* The end of the time axis gs_svg_step gives samples over [0, t_end]
 * once they are taken over [0, the returned end]: t_end rounded up to a
 * grid step.  Sampling to it makes the axis end on a labelled tick with
 * the trace reaching it.  A t_end that is not finite and positive comes
 * back unchanged. */
long double gs_svg_step_axis_end(long double t_end);

/* Write a noise spectrum: one panel, logarithmic frequency axis in Hz,
 * each trace's y a density in dB (20 log10 of unit/sqrt(Hz)), the axis
 * title p->ylabel (NULL: "Density (dB)").  Returns as gs_svg_bode. */
int gs_svg_spectrum(FILE *out, const gs_plot *p);

/* Fill m from h: its poles and zeros (borrowed from h, which must outlive
 * m), bandwidth and unity-gain frequency where they exist, and, when
 * loop_gain is nonzero, the margins of h as a loop gain.  Returns GS_OK or
 * GS_ERANGE if a root search failed (m is still usable). */
int gs_plot_marks_fill(gs_plot_marks *m, const gs_tfn *h, int loop_gain);

#endif
