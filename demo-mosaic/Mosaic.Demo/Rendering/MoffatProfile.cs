namespace Mosaic.Demo.Rendering;

/// <summary>
/// The Moffat (1969) stellar profile I(r) = F (β − 1) / (π α²) · (1 + r²/α²)^(−β), normalised to total flux F, with
/// α = FWHM / (2 √(2^(1/β) − 1)).
/// </summary>
internal static class MoffatProfile
{
    public static double Alpha(double fwhm, double beta) => fwhm / (2 * Math.Sqrt(Math.Pow(2, 1 / beta) - 1));

    /// <summary>Fraction of the total flux per unit area at the centre.</summary>
    public static double PeakFraction(double fwhm, double beta)
    {
        var alpha = Alpha(fwhm, beta);
        return (beta - 1) / (Math.PI * alpha * alpha);
    }

    /// <summary>Radius where the profile of a star of this flux falls to threshold electrons per pixel.</summary>
    public static double RadiusAtLevel(double flux, double fwhm, double beta, double threshold)
    {
        var peak = flux * PeakFraction(fwhm, beta);
        if (peak <= threshold) return 0;
        var alpha = Alpha(fwhm, beta);
        return alpha * Math.Sqrt(Math.Pow(peak / threshold, 1 / beta) - 1);
    }
}
