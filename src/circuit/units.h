/* units.h - numbers with SI prefixes and optional units. See LICENSE.
 *
 * The numeric path of the device models (bias lines, `gainsmith extract`)
 * reads figures such as "10mS", "200uS", "4.5mA/V^2", "0.7V", "45k",
 * "1/45", "300K" or "27C" into long doubles in SI base units.  A number
 * is
 *
 *     [+|-] digits [. digits] [(e|E) [+|-] digits] [/ denominator]
 *           [space] [prefix] [unit]
 *
 * with one SI prefix letter f p n u µ m k M G T (M is mega, m is milli;
 * a capital K is the kelvin, never kilo) and a unit that must fit the
 * quantity asked for.  A fraction "a/b" takes no prefix, to keep "1/45k"
 * from meaning two different things.  A bare number is always accepted
 * and read in the base unit (a bare temperature is in kelvin).
 */
#ifndef GS_UNITS_H
#define GS_UNITS_H

#include "base/diag.h"

/* What a figure measures; each has its own units. */
typedef enum gs_quantity {
    GS_Q_NUMBER,        /* a plain number (beta, ratios): no unit      */
    GS_Q_CURRENT,       /* A                                           */
    GS_Q_VOLTAGE,       /* V                                           */
    GS_Q_CONDUCTANCE,   /* S, or A/V                                   */
    GS_Q_RESISTANCE,    /* Ohm, ohm, ohms, the sign Ω                  */
    GS_Q_CAPACITANCE,   /* F                                           */
    GS_Q_FREQUENCY,     /* Hz                                          */
    GS_Q_TEMPERATURE,   /* K, or C / degC / °C (Celsius, no prefix)    */
    GS_Q_KPARAM,        /* A/V^2: the MOSFET K = µCox·W/L              */
    GS_Q_INV_VOLTAGE,   /* 1/V, /V, V^-1: the MOSFET lambda            */
    GS_Q_SQRT_VOLTAGE,  /* V^0.5, V^1/2: the body-effect gamma         */
    GS_Q_LENGTH,        /* m, after a prefix only (a lone m is milli):
                           a MOSFET's W and L                          */
    GS_Q_CAP_AREA       /* F/m^2, F/m2: a MOSFET's Cox                 */
} gs_quantity;

/* Where a figure was written, for messages (file may be NULL; line 0
   means no location, as in gs_diag). */
typedef struct gs_srcpos {
    const char *file;
    int line, col;
} gs_srcpos;

/* Read `text` as a figure of quantity q into *out (SI base units;
   Celsius is converted to kelvin).  `what` names the figure in messages
   ("--gm", "id").  Returns GS_OK; GS_ESYNTAX when text is not a number or
   has an unknown unit; GS_EINVAL when the unit belongs to another quantity
   ("--gm expects siemens, got 10mA"); GS_ERANGE when the number overflows.
   On error *out is unchanged and one message (with a hint where one
   helps) is added to d at `at` (NULL: no location). */
int gs_units_parse(long double *out, const char *text, gs_quantity q,
                   const char *what, const gs_srcpos *at, gs_diag *d);

/* The scanner under gs_units_parse, without messages: the value in SI
   base units and the quantity its unit names (GS_Q_NUMBER when it has no
   unit; a bare number fits every quantity).  Returns GS_OK, GS_ESYNTAX
   or GS_ERANGE. */
int gs_units_scan(long double *value, gs_quantity *unit, const char *text);

/* "siemens", "amperes", ..., "a plain number": never NULL. */
const char *gs_quantity_name(gs_quantity q);
/* The unit symbol printed after a value: "S", "A", "Ohm", "1/V", "". */
const char *gs_quantity_unit(gs_quantity q);

/* v in engineering notation with an SI prefix and q's unit, six
   significant digits, ASCII only: "25.852 mV", "4.5 mA/V^2", "25 kOhm",
   "0.04 1/V" (inverse units and temperatures take no prefix; a length
   of metres is said in millimetres, "1500 mm", as a lone m reads as
   milli).  Infinity
   prints as "inf".  A new string the caller frees. */
char *gs_units_format(long double v, gs_quantity q);

/* A figure formatted by gs_units_format in an array that lives until the
   end of the full expression that made it (C11 6.2.4p8): long enough for
   a printf-style call, with nothing to free.  Longer text is cut. */
typedef struct gs_numtext {
    char s[64];
} gs_numtext;

gs_numtext gs_units_text(long double v, gs_quantity q);

#endif
