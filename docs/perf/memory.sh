#!/bin/sh
# memory.sh [RUNS]: the peak memory of 'govern run --quiet --json OUT MODEL'
# (maximum resident set size from /usr/bin/time, the median of RUNS runs,
# default 1) on the frames docs/perf/model.sh writes, against the estimate
# that refuses a model too large (frame.MaxMemory; docs/errors.md, Limits).
# Run from the repository's root; not run by the tests (minutes of work).
#
# FIRST and SECOND list the frames (BAYSxSTOREYS) run in first and in
# second order ([analysis] second_order = true), UNPATTERNED and
# UNPATTERNED2 those run with no case patterned (a few load columns: the
# band dominates) in first and in second order, STARTER those run as
# 'govern new' writes them (column faces and a service combination with a
# deflection limit), in first order ("starter") and in second
# ("starter2"). GOVERN names the command measured (default: one built from
# this tree). The estimates are printed by the test helper
# TestPrintMemoryEstimates of cmd/govern. 'govern run' sets the Go
# runtime's soft memory limit to the estimate unless GOMEMLIMIT is set:
# GOMEMLIMIT=off measures the run without it. While its limit holds it
# also turns the collector's own target off, unless GOGC is set, and a
# run may then grow to its estimate before it collects, whatever it needs:
# so the runs here are made with GOGC=100 (the target kept, the peak the
# run's need, which the estimate is checked against); GOGC= (empty)
# measures them as they are.
#
# Prints, for each frame: the order, the frame, equations, half-bandwidth,
# load columns, the estimate and the measured peak (MiB, the median), their
# ratio, the smallest and largest peak of the runs, and the load average
# when they ended.
set -e
runs=${1:-1}
: "${GOGC=100}"
export GOGC
: "${FIRST=10x10 20x20 30x30 40x40 30x60 50x20 10x50 60x60 20x200 70x70}"
: "${SECOND=10x10 10x20 20x20 20x30 30x30 10x50 50x20 30x60}"
: "${UNPATTERNED=60x60 100x100}"
: "${UNPATTERNED2=60x60}"
: "${STARTER=20x20 30x30}"
dir=$(mktemp -d)
trap 'rm -rf "$dir"' EXIT
if [ -z "$GOVERN" ]; then
	go build -o "$dir/govern" ./cmd/govern
	GOVERN=$dir/govern
fi
export GOVERN
files=
for order in first second unpatterned unpatterned2 starter starter2; do
	case $order in
	first) sizes=$FIRST ;;
	second) sizes=$SECOND ;;
	unpatterned) sizes=$UNPATTERNED ;;
	unpatterned2) sizes=$UNPATTERNED2 ;;
	starter | starter2) sizes=$STARTER ;;
	esac
	for size in $sizes; do
		b=${size%x*} s=${size#*x}
		f=$dir/$order-$size.toml
		case $order in
		starter*) "$GOVERN" new --bays "7.5,6x$((b - 1))" --storeys "4.2,3.6x$((s - 1))" "$f.base" >/dev/null 2>&1 ;;
		*) sh docs/perf/model.sh "$b" "$s" "$f.base" ;;
		esac
		case $order in
		first | starter) cp "$f.base" "$f" ;;
		second | starter2) sed 's/^\[analysis\]$/[analysis]\nsecond_order = true/' "$f.base" >"$f" ;;
		unpatterned) sed 's/^pattern = true/pattern = false/' "$f.base" >"$f" ;;
		unpatterned2) sed -e 's/^pattern = true/pattern = false/' -e 's/^\[analysis\]$/[analysis]\nsecond_order = true/' "$f.base" >"$f" ;;
		esac
		rm "$f.base"
		files="$files $f"
	done
done
go test -count=1 -v -run TestPrintMemoryEstimates ./cmd/govern -memory-estimates "$files" |
	awk '$1 == "estimate"' >"$dir/estimates"
printf '%-12s %-8s %9s %6s %8s %10s %10s %6s %11s  %s\n' order frame equations band columns "estimate" "peak" ratio "runs (MiB)" load
for f in $files; do
	name=$(basename "$f" .toml)
	: >"$dir/peaks"
	for r in $(seq "$runs"); do
		/usr/bin/time -f %M -a -o "$dir/peaks" "$GOVERN" run --quiet --json "$dir/out.json" "$f" >/dev/null 2>&1
	done
	peak=$(sort -n "$dir/peaks" | awk '{a[NR] = $1} END {print a[int((NR + 1) / 2)]}')
	range=$(sort -n "$dir/peaks" | awk 'NR == 1 {lo = $1} {hi = $1} END {printf "%.0f-%.0f", lo / 1024, hi / 1024}')
	load=$(uptime | sed 's/.*load average: //')
	awk -v f="$f" -v name="$name" -v peak="$peak" -v range="$range" -v load="$load" '$2 == f {
		split(name, p, "-")
		est = $6 / 1048576; got = peak / 1024
		printf "%-12s %-8s %9d %6d %8d %6.0f MiB %6.0f MiB %6.2f %11s  %s\n", p[1], p[2], $3, $4, $5, est, got, est / got, range, load
	}' "$dir/estimates"
done
