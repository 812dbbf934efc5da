#!/bin/sh
# run_bench.sh - runs every benchmark for `make bench`. See LICENSE.
#
# usage: sh tests/bench/run_bench.sh BUILD
#
# Prints machine-readable lines (docs/benchmarks.md explains each):
#   bench machine nproc=N loadavg_1min=L
#   bench spawn-baseline command=true seconds=S peak_kib=K
#   bench derive-NAME terms_N=N terms_D=D seconds=S peak_kib=K check=ok
#   bench derive-NAME-maxima seconds=S terms_N=N terms_D=D check=ok
#   bench derive-NAME-ratio maxima_over_gainsmith=R
#   ...the lines of every BUILD/bench/bench_* program and of the sympy
#   benchmark scripts, passed through...
#   bench engine-NAME graph_nodes=N graph_edges=E build_seconds=B
#         bode_1k_seconds=T paths_D=P ... approx_seconds=A approx_err_db=E
#         ... peak_kib=K   (bench_engine.c)
#   bench engine-order-NAME greedy=N/E/S natural=N/E/S sparse=N/E/S
#   bench noise-NAME seconds=S peak_kib=K status=ok
#   bench noise-approx-NAME seconds=S err_db=E peak_kib=K status=ok
#   bench goal KEY=yes|no ...
#   bench load loadavg_1min=L
#   bench summary cases=C mismatches=M max_peak_kib=K
# Each circuit tests/bench/NAME.gsc is derived 5 times as a whole process
# (`gainsmith derive FILE --stats`, timed by tests/bench/timer.c), or once
# when the first run takes over 10 s; seconds is the median, peak_kib the
# largest peak resident set.  The address space of each gainsmith run is
# capped at GS_BENCH_MAX_MIB MiB (default 2048, 0 for none) so that a
# case that blows up fails instead of exhausting a shared machine.  The
# term counts are checked against the table in tests/bench/README.md
# (maxima 5.46 and sympy 1.11, computed independently).  When maxima is
# installed, the same circuit is solved by an MNA written in maxima
# (tests/bench/maxima_mna.py) as a speed anchor measured in the same run:
# median of 3 runs, or 1 run when the first takes over 10 s.
# GS_BENCH_SKIP_MAXIMA=1 skips maxima.  Every run has a limit of 300 s.
# The exit status is 1 on any term-count mismatch or failed run.
build=${1:-build}
here=tests/bench
bin=$build/gainsmith
timer=$build/bench/timer
limit=300
max_mib=${GS_BENCH_MAX_MIB:-2048}
status=0
mismatches=0
cases=0
max_peak=0
min_ratio=
min_ratio_case=
ladder12=

if [ ! -x "$bin" ]; then
    echo "run_bench.sh: $bin not found (run make first)" >&2
    exit 1
fi
mkdir -p "$build/bench"
if ! ${CC:-cc} -O2 -std=c11 -D_POSIX_C_SOURCE=200809L -o "$timer" \
    "$here/timer.c"; then
    echo "run_bench.sh: cannot build $timer" >&2
    exit 1
fi
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
trap 'rm -rf "$tmp"; exit 130' INT TERM

# field KEY LINE: the value of KEY=value in a line of such pairs
field() {
    echo " $2" | sed -n "s/.* $1=\([^ ]*\).*/\1/p"
}

# The first Python that imports sympy (argument "sympy"), or any python3.
find_python() {
    for py in python3 /usr/bin/python3; do
        command -v "$py" >/dev/null 2>&1 || continue
        if [ -z "$1" ] || "$py" -c 'import sympy' 2>/dev/null; then
            echo "$py"
            return 0
        fi
    done
    return 1
}

# The README table's rows: "NAME N D", in table order.
expected_table() {
    awk -F'|' 'NF >= 7 {
        for (i = 2; i <= 6; i++) gsub(/^ +| +$/, "", $i)
        if ($5 ~ /^[0-9]+$/ && $6 ~ /^[0-9]+$/) print $2, $5, $6
    }' "$here/README.md"
}

# check N D EN ED: "ok" or "MISMATCH(expected EN/ED)"
check() {
    if [ -n "$3" ] && [ "$1" = "$3" ] && [ "$2" = "$4" ]; then
        echo ok
    else
        echo "MISMATCH(expected ${3:-?}/${4:-?})"
    fi
}

# larger A B, ratio A B: comparisons and quotients of decimals, in awk
larger() {
    awk -v a="$1" -v b="$2" 'BEGIN { exit !(a + 0 > b + 0) }'
}
ratio() {
    awk -v a="$1" -v b="$2" 'BEGIN { if (b > 0) printf "%.1f", a / b }'
}
yes_no() {
    if "$@"; then echo yes; else echo no; fi
}
loadavg() {
    cut -d' ' -f1 /proc/loadavg 2>/dev/null || echo unknown
}

# Whole-process time of gainsmith on one circuit; sets g_seconds.
bench_gainsmith() {
    name=$1
    t=$("$timer" -n 5 -s 10 -l "$limit" -m "$max_mib" -e "$tmp/err" -- \
        "$bin" derive "$here/$name.gsc" --stats)
    g_seconds=$(field seconds "$t")
    kib=$(field peak_kib "$t")
    st=$(field status "$t")
    stats=$(sed -n '/^stats /{p;q;}' "$tmp/err")
    tn=$(field terms_N "$stats")
    td=$(field terms_D "$stats")
    c=$(check "$tn" "$td" "$2" "$3")
    extra=
    if [ "$st" != ok ]; then
        extra=" status=$st"
        c="MISMATCH(expected ${2:-?}/${3:-?})"
        echo "run_bench.sh: $name: gainsmith $st (limits: $limit s," \
            "$max_mib MiB of address space)" >&2
        sed -n '1,5s/^/run_bench.sh: gainsmith: /p' "$tmp/err" >&2
    fi
    echo "bench derive-$name terms_N=${tn:--} terms_D=${td:--}" \
        "seconds=$g_seconds peak_kib=$kib check=$c$extra"
    if [ "$name" = rc_ladder_12 ]; then
        ladder12="seconds=$g_seconds$extra"
        ladder12_ok=$(yes_no larger 0.1 "$g_seconds")
        [ "$st" = ok ] || ladder12_ok=no
    fi
    [ "$c" = ok ] || { mismatches=$((mismatches + 1)); g_seconds=; }
    if larger "$kib" "$max_peak"; then max_peak=$kib; fi
}

# The same circuit solved by the MNA written in maxima, and the ratio.
bench_maxima() {
    name=$1
    if ! "$gen_py" "$here/maxima_mna.py" "$here/$name.gsc" \
        >"$tmp/$name.mac"; then
        mismatches=$((mismatches + 1))
        return
    fi
    t=$("$timer" -n 3 -s 10 -l "$limit" -o "$tmp/out" -- \
        maxima --very-quiet --batch="$tmp/$name.mac")
    m_seconds=$(field seconds "$t")
    st=$(field status "$t")
    line=$(sed -n '/^terms_N=[0-9]/{p;q;}' "$tmp/out")
    tn=$(field terms_N "$line")
    td=$(field terms_D "$line")
    c=$(check "$tn" "$td" "$2" "$3")
    extra=
    bound=
    [ "$st" = ok ] || extra=" status=$st"
    [ "$st" = timeout ] && bound=" bound=lower"
    echo "bench derive-$name-maxima seconds=$m_seconds" \
        "terms_N=${tn:--} terms_D=${td:--} check=$c$extra"
    # a timeout is not a wrong answer: the ratio is then a lower bound
    [ "$c" = ok ] || [ "$st" = timeout ] || mismatches=$((mismatches + 1))
    r=$(ratio "$m_seconds" "$g_seconds")
    [ -n "$r" ] || return
    echo "bench derive-$name-ratio maxima_over_gainsmith=$r$bound"
    if [ -z "$min_ratio" ] || larger "$min_ratio" "$r"; then
        min_ratio=$r
        min_ratio_case=$name
    fi
}

run_case() {
    cases=$((cases + 1))
    if [ ! -f "$here/$1.gsc" ]; then
        echo "bench derive-$1 check=MISSING(expected $2/$3)"
        mismatches=$((mismatches + 1))
        return
    fi
    bench_gainsmith "$@"
    [ -n "$use_maxima" ] && bench_maxima "$@"
}

# The machine is often shared: its load average goes with the figures.
echo "bench machine nproc=$(nproc 2>/dev/null || echo unknown)" \
    "loadavg_1min=$(loadavg)"
# What starting any process costs here: the floor under every figure.
t=$("$timer" -n 5 -- true)
echo "bench spawn-baseline command=true seconds=$(field seconds "$t")" \
    "peak_kib=$(field peak_kib "$t")"

use_maxima=
gen_py=$(find_python "")
if [ "${GS_BENCH_SKIP_MAXIMA:-0}" = 1 ]; then
    echo "bench maxima skipped=GS_BENCH_SKIP_MAXIMA"
elif ! command -v maxima >/dev/null 2>&1; then
    echo "bench maxima skipped=not_installed"
elif [ -z "$gen_py" ]; then
    echo "bench maxima skipped=no_python3"
else
    use_maxima=1
fi

expected_table >"$tmp/table"
while read -r name en ed; do
    run_case "$name" "$en" "$ed"
done <"$tmp/table"
# a circuit without a row in the table has nothing to be checked against
for f in "$here"/*.gsc; do
    [ -f "$f" ] || continue
    name=${f##*/}
    name=${name%.gsc}
    grep -q "^$name " "$tmp/table" || run_case "$name" "" ""
done

# The pivot rules of the elimination on the larger cases (the result is
# the same under every rule; only the work differs).
for name in rc_ladder_8 rc_ladder_10 rc_ladder_12 rand_8 rand_9 rand_10; do
    [ -f "$here/$name.gsc" ] || continue
    for rule in minwork minterms markowitz natural; do
        t=$("$timer" -n 3 -s 5 -l 20 -m "$max_mib" -- "$bin" derive \
            "$here/$name.gsc" --pivot "$rule")
        echo "bench pivot-$rule-$name seconds=$(field seconds "$t")" \
            "peak_kib=$(field peak_kib "$t") status=$(field status "$t")"
    done
done

# the graph of minors on the engine circuits (tests/bench/engine), one
# process each
for f in "$here"/engine/*.gsc; do
    "$build/bench/bench_engine" "$f" \
        || { echo "run_bench.sh: bench_engine $f failed" >&2; status=1; }
    "$build/bench/bench_engine" "$f" --orders || status=1
done

for b in "$build"/bench/bench_*; do
    [ -f "$b" ] && [ -x "$b" ] || continue
    "$b" || { echo "run_bench.sh: $b exited with $?" >&2; status=1; }
done
sympy_py=$(find_python sympy)
for script in fateman_sympy.py gcd_sympy.py; do
    [ -f "$here/$script" ] || continue
    if [ -z "$sympy_py" ]; then
        echo "bench ${script%.py} skipped=no_sympy"
        continue
    fi
    "$sympy_py" "$here/$script" "$build" ||
        { echo "run_bench.sh: $script exited with $?" >&2; status=1; }
done

# The review document of each example, whole process, without a browser.
for gsc in examples/*.gsc; do
    ex=$(basename "$gsc" .gsc)
    t=$("$timer" -n 5 -s 10 -l "$limit" -m "$max_mib" -e "$tmp/err" -- \
        "$bin" report "$gsc" -o "$tmp/report-$ex.html")
    echo "bench report-$ex seconds=$(field seconds "$t")" \
        "peak_kib=$(field peak_kib "$t") status=$(field status "$t")"
done

# Noise: the symbolic density of every source, the integrated band and a
# 1000-point spectrum, on the examples and the two-stage op-amp case.
noise_ok=yes
noise_max=0
for f in examples/noise_*.gsc examples/miller_opamp.gsc \
         "$here/miller_ota.gsc"; do
    [ -f "$f" ] || continue
    name=${f##*/}
    name=${name%.gsc}
    # the bench case is symbolic only: an invented design point for it
    sets=
    [ "$name" = miller_ota ] && sets="--set gm1=200u --set R1=400k \
        --set C1=50f --set gm6=2m --set R2=100k --set CL=5p --set Cc=2p"
    # shellcheck disable=SC2086
    t=$("$timer" -n 5 -s 10 -l "$limit" -m "$max_mib" -o "$tmp/out" -- \
        "$bin" noise "$f" --at 1k --band 1:100M --points 1000 \
        --csv "$tmp/noise.csv" $sets)
    sec=$(field seconds "$t")
    st=$(field status "$t")
    echo "bench noise-$name seconds=$sec peak_kib=$(field peak_kib "$t")" \
        "status=$st"
    [ "$st" = ok ] || { noise_ok=no; status=1; }
    larger 0.1 "$sec" || noise_ok=no
    if larger "$sec" "$noise_max"; then noise_max=$sec; fi
done
# Short forms of the noise (noise --approx, 0.5 dB) on two examples.
for f in examples/noise_cs.gsc examples/miller_opamp.gsc; do
    name=$(basename "$f" .gsc)
    t=$("$timer" -n 5 -s 10 -l "$limit" -m "$max_mib" -o "$tmp/out" -- \
        "$bin" noise "$f" --approx --tol 0.5)
    err=$(sed -n 's/.*S_out \([^ ]*\) dB, S_in \([^ ]*\) dB.*/\1 \2/p' \
        "$tmp/out" | awk '{m = $1 > $2 ? $1 : $2; if (m > w) w = m} \
        END {print w + 0}')
    echo "bench noise-approx-$name seconds=$(field seconds "$t")" \
        "err_db=$err peak_kib=$(field peak_kib "$t") status=$(field status "$t")"
    [ "$(field status "$t")" = ok ] || status=1
done
# approx: whole-process time of `gainsmith approx FILE --stats` (median of
# 5) on the examples with a transfer function worth simplifying and on the
# full-capacitance op-amp; terms kept and the worst magnitude error.
# Goals: every example under 50 ms, the op-amp under 300 ms and 64 MiB.
approx_ok=yes
for f in examples/miller_opamp.gsc examples/cs_degen.gsc \
         examples/sallen_key.gsc $here/opamp_full_caps.gsc; do
    n=$(basename "$f" .gsc)
    t=$("$timer" -n 5 -s 10 -l "$limit" -m "$max_mib" -e "$tmp/err" \
        -o "$tmp/out" -- "$bin" approx "$f" --stats --format json)
    sec=$(field seconds "$t")
    kib=$(field peak_kib "$t")
    terms=$(sed -n 's/.*terms_kept=\([0-9]*\).*/\1/p' "$tmp/err" | head -1)
    err=$(sed -n 's/.*"mag_db": \([^,]*\),.*"spread_mag_db": \([^,]*\),.*/\1 \2/p' \
        "$tmp/out" | awk '{m = $1 > $2 ? $1 : $2; if (m > w) w = m} \
        END {print w + 0}')
    echo "bench approx-$n seconds=$sec terms=${terms:--} err_db=$err" \
        "peak_kib=$kib status=$(field status "$t")"
    goal=0.05
    [ "$n" = opamp_full_caps ] && goal=0.3
    [ "$(yes_no larger "$goal" "$sec")" = yes ] || approx_ok=no
    [ "$(yes_no larger 65536 "$kib")" = yes ] || approx_ok=no
done
echo "bench goal approx_examples_50ms_opamp_300ms_64MiB=$approx_ok"

# The goals: 100x faster than maxima on every case, rc_ladder_12 under
# 100 ms, peak resident memory under 64 MiB everywhere.
if [ -n "$min_ratio" ]; then
    echo "bench goal maxima_over_gainsmith_at_least_100=$(yes_no \
        larger "$min_ratio" 99.99) min_ratio=$min_ratio case=$min_ratio_case"
fi
if [ -n "$ladder12" ]; then
    echo "bench goal rc_ladder_12_under_100ms=$ladder12_ok $ladder12"
fi
echo "bench goal noise_under_100ms=$noise_ok max_seconds=$noise_max"
echo "bench goal peak_under_64MiB=$(yes_no larger 65536 "$max_peak")" \
    "max_peak_kib=$max_peak"

echo "bench load loadavg_1min=$(loadavg)"
echo "bench summary cases=$cases mismatches=$mismatches max_peak_kib=$max_peak"
[ "$mismatches" -eq 0 ] || status=1
exit "$status"
