-- Render-heavy requests on the load field: whole-quarter PNGs, statistics of large boxes and histograms.
--   wrk ... -s render_heavy.lua http://host:port -- SIZE
dofile(os.getenv("LOAD_DIR") .. "/tally.lua")

local size, n

function init(args)
    size = tonumber(args[1])
    n = 0
    math.randomseed(os.time() * 16 + wrk.thread:get("id"))
end

function request()
    n = n + 1
    local half = size / 2
    local x0, y0 = math.random(1, half), math.random(1, half)
    local kind = n % 3
    if kind == 0 then
        return wrk.format("GET", string.format("/api/fields/sky/render.png?x0=%d&y0=%d&x1=%d&y1=%d&stretch=asinh", x0, y0, x0 + half - 1, y0 + half - 1))
    elseif kind == 1 then
        return wrk.format("GET", string.format("/api/fields/sky/stats?x0=%d&y0=%d&x1=%d&y1=%d", x0, y0, x0 + 1499, y0 + 1499))
    end
    return wrk.format("GET", string.format("/api/fields/sky/histogram?lo=%d&hi=%d&bins=512", 900 + n % 50, 2000 + n % 50))
end
