#!/usr/bin/env python3
"""Batch against single runs: wall time of `skerry batch` over twelve datasets, divided by the sum
of the wall times of twelve `skerry run` processes on the same run files (each analysis's own
run.conf from the batch folder, so the work is identical), measured side by side in rounds whose
order rotates, with the load average beside every figure.

usage: benchmarks/batch-vs-single.py KIND ROUNDS LEVEL... > benchmarks/results/FILE.txt
  LEVEL concurrent analyses of a batch variant, e.g. 4; 4fifo: the same with Spark's FIFO scheduler
  BATCH_ONLY=1 in the environment leaves the single runs out (to compare batch variants only)
  KIND  short: normal-mean (closed-form likelihood, 20 points), N = 200, local[2]
        long:  the Lake Quellmar plankton ODE model (synthetic demo data), N = 100, local[2]
The work folder is benchmarks/target/batch-bench/KIND. Run from the project root after
`mvn -q -B -o -pl spark-runner -am package -DskipTests`; the built program is copied into the work
folder first (with bin/skerry), so editing sources meanwhile cannot set off a rebuild mid-run.
"""
import json
import os
import random
import shutil
import subprocess
import sys
import time

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
SKERRY = None  # the frozen copy, set in main
NUTRIENT = [4.1, 4.8, 5.6, 3.7, 4.4, 5.2, 4.6, 3.9, 5.9, 4.3, 3.5, 5.0]  # the scenario's N0 per buoy


def load():
    with open("/proc/loadavg") as f:
        return f.read().split()[0]


def prepare(kind, work):
    shutil.rmtree(work, ignore_errors=True)
    os.makedirs(os.path.join(work, "data"))
    if kind == "short":
        for i in range(1, 13):
            r = random.Random(100 + i)
            with open(os.path.join(work, "data", "site-%02d.csv" % i), "w") as f:
                f.write("# synthetic benchmark data\ny\n")
                for _ in range(20):
                    f.write(repr(r.gauss(0.3 * i, 2.0)) + "\n")
        model = "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0, sd = 3 } } }\n"
        particles, extra = 200, ""
        datasets = 'datasets { folder = data }\n'
    else:
        for i in range(1, 13):
            shutil.copy(os.path.join(ROOT, "conf", "demo", "data", "buoy-%02d.csv" % i), os.path.join(work, "data"))
        model = "model { name = plankton-npz, settings.grazing = sigmoidal }\n"
        particles = 100
        extra = "".join('"buoy-%02d" { model.settings.initial.nutrient = %s }\n' % (i + 1, n)
                        for i, n in enumerate(NUTRIENT))
        datasets = 'datasets { folder = data, settings {\n' + extra + '} }\n'
    with open(os.path.join(work, "base.conf"), "w") as f:
        f.write(model + "sampler.particles = %d\n" % particles
                + 'backend { kind = spark, master = "local[2]" }\noutput.progress = off\n')
    with open(os.path.join(work, "batch.conf"), "w") as f:
        f.write("base = base.conf\n" + datasets + "seed = 5\nprogress = off\n")


def timed(args):
    start = time.monotonic()
    result = subprocess.run(args, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True)
    wall = time.monotonic() - start
    if result.returncode != 0:
        sys.exit("failed: %s\n%s" % (" ".join(args), result.stderr[-2000:]))
    return wall


def batch(work, out, level):
    """level: a number of concurrent analyses, with "fifo" after it for Spark's default scheduler."""
    shutil.rmtree(out, ignore_errors=True)
    with open(os.path.join(work, "batch.conf")) as f:
        text = f.read()
    conf = os.path.join(work, "batch-c%s.conf" % level)
    with open(conf, "w") as f:
        f.write(text + "concurrent = %d\n" % int(level.replace("fifo", "")))
        if level.endswith("fifo"):
            f.write('settings { backend.spark { "spark.scheduler.mode" = FIFO } }\n')
    return timed([SKERRY, "batch", conf, "--out", out])


def singles(work, reference, round_no):
    total = 0.0
    sampler = 0.0
    for name in sorted(os.listdir(reference)):
        run = os.path.join(reference, name, "base")
        if not os.path.isdir(run):
            continue
        out = os.path.join(work, "single-%d" % round_no, name)
        shutil.rmtree(out, ignore_errors=True)
        total += timed([SKERRY, "run", os.path.join(run, "run.conf"), "--out", out])
        with open(os.path.join(out, "timing.json")) as f:
            sampler += json.load(f)["wall_seconds"]
        with open(os.path.join(out, "summary.json"), "rb") as a, open(os.path.join(run, "summary.json"), "rb") as b:
            if a.read() != b.read():
                sys.exit("single run of %s differs from the batch's" % name)
    return total, sampler


def freeze(work):
    app = os.path.join(work, "app")
    target = os.path.join(app, "spark-runner", "target")
    os.makedirs(os.path.join(app, "bin"), exist_ok=True)
    shutil.copy(os.path.join(ROOT, "bin", "skerry"), os.path.join(app, "bin", "skerry"))
    shutil.copy(os.path.join(ROOT, "spark-runner", "target", "skerry-spark-runner.jar"), target + "/")
    shutil.copytree(os.path.join(ROOT, "spark-runner", "target", "lib"), os.path.join(target, "lib"))
    return os.path.join(app, "bin", "skerry")


def main():
    global SKERRY
    kind, rounds, levels = sys.argv[1], int(sys.argv[2]), sys.argv[3:]
    work = os.path.join(ROOT, "benchmarks", "target", "batch-bench", kind)
    prepare(kind, work)
    os.makedirs(os.path.join(work, "app", "spark-runner", "target"))
    SKERRY = freeze(work)
    reference = os.path.join(work, "reference")
    print("# %s: warm-up batch (builds, fills the page cache), load %s" % (kind, load()))
    batch(work, reference, levels[-1])
    print("round,variant,wall_s,sampler_sum_s,load1_before,load1_after")
    for r in range(rounds):
        variants = ([] if os.environ.get("BATCH_ONLY") else ["singles"]) + ["batch-c%s" % c for c in levels]
        shift = r % len(variants)
        for v in variants[shift:] + variants[:shift]:
            before = load()
            if v == "singles":
                wall, sampler = singles(work, reference, r)
                print("%d,singles,%.2f,%.2f,%s,%s" % (r, wall, sampler, before, load()), flush=True)
            else:
                c = v.split("-c")[1]
                wall = batch(work, os.path.join(work, "batch-%d-c%s" % (r, c)), c)
                print("%d,%s,%.2f,,%s,%s" % (r, v, wall, before, load()), flush=True)


if __name__ == "__main__":
    main()
