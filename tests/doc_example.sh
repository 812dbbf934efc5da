#!/bin/sh
# doc_example.sh - the example program of docs/library.md, taken from the
# page, built against the library and run: it must build without a
# warning and print exactly the output the page shows.  See LICENSE.
#
# usage: tests/doc_example.sh BUILD
build=${1:-build}
cc=${CC:-cc}
doc=docs/library.md
name=doc_example
passed=0
failed=0
pass() { passed=$((passed + 1)); }
fail() { failed=$((failed + 1)); echo "$name: FAIL: $*"; }
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT

# The fenced block between a begin and an end marker, without the fences.
block() {
    sed -n "/^<!-- example $1: begin -->\$/,/^<!-- example $1: end -->\$/p" \
        "$doc" | sed '1,2d;$d' | sed '$d'
}
block program >"$tmp/example.c"
block output >"$tmp/expected"
if [ -s "$tmp/example.c" ] && [ -s "$tmp/expected" ]; then pass; else
    fail "$doc has no example program or no example output"; fi

# shellcheck disable=SC2086
if $cc -std=c11 -Wall -Wextra -Wpedantic -Werror ${SANFLAGS:-} -Iinclude \
    -o "$tmp/example" "$tmp/example.c" "$build/libgainsmith.a" -lm \
    2>"$tmp/cc.log"; then
    pass
    "$tmp/example" examples/sallen_key.gsc >"$tmp/out" 2>"$tmp/err"
    rc=$?
    if [ "$rc" -eq 0 ] && [ ! -s "$tmp/err" ]; then pass; else
        fail "the example exited with $rc:"
        cat "$tmp/err"
    fi
    if cmp -s "$tmp/out" "$tmp/expected"; then pass; else
        fail "the example's output differs from $doc (< doc, > program):"
        diff "$tmp/expected" "$tmp/out"
    fi
    # and its error path: a file that does not exist
    "$tmp/example" examples/no-such-file.gsc >/dev/null 2>"$tmp/err"
    rc=$?
    if [ "$rc" -eq 2 ] && grep -q 'error' "$tmp/err"; then pass; else
        fail "the example on a missing file exited with $rc"; fi
else
    fail "the example does not build:"
    cat "$tmp/cc.log"
fi
echo "$name: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
