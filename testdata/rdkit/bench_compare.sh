#!/bin/sh
# Runs RDKit's CIP labeller timing (bench_cip.py) beside the Go labelling
# benchmarks of ./stereo/, both on one core, and prints both figures.
#
# Usage (from anywhere): sh testdata/rdkit/bench_compare.sh [seconds]
# Needs Debian's python3-rdkit (run by /usr/bin/python3) and Go on PATH.
set -u
here=$(cd "$(dirname "$0")" && pwd)
repo=$(cd "$here/../.." && pwd)
secs=${1:-2}

# taskset pins both runs to the same single CPU when it is available.
pin=""
if command -v taskset >/dev/null 2>&1; then
	pin="taskset -c 0"
fi

echo "== RDKit (rdCIPLabeler.AssignCIPLabels) =="
$pin /usr/bin/python3 "$here/bench_cip.py" \
	"$repo/../shared/reference/cip-validation-suite/compounds.smi" \
	"$here/cip_labels.tsv" "$secs" || echo "bench_cip.py failed"

echo
echo "== Go (go test -run ^\$ -bench BenchmarkLabel ./stereo/, GOMAXPROCS=1) =="
cd "$repo" || exit 1
out=$(GOMAXPROCS=1 $pin go test -run '^$' -bench 'BenchmarkLabel' -benchtime "${secs}s" -cpu 1 ./stereo/ 2>&1)
status=$?
if [ $status -ne 0 ]; then
	echo "$out"
	echo "go benchmarks failed (exit $status)"
	exit $status
fi
if ! echo "$out" | grep -E '^Benchmark'; then
	echo "no BenchmarkLabel benchmark ran in ./stereo/ (none written yet?)"
fi
