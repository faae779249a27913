using Mosaic.Canvas.Tests.Fields;
using Xunit.Abstractions;

namespace Mosaic.Canvas.Tests;

/// <summary>
/// Chips at the canvas's own scale, unturned and without distortion: along a canvas row the chip columns then advance
/// one by one, the case the vector loop reads with plain loads instead of gathers. The canvas must still match the
/// reference resampling and the one-pixel-at-a-time path bit for bit.
/// </summary>
public sealed class ResamplingPathTests(ITestOutputHelper output)
{
    /// <summary>As in <see cref="ResamplingTests"/>: the pattern's slope times a 0.005 px position error, plus float rounding near 2000.</summary>
    private const double ValueTolerance = 0.02;

    private static SyntheticField Unturned() => new(TestFields.FieldRa, TestFields.FieldDec,
    [
        new ChipSpec("CCD-P", 300, 200, -160, 0, 0) { Values = TestFields.Pattern(1) },
        new ChipSpec("CCD-Q", 300, 200, 160, 0, 0) { Values = TestFields.Pattern(2) },
    ]);

    [Fact]
    public void Unturned_chips_at_the_canvas_scale_match_the_reference_resampling()
    {
        using var field = Unturned();
        var plan = CanvasPlan.Create(field.Footprints);
        var band = new CanvasBand(plan, field.Chips);
        // Outside reference: numpy resampling at astropy.wcs positions (Reference/canvas_reference.py).
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
                0 or 3 => float.IsNaN(ours[i]),
                1 or 2 => Math.Abs(ours[i] - reference.Values[i]) <= ValueTolerance,
                _ => true,
            };
            if (!ok && mismatches.Count < 10)
                mismatches.Add($"canvas ({i % plan.Width + 1}, {i / plan.Width + 1}) class {cls}: ours {ours[i]}, reference {reference.Values[i]}");
        }
        output.WriteLine($"outside {counts[0]}, bilinear {counts[1]}, nearest {counts[2]}, masked {counts[3]}, ambiguous {counts[255]}");
        Assert.True(mismatches.Count == 0, string.Join("\n", mismatches));
        Assert.True(counts[1] > 100000 && counts[3] > 100, string.Join(", ", counts.Take(4)));
    }

    [Fact]
    public void Unturned_chips_give_the_same_bits_in_strips_as_pixel_by_pixel()
    {
        using var field = Unturned();
        var plan = CanvasPlan.Create(field.Footprints);
        var band = new CanvasBand(plan, field.Chips);
        var whole = new float[plan.Width * plan.Height];
        band.Plane.ReadRows(0, plan.Height, whole);
        Assert.True(whole.Count(float.IsFinite) > plan.Width * plan.Height / 2, "most of the canvas should be on a chip");

        // A single value is read one pixel at a time, the scalar path; every pixel of every 9th row, NaN included.
        for (var y = 0; y < plan.Height; y += 9)
            for (var x = 0; x < plan.Width; x++)
            {
                var one = (float)band.Plane.ReadValue(x, y);
                var strip = whole[y * plan.Width + x];
                Assert.True(BitConverter.SingleToInt32Bits(one) == BitConverter.SingleToInt32Bits(strip) || (float.IsNaN(one) && float.IsNaN(strip)),
                    $"canvas ({x + 1}, {y + 1}): strip {strip}, single pixel {one}");
            }
    }
}
