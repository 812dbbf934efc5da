#!/bin/sh
# latex_check.sh - builds the LaTeX printer's equations with pdflatex.
# See LICENSE.
#
# usage: tests/latex_check.sh [BUILD]
# build/tests/test_print writes BUILD/tests/test_print.tex, a document of
# the equations of its cases (textbook transfer functions and random
# ones); this script runs it if needed and compiles the document.  Without
# pdflatex it says so loudly and counts nothing.  The last line is
# "latex_check.sh: N passed, N failed"; the status is 1 on any failure.
build=${1:-build}
name=latex_check.sh
if ! command -v pdflatex >/dev/null 2>&1; then
    echo "*** SKIPPED $name: pdflatex not found" \
        "(apt-get install texlive-latex-base) ***"
    echo "$name: 0 passed, 0 failed"
    exit 0
fi
passed=0
failed=0
pass() { passed=$((passed + 1)); }
fail() { failed=$((failed + 1)); echo "$name: FAILED: $1"; }

tex=$build/tests/test_print.tex
if [ ! -f "$tex" ] && [ -x "$build/tests/test_print" ]; then
    "$build/tests/test_print" >/dev/null 2>&1
fi
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
if [ -f "$tex" ]; then
    pass
    cp "$tex" "$tmp/eq.tex"
    if (cd "$tmp" && pdflatex -interaction=nonstopmode -halt-on-error \
            eq.tex >/dev/null 2>&1); then
        pass
    else
        fail "pdflatex failed on $tex:"
        grep -A 3 '^!' "$tmp/eq.log" 2>/dev/null | head -n 20
    fi
    if [ -s "$tmp/eq.pdf" ]; then pass; else fail "no PDF made"; fi
    if grep -q '^! ' "$tmp/eq.log" 2>/dev/null; then
        fail "errors in the log"
    else
        pass
    fi
    # the document is not empty of equations
    want=$(grep -c '\\begin{equation}' "$tex")
    if [ "$want" -gt 0 ]; then pass; else fail "no equations in $tex"; fi
else
    fail "$tex not found (make tests, then run $build/tests/test_print)"
fi
echo "$name: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
