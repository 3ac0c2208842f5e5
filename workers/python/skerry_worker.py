"""A worker for skerry's program models: write one function, call serve().

skerry starts this program once per concurrent evaluation slot and talks to it over standard
input and output with a small line protocol (docs/program-protocol.md in the skerry repository).
This module implements the protocol; it needs nothing beyond the Python 3 standard library
(numpy is used for batches when it is installed).

One particle at a time:

    import skerry_worker

    def log_likelihood(theta, seed):
        # theta: {"mu": 1.3, ...} by parameter name; seed: an int in [0, 2**64)
        return ...

    skerry_worker.serve(log_likelihood)

Data files listed in the run file's model.program.files arrive in the start message; read them
once with a setup function that returns the evaluating function:

    def setup(start):              # start.parameters, start.files (absolute paths)
        y = load(start.files[0])
        def log_likelihood(theta, seed): ...
        return log_likelihood

    skerry_worker.serve(setup=setup)

Batches (model.program.batch > 1): serve(..., batched=True) calls the function once per request
with values (an n x d numpy array when numpy is installed, else a list of lists, columns in the
order of start.parameters) and seeds (a list of n ints), and expects n numbers back. A particle's
result must depend only on its own values and seed, never on which particles share the batch:
that is what keeps skerry's answers identical for every batch size and partitioning.

A simulator for approximate Bayesian computation (the run file names its summaries in
model.program.summaries and runs sampler.sequence = abc) gives serve() a summaries function
instead: it returns one number per summary, in the order the run file names them
(start.summaries), and draws its randomness from the seed alone:

    def summaries(theta, seed):
        rng = random.Random(seed)
        y = [rng.gauss(theta["mu"], 1.0) for _ in range(10)]
        return [statistics.fmean(y), statistics.stdev(y)]

    skerry_worker.serve(summaries=summaries)

With batched=True it takes (values, seeds) and returns n rows of one number per summary (an n x s
numpy array or a list of lists). A setup function may return either kind of function: the start
message says which skerry asks for (start.reply is "log-likelihood" or "summaries").

Return float("-inf") for parameters the model rules out (a zero likelihood). Raise an exception
(or return NaN) for a failed evaluation: skerry counts it as invalid, with the message as the
reason, and retries it as the run file allows. Print diagnostics to standard error (print() goes
there while serve() runs); standard output carries the protocol only. The worker exits when
skerry closes its standard input, or when skerry itself is gone.
"""

import os
import sys
import threading
import traceback

PROTOCOL_VERSION = 1
__all__ = ["serve", "Start", "PROTOCOL_VERSION"]


class Start:
    """The start message: protocol version, parameter names (vector order), files, reply kind,
    and the summary names when the reply kind is "summaries" (else an empty list)."""

    def __init__(self, version, parameters, files, reply, summaries=()):
        self.version = version
        self.parameters = parameters
        self.files = files
        self.reply = reply
        self.summaries = list(summaries)

    def __repr__(self):
        return "Start(version=%r, parameters=%r, files=%r, reply=%r, summaries=%r)" % (
            self.version, self.parameters, self.files, self.reply, self.summaries)


class ProtocolError(Exception):
    """skerry sent something this library does not understand."""


def _watch_parent(interval=1.0):
    # When skerry dies its pipes close, but a long evaluation would only notice at its end; the
    # parent's disappearance (we are handed to another parent) ends the worker at once.
    parent = os.getppid()

    def watch():
        import time
        while True:
            time.sleep(interval)
            if os.getppid() != parent:
                os._exit(70)

    thread = threading.Thread(target=watch, name="skerry-parent-watch", daemon=True)
    thread.start()


def _read_line(source):
    line = source.readline()
    if not line:
        return None
    return line.decode("utf-8").rstrip("\r\n")


def _read_start(source):
    first = _read_line(source)
    if first is None:
        return None
    words = first.split(" ")
    if len(words) != 2 or words[0] != "skerry-worker":
        raise ProtocolError("expected 'skerry-worker VERSION', got %r" % first)
    version = int(words[1])
    parameters, files, reply, summaries = [], [], "log-likelihood", []
    while True:
        line = _read_line(source)
        if line is None:
            raise ProtocolError("the start message ended early")
        if line == "start":
            return Start(version, parameters, files, reply, summaries)
        if line.startswith("parameters "):
            words = line.split(" ")
            parameters = words[2:]
            if int(words[1]) != len(parameters):
                raise ProtocolError("parameter count does not match: %r" % line)
        elif line.startswith("files "):
            for _ in range(int(line.split(" ")[1])):
                path = _read_line(source)
                if path is None:
                    raise ProtocolError("the start message ended inside its file list")
                files.append(path)
        elif line.startswith("reply "):
            reply = line[len("reply "):]
        elif line.startswith("summaries "):
            words = line.split(" ")
            summaries = words[2:]
            if int(words[1]) != len(summaries):
                raise ProtocolError("summary count does not match: %r" % line)
        # Lines of later minor additions are ignored, as the protocol allows.


def _number_text(value):
    return float(value).hex()


def _one_line(text):
    return " ".join(str(text).split()) or "(no text)"


def _failure_text(error):
    return _one_line("%s: %s" % (type(error).__name__, error))


def serve(log_likelihood=None, setup=None, batched=False, stdin=None, stdout=None, summaries=None):
    """Runs the worker loop until skerry closes standard input.

    Give one of log_likelihood (the evaluating function), summaries (a simulator's function
    returning one number per summary) or setup (a function of the Start message returning the
    function skerry's start message asks for). With batched=True the function takes (values,
    seeds) for a whole request and returns one result per particle.
    """
    given = [f for f in (log_likelihood, setup, summaries) if f is not None]
    if len(given) != 1:
        raise TypeError("give exactly one of log_likelihood, summaries and setup")
    source = stdin if stdin is not None else sys.stdin.buffer
    sink = stdout if stdout is not None else sys.stdout.buffer
    # Anything the model prints goes to standard error, keeping standard output for the protocol.
    sys.stdout = sys.stderr
    if stdin is None:
        _watch_parent()
    start = _read_start(source)
    if start is None:
        return
    if start.version != PROTOCOL_VERSION:
        sink.write(("ready %d\n" % PROTOCOL_VERSION).encode("ascii"))
        sink.flush()
        return
    if start.reply not in ("log-likelihood", "summaries"):
        # A reply kind of a later skerry: say so rather than answer wrongly.
        print("skerry_worker: skerry asks for replies of kind %r; this library gives log-likelihoods and "
              "summaries only" % start.reply, file=sys.stderr)
        sys.exit(2)
    if start.reply == "summaries" and log_likelihood is not None:
        print("skerry_worker: the run file names summaries (model.program.summaries = %s), but this worker "
              "gives a log-likelihood: call serve(summaries=...) for a simulator, or remove the key"
              % ", ".join(start.summaries), file=sys.stderr)
        sys.exit(2)
    if start.reply == "log-likelihood" and summaries is not None:
        print("skerry_worker: this worker simulates summaries (serve(summaries=...)), but the run file asks "
              "for a log-likelihood: name the summaries in model.program.summaries and run "
              "sampler.sequence = abc", file=sys.stderr)
        sys.exit(2)
    function = setup(start) if setup is not None else (log_likelihood or summaries)
    if function is None:
        raise TypeError("setup returned no function")
    names = start.parameters
    numpy = None
    if batched:
        try:
            import numpy
        except ImportError:
            numpy = None
    sink.write(("ready %d\n" % PROTOCOL_VERSION).encode("ascii"))
    sink.flush()
    while True:
        header = _read_line(source)
        if header is None:
            return
        words = header.split(" ")
        if len(words) != 4 or words[0] != "evaluate":
            raise ProtocolError("expected 'evaluate REQUEST ITERATION COUNT', got %r" % header)
        request, count = words[1], int(words[3])
        lines = [source.readline() for _ in range(count)]
        if count and not lines[-1].endswith(b"\n"):
            return
        # One split of the whole request, then a column at a time: map() over builtins keeps the
        # per-particle cost of a large batch to a few hundred nanoseconds.
        fields = b"".join(lines).decode("ascii").split()
        width = len(names) + 1
        if len(fields) != count * width:
            raise ProtocolError("request %s: expected %d fields, got %d" % (request, count * width, len(fields)))
        seeds = list(map(int, fields[0::width]))
        columns = [list(map(float.fromhex, fields[j::width])) for j in range(1, width)]
        out = ["result %s %d\n" % (request, count)]
        if start.summaries:
            out.extend(_simulate(function, columns, seeds, names, len(start.summaries), batched, numpy))
        elif batched:
            out.extend(_evaluate_batch(function, columns, seeds, numpy))
        else:
            for row, seed in zip(zip(*columns), seeds):
                try:
                    out.append("value %s\n" % _number_text(function(dict(zip(names, row)), seed)))
                except Exception as error:  # the model's own failure: reported, the worker goes on
                    traceback.print_exc(file=sys.stderr)
                    out.append("error %s\n" % _failure_text(error))
        sink.write("".join(out).encode("utf-8"))
        sink.flush()


def _evaluate_batch(function, columns, seeds, numpy):
    count = len(seeds)
    try:
        if numpy is not None:
            values = numpy.array(columns, dtype=float).reshape(len(columns), count).T
        else:
            values = [list(row) for row in zip(*columns)]
        results = list(function(values, seeds))
        if len(results) != count:
            raise ValueError("the batch function returned %d numbers for %d particles" % (len(results), count))
    except Exception as error:
        traceback.print_exc(file=sys.stderr)
        return ["error %s\n" % _failure_text(error)] * count
    try:
        return ["value " + float(result).hex() + "\n" for result in results]
    except (TypeError, ValueError):
        lines = []
        for result in results:
            try:
                lines.append("value %s\n" % _number_text(result))
            except (TypeError, ValueError) as error:
                lines.append("error %s\n" % _failure_text(error))
        return lines


def _summary_line(row, width):
    row = list(row)
    if len(row) != width:
        raise ValueError("the summaries function returned %d numbers for %d summaries" % (len(row), width))
    return "value " + " ".join(float(x).hex() for x in row) + "\n"


def _simulate(function, columns, seeds, names, width, batched, numpy):
    """Reply lines for a simulator: one line of `width` numbers per particle, or an error line."""
    count = len(seeds)
    lines = []
    if batched:
        try:
            if numpy is not None:
                values = numpy.array(columns, dtype=float).reshape(len(columns), count).T
            else:
                values = [list(row) for row in zip(*columns)]
            rows = list(function(values, seeds))
            if len(rows) != count:
                raise ValueError("the batch function returned %d rows for %d particles" % (len(rows), count))
        except Exception as error:
            traceback.print_exc(file=sys.stderr)
            return ["error %s\n" % _failure_text(error)] * count
        for row in rows:
            try:
                lines.append(_summary_line(row, width))
            except (TypeError, ValueError) as error:
                lines.append("error %s\n" % _failure_text(error))
        return lines
    for row, seed in zip(zip(*columns), seeds):
        try:
            lines.append(_summary_line(function(dict(zip(names, row)), seed), width))
        except Exception as error:  # the simulator's own failure: reported, the worker goes on
            traceback.print_exc(file=sys.stderr)
            lines.append("error %s\n" % _failure_text(error))
    return lines
