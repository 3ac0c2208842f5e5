"""Test worker that misbehaves on purpose: faulty.py BEHAVIOUR [ARGUMENT].

Healthy requests answer -mu**2/2. Behaviours (each on every request unless said otherwise):
  error        replies 'error' with a text            exit       exits with status 3
  crash        kills itself with SIGSEGV               garbage    replies 'value not-a-number'
  mismatch     replies to another request number       hang DIR   starts a child process, writes
               both pids to DIR, then sleeps           busy DIR   while DIR/go exists: writes DIR/busy-PID, sleeps
  fail-once F  exits 4 if file F exists (deleting it first), else healthy
  import-error fails to import a module at start       version    says it speaks protocol 2
  silent       exits at start without a word           chatty     prints a banner to standard output
"""
import os
import signal
import subprocess
import sys
import time

behaviour = sys.argv[1]
argument = sys.argv[2] if len(sys.argv) > 2 else None
print("faulty worker starting: " + behaviour, file=sys.stderr, flush=True)

if behaviour == "import-error":
    import a_module_that_is_not_installed  # noqa: F401
if behaviour == "silent":
    sys.exit(5)
if behaviour == "chatty":
    sys.stdout.write("Welcome to the simulator 1.0\n")
    sys.stdout.flush()

sys.path.insert(0, os.environ["SKERRY_WORKER_LIBRARY"])
import skerry_worker  # noqa: E402

if behaviour == "version":
    skerry_worker.PROTOCOL_VERSION = 2


def log_likelihood(theta, seed):
    mu = theta["mu"]
    if behaviour == "error":
        raise ValueError("the solver diverged at mu=%r" % mu)
    if behaviour == "exit":
        print("giving up on mu=%r" % mu, file=sys.stderr, flush=True)
        os._exit(3)
    if behaviour == "crash":
        print("about to crash", file=sys.stderr, flush=True)
        os.kill(os.getpid(), signal.SIGSEGV)
    if behaviour == "garbage":
        return "not-a-number"
    if behaviour == "hang":
        child = subprocess.Popen(["sleep", "600"])
        with open(os.path.join(argument, "pids-%d" % os.getpid()), "w") as f:
            f.write("%d %d\n" % (os.getpid(), child.pid))
        time.sleep(600)
    if behaviour == "busy" and os.path.exists(os.path.join(argument, "go")):
        with open(os.path.join(argument, "busy-%d" % os.getpid()), "w") as f:
            f.write(str(os.getpid()))
        time.sleep(600)
    if behaviour == "fail-once" and os.path.exists(argument):
        os.remove(argument)
        print("failing once", file=sys.stderr, flush=True)
        os._exit(4)
    return -0.5 * mu * mu


if behaviour == "garbage":
    # The library would refuse to send a non-number, so write the protocol by hand.
    out = sys.stdout.buffer
    source = sys.stdin.buffer
    while True:
        line = source.readline()
        if not line or line.strip() == b"start":
            break
    out.write(b"ready 1\n")
    out.flush()
    while True:
        header = source.readline()
        if not header:
            sys.exit(0)
        words = header.split()
        for _ in range(int(words[3])):
            source.readline()
        out.write(b"result " + words[1] + b" " + words[3] + b"\n" + b"value not-a-number\n" * int(words[3]))
        out.flush()
elif behaviour == "mismatch":
    out = sys.stdout.buffer
    source = sys.stdin.buffer
    while True:
        line = source.readline()
        if not line or line.strip() == b"start":
            break
    out.write(b"ready 1\n")
    out.flush()
    while True:
        header = source.readline()
        if not header:
            sys.exit(0)
        words = header.split()
        for _ in range(int(words[3])):
            source.readline()
        out.write(b"result 999 " + words[3] + b"\n")
        out.flush()
else:
    skerry_worker.serve(log_likelihood)
