using Mosaic.Demo.Camera;
using Mosaic.Demo.Randomness;
using Mosaic.Demo.Rendering;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Scene;

/// <summary>Draws the stars: a power-law field population, and a few bright stars placed on chips on purpose.</summary>
internal static class StarCatalogue
{
    public const double FaintestMagnitude = 21.5;
    public const double BrightestFieldMagnitude = 13.0;

    /// <summary>Field stars per focal-plane pixel between the two magnitude limits (about 12 000 per square degree).</summary>
    private const double StarsPerPixel = 5.5e-5;

    /// <summary>Counts rise as dN/dm ∝ 10^(0.3 m), a typical slope for faint stars at high latitude.</summary>
    private const double CountSlope = 0.3;

    private const double ReferenceZeroPoint = 27.8;
    private const double NominalFullWell = 90_000;
    private const double FieldMargin = 40;

    public static (List<CatalogueStar> Stars, int GhostSourceId) Build(DemoFieldOptions options, CameraModel camera)
    {
        var stars = new List<CatalogueStar>();
        var rng = Xoshiro256StarStar.For(options.Seed, RandomStream.Stars);
        var halfW = camera.FieldWidth / 2 + FieldMargin;
        var halfH = camera.FieldHeight / 2 + FieldMargin;
        var count = (int)Math.Round(StarsPerPixel * 4 * halfW * halfH);
        var low = Math.Pow(10, CountSlope * BrightestFieldMagnitude);
        var high = Math.Pow(10, CountSlope * FaintestMagnitude);
        for (var i = 0; i < count; i++)
        {
            var x = rng.Uniform(-halfW, halfW);
            var y = rng.Uniform(-halfH, halfH);
            // Inverse of the cumulative power law.
            var m = Math.Log10(low + rng.NextDouble() * (high - low)) / CountSlope;
            var colour = Math.Clamp(0.65 + 0.35 * rng.NextGaussian(), -0.3, 2.2);
            stars.Add(Make(stars.Count, camera.FocalPlaneToSky(x, y), m, colour, options.Bands, placed: false));
        }

        // Bright stars, one per chip at least: cores above full well, the brightest with long bleed trails.
        var bright = Xoshiro256StarStar.For(options.Seed, RandomStream.BrightStars);
        var h = options.ChipHeight;
        var minFlux = 2.5 * NominalFullWell / MoffatProfile.PeakFraction(3.5, 3.0);
        var maxFlux = Math.Max(minFlux * 1.5, 0.1 * NominalFullWell * h);
        var brightCount = Math.Max(5, camera.Chips.Count);
        for (var i = 0; i < brightCount; i++)
        {
            var chip = camera.Chips[i % camera.Chips.Count];
            var local = new PixelPosition(bright.Uniform(0.12, 0.88) * chip.Width, bright.Uniform(0.15, 0.85) * chip.Height);
            var (fx, fy) = chip.ToFocalPlane(local);
            var flux = Math.Exp(bright.Uniform(Math.Log(minFlux), Math.Log(maxFlux)));
            var colour = Math.Clamp(0.65 + 0.3 * bright.NextGaussian(), -0.2, 1.8);
            stars.Add(Make(stars.Count, camera.FocalPlaneToSky(fx, fy), MagnitudeOf(flux), colour, options.Bands, placed: true));
        }

        // The ghost's source: the brightest star, near the middle of the second chip of the bottom row.
        var host = camera.Chips[Math.Min(1, options.ChipColumns - 1)];
        var (gx, gy) = host.ToFocalPlane(new PixelPosition(0.45 * host.Width, 0.35 * host.Height));
        var ghostId = stars.Count;
        stars.Add(Make(ghostId, camera.FocalPlaneToSky(gx, gy), MagnitudeOf(0.22 * NominalFullWell * h), 0.5, options.Bands, placed: true));
        return (stars, ghostId);
    }

    private static double MagnitudeOf(double referenceFlux) => ReferenceZeroPoint - 2.5 * Math.Log10(referenceFlux);

    private static CatalogueStar Make(int id, SkyCoordinate position, double magnitude, double colour,
        IReadOnlyList<DemoBand> bands, bool placed)
    {
        var flux = new double[bands.Count];
        for (var b = 0; b < bands.Count; b++)
            flux[b] = Math.Pow(10, 0.4 * (bands[b].ZeroPoint - (magnitude + bands[b].ColourTerm * colour)));
        return new CatalogueStar(id, position, magnitude, colour, flux, placed);
    }
}
