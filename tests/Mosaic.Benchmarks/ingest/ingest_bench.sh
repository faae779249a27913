#!/usr/bin/env bash
# Ingest benchmark: the time to ingest a 1 GiB float32 frame and a 16-chip field, against reading the same bytes
# once from the page cache and against libvips `dzsave` making 8-bit tiles of the same frame; peak memory of the
# ingest command, of the server building the same pyramids itself, and of the server afterwards.
#
#   tests/Mosaic.Benchmarks/ingest/ingest_bench.sh [FRAME_SIZE] [CHIPS] [CHIP_SIZE]     (defaults 16384 16 4096)
#
# Needs Debian's /usr/bin/python3 with python3-astropy and python3-numpy, libvips-tools (vips), GNU time, curl.
# Everything it writes goes under one /tmp folder, removed on exit; every step has a time limit.
set -euo pipefail

FRAME_SIZE=${1:-16384}
CHIPS=${2:-16}
CHIP_SIZE=${3:-4096}
REPO=$(cd "$(dirname "${BASH_SOURCE[0]}")/../../.." && pwd)
HERE="$REPO/tests/Mosaic.Benchmarks/ingest"
STEP_LIMIT=600
PORT=$((20000 + RANDOM % 20000))

for tool in /usr/bin/python3 /usr/bin/time vips curl dotnet; do
    command -v "$tool" >/dev/null || { echo "ingest_bench: $tool is missing" >&2; exit 2; }
done
/usr/bin/python3 -c "import astropy, numpy" 2>/dev/null || { echo "ingest_bench: /usr/bin/python3 lacks astropy/numpy (apt-get install python3-astropy python3-numpy)" >&2; exit 2; }

WORK=$(mktemp -d /tmp/mosaic-ingest-bench-XXXXXX)
SERVER_PID=""
cleanup() {
    [ -n "$SERVER_PID" ] && kill "$SERVER_PID" 2>/dev/null && wait "$SERVER_PID" 2>/dev/null
    rm -rf "$WORK"
}
trap cleanup EXIT

echo "== building the server (Release)"
timeout $STEP_LIMIT dotnet build "$REPO/server/Mosaic.Server/Mosaic.Server.csproj" -c Release -nologo -v q -o "$WORK/bin" >"$WORK/build.log" 2>&1 \
    || { tail -20 "$WORK/build.log" >&2; exit 1; }
SERVER="$WORK/bin/Mosaic.Server.dll"

echo "== writing the synthetic data"
mkdir -p "$WORK/frame" "$WORK/field"
timeout $STEP_LIMIT /usr/bin/python3 "$HERE/make_fits.py" frame "$WORK/frame/frame.fits" "$FRAME_SIZE"
timeout $STEP_LIMIT /usr/bin/python3 "$HERE/make_fits.py" field "$WORK/field/field.fits" "$CHIPS" "$CHIP_SIZE"

# Seconds, best of three, for a command (output discarded).
best_of_3() {
    local best="" t log="$WORK/best.$RANDOM"
    for _ in 1 2 3; do
        /usr/bin/time -o "$log" -f "%e" timeout $STEP_LIMIT "$@" >/dev/null
        t=$(tail -1 "$log")
        best=$(awk -v a="$t" -v b="$best" 'BEGIN { print (b == "" || a < b) ? a : b }')
    done
    echo "$best"
}

# Runs a command under GNU time; prints "seconds peak_kib".
timed() {
    local log="$WORK/time.$RANDOM"
    /usr/bin/time -o "$log" -f "%e %M" timeout $STEP_LIMIT "$@" >"$WORK/last.out" 2>&1 || { cat "$WORK/last.out" >&2; return 1; }
    cat "$log"
}

status_kib() { awk -v k="$2:" '$1 == k { print $2 }' "/proc/$1/status"; }

# Starts the server on a data and cache folder, waits until every pyramid of every field is ready and prints
# "seconds_until_ready peak_kib_then rss_kib_after_tiles peak_kib_after_tiles".
serve_and_measure() {
    local data=$1 cache=$2 field=$3 start now
    start=$(date +%s.%N)
    dotnet "$SERVER" --data "$data" --cache "$cache" --urls "http://127.0.0.1:$PORT" >"$WORK/server.log" 2>&1 &
    SERVER_PID=$!
    local deadline=$((SECONDS + STEP_LIMIT))
    until curl -sf "http://127.0.0.1:$PORT/api/fields/$field" -o "$WORK/field.json" \
          && /usr/bin/python3 - "$WORK/field.json" <<'PY'
import json, sys
def states(x):
    if isinstance(x, dict):
        for k, v in x.items():
            if k == "pyramid" and isinstance(v, dict) and "state" in v: yield v["state"]
            else: yield from states(v)
    elif isinstance(x, list):
        for v in x: yield from states(v)
s = list(states(json.load(open(sys.argv[1]))))
sys.exit(0 if s and all(v == "ready" for v in s) else 1)
PY
    do
        [ $SECONDS -lt $deadline ] || { echo "server did not get ready" >&2; tail "$WORK/server.log" >&2; return 1; }
        sleep 0.2
    done
    now=$(date +%s.%N)
    local ready_peak
    ready_peak=$(status_kib "$SERVER_PID" VmHWM)
    # A viewer's first screens: the top levels and a native-resolution patch, then the field statistics.
    local z x y
    for z in 0 1 2 3; do for x in 0 1; do for y in 0 1; do
        curl -s -o /dev/null "http://127.0.0.1:$PORT/api/fields/$field/$z/$x/$y.png" || true
    done; done; done
    curl -s -o /dev/null "http://127.0.0.1:$PORT/api/fields/$field/stats" || true
    sleep 1
    echo "$(awk -v a="$start" -v b="$now" 'BEGIN { printf "%.2f", b - a }') $ready_peak $(status_kib "$SERVER_PID" VmRSS) $(status_kib "$SERVER_PID" VmHWM)"
    kill "$SERVER_PID"; wait "$SERVER_PID" 2>/dev/null || true
    SERVER_PID=""
}

row() { printf "| %-42s | %8s | %8s | %s\n" "$1" "$2" "$3" "$4"; }
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.2fx", a / b }'; }
mib() { awk -v k="$1" 'BEGIN { printf "%.0f MiB", k / 1024 }'; }

declare -a TABLE
for kind in frame field; do
    file="$WORK/$kind/$kind.fits"
    bytes=$(stat -c %s "$file")
    cat "$file" >/dev/null                      # warm-up: the file is in the page cache from here on
    read_s=$(best_of_3 cat "$file")
    echo "== $kind: $((bytes / 1048576)) MiB, cat from the page cache ${read_s} s"

    read -r ingest_s ingest_kib < <(timed dotnet "$SERVER" ingest --data "$WORK/$kind" --cache "$WORK/cache-$kind")
    built_line=$(grep -E '^(Built|Nothing)' "$WORK/last.out")
    inner_s=$(sed -nE 's/.* in ([0-9.]+) s.*/\1/p' <<<"$built_line")
    echo "   $built_line"
    TABLE+=("$(row "$kind: read once from the page cache (cat)" "$read_s s" "1.00x" "")")
    TABLE+=("$(row "$kind: ingest command, whole process" "$ingest_s s" "$(ratio "$ingest_s" "$read_s")" "peak RSS $(mib "$ingest_kib")")")
    TABLE+=("$(row "$kind: ingest, building only (its summary)" "$inner_s s" "$(ratio "$inner_s" "$read_s")" "")")
    if grep -q '/CANVAS ' "$WORK/last.out"; then
        # Each "ready" line ends "in S s", that pyramid's own build time: the chips' own pyramids, and the canvas
        # (resampled from the chips). Two builds run at once, so the chips' sum can exceed their share of the run.
        chips_s=$(awk '/^ +ready / && !/\/CANVAS / { t += $(NF - 1) } END { printf "%.2f", t }' "$WORK/last.out")
        canvas_s=$(awk '/^ +ready / && /\/CANVAS / { t += $(NF - 1) } END { printf "%.2f", t }' "$WORK/last.out")
        TABLE+=("$(row "$kind: the chips' pyramids (sum of builds)" "$chips_s s" "$(ratio "$chips_s" "$read_s")" "")")
        TABLE+=("$(row "$kind: the canvas (resampling + pyramid)" "$canvas_s s" "$(ratio "$canvas_s" "$read_s")" "")")
    fi

    if [ "$kind" = frame ]; then
        for suffix in .jpeg .png; do
            rm -rf "$WORK/dz"*
            read -r vips_s vips_kib < <(timed vips dzsave "$file" "$WORK/dz" --tile-size 256 --overlap 0 --suffix "$suffix")
            TABLE+=("$(row "frame: vips dzsave, 8-bit ${suffix#.} tiles" "$vips_s s" "$(ratio "$vips_s" "$read_s")" "peak RSS $(mib "$vips_kib")")")
        done
        rm -rf "$WORK/dz"*
    fi

    read -r _ _ after_rss after_peak < <(serve_and_measure "$WORK/$kind" "$WORK/cache-$kind" "$kind")
    TABLE+=("$(row "$kind: server on the ingested cache" "-" "-" "RSS $(mib "$after_rss") after first tiles, peak $(mib "$after_peak")")")
    read -r build_s during_peak after_rss after_peak < <(serve_and_measure "$WORK/$kind" "$WORK/cache-$kind-server" "$kind")
    TABLE+=("$(row "$kind: server building it (start to ready)" "$build_s s" "$(ratio "$build_s" "$read_s")" "peak RSS $(mib "$during_peak") while building; RSS $(mib "$after_rss") after, peak $(mib "$after_peak")")")
    rm -rf "$WORK/cache-$kind" "$WORK/cache-$kind-server"
done

echo
echo "Frame ${FRAME_SIZE}x${FRAME_SIZE} float32; field ${CHIPS} chips of ${CHIP_SIZE}x${CHIP_SIZE} float32; $(nproc) cores; vips $(vips --version | cut -d' ' -f1 | cut -d- -f2)"
row "step" "time" "vs read" "memory"
row "------------------------------------------" "--------" "--------" "------"
printf "%s\n" "${TABLE[@]}"
