namespace Mosaic.Imaging.Display.Stretches;

/// <summary>Validation shared by the stretches, with messages naming the query parameter.</summary>
internal static class StretchParameters
{
    public static readonly IReadOnlyDictionary<string, double> None = new Dictionary<string, double>();

    public static double Positive(double value, string parameter)
    {
        if (!(value > 0) || !double.IsFinite(value))
            throw new ArgumentOutOfRangeException(parameter, value, $"{parameter} must be > 0 and finite");
        return value;
    }

    public static double Clamp(double x) => Math.Clamp(double.IsNaN(x) ? 0 : x, 0, 1);
}
