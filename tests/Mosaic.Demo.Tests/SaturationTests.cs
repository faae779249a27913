using System.Text.Json.Nodes;
using Mosaic.Demo.Scene;
using Mosaic.Demo.Tests.Support;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Tests;

/// <summary>Saturated stars and their bleed trails, read back with astropy.io.fits and numpy (Debian).</summary>
[Collection(SmallFieldCollection.Name)]
public sealed class SaturationTests(SmallField field)
{
    [Theory]
    [InlineData("blue")]
    [InlineData("green")]
    [InlineData("red")]
    public void Stars_far_above_full_well_are_NaN_at_their_centre_and_faint_ones_are_not(string bandName)
    {
        var scene = field.Scene;
        var bandIndex = scene.Options.Bands.ToList().FindIndex(b => b.Name == bandName);
        var band = scene.Options.Bands[bandIndex];
        var headers = AstropyProbe.Run(scene.Chips.Select(c => (object)new
        {
            op = "header", file = field.FileOf(bandName), ext = c.ExtName, keys = new[] { "GAIN", "SATURATE" },
        }).ToArray());

        var operations = new List<object>();
        var expectNaN = new List<bool[]>();
        var saturatedSeen = 0;
        for (var c = 0; c < scene.Chips.Count; c++)
        {
            var chip = scene.Chips[c];
            var fullWell = (double)headers[c]!["GAIN"]! * (double)headers[c]!["SATURATE"]!;
            var picks = new List<(PixelPosition Pixel, bool Saturated)>();
            foreach (var star in scene.Stars)
            {
                var p = chip.Wcs.SkyToPixel(star.Position);
                if (!chip.Contains(p, margin: 4)) continue;
                var peak = star.FluxElectrons[bandIndex] * MoffatPeakFraction(band.PsfFwhmPixels, band.PsfBeta);
                if (peak > 1.5 * fullWell) picks.Add((p, true));
                else if (peak > 200 && peak < 0.2 * fullWell && !NearBrightStar(scene, chip, p, bandIndex, fullWell)) picks.Add((p, false));
            }
            saturatedSeen += picks.Count(p => p.Saturated);
            operations.Add(new { op = "nan_census", file = field.FileOf(bandName), ext = chip.ExtName, pixels = picks.Select(p => new[] { p.Pixel.X, p.Pixel.Y }).ToArray() });
            expectNaN.Add(picks.Select(p => p.Saturated).ToArray());
        }
        Assert.True(saturatedSeen >= 4, $"only {saturatedSeen} saturated stars landed on chips");

        var results = AstropyProbe.Run(operations.ToArray());
        long totalNaN = 0;
        for (var c = 0; c < results.Count; c++)
        {
            totalNaN += (long)results[c]!["total"]!;
            var pixels = results[c]!["pixels"]!.AsArray();
            for (var k = 0; k < expectNaN[c].Length; k++)
                Assert.Equal(expectNaN[c][k], (bool)pixels[k]!["nan"]!);
        }
        Assert.True(totalNaN > 0);
    }

    [Fact]
    public void The_brightest_star_bleeds_along_its_column_with_the_charge_it_has_above_full_well()
    {
        var scene = field.Scene;
        var red = scene.Options.Bands.ToList().FindIndex(b => b.Name == "red");
        var star = scene.Stars[scene.Ghost.SourceStarId];
        var chip = scene.Chips.First(c => c.Contains(c.Wcs.SkyToPixel(star.Position), 10));
        var p = chip.Wcs.SkyToPixel(star.Position);
        var results = AstropyProbe.Run(
            new { op = "header", file = field.FileOf("red"), ext = chip.ExtName, keys = new[] { "GAIN", "SATURATE" } },
            new { op = "nan_census", file = field.FileOf("red"), ext = chip.ExtName, pixels = new[] { new[] { p.X, p.Y } } });
        var fullWell = (double)results[0]!["GAIN"]! * (double)results[0]!["SATURATE"]!;
        var census = results[1]!["pixels"]![0]!;
        var column = (int)census["columnRun"]!;
        var row = (int)census["rowRun"]!;
        Assert.True(column > 3 * row, $"column run {column} should be far longer than row run {row}");
        // Charge is conserved (common practice): the centre column alone must hold a good part of the
        // star's saturated charge, at least a tenth of flux / full well.
        Assert.True(column > 0.1 * star.FluxElectrons[red] / fullWell, $"column run {column} px is short for {star.FluxElectrons[red]:E2} e-");
    }

    [Fact]
    public void No_finite_pixel_reaches_SATURATE()
    {
        var ops = new List<object>();
        foreach (var band in new[] { "blue", "green", "red" })
        foreach (var chip in field.Scene.Chips)
            ops.Add(new { op = "header", file = field.FileOf(band), ext = chip.ExtName, keys = new[] { "SATURATE" } });
        var results = AstropyProbe.Run(ops.ToArray());
        var stats = AstropyProbe.Run(new[] { "blue", "green", "red" }
            .SelectMany(b => field.Scene.Chips.Select(c => (object)new { op = "box_stats", file = field.FileOf(b), ext = c.ExtName, boxes = new[] { new[] { 0, 0, c.Width - 1, c.Height - 1 } } }))
            .ToArray());
        for (var i = 0; i < results.Count; i++)
        {
            var saturate = (double)results[i]!["SATURATE"]!;
            var max = (double)stats[i]!["boxes"]![0]!["max"]!;
            Assert.True(max < saturate, $"a finite pixel of {max} at or above SATURATE {saturate}");
        }
    }

    /// <summary>Moffat (1969) central intensity per unit flux: (β − 1) / (π α²), α = FWHM / (2 √(2^(1/β) − 1)) (from memory; the
    /// unit tests check both against the definitions of FWHM and of a normalised profile).</summary>
    internal static double MoffatPeakFraction(double fwhm, double beta)
    {
        var alpha = fwhm / (2 * Math.Sqrt(Math.Pow(2, 1 / beta) - 1));
        return (beta - 1) / (Math.PI * alpha * alpha);
    }

    /// <summary>A faint star inside a bright star's saturated core or bleed trail would be NaN for a good reason.</summary>
    private static bool NearBrightStar(DemoScene scene, Camera.ChipLayout chip, PixelPosition p, int band, double fullWell) =>
        scene.Stars.Any(s =>
        {
            if (!s.Placed) return false;
            var q = chip.Wcs.SkyToPixel(s.Position);
            var reach = s.FluxElectrons[band] / fullWell;
            return Math.Abs(q.X - p.X) < 30 && Math.Abs(q.Y - p.Y) < reach + 30;
        });
}
