# Shared by the load scripts: builds the server (Release) into a scratch folder, writes the synthetic field, starts
# the server on a free loopback port and waits for its pyramids. Source it after setting WORK; call stop_server last.
# Needs dotnet, wrk, curl and Debian's /usr/bin/python3 with python3-astropy and python3-numpy.

REPO=$(cd "$(dirname "${BASH_SOURCE[0]}")/../../.." && pwd)
HERE="$REPO/tests/Mosaic.Benchmarks/load"
STEP_LIMIT=600
PORT=${PORT:-$((20000 + RANDOM % 20000))}
BASE="http://127.0.0.1:$PORT"
SERVER_PID=""

require_tools() {
    for tool in dotnet wrk curl /usr/bin/python3; do
        command -v "$tool" >/dev/null || { echo "load: $tool is missing" >&2; exit 2; }
    done
    /usr/bin/python3 -c "import astropy, numpy" 2>/dev/null \
        || { echo "load: /usr/bin/python3 lacks astropy/numpy (apt-get install python3-astropy python3-numpy)" >&2; exit 2; }
}

build_server() {
    echo "== building the server (Release)"
    timeout $STEP_LIMIT dotnet build "$REPO/server/Mosaic.Server/Mosaic.Server.csproj" -c Release -nologo -v q -o "$WORK/bin" >"$WORK/build.log" 2>&1 \
        || { tail -20 "$WORK/build.log" >&2; exit 1; }
}

make_field() {
    echo "== writing the synthetic ${1} x ${1} field"
    mkdir -p "$WORK/data"
    timeout $STEP_LIMIT /usr/bin/python3 "$HERE/make_field.py" "$WORK/data/sky.fits" "$1"
}

# Starts the server with any extra arguments and waits until the field's pyramid is ready.
start_server() {
    dotnet "$WORK/bin/Mosaic.Server.dll" --data "$WORK/data" --cache "$WORK/cache" --state "$WORK/state" \
        --urls "$BASE" "$@" >"$WORK/server.log" 2>&1 &
    SERVER_PID=$!
    local deadline=$((SECONDS + STEP_LIMIT))
    until curl -sf "$BASE/api/fields/sky" -o "$WORK/field.json" && grep -q '"state":"ready"' "$WORK/field.json" \
          && ! grep -q '"state":"building"\|"state":"queued"' "$WORK/field.json"; do
        kill -0 "$SERVER_PID" 2>/dev/null || { echo "load: the server exited" >&2; tail -20 "$WORK/server.log" >&2; exit 1; }
        [ $SECONDS -lt $deadline ] || { echo "load: the pyramid was not ready in ${STEP_LIMIT}s" >&2; exit 1; }
        sleep 0.5
    done
    VERSION=$(/usr/bin/python3 -c 'import json,sys; print(json.load(open(sys.argv[1]))["bands"][0]["version"])' "$WORK/field.json")
}

loadavg() { cut -d' ' -f1-3 /proc/loadavg; }

# The server's peak resident set (VmHWM) in MiB.
peak_rss_mib() { awk '$1 == "VmHWM:" { printf "%.0f", $2 / 1024 }' "/proc/$SERVER_PID/status"; }

stop_server() {
    if [ -n "$SERVER_PID" ] && kill -0 "$SERVER_PID" 2>/dev/null; then
        kill "$SERVER_PID" && wait "$SERVER_PID" 2>/dev/null || true
    fi
    SERVER_PID=""
}
