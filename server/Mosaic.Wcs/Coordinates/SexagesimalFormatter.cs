using System.Globalization;

namespace Mosaic.Wcs.Coordinates;

/// <summary>
/// Writes angles for people: RA as hh:mm:ss.sss (hours), Dec as ±dd:mm:ss.ss, or decimal degrees. Rounding is done
/// once, on a whole count of the last shown digit, so 59.9995 s carries into the next minute instead of printing 60.
/// </summary>
public static class SexagesimalFormatter
{
    /// <summary>The most decimals of a second we show; beyond this a double no longer holds the digits.</summary>
    public const int MaxSecondDecimals = 6;

    /// <summary>RA in degrees as hh:mm:ss with <paramref name="secondDecimals"/> decimals (default 3); 24h wraps to 00.</summary>
    public static string FormatRightAscension(double degrees, int secondDecimals = 3)
    {
        CheckArguments(degrees, secondDecimals);
        var scale = Pow10(secondDecimals);
        var perDay = 24L * 3600L * scale;
        var units = (long)Math.Round(Angles.NormaliseDegrees(degrees) / 15.0 * 3600.0 * scale, MidpointRounding.AwayFromZero);
        if (units >= perDay) units -= perDay;
        return Compose(units, scale, secondDecimals, 2);
    }

    /// <summary>Dec in degrees as ±dd:mm:ss with <paramref name="secondDecimals"/> decimals (default 2).</summary>
    public static string FormatDeclination(double degrees, int secondDecimals = 2)
    {
        CheckArguments(degrees, secondDecimals);
        if (degrees < -90 || degrees > 90)
            throw new ArgumentOutOfRangeException(nameof(degrees), degrees, "Dec must lie in [-90, 90] degrees");
        var scale = Pow10(secondDecimals);
        var units = (long)Math.Round(Math.Abs(degrees) * 3600.0 * scale, MidpointRounding.AwayFromZero);
        // A value that rounds to zero prints as +00:00:00, never as -00:00:00.
        var sign = degrees < 0 && units != 0 ? '-' : '+';
        return sign + Compose(units, scale, secondDecimals, 2);
    }

    /// <summary>Degrees with <paramref name="decimals"/> decimals, invariant culture.</summary>
    public static string FormatDegrees(double degrees, int decimals = 6)
    {
        if (!double.IsFinite(degrees)) throw new ArgumentOutOfRangeException(nameof(degrees), degrees, "the angle must be finite");
        if (decimals is < 0 or > 15) throw new ArgumentOutOfRangeException(nameof(decimals), decimals, "decimals must be 0 to 15");
        var text = degrees.ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        return text.StartsWith('-') && text.AsSpan(1).IndexOfAnyExcept("0.") < 0 ? text[1..] : text;
    }

    /// <summary>"hh:mm:ss.sss ±dd:mm:ss.ss" for a position.</summary>
    public static string Format(SkyPosition position)
    {
        ArgumentNullException.ThrowIfNull(position);
        return FormatRightAscension(position.RightAscension) + " " + FormatDeclination(position.Declination);
    }

    private static string Compose(long units, long scale, int secondDecimals, int leadingWidth)
    {
        var fraction = units % scale;
        var wholeSeconds = units / scale;
        var seconds = wholeSeconds % 60;
        var minutes = wholeSeconds / 60 % 60;
        var leading = wholeSeconds / 3600;
        var text = string.Create(CultureInfo.InvariantCulture,
            $"{leading.ToString("D" + leadingWidth, CultureInfo.InvariantCulture)}:{minutes:D2}:{seconds:D2}");
        return secondDecimals == 0 ? text : text + "." + fraction.ToString("D" + secondDecimals, CultureInfo.InvariantCulture);
    }

    private static void CheckArguments(double degrees, int secondDecimals)
    {
        if (!double.IsFinite(degrees)) throw new ArgumentOutOfRangeException(nameof(degrees), degrees, "the angle must be finite");
        if (secondDecimals is < 0 or > MaxSecondDecimals)
            throw new ArgumentOutOfRangeException(nameof(secondDecimals), secondDecimals, $"second decimals must be 0 to {MaxSecondDecimals}");
    }

    private static long Pow10(int power)
    {
        var result = 1L;
        for (var k = 0; k < power; k++) result *= 10;
        return result;
    }
}
