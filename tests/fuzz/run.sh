#!/bin/sh
# run.sh - run the libFuzzer target for a while. See LICENSE.
#
# usage: tests/fuzz/run.sh build/fuzz/fuzz_circuit [SECONDS]
# The corpus (build/fuzz/corpus) is seeded from every circuit file of
# examples/ and tests/, and kept between runs.  A crash leaves its input
# in build/fuzz/ (crash-*, leak-*, timeout-*) and makes the run fail;
# minimise it with `build/fuzz/fuzz_circuit -minimize_crash=1 FILE` and
# add it as a golden in tests/cli.
bin=$1
secs=${2:-60}
dir=$(dirname "$bin")
corpus=$dir/corpus
mkdir -p "$corpus"
for f in examples/*.gsc tests/cli/*.gsc tests/bench/*.gsc; do
    [ -f "$f" ] || continue
    # at most the target's own input limit
    [ "$(wc -c <"$f")" -le 4096 ] || continue
    cp "$f" "$corpus/seed-$(basename "$(dirname "$f")")-$(basename "$f")"
done
"$bin" -max_total_time="$secs" -max_len=4096 -timeout=10 \
    -rss_limit_mb=1024 -artifact_prefix="$dir/" -print_final_stats=1 \
    "$corpus" 2>"$dir/fuzz.log"
rc=$?
tail -n 12 "$dir/fuzz.log"
if [ $rc -ne 0 ]; then
    echo "fuzz: the target failed (status $rc); see $dir/fuzz.log"
    exit 1
fi
echo "fuzz: no crash in $secs s"
