# --at-vds alone: it needs --at-id or --at-vgs, exit 2.
# The figures are on the command line; this file is not read.
