# A new point below threshold: cut off, exit 1.
# The figures are on the command line; this file is not read.
