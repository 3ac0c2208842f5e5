"""Test worker: the log-likelihood of normal observations with known sd (the normal-mean model).

Usage: normal_mean.py SIGMA [--batched] [--jitter] [--sleep SECONDS] [--pids FOLDER] [--fail-batches]. The data file (start.files[0]) is a CSV with a
header line 'y' and '#' comments. --jitter adds a term in [0, 1e-3) taken from the particle's seed,
as a stochastic simulator's answer depends on its seed, so that tests of identical answers also
check the seeds. The one-at-a-time and the batched (numpy) forms do the same floating-point
operations in the same order, so they give the same bits. --sleep makes each request take that
long (runs long enough to interrupt); --pids (or the variable SKERRY_TEST_PIDS) names a folder
where the worker writes its process id at start. --fail-batches (with --batched) fails every request
of more than one particle, so that each particle is answered only when asked alone.
"""
import math
import os
import sys
import time

sys.path.insert(0, os.environ["SKERRY_WORKER_LIBRARY"])
import skerry_worker  # noqa: E402

SIGMA = float(sys.argv[1])
BATCHED = "--batched" in sys.argv
JITTER = "--jitter" in sys.argv
FAIL_BATCHES = "--fail-batches" in sys.argv
CONSTANT = -0.5 * math.log(2 * math.pi * SIGMA * SIGMA)
SLEEP = float(sys.argv[sys.argv.index("--sleep") + 1]) if "--sleep" in sys.argv else 0.0
PIDS = sys.argv[sys.argv.index("--pids") + 1] if "--pids" in sys.argv else os.environ.get("SKERRY_TEST_PIDS")
if PIDS:
    with open(os.path.join(PIDS, "worker-%d" % os.getpid()), "w") as f:
        f.write(str(os.getpid()))


def read(path):
    values = []
    with open(path) as f:
        for line in f:
            line = line.strip()
            if line and not line.startswith("#") and line != "y":
                values.append(float(line))
    return values


def jitter(seed):
    return (seed >> 11) * 2.0 ** -53 * 1e-3 if JITTER else 0.0


def setup(start):
    y = read(start.files[0])
    if not BATCHED:
        def log_likelihood(theta, seed):
            if SLEEP:
                time.sleep(SLEEP)
            mu = theta["mu"]
            total = 0.0
            for v in y:
                z = (v - mu) / SIGMA
                total += CONSTANT - 0.5 * (z * z)
            return total + jitter(seed)
        return log_likelihood

    import numpy

    def log_likelihoods(values, seeds):
        if FAIL_BATCHES and len(seeds) > 1:
            raise RuntimeError("this test worker fails every request of more than one particle")
        if SLEEP:
            time.sleep(SLEEP)
        mu = values[:, 0]
        total = numpy.zeros(len(mu))
        for v in y:
            z = (v - mu) / SIGMA
            total += CONSTANT - 0.5 * (z * z)
        return (total + numpy.array([jitter(s) for s in seeds])).tolist()
    return log_likelihoods


skerry_worker.serve(setup=setup, batched=BATCHED)
