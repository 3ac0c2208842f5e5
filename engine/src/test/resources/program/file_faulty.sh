#!/bin/sh
# Test program for file mode: file_faulty.sh BEHAVIOUR. Reads mu from input.txt ("mu = VALUE").
#   healthy    writes -mu*mu/2 to output.txt       exit       exits with status 3 (after a message)
#   nooutput   writes nothing                       garbage    writes "not-a-number"
#   hang       starts a child (sleep 600), writes its own and the child's pid to pids.txt in the
#              folder named by the variable PIDS_DIR, then sleeps
#   hang-many  as hang, each evaluation writing its own pids-PID.txt (written whole, then renamed)
case "$1" in
  exit) echo "cannot converge" >&2; exit 3 ;;
  nooutput) exit 0 ;;
  garbage) echo "not-a-number" > output.txt; exit 0 ;;
  hang) sleep 600 & echo "$$ $!" > "$PIDS_DIR/pids.txt"; wait; exit 0 ;;
  hang-many) sleep 600 & echo "$$ $!" > "$PIDS_DIR/pids-$$.tmp"; mv "$PIDS_DIR/pids-$$.tmp" "$PIDS_DIR/pids-$$.txt"
    wait; exit 0 ;;
esac
awk '$1 == "mu" { printf "%.17g\n", -0.5 * $3 * $3 }' input.txt > output.txt
