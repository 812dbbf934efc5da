#!/bin/sh
# render_check.sh - renders gainsmith's SVG plots with headless Chromium.
# See LICENSE.
#
# usage: tests/render_check.sh BUILD
# Writes a Bode plot and a step plot of an example, renders each to PNG
# with Debian's chromium (when installed; otherwise a loud skip) and checks
# that a PNG of plausible size came out.  Ends with
# "render_check.sh: N passed, N failed".
build=${1:-build}
name=render_check.sh
bin=$build/gainsmith
if ! command -v chromium >/dev/null 2>&1; then
    echo "*** SKIPPED $name: chromium not found (apt-get install chromium) ***"
    echo "$name: 0 passed, 0 failed"
    exit 0
fi
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
passed=0
failed=0
render() {
    svg=$1
    png=$2
    timeout 120 chromium --headless --no-sandbox --disable-gpu \
        --disable-quic --no-first-run --disable-background-networking \
        --disable-component-update --disable-sync \
        --user-data-dir="$tmp/profile" --window-size=800,640 \
        --screenshot="$png" "file://$svg" >/dev/null 2>&1
    # a PNG starts with \211PNG; an empty page renders to a few KiB only
    if [ -f "$png" ] && [ "$(head -c 4 "$png" | tail -c 3)" = "PNG" ] \
        && [ "$(wc -c <"$png")" -gt 10000 ]; then
        passed=$((passed + 1))
    else
        failed=$((failed + 1))
        echo "$name: FAILED: no plausible PNG from $svg"
    fi
}
"$bin" bode examples/sallen_key.gsc --from 100 --to 1M --svg "$tmp/bode.svg" >/dev/null
render "$tmp/bode.svg" "$tmp/bode.png"
"$bin" step examples/sallen_key.gsc --svg "$tmp/step.svg" >/dev/null
render "$tmp/step.svg" "$tmp/step.png"
echo "$name: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
