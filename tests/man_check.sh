#!/bin/sh
# man_check.sh - the manual pages and the bash completion against the
# program.  See LICENSE.
#
# usage: tests/man_check.sh BUILD
# - every command `gainsmith help` lists has a section (.SS) under
#   COMMANDS in man/gainsmith.1, and every such section is a command the
#   program lists; the version in each page's .TH is the program's;
# - `man -l` renders each page without a warning (skipped, loudly, where
#   man is not installed; under CI=true that is a failure);
# - the completion offers exactly the program's commands, and a
#   command's options as its help text lists them (with bash).
build=${1:-build}
bin=$build/gainsmith
name=man_check
passed=0
failed=0
pass() { passed=$((passed + 1)); }
fail() { failed=$((failed + 1)); echo "$name: FAIL: $*"; }
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT

# The commands, as the program lists them.
"$bin" help | sed -n '/^commands:/,/^$/s/^  \([a-z][a-z0-9_-]*\) .*/\1/p' \
    | sort >"$tmp/help"
if [ -s "$tmp/help" ]; then pass; else
    fail "'gainsmith help' lists no commands"; fi
# The commands, as the page documents them.
sed -n '/^\.SH COMMANDS/,/^\.SH [^C]/s/^\.SS \(.*\)/\1/p' man/gainsmith.1 \
    | sort >"$tmp/man"
if cmp -s "$tmp/help" "$tmp/man"; then
    pass
else
    fail "man/gainsmith.1 and 'gainsmith help' list different commands" \
        "(< help, > man):"
    diff "$tmp/help" "$tmp/man" | grep '^[<>]'
fi
# Every listed command is one the program runs.
while read -r cmd; do
    [ "$cmd" = help ] && continue
    if "$bin" help "$cmd" >/dev/null 2>&1; then pass; else
        fail "'gainsmith help $cmd' fails"; fi
done <"$tmp/help"

version=$("$bin" --version | sed 's/^gainsmith //')
for page in man/gainsmith.1 man/gainsmith-circuit.5; do
    if grep -q "^\.TH .*\"gainsmith $version\"" "$page"; then pass; else
        fail "$page: .TH does not give version $version"; fi
done

if command -v man >/dev/null 2>&1; then
    for page in man/gainsmith.1 man/gainsmith-circuit.5; do
        LC_ALL=C.UTF-8 MANWIDTH=80 man --warnings -l "$page" \
            >"$tmp/out" 2>"$tmp/err"
        if [ -s "$tmp/err" ] || [ ! -s "$tmp/out" ]; then
            fail "man -l $page:"
            cat "$tmp/err"
        else
            pass
        fi
    done
elif [ "${CI:-}" = true ]; then
    fail "man is not installed"
else
    echo "$name: SKIPPED: rendering the pages: man is not installed" \
        "(apt-get install man-db)"
fi

if command -v bash >/dev/null 2>&1; then
    # shellcheck disable=SC2016
    bash -c '. completion/gainsmith.bash
        COMP_WORDS=("$1" ""); COMP_CWORD=1; _gainsmith
        printf "%s\n" "${COMPREPLY[@]}"' sh "$bin" \
        | grep -v '^--' | grep -v '^help$' | sort >"$tmp/comp"
    grep -v '^help$' "$tmp/help" >"$tmp/help2"
    if cmp -s "$tmp/comp" "$tmp/help2"; then pass; else
        fail "the completion's commands differ from 'gainsmith help'"; fi
    # shellcheck disable=SC2016
    bash -c '. completion/gainsmith.bash
        COMP_WORDS=("$1" derive --max-t); COMP_CWORD=2; _gainsmith
        printf "%s\n" "${COMPREPLY[@]}"' sh "$bin" >"$tmp/opt"
    if [ "$(cat "$tmp/opt")" = "--max-terms" ]; then pass; else
        fail "completing 'derive --max-t' gave: $(cat "$tmp/opt")"; fi
    # shellcheck disable=SC2016
    bash -c '. completion/gainsmith.bash
        COMP_WORDS=("$1" derive examples/sallen); COMP_CWORD=2; _gainsmith
        printf "%s\n" "${COMPREPLY[@]}"' sh "$bin" >"$tmp/file"
    if [ "$(cat "$tmp/file")" = "examples/sallen_key.gsc" ]; then pass; else
        fail "completing a .gsc file gave: $(cat "$tmp/file")"; fi
else
    echo "$name: SKIPPED: the completion: bash is not installed"
fi

echo "$name: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
