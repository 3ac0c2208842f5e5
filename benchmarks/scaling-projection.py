#!/usr/bin/env python3
"""A projection, on paper, of parallel efficiency on larger clusters from the per-phase costs
measured by `skerry scale` on this machine (benchmarks/results/scaling-driver-cost-*/scaling.csv).

Usage: python3 benchmarks/scaling-projection.py [results folder]   (default benchmarks/results)

Model of one tempering iteration on k cores, P = 3k partitions (the default; also P = k), N particles,
R MH steps per particle, likelihood cost c (seconds per evaluation):

  T(k) = N R c / k * (1 + imbalance)         likelihood calls, spread over the cores
       + e N / k                              executor work per particle besides the likelihood
       + delta N                              driver work per particle (serial)
       + alpha + beta P                       fixed cost per iteration, and cost per partition
       + J L + 16 N / B                       network: J jobs' round trips, two doubles per particle

measured here (Spark local mode, cost-micros = 0):
  delta  slope of the driver thread's CPU time per iteration against N, adaptive tempering
                                                                       (adaptive study)
  e      slope of loop time per iteration against N, times the 2 cores used, less the
         driver's slope there                                                   (particles study)
  beta   slope of loop time per iteration against P                            (partitions study)
  alpha  intercept of the N fit less 8 beta (that study used P = 8)
assumed (not measured; local mode has no network):
  J = 8 Spark jobs per iteration (global resampling every iteration, fixed steps: tempering inputs,
      reweight, four resampling jobs, moment sums, moves; read off SparkPopulation)
  L = 0.5 ms per job round trip, B = 1 GB/s into the driver (10 Gb/s Ethernet)
  imbalance = ceil(N/P) / (N/P) - 1 (partitions differ by at most one particle; three per core)
Efficiency E(k) = T(1) / (k T(k)). It ignores stragglers, executor loss, and heterogeneous nodes.
"""
import csv
import math
import os
import sys


def rows(folder, study):
    with open(os.path.join(folder, "scaling-" + study, "scaling.csv")) as f:
        return list(csv.DictReader(f))


def median(values):
    s = sorted(values)
    n = len(s)
    return s[n // 2] if n % 2 else 0.5 * (s[n // 2 - 1] + s[n // 2])


def per_point(records, key, value):
    points = {}
    for r in records:
        it = float(r["iterations"])
        points.setdefault(float(r[key]), []).append(float(r[value]) / (it if value != "driver_cpu_seconds_per_iteration" else 1))
    return sorted((x, median(v)) for x, v in points.items())


def fit(points):
    n = len(points)
    mx = sum(x for x, _ in points) / n
    my = sum(y for _, y in points) / n
    sxx = sum((x - mx) ** 2 for x, _ in points)
    slope = sum((x - mx) * (y - my) for x, y in points) / sxx
    return slope, my - slope * mx


def main():
    folder = sys.argv[1] if len(sys.argv) > 1 else os.path.join(os.path.dirname(__file__), "results")
    particles = rows(folder, "driver-cost-particles")
    partitions = rows(folder, "driver-cost-partitions")
    loop_n = per_point(particles, "particles", "loop_seconds")
    cpu_n = per_point(particles, "particles", "driver_cpu_seconds_per_iteration")
    loop_p = per_point(partitions, "partitions", "loop_seconds")
    # The loop time includes the initial draw (iteration 0); per iteration it is divided by T.
    gamma, intercept = fit(loop_n)
    delta_fixed, _ = fit(cpu_n)
    # Adaptive tempering (the default rule) bisects on the conditional ESS: the larger driver cost.
    delta, _ = fit(per_point(rows(folder, "driver-cost-adaptive"), "particles", "driver_cpu_seconds_per_iteration"))
    beta, _ = fit(loop_p)
    alpha = max(0.0, intercept - 8 * beta)
    e = max(0.0, 2 * gamma - delta_fixed)
    jobs, latency, bandwidth, steps = 8, 0.5e-3, 1e9, 2
    print("measured: delta = %.3g s/particle (driver, adaptive tempering; fixed schedule %.3g), e = %.3g s/particle (executor, one core), "
          "beta = %.3g s/partition, alpha = %.3g s per iteration" % (delta, delta_fixed, e, beta, alpha))

    def iteration(k, n, c, per_core):
        p = per_core * k
        imbalance = math.ceil(n / p) / (n / p) - 1
        return (n * steps * c / k * (1 + imbalance) + e * n / k + delta * n + alpha + beta * p
                + jobs * latency + 16 * n / bandwidth)

    for per_core, title, size in (
            (3, "strong scaling, N = 100 000 particles", lambda k: 100_000),
            (3, "weak scaling, N = 1 000 particles per core", lambda k: 1000 * k),
            (1, "strong scaling, N = 100 000 particles", lambda k: 100_000),
            (1, "weak scaling, N = 1 000 particles per core", lambda k: 1000 * k)):
        print()
        print("PROJECTION (not measured): parallel efficiency, " + title + ", R = %d MH steps, "
              "%d partition(s) per core" % (steps, per_core))
        print("| likelihood cost | 64 cores | 256 cores | 1024 cores |")
        print("|---|---|---|---|")
        for label, c in (("1 ms", 1e-3), ("10 ms", 1e-2), ("1 s", 1.0)):
            cells = []
            for k in (64, 256, 1024):
                n = size(k)
                if size(1) == size(k):
                    eff = iteration(1, n, c, per_core) / (k * iteration(k, n, c, per_core))
                else:
                    eff = iteration(1, size(1), c, per_core) / iteration(k, n, c, per_core)
                cells.append("%.3f" % eff)
            print("| %s | %s |" % (label, " | ".join(cells)))


if __name__ == "__main__":
    main()
