using System.Globalization;

namespace Mosaic.Imaging.Display;

/// <summary>Number text for canonical keys: culture-free, shortest round-trip, one spelling for zero.</summary>
internal static class KeyText
{
    public static string Number(double value) => (value == 0 ? 0.0 : value).ToString("R", CultureInfo.InvariantCulture);
}
