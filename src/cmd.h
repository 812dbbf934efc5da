/* cmd.h - the commands of the gainsmith program. See LICENSE.
 *
 * Each command is a function of one shape:
 *
 *     int gs_cmd_NAME(int argc, char **argv, FILE *out, FILE *err);
 *
 * argv[0] is the command's own word ("extract") and argv[1..argc-1] its
 * arguments.  Results go to out, messages to err; the return value is the
 * exit status: 0 success, 1 the analysis failed, 2 bad input or usage.
 */
#ifndef GS_CMD_H
#define GS_CMD_H

#include <stdio.h>

/* gainsmith extract mos|bjt --KEY=VAL...: device figures to model
   parameters (docs/devices.md). */
int gs_cmd_extract(int argc, char **argv, FILE *out, FILE *err);

#endif
