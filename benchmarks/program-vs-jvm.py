#!/usr/bin/env python3
"""A program model (benchmarks/program-worker.py) against the in-JVM model computing the same
likelihood after the same timed busy wait (TimedSpinNormal, d = 2), same run file otherwise, thread backend with 2 threads: wall time of
the program model divided by the in-JVM model's, measured side by side in rounds whose order
alternates, with the load average beside every figure. Also the protocol's cost: the same pair
with no busy work, the wall-time difference divided by the evaluations (which includes starting the
workers), and the move phase's difference divided by the moves' evaluations (which does not).

usage: benchmarks/program-vs-jvm.py ROUNDS [CASE[:COST]...] > benchmarks/results/program-vs-jvm.txt
  (all four by default; e.g. single:0 for the one-at-a-time protocol cost only)
Cases: single (1 ms per evaluation, one particle per request, N = 1000) and batch (100 us per
evaluation, numpy batches of up to 1000 particles, block size 1000, N = 4000), each also at cost 0
(the default set); single-1thread (single with one thread, N = 500) on request.
Run from the project root after `mvn -q -B -o -pl benchmarks -am package -DskipTests`; the work
folder is benchmarks/target/program-bench, which gets a frozen copy of the built program (so editing
sources meanwhile cannot set off a rebuild mid-run), of the worker and of the worker library. Wall times are timing.json's wall_seconds (the run
itself: workers' start included, the JVM's start not).
"""
import json
import os
import shutil
import subprocess
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
WORK = os.path.join(ROOT, "benchmarks", "target", "program-bench")
PYTHON = subprocess.run(["python3", "-c", "import sys; print(sys.executable)"], capture_output=True,
                        text=True).stdout.strip()
CASES = {
    "single": dict(cost=1000, batch=1, particles=1000, block=0, batched=False, threads=2),
    "batch": dict(cost=100, batch=1000, particles=4000, block=1000, batched=True, threads=2),
    # One thread on the two cores: the JVM's reading thread finds a free core when a reply comes.
    "single-1thread": dict(cost=1000, batch=1, particles=500, block=0, batched=False, threads=1),
}
DEFAULT = ["single:1000", "single:0", "batch:100", "batch:0"]


SKERRY = None  # the frozen copy, set in main
FROZEN = None


def freeze():
    app = os.path.join(WORK, "app")
    target = os.path.join(app, "spark-runner", "target")
    os.makedirs(os.path.join(app, "bin"))
    os.makedirs(target)
    shutil.copy(os.path.join(ROOT, "bin", "skerry"), os.path.join(app, "bin", "skerry"))
    shutil.copy(os.path.join(ROOT, "spark-runner", "target", "skerry-spark-runner.jar"), target + "/")
    shutil.copytree(os.path.join(ROOT, "spark-runner", "target", "lib"), os.path.join(target, "lib"))
    shutil.copytree(os.path.join(ROOT, "workers", "python"), os.path.join(app, "workers", "python"))
    os.makedirs(os.path.join(app, "benchmarks"))
    shutil.copy(os.path.join(ROOT, "benchmarks", "program-worker.py"), os.path.join(app, "benchmarks"))
    subprocess.run(["jar", "--create", "--file", os.path.join(app, "spin.jar"), "-C",
                    os.path.join(ROOT, "benchmarks", "target", "classes"),
                    "org/skerry/benchmarks/TimedSpinNormal.class"], check=True)
    return os.path.join(app, "bin", "skerry"), app


def load():
    with open("/proc/loadavg") as f:
        return f.read().split()[0]


def run_file(name, case, cost, program):
    c = CASES[case]
    lines = ["name = %s" % name]
    if program:
        command = [PYTHON, os.path.join(FROZEN, "benchmarks", "program-worker.py"), str(cost)]
        if c["batched"]:
            command.append("--batched")
        lines += ["model.program {",
                  "  command = %s" % json.dumps(command),
                  "  environment { SKERRY_WORKER_LIBRARY = %s }" % json.dumps(os.path.join(FROZEN, "workers", "python")),
                  "  batch = %d" % c["batch"],
                  "  parameters = [",
                  "    { name = mu1, prior { distribution = normal, mean = 0, sd = 3 } }",
                  "    { name = mu2, prior { distribution = normal, mean = 0, sd = 3 } }",
                  "  ]",
                  "}"]
    else:
        lines += ["model { class = org.skerry.benchmarks.TimedSpinNormal, settings { dimension = 2, "
                  "cost-micros = %s } }" % cost]
    lines += ["sampler { particles = %d, seed = 5 }" % c["particles"],
              "backend { kind = threads, threads = %d%s }" % (c["threads"],
                                                               ", block-size = %d" % c["block"] if c["block"] else ""),
              "checkpoint.enabled = false", "output.progress = off", "output.report = false"]
    path = os.path.join(WORK, name + ".conf")
    with open(path, "w") as f:
        f.write("\n".join(lines) + "\n")
    return path


def measure(path, out):
    """Wall seconds, evaluations, and the move phase's seconds (no worker start in it)."""
    shutil.rmtree(out, ignore_errors=True)
    environment = dict(os.environ, SKERRY_CLASSPATH=os.path.join(FROZEN, "spin.jar"))
    subprocess.run([SKERRY, "run", path, "--out", out], check=True, env=environment,
                   stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    with open(os.path.join(out, "timing.json")) as f:
        timing = json.load(f)
    with open(os.path.join(out, "summary.json")) as f:
        evaluations = json.load(f)["likelihood_evaluations"]
    return timing["wall_seconds"], evaluations, timing["phase_seconds"]["move"]


def main():
    global SKERRY, FROZEN
    rounds = int(sys.argv[1])
    shutil.rmtree(WORK, ignore_errors=True)
    os.makedirs(WORK)
    SKERRY, FROZEN = freeze()
    print("# benchmarks/program-vs-jvm.py %s; python %s" % (" ".join(sys.argv[1:]), PYTHON))
    print("case cost_us round load program_s jvm_s ratio program_evals jvm_evals protocol_us_per_eval "
          "move_protocol_us_per_eval")
    chosen = sys.argv[2:] or DEFAULT
    for choice in chosen:
        case, cost = choice.split(":") if ":" in choice else (choice, CASES[choice]["cost"])
        cost = int(cost)
        if True:
            files = {kind: run_file("%s-%s-%s" % (case, cost, kind), case, cost, kind == "program")
                     for kind in ("program", "jvm")}
            for r in range(rounds):
                order = ("program", "jvm") if r % 2 == 0 else ("jvm", "program")
                before = load()
                result = {}
                for kind in order:
                    result[kind] = measure(files[kind], os.path.join(WORK, "out-%s-%s-%s" % (case, cost, kind)))
                (pw, pe, pm), (jw, je, jm) = result["program"], result["jvm"]
                moved = pe - CASES[case]["particles"]
                print("%s %s %d %s %.3f %.3f %.4f %d %d %.2f %.2f" % (case, cost, r, before, pw, jw, pw / jw, pe, je,
                                                                     (pw - jw) / pe * 1e6, (pm - jm) / moved * 1e6),
                      flush=True)


if __name__ == "__main__":
    main()
