#!/usr/bin/env bash
# Two builds' run reports side by side: the same run folder reported COPIES times in one JVM per
# build (after one warm-up report), the builds alternating first in each round; prints each
# build's median CPU time (the whole process's, user + system) per report and round, and the
# ratio, with the load average: CPU time, since on a shared machine wall time measures the load.
# usage: benchmarks/report-timing/report-builds.sh RUN_FOLDER ROUNDS COPIES OLD_ROOT NEW_ROOT
#   (OLD_ROOT, NEW_ROOT: repository roots with spark-runner built, e.g. a git worktree of the
#   older commit after `mvn -o -q -B -pl spark-runner -am package -DskipTests`)
set -euo pipefail
run="$1" rounds="$2" copies="$3" old="$4" new="$5"
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
time_build() { # root -> median seconds
  java -Djava.awt.headless=true -cp "$1/spark-runner/target/skerry-spark-runner.jar:$1/spark-runner/target/lib/*" \
    "$here/ReportTiming.java" "$run" "$copies" 2>/dev/null | awk '{ print $4 }' | sort -n \
    | awk '{ a[NR] = $1 } END { print (NR % 2 ? a[(NR + 1) / 2] : (a[NR / 2] + a[NR / 2 + 1]) / 2) }'
}
for round in $(seq 1 "$rounds"); do
  load="$(cut -d' ' -f1-3 /proc/loadavg)"
  if [ $((round % 2)) -eq 1 ]; then o=$(time_build "$old"); n=$(time_build "$new"); else n=$(time_build "$new"); o=$(time_build "$old"); fi
  awk -v r="$round" -v o="$o" -v n="$n" -v l="$load" 'BEGIN { printf "round %d CPU per report: old %.3f s new %.3f s new/old %.3f load %s\n", r, o, n, n / o, l }'
done
