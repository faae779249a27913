#!/usr/bin/env bash
# /healthz latency while rendering is saturated: wrk keeps render.png, statistics of large boxes and histograms
# coming on 32 connections (more than the server renders at once, so renders queue and the rest get 429), while a
# second wrk asks /healthz every 10 ms on its own connection. Prints the probe's p99 and fails above 50 ms.
#
#   tests/Mosaic.Benchmarks/load/health_under_load.sh [SECONDS] [FIELD_SIZE]     (defaults 30 4096)
#
# Builds the server (Release) into $MOSAIC_LOAD_WORK/bin like the other load scripts (lib.sh; MOSAIC_LOAD_BUILD=0
# reuses it), writes a synthetic field into a scratch folder under /tmp, starts the server on a free loopback port,
# and stops it and removes the folder on exit; every step has a time limit.
set -euo pipefail

DURATION=${1:-30}
SIZE=${2:-4096}
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
SCRATCH=$(mktemp -d /tmp/mosaic-health-load-XXXXXX)
export LOAD_DIR="$LOAD"
cleanup() { stop_server; rm -rf "$SCRATCH"; }
trap cleanup EXIT

need dotnet wrk curl taskset "$PY"
need_python_packages
build_server
serve_sky_field "$SIZE"

echo "== ${DURATION}s of render-heavy load, /healthz probed every 10 ms"
timeout $((DURATION + 60)) wrk -t1 -c32 -d"${DURATION}s" --timeout 30s -s "$LOAD/render_heavy.lua" "$BASE" -- "$SIZE" >"$SCRATCH/render.out" 2>&1 &
RENDER_PID=$!
sleep 3 # let the renders pile up first
timeout $((DURATION + 60)) wrk -t1 -c1 -d"$((DURATION - 5))s" --timeout 10s -s "$LOAD/health_probe.lua" "$BASE" >"$SCRATCH/health.out" 2>&1
wait $RENDER_PID || true

echo "-- render-heavy load (statuses, wrk socket errors)"
grep -E '^(status|errors|requests|latency_ms)' "$SCRATCH/render.out"
echo "-- /healthz probe"
grep -E '^(status|errors|requests|latency_ms)' "$SCRATCH/health.out"
P99=$(awk '$1 == "latency_ms" { print $5 }' "$SCRATCH/health.out")
echo "-- server peak RSS: $(peak_rss_mib) MiB, now $(rss_parts); machine load after: $(load_average)"
RENDERED=$(awk '$1 == "status" && $2 == 200 { print $3 }' "$SCRATCH/render.out")
echo "healthz p99 ${P99} ms with ${RENDERED:-0} expensive requests answered 200 in ${DURATION}s"
awk -v p="$P99" 'BEGIN { exit !(p != "" && p < 50) }' || { echo "FAIL: /healthz p99 ${P99} ms is over 50 ms" >&2; exit 1; }
grep -qE '^status 200 ' "$SCRATCH/health.out" && ! grep -E '^status ' "$SCRATCH/health.out" | grep -vq '^status 200 ' \
    || { echo "FAIL: /healthz answered other than 200" >&2; exit 1; }
echo "PASS"
