#!/bin/sh
# check_free.sh - no plain free() in src/ outside base/mem.c: a block a
# guard recorded must be forgotten as it is freed, or the guard frees it
# a second time when it unwinds.  See LICENSE and DEVELOPERS.md ("Memory
# exhaustion").
#
# usage: tests/check_free.sh [SRCDIR]
src=${1:-src}
passed=0
failed=0
for f in $(find "$src" -name '*.c' -o -name '*.h' | sort); do
    [ "$f" = "$src/base/mem.c" ] && continue
    # free( not preceded by a letter, digit or underscore, outside comments
    hits=$(sed -e 's|/\*.*\*/||g' "$f" |
           grep -nE '(^|[^A-Za-z0-9_])free\(' | head -3)
    if [ -n "$hits" ]; then
        echo "check_free.sh: $f: plain free(), use gs_free():"
        echo "$hits" | sed 's/^/    /'
        failed=$((failed + 1))
    else
        passed=$((passed + 1))
    fi
done
echo "check_free.sh: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
