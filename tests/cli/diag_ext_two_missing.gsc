# The two-point fit without --vgs2: exit 2.
# The figures are on the command line; this file is not read.
