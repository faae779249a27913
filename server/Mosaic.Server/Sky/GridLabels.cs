using System.Globalization;

namespace Mosaic.Server.Sky;

/// <summary>
/// Grid labels with exactly the precision of the step: RA as "10h", "10h05m", "10h05m30s" or "10h05m30.5s"; Dec as
/// "+45°", "−2°30′", "+12°30′15″" or "+12°30′15.5″", with the typographic minus U+2212 and no sign on zero.
/// </summary>
public static class GridLabels
{
    private const char Minus = '\u2212';

    /// <param name="units">The line's RA in hundredths of a second of time (any whole multiple of the circle is removed).</param>
    /// <param name="stepUnits">The grid step in the same units.</param>
    public static string RightAscension(long units, long stepUnits)
    {
        units %= GridSpacing.RaUnitsPerCircle;
        if (units < 0) units += GridSpacing.RaUnitsPerCircle;
        var (leading, minutes, centi) = Split(units);
        var text = leading.ToString(CultureInfo.InvariantCulture) + "h";
        if (stepUnits % 360_000 == 0) return text;
        text += minutes.ToString("D2", CultureInfo.InvariantCulture) + "m";
        if (stepUnits % 6_000 == 0) return text;
        return text + Seconds(centi, stepUnits) + "s";
    }

    /// <param name="units">The line's Dec in hundredths of an arcsecond.</param>
    /// <param name="stepUnits">The grid step in the same units.</param>
    public static string Declination(long units, long stepUnits)
    {
        var sign = units > 0 ? "+" : units < 0 ? Minus.ToString() : "";
        var (leading, minutes, centi) = Split(Math.Abs(units));
        var text = sign + leading.ToString(CultureInfo.InvariantCulture) + "°";
        if (stepUnits % 360_000 == 0) return text;
        text += minutes.ToString("D2", CultureInfo.InvariantCulture) + "′";
        if (stepUnits % 6_000 == 0) return text;
        return text + Seconds(centi, stepUnits) + "″";
    }

    private static (long Leading, long Minutes, long Centiseconds) Split(long units) =>
        (units / 360_000, units / 6_000 % 60, units % 6_000);

    /// <summary>Seconds with as many decimals as the step needs: none for whole seconds, one for tenths, two below.</summary>
    private static string Seconds(long centi, long stepUnits)
    {
        var whole = (centi / 100).ToString("D2", CultureInfo.InvariantCulture);
        if (stepUnits % 100 == 0) return whole;
        if (stepUnits % 10 == 0) return whole + "." + (centi % 100 / 10).ToString(CultureInfo.InvariantCulture);
        return whole + "." + (centi % 100).ToString("D2", CultureInfo.InvariantCulture);
    }
}
