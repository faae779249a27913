#!/usr/bin/env bash
# 500 concurrent connections of mixed requests for 60 s on loopback (see mixed.lua for the mix) against a server this
# script starts and stops itself. Passes when every answer is 200, 304 or 429, wrk reports no connect, read or write
# errors, and the server's peak RSS stays within 400 MB (381 MiB). wrk's "timeout" count is printed apart: those
# are requests still unanswered after --timeout (10 s), which under overload means queued behind others, not refused.
#
#   tests/Mosaic.Benchmarks/load/mixed_load.sh [SECONDS] [CONNECTIONS] [FIELD_SIZE]     (defaults 60 500 4096)
#
# Builds the server (Release) into $MOSAIC_LOAD_WORK/bin like the other load scripts (lib.sh; MOSAIC_LOAD_BUILD=0
# reuses it), writes a synthetic field into a scratch folder under /tmp and removes that folder on exit; every step
# has a time limit.
set -euo pipefail

DURATION=${1:-60}
CONNECTIONS=${2:-500}
SIZE=${3:-4096}
RSS_BOUND_MIB=381 # issue 8 and 9: 400 MB = 381 MiB
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
SCRATCH=$(mktemp -d /tmp/mosaic-mixed-load-XXXXXX)
export LOAD_DIR="$LOAD"
cleanup() { stop_server; rm -rf "$SCRATCH"; }
trap cleanup EXIT

need dotnet wrk curl taskset "$PY"
need_python_packages
build_server
serve_sky_field "$SIZE"
ETAG=$(curl -sf -D - -o /dev/null "$BASE/tiles/sky/0/0/0.png?v=$VERSION" | awk 'tolower($1) == "etag:" { print $2 }' | tr -d '\r')
[ -n "$ETAG" ] || { echo "load: no ETag on tile 0/0/0" >&2; exit 1; }
echo "   before load: RSS peak $(peak_rss_mib) MiB"

# Enough open files for 500 sockets on each side.
ulimit -n 65536 2>/dev/null || ulimit -n 4096
echo "== ${DURATION}s, ${CONNECTIONS} connections, 2 wrk threads"
timeout $((DURATION + 120)) wrk -t2 -c"$CONNECTIONS" -d"${DURATION}s" --timeout 10s -s "$LOAD/mixed.lua" "$BASE" -- "$SIZE" "$VERSION" "$ETAG" \
    >"$SCRATCH/mixed.out" 2>&1 || { cat "$SCRATCH/mixed.out" >&2; exit 1; }
PEAK=$(peak_rss_mib)
curl -sf "$BASE/healthz" >/dev/null || { echo "FAIL: the server does not answer after the load" >&2; exit 1; }

echo "-- answers by status"
grep -E '^status ' "$SCRATCH/mixed.out"
grep -E '^(errors|requests|latency_ms)' "$SCRATCH/mixed.out"
echo "-- server peak RSS: ${PEAK} MiB (bound ${RSS_BOUND_MIB} MiB), now $(rss_parts); machine load after: $(load_average)"
FIVES=$(grep -c "^fail:" "$SERVER_LOG" || true)
echo "-- server log errors (fail:): ${FIVES}"

FAILED=0
BAD=$(awk '$1 == "status" && $2 != 200 && $2 != 304 && $2 != 429 { print $2 " x" $3 }' "$SCRATCH/mixed.out")
[ -z "$BAD" ] || { echo "FAIL: answers other than 200/304/429: $BAD" >&2; FAILED=1; }
read -r _ _ CONNECT _ READ _ WRITE _ TIMEOUT < <(grep '^errors ' "$SCRATCH/mixed.out")
[ "$CONNECT" = 0 ] && [ "$READ" = 0 ] && [ "$WRITE" = 0 ] || { echo "FAIL: socket errors connect $CONNECT read $READ write $WRITE" >&2; FAILED=1; }
[ "$PEAK" -le "$RSS_BOUND_MIB" ] || { echo "FAIL: peak RSS ${PEAK} MiB is over ${RSS_BOUND_MIB} MiB" >&2; FAILED=1; }
echo "timeouts (unanswered after 10 s): $TIMEOUT"
[ $FAILED = 0 ] && echo "PASS"
exit $FAILED
