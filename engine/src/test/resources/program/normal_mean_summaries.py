"""Test worker: a simulator for ABC, the normal mean with known sd summarised by the sample mean.

Usage: normal_mean_summaries.py N SIGMA [--batched] [--wrong-count] [--two] [--sleep SECONDS]. A simulation draws N
observations y ~ N(mu, SIGMA^2) from a generator seeded with the particle's seed alone and
replies with their mean (the run file's model.program.summaries = [mean]). --batched serves the
numpy form, which draws each particle's observations from its own generator, so a particle's
summary never depends on its batch. --wrong-count writes the protocol by hand and replies with two
numbers per particle for one summary (to test skerry's refusal of such a reply); --two has the
summaries function return two numbers, which the worker library refuses itself. --sleep makes each
request take that long (runs long enough to interrupt); the variable SKERRY_TEST_PIDS names a
folder where each worker writes its process id; SKERRY_TEST_BATCHES names a file to which the
batched form appends each request's particle count, one a line.
"""
import os
import random
import sys
import time

sys.path.insert(0, os.environ["SKERRY_WORKER_LIBRARY"])
import skerry_worker  # noqa: E402

N = int(sys.argv[1])
SIGMA = float(sys.argv[2])
TWO = "--two" in sys.argv
SLEEP = float(sys.argv[sys.argv.index("--sleep") + 1]) if "--sleep" in sys.argv else 0.0
PIDS = os.environ.get("SKERRY_TEST_PIDS")
BATCHES = os.environ.get("SKERRY_TEST_BATCHES")
if PIDS:
    with open(os.path.join(PIDS, "worker-%d" % os.getpid()), "w") as f:
        f.write(str(os.getpid()))


def summaries(theta, seed):
    if SLEEP:
        time.sleep(SLEEP)
    rng = random.Random(seed)
    mu = theta["mu"]
    total = 0.0
    for _ in range(N):
        total += rng.gauss(mu, SIGMA)
    mean = total / N
    return [mean, mean] if TWO else [mean]


def batch(values, seeds):
    if BATCHES:
        with open(BATCHES, "a") as f:
            f.write("%d\n" % len(values))
    rows = []
    for row, seed in zip(values, seeds):
        rows.append(summaries({"mu": float(row[0])}, seed))
    return rows


def wrong_count():
    # The protocol by hand: ready, then two numbers for each particle, whatever skerry named.
    for line in sys.stdin:
        if line.strip() == "start":
            break
    sys.stdout.write("ready 1\n")
    sys.stdout.flush()
    for header in sys.stdin:
        words = header.split()
        count = int(words[3])
        for _ in range(count):
            sys.stdin.readline()
        sys.stdout.write("result %s %d\n" % (words[1], count) + "value 0x1.0p0 0x1.0p1\n" * count)
        sys.stdout.flush()


if "--wrong-count" in sys.argv:
    wrong_count()
elif "--batched" in sys.argv:
    skerry_worker.serve(summaries=batch, batched=True)
else:
    skerry_worker.serve(summaries=summaries)
