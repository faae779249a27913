# Shared by the load scripts (sourced, not run). Everything goes under $MOSAIC_LOAD_WORK (default /tmp/mosaic-load):
# the Release build of the server, generated data, pyramid caches and logs; the scripts reuse what is already there.
#
# How the two cores are shared (override with the variables): wrk runs with one thread on CPU 0
# (MOSAIC_WRK_CPUS=0); the server may use both (MOSAIC_SERVER_CPUS=0,1), so the two compete for CPU 0 as a client
# and server on one machine do.

REPO=$(cd "$(dirname "${BASH_SOURCE[0]}")/../../.." && pwd)
LOAD="$REPO/tests/Mosaic.Benchmarks/load"
PY=/usr/bin/python3
WORK=${MOSAIC_LOAD_WORK:-/tmp/mosaic-load}
BIN="$WORK/bin"
SERVER_CPUS=${MOSAIC_SERVER_CPUS:-0,1}
WRK_CPUS=${MOSAIC_WRK_CPUS:-0}
SERVER_PID=""
mkdir -p "$WORK"

need() {
    local tool
    for tool in "$@"; do
        command -v "$tool" >/dev/null || { echo "load: $tool is missing (Debian: apt-get install ${tool##*/})" >&2; exit 2; }
    done
}

need_python_packages() {
    $PY -c "import numpy, astropy, PIL" 2>/dev/null \
        || { echo "load: $PY lacks numpy/astropy/Pillow (apt-get install python3-numpy python3-astropy python3-pil)" >&2; exit 2; }
}

# Builds the server in Release into $BIN unless MOSAIC_LOAD_BUILD=0 and a build is already there.
build_server() {
    if [ "${MOSAIC_LOAD_BUILD:-1}" = 0 ] && [ -f "$BIN/Mosaic.Server.dll" ]; then return; fi
    echo "== building the server (Release) into $BIN"
    # Into a fresh folder, then swapped in: a server still running from $BIN keeps its (unlinked) files.
    rm -rf "$BIN.new"
    dotnet build "$REPO/server/Mosaic.Server/Mosaic.Server.csproj" -c Release -nologo -v q -o "$BIN.new" >"$WORK/build.log" 2>&1 \
        || { tail -20 "$WORK/build.log" >&2; exit 1; }
    rm -rf "$BIN.old"
    if [ -d "$BIN" ]; then mv "$BIN" "$BIN.old"; fi
    mv "$BIN.new" "$BIN"
}

# The synthetic demo field of a preset (small, default, large) under $WORK/PRESET/demo.
demo_data() {
    local preset=$1 folder="$WORK/$1"
    if [ ! -f "$folder/.done" ]; then
        echo "== generating the $preset demo field into $folder" >&2
        rm -rf "$folder"
        dotnet "$BIN/Mosaic.Server.dll" generate-demo --out "$folder/demo" --preset "$preset" >"$WORK/generate-$preset.log" 2>&1 \
            || { tail -5 "$WORK/generate-$preset.log" >&2; exit 1; }
        touch "$folder/.done"
    fi
    echo "$folder"
}

free_port() { $PY -c "import socket; s=socket.socket(); s.bind(('127.0.0.1',0)); print(s.getsockname()[1])"; }

# start_server PORT DATA CACHE [more server arguments]: sets SERVER_PID; the log is $WORK/server-PORT.log.
# The framework's per-request logs stay at their default (off); MOSAIC_SERVER_ENV adds environment variables.
start_server() {
    local port=$1 data=$2 cache=$3
    shift 3
    # shellcheck disable=SC2086
    # The content root is the project folder, whose wwwroot/ the build fills with the client.
    env ${MOSAIC_SERVER_ENV:-} taskset -c "$SERVER_CPUS" dotnet "$BIN/Mosaic.Server.dll" --contentRoot "$REPO/server/Mosaic.Server" \
        --data "$data" --cache "$cache" --state "$WORK/state-$port" --urls "http://127.0.0.1:$port" "$@" >"$WORK/server-$port.log" 2>&1 &
    SERVER_PID=$!
}

stop_server() {
    if [ -n "$SERVER_PID" ]; then
        kill "$SERVER_PID" 2>/dev/null || true
        wait "$SERVER_PID" 2>/dev/null || true
        SERVER_PID=""
    fi
}

# wait_ready BASE FIELD SECONDS: until every pyramid of the field (chips and canvases) is ready.
wait_ready() {
    $PY - "$@" <<'PY'
import json, sys, time, urllib.request
base, field, limit = sys.argv[1], sys.argv[2], float(sys.argv[3])
deadline = time.monotonic() + limit
def states(x):
    if isinstance(x, dict):
        for k, v in x.items():
            if k == "pyramid" and isinstance(v, dict) and "state" in v: yield v["state"]
            else: yield from states(v)
    elif isinstance(x, list):
        for v in x: yield from states(v)
while True:
    try:
        with urllib.request.urlopen(f"{base}/api/fields/{field}", timeout=5) as r:
            found = list(states(json.load(r)))
        if found and all(s == "ready" for s in found): break
        if any(s == "failed" for s in found): sys.exit(f"load: a pyramid of {field} failed")
    except OSError:
        pass
    if time.monotonic() > deadline: sys.exit(f"load: {field} not ready after {limit} s")
    time.sleep(0.2)
PY
}

# warm_up BASE PATHFILE: asks for every path once (two at a time) so the tiles are in the server's cache.
warm_up() {
    $PY - "$@" <<'PY'
import sys, urllib.request
from concurrent.futures import ThreadPoolExecutor
base, paths = sys.argv[1], [l.split("\t")[0] for l in open(sys.argv[2]) if l.strip()]
def get(path):
    with urllib.request.urlopen(base + path, timeout=60) as r:
        r.read()
        return r.status
bad = [s for s in ThreadPoolExecutor(2).map(get, paths) if s != 200]
if bad: sys.exit(f"load: {len(bad)} of {len(paths)} tiles did not answer 200")
PY
}

load_average() { cut -d' ' -f1-3 /proc/loadavg; }

# CPU time (user + system, all threads) the server has used so far, in clock ticks.
server_ticks() { awk '{ print $14 + $15 }' "/proc/$SERVER_PID/stat"; }

# run_wrk LUA SECONDS BASE [script arguments]: prints wrk's FIGURE line, plus the server's CPU time per response
# (less sensitive than the rate to what else the machine runs, so changes can be compared on a busy machine).
run_wrk() {
    local lua=$1 seconds=$2 base=$3 before after line requests
    shift 3
    before=$(server_ticks)
    line=$(taskset -c "$WRK_CPUS" wrk -t1 -c64 -d"${seconds}s" --latency -s "$LOAD/$lua" "$base" -- "$@" | grep '^FIGURE')
    after=$(server_ticks)
    requests=$(echo "$line" | figure requests)
    echo "$line server_cpu_us_per_response=$(awk -v a="$after" -v b="$before" -v n="$requests" -v hz="$(getconf CLK_TCK)" \
        'BEGIN { printf "%.1f", (n > 0) ? (a - b) * 1e6 / hz / n : 0 }')"
}

figure() { sed -n "s/.* $1=\([^ ]*\).*/\1/p"; }
