#!/usr/bin/env bash
# Issue 16's large-population figures, from the repository root after one build
# (`mvn -q -B -o -DskipTests package`, so that no build is timed):
#  1. N (default 10^7), d = 10, a free likelihood (costly-normal without busy work; synthetic, no
#     data file) on the thread backend and on Spark (local[*], default Spark settings): each run's
#     wall time and timing.json's stages; the output share is stage "output" over "wall"; the
#     two backends alternate order over ROUNDS rounds so that a burst of load hits both alike.
#  2. heap per particle, Spark against threads, at HEAP_N (default 10^6) and HEAP_N/10 particles,
#     d = 10, by the JVM's own accounting: the largest heap in use right after a collection
#     (unified GC log, -Xlog:gc), an upper bound on the live data; per particle is the difference
#     between the two sizes over the difference in N, which cancels what does not grow with N
#     (the JVM, Spark's own structures). Spark local mode runs driver and executor in one JVM, so
#     its figure holds the executor's cached blocks and the driver alike.
# Usage: benchmarks/large-population.sh [N] [HEAP_N] [ROUNDS]   (SKERRY_HEAP, default 24g: -Xmx;
# N = 0 skips part 1, HEAP_N = 0 part 2; BACKENDS, default "threads spark": part 1's backends, in
# the odd rounds' order)
# Prints one line a run and the ratios; keeps nothing (a temporary folder, removed at the end).
set -euo pipefail
n="${1:-10000000}"
heap_n="${2:-1000000}"
rounds="${3:-1}"
xmx="${SKERRY_HEAP:-24g}"
out="$(mktemp -d)"
trap 'rm -rf "$out"' EXIT
load() { cut -d' ' -f1-3 /proc/loadavg; }

run_file() { # particles file
  cat >"$2" <<CONF
# Synthetic: costly-normal without busy work (a free likelihood), no data file.
name = large-population
model { name = costly-normal, settings { dimension = 10, cost-micros = 0 } }
sampler { particles = $1, seed = 16 }
checkpoint.enabled = false
output { progress = off, report = off }
CONF
}

# One run: label backend particles; prints wall, stages, output share and the peak heap after GC.
one() {
  local label="$1" backend="$2" particles="$3" folder="$out/$1"
  run_file "$particles" "$out/$label.conf"
  local before; before="$(load)"
  SKERRY_JAVA_OPTS="-Xmx$xmx -Xlog:gc:file=$out/$label.gc" bin/skerry run "$out/$label.conf" --out "$folder" \
    --set backend.kind="$backend" >"$out/$label.log" 2>&1 || { echo "$label failed:"; tail -20 "$out/$label.log"; return 1; }
  python3 - "$folder/timing.json" "$out/$label.gc" "$label" "$particles" "$before" "$(load)" <<'PY'
import json, re, sys
timing, gc, label, n, before, after = sys.argv[1:]
t = json.load(open(timing)); s = t["stage_seconds"]; wall = t["wall_seconds"]
peak = 0.0
for line in open(gc):
    m = re.search(r"(\d+)M->(\d+)M\((\d+)M\)", line)
    if m:
        peak = max(peak, float(m.group(2)))
print(f"{label} N={n} wall {wall:.2f} s startup {s['startup']:.2f} sampling {s['sampling']:.2f} "
      f"export {s['export']:.2f} output {s['output']:.2f} output share {100 * s['output'] / wall:.1f} % "
      f"peak heap after GC {peak:.0f} MiB load {before} -> {after}")
PY
}

[ "$n" -gt 0 ] && for round in $(seq 1 "$rounds"); do
  backends="${BACKENDS:-threads spark}"
  if [ $((round % 2)) -eq 1 ]; then order="$backends"; else order="$(echo "$backends" | awk '{ for (i = NF; i > 0; i--) printf "%s ", $i }')"; fi
  for backend in $order; do one "$backend-$round" "$backend" "$n"; done
done | tee "$out/large"

[ "$heap_n" -gt 0 ] || exit 0
small=$((heap_n / 10))
for backend in threads spark; do
  one "heap-$backend-large" "$backend" "$heap_n"
  one "heap-$backend-small" "$backend" "$small"
done | tee "$out/heap"
awk -v big="$heap_n" -v small="$small" '
  { for (i = 1; i <= NF; i++) if ($i == "GC") peak[$1] = $(i + 1) }
  END {
    t = (peak["heap-threads-large"] - peak["heap-threads-small"]) * 1048576 / (big - small)
    s = (peak["heap-spark-large"] - peak["heap-spark-small"]) * 1048576 / (big - small)
    printf "heap per particle: threads %.0f B, spark %.0f B, spark / threads %.2f (target <= 1.3)\n", t, s, s / t
  }' "$out/heap"
