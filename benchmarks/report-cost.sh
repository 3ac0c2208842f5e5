#!/usr/bin/env bash
# The report's share of the demo's wall time, two ways in one script:
#  1. within each demo with the report on: the time each run report and the comparison took (the
#     "made in" seconds skerry prints) over the demo's wall time — free of run-to-run noise;
#  2. side by side: `skerry demo` with the report on and off (--set output.report=false), the order
#     alternating every round so that a burst of load hits both alike; the ratio per round;
#  3. the same pairs' CPU time (user + system, from /usr/bin/time), which waits for a core do not
#     inflate as they inflate the wall time on a shared machine; and each demo's sampling time (the
#     two runs' timing.json wall_seconds), so that a difference in sampling speed between the two
#     demos of a pair, which the report cannot cause, is seen apart from the report's own time.
# Usage: benchmarks/report-cost.sh ROUNDS   (from the repository root, after one `bin/skerry demo`
# or `mvn -q -B -o -DskipTests package` so that no build is timed)
set -euo pipefail
rounds="${1:-3}"
out="$(mktemp -d)"
trap 'rm -rf "$out"' EXIT
now() { date +%s.%N; }
wall() {
  local label="$1" round="$2"; shift 2
  local start end report cpu
  start=$(now)
  /usr/bin/time -f '%U %S' -o "$out/$label-$round.cpu" bin/skerry demo --out "$out/$label-$round" "$@" >"$out/$label-$round.err" 2>&1
  end=$(now)
  cpu=$(awk '{ printf "%.2f", $1 + $2 }' "$out/$label-$round.cpu")
  runs=$(cat "$out/$label-$round"/*/timing.json | sed -n 's/.*"wall_seconds": *\([0-9.]*\).*/\1/p' | awk '{ s += $1 } END { printf "%.2f", s }')
  report=$(sed -n 's/.*report: .* (made in \([0-9.]*\) s)$/\1/p' "$out/$label-$round.err" | awk '{ s += $1 } END { printf "%.2f", s }')
  awk -v l="$label" -v r="$round" -v s="$start" -v e="$end" -v rep="$report" -v cpu="$cpu" -v runs="$runs" -v load="$(cut -d' ' -f1-3 /proc/loadavg)" \
    'BEGIN { printf "%s %d wall %.2f s, reports %s s (%.1f %%), cpu %s s, load %s, runs %s s\n", l, r, e - s, rep, 100 * rep / (e - s), cpu, load, runs }'
}
for round in $(seq 1 "$rounds"); do
  if [ $((round % 2)) -eq 1 ]; then
    wall on "$round"; wall off "$round" --set output.report=false
  else
    wall off "$round" --set output.report=false; wall on "$round"
  fi
done | tee "$out/lines"
awk '/^on / { on[$2] = $4; onc[$2] = $12; onr[$2] = $19 } /^off / { off[$2] = $4; offc[$2] = $12; offr[$2] = $19 }
     /^on / { share += 100 * $7 / $4; n++ }
     END { for (r in on) { q = on[r] / off[r]; c = onc[r] / offc[r]; sr = onr[r] / offr[r]
                           x = (on[r] - onr[r]) - (off[r] - offr[r])
                           printf "round %d: on/off wall %.3f, cpu %.3f, sampling %.3f; outside the runs on - off %.2f s\n", r, q, c, sr, x
                           s += q; sc += c; ss += sr; sx += x; k++ }
           printf "mean on/off wall %.3f, cpu %.3f, sampling %.3f; outside the runs on - off %.2f s; over %d rounds; reports %.1f %% of the wall time with the report on\n", s / k, sc / k, ss / k, sx / k, k, share / n }' \
  "$out/lines"
