#!/usr/bin/env python3
"""Lake Quellmar demo, buoy 7, with the model as a Python program: the nutrient-phytoplankton-
zooplankton (NPZ) model with sigmoidal grazing (Franks, Wroblewski & Flierl 1986, Marine
Biology 91), solved with a fixed-step fourth-order Runge-Kutta method, vectorised with numpy over
a batch of particles. Lake Quellmar is invented and its data are synthetic (see ../README.md).

Observed chlorophyll-a y_j is log-normal: log y_j ~ N(log(ratio * P(t_j)), sigma^2), as in the
built-in plankton-npz model; this program is an independent implementation of the same model (its
own solver, so its numbers differ from the built-in model's in the last digits).

skerry runs it as a worker (run file: buoy-07-python.conf); each particle's result depends only
on its own parameters, so every batch size gives the same answer."""
import math
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "..", "workers", "python"))
import numpy  # noqa: E402
import skerry_worker  # noqa: E402

ASSIMILATION = 0.3          # gamma
ZOOPLANKTON_MORTALITY = 0.15
INITIAL = (4.6, 0.1, 0.1)   # N0 for buoy-07 (the scenario's), P0, Z0 in mmol N m^-3
RATIO = 1.59                # chlorophyll-a per nitrogen
STEP = 0.25                 # days


def read(path):
    days, values = [], []
    with open(path) as f:
        for line in f:
            if line.startswith("#") or line.startswith("day"):
                continue
            day, value = line.strip().split(",")
            days.append(float(day))
            values.append(float(value))
    return numpy.array(days), numpy.array(values)


def setup(start):
    days, chlorophyll = read(start.files[0])
    log_y = numpy.log(chlorophyll)
    steps_to = numpy.rint(days / STEP).astype(int)
    constant = -log_y.sum() - 0.5 * len(log_y) * math.log(2 * math.pi)

    def log_likelihoods(theta, seeds):
        mu_max, k_n, g_max, k_p, m_p, sigma = (theta[:, i] for i in range(6))

        def rates(n, p, z):
            uptake = mu_max * n / (k_n + n) * p
            grazing = g_max * p * p / (k_p * k_p + p * p) * z
            return (-uptake + (1 - ASSIMILATION) * grazing + m_p * p + ZOOPLANKTON_MORTALITY * z,
                    uptake - grazing - m_p * p,
                    ASSIMILATION * grazing - ZOOPLANKTON_MORTALITY * z)

        count = theta.shape[0]
        state = [numpy.full(count, value) for value in INITIAL]
        phytoplankton = numpy.empty((len(days), count))
        with numpy.errstate(all="ignore"):
            step = 0
            for j, target in enumerate(steps_to):
                while step < target:
                    k1 = rates(*state)
                    k2 = rates(*(s + 0.5 * STEP * k for s, k in zip(state, k1)))
                    k3 = rates(*(s + 0.5 * STEP * k for s, k in zip(state, k2)))
                    k4 = rates(*(s + STEP * k for s, k in zip(state, k3)))
                    state = [s + STEP / 6 * (a + 2 * b + 2 * c + d) for s, a, b, c, d in zip(state, k1, k2, k3, k4)]
                    step += 1
                phytoplankton[j] = state[1]
            residual = log_y[:, None] - numpy.log(RATIO * phytoplankton)
            result = constant - len(log_y) * numpy.log(sigma) - 0.5 * (residual * residual).sum(axis=0) / (sigma * sigma)
        # A solution that left the positive states (P <= 0) is impossible: a zero likelihood.
        impossible = ~numpy.all(phytoplankton > 0, axis=0)
        result[impossible] = -math.inf
        return result.tolist()

    return log_likelihoods


skerry_worker.serve(setup=setup, batched=True)
