using System.Text.Json;
using Mosaic.Server.Errors;
using Mosaic.Server.Redis;
using StackExchange.Redis;

namespace Mosaic.Server.Meetings;

/// <summary>
/// Meetings in Redis, shared by every instance on it: a follower connected to one instance follows a presenter on
/// another. The same limits, messages and expiry rules as <see cref="InMemoryMeetingStore"/>; each operation is one
/// Lua script, so racing instances cannot interleave inside it. While Redis is unreachable every operation fails
/// with 503 rather than pretending the meeting is gone.
/// </summary>
public sealed class RedisMeetingStore(RedisConnection redis, MeetingLimits limits, TimeProvider clock) : IMeetingStore
{
    public const string KeyPrefix = "mosaic:meet:";

    // Keys outlive their meeting's expiry a little, so a meeting is always dropped by the expiry rule first;
    // Redis's own expiry only collects what an instance that died left behind.
    private static readonly TimeSpan Margin = TimeSpan.FromMinutes(5);

    public int Count => (int)(long)Run(RedisMeetingScripts.Count)[1];

    public MeetingStarted Start(IReadOnlyDictionary<string, string> state)
    {
        var key = MeetingSecrets.NewKey();
        var json = JsonSerializer.Serialize(state);
        while (true)
        {
            var id = MeetingSecrets.NewId();
            var result = Run(RedisMeetingScripts.Start, limits.MaxMeetings, id, MeetingSecrets.Hash(key), json);
            switch (Status(result))
            {
                case "ok": return new MeetingStarted(id, key);
                case "taken": continue; // 72 random bits met an open meeting's id: draw again
                case "full": throw new MeetingException(MeetingError.Full, $"The server already holds {limits.MaxMeetings} meetings; end one or try again later.");
                default: throw Refused(result, id);
            }
        }
    }

    public MeetingJoined Join(string id, string connectionId)
    {
        CheckId(id);
        var result = Run(RedisMeetingScripts.Join, id, connectionId, limits.MaxParticipants, (long)ConnectionLifetime.TotalMilliseconds);
        if (Status(result) == "full") throw new MeetingException(MeetingError.Full, $"Meeting '{id}' already has {limits.MaxParticipants} participants.");
        if (Status(result) != "ok") throw Refused(result, id);
        var state = JsonSerializer.Deserialize<Dictionary<string, string>>((string)result[1]!)!;
        var left = (string)result[3]!;
        return new MeetingJoined(state, (int)result[2], left.Length == 0 ? null : new MeetingMembership(left, (int)result[4]));
    }

    public MeetingMembership? Leave(string connectionId)
    {
        var result = Run(RedisMeetingScripts.Leave, connectionId);
        return result.Length < 3 ? null : new MeetingMembership((string)result[1]!, (int)result[2]);
    }

    public void Present(string id, string presenterKey, IReadOnlyDictionary<string, string> state)
    {
        CheckId(id);
        Expect(Run(RedisMeetingScripts.Present, id, Hashed(presenterKey), JsonSerializer.Serialize(state)), id);
    }

    public void Authorize(string id, string presenterKey)
    {
        CheckId(id);
        Expect(Run(RedisMeetingScripts.Authorize, id, Hashed(presenterKey)), id);
    }

    public string HandOver(string id, string presenterKey)
    {
        CheckId(id);
        var code = MeetingSecrets.NewKey();
        var until = (clock.GetUtcNow() + limits.HandOverLifetime).ToUnixTimeMilliseconds();
        Expect(Run(RedisMeetingScripts.HandOver, id, Hashed(presenterKey), MeetingSecrets.Hash(code), until), id);
        return code;
    }

    public string TakeOver(string id, string code)
    {
        CheckId(id);
        var key = MeetingSecrets.NewKey();
        Expect(Run(RedisMeetingScripts.TakeOver, id, Hashed(code), MeetingSecrets.Hash(key)), id);
        return key;
    }

    public void End(string id, string presenterKey)
    {
        CheckId(id);
        Expect(Run(RedisMeetingScripts.End, id, Hashed(presenterKey)), id);
    }

    // A follower may stay connected far longer than the presenter's idle limit; its entry must last as long.
    private TimeSpan ConnectionLifetime => limits.Expiry * 2 + TimeSpan.FromDays(1);

    private RedisResult[] Run(string script, params RedisValue[] arguments)
    {
        var values = new RedisValue[4 + arguments.Length];
        values[0] = KeyPrefix;
        values[1] = clock.GetUtcNow().ToUnixTimeMilliseconds();
        values[2] = (long)limits.Expiry.TotalMilliseconds;
        values[3] = (long)(limits.Expiry + Margin).TotalMilliseconds;
        arguments.CopyTo(values, 4);
        try
        {
            return (RedisResult[])redis.Multiplexer.GetDatabase().ScriptEvaluate(script, keys: null, values: values)!;
        }
        catch (Exception e) when (e is RedisConnectionException or RedisTimeoutException)
        {
            throw new MosaicRequestException(StatusCodes.Status503ServiceUnavailable, "Meetings unavailable",
                "Meetings are kept in Redis, which this server cannot reach right now; tiles still work. Try again shortly.");
        }
    }

    private static string Status(RedisResult[] result) => (string)result[0]!;

    private static void Expect(RedisResult[] result, string id)
    {
        if (Status(result) != "ok") throw Refused(result, id);
    }

    private static MeetingException Refused(RedisResult[] result, string id) => Status(result) switch
    {
        "notfound" => new MeetingException(MeetingError.NotFound, $"There is no meeting '{id}': it has ended or never existed.", "id"),
        "expired" => new MeetingException(MeetingError.NotFound, $"Meeting '{id}' has ended: its presenter was idle for too long.", "id"),
        "wrongkey" => new MeetingException(MeetingError.WrongKey,
            "This presenter key does not drive the meeting: it is wrong, or the meeting was handed over to someone else.", "key"),
        "badcode" => new MeetingException(MeetingError.WrongKey,
            "This hand-over code is not valid for this meeting (it may have been used already).", "code"),
        "codeexpired" => new MeetingException(MeetingError.WrongKey, "This hand-over code has expired; ask the presenter for a new one.", "code"),
        var other => throw new InvalidOperationException($"The meeting script answered '{other}', which this server does not know."),
    };

    // A missing key or code matches nothing, as in memory, instead of failing to hash.
    private static RedisValue Hashed(string? secret) => secret is null ? RedisValue.EmptyString : MeetingSecrets.Hash(secret);

    private static void CheckId(string id)
    {
        if (!MeetingSecrets.IsWellFormedId(id))
            throw new MeetingException(MeetingError.BadInput, "A meeting id is 8 to 64 letters, digits, '-' or '_'.", "id");
    }
}
