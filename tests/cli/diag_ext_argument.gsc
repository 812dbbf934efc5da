# A figure written without its --NAME=: exit 2.
# The figures are on the command line; this file is not read.
