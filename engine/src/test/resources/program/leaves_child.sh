#!/bin/sh
# Test program: leaves_child.sh FILE starts a background child (sleep 600), writes the child's pid
# to FILE (whole, then renamed), and exits at once with status 0, leaving the child running.
sleep 600 &
echo "$!" > "$1.tmp"
mv "$1.tmp" "$1"
exit 0
