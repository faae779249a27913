#!/usr/bin/env bash
# Cold tiles at steady state, builds or settings compared: for each round, each variant in turn gets a fresh server
# on the default demo field, runs until the runtime has settled (settle), then 10 s of a new display every request
# and 10 s of a new display every 16 tiles. Prints rate, server CPU per response, p99 and the server's peak RSS.
# A variant is NAME|BUILD_FOLDER|SERVER_ARGUMENTS|ENVIRONMENT (the last three may be empty; an empty folder is the
# script's own Release build), e.g.
#
#   tests/Mosaic.Benchmarks/load/cold_ab.sh 2 'capped|||' 'uncapped||--heap-limit-mb 0|' \
#       'old|/tmp/old-bin||' 'nopgo|||DOTNET_TieredPGO=0'
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
ROUNDS=$1
shift
need wrk taskset dotnet "$PY"
trap stop_server EXIT
build_server
DATA=$(demo_data default)
OWN_BIN=$BIN
echo "== $(date -u '+%F %T') UTC, load average $(load_average)"
for round in $(seq "$ROUNDS"); do
    for variant in "$@"; do
        IFS='|' read -r name folder arguments environment <<<"$variant"
        BIN=${folder:-$OWN_BIN} MOSAIC_SERVER_ARGS=$arguments MOSAIC_SERVER_ENV=$environment \
            serve_field "$DATA" "$WORK/cache-ab" demo 900
        $PY "$LOAD/tile_urls.py" --native --limits "$BASE" demo 384 >"$WORK/cold-paths.tsv"
        settle cold.lua "$BASE" "$WORK/cold-paths.tsv" 1 2>/dev/null
        for per in 1 16; do
            line=$(run_wrk cold.lua 10 "$BASE" "$WORK/cold-paths.tsv" "$per")
            echo "round $round $name, new display every $per: $(echo "$line" | figure rps)/s," \
                "$(echo "$line" | figure server_cpu_us_per_response) us a response, p99 $(echo "$line" | figure p99_ms) ms," \
                "peak RSS $(peak_rss_mib) MiB, errors $(echo "$line" | figure errors_4xx5xx)"
        done
        stop_server
        rm -rf "$WORK/cache-ab"
    done
done
