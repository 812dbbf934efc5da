# ro*IC below VCE: the Early voltage would not be positive, exit 2.
# The figures are on the command line; this file is not read.
