#!/usr/bin/env python3
"""The benchmark's worker program: the likelihood of TimedSpinNormal (every coordinate observed at
1, known sd 1) after a timed busy wait of COST microseconds per particle, as the in-JVM model
waits: the same wall time in both languages, so the runs differ only by the protocol.

usage: program-worker.py COST_MICROS [--batched]   (environment: SKERRY_WORKER_LIBRARY)
With --batched the likelihood is computed with numpy for the whole batch, after a wait of COST
per particle of the batch."""
import math
import os
import sys
import time

sys.path.insert(0, os.environ["SKERRY_WORKER_LIBRARY"])
import skerry_worker  # noqa: E402

COST = float(sys.argv[1])
BATCHED = "--batched" in sys.argv
OBSERVATION, SIGMA = 1.0, 1.0
CONSTANT = -0.5 * math.log(2 * math.pi)


def spin(micros):
    if micros > 0:
        until = time.perf_counter_ns() + int(micros * 1000)
        while time.perf_counter_ns() < until:
            pass


def log_likelihood(theta, seed):
    spin(COST)
    total = 0.0
    for value in theta.values():
        z = (OBSERVATION - value) / SIGMA
        total += CONSTANT - 0.5 * z * z
    return total


def log_likelihoods(values, seeds):
    import numpy
    spin(COST * len(seeds))
    z = (OBSERVATION - values) / SIGMA
    return (CONSTANT - 0.5 * z * z).sum(axis=1).tolist()


if BATCHED:
    skerry_worker.serve(log_likelihoods, batched=True)
else:
    skerry_worker.serve(log_likelihood)
