-- The mixed load: warm tiles (same URLs, cached for good), revalidated tiles (If-None-Match, 304), cold tiles (a
-- display no one asked for yet), the field list, probes, statistics of boxes, render.png, histograms and /healthz,
-- in fixed proportions out of 20.
--   wrk ... -s mixed.lua http://host:port -- SIZE VERSION ETAG
dofile(os.getenv("LOAD_DIR") .. "/tally.lua")

local size, version, etag, maxzoom, n

function init(args)
    size, version, etag = tonumber(args[1]), args[2], args[3]
    maxzoom = math.ceil(math.log(size / 256) / math.log(2))
    n = 0
    math.randomseed(os.time() * 16 + wrk.thread:get("id"))
end

local function tile(z, extra)
    local count = 2 ^ z
    return string.format("/tiles/sky/%d/%d/%d.png?%s", z, math.random(0, count - 1), math.random(0, count - 1), extra)
end

local kinds = {
    "warm", "warm", "warm", "revalidate", "revalidate", "cold", "cold", "cold", "list", "list",
    "field", "probe", "probe", "probe", "stats", "stats", "render", "histogram", "health", "health",
}

function request()
    n = n + 1
    local kind = kinds[(n + math.random(0, 19)) % 20 + 1]
    if kind == "warm" then
        return wrk.format("GET", tile(math.random(0, 2), "v=" .. version))
    elseif kind == "revalidate" then
        return wrk.format("GET", "/tiles/sky/0/0/0.png?v=" .. version, { ["If-None-Match"] = etag })
    elseif kind == "cold" then
        return wrk.format("GET", tile(math.random(0, maxzoom), string.format("stretch=linear&lo=%d&hi=%d", 900 + math.random(0, 200), 1500 + math.random(0, 2000))))
    elseif kind == "list" then
        return wrk.format("GET", "/api/fields")
    elseif kind == "field" then
        return wrk.format("GET", "/api/fields/sky")
    elseif kind == "probe" then
        return wrk.format("GET", string.format("/api/fields/sky/probe?x=%d&y=%d", math.random(1, size), math.random(1, size)))
    elseif kind == "stats" then
        local x, y = math.random(1, size - 256), math.random(1, size - 256)
        return wrk.format("GET", string.format("/api/fields/sky/stats?x0=%d&y0=%d&x1=%d&y1=%d", x, y, x + 255, y + 255))
    elseif kind == "render" then
        local x, y = math.random(1, size - 512), math.random(1, size - 512)
        return wrk.format("GET", string.format("/api/fields/sky/render.png?x0=%d&y0=%d&x1=%d&y1=%d", x, y, x + 511, y + 511))
    elseif kind == "histogram" then
        return wrk.format("GET", string.format("/api/fields/sky/histogram?bins=%d", 64 + math.random(0, 400)))
    end
    return wrk.format("GET", "/healthz")
end
