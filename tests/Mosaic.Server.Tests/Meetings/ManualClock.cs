namespace Mosaic.Server.Tests.Meetings;

/// <summary>A clock the test moves by hand, so expiry is checked without waiting hours.</summary>
public sealed class ManualClock : TimeProvider
{
    private DateTimeOffset _now = new(2030, 1, 1, 12, 0, 0, TimeSpan.Zero);

    public override DateTimeOffset GetUtcNow() => _now;

    public void Advance(TimeSpan by) => _now += by;
}
