#!/usr/bin/env bash
# Runtime-settings A/B of the ingest command, interleaved so load changes hit every variant alike: the `dotnet build`
# output with default settings, with DOTNET_TieredPGO=0, DOTNET_TieredCompilation=0 and DOTNET_TC_QuickJitForLoops=0,
# and a ReadyToRun publish of the same sources (published from a copy, so the working tree's obj/ is not touched).
#
#   flock /tmp/mosaic-bench.lock tests/Mosaic.Benchmarks/ingest/runtime_ab.sh [ROUNDS] [FRAME_SIZE] [CHIPS] [CHIP_SIZE]
#   (defaults 3 16384 16 4096)
#
# Prints "kind variant wall_s user_s sys_s peak_KiB" per run, and a `cat` of the same file before each round.
set -euo pipefail

ROUNDS=${1:-3}
FRAME_SIZE=${2:-16384}
CHIPS=${3:-16}
CHIP_SIZE=${4:-4096}
REPO=$(cd "$(dirname "${BASH_SOURCE[0]}")/../../.." && pwd)
HERE="$REPO/tests/Mosaic.Benchmarks/ingest"
LIMIT=600

WORK=$(mktemp -d /tmp/mosaic-runtime-ab-XXXXXX)
trap 'rm -rf "$WORK"' EXIT

echo "== building (Release) and publishing ReadyToRun"
timeout $LIMIT dotnet build "$REPO/server/Mosaic.Server/Mosaic.Server.csproj" -c Release -nologo -v q -o "$WORK/bin" >"$WORK/build.log" 2>&1 \
    || { tail -20 "$WORK/build.log" >&2; exit 1; }
mkdir -p "$WORK/src"
(cd "$REPO" && tar --exclude='*/bin' --exclude='*/obj' -cf - Directory.Build.props Directory.Packages.props server tile-cache demo-mosaic client) | tar -xf - -C "$WORK/src"
timeout $LIMIT dotnet publish "$WORK/src/server/Mosaic.Server/Mosaic.Server.csproj" -c Release -r linux-x64 --self-contained false \
    -p:PublishReadyToRun=true -nologo -v q -o "$WORK/r2r" >"$WORK/publish.log" 2>&1 || { tail -20 "$WORK/publish.log" >&2; exit 1; }
rm -rf "$WORK/src"

echo "== writing the synthetic data"
mkdir -p "$WORK/frame" "$WORK/field"
timeout $LIMIT /usr/bin/python3 "$HERE/make_fits.py" frame "$WORK/frame/frame.fits" "$FRAME_SIZE"
timeout $LIMIT /usr/bin/python3 "$HERE/make_fits.py" field "$WORK/field/field.fits" "$CHIPS" "$CHIP_SIZE"

measure() { { /usr/bin/time -f '%e %U %S %M' timeout $LIMIT "$@" >/dev/null; } 2>&1 | tail -1; }

for round in $(seq "$ROUNDS"); do
    for kind in frame field; do
        file="$WORK/$kind/$kind.fits"
        cat "$file" >/dev/null
        echo "$kind cat $(measure cat "$file")"
        for variant in default pgo0 tc0 qjfl0 r2r; do
            dll="$WORK/bin/Mosaic.Server.dll"
            settings=()
            case $variant in
                pgo0) settings=(DOTNET_TieredPGO=0) ;;
                tc0) settings=(DOTNET_TieredCompilation=0) ;;
                qjfl0) settings=(DOTNET_TC_QuickJitForLoops=0) ;;
                r2r) dll="$WORK/r2r/Mosaic.Server.dll" ;;
            esac
            rm -rf "$WORK/cache"
            echo "$kind $variant $(measure env "${settings[@]}" dotnet "$dll" ingest --data "$WORK/$kind" --cache "$WORK/cache")"
        done
    done
done
