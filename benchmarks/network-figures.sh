#!/usr/bin/env bash
# skerry against the naive collect-everything program on a shaped network: the loopback cluster
# with --network (master, two workers and the driver each in a network namespace of its own,
# every link shaped with tc), the driver started in its namespace by `deploy/loopback-cluster exec`.
# Steps: link (round trip and rate of two links, benchmarks/link-check.py), naive-10us (N = 10⁶,
# d = 20, 10 µs), naive-1ms (N = 10⁵, d = 2, 1 ms). Each writes benchmarks/results/network-*.txt
# with the command, `uptime` before and after, the bytes each run moved over each link and the
# queueing statistics of every link end at the close. The cluster and its network are removed on
# every exit, failures included. Needs root (network namespaces); a benchmark, never run in CI.
#
# usage: benchmarks/network-figures.sh [STEP...]   (steps: link naive-10us naive-1ms; default all)
#        Build first: mvn -q -B -o -pl benchmarks,spark-runner -am package -DskipTests
# Settings: RATE (1gbit), DELAY (0.2ms; 0 where the kernel has no netem), CLUSTER_DIR
#   (benchmarks/target/network), WORKER_MEMORY (3500m), EXECUTOR_MEMORY (3g), DRIVER_HEAP (6g),
#   ROUNDS (2), WARMUP (1), PARTICLES_10US (1000000), PARTICLES_1MS (100000),
#   TEMPERATURES_1MS (4), STEPS_1MS (2), VARIANTS (spark,naive: the first is the base of the ratios
#   and runs first in round 0).
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."

dir=${CLUSTER_DIR:-$PWD/benchmarks/target/network}
rounds=${ROUNDS:-2}
warmup=${WARMUP:-1}
executor_memory=${EXECUTOR_MEMORY:-3g}
results=benchmarks/results
name=sk subnet=10.213.0 port=7077
steps=("$@")
[ ${#steps[@]} -gt 0 ] || steps=(link naive-10us naive-1ms)
for step in "${steps[@]}"; do
  case $step in link|naive-10us|naive-1ms) ;; *) echo "unknown step '$step' (link, naive-10us, naive-1ms)" >&2; exit 2 ;; esac
done

opts=$(sed -n 's/^spark.module.options=//p' benchmarks/target/classes/org/skerry/benchmarks/jvm.properties 2>/dev/null || true)
[ -n "$opts" ] || { echo "benchmarks are not built: mvn -q -B -o -pl benchmarks,spark-runner -am package -DskipTests" >&2; exit 2; }
read -r -a opts <<<"$opts"
links="$name-d,$name-m,$name-w1,$name-w2"

trap 'deploy/loopback-cluster stop --dir "$dir"' EXIT
deploy/loopback-cluster start --network --rate "${RATE:-1gbit}" --delay "${DELAY:-0.2ms}" --subnet "$subnet" \
  --network-name "$name" --workers 2 --memory "${WORKER_MEMORY:-3500m}" --dir "$dir" --port "$port" --timeout 600

queue_statistics() {  # what tc counted on every link end: sent, dropped, over the limit
  local end ns
  for end in ${links//,/ }; do
    echo "# tc -s qdisc show dev $end"; tc -s qdisc show dev "$end" | sed 's/^/#   /'
  done
  for ns in master worker-1 worker-2 driver; do
    echo "# ip netns exec $name-$ns tc -s qdisc show dev eth0"
    ip netns exec "$name-$ns" tc -s qdisc show dev eth0 | sed 's/^/#   /'
  done
}

run() {  # OUTPUT-NAME COMMAND...: the command runs as the driver, in the driver's namespace
  local out="$results/$1"
  shift
  { echo "# $(date -u +%FT%TZ) $(uptime)"; echo "# deploy/loopback-cluster exec --dir $dir -- $*"; } >"$out"
  deploy/loopback-cluster exec --dir "$dir" -- "$@" >>"$out" 2>&1 || echo "# FAILED with exit code $?" >>"$out"
  echo "# $(date -u +%FT%TZ) $(uptime)" >>"$out"
  queue_statistics >>"$out"
  grep -E 'summary|ratio mean|round .*ratios|wall,|bytes over|round trip|Mbit/s|FAILED' "$out" || true
}

comparison() {  # OUTPUT-NAME KEY=VALUE...
  local out="$1"
  shift
  # /proc/$$/net/dev: this shell stays in the root namespace, where the bridge ends of the links are.
  run "$out" java -Xmx"${DRIVER_HEAP:-6g}" "${opts[@]}" -cp benchmarks/target/benchmarks.jar \
    org.skerry.benchmarks.InterleavedComparison variants="${VARIANTS:-spark,naive}" master="spark://$subnet.1:$port" \
    executorMemory="$executor_memory" links="$links" netDev="/proc/$$/net/dev" rounds="$rounds" warmup="$warmup" "$@"
}

for step in "${steps[@]}"; do
  case $step in
    link)
      out="$results/network-link.txt"
      { echo "# $(date -u +%FT%TZ) $(uptime)"; echo "# driver namespace to worker 1, then worker 1 to worker 2, then loopback (unshaped)"; } >"$out"
      for pair in "$name-driver $name-worker-1 $subnet.2" "$name-worker-1 $name-worker-2 $subnet.3" "- - 127.0.0.1"; do
        read -r client server address <<<"$pair"
        echo "## benchmarks/link-check.py $client $server $address 300" >>"$out"
        python3 benchmarks/link-check.py "$client" "$server" "$address" 300 >>"$out" 2>&1 || echo "# FAILED" >>"$out"
      done
      echo "# $(date -u +%FT%TZ) $(uptime)" >>"$out"
      cat "$out" ;;
    naive-10us)
      comparison network-10us-d20-n1e6.txt particles="${PARTICLES_10US:-1000000}" dimension=20 costMicros=10 ;;
    naive-1ms)
      comparison network-1ms-n1e5.txt particles="${PARTICLES_1MS:-100000}" dimension=2 costMicros=1000 \
        temperatures="${TEMPERATURES_1MS:-4}" steps="${STEPS_1MS:-2}" ;;
  esac
done
