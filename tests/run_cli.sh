#!/bin/sh
# run_cli.sh - golden tests of the gainsmith command. See LICENSE.
#
# usage: tests/run_cli.sh path/to/gainsmith
# For each tests/cli/NAME.gsc:
#   NAME.args    the arguments, one line, '@' standing for the .gsc file
#                (default: "derive @")
#   NAME.out     expected standard output, byte for byte (optional)
#   NAME.err     expected standard error, byte for byte (optional; when
#                absent, standard error must be empty)
#   NAME.status  expected exit status (default 2 when NAME.err exists and
#                NAME.out does not, else 0)
#   NAME.same    the name of another case whose expected output NAME's
#                output must equal, once "(origin)" notes of values are
#                dropped (two ways of writing the same circuit)
# Ends with "run_cli.sh: N passed, N failed".
bin=$1
dir=tests/cli
passed=0
failed=0
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT

for gsc in "$dir"/*.gsc; do
    [ -f "$gsc" ] || continue
    name=${gsc%.gsc}
    base=${name##*/}
    args="derive @"
    [ -f "$name.args" ] && args=$(cat "$name.args")
    if [ -f "$name.status" ]; then
        want=$(cat "$name.status")
    elif [ -f "$name.err" ] && [ ! -f "$name.out" ]; then
        want=2
    else
        want=0
    fi
    # shellcheck disable=SC2086
    set -- $args
    cmdline=""
    for a in "$@"; do
        [ "$a" = "@" ] && a=$gsc
        cmdline="$cmdline '$a'"
    done
    eval "\"$bin\" $cmdline" >"$tmp/out" 2>"$tmp/err" </dev/null
    got=$?
    ok=1
    if [ "$got" != "$want" ]; then
        echo "$base: exit status $got, expected $want"
        ok=0
    fi
    if [ -f "$name.out" ] && ! cmp -s "$tmp/out" "$name.out"; then
        echo "$base: standard output differs:"
        diff "$name.out" "$tmp/out" | head -20
        ok=0
    fi
    if [ -f "$name.same" ]; then
        other="$dir/$(cat "$name.same").out"
        sed 's/  ([^)]*)$//' "$tmp/out" >"$tmp/a"
        sed 's/  ([^)]*)$//' "$other" >"$tmp/b"
        if ! cmp -s "$tmp/a" "$tmp/b"; then
            echo "$base: output differs from $other:"
            diff "$tmp/b" "$tmp/a" | head -20
            ok=0
        fi
    fi
    if [ -f "$name.err" ]; then
        if ! cmp -s "$tmp/err" "$name.err"; then
            echo "$base: standard error differs:"
            diff "$name.err" "$tmp/err" | head -20
            ok=0
        fi
    elif [ -s "$tmp/err" ]; then
        echo "$base: unexpected standard error:"
        head -5 "$tmp/err"
        ok=0
    fi
    if [ $ok -eq 1 ]; then
        passed=$((passed + 1))
    else
        failed=$((failed + 1))
    fi
done
echo "run_cli.sh: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
