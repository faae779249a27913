using Mosaic.Canvas.Tests.Fields;
using Xunit.Abstractions;

namespace Mosaic.Canvas.Tests;

/// <summary>The interpolated canvas → chip mapping (exact on a 16-pixel grid, bilinear between) against the exact
/// chain computed by astropy.wcs: canvas pixel → sky by the canvas header → chip pixel by all_world2pix (SIP).</summary>
public sealed class MappingTests(ITestOutputHelper output)
{
    /// <summary>The goal for the interpolation error, chip pixels (the contract of issue 6).</summary>
    private const double Goal = 0.01;

    [Theory]
    [InlineData(1.0)]   // about half a pixel of distortion at the chip corners
    [InlineData(6.0)]   // about three pixels
    public void Interpolated_chip_positions_stay_within_a_hundredth_of_a_pixel_of_the_exact_chain(double sip)
    {
        using var field = TestFields.GapsAndOverlap(sip);
        var plan = CanvasPlan.Create(field.Footprints);
        var band = new CanvasBand(plan, field.Chips);
        var random = new Random(20261201);
        var points = Enumerable.Range(0, 4000)
            .Select(_ => (X: 1 + random.Next(plan.Width) + 0.0, Y: 1 + random.Next(plan.Height) + 0.0)).ToList();
        var (positions, _) = CanvasReference.Map(plan, field, points);
        double worst = 0;
        var compared = 0;
        for (var p = 0; p < points.Count; p++)
            for (var c = 0; c < field.Chips.Count; c++)
            {
                if (positions[p][c] is not { } exact) continue;
                var spec = field.Specs[c];
                if (!(exact.X >= 0.5 && exact.X < spec.Width + 0.5 && exact.Y >= 0.5 && exact.Y < spec.Height + 0.5)) continue;
                var (x, y) = band.Chips[c].Grid.Interpolate(points[p].X, points[p].Y);
                var error = Math.Max(Math.Abs(x - exact.X), Math.Abs(y - exact.Y));
                Assert.True(error < Goal, $"{spec.Name} at canvas ({points[p].X}, {points[p].Y}): interpolated ({x}, {y}), astropy ({exact.X}, {exact.Y})");
                worst = Math.Max(worst, error);
                compared++;
            }
        output.WriteLine($"SIP x{sip}: {compared} chip positions, largest interpolation error {worst:E2} chip px, grid spacings {string.Join(", ", band.Chips.Select(c => c.Grid.Spacing))}");
        Assert.True(compared > 1000, $"only {compared} positions fell on chips");
        // The grid must be doing something: nodes every 16 px, so a linear fit alone would not reach 1e-9.
        Assert.True(worst > 0);
    }
}
