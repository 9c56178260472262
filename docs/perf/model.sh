#!/bin/sh
# model.sh BAYS STOREYS FILE: the regular frame of docs/performance.md,
# as 'govern new' writes it (bays of 7.5 m then 6 m, storeys of 4.2 m then
# 3.6 m) without the column faces (the sections' depths) and the service
# combination. GOVERN names the command (default: govern on the PATH).
set -e
b=$1 s=$2 out=$3
: "${GOVERN:=govern}"
[ -e "$out" ] && { echo "$out exists" >&2; exit 1; }
"$GOVERN" new --bays "7.5,6x$((b - 1))" --storeys "4.2,3.6x$((s - 1))" - 2>/dev/null |
	sed -e '/^depth = /d' -e '/^# A service combination/,$d' >"$out"
