#!/bin/sh
# A file-mode model program in plain shell and awk, as a legacy code would be driven: skerry writes
# input.txt into a fresh folder (rendered from input.tmpl), runs this script there, and reads the
# log-likelihood it writes to output.txt. The model: the observations in the file named by $1 are
# normal with unknown mean mu and known sd 2 (BDA3 §2.5, so the answer has a closed form).
# A non-zero exit, a missing output.txt or text that is not a number is a failed evaluation.
set -eu
awk -v sd=2 '
  FNR == NR { if ($1 == "mu") mu = $3; next }
  /^#/ || $1 == "y" || NF == 0 { next }
  { z = ($1 - mu) / sd; total += -0.5 * log(2 * 3.141592653589793 * sd * sd) - 0.5 * z * z }
  END { printf "%.17g\n", total }
' input.txt "$1" > output.txt
