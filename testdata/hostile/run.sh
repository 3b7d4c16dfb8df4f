#!/bin/sh
# Checks each hostile record of issue 13 with `stereoline check` and
# prints its wall time, peak RSS, exit status and the codes reported.
#
# usage: run.sh STEREOLINE [DIR] [TIMEOUT]
#   STEREOLINE  the binary (go build -o /tmp/stereoline ./cmd/stereoline)
#   DIR         where the inputs are written (default: a temporary folder)
#   TIMEOUT     seconds before a case is stopped (default 60)
# Run with GOMAXPROCS=1 for one core.
set -eu
bin=$1
dir=${2:-$(mktemp -d)}
limit=${3:-60}
here=$(dirname "$0")
python3 "$here/gen.py" "$dir"
printf '%-24s %9s %10s %6s  %s\n' case wall_s peak_MB status codes
for f in "$dir"/*.smi; do
	name=$(basename "$f" .smi)
	set +e
	timeout "$limit" /usr/bin/time -v -o "$dir/$name.time" "$bin" check --format json "$f" >"$dir/$name.out" 2>"$dir/$name.err"
	status=$?
	set -e
	wall=$(sed -n 's/.*Elapsed (wall clock) time (h:mm:ss or m:ss): //p' "$dir/$name.time" 2>/dev/null |
		awk -F: '{ if (NF == 3) print $1*3600+$2*60+$3; else print $1*60+$2 }')
	rss=$(sed -n 's/.*Maximum resident set size (kbytes): //p' "$dir/$name.time" 2>/dev/null | awk '{ printf "%.0f", $1/1024 }')
	codes=$(grep -o '"code":"[^"]*"' "$dir/$name.out" | sort | uniq -c | awk '{ sub(/"code":/, "", $2); printf "%s%sx%s", sep, $2, $1; sep=" " }')
	[ "$status" = 124 ] && wall=">$limit"
	printf '%-24s %9s %10s %6s  %s\n' "$name" "${wall:-?}" "${rss:-?}" "$status" "$codes"
done
