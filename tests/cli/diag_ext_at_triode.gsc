# A new point in triode: a warning and the triode values, exit 0.
# The figures are on the command line; this file is not read.
