#!/usr/bin/env bash
# Side-by-side overhead of two builds (say the parent commit and this one): the Spark backend's
# wall and CPU time over the bare loop, from InterleavedComparison, one JVM per build per round,
# the builds' order alternating every round so that a burst of load hits both alike.
# Usage: benchmarks/parent-overhead.sh PARENT_CHECKOUT THIS_CHECKOUT ROUNDS [extra args]
# Each checkout must have run: mvn -q -B -o -pl benchmarks -am package -DskipTests
set -euo pipefail
parent="$1"; this="$2"; rounds="$3"; shift 3
args=(variants=bare,spark particles=4000 dimension=2 costMicros=1000 rounds=1 warmup=1 "$@")
run() {
  local dir="$1" label="$2" round="$3"
  local mo
  mo=$(sed -n 's/^spark.module.options=//p' "$dir/benchmarks/target/classes/org/skerry/benchmarks/jvm.properties")
  echo "== round $round $label ($(git -C "$dir" rev-parse --short HEAD)), load $(cut -d' ' -f1-3 /proc/loadavg)"
  # shellcheck disable=SC2086
  SPARK_LOCAL_IP=127.0.0.1 java -Xmx4g $mo -cp "$dir/benchmarks/target/benchmarks.jar" \
    org.skerry.benchmarks.InterleavedComparison "${args[@]}" 2>/dev/null | grep -E "^round 0 (bare|spark):|ratios to bare"
}
for round in $(seq 1 "$rounds"); do
  if [ $((round % 2)) -eq 1 ]; then
    run "$parent" parent "$round"; run "$this" this "$round"
  else
    run "$this" this "$round"; run "$parent" parent "$round"
  fi
done
