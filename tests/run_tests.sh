#!/bin/sh
# run_tests.sh - runs every test suite and sums the counts. See LICENSE.
#
# usage: tests/run_tests.sh BUILD [MODULE]
# Each suite prints a line "NAME: N passed, N failed"; a suite that exits
# non-zero without saying so (a crash) counts as one failure.  The last line
# is the total, "N passed, N failed"; the exit status is 1 on any failure.
build=${1:-build}
only=${2:-}
passed=0
failed=0
log=$(mktemp)
trap 'rm -f "$log"' EXIT

run_suite() {
    name=$1
    shift
    "$@" >"$log" 2>&1
    rc=$?
    cat "$log"
    line=$(grep -E '^[A-Za-z0-9_.-]+: [0-9]+ passed, [0-9]+ failed' "$log" | tail -n 1)
    if [ -n "$line" ]; then
        p=$(echo "$line" | sed -E 's/.*: ([0-9]+) passed, ([0-9]+) failed.*/\1/')
        f=$(echo "$line" | sed -E 's/.*: ([0-9]+) passed, ([0-9]+) failed.*/\2/')
    else
        p=0
        f=0
    fi
    if [ "$rc" -ne 0 ] && [ "$f" -eq 0 ]; then
        echo "$name: exited with status $rc without reporting a failure"
        f=1
    fi
    passed=$((passed + p))
    failed=$((failed + f))
}

for t in "$build"/tests/test_*; do
    [ -x "$t" ] || continue
    mod=${t##*/test_}
    if [ -n "$only" ] && [ "$mod" != "$only" ]; then
        continue
    fi
    run_suite "test_$mod" "$t"
done

if [ -z "$only" ]; then
    if [ -f tests/run_cli.sh ]; then
        run_suite cli sh tests/run_cli.sh "$build/gainsmith"
    fi
    run_suite layers sh tests/check_layers.sh src
    run_suite free_check sh tests/check_free.sh src
    run_suite latex_check sh tests/latex_check.sh "$build"
    run_suite render_check sh tests/render_check.sh "$build"
    run_suite report_check sh tests/report_check.sh "$build"
    run_suite diag_catalogue sh tests/diag_catalogue.sh
    run_suite install_check sh tests/install_check.sh "$build"
    run_suite man_check sh tests/man_check.sh "$build"
    run_suite doc_example sh tests/doc_example.sh "$build"
    for py in tests/sympy/*.py; do
        [ -f "$py" ] || continue
        run_suite "${py##*/}" sh tests/sympy/run.sh "$build" "$py"
    done
fi

echo "$passed passed, $failed failed"
[ "$failed" -eq 0 ]
