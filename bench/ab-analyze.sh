#!/bin/bash
# Interleaved A/B of whole `analyze` processes: an older build against this one, on one record.
#   bash bench/ab-analyze.sh /path/to/older/bin/strainledger.js FILE [N=15] [extra analyze options]
# Each of N rounds runs the older build, then this one (`--format json`, output discarded), wall time from
# /usr/bin/time; prints both sorted lists and the medians. Alternating keeps a drift of the machine's load out of
# the comparison (the whole-process time of one build moves by ±5 % over a day on a shared 2-core machine).
# An older build: `git worktree add /tmp/base REV && cd /tmp/base && npm ci && npm run build`.
set -euo pipefail
base=$1; file=$2; n=${3:-15}; shift $(( $# >= 3 ? 3 : 2 ))
here="$(cd "$(dirname "$0")/.." && pwd)/bin/strainledger.js"
for i in $(seq "$n"); do
  a=$( { /usr/bin/time -f "%e" node "$base" analyze "$file" --format json "$@" >/dev/null; } 2>&1 )
  b=$( { /usr/bin/time -f "%e" node "$here" analyze "$file" --format json "$@" >/dev/null; } 2>&1 )
  echo "$a $b"
done | python3 -c "
import sys, statistics
r = [tuple(map(float, l.split())) for l in sys.stdin]
a = [x[0] for x in r]; b = [x[1] for x in r]
print('older', sorted(a)); print('this ', sorted(b))
print('median older %.3f s, this %.3f s' % (statistics.median(a), statistics.median(b)))"
