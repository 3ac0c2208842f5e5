"""Test worker: report_environment.py FILE writes, at start, its environment and current folder to
FILE (one NAME=VALUE a line, then "cwd=FOLDER" last), then answers -mu*mu/2."""
import os
import sys

sys.path.insert(0, os.environ["SKERRY_WORKER_LIBRARY"])
import skerry_worker  # noqa: E402

with open(sys.argv[1] + ".tmp", "w") as f:
    for name in sorted(os.environ):
        f.write("%s=%s\n" % (name, os.environ[name]))
    f.write("cwd=%s\n" % os.getcwd())
os.replace(sys.argv[1] + ".tmp", sys.argv[1])

skerry_worker.serve(log_likelihood=lambda theta, seed: -0.5 * theta["mu"] ** 2)
