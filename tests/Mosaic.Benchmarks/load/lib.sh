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
BIN=${MOSAIC_LOAD_BIN:-$WORK/bin} # another build to measure (with MOSAIC_LOAD_BUILD=0), e.g. an old one beside a new
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

# start_server PORT DATA CACHE [more server arguments]: sets SERVER_PID and SERVER_LOG ($WORK/server-PORT.log).
# The framework's per-request logs stay at their default (off); MOSAIC_SERVER_ENV adds environment variables and
# MOSAIC_SERVER_ARGS server arguments (e.g. MOSAIC_SERVER_ARGS="--heap-limit-mb 0" for the GC's own heap limit).
start_server() {
    local port=$1 data=$2 cache=$3
    shift 3
    SERVER_LOG="$WORK/server-$port.log"
    # shellcheck disable=SC2086
    # The content root is the project folder, whose wwwroot/ the build fills with the client.
    env ${MOSAIC_SERVER_ENV:-} taskset -c "$SERVER_CPUS" dotnet "$BIN/Mosaic.Server.dll" --contentRoot "$REPO/server/Mosaic.Server" \
        --data "$data" --cache "$cache" --state "$WORK/state-$port" --urls "http://127.0.0.1:$port" "$@" ${MOSAIC_SERVER_ARGS:-} >"$SERVER_LOG" 2>&1 &
    SERVER_PID=$!
}

stop_server() {
    if [ -n "$SERVER_PID" ]; then
        kill "$SERVER_PID" 2>/dev/null || true
        wait "$SERVER_PID" 2>/dev/null || true
        SERVER_PID=""
    fi
}

# wait_ready BASE FIELD SECONDS: until every pyramid of the field (chips and canvases) is ready; fails at once if
# the server started by start_server exits.
wait_ready() {
    $PY - "$@" "${SERVER_PID:-0}" <<'PY'
import json, os, sys, time, urllib.request
base, field, limit, pid = sys.argv[1], sys.argv[2], float(sys.argv[3]), int(sys.argv[4])
deadline = time.monotonic() + limit
def alive():
    if pid == 0: return True
    try:
        os.kill(pid, 0)
        return True
    except OSError:
        return False
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
    if not alive(): sys.exit("load: the server exited (see its log)")
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

# make_field FILE SIZE: the synthetic SIZE x SIZE float32 field of make_field.py (astropy), unless FILE exists.
make_field() {
    local file=$1 size=$2
    [ -f "$file" ] && return
    echo "== writing the synthetic ${size} x ${size} field into $file" >&2
    mkdir -p "$(dirname "$file")"
    timeout 600 $PY "$LOAD/make_field.py" "$file.tmp" "$size" && mv "$file.tmp" "$file"
}

# band_version BASE FIELD: the version of the field's first band (tile URLs carry it as v=).
band_version() {
    $PY -c 'import json, sys, urllib.request; print(json.load(urllib.request.urlopen(sys.argv[1] + "/api/fields/" + sys.argv[2]))["bands"][0]["version"])' "$1" "$2"
}

# The server's peak resident set so far (VmHWM), in MiB.
peak_rss_mib() { awk '$1 == "VmHWM:" { printf "%.0f", $2 / 1024 }' "/proc/$SERVER_PID/status"; }

# Where the server's resident memory is now (/proc/PID/status): anonymous (heaps, stacks) and file-backed
# (code, mapped files), in MiB.
rss_parts() { awk '$1 ~ /^Rss(Anon|File|Shmem):$/ { printf "%s %.0f MiB ", $1, $2 / 1024 }' "/proc/$SERVER_PID/status"; }

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

# settle LUA BASE [script arguments]: 5 s runs until the server's CPU time per response has settled (two runs in a
# row within 5 %, after at least four; at most twelve), each printed to stderr. A fresh server's hot paths run
# first as quickly compiled code and are compiled again optimised in the background: measured on the cold tiles,
# CPU time per response fell from about 1,700 to 860 us over the first 40 s of load, so a fixed short warm-up
# measures the runtime's tiering rather than the server.
settle() {
    local lua=$1 base=$2 round cpu last=0
    shift 2
    for round in 1 2 3 4 5 6 7 8 9 10 11 12; do
        cpu=$(run_wrk "$lua" 5 "$base" "$@" | figure server_cpu_us_per_response)
        echo "   settling, run $round: ${cpu} us of server CPU a response" >&2
        if [ "$round" -ge 4 ] && awk -v a="$cpu" -v b="$last" 'BEGIN { exit !(b > 0 && a > 0.95 * b && a < 1.05 * b) }'; then return; fi
        last=$cpu
    done
}

# serve_field DATA CACHE FIELD SECONDS: starts the server on a free loopback port and waits until FIELD's pyramids
# are ready; sets PORT and BASE (and SERVER_PID, SERVER_LOG as start_server does).
serve_field() {
    PORT=$(free_port)
    BASE="http://127.0.0.1:$PORT"
    start_server "$PORT" "$1" "$2"
    wait_ready "$BASE" "$3" "$4"
}

# serve_sky_field SIZE: writes a SIZE x SIZE synthetic field "sky" under $SCRATCH/data, starts the server on it with
# the default limits and waits for its pyramid; sets PORT, BASE and VERSION (the band version for tile URLs).
serve_sky_field() {
    make_field "$SCRATCH/data/sky.fits" "$1"
    echo "== starting the server"
    serve_field "$SCRATCH/data" "$SCRATCH/cache" sky 600
    VERSION=$(band_version "$BASE" sky)
    grep -o 'GC heap limit.*' "$SERVER_LOG" | sed 's/^/   /' || true
    echo "   machine load before: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores (p99 figures mean little when it is far above the core count)"
}
