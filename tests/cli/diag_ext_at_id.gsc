# A new point with a negative drain current: exit 2.
# The figures are on the command line; this file is not read.
