namespace Mosaic.Server.Sky;

/// <summary>
/// The "nice" steps a coordinate grid may use, as whole counts of a small unit so that line values and labels are
/// exact: RA in hundredths of a second of time, Dec in hundredths of an arcsecond. Each run follows the usual
/// sexagesimal divisions of an hour, a degree, a minute and a second (common practice for sky charts).
/// </summary>
public static class GridSpacing
{
    /// <summary>Hundredths of a second of time in one degree of RA (1° = 4 min = 240 s).</summary>
    public const long RaUnitsPerDegree = 24_000;

    /// <summary>Hundredths of an arcsecond in one degree.</summary>
    public const long DecUnitsPerDegree = 360_000;

    /// <summary>Hundredths of a second of time in 24 h.</summary>
    public const long RaUnitsPerCircle = 360 * RaUnitsPerDegree;

    private const long Second = 100, Minute = 60 * Second, Hour = 60 * Minute;
    private const long ArcSecond = 100, ArcMinute = 60 * ArcSecond, Degree = 60 * ArcMinute;

    /// <summary>12h 6h 4h 3h 2h 1h 30m 20m 15m 10m 5m 2m 1m 30s 20s 15s 10s 5s 2s 1s 0.5s 0.2s 0.1s 0.05s 0.02s 0.01s.</summary>
    public static IReadOnlyList<long> RaSteps { get; } =
    [
        12 * Hour, 6 * Hour, 4 * Hour, 3 * Hour, 2 * Hour, Hour,
        30 * Minute, 20 * Minute, 15 * Minute, 10 * Minute, 5 * Minute, 2 * Minute, Minute,
        30 * Second, 20 * Second, 15 * Second, 10 * Second, 5 * Second, 2 * Second, Second,
        50, 20, 10, 5, 2, 1,
    ];

    /// <summary>30° 20° 15° 10° 5° 2° 1° 30′ 20′ 15′ 10′ 5′ 2′ 1′ 30″ 20″ 15″ 10″ 5″ 2″ 1″ 0.5″ 0.2″ 0.1″ 0.05″ 0.02″ 0.01″.</summary>
    public static IReadOnlyList<long> DecSteps { get; } =
    [
        30 * Degree, 20 * Degree, 15 * Degree, 10 * Degree, 5 * Degree, 2 * Degree, Degree,
        30 * ArcMinute, 20 * ArcMinute, 15 * ArcMinute, 10 * ArcMinute, 5 * ArcMinute, 2 * ArcMinute, ArcMinute,
        30 * ArcSecond, 20 * ArcSecond, 15 * ArcSecond, 10 * ArcSecond, 5 * ArcSecond, 2 * ArcSecond, ArcSecond,
        50, 20, 10, 5, 2, 1,
    ];

    /// <summary>The lines a view should show each way; steps are picked so the count lands nearest to it.</summary>
    public const double TargetLines = 5;

    /// <summary>The RA step (in hundredths of a second of time) for an RA span of <paramref name="spanDegrees"/>.</summary>
    public static long ChooseRaStep(double spanDegrees) => Choose(RaSteps, spanDegrees * RaUnitsPerDegree);

    /// <summary>The Dec step (in hundredths of an arcsecond) for a Dec span of <paramref name="spanDegrees"/>.</summary>
    public static long ChooseDecStep(double spanDegrees) => Choose(DecSteps, spanDegrees * DecUnitsPerDegree);

    private static long Choose(IReadOnlyList<long> steps, double spanUnits)
    {
        if (!(spanUnits > 0) || !double.IsFinite(spanUnits)) return steps[^1];
        // The ratio of neighbouring steps is at most 2.5, so the nearest on a log scale gives 5 / 1.6 ... 5 * 1.6
        // lines: within the 3 to 8 we aim for.
        var best = steps[0];
        var bestMiss = double.PositiveInfinity;
        foreach (var step in steps)
        {
            var miss = Math.Abs(Math.Log(spanUnits / step / TargetLines));
            if (miss < bestMiss) (best, bestMiss) = (step, miss);
        }
        return best;
    }
}
