#!/usr/bin/env python3
"""Measures one link of the shaped network of `deploy/loopback-cluster start --network`: TCP
round-trip time (1-byte request and answer, Nagle off) and bulk rate in both directions, between
a client in one network namespace and a server in another. Run as root (ip netns exec).

usage: benchmarks/link-check.py CLIENT-NAMESPACE SERVER-NAMESPACE SERVER-ADDRESS [MEGABYTES] [PORT]
       benchmarks/link-check.py - - 127.0.0.1     (both ends here, on loopback: the unshaped floor)

Both ends are this file started again with `ip netns exec NAMESPACE python3 …` (argument lists,
no shell); the server is stopped on every way out.
"""
import socket
import statistics
import subprocess
import sys
import time

CHUNK = 1 << 20
PINGS = 2000


def serve(address, port):
    with socket.create_server((address, port)) as server:
        print("ready", flush=True)
        # 1: echo one byte at a time; 2: swallow bytes, answer with one; 3: send what is asked.
        for _ in range(3):
            connection, _ = server.accept()
            with connection:
                connection.setsockopt(socket.IPPROTO_TCP, socket.TCP_NODELAY, 1)
                mode = connection.recv(1)
                if mode == b"e":
                    while (byte := connection.recv(1)):
                        connection.sendall(byte)
                elif mode == b"s":
                    receive(connection, int.from_bytes(connection.recv(8, socket.MSG_WAITALL), "big"))
                    connection.sendall(b"k")
                elif mode == b"r":
                    count = int.from_bytes(connection.recv(8, socket.MSG_WAITALL), "big")
                    block = bytes(CHUNK)
                    for _ in range(count // CHUNK):
                        connection.sendall(block)


def receive(connection, expected):
    """Reads and drops up to `expected` bytes; returns how many came before the peer closed."""
    got = 0
    while got < expected:
        part = connection.recv(CHUNK)
        if not part:
            break
        got += len(part)
    return got


def connect(address, port, mode):
    connection = socket.create_connection((address, port), timeout=120)
    connection.setsockopt(socket.IPPROTO_TCP, socket.TCP_NODELAY, 1)
    connection.sendall(mode)
    return connection


def client(address, port, megabytes):
    with connect(address, port, b"e") as c:
        times = []
        for _ in range(PINGS):
            start = time.perf_counter_ns()
            c.sendall(b"x")
            c.recv(1)
            times.append((time.perf_counter_ns() - start) / 1000)
    times.sort()
    total = megabytes * CHUNK
    with connect(address, port, b"s") as c:
        block = bytes(CHUNK)
        start = time.perf_counter()
        c.sendall(total.to_bytes(8, "big"))
        for _ in range(megabytes):
            c.sendall(block)
        assert c.recv(1) == b"k"
        send_seconds = time.perf_counter() - start
    with connect(address, port, b"r") as c:
        start = time.perf_counter()
        c.sendall(total.to_bytes(8, "big"))
        got = receive(c, total)
        receive_seconds = time.perf_counter() - start
    print(f"round trip (1 byte each way, {PINGS} times): median {statistics.median(times):.1f} us, "
          f"10th percentile {times[len(times) // 10]:.1f} us, 90th {times[9 * len(times) // 10]:.1f} us")
    print(f"client to server: {total} bytes in {send_seconds:.3f} s = {total * 8 / send_seconds / 1e6:.0f} Mbit/s")
    print(f"server to client: {got} bytes in {receive_seconds:.3f} s = {got * 8 / receive_seconds / 1e6:.0f} Mbit/s")


def in_namespace(namespace, arguments):
    return arguments if namespace == "-" else ["ip", "netns", "exec", namespace] + arguments


def main(argv):
    if len(argv) >= 2 and argv[1] == "serve":
        serve(argv[2], int(argv[3]))
        return 0
    if len(argv) >= 2 and argv[1] == "client":
        client(argv[2], int(argv[3]), int(argv[4]))
        return 0
    if len(argv) not in (4, 5, 6):
        print(__doc__, file=sys.stderr)
        return 2
    client_ns, server_ns, address = argv[1:4]
    megabytes = int(argv[4]) if len(argv) > 4 else 300
    port = int(argv[5]) if len(argv) > 5 else 39217
    me = [sys.executable, __file__]
    server = subprocess.Popen(in_namespace(server_ns, me + ["serve", address, str(port)]),
                              stdout=subprocess.PIPE, text=True)
    try:
        if server.stdout.readline().strip() != "ready":
            print("the server did not start", file=sys.stderr)
            return 1
        return subprocess.run(in_namespace(client_ns, me + ["client", address, str(port), str(megabytes)])).returncode
    finally:
        server.kill()
        server.wait()


if __name__ == "__main__":
    sys.exit(main(sys.argv))
