#!/usr/bin/env python3
# Usage: benchmarks/paired-ratios.py OUTPUT BASE_VARIANT  (OUTPUT of InterleavedComparison)
# Paired per-round ratios of wall and CPU time from an InterleavedComparison output.
import re, sys, collections
rounds = collections.defaultdict(dict)
for line in open(sys.argv[1]):
    m = re.match(r"round (\d+) (\w+): ([\d.]+) s wall, ([\d.]+) s CPU of this JVM; load average ([\d.]+)", line)
    if m:
        rounds[int(m[1])][m[2]] = (float(m[3]), float(m[4]), float(m[5]))
base = sys.argv[2]
for r, v in sorted(rounds.items()):
    print("round", r, " ".join("%s wall %.3f cpu %.3f (load %.1f)" % (k, v[k][0] / v[base][0], v[k][1] / v[base][1], v[k][2]) for k in v))
for k in next(iter(rounds.values())):
    w = [v[k][0] / v[base][0] for v in rounds.values()]; c = [v[k][1] / v[base][1] for v in rounds.values()]
    print("%-8s wall ratio mean %.4f [%.4f, %.4f]  CPU ratio mean %.4f [%.4f, %.4f]" % (k, sum(w)/len(w), min(w), max(w), sum(c)/len(c), min(c), max(c)))
