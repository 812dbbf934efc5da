# --gds without --vds: the model has the factor (1 + lambda*VDS), exit 2.
# The figures are on the command line; this file is not read.
