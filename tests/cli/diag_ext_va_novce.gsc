# --va without --vce (and without --early=plain): exit 2.
# The figures are on the command line; this file is not read.
