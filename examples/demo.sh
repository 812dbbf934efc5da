#!/bin/sh
# demo.sh - runs gainsmith on the bundled examples. See LICENSE.
# usage: examples/demo.sh path/to/gainsmith
bin=${1:-build/gainsmith}
status=0
run() {
    echo "\$ gainsmith $*"
    "$bin" "$@" || status=1
    echo
}
run derive examples/cs_degen.gsc
run derive examples/cs_degen.gsc --only Av --limit ro1=inf
run derive examples/cs_degen.gsc --only Av --format pretty
run eval examples/cs_degen.gsc --at 1k
run derive examples/cascode.gsc
run derive examples/source_follower.gsc
run derive examples/inverting_amp.gsc --limit A=inf
run derive examples/sallen_key.gsc --format latex
run eval examples/sallen_key.gsc --at 10k
run derive examples/bjt_ce_degen.gsc
run poles examples/sallen_key.gsc
run step examples/sallen_key.gsc
run bode examples/sallen_key.gsc --from 100 --to 1M --points 5
run check examples/sallen_key.gsc
run eval examples/cs_biased.gsc
run approx examples/miller_opamp.gsc
run approx examples/miller_opamp.gsc --tol 1 --format pretty
run extract mos --id=200u --vds=1.5 --gm=1.3115m --gds=9.3023u --vth=0.45
run sens examples/sallen_key.gsc --at 10k
demo_doc=${TMPDIR:-/tmp}/gainsmith-demo-review.html
run report examples/miller_opamp.gsc -o "$demo_doc"
echo "# the review document of the two-stage op-amp is $demo_doc"
exit $status
