using System.Globalization;

namespace Mosaic.Imaging.Composite;

/// <summary>Checks and key text shared by the per-channel numbers of both composites.</summary>
internal static class ChannelWeights
{
    public static Channels<double> Ones { get; } = Channels<double>.All(1);

    public static Channels<double> Positive(Channels<double> scale, string parameter)
    {
        foreach (var s in scale.AsEnumerable())
            if (!(double.IsFinite(s) && s > 0))
                throw new ArgumentOutOfRangeException(parameter, s, $"{parameter} must be three finite weights > 0; got {s.ToString(CultureInfo.InvariantCulture)}");
        return scale;
    }

    public static string Key(Channels<double> values) =>
        $"{Number(values.Red)},{Number(values.Green)},{Number(values.Blue)}";

    public static string Number(double value) => Display.KeyText.Number(value);
}
