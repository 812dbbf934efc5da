#!/bin/sh
# install_check.sh - `make install` into a temporary prefix, then a small
# program built against it with pkg-config, once linked with the shared
# library and once with the static one.  See LICENSE.
#
# usage: tests/install_check.sh BUILD
# Skipped, loudly, without pkg-config; under CI=true that is a failure.
build=${1:-build}
cc=${CC:-cc}
name=install_check
passed=0
failed=0
pass() { passed=$((passed + 1)); }
fail() { failed=$((failed + 1)); echo "$name: FAIL: $*"; }
report() {
    echo "$name: $passed passed, $failed failed"
    [ "$failed" -eq 0 ]
    exit
}

if ! command -v pkg-config >/dev/null 2>&1; then
    if [ "${CI:-}" = true ]; then
        fail "pkg-config is not installed"
        report
    fi
    echo "$name: SKIPPED: pkg-config is not installed" \
        "(apt-get install pkg-config)"
    report
fi

tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
prefix=$tmp/prefix
# A make of its own, without the jobserver of the make that runs the tests.
if env -u MAKEFLAGS -u MAKELEVEL -u MFLAGS make -s BUILD="$build" \
    PREFIX="$prefix" install >"$tmp/log" 2>&1; then
    pass
else
    fail "make install failed:"
    cat "$tmp/log"
    report
fi

for f in bin/gainsmith lib/libgainsmith.a lib/libgainsmith.so \
    lib/libgainsmith.so.0 include/gainsmith.h lib/pkgconfig/gainsmith.pc \
    share/man/man1/gainsmith.1 share/man/man5/gainsmith-circuit.5 \
    share/bash-completion/completions/gainsmith; do
    if [ -e "$prefix/$f" ]; then pass; else fail "not installed: $f"; fi
done

PKG_CONFIG_PATH=$prefix/lib/pkgconfig
export PKG_CONFIG_PATH
# Expected output: H = 1/(R C s + 1) at s = j/(RC) is 1/(1 + j)
# = 0.5 - 0.5j (math fact).
expected='H = (1)/(R*C*s + 1)
success H(j1000) = 0.500000-0.500000j'

# shared: exactly the flags pkg-config gives
# shellcheck disable=SC2046
if $cc ${SANFLAGS:-} -o "$tmp/shared" tests/install/consumer.c \
    $(pkg-config --cflags --libs gainsmith) 2>"$tmp/cc.log"; then
    pass
    out=$(LD_LIBRARY_PATH=$prefix/lib "$tmp/shared" 2>&1)
    if [ "$out" = "$expected" ]; then pass; else
        fail "shared consumer printed: $out"; fi
    if command -v readelf >/dev/null 2>&1; then
        if readelf -d "$tmp/shared" | grep -q 'NEEDED.*libgainsmith\.so\.0'
        then pass; else fail "shared consumer does not need the soname"; fi
    fi
else
    fail "building the shared consumer failed:"
    cat "$tmp/cc.log"
fi

# static: pkg-config's flags for static linking, with the archive forced
libs=$(pkg-config --libs --static gainsmith |
    sed 's/-lgainsmith/-Wl,-Bstatic -lgainsmith -Wl,-Bdynamic/')
# shellcheck disable=SC2046,SC2086
if $cc ${SANFLAGS:-} -o "$tmp/static" tests/install/consumer.c \
    $(pkg-config --cflags gainsmith) $libs 2>"$tmp/cc.log"; then
    pass
    out=$("$tmp/static" 2>&1)
    if [ "$out" = "$expected" ]; then pass; else
        fail "static consumer printed: $out"; fi
    if command -v readelf >/dev/null 2>&1; then
        if readelf -d "$tmp/static" | grep -q 'NEEDED.*libgainsmith'; then
            fail "static consumer needs the shared library"; else pass; fi
    fi
else
    fail "building the static consumer failed:"
    cat "$tmp/cc.log"
fi
report
