#!/bin/sh
# report_check.sh - the review documents of the examples, checked.
# See LICENSE.
#
# usage: tests/report_check.sh [BUILD]
# Writes the .html, .md and .tex document of every example and checks:
# every section in the Markdown and in the HTML (the approx section too,
# and its plain sentence when approx cannot run), MathML in the HTML, the
# HTML's text content against tests/report/sallen_key.txt; with Debian's
# chromium, the DOM as the browser parsed it (--dump-dom), the laid-out
# page no wider than the window and no formula wider than its box, and a
# screenshot whose pixels are not all one colour; with pdflatex, the .tex
# compiles without errors and without overfull boxes over 10 pt.  A
# missing tool is a loud skip, and a failure under CI=true.
build=${1:-build}
name=report_check.sh
bin=$build/gainsmith
passed=0
failed=0
pass() { passed=$((passed + 1)); }
fail() { failed=$((failed + 1)); echo "$name: FAILED: $1"; }
missing() {
    echo "*** SKIPPED in $name: $1 not found (apt-get install $2) ***"
    [ "$CI" = true ] && fail "$1 is required under CI=true"
}
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
sections="Circuit Values Exact Approximation Poles Sensitivities Check Caution"

for gsc in examples/*.gsc; do
    ex=$(basename "$gsc" .gsc)
    for f in html md tex; do
        if "$bin" report "$gsc" -o "$tmp/$ex.$f" >/dev/null; then pass
        else fail "$ex.$f not written"; fi
    done
    for s in $sections; do
        grep -q "^#.* $s" "$tmp/$ex.md" && pass || fail "$ex.md: no $s"
        grep -q "<h[23]>$s" "$tmp/$ex.html" && pass || fail "$ex.html: no $s"
    done
    grep -q "<math display=\"block\">" "$tmp/$ex.html" && pass \
        || fail "$ex.html: no MathML"
    grep -q "<script" "$tmp/$ex.html" && fail "$ex.html: a script" || pass
    # every formula sits in a box that scrolls sideways rather than widen
    # the page, and the style sheet has the rule
    nm=$(grep -o '<math display="block">' "$tmp/$ex.html" | wc -l)
    nb=$(grep -o '<div class="formula"><math display="block">' \
        "$tmp/$ex.html" | wc -l)
    [ "$nm" -eq "$nb" ] && pass || fail "$ex.html: a formula outside a box"
    grep -q '^\.formula { overflow-x: auto;' "$tmp/$ex.html" && pass \
        || fail "$ex.html: no overflow-x rule for formulas"
    grep -q '^\$\$.*\$\$$' "$tmp/$ex.md" && pass || fail "$ex.md: no \$\$"
done

# values that leave approx nothing to measure (D is zero at the nominal
# point: R1 + R2 - A*R1 with A = 2, R1 = R2): the report is still written
# and its approx section says so
for f in html md tex; do
    if "$bin" report tests/report/edge_feedback.gsc -o "$tmp/edge.$f" \
        >/dev/null; then pass
    else fail "edge_feedback.$f not written"; fi
    grep -q "No short form: the denominator is zero" "$tmp/edge.$f" && pass \
        || fail "edge_feedback.$f: the approx section does not say why"
    grep -q "Caution" "$tmp/edge.$f" && pass \
        || fail "edge_feedback.$f: the document stops early"
done

# the noise section, where the circuit has noise sources: every noise
# example has one, in every format
for ex in noise_cs noise_bjt noise_divider; do
    for f in md html tex; do
        grep -q "Noise" "$tmp/$ex.$f" && grep -q "rms over the band" \
            "$tmp/$ex.$f" && pass || fail "$ex.$f: no noise section"
    done
done
# and its figures on an RC low-pass over the plot's span, fc = 159.2 kHz
# so f1 = 1 kHz and f2 = 100 MHz: the output rms is
# sqrt((kT/C)(2/pi)(atan(f2/fc) - atan(f1/fc))) (Gray, Hurst, Lewis and
# Meyer, noise chapter, from memory) and the input-referred rms that of
# the resistor alone, sqrt(4kTR(f2 - f1)) (Johnson-Nyquist), each to the
# four digits printed
"$bin" report tests/report/rc_noise.gsc -o "$tmp/rc.md" >/dev/null
line=$(grep "the span of the Bode plot" "$tmp/rc.md")
si_value() {    # "2.03 µV" -> 2.03e-06
    awk -v s="$1" 'BEGIN { n = split(s, a, " "); v = a[1]; u = a[2];
        m = 1; if (u ~ /^n/) m = 1e-9; else if (u ~ /^µ/) m = 1e-6;
        else if (u ~ /^m/) m = 1e-3; else if (u ~ /^p/) m = 1e-12;
        printf "%.10g\n", v * m }'
}
out=$(si_value "$(echo "$line" | sed 's/.*: output \([^ ]* [^ ]*\) rms.*/\1/')")
inr=$(si_value "$(echo "$line" | sed 's/.*input-referred \([^ ]* [^ ]*\) rms.*/\1/')")
if awk -v o="$out" -v i="$inr" 'BEGIN { k = 1.380649e-23; t = 300;
        r = 1e3; c = 1e-9; pi = atan2(0, -1); fc = 1 / (2 * pi * r * c);
        wo = sqrt(k * t / c * 2 / pi * (atan2(1e8, fc) - atan2(1e3, fc)));
        wi = sqrt(4 * k * t * r * (1e8 - 1e3));
        exit !(o > 0 && i > 0 && (o - wo) ^ 2 < (1e-3 * wo) ^ 2 \
               && (i - wi) ^ 2 < (1e-3 * wi) ^ 2) }'; then pass
else fail "rc_noise: output $out, input-referred $inr V rms against kT/C"
fi

# where the noise is not computed, the section says why in one sentence
"$bin" report tests/report/rc_noise.gsc --limit s=0 -o "$tmp/rcl.md" \
    >/dev/null
grep -q "Not computed under --limit" "$tmp/rcl.md" && pass \
    || fail "rc_noise --limit: the noise section does not say why"
"$bin" report - -o "$tmp/rcs.md" <tests/report/rc_noise.gsc >/dev/null
grep -q "Not computed: the circuit was read from standard input" \
    "$tmp/rcs.md" && pass || fail "rc_noise from stdin: no sentence"

# the text of one document, tags stripped; the check's error (last bits
# of long double, which may differ between compilers) is left out
sed -e 's/<[^>]*>//g' -e 's/worst relative error [^ ]* at [^ ]* Hz/worst/' \
    "$tmp/sallen_key.html" | grep -v '^ *$' | grep -v 'examples/' \
    >"$tmp/sk.txt"
if cmp -s "$tmp/sk.txt" tests/report/sallen_key.txt; then pass
else fail "the text of sallen_key.html differs from tests/report/sallen_key.txt"
    diff "$tmp/sk.txt" tests/report/sallen_key.txt | head -20
fi

if command -v chromium >/dev/null 2>&1; then
    for ex in sallen_key miller_opamp cascode; do
        flags="--headless --no-sandbox --disable-gpu --no-first-run
            --disable-background-networking --disable-component-update
            --disable-sync --user-data-dir=$tmp/profile"
        # shellcheck disable=SC2086
        timeout 120 chromium $flags --dump-dom "file://$tmp/$ex.html" \
            >"$tmp/$ex.dom" 2>/dev/null
        n=$(grep -o '<math' "$tmp/$ex.dom" | wc -l)
        [ "$n" -ge 1 ] && pass || fail "$ex: no MathML in the DOM"
        grep -q 'parsererror' "$tmp/$ex.dom" && fail "$ex: parse error" || pass
        for s in $sections; do
            grep -q ">$s" "$tmp/$ex.dom" && pass || fail "$ex DOM: no $s"
        done
        grep -q '<svg' "$tmp/$ex.dom" && pass || fail "$ex DOM: no SVG"
        # the laid-out widths: a copy of the page with one line of script
        # (the document itself has none) writes the page's scroll width,
        # its viewport width and each formula box's scroll and client
        # widths into an attribute that --dump-dom shows.  Content wider
        # than the viewport is a page that runs off screen and off paper.
        sed 's|</body>|<script>document.body.setAttribute("data-w", [document.documentElement.scrollWidth, document.documentElement.clientWidth].concat(Array.from(document.querySelectorAll(".formula"), function (e) { return e.scrollWidth + ":" + e.clientWidth; })).join(" "));</script></body>|' \
            "$tmp/$ex.html" >"$tmp/$ex-w.html"
        # shellcheck disable=SC2086
        w=$(timeout 120 chromium $flags --window-size=900,3000 --dump-dom \
            "file://$tmp/$ex-w.html" 2>/dev/null \
            | sed -n 's/.*data-w="\([^"]*\)".*/\1/p')
        set -- $w
        if [ $# -ge 3 ] && [ "$1" -le "$2" ]; then pass
        else fail "$ex: the page is wider than the viewport (widths: $w)"; fi
        shift 2 2>/dev/null
        for fw in "$@"; do
            [ "${fw%%:*}" -le "${fw##*:}" ] && pass \
                || fail "$ex: a formula runs past its box ($fw)"
        done
        # shellcheck disable=SC2086
        timeout 120 chromium $flags --window-size=900,3000 \
            --screenshot="$tmp/$ex.png" "file://$tmp/$ex.html" \
            >/dev/null 2>&1
        if python3 - "$tmp/$ex.png" <<'PY'
import sys, zlib, struct
d = open(sys.argv[1], 'rb').read()
assert d[:8] == b'\x89PNG\r\n\x1a\n'
# count distinct bytes of the image data: a blank page has almost none
i, idat = 8, b''
while i < len(d):
    n, t = struct.unpack('>I4s', d[i:i + 8])
    if t == b'IDAT':
        idat += d[i + 8:i + 8 + n]
    i += 12 + n
raw = zlib.decompress(idat)
sys.exit(0 if len(set(raw)) > 8 and raw.count(0xff) < len(raw) * 0.995
         else 1)
PY
        then pass; else fail "$ex: the screenshot is blank"; fi
    done
else
    missing chromium chromium
fi

if command -v pdflatex >/dev/null 2>&1; then
    for ex in sallen_key miller_opamp cascode edge; do
        (cd "$tmp" && pdflatex -interaction=nonstopmode -halt-on-error \
            "$ex.tex" >/dev/null 2>&1)
        [ -f "$tmp/$ex.pdf" ] && pass || fail "$ex.tex does not compile"
        bad=$(grep -o 'Overfull \\hbox ([0-9.]*pt' "$tmp/$ex.log" \
            | sed 's/.*(//; s/pt//' | awk '$1 > 10' | wc -l)
        [ "$bad" -eq 0 ] && pass || fail "$ex.tex: $bad overfull boxes > 10pt"
    done
else
    missing pdflatex texlive-latex-base
fi

echo "$name: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
