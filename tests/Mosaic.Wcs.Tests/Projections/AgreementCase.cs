using System.Globalization;

namespace Mosaic.Wcs.Tests.Projections;

/// <summary>
/// One card set checked against astropy.wcs: a grid of pixels over a 2000 x 2000 image plus the reference pixel, and
/// sky points made of our own answers on that grid plus two far-side points. <see cref="Verify"/> asserts sky
/// positions within 1 mas, pixels within 1e-6 px, our round trips within 1e-6 px, and the same verdict where a point
/// has no solution.
/// </summary>
internal sealed class AgreementCase
{
    public const double MilliArcsecond = 1.0 / 3.6e6;

    private AgreementCase(string name, Dictionary<string, object> cards, Dictionary<string, object> referenceCards, Wcs wcs,
        List<(double X, double Y)> pixels, List<(double Lon, double Lat)> sky)
    {
        Name = name; Cards = cards; ReferenceCards = referenceCards; Wcs = wcs; Pixels = pixels; Sky = sky;
    }

    public string Name { get; }
    public Dictionary<string, object> Cards { get; }
    /// <summary>The cards astropy gets: the same, or an equivalent WCS written another way.</summary>
    public Dictionary<string, object> ReferenceCards { get; }
    public Wcs Wcs { get; }
    public List<(double X, double Y)> Pixels { get; }
    public List<(double Lon, double Lat)> Sky { get; }
    private int _ownCount;

    /// <summary>Adds a sky point whose verdict (image or none) must be the same in both, and the pixel too where there is one, as for the far-side points.</summary>
    public void AddStrictSky(double lon, double lat) => Sky.Add((lon, lat));

    public static AgreementCase Prepare(string name, Dictionary<string, object> cards, Dictionary<string, object>? referenceCards = null)
    {
        var wcs = Mosaic.Wcs.Wcs.From(Tests.Cards.ToHeader(cards));
        var pixels = new List<(double X, double Y)> { ((double)cards["CRPIX1"], (double)cards["CRPIX2"]) };
        for (var i = 0; i <= 6; i++)
            for (var j = 0; j <= 6; j++)
                pixels.Add((1 + i * 333.0 + 0.3 * j, 1 + j * 333.0 - 0.2 * i));
        var sky = new List<(double Lon, double Lat)>();
        foreach (var (x, y) in pixels)
            if (wcs.TryPixelToSky(x, y, out var ra, out var dec)) sky.Add((ra, dec));
        // From the header as read (degrees, longitude then latitude), whatever the units and axis order of the cards.
        double crval1 = wcs.Header.CrVal1, crval2 = wcs.Header.CrVal2;
        var own = sky.Count;
        sky.Add((crval1 + 150, -0.8 * crval2));
        sky.Add((crval1 + 100, -crval2 * 0.5));
        return new AgreementCase(name, cards, referenceCards ?? cards, wcs, pixels, sky) { _ownCount = own };
    }

    /// <summary>The largest disagreements found, for the record.</summary>
    public sealed record Result(int Solved, int Unsolved, double MaxMas, double MaxPixel, double MaxRoundTrip);

    /// <param name="expectUnsolved">The grid reaches outside the projection's domain: at least one pixel must have no solution in both.</param>
    /// <param name="repeatedPlane">The projection plane shows some of the sky twice (the quad-cube cross wraps around in x),
    /// so a round trip may land on the other copy: it must then show the same sky point.</param>
    /// <param name="roundTripTolerance">Pixels a pixel -> sky -> pixel round trip may move (1e-6 unless the projection's two directions are not exact inverses).</param>
    public Result Verify(AstropyReference.Answer reference, bool expectUnsolved = false, bool repeatedPlane = false, double roundTripTolerance = 1e-6)
    {
        var context = Name + ": " + AstropyReference.Describe(Cards) + (ReferenceCards == Cards ? "" : "; reference " + AstropyReference.Describe(ReferenceCards));
        int solved = 0, unsolved = 0;
        double maxMas = 0, maxPixel = 0, maxRoundTrip = 0;
        for (var k = 0; k < Pixels.Count; k++)
        {
            var (x, y) = Pixels[k];
            var ours = Wcs.TryPixelToSky(x, y, out var ra, out var dec);
            var theirs = reference.Sky[k];
            Assert.True(ours == theirs.HasValue, $"pixel ({x}, {y}): ours solvable={ours} ({ra}, {dec}), astropy={theirs.HasValue}; {context}");
            if (!ours) { unsolved++; continue; }
            solved++;
            var (tra, tdec) = theirs!.Value;
            var separation = Separation(ra, dec, tra, tdec);
            maxMas = Math.Max(maxMas, separation / MilliArcsecond);
            Assert.True(separation < MilliArcsecond,
                $"pixel ({x}, {y}): ({ra}, {dec}) vs astropy ({tra}, {tdec}), {separation * 3.6e6:F4} mas; {context}");
            Assert.True(Wcs.TrySkyToPixel(ra, dec, out var bx, out var by), $"round trip of ({x}, {y}) failed; {context}");
            var roundTrip = Math.Max(Math.Abs(bx - x), Math.Abs(by - y));
            if (repeatedPlane && roundTrip >= Math.Max(roundTripTolerance, 1e-3))
            {
                Assert.True(Wcs.TryPixelToSky(bx, by, out var ra2, out var dec2), $"round trip ({x}, {y}) -> ({bx}, {by}) has no sky; {context}");
                // The other copy shows the same sky point, to the round trip's own tolerance turned into an angle.
                var scale = Math.Sqrt(Math.Abs(Wcs.Header.Cd11 * Wcs.Header.Cd22 - Wcs.Header.Cd12 * Wcs.Header.Cd21));
                var allowed = Math.Max(MilliArcsecond, roundTripTolerance * scale);
                Assert.True(Separation(ra, dec, ra2, dec2) < allowed, $"round trip ({x}, {y}) -> ({bx}, {by}) is another sky point; {context}");
                continue;
            }
            maxRoundTrip = Math.Max(maxRoundTrip, roundTrip);
            Assert.True(roundTrip < roundTripTolerance, $"round trip ({x}, {y}) -> ({bx}, {by}); {context}");
        }
        Assert.True(solved >= 8, $"too few solvable pixels ({solved}) for a meaningful check; {context}");
        if (expectUnsolved) Assert.True(unsolved > 0, $"the grid was meant to reach outside the domain but every pixel solved; {context}");

        for (var k = 0; k < Sky.Count; k++)
        {
            var (lon, lat) = Sky[k];
            var ours = Wcs.TrySkyToPixel(lon, lat, out var x, out var y);
            var theirs = reference.Pixels[k];
            // Our own sky answers must have an image in both; the far-side and added points the same verdict in both.
            if (k < _ownCount)
                Assert.True(ours && theirs.HasValue, $"sky ({lon}, {lat}): ours={ours}, astropy={theirs.HasValue}; {context}");
            else
                Assert.True(ours == theirs.HasValue, $"sky ({lon}, {lat}): ours={ours} ({x}, {y}), astropy={theirs.HasValue}; {context}");
            if (!ours) continue;
            var (tx, ty) = theirs!.Value;
            var miss = Math.Max(Math.Abs(tx - x), Math.Abs(ty - y));
            maxPixel = Math.Max(maxPixel, miss);
            Assert.True(miss < 1e-6, $"sky ({lon}, {lat}): ({x}, {y}) vs astropy ({tx}, {ty}); {context}");
        }
        return new Result(solved, unsolved, maxMas, maxPixel, maxRoundTrip);
    }

    public static string Report(string name, Result r) => string.Create(CultureInfo.InvariantCulture,
        $"{name}: {r.Solved} solved, {r.Unsolved} without solution; max {r.MaxMas:E2} mas, sky->pixel {r.MaxPixel:E2} px, round trip {r.MaxRoundTrip:E2} px");

    /// <summary>Great-circle distance in degrees (Vincenty form, common practice for small angles).</summary>
    public static double Separation(double ra1, double dec1, double ra2, double dec2)
    {
        const double d2r = Math.PI / 180;
        double dra = (ra2 - ra1) * d2r, p1 = dec1 * d2r, p2 = dec2 * d2r;
        var num1 = Math.Cos(p2) * Math.Sin(dra);
        var num2 = Math.Cos(p1) * Math.Sin(p2) - Math.Sin(p1) * Math.Cos(p2) * Math.Cos(dra);
        var den = Math.Sin(p1) * Math.Sin(p2) + Math.Cos(p1) * Math.Cos(p2) * Math.Cos(dra);
        return Math.Atan2(Math.Sqrt(num1 * num1 + num2 * num2), den) / d2r;
    }
}
