# Two points where ID falls as VGS rises: the square law cannot fit them, exit 2.
# The figures are on the command line; this file is not read.
