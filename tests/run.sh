#!/usr/bin/env bash
# Runs every test of Mosaic on a fresh machine: installs what the tests need from Debian's packages (the outside
# reference libraries and Chromium), builds once, runs every test project, and ends with one summary line.
set -euo pipefail
cd "$(dirname "$0")/.."

need=()
# redis-server: the scale-out tests start their own instances on free loopback ports, so no service is started here.
for pkg in chromium python3-astropy python3-numpy python3-pil libcfitsio-bin wcslib-tools redis-server; do
  dpkg -s "$pkg" >/dev/null 2>&1 || need+=("$pkg")
done
if [ ${#need[@]} -gt 0 ]; then
  echo "Installing Debian packages the tests use: ${need[*]}"
  sudo_cmd=(); [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update -qq
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi

dotnet build Mosaic.sln -c Release -nologo -v q
log=$(mktemp)
status=0
dotnet test Mosaic.sln -c Release --no-build -nologo -v q "$@" 2>&1 | tee "$log" || status=$?

# One closing line for the whole suite, summed over the test projects' own summaries.
passed=$(grep -Eo 'Passed: +[0-9]+' "$log" | awk '{s+=$2} END {print s+0}')
failed=$(grep -Eo 'Failed: +[0-9]+' "$log" | awk '{s+=$2} END {print s+0}')
skipped=$(grep -Eo 'Skipped: +[0-9]+' "$log" | awk '{s+=$2} END {print s+0}')
rm -f "$log"
if [ "$passed" -eq 0 ] && [ "$status" -eq 0 ]; then
  echo "no test ran"; status=1
fi
[ "$skipped" -eq 0 ] || { echo "$skipped tests were skipped: a skipped test is not a pass"; status=1; }
echo "$passed passed, $failed failed"
exit "$status"
