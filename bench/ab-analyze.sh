#!/bin/bash
# Interleaved A/B of whole `analyze` processes: an older build against this one, on one record.
#   bash bench/ab-analyze.sh /path/to/older/bin/strainledger.js FILE [N=15] [extra analyze options]
# Kept for the commands written in bench/RESULTS.md; it runs bench/ab-builds.mjs (the older build, then this one, N
# rounds, each process timed to the millisecond around spawnSync). An older build:
# `git worktree add /tmp/base REV && cd /tmp/base && npm ci && npm run build`.
set -euo pipefail
base=$1; file=$2; n=${3:-15}; shift $(( $# >= 3 ? 3 : 2 ))
here="$(cd "$(dirname "$0")/.." && pwd)"
exec node "$here/bench/ab-builds.mjs" "$file" "$n" "$base" "$here/bin/strainledger.js" -- "$@"
