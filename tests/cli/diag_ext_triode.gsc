# VDS below Vov = 2*ID/gm: the figures put the device in triode, exit 1.
# The figures are on the command line; this file is not read.
