"""Test helper: parent_of_worker.py FIFO COMMAND...

Starts COMMAND with its standard input read from the named pipe FIFO (held open by the test, so the
command never sees the end of its input) and its standard output ours, prints the command's process
id, then sleeps until it is killed: a parent whose death the worker library must notice by itself.
"""
import subprocess
import sys
import time

with open(sys.argv[1], "rb") as source:
    child = subprocess.Popen(sys.argv[2:], stdin=source)
print(child.pid, flush=True)
time.sleep(600)
