using Mosaic.Canvas.Tests.Fields;

namespace Mosaic.Canvas.Tests;

/// <summary>Chip placement on the canvas against astropy.wcs (Debian's python3-astropy): chip pixel → sky by the chip's
/// own header read from the file (all_pix2world, SIP included) → canvas pixel by the plan's header.</summary>
public sealed class PlacementTests
{
    private const double Tolerance = 1e-6;

    [Fact]
    public void Sip_chips_with_gaps_and_an_overlap_are_placed_as_astropy_places_them()
    {
        using var field = TestFields.GapsAndOverlap();
        CheckPlacement(field);
    }

    [Fact]
    public void A_chip_across_RA_zero_is_placed_as_astropy_places_it()
    {
        using var field = TestFields.AcrossRaZero();
        var plan = CheckPlacement(field);
        // The field centre lies between the chips, just east of RA 0 (mean of unit vectors, not of RA numbers).
        var crval1 = (double)plan.Header.Find("CRVAL1")!.Value!;
        Assert.True(crval1 < 1 || crval1 > 359, $"CRVAL1 = {crval1}");
    }

    [Fact]
    public void The_plan_centre_and_scale_follow_their_definitions_computed_by_astropy()
    {
        using var field = TestFields.GapsAndOverlap();
        var plan = CanvasPlan.Create(field.Footprints);
        var (ra, dec, scale) = CanvasReference.Centre(field);
        Assert.Equal(ra, (double)plan.Header.Find("CRVAL1")!.Value!, 9);
        Assert.Equal(dec, (double)plan.Header.Find("CRVAL2")!.Value!, 9);
        // Our scale is a central difference of one pixel; astropy's the area of the CD matrix at CRPIX (= the centre).
        Assert.InRange(plan.PixelScale / scale, 1 - 1e-7, 1 + 1e-7);
        Assert.Equal(-plan.PixelScale, (double)plan.Header.Find("CD1_1")!.Value!);
        Assert.Equal(plan.PixelScale, (double)plan.Header.Find("CD2_2")!.Value!);
        Assert.Equal(0.0, (double)plan.Header.Find("CD1_2")!.Value!);
    }

    [Fact]
    public void Equal_chips_give_equal_fingerprints_and_a_moved_chip_another()
    {
        using var field = TestFields.GapsAndOverlap();
        using var other = TestFields.AcrossRaZero();
        var a = CanvasPlan.Create(field.Footprints);
        var b = CanvasPlan.Create(field.Footprints.Reverse().ToList());
        Assert.Equal(a.Fingerprint, b.Fingerprint);     // the mean and median do not depend on the order (common practice: exact for this field)
        Assert.NotEqual(a.Fingerprint, CanvasPlan.Create(field.Footprints.Take(3).ToList()).Fingerprint);
        Assert.NotEqual(a.Fingerprint, CanvasPlan.Create(other.Footprints).Fingerprint);
        Assert.Equal(16, a.Fingerprint.Length);
    }

    private static CanvasPlan CheckPlacement(SyntheticField field)
    {
        var plan = CanvasPlan.Create(field.Footprints);
        var band = new CanvasBand(plan, field.Chips);

        // The outline vertices by their documented rule, re-derived here; then the pixel-centre corners and the centre.
        var outlines = field.Specs.Select(s => EdgePoints(s.Width, s.Height, CanvasBand.OutlineStep)).ToList();
        var marks = field.Specs.Select(s => (IReadOnlyList<(double X, double Y)>)
            [(1, 1), (s.Width, 1), (s.Width, s.Height), (1, s.Height), ((s.Width + 1) / 2.0, (s.Height + 1) / 2.0)]).ToList();
        var reference = CanvasReference.Place(plan, field,
            outlines.Select((o, c) => (IReadOnlyList<(double X, double Y)>)[.. o, .. marks[c]]).ToList());

        double minX = double.MaxValue, minY = double.MaxValue, maxX = double.MinValue, maxY = double.MinValue;
        for (var c = 0; c < field.Chips.Count; c++)
        {
            var outline = band.Chips[c].Outline;
            Assert.Equal(outlines[c].Count, outline.Count);
            Assert.Equal(outline[0], outline[^1]);
            for (var i = 0; i < outline.Count; i++)
            {
                var (x, y) = reference[c][i] ?? throw new Xunit.Sdk.XunitException("astropy found no canvas pixel");
                Assert.True(Math.Abs(outline[i].X - x) < Tolerance && Math.Abs(outline[i].Y - y) < Tolerance,
                    $"{field.Specs[c].Name} vertex {i}: ours ({outline[i].X}, {outline[i].Y}), astropy ({x}, {y})");
                minX = Math.Min(minX, x); maxX = Math.Max(maxX, x); minY = Math.Min(minY, y); maxY = Math.Max(maxY, y);
            }
        }
        // Every outline on the canvas with a margin of one pixel: canvas pixel 1 spans [0.5, 1.5).
        Assert.InRange(minX, 1.5 - Tolerance, 1.6);
        Assert.InRange(minY, 1.5 - Tolerance, 1.6);
        Assert.InRange(plan.Width - 0.5 - maxX, -Tolerance, 1.1);
        Assert.InRange(plan.Height - 0.5 - maxY, -Tolerance, 1.1);

        // Corners and centres located back on their chips by the exact chain; the owner by the overlap rule, from astropy.
        var points = field.Specs.Select((_, c) => reference[c].Skip(outlines[c].Count).Select(p => p!.Value).ToList()).SelectMany(p => p).ToList();
        var (positions, centres) = CanvasReference.Map(plan, field, points);
        for (var p = 0; p < points.Count; p++)
        {
            int own = p / 5, expected = Owner(field, positions[p], centres, points[p]);
            Assert.True(band.TryLocate(points[p].X, points[p].Y, out var chip, out var chipX, out var chipY), $"point {p} not located");
            Assert.Equal(expected, chip.Index);
            var (ex, ey) = positions[p][expected]!.Value;
            Assert.True(Math.Abs(chipX - ex) < Tolerance && Math.Abs(chipY - ey) < Tolerance,
                $"{chip.Name}: ours ({chipX}, {chipY}), astropy ({ex}, {ey})");
            if (p % 5 == 4)
            {
                // A chip's centre is always its own, at its centre pixel.
                Assert.Equal(own, chip.Index);
                var spec = field.Specs[own];
                Assert.True(Math.Abs(chipX - (spec.Width + 1) / 2.0) < Tolerance && Math.Abs(chipY - (spec.Height + 1) / 2.0) < Tolerance);
                Assert.True(Math.Abs(band.Chips[own].Centre.X - centres[own].X) < Tolerance && Math.Abs(band.Chips[own].Centre.Y - centres[own].Y) < Tolerance);
            }
        }
        return plan;
    }

    /// <summary>The owner by the overlap rule from astropy's positions: held (0.5 ≤ x &lt; W + 0.5, same for y), nearest centre, first on a tie.</summary>
    internal static int Owner(SyntheticField field, IReadOnlyList<(double X, double Y)?> positions, IReadOnlyList<(double X, double Y)> centres, (double X, double Y) canvas)
    {
        int owner = -1;
        var best = double.PositiveInfinity;
        for (var c = 0; c < positions.Count; c++)
        {
            if (positions[c] is not { } q) continue;
            var s = field.Specs[c];
            if (!(q.X >= 0.5 && q.X < s.Width + 0.5 && q.Y >= 0.5 && q.Y < s.Height + 0.5)) continue;
            var d = Math.Pow(canvas.X - centres[c].X, 2) + Math.Pow(canvas.Y - centres[c].Y, 2);
            if (d < best) { best = d; owner = c; }
        }
        return owner;
    }

    /// <summary>The documented outline rule: from (0.5, 0.5) counter-clockwise, ceil(length / step) equal steps per edge, closed.</summary>
    internal static IReadOnlyList<(double X, double Y)> EdgePoints(int w, int h, int step)
    {
        int nx = (int)Math.Ceiling((double)w / step), ny = (int)Math.Ceiling((double)h / step);
        var points = new List<(double, double)>();
        for (var i = 0; i < nx; i++) points.Add((0.5 + w * (double)i / nx, 0.5));
        for (var i = 0; i < ny; i++) points.Add((w + 0.5, 0.5 + h * (double)i / ny));
        for (var i = 0; i < nx; i++) points.Add((w + 0.5 - w * (double)i / nx, h + 0.5));
        for (var i = 0; i < ny; i++) points.Add((0.5, h + 0.5 - h * (double)i / ny));
        points.Add((0.5, 0.5));
        return points;
    }
}
