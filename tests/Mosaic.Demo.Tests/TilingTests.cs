using Mosaic.Demo.Tests.Support;

namespace Mosaic.Demo.Tests;

/// <summary>The chips' footprints on the sky, from astropy.wcs (Debian python3-astropy): gaps between neighbours, no overlaps.</summary>
[Collection(SmallFieldCollection.Name)]
public sealed class TilingTests(SmallField field)
{
    private const int EdgeSamples = 9;

    [Fact]
    public void Chips_tile_the_focal_plane_with_gaps_of_the_requested_width_and_never_overlap()
    {
        var chips = field.Scene.Chips;
        var file = field.FileOf("green");
        var outlines = chips.Select(Outline).ToArray();
        var skies = AstropyProbe.Run(chips.Select((c, i) => (object)new { op = "pix2world", file, ext = c.ExtName, pixels = outlines[i] }).ToArray());

        // Every chip's outline, seen in every other chip's pixel frame.
        var operations = new List<object>();
        var pairs = new List<(int From, int To)>();
        for (var i = 0; i < chips.Count; i++)
        for (var j = 0; j < chips.Count; j++)
        {
            if (i == j) continue;
            var world = skies[i]!["world"]!.AsArray().Select(p => new[] { p![0]!.GetValue<double>(), p[1]!.GetValue<double>() }).ToArray();
            operations.Add(new { op = "world2pix", file, ext = chips[j].ExtName, world });
            pairs.Add((i, j));
        }
        var projected = AstropyProbe.Run(operations.ToArray());

        var gap = field.Options.GapPixels;
        var neighbourGaps = 0;
        for (var k = 0; k < pairs.Count; k++)
        {
            var (i, j) = pairs[k];
            var to = chips[j];
            var points = projected[k]!["pixels"]!.AsArray().Select(p => (X: p![0]!.GetValue<double>(), Y: p[1]!.GetValue<double>())).ToArray();
            foreach (var (x, y) in points)
            {
                var inside = x > -0.5 && x < to.Width - 0.5 && y > -0.5 && y < to.Height - 0.5;
                Assert.False(inside, $"{chips[i].ExtName} overlaps {to.ExtName} at ({x:F1}, {y:F1})");
            }

            var from = chips[i];
            // Product requirement: gaps of the requested width between neighbours; mounting offsets and
            // rotations move each edge by a few pixels at most.
            if (from.Row == to.Row && to.Column == from.Column + 1)
            {
                var rightEdge = points.Skip(EdgeSamples).Take(EdgeSamples).Select(p => -0.5 - p.X).ToArray();
                Assert.All(rightEdge, g => Assert.InRange(g, gap - 10, gap + 10));
                neighbourGaps++;
            }
            if (from.Column == to.Column && to.Row == from.Row + 1)
            {
                var topEdge = points.Skip(2 * EdgeSamples).Take(EdgeSamples).Select(p => -0.5 - p.Y).ToArray();
                Assert.All(topEdge, g => Assert.InRange(g, gap - 10, gap + 10));
                neighbourGaps++;
            }
        }
        var expectedPairs = field.Options.ChipRows * (field.Options.ChipColumns - 1) + field.Options.ChipColumns * (field.Options.ChipRows - 1);
        Assert.Equal(expectedPairs, neighbourGaps);
    }

    [Fact]
    public void Chip_columns_run_east_to_west_and_rows_south_to_north_on_the_sky()
    {
        var chips = field.Scene.Chips;
        var centres = AstropyProbe.Run(chips.Select(c => (object)new
        {
            op = "pix2world", file = field.FileOf("red"), ext = c.ExtName,
            pixels = new[] { new[] { (c.Width - 1) / 2.0, (c.Height - 1) / 2.0 } },
        }).ToArray());
        var sky = centres.Select(r => (Ra: r!["world"]![0]![0]!.GetValue<double>(), Dec: r["world"]![0]![1]!.GetValue<double>())).ToArray();
        for (var i = 0; i < chips.Count; i++)
        for (var j = 0; j < chips.Count; j++)
        {
            if (chips[j].Row == chips[i].Row && chips[j].Column == chips[i].Column + 1)
                Assert.True(sky[j].Ra < sky[i].Ra, $"{chips[j].ExtName} should lie west of {chips[i].ExtName}");
            if (chips[j].Column == chips[i].Column && chips[j].Row == chips[i].Row + 1)
                Assert.True(sky[j].Dec > sky[i].Dec, $"{chips[j].ExtName} should lie north of {chips[i].ExtName}");
        }
    }

    /// <summary>Points along the chip's outer pixel edges: bottom, right, top, left, EdgeSamples each.</summary>
    private static double[][] Outline(Camera.ChipLayout chip)
    {
        double x0 = -0.5, y0 = -0.5, x1 = chip.Width - 0.5, y1 = chip.Height - 0.5;
        var points = new List<double[]>();
        for (var k = 0; k < EdgeSamples; k++) points.Add([x0 + (x1 - x0) * k / (EdgeSamples - 1), y0]);
        for (var k = 0; k < EdgeSamples; k++) points.Add([x1, y0 + (y1 - y0) * k / (EdgeSamples - 1)]);
        for (var k = 0; k < EdgeSamples; k++) points.Add([x0 + (x1 - x0) * k / (EdgeSamples - 1), y1]);
        for (var k = 0; k < EdgeSamples; k++) points.Add([x0, y0 + (y1 - y0) * k / (EdgeSamples - 1)]);
        return points.ToArray();
    }
}
