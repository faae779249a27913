using Mosaic.Demo.Camera;
using Mosaic.Demo.Randomness;

namespace Mosaic.Demo.Scene;

/// <summary>Draws the galaxies: discs (Sérsic n = 1) and spheroids (n = 4), bigger when brighter.</summary>
internal static class GalaxyCatalogue
{
    /// <summary>About 310 galaxies over the default field.</summary>
    private const double GalaxiesPerPixel = 4.4e-6;

    private const double Brightest = 14.5;
    private const double Faintest = 21.5;
    private const double CountSlope = 0.33;

    public static List<CatalogueGalaxy> Build(DemoFieldOptions options, CameraModel camera)
    {
        var rng = Xoshiro256StarStar.For(options.Seed, RandomStream.Galaxies);
        var halfW = camera.FieldWidth / 2;
        var halfH = camera.FieldHeight / 2;
        var count = Math.Max(3, (int)Math.Round(GalaxiesPerPixel * 4 * halfW * halfH));
        var low = Math.Pow(10, CountSlope * Brightest);
        var high = Math.Pow(10, CountSlope * Faintest);
        var galaxies = new List<CatalogueGalaxy>(count);
        for (var i = 0; i < count; i++)
        {
            var x = rng.Uniform(-halfW, halfW);
            var y = rng.Uniform(-halfH, halfH);
            var m = Math.Log10(low + rng.NextDouble() * (high - low)) / CountSlope;
            var spheroid = rng.NextDouble() < 0.3;
            var n = spheroid ? 4.0 : 1.0;
            // Size grows with brightness at roughly constant surface brightness, with a log-normal scatter.
            var baseRadius = spheroid ? 2.6 : 4.0;
            var re = Math.Clamp(baseRadius * Math.Pow(10, -0.2 * (m - 20)) * Math.Exp(0.3 * rng.NextGaussian()), 1.5, 45);
            var q = spheroid ? rng.Uniform(0.55, 1.0) : rng.Uniform(0.2, 1.0);
            var pa = rng.Uniform(0, 180);
            var colour = spheroid ? 1.15 + 0.12 * rng.NextGaussian() : 0.55 + 0.2 * rng.NextGaussian();
            var flux = new double[options.Bands.Count];
            for (var b = 0; b < flux.Length; b++)
            {
                var band = options.Bands[b];
                flux[b] = Math.Pow(10, 0.4 * (band.ZeroPoint - (m + band.ColourTerm * colour)));
            }
            galaxies.Add(new CatalogueGalaxy(i, camera.FocalPlaneToSky(x, y), m, colour, n, re, q, pa, flux));
        }
        return galaxies;
    }
}
