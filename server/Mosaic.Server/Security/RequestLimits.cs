using System.Globalization;

namespace Mosaic.Server.Security;

/// <summary>
/// How hard one client may push the expensive endpoints (render.png, cutouts, statistics of a box, histograms) and
/// how long a rendering request may run; read from --expensive-rate, --expensive-burst, --expensive-concurrency and
/// --render-timeout.
/// </summary>
public sealed record RequestLimits
{
    /// <summary>Expensive requests one client IP may make per second, sustained.</summary>
    public int PerSecond { get; init; } = 30;

    /// <summary>Expensive requests one client IP may make at once after a quiet spell.</summary>
    public int Burst { get; init; } = 60;

    /// <summary>
    /// Expensive requests running at once over all clients: half the cores by default, so the other half stays free
    /// for tiles, probes and health checks however many renders are asked for.
    /// </summary>
    public int Concurrency { get; init; } = Math.Max(1, Environment.ProcessorCount / 2);

    /// <summary>Expensive requests that wait for a free slot (without a thread) rather than being refused at once.</summary>
    public int Queue => Math.Max(8, 4 * Concurrency);

    /// <summary>How long render.png, a cutout or a statistics request may run before it is stopped with 504.</summary>
    public TimeSpan RenderTimeout { get; init; } = TimeSpan.FromSeconds(30);

    public static RequestLimits Default { get; } = new();

    public static RequestLimits FromConfiguration(IConfiguration configuration)
    {
        ArgumentNullException.ThrowIfNull(configuration);
        return new RequestLimits
        {
            PerSecond = Whole(configuration, "expensive-rate", Default.PerSecond),
            Burst = Whole(configuration, "expensive-burst", Default.Burst),
            Concurrency = Whole(configuration, "expensive-concurrency", Default.Concurrency),
            RenderTimeout = TimeSpan.FromSeconds(Seconds(configuration, "render-timeout", Default.RenderTimeout.TotalSeconds)),
        };
    }

    private static int Whole(IConfiguration configuration, string name, int fallback)
    {
        var text = configuration[name];
        if (string.IsNullOrWhiteSpace(text)) return fallback;
        if (!int.TryParse(text.Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var value) || value < 1)
            throw new ArgumentException($"--{name} must be a whole number, at least 1; got '{text}'.");
        return value;
    }

    private static double Seconds(IConfiguration configuration, string name, double fallback)
    {
        var text = configuration[name];
        if (string.IsNullOrWhiteSpace(text)) return fallback;
        if (!double.TryParse(text.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out var value) || !double.IsFinite(value) || value <= 0 || value > 3600)
            throw new ArgumentException($"--{name} must be a number of seconds above 0 and at most 3600; got '{text}'.");
        return value;
    }
}
