#!/usr/bin/env bash
# First screen in a browser: headless Chromium (Debian's) opens a link to the default demo field's whole-field
# canvas on a server just started (pyramids built, tile cache empty) and the time from navigation start to every
# tile on screen loaded is read in the page (first_screen_browser.mjs). Also: the same link again (tiles in the
# server's cache), and the baseline in the same run: a bare page of the same tile URLs as <img> elements.
#
#   tests/Mosaic.Benchmarks/load/browser.sh [RUNS]        (default 3; each run starts a new server)
#
# Goal (issue 8): the first screen complete within 1.5 s of opening the link.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
RUNS=${1:-3}
need chromium node taskset dotnet "$PY"
trap stop_server EXIT

build_server
DATA=$(demo_data default)
echo "== $(date -u '+%F %T') UTC, load average $(load_average), server on CPUs $SERVER_CPUS, Chromium unpinned, 1280 x 800"
COLD=()
for run in $(seq "$RUNS"); do
    serve_field "$DATA" "$WORK/cache-default" demo 900
    # A shared link: the red band's whole field, centred, at a quarter of full resolution.
    LINK="$BASE/?field=demo&band=red&hdu=canvas&x=4220.5&y=4142.5&z=4"
    OUT=$(node --experimental-websocket "$LOAD/first_screen_browser.mjs" "$LINK")
    echo "$OUT" | sed "s/^/run $run: /"
    COLD+=("$(echo "$OUT" | grep link_server_cache_cold | figure ms)")
    stop_server
done
echo "load average after: $(load_average)"
MEDIAN=$(printf '%s\n' "${COLD[@]}" | sort -n | awk '{ a[NR] = $1 } END { print a[int((NR + 1) / 2)] }')
echo "RESULT browser: first screen of a link on a fresh server, median $MEDIAN ms of $RUNS (goal <= 1500 ms): $(awk -v m="$MEDIAN" 'BEGIN { print (m <= 1500) ? "met" : "NOT met" }')"
