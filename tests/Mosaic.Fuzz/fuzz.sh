#!/usr/bin/env bash
# Fuzzes the FITS reader with SharpFuzz and afl-fuzz (Debian's afl++): the "file" target (headers, HDU walk, tile
# index, tile decoding through FitsFile.Open) and the "decoders" target (RICE_1, GZIP, PLIO_1, HCOMPRESS_1 streams).
# usage: tests/Mosaic.Fuzz/fuzz.sh [seconds per target, default 300]
# Needs: afl-fuzz (apt-get install afl++), fpack (libcfitsio-bin), /usr/bin/python3 with astropy and numpy.
set -euo pipefail

seconds="${1:-300}"
here="$(cd "$(dirname "$0")" && pwd)"
work="${MOSAIC_FUZZ_WORK:-${TMPDIR:-/tmp}/mosaic-fuzz}"
tools="$work/tools"
bin="$work/bin"

command -v afl-fuzz >/dev/null || { echo "afl-fuzz is missing: apt-get install -y afl++" >&2; exit 1; }
[ -x /usr/bin/fpack ] || { echo "fpack is missing: apt-get install -y libcfitsio-bin" >&2; exit 1; }

if [ ! -x "$tools/sharpfuzz" ]; then
  dotnet tool install SharpFuzz.CommandLine --version 2.3.0 --tool-path "$tools"
fi

rm -rf "$bin"
dotnet build "$here/Mosaic.Fuzz.csproj" -c Release -o "$bin" -nologo -v quiet
# Instruments the reader only: the harness and the framework stay as they are.
"$tools/sharpfuzz" "$bin/Mosaic.Fits.dll"

rm -rf "$work/seeds"
/usr/bin/python3 "$here/make_seeds.py" "$work/seeds/file" "$work/seeds/decoders"

export AFL_SKIP_BIN_CHECK=1 AFL_NO_UI=1 AFL_SKIP_CPUFREQ=1 AFL_I_DONT_CARE_ABOUT_MISSING_CRASHES=1 AFL_NO_AFFINITY=1
total_execs=0
total_crashes=0
for target in file decoders; do
  out="$work/out/$target"
  rm -rf "$out"; mkdir -p "$work/out"
  echo "== $target: $seconds s"
  # -t: per-input timeout in ms (a hang is one over it); -m none: the .NET runtime reserves far more than it uses.
  afl-fuzz -i "$work/seeds/$target" -o "$out" -V "$seconds" -t 5000 -m none -- "$(command -v dotnet)" "$bin/Mosaic.Fuzz.dll" "$target" \
    > "$work/$target.log" 2>&1 || { tail -30 "$work/$target.log" >&2; exit 1; }
  stats="$out/default/fuzzer_stats"
  execs=$(awk -F: '/^execs_done/ {gsub(/ /, "", $2); print $2}' "$stats")
  crashes=$(awk -F: '/^saved_crashes/ {gsub(/ /, "", $2); print $2}' "$stats")
  hangs=$(awk -F: '/^saved_hangs/ {gsub(/ /, "", $2); print $2}' "$stats")
  edges=$(awk -F: '/^edges_found/ {gsub(/ /, "", $2); print $2}' "$stats")
  echo "$target: executions $execs, crashes $crashes, hangs $hangs, edges covered $edges"
  for crash in "$out"/default/crashes/id* "$out"/default/hangs/id*; do
    [ -e "$crash" ] && echo "  input: $crash"
  done
  total_execs=$((total_execs + execs))
  total_crashes=$((total_crashes + crashes + hangs))
done
echo "total: executions $total_execs, crashes and hangs $total_crashes"
