# --vth and --vgs together, though one fixes the other: exit 2.
# The figures are on the command line; this file is not read.
