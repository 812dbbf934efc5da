#!/bin/sh
# latex_check.sh - builds the LaTeX printer's equations with pdflatex.
# See LICENSE.
#
# usage: tests/latex_check.sh [BUILD]
# build/tests/test_print writes BUILD/tests/test_print.tex, a document of
# the equations of its cases (textbook transfer functions and random
# ones); this script runs it if needed and compiles the document.  Then
# `derive --format latex` of every example (one of several hundred terms)
# must compile without overfull boxes over 10 pt.  Without
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

# derive --format latex of every example, in an article with amsmath:
# it compiles, and no line runs past the margin by more than 10 pt (a
# long result is broken across lines).  The two-stage op-amp's result
# has hundreds of terms; the check below makes sure at least one example
# is that long, so the breaking is exercised and not only short results.
overfull() {
    grep -o 'Overfull \\hbox ([0-9.]*pt' "$1" | sed 's/.*(//; s/pt//' \
        | awk '$1 > 10' | wc -l
}
# article EX CMD GSC: the output of `gainsmith CMD GSC --format latex`
# in an amsmath article, $tmp/EX.tex; fails when the command does
article() {
    {
        printf '\\documentclass{article}\n\\usepackage{amsmath}\n'
        printf '\\begin{document}\n'
        "$build/gainsmith" "$2" "$3" --format latex
        printf '\\end{document}\n'
    } >"$tmp/$1.tex" 2>"$tmp/$1.err"
}
# compiles EX WHAT: $tmp/EX.tex compiles with pdflatex, within the margin
compiles() {
    if (cd "$tmp" && pdflatex -interaction=nonstopmode -halt-on-error \
            "$1.tex" >/dev/null 2>&1); then
        pass
    else
        fail "$1: $2 does not compile"
        grep -A 3 '^!' "$tmp/$1.log" 2>/dev/null | head -n 10
        return
    fi
    bad=$(overfull "$tmp/$1.log")
    [ "$bad" -eq 0 ] && pass || fail "$1: $2 has $bad overfull boxes > 10pt"
}
longest=0
for gsc in examples/*.gsc; do
    ex=$(basename "$gsc" .gsc)
    article "$ex" derive "$gsc" || { fail "$ex: derive failed"; continue; }
    # terms of the longest side, counted in the text form
    n=$("$build/gainsmith" derive "$gsc" | tr '+-' '\n\n' | wc -l)
    [ "$n" -gt "$longest" ] && longest=$n
    compiles "$ex" "derive --format latex"
done
# noise --format latex of the noise examples: the densities as equations
# (output/formula.h) compile, within the margin
for gsc in examples/noise_*.gsc; do
    ex=$(basename "$gsc" .gsc)-noise
    article "$ex" noise "$gsc" || { fail "$ex: noise failed"; continue; }
    grep -q '^S_{\\mathrm{out}} = ' "$tmp/$ex.tex" && pass \
        || fail "$ex: no S_out equation"
    compiles "$ex" "noise --format latex"
done
[ "$longest" -ge 30 ] && pass \
    || fail "no example has a result of 30 or more terms ($longest)"
echo "$name: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
