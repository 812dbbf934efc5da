# Two points, one of them in triode at the given VDS: exit 1.
# The figures are on the command line; this file is not read.
