# extract mos with neither the one-point nor the two-point figures: exit 2.
# The figures are on the command line; this file is not read.
