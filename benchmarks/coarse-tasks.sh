#!/usr/bin/env bash
# Issue 17, part 1: Spark tasks per block against tasks per executor, side by side in one JVM per
# study (TaskCostStudy rotates the order of the variants every round). Writes benchmarks/results/
# coarse-tasks-*.txt; /proc/loadavg is printed beside every run. Build first:
#   mvn -q -B -o -pl benchmarks -am package -DskipTests
set -euo pipefail
cd "$(dirname "$0")/.."
MO=$(sed -n 's/^spark.module.options=//p' benchmarks/target/classes/org/skerry/benchmarks/jvm.properties)
study() {
  local name=$1; shift
  echo "== $name: $*"
  SPARK_LOCAL_IP=127.0.0.1 java -Xmx4g $MO -cp benchmarks/target/benchmarks.jar \
    org.skerry.benchmarks.TaskCostStudy "$@" 2> >(grep -v '^WARNING' >&2) | tee "benchmarks/results/coarse-tasks-$name.txt"
}
what=${1:-all}   # all, blocks, blocks-repeat, stragglers or overhead; ROUNDS and WARMUP override the last two's
# Loop time per iteration at P = 512 against P = 8: N = 10^5, d = 2, free likelihood, fixed schedule, 2 MH steps.
if [[ $what == all || $what == blocks ]]; then
  study blocks variants=blocks:8,blocks:512,executors:8,executors:512 particles=100000 dimension=2 costMicros=0 \
    temperatures=8 steps=2 rounds=2 warmup=1
fi
# The same, more rounds of the three cheap variants (a task per block at P = 512 takes minutes on a loaded machine).
if [[ $what == all || $what == blocks-repeat ]]; then
  study blocks-repeat variants=executors:8,executors:512,blocks:8 particles=100000 dimension=2 costMicros=0 \
    temperatures=8 steps=2 rounds=4 warmup=1 detail=false
fi
# Stragglers: 500 us, 5 % of evaluations 20 x slower, N = 4 000; the ideal is the counted work / 2 cores.
if [[ $what == all || $what == stragglers ]]; then
  study stragglers variants=threads,blocks:6,executors:24 particles=4000 dimension=2 costMicros=500 \
    slowFraction=0.05 slowFactor=20 temperatures=4 steps=2 rounds=${ROUNDS:-2} warmup=${WARMUP:-1} detail=false
fi
# Overhead against the bare loop at 1 ms, N = 4 000 (the figures of "Spark backend overhead").
if [[ $what == all || $what == overhead ]]; then
  study overhead variants=bare,blocks:6,executors:6 particles=4000 dimension=2 costMicros=1000 \
    temperatures=4 steps=2 rounds=${ROUNDS:-3} warmup=${WARMUP:-1} detail=false
fi
