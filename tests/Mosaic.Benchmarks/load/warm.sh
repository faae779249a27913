#!/usr/bin/env bash
# Warm tiles: responses per second and latency percentiles for tiles already in the server's cache, with wrk at 64
# connections on loopback cycling over a few hundred distinct tile URLs of the default demo field (every band's
# whole-field canvas, zoom 0 down). Baseline in the same run: the same server sending a static file of the client
# (Kestrel's static files, no tile code) of about a tile's size, with the same wrk settings.
#
#   tests/Mosaic.Benchmarks/load/warm.sh [SECONDS] [URLS]        (defaults 10 and 300)
#
# Goal (issue 8): at least 15,000 responses/s, p99 at most 20 ms. See lib.sh for how the cores are shared.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
SECONDS_EACH=${1:-10}
COUNT=${2:-300}
need wrk taskset curl dotnet "$PY"
trap stop_server EXIT

build_server
DATA=$(demo_data default)
serve_field "$DATA" "$WORK/cache-default" demo 900
$PY "$LOAD/tile_urls.py" "$BASE" demo "$COUNT" >"$WORK/warm-paths.txt"
warm_up "$BASE" "$WORK/warm-paths.txt"
STATIC=/lib/signalr/signalr.min.js
echo "$STATIC" >"$WORK/static-path.txt"
TILE_BYTES=$($PY - "$BASE" "$WORK/warm-paths.txt" <<'PY'
import sys, urllib.request
paths = [l.strip() for l in open(sys.argv[2]) if l.strip()]
print(sum(len(urllib.request.urlopen(sys.argv[1] + p).read()) for p in paths) // len(paths))
PY
)
STATIC_BYTES=$(curl -sf "$BASE$STATIC" | wc -c)

# A short run first so the JIT has settled on both paths.
run_wrk warm.lua 5 "$BASE" "$WORK/warm-paths.txt" >/dev/null
run_wrk warm.lua 5 "$BASE" "$WORK/static-path.txt" >/dev/null
echo "== $(date -u '+%F %T') UTC, load average $(load_average), server on CPUs $SERVER_CPUS, wrk -t1 -c64 on CPUs $WRK_CPUS, ${SECONDS_EACH} s each"
TILES=$(run_wrk warm.lua "$SECONDS_EACH" "$BASE" "$WORK/warm-paths.txt")
BASELINE=$(run_wrk warm.lua "$SECONDS_EACH" "$BASE" "$WORK/static-path.txt")
echo "warm tiles ($COUNT URLs, mean $TILE_BYTES bytes):  $TILES"
echo "baseline, static file ($STATIC_BYTES bytes):      $BASELINE"
echo "load average after: $(load_average)"
RPS=$(echo "$TILES" | figure rps)
P99=$(echo "$TILES" | figure p99_ms)
ERRORS=$(echo "$TILES" | figure errors_4xx5xx)
VERDICT=$(awk -v r="$RPS" -v p="$P99" -v e="$ERRORS" 'BEGIN { print (r >= 15000 && p <= 20 && e == 0) ? "met" : "NOT met" }')
echo "RESULT warm: $RPS responses/s, p99 $P99 ms (goal >= 15000/s, p99 <= 20 ms): $VERDICT; static-file baseline $(echo "$BASELINE" | figure rps)/s"
