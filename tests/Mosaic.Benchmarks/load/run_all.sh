#!/usr/bin/env bash
# Every serving figure of issue 8, one after the other (never two at once: they share the two cores), then the
# RESULT lines together. Builds the server once; MOSAIC_LOAD_BUILD=0 reuses the build already in $MOSAIC_LOAD_WORK.
#
#   tests/Mosaic.Benchmarks/load/run_all.sh [SECONDS]        (default 10 per wrk run)
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
SECONDS_EACH=${1:-10}
build_server
LOG="$WORK/run-all-$(date -u +%Y%m%dT%H%M%S).log"
echo "== $(date -u '+%F %T') UTC, $(nproc) cores, load average $(load_average); log $LOG"
uptime | tee -a "$LOG"
STEPS=("warm.sh $SECONDS_EACH" "cold.sh $SECONDS_EACH" "startup.sh 3" "browser.sh 3" "memory.sh $((SECONDS_EACH * 2))")
for step in "${STEPS[@]}"; do
    read -r script argument <<<"$step"
    echo "== $step" | tee -a "$LOG"
    MOSAIC_LOAD_BUILD=0 "$LOAD/$script" "$argument" 2>&1 | tee -a "$LOG" || echo "RESULT $script: FAILED (see $LOG)" | tee -a "$LOG"
done
uptime | tee -a "$LOG"
echo "== results"
grep '^RESULT' "$LOG"
