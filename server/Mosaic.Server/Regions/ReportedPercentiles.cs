using System.Globalization;

namespace Mosaic.Server.Regions;

/// <summary>The percentiles every statistics answer lists, dense in the tails where display limits are chosen.</summary>
public static class ReportedPercentiles
{
    public static IReadOnlyList<double> Values { get; } = [0.1, 0.5, 1, 5, 25, 50, 75, 95, 99, 99.5, 99.9];

    /// <summary>The JSON key of a percentile: its shortest invariant spelling ("0.1", "5", "99.5").</summary>
    public static string Key(double percent) => percent.ToString("R", CultureInfo.InvariantCulture);
}
