#!/usr/bin/env bash
# /healthz latency while rendering is saturated: wrk keeps render.png, statistics of large boxes and histograms
# coming on 32 connections (more than the server renders at once, so renders queue and the rest get 429), while a
# second wrk asks /healthz every 10 ms on its own connection. Prints the probe's p99 and fails above 50 ms.
#
#   tests/Mosaic.Benchmarks/load/health_under_load.sh [SECONDS] [FIELD_SIZE]     (defaults 30 4096)
#
# Builds the server (Release) into a scratch folder under /tmp, writes a synthetic field there, starts the server on
# a free loopback port and stops it and removes the folder on exit; every step has a time limit.
set -euo pipefail

DURATION=${1:-30}
SIZE=${2:-4096}
WORK=$(mktemp -d /tmp/mosaic-health-load-XXXXXX)
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
export LOAD_DIR="$HERE"
cleanup() { stop_server; rm -rf "$WORK"; }
trap cleanup EXIT

require_tools
build_server
make_field "$SIZE"
echo "== starting the server"
start_server
echo "   machine load before: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores (p99 figures mean little when it is far above the core count)"

echo "== ${DURATION}s of render-heavy load, /healthz probed every 10 ms"
timeout $((DURATION + 60)) wrk -t1 -c32 -d"${DURATION}s" --timeout 30s -s "$HERE/render_heavy.lua" "$BASE" -- "$SIZE" >"$WORK/render.out" 2>&1 &
RENDER_PID=$!
sleep 3 # let the renders pile up first
timeout $((DURATION + 60)) wrk -t1 -c1 -d"$((DURATION - 5))s" --timeout 10s -s "$HERE/health_probe.lua" "$BASE" >"$WORK/health.out" 2>&1
wait $RENDER_PID || true

echo "-- render-heavy load (statuses, wrk socket errors)"
grep -E '^(status|errors|requests|latency_ms)' "$WORK/render.out"
echo "-- /healthz probe"
grep -E '^(status|errors|requests|latency_ms)' "$WORK/health.out"
P99=$(awk '$1 == "latency_ms" { print $5 }' "$WORK/health.out")
echo "-- server peak RSS: $(peak_rss_mib) MiB; machine load after: $(loadavg)"
RENDERED=$(awk '$1 == "status" && $2 == 200 { print $3 }' "$WORK/render.out")
echo "healthz p99 ${P99} ms with ${RENDERED:-0} expensive requests answered 200 in ${DURATION}s"
awk -v p="$P99" 'BEGIN { exit !(p != "" && p < 50) }' || { echo "FAIL: /healthz p99 ${P99} ms is over 50 ms" >&2; exit 1; }
grep -qE '^status 200 ' "$WORK/health.out" && ! grep -E '^status ' "$WORK/health.out" | grep -vq '^status 200 ' \
    || { echo "FAIL: /healthz answered other than 200" >&2; exit 1; }
echo "PASS"
