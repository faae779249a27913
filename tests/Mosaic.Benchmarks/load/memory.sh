#!/usr/bin/env bash
# Server memory under load: peak resident set (VmHWM in /proc/PID/status, sampled with VmRSS every 0.5 s) of a
# server with default cache settings on the large demo field (3 bands x 16 chips of 8192 x 8192 float32, about
# 13 GB, with three whole-field canvases of 1.1 Gpx), while wrk asks for warm tiles over thousands of distinct
# URLs (more than the memory tier holds) and then for cold tiles with new displays. Baseline in the same run: the
# same load on the default demo field (805 MB), so what grows with the data shows as the difference.
# The pyramids are built before the measured start (a first server run, not counted), so the figure is serving.
#
#   tests/Mosaic.Benchmarks/load/memory.sh [SECONDS] [URLS]       (defaults 20 and 4000)
#
# Goal (issue 8): at most 400 MB whatever the data size.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
SECONDS_EACH=${1:-20}
COUNT=${2:-4000}
need wrk taskset dotnet "$PY"
trap stop_server EXIT

build_server

# measure PRESET: prints "peak_mib rss_after_mib idle_mib" for a server on that preset under the load.
measure() {
    local preset=$1 data port base sampler
    data=$(demo_data "$preset")
    port=$(free_port)
    base="http://127.0.0.1:$port"
    # Pyramids first (not measured): a server that builds them, stopped when they are ready.
    if [ ! -f "$WORK/cache-$preset/.ready" ]; then
        echo "== building the $preset field's pyramids (not measured)" >&2
        start_server "$port" "$data" "$WORK/cache-$preset"
        wait_ready "$base" demo 7200
        stop_server
        touch "$WORK/cache-$preset/.ready"
    fi
    start_server "$port" "$data" "$WORK/cache-$preset"
    wait_ready "$base" demo 600
    local idle
    idle=$(awk '$1 == "VmRSS:" { print int($2 / 1024) }' "/proc/$SERVER_PID/status")
    $PY "$LOAD/tile_urls.py" "$base" demo "$COUNT" >"$WORK/memory-$preset-warm.txt"
    $PY "$LOAD/tile_urls.py" --native --limits "$base" demo 384 >"$WORK/memory-$preset-cold.tsv"
    ( while kill -0 "$SERVER_PID" 2>/dev/null; do
          awk '$1 == "VmRSS:" { print int($2 / 1024) }' "/proc/$SERVER_PID/status" 2>/dev/null
          sleep 0.5
      done >"$WORK/memory-$preset-rss.txt" ) &
    sampler=$!
    # The first pass over the URLs renders them all (the memory tier fills and evicts), the rest is wrk's cycling.
    run_wrk warm.lua "$SECONDS_EACH" "$base" "$WORK/memory-$preset-warm.txt" >"$WORK/memory-$preset-wrk.txt"
    run_wrk cold.lua "$SECONDS_EACH" "$base" "$WORK/memory-$preset-cold.tsv" 16 >>"$WORK/memory-$preset-wrk.txt"
    local peak after
    echo "$preset field: $(grep -o 'GC heap limit.*' "$SERVER_LOG" || echo 'no GC heap limit line in the log'); after the load $(rss_parts)" >&2
    peak=$(awk '$1 == "VmHWM:" { print int($2 / 1024) }' "/proc/$SERVER_PID/status")
    after=$(awk '$1 == "VmRSS:" { print int($2 / 1024) }' "/proc/$SERVER_PID/status")
    stop_server
    kill "$sampler" 2>/dev/null || true
    wait "$sampler" 2>/dev/null || true
    echo "$peak $after $idle $(sort -n "$WORK/memory-$preset-rss.txt" | tail -1) $(du -sh "$data" | cut -f1)"
}

echo "== $(date -u '+%F %T') UTC, load average $(load_average), server on CPUs $SERVER_CPUS, wrk -t1 -c64 on CPUs $WRK_CPUS, ${SECONDS_EACH} s warm + ${SECONDS_EACH} s cold"
read -r LARGE_PEAK LARGE_AFTER LARGE_IDLE LARGE_SAMPLED LARGE_SIZE < <(measure large)
sed 's/^/large field, /' "$WORK/memory-large-wrk.txt"
read -r BASE_PEAK BASE_AFTER BASE_IDLE BASE_SAMPLED BASE_SIZE < <(measure default)
sed 's/^/default field, /' "$WORK/memory-default-wrk.txt"
echo "large field ($LARGE_SIZE of FITS): idle $LARGE_IDLE MiB, peak (VmHWM) $LARGE_PEAK MiB, largest sample $LARGE_SAMPLED MiB, after $LARGE_AFTER MiB"
echo "baseline, default field ($BASE_SIZE): idle $BASE_IDLE MiB, peak (VmHWM) $BASE_PEAK MiB, largest sample $BASE_SAMPLED MiB, after $BASE_AFTER MiB"
echo "load average after: $(load_average)"
echo "RESULT memory: peak RSS $LARGE_PEAK MiB on the large field (goal <= 400 MB = 381 MiB): $(awk -v p="$LARGE_PEAK" 'BEGIN { print (p * 1048576 <= 400e6) ? "met" : "NOT met" }'); default field $BASE_PEAK MiB"
