"""Test worker: the log-likelihood of normal observations with known sd (the normal-mean model).

Usage: normal_mean.py SIGMA [--batched] [--jitter]. The data file (start.files[0]) is a CSV with a
header line 'y' and '#' comments. --jitter adds a term in [0, 1e-3) taken from the particle's seed,
as a stochastic simulator's answer depends on its seed, so that tests of identical answers also
check the seeds. The one-at-a-time and the batched (numpy) forms do the same floating-point
operations in the same order, so they give the same bits.
"""
import math
import os
import sys

sys.path.insert(0, os.environ["SKERRY_WORKER_LIBRARY"])
import skerry_worker  # noqa: E402

SIGMA = float(sys.argv[1])
BATCHED = "--batched" in sys.argv
JITTER = "--jitter" in sys.argv
CONSTANT = -0.5 * math.log(2 * math.pi * SIGMA * SIGMA)


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
            mu = theta["mu"]
            total = 0.0
            for v in y:
                z = (v - mu) / SIGMA
                total += CONSTANT - 0.5 * (z * z)
            return total + jitter(seed)
        return log_likelihood

    import numpy

    def log_likelihoods(values, seeds):
        mu = values[:, 0]
        total = numpy.zeros(len(mu))
        for v in y:
            z = (v - mu) / SIGMA
            total += CONSTANT - 0.5 * (z * z)
        return (total + numpy.array([jitter(s) for s in seeds])).tolist()
    return log_likelihoods


skerry_worker.serve(setup=setup, batched=BATCHED)
