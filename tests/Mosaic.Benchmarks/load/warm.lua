-- wrk script: cycles over the tile paths in the file named by the first script argument (one per line), so every
-- request is a tile already in the server's cache. No response() hook: wrk then skips handing each body to Lua,
-- and its own summary still counts answers of 400 and above (errors.status), which the figure line reports.
--   wrk -t1 -c64 -d10s --latency -s warm.lua http://127.0.0.1:PORT -- paths.txt

local paths = {}
local next_index = 1

function setup(thread)
  setup_count = (setup_count or 0) + 1
  thread:set("id", setup_count)
end

function init(args)
  local file = assert(io.open(args[1], "r"), "warm.lua: cannot open " .. tostring(args[1]))
  for line in file:lines() do
    if #line > 0 then paths[#paths + 1] = line end
  end
  file:close()
  assert(#paths > 0, "warm.lua: no paths in " .. args[1])
  -- Threads start at different places in the cycle.
  next_index = (wrk.thread:get("id") or 1) * 97 % #paths + 1
end

function request()
  local path = paths[next_index]
  next_index = next_index % #paths + 1
  return wrk.format("GET", path)
end

function done(summary, latency, requests)
  local seconds = summary.duration / 1e6
  io.write(string.format("FIGURE requests=%d seconds=%.2f rps=%.0f p50_ms=%.2f p99_ms=%.2f max_ms=%.2f errors_4xx5xx=%d socket_errors=%d\n",
    summary.requests, seconds, summary.requests / seconds,
    latency:percentile(50) / 1000, latency:percentile(99) / 1000, latency.max / 1000, summary.errors.status,
    summary.errors.connect + summary.errors.read + summary.errors.write + summary.errors.timeout))
end
