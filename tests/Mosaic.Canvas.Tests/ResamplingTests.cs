using Mosaic.Canvas.Tests.Fields;
using Xunit.Abstractions;

namespace Mosaic.Canvas.Tests;

/// <summary>
/// The resampled canvas against a numpy reference of the documented method (bilinear where the four neighbours are
/// finite, else nearest; NaN outside every chip; the nearest chip centre owns an overlap) at exact positions from
/// astropy.wcs. Pixels where the method's result jumps within 0.01 chip px of the exact position (chip edges, seams,
/// a change between bilinear and nearest) are left out of the value comparison; they must be few.
/// </summary>
public sealed class ResamplingTests(ITestOutputHelper output)
{
    /// <summary>Value tolerance: the pattern's slope (at most ~3.3 per px, see TestFields.Pattern) times a 0.005 px
    /// position error, plus the float rounding of values near 4000.</summary>
    private const double ValueTolerance = 0.02;

    [Fact]
    public void The_canvas_matches_the_reference_resampling_pixel_for_pixel()
    {
        using var field = TestFields.GapsAndOverlap();
        var plan = CanvasPlan.Create(field.Footprints);
        var band = new CanvasBand(plan, field.Chips);
        var reference = CanvasReference.Resample(plan, field, eps: 0.01, jump: 1.0);
        var ours = new float[plan.Width * plan.Height];
        band.Plane.ReadRows(0, plan.Height, ours);

        Assert.Equal(ours.Length, reference.Values.Length);
        var counts = new int[256];
        var mismatches = new List<string>();
        for (var i = 0; i < ours.Length; i++)
        {
            var cls = reference.Classes[i];
            counts[cls]++;
            var ok = cls switch
            {
                0 or 3 => float.IsNaN(ours[i]),                    // gaps, off the field, and masked pixels
                1 or 2 => Math.Abs(ours[i] - reference.Values[i]) <= ValueTolerance,
                _ => true,                                           // ambiguous
            };
            if (!ok && mismatches.Count < 10)
                mismatches.Add($"canvas ({i % plan.Width + 1}, {i / plan.Width + 1}) class {cls}: ours {ours[i]}, reference {reference.Values[i]}");
        }
        output.WriteLine($"outside {counts[0]}, bilinear {counts[1]}, nearest {counts[2]}, masked {counts[3]}, ambiguous {counts[255]}");
        Assert.True(mismatches.Count == 0, string.Join("\n", mismatches));
        // Every case must actually occur in this field.
        Assert.True(counts[0] > 10000 && counts[1] > 100000 && counts[2] > 50 && counts[3] > 200, string.Join(", ", counts.Take(4)));
        Assert.True(counts[255] < ours.Length / 100, $"{counts[255]} ambiguous pixels");
    }

    [Fact]
    public void Gaps_are_NaN_and_have_no_chip_and_overlaps_follow_the_nearest_centre()
    {
        using var field = TestFields.GapsAndOverlap();
        var plan = CanvasPlan.Create(field.Footprints);
        var band = new CanvasBand(plan, field.Chips);
        var reference = CanvasReference.Resample(plan, field, eps: 0.01, jump: 1.0);
        var ours = new float[plan.Width * plan.Height];
        band.Plane.ReadRows(0, plan.Height, ours);

        int gaps = 0, overlapped = 0;
        var ownersInOverlap = new HashSet<int>();
        for (var i = 0; i < ours.Length; i++)
        {
            if (reference.Classes[i] == 255) continue;
            double x = i % plan.Width + 1, y = i / plan.Width + 1;
            if (reference.Held[i] == 0)
            {
                gaps++;
                Assert.True(float.IsNaN(ours[i]), $"gap pixel ({x}, {y}) = {ours[i]}");
                if (gaps % 37 == 0) Assert.False(band.TryLocate(x, y, out _, out _, out _), $"gap pixel ({x}, {y}) located");
            }
            else if (reference.Held[i] >= 2)
            {
                overlapped++;
                var owner = reference.Owners[i] - 1;
                ownersInOverlap.Add(owner);
                Assert.True(band.TryLocate(x, y, out var chip, out _, out _));
                Assert.Equal(owner, chip.Index);
                // The pattern puts the chip number in the thousands: the value shows which chip gave it.
                if (float.IsFinite(ours[i])) Assert.Equal(owner + 1, (int)Math.Round(ours[i] / 1000.0));
            }
        }
        output.WriteLine($"{gaps} gap pixels, {overlapped} overlapped, owners there: {string.Join(", ", ownersInOverlap)}");
        Assert.True(gaps > 10000);
        // The upper two chips overlap: both sides of the seam are seen.
        Assert.True(overlapped > 500 && ownersInOverlap.SetEquals([2, 3]), $"{overlapped} overlapped, owners {string.Join(", ", ownersInOverlap)}");
    }

    [Fact]
    public void Strips_partial_rows_single_values_and_parallel_reads_give_the_same_pixels()
    {
        using var field = TestFields.GapsAndOverlap();
        var plan = CanvasPlan.Create(field.Footprints);
        var band = new CanvasBand(plan, field.Chips);
        var whole = new float[plan.Width * plan.Height];
        // The whole canvas in one read is split over two threads; the 7-row strips below are not.
        Assert.True(whole.Length >= CanvasPlane.ParallelPixels && 7 * plan.Width < CanvasPlane.ParallelPixels, $"a {plan.Width} x {plan.Height} canvas does not exercise both paths");
        band.Plane.ReadRows(0, plan.Height, whole);
        Assert.Contains(whole, float.IsFinite);

        var strips = new float[whole.Length];
        Parallel.For(0, (plan.Height + 6) / 7, s =>
        {
            var y = s * 7;
            var rows = Math.Min(7, plan.Height - y);
            band.Plane.ReadRows(y, rows, strips.AsSpan(y * plan.Width, rows * plan.Width));
        });
        Assert.Equal(whole, strips);

        var random = new Random(7);
        for (var k = 0; k < 300; k++)
        {
            int y = random.Next(plan.Height), x = random.Next(plan.Width), n = random.Next(1, plan.Width - x + 1);
            var part = new float[n];
            band.Plane.ReadRow(y, x, part);
            Assert.Equal(whole.AsSpan(y * plan.Width + x, n).ToArray(), part);
            Assert.Equal(whole[y * plan.Width + x], (float)band.Plane.ReadValue(x, y));
        }
    }

    [Fact]
    public void The_canvas_plane_describes_itself_as_the_contract_says()
    {
        using var field = TestFields.GapsAndOverlap();
        var plan = CanvasPlan.Create(field.Footprints);
        var plane = new CanvasBand(plan, field.Chips).Plane;
        Assert.Equal((plan.Width, plan.Height, -32, -1, field.FilePath), (plane.Width, plane.Height, plane.BitPix, plane.HduIndex, plane.FilePath));
        Assert.Throws<ArgumentOutOfRangeException>(() => plane.ReadRows(plan.Height - 1, 2, new float[2 * plan.Width]));
    }
}
