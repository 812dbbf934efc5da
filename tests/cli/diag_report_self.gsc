# report -o naming its own input file (whose name ends in .md): the
# input is never written over, exit 2.
# The circuit is diag_report_self.md; see the .args.
