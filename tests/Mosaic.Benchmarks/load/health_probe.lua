-- One /healthz request every 10 ms on one connection, so the probe measures the server, not a flood of its own.
dofile(os.getenv("LOAD_DIR") .. "/tally.lua")

function delay()
    return 10
end

request = function()
    return wrk.format("GET", "/healthz")
end
