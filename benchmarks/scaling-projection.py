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

Tasks per executor (backend.tasks = per-executor, issue 17): a step is one task per executor, not
one per partition, so beta P becomes

  beta k / C + beta_block P / k               Spark's per-task cost for k / C executors of C cores,
                                              and the per-block work inside the executors (parallel)

with C = 8 cores per executor (assumed) and beta_block the slope of loop time per iteration
against P with tasks per executor (coarse-tasks-blocks-repeat-run1.txt: P = 512 against P = 8 on
2 cores; the mean difference was within its noise, so the bound mean + 2 standard errors of the
paired differences is used, times the 2 cores, as executor time per block). Imbalance between
executors: ceil(N / E) / (N / E) - 1 for E executors; inside one, threads take blocks as they
free up.
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


def block_slope(folder):
    """Executor seconds per block and iteration with tasks per executor: an upper bound (see above)."""
    loops = {}
    with open(os.path.join(folder, "coarse-tasks-blocks-repeat-run1.txt")) as f:
        for line in f:
            if line.startswith("round "):
                variant = line.split()[2].rstrip(":")
                loops.setdefault(variant, []).append(float(line.split("loop ")[1].split()[0]))
    d = [b - a for a, b in zip(loops["executors:8"], loops["executors:512"])]
    mean = sum(d) / len(d)
    se = math.sqrt(sum((x - mean) ** 2 for x in d) / (len(d) - 1) / len(d))
    return max(0.0, mean + 2 * se) * 2 / (512 - 8), mean, se


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
    beta_block, block_mean, block_se = block_slope(folder)
    cores_per_executor = 8
    print("tasks per executor: loop(P = 512) - loop(P = 8) = %.3f +- %.3f s per iteration (mean, standard error); "
          "beta_block <= %.3g executor s per block and iteration; C = %d cores per executor (assumed)"
          % (block_mean, block_se, beta_block, cores_per_executor))
    print("measured: delta = %.3g s/particle (driver, adaptive tempering; fixed schedule %.3g), e = %.3g s/particle (executor, one core), "
          "beta = %.3g s/partition, alpha = %.3g s per iteration" % (delta, delta_fixed, e, beta, alpha))

    def iteration(k, n, c, per_core, grouped=False):
        p = per_core * k
        if grouped:
            executors = max(1, k // cores_per_executor)
            imbalance = math.ceil(n / executors) / (n / executors) - 1
            tasks = beta * executors + beta_block * p / k
        else:
            imbalance = math.ceil(n / p) / (n / p) - 1
            tasks = beta * p
        return (n * steps * c / k * (1 + imbalance) + e * n / k + delta * n + alpha + tasks
                + jobs * latency + 16 * n / bandwidth)

    for per_core, grouped, title, size in (
            (3, False, "strong scaling, N = 100 000 particles", lambda k: 100_000),
            (3, False, "weak scaling, N = 1 000 particles per core", lambda k: 1000 * k),
            (1, False, "strong scaling, N = 100 000 particles", lambda k: 100_000),
            (1, False, "weak scaling, N = 1 000 particles per core", lambda k: 1000 * k),
            (3, True, "strong scaling, N = 100 000 particles", lambda k: 100_000),
            (3, True, "weak scaling, N = 1 000 particles per core", lambda k: 1000 * k)):
        print()
        print("PROJECTION (not measured): parallel efficiency, " + title + ", R = %d MH steps, "
              "%d partition(s) per core, %s" % (steps, per_core, "a task per executor of %d cores"
                                                % cores_per_executor if grouped else "a task per partition"))
        print("| likelihood cost | 64 cores | 256 cores | 1024 cores |")
        print("|---|---|---|---|")
        for label, c in (("1 ms", 1e-3), ("10 ms", 1e-2), ("1 s", 1.0)):
            cells = []
            for k in (64, 256, 1024):
                n = size(k)
                if size(1) == size(k):
                    eff = iteration(1, n, c, per_core, grouped) / (k * iteration(k, n, c, per_core, grouped))
                else:
                    eff = iteration(1, size(1), c, per_core, grouped) / iteration(k, n, c, per_core, grouped)
                cells.append("%.3f" % eff)
            print("| %s | %s |" % (label, " | ".join(cells)))


if __name__ == "__main__":
    main()
