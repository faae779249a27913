#!/usr/bin/env bash
# Cold tiles: tiles rendered from the pyramid with display settings no earlier request used, so nothing can come
# from a cache, with wrk at 64 connections on loopback over a few hundred native-level chip tiles of the default
# demo field (each read from the FITS file). Two figures: a new display for every request, and a new display for
# every screen of 16 tiles (what one change of settings in a browser asks for). Baseline in the same run: the same
# tiles, each with its own limits, made by numpy + astropy + Pillow in 2 processes (baseline_tiles.py), after a
# check that its pictures equal ours within 1 DN.
#
#   tests/Mosaic.Benchmarks/load/cold.sh [SECONDS] [TILES]        (defaults 10 and 384)
#
# Goals (issue 8): at least 2,500 cold tiles/s across both cores; at least 3x the baseline's throughput.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
SECONDS_EACH=${1:-10}
COUNT=${2:-384}
need wrk taskset dotnet "$PY"
need_python_packages
trap stop_server EXIT

build_server
DATA=$(demo_data default)
serve_field "$DATA" "$WORK/cache-default" demo 900
$PY "$LOAD/tile_urls.py" --native --limits "$BASE" demo "$COUNT" >"$WORK/cold-paths.tsv"

# Until the runtime has compiled the hot paths optimised (see settle); these displays are never asked for again.
settle cold.lua "$BASE" "$WORK/cold-paths.tsv" 1
echo "== $(date -u '+%F %T') UTC, load average $(load_average), server on CPUs $SERVER_CPUS, wrk -t1 -c64 on CPUs $WRK_CPUS, ${SECONDS_EACH} s each"
EACH=$(run_wrk cold.lua "$SECONDS_EACH" "$BASE" "$WORK/cold-paths.tsv" 1)
SCREEN=$(run_wrk cold.lua "$SECONDS_EACH" "$BASE" "$WORK/cold-paths.tsv" 16)
BASELINE_OUT=$($PY "$LOAD/baseline_tiles.py" "$BASE" "$DATA" "$WORK/cold-paths.tsv" "$SECONDS_EACH" 2)
BASELINE=$(echo "$BASELINE_OUT" | grep '^FIGURE')
echo "cold tiles, new display every request:   $EACH"
echo "cold tiles, new display every 16 tiles:  $SCREEN"
echo "$BASELINE_OUT" | grep '^BASELINE'
echo "baseline, numpy + astropy + Pillow:      $BASELINE"
echo "load average after: $(load_average)"
B=$(echo "$BASELINE" | figure rps)
for name in EACH SCREEN; do
    line=${!name}
    rps=$(echo "$line" | figure rps)
    errors=$(echo "$line" | figure errors_4xx5xx)
    awk -v n="$name" -v r="$rps" -v b="$B" -v e="$errors" 'BEGIN {
        label = (n == "EACH") ? "new display every request" : "new display every 16 tiles"
        printf "RESULT cold (%s): %d tiles/s (goal >= 2500: %s), %.1fx the baseline'"'"'s %d/s (goal >= 3x: %s)%s\n",
            label, r, (r >= 2500 && e == 0) ? "met" : "NOT met", r / b, b, (r >= 3 * b && e == 0) ? "met" : "NOT met",
            (e > 0) ? ", " e " error answers" : "" }'
done
