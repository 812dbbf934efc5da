# --type takes nmos or pmos for a mosfet: exit 2.
# The figures are on the command line; this file is not read.
