-- wrk script for tiles that cannot be cached: every request shows new display settings. Lines of the file named by
-- the first script argument are "PATH<TAB>LO<TAB>HI" (a tile path and its band's resolved limits). Each request
-- asks for the next tile with limits=value and a lo no earlier request used, so the server compiles the display
-- and renders the tile from the pyramid every time. The optional second argument N keeps one display for N
-- consecutive requests (a screen of tiles after one change of settings); the default, 1, is a new display each time.
-- hi carries the run's start second, so a rerun against the same cache folder cannot find an earlier run's tiles on disk.
--   wrk -t1 -c64 -d10s --latency -s cold.lua http://127.0.0.1:PORT -- cold-paths.tsv [N]

local paths, los, spans = {}, {}, {}
local next_index = 1
local counter = 0
local per_display = 1
local thread_id = 1
local hi_fraction = 1

function setup(thread)
  setup_count = (setup_count or 0) + 1
  thread:set("id", setup_count)
end

function init(args)
  local file = assert(io.open(args[1], "r"), "cold.lua: cannot open " .. tostring(args[1]))
  for line in file:lines() do
    local path, lo, hi = line:match("^(%S+)\t(%S+)\t(%S+)$")
    if path then
      paths[#paths + 1] = path
      los[#los + 1] = tonumber(lo)
      spans[#spans + 1] = tonumber(hi) - tonumber(lo)
    end
  end
  file:close()
  assert(#paths > 0, "cold.lua: no lines in " .. args[1])
  per_display = tonumber(args[2] or "1")
  thread_id = wrk.thread:get("id") or 1
  next_index = thread_id * 97 % #paths + 1
  hi_fraction = 1 - 1e-6 * (os.time() % 100000)
end

function request()
  local i = next_index
  next_index = next_index % #paths + 1
  -- Display number d is shared by per_display consecutive requests; threads use disjoint lo values.
  local d = math.floor(counter / per_display) * 64 + thread_id
  counter = counter + 1
  local lo = los[i] + spans[i] * 1e-8 * d
  local hi = los[i] + spans[i] * hi_fraction
  return wrk.format("GET", string.format("%s&limits=value&lo=%.9f&hi=%.9f", paths[i], lo, hi))
end

function done(summary, latency, requests)
  local seconds = summary.duration / 1e6
  io.write(string.format("FIGURE requests=%d seconds=%.2f rps=%.0f p50_ms=%.2f p99_ms=%.2f max_ms=%.2f errors_4xx5xx=%d socket_errors=%d\n",
    summary.requests, seconds, summary.requests / seconds,
    latency:percentile(50) / 1000, latency:percentile(99) / 1000, latency.max / 1000, summary.errors.status,
    summary.errors.connect + summary.errors.read + summary.errors.write + summary.errors.timeout))
end
