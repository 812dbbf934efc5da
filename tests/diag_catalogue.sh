#!/bin/sh
# diag_catalogue.sh - every message in docs/diagnostics.md has a golden.
# See LICENSE.
#
# For each table row: the golden named in the last column exists and its
# .err holds the message's fixed text (the part before the first NAME-like
# placeholder in capitals).  Ends with "diag_catalogue.sh: N passed, N
# failed".
passed=0
failed=0
tab=$(printf '\t')
grep '^| `' docs/diagnostics.md | while IFS= read -r row; do
    msg=$(printf '%s\n' "$row" | sed 's/^| `\([^`]*\)`.*/\1/')
    golden=$(printf '%s\n' "$row" | sed 's/.*| `\([^`]*\)` |$/\1/')
    # the fixed text before the first placeholder word or quote
    fixed=$(printf '%s\n' "$msg" | sed "s/'.*//; s/[A-Z][A-Z]*.*//")
    printf '%s%s%s\n' "$golden" "$tab" "$fixed"
done > "${TMPDIR:-/tmp}/diag_catalogue.$$"
while IFS="$tab" read -r golden fixed; do
    err=tests/cli/$golden.err
    if [ -f "$err" ] && grep -qF -- "$fixed" "$err"; then
        passed=$((passed + 1))
    else
        echo "diag_catalogue.sh: '$fixed' has no golden in $err"
        failed=$((failed + 1))
    fi
done < "${TMPDIR:-/tmp}/diag_catalogue.$$"
rm -f "${TMPDIR:-/tmp}/diag_catalogue.$$"
echo "diag_catalogue.sh: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
