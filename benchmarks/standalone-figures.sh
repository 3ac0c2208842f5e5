#!/usr/bin/env bash
# The Spark figures of RESULTS.md on the loopback standalone cluster (master and two workers as
# separate JVMs, deploy/loopback-cluster), with local[2] beside them: overhead at 1 ms (N = 4 000),
# skerry against the naive collect-everything program at 10 µs (N = 10⁶, d = 20), and the driver's
# heap at N = 10⁶, d = 10 with -Xmx512m. Each step writes benchmarks/results/standalone-*.txt;
# `uptime` goes beside every figure. The cluster is stopped on every exit, failures included.
#
# usage: benchmarks/standalone-figures.sh [STEP...]   (steps: overhead-standalone overhead-local
#        naive-10us heap; default all). Build first: mvn -q -B -o -pl benchmarks -am package -DskipTests
# Settings: PORT (7277), CLUSTER_DIR (benchmarks/target/loopback), WORKER_MEMORY (1536m),
#           EXECUTOR_MEMORY (1400m), PARTICLES_10US (1000000), ROUNDS (2).
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."

port=${PORT:-7277}
dir=${CLUSTER_DIR:-$PWD/benchmarks/target/loopback}
rounds=${ROUNDS:-2}
executor_memory=${EXECUTOR_MEMORY:-1400m}
results=benchmarks/results
steps=("$@")
[ ${#steps[@]} -gt 0 ] || steps=(overhead-standalone overhead-local naive-10us heap)

opts=$(sed -n 's/^spark.module.options=//p' benchmarks/target/classes/org/skerry/benchmarks/jvm.properties)
[ -n "$opts" ] || { echo "benchmarks are not built: mvn -q -B -o -pl benchmarks -am package -DskipTests" >&2; exit 2; }
master="spark://127.0.0.1:$port"
run() { # OUTPUT-NAME JVM-OPTIONS... -- PROGRAM-ARGUMENTS...
  local out="$results/$1"; shift
  { echo "# $(date -u +%FT%TZ) $(uptime)"; echo "# java $*"; } > "$out"
  SPARK_LOCAL_IP=127.0.0.1 java "$@" >> "$out" 2>&1 || echo "# FAILED with exit code $?" >> "$out"
  echo "# $(date -u +%FT%TZ) $(uptime)" >> "$out"
  grep -E 'summary|ratio mean|completed|heap' "$out" || true
}

needs_cluster=false
for step in "${steps[@]}"; do
  case $step in overhead-standalone|naive-10us|heap) needs_cluster=true ;; overhead-local) ;;
    *) echo "unknown step $step" >&2; exit 2 ;; esac
done
if $needs_cluster; then
  trap 'deploy/loopback-cluster stop --dir "$dir"' EXIT
  deploy/loopback-cluster start --workers 2 --memory "${WORKER_MEMORY:-1536m}" --dir "$dir" --port "$port" \
    --ui-port $((port + 1000)) --rest-port $((port - 1000))
fi

for step in "${steps[@]}"; do
  case $step in
    overhead-standalone)
      run standalone-1ms-n4000.txt -Xmx6g $opts -cp benchmarks/target/benchmarks.jar \
        org.skerry.benchmarks.InterleavedComparison variants=bare,threads,spark,naive master="$master" \
        executorMemory="$executor_memory" particles=4000 dimension=2 costMicros=1000 rounds="$rounds" warmup=1 ;;
    overhead-local)
      run local2-1ms-n4000.txt -Xmx6g $opts -cp benchmarks/target/benchmarks.jar \
        org.skerry.benchmarks.InterleavedComparison variants=bare,threads,spark,naive \
        particles=4000 dimension=2 costMicros=1000 rounds="$rounds" warmup=1 ;;
    naive-10us)
      run standalone-10us-d20.txt -Xmx6g $opts -cp benchmarks/target/benchmarks.jar \
        org.skerry.benchmarks.InterleavedComparison variants=spark,naive master="$master" \
        executorMemory="$executor_memory" particles="${PARTICLES_10US:-1000000}" dimension=20 costMicros=10 \
        rounds="$rounds" warmup=1 ;;
    heap)
      run standalone-driver-heap-xmx512m.txt -Xmx512m -Xlog:gc:file="$results/standalone-driver-heap-xmx512m.gc.log" \
        $opts -cp benchmarks/target/benchmarks.jar org.skerry.benchmarks.DriverMemoryProbe master="$master" \
        particles=1000000 dimension=10 costMicros=10 executorMemory="$executor_memory" ;;
  esac
done
