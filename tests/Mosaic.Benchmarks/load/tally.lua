-- Loaded by the other wrk scripts: counts answers by status in each wrk thread and prints the sums, wrk's socket
-- errors and the latency percentiles as "key value" lines when the run ends.
local threads = {}

function setup(thread)
    table.insert(threads, thread)
    thread:set("id", #threads) -- seeds each thread's random numbers apart
end

counts = {}

function response(status, headers, body)
    counts[status] = (counts[status] or 0) + 1
end

function done(summary, latency, requests)
    local total = {}
    for _, thread in ipairs(threads) do
        for status, n in pairs(thread:get("counts")) do total[status] = (total[status] or 0) + n end
    end
    local statuses = {}
    for status in pairs(total) do table.insert(statuses, status) end
    table.sort(statuses)
    for _, status in ipairs(statuses) do io.write(string.format("status %d %d\n", status, total[status])) end
    local e = summary.errors
    io.write(string.format("errors connect %d read %d write %d timeout %d\n", e.connect, e.read, e.write, e.timeout))
    io.write(string.format("requests %d seconds %.1f\n", summary.requests, summary.duration / 1e6))
    io.write(string.format("latency_ms p50 %.2f p99 %.2f max %.2f\n",
        latency:percentile(50) / 1000, latency:percentile(99) / 1000, latency.max / 1000))
end
