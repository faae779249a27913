using Mosaic.Canvas.Tests.Fields;
using Xunit.Abstractions;

namespace Mosaic.Canvas.Tests;

/// <summary>
/// Two bands of one field on different pixel grids (four 300 x 200 SIP chips at 1.5e-4 deg/px; two 380 x 260 plain
/// TAN chips at 1.2e-4 deg/px, turned 1.5°) share one plan: a star painted at one sky position in both lands on the
/// same canvas pixel, the one astropy gives for that position with the canvas header.
/// </summary>
public sealed class BandAlignmentTests(ITestOutputHelper output)
{
    private const double StarSigma = 2.0;     // canvas pixels
    private const double Background = 10;

    [Fact]
    public void A_star_at_one_sky_position_lands_on_the_same_canvas_pixel_in_bands_of_different_grids()
    {
        double ra0 = TestFields.FieldRa, dec0 = TestFields.FieldDec;
        var coarse = TestFields.GapsAndOverlap().Specs.Select(s => s with { Values = (_, _) => 0f }).ToList();
        List<ChipSpec> fine =
        [
            new("FINE-1", 380, 260, -100 * 1.25, -60 * 1.25, 1.5) { Scale = 1.2e-4 },
            new("FINE-2", 380, 260, 150 * 1.25, 90 * 1.25, 1.5) { Scale = 1.2e-4 },
        ];
        // The plan comes from the headers alone; the star's pixel in every chip and on the canvas then from astropy.
        var headers = coarse.Concat(fine).Select(s => (IReadOnlyDictionary<string, object>)s.Cards(ra0, dec0)).ToList();
        var footprints = coarse.Concat(fine).Zip(headers, (s, h) => new ChipFootprint(s.Name, s.Width, s.Height, Wcs.Wcs.From(ToHeader(h)))).ToList();
        var plan = CanvasPlan.Create(footprints);
        var star = Gnomonic.Offset(ra0, dec0, -170 * 1.5e-4, -100 * 1.5e-4);
        var (chipPixels, canvasPixels) = CanvasReference.Sky(plan, headers, [star]);
        var truth = canvasPixels[0]!.Value;

        List<ChipSpec> Paint(List<ChipSpec> specs, int offset) => specs.Select((s, i) =>
        {
            var at = chipPixels[offset + i][0];
            var sigma = StarSigma * plan.PixelScale / s.Scale;
            return s with
            {
                Values = (x, y) =>
                {
                    if (at is not { } p) return (float)Background;
                    double dx = x + 1 - p.X, dy = y + 1 - p.Y;     // 0-based sample → 1-based position
                    return (float)(Background + 500 * Math.Exp(-(dx * dx + dy * dy) / (2 * sigma * sigma)));
                },
            };
        }).ToList();
        using var bandA = new SyntheticField(ra0, dec0, Paint(coarse, 0));
        using var bandB = new SyntheticField(ra0, dec0, Paint(fine, coarse.Count));
        var a = Centroid(new CanvasBand(plan, bandA.Chips), plan, truth);
        var b = Centroid(new CanvasBand(plan, bandB.Chips), plan, truth);
        output.WriteLine($"astropy ({truth.X:F4}, {truth.Y:F4}); coarse band ({a.X:F4}, {a.Y:F4}); fine band ({b.X:F4}, {b.Y:F4})");
        // A centroid of a resampled Gaussian of sigma 2 px: common practice puts its error at about a hundredth of a pixel.
        Assert.True(Distance(a, truth) < 0.02, $"coarse band star at ({a.X}, {a.Y}), astropy says ({truth.X}, {truth.Y})");
        Assert.True(Distance(b, truth) < 0.02, $"fine band star at ({b.X}, {b.Y}), astropy says ({truth.X}, {truth.Y})");
        Assert.True(Distance(a, b) < 0.02);
    }

    private static Fits.Header ToHeader(IReadOnlyDictionary<string, object> cards) =>
        new(cards.Select(c => new Fits.HeaderCard(c.Key, c.Value, null)).ToList());

    private static double Distance((double X, double Y) p, (double X, double Y) q) => Math.Sqrt(Math.Pow(p.X - q.X, 2) + Math.Pow(p.Y - q.Y, 2));

    /// <summary>Background-subtracted first moment in a 15 x 15 window around the expected pixel.</summary>
    private static (double X, double Y) Centroid(CanvasBand band, CanvasPlan plan, (double X, double Y) around)
    {
        int cx = (int)Math.Round(around.X), cy = (int)Math.Round(around.Y);
        double sum = 0, sx = 0, sy = 0;
        var row = new float[15];
        for (var y = cy - 7; y <= cy + 7; y++)
        {
            band.Plane.ReadRow(y - 1, cx - 8, row);
            for (var i = 0; i < 15; i++)
            {
                var w = row[i] - Background;
                Assert.True(double.IsFinite(w), $"canvas ({cx - 7 + i}, {y}) has no value");
                sum += w; sx += w * (cx - 7 + i); sy += w * y;
            }
        }
        Assert.True(sum > 1000, "no star there");
        return (sx / sum, sy / sum);
    }
}
