# VCE below 0.2 V (common practice): a warning that the transistor is saturated, exit 0.
# The figures are on the command line; this file is not read.
