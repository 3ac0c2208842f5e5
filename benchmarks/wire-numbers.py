#!/usr/bin/env python3
"""Python's side of the program protocol's number text: nanoseconds per number to read and write
C99 hexadecimal (float.fromhex / float.hex) and shortest round-trip decimal (float / repr), one at
a time and, with numpy, a whole batch. Usage: benchmarks/wire-numbers.py [COUNT]. Results in
benchmarks/RESULTS.md ("Program models: number text")."""
import random
import sys
import timeit

count = int(sys.argv[1]) if len(sys.argv) > 1 else 100000
rng = random.Random(14)
values = [rng.gauss(0, 1) * 10 ** rng.randint(-3, 3) for _ in range(count)]
hex_text = [v.hex() for v in values]
decimal_text = [repr(v) for v in values]
assert all(float.fromhex(h) == v for h, v in zip(hex_text, values))
assert all(float(d) == v for d, v in zip(decimal_text, values))


def per_number(statement, **names):
    best = min(timeit.repeat(statement, globals=names, number=1, repeat=7))
    return best / count * 1e9


rows = [
    ("read hex, float.fromhex", per_number("[float.fromhex(t) for t in x]", x=hex_text)),
    ("read decimal, float", per_number("[float(t) for t in x]", x=decimal_text)),
    ("write hex, float.hex", per_number("[v.hex() for v in x]", x=values)),
    ("write decimal, repr", per_number("[repr(v) for v in x]", x=values)),
]
try:
    import numpy
    joined = " ".join(decimal_text)
    rows.append(("read decimal, numpy.array(list of str, float)",
                 per_number("numpy.array(x, dtype=float)", x=decimal_text, numpy=numpy)))
    rows.append(("read decimal, numpy.fromstring(sep=' ')",
                 per_number("numpy.fromstring(x, sep=' ')", x=joined, numpy=numpy)))
    rows.append(("read hex, numpy.array(map(float.fromhex))",
                 per_number("numpy.array(list(map(float.fromhex, x)))", x=hex_text, numpy=numpy)))
except ImportError:
    pass
print("python %s, %d numbers, best of 7" % (sys.version.split()[0], count))
for name, ns in rows:
    print("%-48s %8.1f ns" % (name, ns))
