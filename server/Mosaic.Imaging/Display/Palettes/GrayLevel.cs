namespace Mosaic.Imaging.Display.Palettes;

/// <summary>round(255 t), halves away from zero, t clamped to [0, 1] and NaN taken as 0.</summary>
internal static class GrayLevel
{
    public static byte Of(double t) => (byte)Math.Round(255 * Math.Clamp(double.IsNaN(t) ? 0 : t, 0, 1), MidpointRounding.AwayFromZero);
}
