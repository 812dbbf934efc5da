/* help.c - the manual text of each command. See LICENSE.
 *
 * Kept in step with docs/commands.md: every option a command's spec
 * accepts is described here, and nothing else.
 */
#include "cli/cmd.h"
#include "gainsmith.h"

#include <string.h>

/* The overview around its list of commands, which comes from the table. */
static const char overview_head[] =
"gainsmith " GS_VERSION " - exact small-signal transfer functions of analog "
"circuits\n"
"\n"
"usage: gainsmith COMMAND FILE [options]\n"
"       gainsmith help [COMMAND]\n"
"       gainsmith --version\n"
"\n"
"commands:\n";

static const char overview_tail[] =
"  help      this text, or the manual of one command\n"
"\n"
"FILE is a circuit in the gainsmith language (.gsc; see docs/language.md),\n"
"or '-' for standard input.  Exit status: 0 success, 1 the analysis\n"
"failed (singular circuit, budget exceeded), 2 bad input or usage.\n"
"Small-signal results are linear approximations: verify a design by\n"
"simulation and measurement.\n";

static const char derive_text[] =
"usage: gainsmith derive FILE [options]\n"
"\n"
"Derives every transfer and impedance that FILE asks for, exactly, as a\n"
"ratio of polynomials in the element symbols and s, in lowest terms\n"
"(resistors read as R, not 1/R), and prints them.\n"
"\n"
"options:\n"
"  --only NAME          derive only the transfer or impedance NAME\n"
"  --out EXPR --in SRC  derive EXPR / SRC instead of the file's outputs:\n"
"                       EXPR is v(NODE), v(NODE, NODE) or i(ELEMENT), SRC\n"
"                       an independent source; named H, or --only's NAME\n"
"  --limit SYM=inf|0    the limit as SYM goes to infinity or zero, e.g.\n"
"                       --limit rds=inf; repeatable, applied in order;\n"
"                       an output with no finite limit is left out with\n"
"                       an error, the others printed, and the exit\n"
"                       status is 1\n"
"  --format FORMAT      text (default: one line each, sympy-readable),\n"
"                       pretty (2-D fraction), latex (equation\n"
"                       environments), c (C99 functions), json\n"
"  --collect SYM        group terms by powers of SYM instead of s\n"
"  --max-terms N        the term budget: stop with exit status 1 when an\n"
"                       intermediate polynomial grows past N terms, a\n"
"                       product past 8N before its exact division, the\n"
"                       minors kept at once past 8N in all, or the\n"
"                       products past 1000N term pairs of work (default\n"
"                       2000000, and auto then also refuses an expansion\n"
"                       of more than 2000000 paths; 0: no limit)\n"
"  --max-memory SIZE    the memory budget: stop with exit status 1 when\n"
"                       the polynomials kept at once would take more than\n"
"                       SIZE bytes (512M, 4G, 2GiB; default 4GiB on 64-bit\n"
"                       machines; 0: no limit)\n"
"  --method METHOD      how the determinants are computed: auto (default:\n"
"                       minors unless the expansion would be too large),\n"
"                       minors (expansion in minors, no division) or\n"
"                       bareiss (fraction-free elimination); the result\n"
"                       is the same, only the work differs\n"
"  --pivot RULE         elimination pivot rule: minwork (default),\n"
"                       markowitz, minterms or natural (often hundreds of\n"
"                       times slower; the work budget stops it); alone,\n"
"                       it implies --method bareiss\n"
"  --stats              after the results, one line per output on stderr:\n"
"                       stats NAME terms_N=.. terms_D=.. unknowns=..\n"
"                       method=.. minors=.. products=..\n"
"                       max_entry_terms=.. big_divisions=.. gcd_terms=..\n"
"  --help               this text\n"
"\n"
"example:\n"
"  gainsmith derive examples/cs_degen.gsc --limit ro1=inf\n";

static const char eval_text[] =
"usage: gainsmith eval FILE [options]\n"
"\n"
"Derives the outputs of FILE exactly, binds the numbers of its value\n"
"lines, and prints for each output its DC value (with |H| in dB and the\n"
"phase), its value at each --at frequency, and the numeric coefficients\n"
"of numerator and denominator in powers of s.  Numbers are evaluated\n"
"from the exact expression in long double (about 18 significant digits;\n"
"fewer where terms of opposite sign cancel).  Every symbol without a\n"
"value is named in one error.\n"
"\n"
"options:\n"
"  --set SYM=VALUE      bind SYM (overrides its value line; values that\n"
"                       depend on it follow); VALUE may use SI prefixes,\n"
"                       arithmetic and other symbols; repeatable\n"
"  --at FREQ            also evaluate at s = j*2*pi*FREQ; FREQ in Hz, SI\n"
"                       prefixes allowed (--at 10k, --at 1MHz); repeatable\n"
"  --only NAME          only the output NAME\n"
"  --limit SYM=inf|0    as for derive\n"
"  --max-terms N        as for derive\n"
"  --max-memory SIZE    as for derive\n"
"  --help               this text\n";

static const char check_text[] =
"usage: gainsmith check FILE [options]\n"
"\n"
"Derives each output exactly, binds the file's values, and compares the\n"
"expression, evaluated in long double as every command evaluates it,\n"
"with an independent solve of the same circuit (the MNA stamped again)\n"
"at log-spaced frequencies.  The reference bounds its own error: a long\n"
"double LU solve refined with residuals in twice the precision, with a\n"
"bound from the adjoint solve, decides the clear points; elsewhere the\n"
"equations are solved exactly, in rationals, at the same point (the\n"
"values and s as the exact numbers their long doubles are).\n"
"\n"
"Each point agrees (relative error within --tol), is inconclusive (the\n"
"error exceeds --tol but rounding in evaluating the expression can\n"
"account for it: long double cannot resolve the value there), or is a\n"
"mismatch (a wrong result).  Prints the worst relative error of each\n"
"output over the conclusive points and lists the inconclusive ones.\n"
"A symbol without a value that cancels out of every output gets a\n"
"generic value for the solve, with a note.  Exit status 0 when no point\n"
"is a mismatch and each output has a point that agrees; 1 on a\n"
"mismatch, when every point of an output is inconclusive (nothing was\n"
"checked), or when the equations have no unique solution at a point.\n"
"\n"
"options:\n"
"  --tol X              largest relative error accepted (default 1e-9)\n"
"  --from F, --to F     the sweep in Hz (default 10m to 10G)\n"
"  --points N           frequencies in the sweep (default 61)\n"
"  --set SYM=VALUE      as for eval; repeatable\n"
"  --only NAME          only the output NAME\n"
"  --max-terms N        as for derive\n"
"  --max-memory SIZE    as for derive\n"
"  --help               this text\n";

static const char poles_text[] =
"usage: gainsmith poles FILE [options]\n"
"\n"
"Derives each output exactly, binds the file's values, and finds the\n"
"roots of numerator and denominator numerically (Aberth-Ehrlich\n"
"iteration in long double with Newton-polygon starting points, polished\n"
"on the original coefficients; docs/analysis.md).  For each output:\n"
"the stability verdict, the DC gain and the high-frequency gain, then a\n"
"row per pole and per zero: real and imaginary parts in rad/s, |p| in\n"
"Hz, Q and zeta for complex pairs, the estimated multiplicity and the\n"
"relative residual; right-half-plane roots are marked, and pole-zero\n"
"pairs closer than --cancel-tol are reported as near-cancellations.\n"
"\n"
"options:\n"
"  --format text|json   the table (default) or one JSON array\n"
"  --cancel-tol X       relative distance for a near-cancellation\n"
"                       (default 1e-3)\n"
"  --set SYM=VALUE      as for eval; repeatable\n"
"  --only NAME          only the output NAME\n"
"  --limit SYM=inf|0    as for derive\n"
"  --max-terms N        as for derive\n"
"  --max-memory SIZE    as for derive\n"
"  --help               this text\n";

static const char bode_text[] =
"usage: gainsmith bode FILE --from F --to F [options]\n"
"\n"
"Derives each output exactly, binds the file's values, and sweeps s =\n"
"j*2*pi*f over log-spaced frequencies: magnitude in dB, phase in degrees\n"
"(unwrapped continuously from the low-frequency asymptote) and group\n"
"delay in seconds.  Prints each output's -3 dB bandwidth and unity-gain\n"
"frequency (and, with --loop, its phase and gain margins); the sweep\n"
"itself goes to --csv, or to standard output when neither --csv nor\n"
"--svg is given.\n"
"\n"
"options:\n"
"  --from F, --to F     the sweep in Hz (required; SI prefixes allowed)\n"
"  --points N           points in the sweep (default 201)\n"
"  --per-decade N       points per decade instead of --points\n"
"  --csv FILE           the sweep as CSV: freq_Hz, then NAME_mag_dB,\n"
"                       NAME_phase_deg, NAME_group_delay_s per output\n"
"  --svg FILE           a Bode plot: magnitude and phase panels, poles\n"
"                       (x) and zeros (o) on the frequency axis, those\n"
"                       in the right half plane boxed and named (\"RHP\n"
"                       zero 159 MHz\"), the bandwidth and unity-gain\n"
"                       frequency marked, every output overlaid with a\n"
"                       legend\n"
"  --loop               the outputs are loop gains: report and mark the\n"
"                       phase margin and gain margin\n"
"  --set SYM=VALUE      as for eval; repeatable\n"
"  --only NAME          only the output NAME\n"
"  --limit SYM=inf|0    as for derive\n"
"  --max-terms N        as for derive\n"
"  --max-memory SIZE    as for derive\n"
"  --help               this text\n";

static const char step_text[] =
"usage: gainsmith step FILE [options]\n"
"\n"
"Derives each output exactly, binds the file's values, and computes the\n"
"response to a unit step from the partial-fraction expansion of H(s)/s\n"
"(repeated poles included).  Prints the final value, the 10-90 % rise\n"
"time, the overshoot and the 1 % settling time, where they exist.\n"
"\n"
"options:\n"
"  --until T            the time span in seconds (default: from the\n"
"                       slowest pole)\n"
"  --points N           samples written to --csv and --svg (default 1001)\n"
"  --csv FILE           time_s, step, impulse_per_s\n"
"  --svg FILE           a plot of the step response with the metrics\n"
"                       marked (one output: use --only with several);\n"
"                       without --until the plotted span runs on to the\n"
"                       time axis's next tick, so the trace reaches it\n"
"  --set SYM=VALUE      as for eval; repeatable\n"
"  --only NAME          only the output NAME\n"
"  --limit SYM=inf|0    as for derive\n"
"  --max-terms N        as for derive\n"
"  --max-memory SIZE    as for derive\n"
"  --help               this text\n";

static const char sens_text[] =
"usage: gainsmith sens FILE [options]\n"
"\n"
"Normalised sensitivities S(Q, x) = (x/Q) dQ/dx of each output's figures\n"
"to every symbol x, at the bound values: the DC gain, |H| and phase at\n"
"each --at, every real pole and zero, w0 and Q of every complex pair,\n"
"and the -3 dB bandwidth.  The derivatives of N and D are exact\n"
"(symbolic), evaluated in long double; a root p moves by\n"
"dp/dx = -(dD/dx)/(dD/ds) at s = p (docs/sens.md).  Each figure's table\n"
"is sorted by |S|; symbols with |S| < 0.001 are folded into one line.\n"
"With --loop, each loopgain output T also gets its unity-gain frequency\n"
"ugf (|T(j wu)| = 1, dwu/dx = -(d|T|/dx)/(d|T|/dw)) and phase margin pm\n"
"(180 deg + arg T(j wu), dPM/dx = d arg/dx + d arg/dw * dwu/dx).\n"
"A device bound by a bias line also gets the sensitivities to its bias\n"
"figures (M1.id, M1.vds, Q1.ic, ...), by the chain rule through the\n"
"small-signal values the line sets, and the chain is printed.\n"
"\n"
"options:\n"
"  --at FREQ            |H| and phase at FREQ (Hz; repeatable)\n"
"  --loop               unity-gain frequency and phase margin of each\n"
"                       loopgain output\n"
"  --only NAME          only the output NAME\n"
"  --set SYM=VALUE      override a value (repeatable)\n"
"  --format text|json   the tables (default) or one JSON array\n"
"  --limit SYM=inf|0    as for derive\n"
"  --max-terms N        as for derive\n"
"  --max-memory SIZE    as for derive\n"
"  --help               this text\n";

static const char report_text[] =
"usage: gainsmith report FILE -o DOC [options]\n"
"\n"
"Writes one self-contained review document of the circuit; the name's\n"
"extension picks the format: .html (one file, MathML formulas, inline\n"
"SVG plots, a print style, no script), .md (LaTeX formulas in $$, the\n"
"plots written beside it as DOC-N.svg) or .tex (a LaTeX article for\n"
"pdflatex, long equations broken across lines, no plots).  Contents:\n"
"the listing with line numbers, the bound values and where each came\n"
"from, and per output the exact result (folded when long), the DC gain,\n"
"poles and zeros, the Bode plot, the step response, the\n"
"sensitivities, the noise (a spot density, the rms over the plot's span,\n"
"the sources ranked) and the check verdict; then the caution.  See\n"
"docs/report.md.\n"
"\n"
"options:\n"
"  -o DOC, --output DOC the document to write (never the input file)\n"
"  --set SYM=VALUE      override a value (repeatable)\n"
"  --only NAME          only the output NAME\n"
"  --limit SYM=inf|0    as for derive\n"
"  --max-terms N        as for derive\n"
"  --max-memory SIZE    as for derive\n"
"  --help               this text\n";
static const char noise_text[] =
"usage: gainsmith noise FILE [options]\n"
"\n"
"The noise of every resistor, conductance, mosfet and bjt of the circuit\n"
"at the output of each transfer: S_out = sum |H_k|^2 S_k with each H_k\n"
"exact, and S_in = S_out/|H|^2 referred to the transfer's input.  Device\n"
"noise: channel 4kT*gamma*gm (gamma = nthermal_M, 2/3 unless bound),\n"
"flicker gm^2*kf/(cox*w*l*f) when kf_M is bound, shot 2kT*gm and 2kT/rpi, rb\n"
"thermal.  nthermal_M, kf_M, cox_M, w_M and l_M are bound by value lines,\n"
"or as nthermal=, kf=, ... on the mosfet line or on its bias line.  T from\n"
"a 'temperature' line, 300 K without one.  Small-signal white-plus-flicker\n"
"models at one operating point (docs/noise.md).\n"
"\n"
"options:\n"
"  --only NAME             only the transfer NAME\n"
"  --format FMT            text (default), pretty, latex or json; json\n"
"                          needs --band\n"
"  --at F                  densities and each source's part at F Hz,\n"
"                          largest first (repeatable)\n"
"  --band F1:F2            rms noise over F1..F2 Hz, output and input-\n"
"                          referred, and per source, largest first\n"
"  --source-resistor R     the noise figure, R being the signal source's\n"
"                          resistor in the circuit\n"
"  --csv FILE, --svg FILE  the spectrum, log-spaced over --from..--to\n"
"                          (the band, or 1 Hz..1 GHz), --points N (201)\n"
"  --approx                the short form: each H_k simplified (approx),\n"
"                          the sources that stay small over the band (or\n"
"                          --from..--to) left out, the errors of S_out and\n"
"                          S_in measured there\n"
"  --tol X                 its tolerance in dB (0.1), as for approx\n"
"  --set SYM=EXPR          as for eval (repeatable)\n"
"  --max-terms N           as for derive\n"
"  --max-memory SIZE       as for derive\n"
"\n"
"example:\n"
"  gainsmith noise examples/noise_cs.gsc --at 1k --band 10:1M\n"
"  gainsmith noise examples/miller_opamp.gsc --approx --tol 0.5\n";

static const char approx_text[] =
"usage: gainsmith approx FILE [options]\n"
"\n"
"Short symbolic forms of each output at the nominal values (value and\n"
"bias lines, --set): per power of s the smallest terms are dropped while\n"
"the error against the exact H, measured on a log grid over the band and\n"
"over a box of parameter spreads, stays within the tolerance; then the\n"
"DC gain in its shortest form, every pole and zero with a dominant-root\n"
"estimate where the roots are separated (p ~ -a0/a1, ...; w0 and Q for a\n"
"complex pair) or exact from a short factor of N or D in s, compared with\n"
"the exact root, and the conditions the dropped terms rest on.\n"
"par(a, b) = a*b/(a + b).  See docs/approx.md.\n"
"When the expansion is over its budget (or --max-terms), the terms are\n"
"the dominant ones generated from the graph of minors and the errors are\n"
"measured against its exact numbers.\n"
"The errors are measured near the nominal point: no substitute for\n"
"simulation across corners.\n"
"\n"
"options:\n"
"  --tol X              dB (and 10 X degrees), DB/DEG, or P%; default 0.1\n"
"  --band F1:F2         band in Hz (default from the roots and unity gain)\n"
"  --spread P           vary every symbol by +-P % (default 20; 0 none)\n"
"  --only NAME          one output\n"
"  --set SYM=VALUE      override a value (repeatable)\n"
"  --format F           text (default), pretty, latex or json\n"
"  --max-terms N        expand at most N terms a minor; past it, the graph\n"
"  --stats              which path ran (exact expansion or graph of\n"
"                       minors), terms, grid, on standard error\n"
"  --help               this text\n"
"\n"
"Exit status 1 when the tolerance cannot be met (the best form is shown);\n"
"2 for bad input or an unbound symbol.\n";

/* The one list of commands: main.c dispatches from it, the overview lists
   it, and tests/test_commands.c checks that each has its manual text, a
   section of man/gainsmith.1 and one of docs/commands.md. */
static const gs_cmd_entry table[] = {
    {"derive", "the exact transfer functions of a circuit, in lowest terms",
     gs_cmd_derive, derive_text},
    {"eval", "their numbers: DC value, values at frequencies, coefficients",
     gs_cmd_eval, eval_text},
    {"poles", "poles and zeros, w0, Q, stability, DC and HF gain",
     gs_cmd_poles, poles_text},
    {"bode", "gain, phase and group delay over frequency; CSV and SVG",
     gs_cmd_bode, bode_text},
    {"step", "step response: rise time, overshoot, settling; CSV and SVG",
     gs_cmd_step, step_text},
    {"check", "the exact result against an independent numeric solve",
     gs_cmd_check, check_text},
    {"extract", "device figures from a datasheet point -> model parameters",
     gs_cmd_extract, gs_cmd_extract_help_text},
    {"sens", "normalised sensitivities of gain, poles, w0, Q, bandwidth",
     gs_cmd_sens, sens_text},
    {"report", "the review document: HTML, Markdown or LaTeX",
     gs_cmd_report, report_text},
    {"noise", "noise densities, their exact transfers, rms over a band",
     gs_cmd_noise, noise_text},
    {"approx", "short symbolic forms with a measured error, root estimates",
     gs_cmd_approx, approx_text},
};

const gs_cmd_entry *gs_cmd_table(size_t *n)
{
    *n = sizeof table / sizeof table[0];
    return table;
}

const gs_cmd_entry *gs_cmd_find(const char *name)
{
    size_t i;
    for (i = 0; name && i < sizeof table / sizeof table[0]; i++)
        if (strcmp(name, table[i].name) == 0)
            return &table[i];
    return NULL;
}

void gs_cmd_print_overview(FILE *out)
{
    size_t i;
    fputs(overview_head, out);
    for (i = 0; i < sizeof table / sizeof table[0]; i++)
        fprintf(out, "  %-9s %s\n", table[i].name, table[i].summary);
    fputs(overview_tail, out);
}

const char *gs_cmd_help_text(const char *command)
{
    const gs_cmd_entry *c = gs_cmd_find(command);
    return c ? c->help : NULL;
}
