namespace Mosaic.Wcs.Tests.Projections;

/// <summary>
/// Every supported projection against astropy.wcs (Debian python3-astropy, wcslib inside) on the same cards:
/// sky positions within 1 milliarcsecond, pixels within 1e-6 px, and the same verdict on points with no solution.
/// </summary>
public sealed class AstropyAgreementTests
{
    private const double MilliArcsecond = 1.0 / 3.6e6;

    public static TheoryData<string, double, double, double> Cases => new()
    {
        // code, CRVAL1, CRVAL2, CD scale (deg/px); the large scales reach the edge of each projection's domain.
        { "TAN", 150.25, 2.5, 2.8e-4 },
        { "TAN", 10.0, -89.5, 2.8e-4 },     // near the south celestial pole, across RA = 0
        { "TAN", 45.0, 30.0, 0.05 },
        { "SIN", 210.0, 54.0, 2.8e-4 },
        { "SIN", 30.0, -20.0, 0.06 },       // the disc edge falls inside the image
        { "ARC", 120.0, 60.0, 0.2 },        // R > 180 deg reached in the corners
        { "STG", 300.0, -45.0, 0.1 },
        { "ZEA", 15.0, 75.0, 0.15 },        // R > 360/pi reached in the corners
        { "CAR", 180.0, 0.0, 0.05 },
        { "CAR", 80.0, 30.0, 0.02 },        // oblique: delta_p from LONPOLE/LATPOLE defaults (Paper II eq. 8)
        { "NCP", 60.0, 40.0, 2.8e-4 },
        { "CEA", 100.0, 10.0, 0.06 },       // |y| > 180/pi reached at the top and bottom
        { "MER", 200.0, -15.0, 0.04 },
        { "SFL", 0.0, 0.0, 0.2 },           // |phi| > 180 reached in the corners
        { "PAR", 340.0, 5.0, 0.2 },
        { "MOL", 0.0, 0.0, 0.2 },           // outside the ellipse in the corners
        { "MOL", 45.0, 60.0, 0.03 },
        { "AIT", 0.0, 0.0, 0.2 },           // outside the ellipse in the corners
        { "AIT", 266.0, -29.0, 0.05 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void PixelToSkyAgreesWithAstropy(string code, double crval1, double crval2, double scale)
    {
        var cards = Cards.Celestial(code, crval1, crval2, scale);
        Check(cards);
    }

    [Fact]
    public void SlantedSinAgreesWithAstropy()
    {
        var cards = Cards.Celestial("SIN", 95.0, -35.0, 0.03);
        cards["PV2_1"] = 0.12;
        cards["PV2_2"] = -0.3;
        Check(cards);
    }

    [Fact]
    public void CypAgreesWithAstropy()
    {
        Check(Cards.Celestial("CYP", 30.0, 20.0, 0.05));
        var cards = Cards.Celestial("CYP", 200.0, -10.0, 0.05);
        cards["PV2_1"] = 2.0;
        cards["PV2_2"] = 0.7;
        Check(cards);
    }

    [Fact]
    public void CeaWithLambdaAgreesWithAstropy()
    {
        var cards = Cards.Celestial("CEA", 120.0, 0.0, 0.05);
        cards["PV2_1"] = 0.6;
        Check(cards);
    }

    [Fact]
    public void ExplicitLonpoleAndLatpoleAgreeWithAstropy()
    {
        var cards = Cards.Celestial("CAR", 250.0, 20.0, 0.03);
        cards["LONPOLE"] = 30.0;
        cards["LATPOLE"] = -30.0;
        Check(cards);
        var zenithal = Cards.Celestial("TAN", 250.0, 20.0, 0.01);
        zenithal["LONPOLE"] = 170.0;
        Check(zenithal);
    }

    [Fact]
    public void LonpoleWithNoCelestialPoleIsRefused()
    {
        // Paper II eq. 8 with theta0 = 0: sin(delta0) = cos(delta_p) cos(phi_p - phi0) has no solution for
        // delta0 = 20 deg, LONPOLE = 150 deg (cos 150 < 0), so no rotation exists.
        var cards = Cards.Celestial("CAR", 250.0, 20.0, 0.03);
        cards["LONPOLE"] = 150.0;
        var error = Assert.Throws<Mosaic.Wcs.Header.WcsHeaderException>(() => Wcs.From(Cards.ToHeader(cards)));
        Assert.Equal("LONPOLE", error.Keyword);
    }

    internal static void Check(Dictionary<string, object> cards)
    {
        var wcs = Wcs.From(Cards.ToHeader(cards));
        var pixels = new List<(double X, double Y)> { ((double)cards["CRPIX1"], (double)cards["CRPIX2"]) };
        for (var i = 0; i <= 6; i++)
            for (var j = 0; j <= 6; j++)
                pixels.Add((1 + i * 333.0 + 0.3 * j, 1 + j * 333.0 - 0.2 * i));
        // Sky points: our own sky answers on the grid plus the far side of the sphere.
        var sky = new List<(double Lon, double Lat)>();
        foreach (var (x, y) in pixels)
            if (wcs.TryPixelToSky(x, y, out var ra, out var dec)) sky.Add((ra, dec));
        var crval1 = (double)cards["CRVAL1"];
        var crval2 = (double)cards["CRVAL2"];
        sky.Add((crval1 + 150, -0.8 * crval2));
        sky.Add((crval1 + 100, -crval2 * 0.5));

        var reference = AstropyReference.Transform(cards, pixels, sky);
        var context = AstropyReference.Describe(cards);
        var solved = 0;
        for (var k = 0; k < pixels.Count; k++)
        {
            var (x, y) = pixels[k];
            var ours = wcs.TryPixelToSky(x, y, out var ra, out var dec);
            var theirs = reference.Sky[k];
            Assert.True(ours == theirs.HasValue, $"pixel ({x}, {y}): ours solvable={ours}, astropy={theirs.HasValue}; {context}");
            if (!ours) continue;
            solved++;
            var (tra, tdec) = theirs!.Value;
            var separation = Separation(ra, dec, tra, tdec);
            Assert.True(separation < MilliArcsecond,
                $"pixel ({x}, {y}): ({ra}, {dec}) vs astropy ({tra}, {tdec}), {separation * 3.6e6:F4} mas; {context}");
            // Round trip through our own inverse (requirement: 1e-6 px).
            Assert.True(wcs.TrySkyToPixel(ra, dec, out var bx, out var by), $"round trip of ({x}, {y}) failed; {context}");
            Assert.True(Math.Abs(bx - x) < 1e-6 && Math.Abs(by - y) < 1e-6, $"round trip ({x}, {y}) -> ({bx}, {by}); {context}");
        }
        Assert.True(solved >= 8, $"too few solvable pixels ({solved}) for a meaningful check; {context}");

        for (var k = 0; k < sky.Count; k++)
        {
            var (lon, lat) = sky[k];
            var ours = wcs.TrySkyToPixel(lon, lat, out var x, out var y);
            var theirs = reference.Pixels[k];
            if (k < sky.Count - 2)
            {
                Assert.True(ours && theirs.HasValue, $"sky ({lon}, {lat}): ours={ours}, astropy={theirs.HasValue}; {context}");
            }
            // Far-side points: where both answer they must agree; where astropy has no answer we must have none.
            if (!theirs.HasValue) { Assert.False(ours, $"sky ({lon}, {lat}) has no image in astropy but we gave ({x}, {y}); {context}"); continue; }
            if (!ours) continue;
            var (tx, ty) = theirs.Value;
            Assert.True(Math.Abs(tx - x) < 1e-6 && Math.Abs(ty - y) < 1e-6,
                $"sky ({lon}, {lat}): ({x}, {y}) vs astropy ({tx}, {ty}); {context}");
        }
    }

    /// <summary>Great-circle distance in degrees (Vincenty form, common practice for small angles).</summary>
    private static double Separation(double ra1, double dec1, double ra2, double dec2)
    {
        const double d2r = Math.PI / 180;
        double dra = (ra2 - ra1) * d2r, p1 = dec1 * d2r, p2 = dec2 * d2r;
        var num1 = Math.Cos(p2) * Math.Sin(dra);
        var num2 = Math.Cos(p1) * Math.Sin(p2) - Math.Sin(p1) * Math.Cos(p2) * Math.Cos(dra);
        var den = Math.Sin(p1) * Math.Sin(p2) + Math.Cos(p1) * Math.Cos(p2) * Math.Cos(dra);
        return Math.Atan2(Math.Sqrt(num1 * num1 + num2 * num2), den) / d2r;
    }
}
