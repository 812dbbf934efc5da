# --at-vgs with no threshold known: exit 2.
# The figures are on the command line; this file is not read.
