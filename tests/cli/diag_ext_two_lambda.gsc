# The two-point fit with --lambda but no --vds: exit 2.
# The figures are on the command line; this file is not read.
