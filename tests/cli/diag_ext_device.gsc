# extract of a device it has no model for: exit 2.
# The figures are on the command line; this file is not read.
