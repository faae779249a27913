#!/usr/bin/env bash
# Start to first screen: from launching the server on a new 1 GiB frame (16384 x 16384 float32, made once by
# ingest/make_fits.py; the file is in the page cache, the pyramid cache empty) until every tile of the first screen
# (the whole frame fitted to 1280 x 800, see first_screen.py) has answered 200. Three launches; the median decides.
# Baselines in the same run: reading the file once (cat, page cache) and numpy + astropy + Pillow making the same
# screen from the file.
#
#   tests/Mosaic.Benchmarks/load/startup.sh [RUNS]        (default 3)
#
# Goal (issue 8): at most 3 s.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
RUNS=${1:-3}
need taskset dotnet "$PY"
need_python_packages

build_server
FRAME_DIR="$WORK/frame"
if [ ! -f "$FRAME_DIR/.done" ]; then
    echo "== writing the 1 GiB frame"
    rm -rf "$FRAME_DIR" && mkdir -p "$FRAME_DIR"
    $PY "$REPO/tests/Mosaic.Benchmarks/ingest/make_fits.py" frame "$FRAME_DIR/frame.fits" 16384
    touch "$FRAME_DIR/.done"
fi
cat "$FRAME_DIR/frame.fits" >/dev/null  # into the page cache, as a file just written would be

echo "== $(date -u '+%F %T') UTC, load average $(load_average), server on CPUs $SERVER_CPUS"
TIMES=()
for run in $(seq "$RUNS"); do
    line=$($PY "$LOAD/first_screen.py" "$BIN/Mosaic.Server.dll" "$REPO/server/Mosaic.Server" "$FRAME_DIR" \
        "$WORK/cache-frame" frame "$(free_port)" "$SERVER_CPUS")
    echo "start to first screen, run $run: $line"
    TIMES+=("$(echo "$line" | figure seconds)")
done
READ=$( { /usr/bin/time -f "%e" cat "$FRAME_DIR/frame.fits" >/dev/null; } 2>&1 )
BASELINE=$($PY "$LOAD/first_screen.py" --baseline "$FRAME_DIR/frame.fits" 16384 16384 6)
echo "baseline, reading the file once (cat): ${READ} s"
echo "baseline, numpy + astropy + Pillow making the same screen: $BASELINE"
echo "load average after: $(load_average)"
MEDIAN=$(printf '%s\n' "${TIMES[@]}" | sort -n | awk '{ a[NR] = $1 } END { print a[int((NR + 1) / 2)] }')
BEST=$(printf '%s\n' "${TIMES[@]}" | sort -n | head -1)
echo "RESULT startup: median $MEDIAN s, best $BEST s of $RUNS (goal <= 3 s): $(awk -v m="$MEDIAN" 'BEGIN { print (m <= 3) ? "met" : "NOT met" }'); baselines: read ${READ} s, numpy + astropy + Pillow $(echo "$BASELINE" | figure seconds) s"
rm -rf "$WORK/cache-frame" "$WORK/cache-frame-state"
