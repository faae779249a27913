namespace Mosaic.Server.Meetings;

/// <summary>
/// The Lua scripts of <see cref="RedisMeetingStore"/>: each operation is one script, so two instances racing on one
/// meeting see it change all at once. Time comes from the caller's clock (ARGV[2], Unix ms) so the store keeps the
/// same expiry rules as the in-memory one. Keys are built inside the scripts: one Redis server, not a cluster.
/// Layout: {p}m:{id} hash (state, key, ho, hountil, last); {p}m:{id}:c set of connection ids; {p}c:{connection} the
/// meeting a connection is in; {p}index sorted set of meeting ids by last activity.
/// Each returns a table whose first element is 'ok' or why not.
/// </summary>
internal static class RedisMeetingScripts
{
    // ARGV: 1 prefix, 2 now (ms), 3 expiry (ms), 4 lifetime of a meeting's keys (ms); the script's own from 5.
    private const string Prelude = """
        local p = ARGV[1]
        local now = tonumber(ARGV[2])
        local expiry = tonumber(ARGV[3])
        local ttl = ARGV[4]
        local index = p .. 'index'
        local function mkey(id) return p .. 'm:' .. id end
        local function ckey(id) return p .. 'm:' .. id .. ':c' end
        local function conn(c) return p .. 'c:' .. c end
        -- Hashes of secrets, compared in time that does not depend on where they differ.
        local function same(a, b)
          if not a or not b or #a ~= #b then return false end
          local d = 0
          for i = 1, #a do d = bit.bor(d, bit.bxor(string.byte(a, i), string.byte(b, i))) end
          return d == 0
        end
        local function drop(id)
          for _, c in ipairs(redis.call('SMEMBERS', ckey(id))) do
            if redis.call('GET', conn(c)) == id then redis.call('DEL', conn(c)) end
          end
          redis.call('DEL', mkey(id), ckey(id))
          redis.call('ZREM', index, id)
        end
        local function dropExpired()
          for _, id in ipairs(redis.call('ZRANGEBYSCORE', index, '-inf', '(' .. (now - expiry))) do drop(id) end
        end
        local function find(id)
          local last = redis.call('HGET', mkey(id), 'last')
          if not last then redis.call('ZREM', index, id) return 'notfound' end
          if now - tonumber(last) > expiry then drop(id) return 'expired' end
          return 'ok'
        end
        local function touch(id)
          redis.call('HSET', mkey(id), 'last', ARGV[2])
          redis.call('ZADD', index, ARGV[2], id)
          redis.call('PEXPIRE', mkey(id), ttl)
          redis.call('PEXPIRE', ckey(id), ttl)
        end
        local function presenting(id, keyHash)
          local found = find(id)
          if found ~= 'ok' then return found end
          if not same(keyHash, redis.call('HGET', mkey(id), 'key')) then return 'wrongkey' end
          touch(id)
          return 'ok'
        end

        """;

    public const string Count = Prelude + """
        dropExpired()
        return { 'ok', redis.call('ZCARD', index) }
        """;

    // 5 max meetings, 6 id, 7 key hash, 8 state (JSON)
    public const string Start = Prelude + """
        dropExpired()
        if redis.call('ZCARD', index) >= tonumber(ARGV[5]) then return { 'full' } end
        if redis.call('EXISTS', mkey(ARGV[6])) == 1 then return { 'taken' } end
        redis.call('HSET', mkey(ARGV[6]), 'state', ARGV[8], 'key', ARGV[7], 'last', ARGV[2])
        redis.call('ZADD', index, ARGV[2], ARGV[6])
        redis.call('PEXPIRE', mkey(ARGV[6]), ttl)
        return { 'ok' }
        """;

    // 5 id, 6 connection, 7 max participants, 8 lifetime of the connection's entry (ms)
    // Returns ok, state, participants, meeting left ('' if none), its participants.
    public const string Join = Prelude + """
        local id, c = ARGV[5], ARGV[6]
        local found = find(id)
        if found ~= 'ok' then return { found } end
        local left, leftCount = '', 0
        local previous = redis.call('GET', conn(c))
        if previous and previous ~= id then
          redis.call('DEL', conn(c))
          if redis.call('EXISTS', mkey(previous)) == 1 then
            redis.call('SREM', ckey(previous), c)
            left, leftCount = previous, redis.call('SCARD', ckey(previous))
          end
        end
        if redis.call('SISMEMBER', ckey(id), c) == 0 and redis.call('SCARD', ckey(id)) >= tonumber(ARGV[7]) then return { 'full' } end
        redis.call('SADD', ckey(id), c)
        local remaining = redis.call('PTTL', mkey(id))
        if remaining > 0 then redis.call('PEXPIRE', ckey(id), remaining) end
        redis.call('SET', conn(c), id, 'PX', ARGV[8])
        return { 'ok', redis.call('HGET', mkey(id), 'state'), redis.call('SCARD', ckey(id)), left, leftCount }
        """;

    // 5 connection. Returns ok, then the meeting left and its participants, or nothing more if it was in none.
    public const string Leave = Prelude + """
        local c = ARGV[5]
        local id = redis.call('GET', conn(c))
        if not id then return { 'ok' } end
        redis.call('DEL', conn(c))
        if redis.call('EXISTS', mkey(id)) == 0 then return { 'ok' } end
        redis.call('SREM', ckey(id), c)
        return { 'ok', id, redis.call('SCARD', ckey(id)) }
        """;

    // 5 id, 6 key hash, 7 state (JSON)
    public const string Present = Prelude + """
        local done = presenting(ARGV[5], ARGV[6])
        if done == 'ok' then redis.call('HSET', mkey(ARGV[5]), 'state', ARGV[7]) end
        return { done }
        """;

    // 5 id, 6 key hash
    public const string Authorize = Prelude + """
        return { presenting(ARGV[5], ARGV[6]) }
        """;

    // 5 id, 6 key hash, 7 code hash, 8 code good until (ms)
    public const string HandOver = Prelude + """
        local done = presenting(ARGV[5], ARGV[6])
        if done == 'ok' then redis.call('HSET', mkey(ARGV[5]), 'ho', ARGV[7], 'hountil', ARGV[8]) end
        return { done }
        """;

    // 5 id, 6 code hash, 7 new key hash
    public const string TakeOver = Prelude + """
        local id = ARGV[5]
        local found = find(id)
        if found ~= 'ok' then return { found } end
        local valid = same(ARGV[6], redis.call('HGET', mkey(id), 'ho'))
        if not valid then return { 'badcode' } end
        if now > tonumber(redis.call('HGET', mkey(id), 'hountil')) then return { 'codeexpired' } end
        redis.call('HSET', mkey(id), 'key', ARGV[7])
        redis.call('HDEL', mkey(id), 'ho', 'hountil')
        touch(id)
        return { 'ok' }
        """;

    // 5 id, 6 key hash
    public const string End = Prelude + """
        local done = presenting(ARGV[5], ARGV[6])
        if done == 'ok' then drop(ARGV[5]) end
        return { done }
        """;
}
