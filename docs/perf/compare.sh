#!/bin/sh
# compare.sh MODEL RUNS CMD...: runs each command RUNS times, alternating
# (one of each per round), and prints each one's wall times sorted, the
# median, the median CPU time (user + system) and the median peak memory,
# from /usr/bin/time. In a command,
# MODEL stands for the model file and OUT for an output file of its own.
# Example, on the frame docs/perf/model.sh writes:
#   docs/perf/compare.sh tall.toml 5 "./govern-main run --quiet --json OUT MODEL" \
#     "./govern run --quiet --json OUT MODEL" "/usr/bin/python3 docs/perf/envelope.py MODEL OUT"
set -e
model=$1 runs=$2
shift 2
log=$(mktemp)
trap 'rm -f "$log" "$log".*' EXIT
for r in $(seq "$runs"); do
	i=0
	for cmd in "$@"; do
		i=$((i + 1))
		c=$(echo "$cmd" | sed -e "s|MODEL|$model|g" -e "s|OUT|$log.$i.out|g")
		/usr/bin/time -f "$i %e %M %U %S" -a -o "$log" $c >/dev/null 2>&1
	done
done
i=0
for cmd in "$@"; do
	i=$((i + 1))
	t=$(awk -v i=$i '$1 == i {print $2}' "$log" | sort -n | tr '\n' ' ')
	med=$(awk -v i=$i '$1 == i {print $2}' "$log" | sort -n | awk '{a[NR]=$1} END {print a[int((NR+1)/2)]}')
	mem=$(awk -v i=$i '$1 == i {print $3}' "$log" | sort -n | awk '{a[NR]=$1} END {printf "%.0f", a[int((NR+1)/2)]/1024}')
	cpu=$(awk -v i=$i '$1 == i {print $4 + $5}' "$log" | sort -n | awk '{a[NR]=$1} END {print a[int((NR+1)/2)]}')
	echo "$cmd: median $med s ($t), CPU $cpu s, peak $mem MiB"
done
