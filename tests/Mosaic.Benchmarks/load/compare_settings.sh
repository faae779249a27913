#!/usr/bin/env bash
# Runtime settings compared on warm (or cold) tiles: one server per variant on the default demo field, all
# started together, then wrk runs taking the variants in turn for several rounds, so each sees the same machine.
# A variant is NAME or NAME=VAR=VALUE,VAR=VALUE (environment of that server), e.g.
#
#   tests/Mosaic.Benchmarks/load/compare_settings.sh warm 5 4 default workstation=DOTNET_gcServer=0 \
#       nopgo=DOTNET_TieredPGO=0
#
# (MODE warm|cold, SECONDS per run, ROUNDS, VARIANTS...). Prints every run and each variant's median rate and
# median server CPU per response.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
MODE=$1 SECONDS_EACH=$2 ROUNDS=$3
shift 3
need wrk taskset dotnet "$PY"
build_server
DATA=$(demo_data default)
declare -A PIDS PORTS
cleanup() { for name in "${!PIDS[@]}"; do kill "${PIDS[$name]}" 2>/dev/null || true; done; }
trap cleanup EXIT
NAMES=()
for variant in "$@"; do
    name=${variant%%=*}
    settings=""
    [ "$name" != "$variant" ] && settings=${variant#*=}
    port=$(free_port)
    MOSAIC_SERVER_ENV=${settings//,/ } start_server "$port" "$DATA" "$WORK/cache-default"
    PIDS[$name]=$SERVER_PID PORTS[$name]=$port
    NAMES+=("$name")
done
for name in "${NAMES[@]}"; do
    base="http://127.0.0.1:${PORTS[$name]}"
    wait_ready "$base" demo 900
    if [ "$MODE" = warm ]; then
        [ -f "$WORK/compare-warm.txt" ] || $PY "$LOAD/tile_urls.py" "$base" demo 300 >"$WORK/compare-warm.txt"
        warm_up "$base" "$WORK/compare-warm.txt"
    else
        [ -f "$WORK/compare-cold.tsv" ] || $PY "$LOAD/tile_urls.py" --native --limits "$base" demo 384 >"$WORK/compare-cold.tsv"
    fi
done
run_mode() {
    if [ "$MODE" = warm ]; then run_wrk warm.lua "$1" "$2" "$WORK/compare-warm.txt"
    else run_wrk cold.lua "$1" "$2" "$WORK/compare-cold.tsv" 16; fi
}
for name in "${NAMES[@]}"; do SERVER_PID=${PIDS[$name]} run_mode 10 "http://127.0.0.1:${PORTS[$name]}" >/dev/null; done
echo "== $(date -u '+%F %T') UTC, load average $(load_average), $MODE tiles, $ROUNDS rounds of ${SECONDS_EACH} s"
for round in $(seq "$ROUNDS"); do
    for name in "${NAMES[@]}"; do
        line=$(SERVER_PID=${PIDS[$name]} run_mode "$SECONDS_EACH" "http://127.0.0.1:${PORTS[$name]}")
        echo "round $round $name $line" | tee -a "$WORK/compare-runs.txt"
    done
done
median_of() { sed -n "s/.* $1=\([^ ]*\).*/\1/p" | sort -n | awk '{ a[NR] = $1 } END { print a[int((NR + 1) / 2)] }'; }
for name in "${NAMES[@]}"; do
    runs=$(grep "^round [0-9]* $name FIGURE" "$WORK/compare-runs.txt" | tail -n "$ROUNDS")
    echo "MEDIAN $name rps=$(echo "$runs" | median_of rps) p99_ms=$(echo "$runs" | median_of p99_ms) server_cpu_us_per_response=$(echo "$runs" | median_of server_cpu_us_per_response)"
done
echo "load average after: $(load_average)"
