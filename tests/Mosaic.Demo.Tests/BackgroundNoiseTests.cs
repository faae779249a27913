using Mosaic.Demo.Camera;
using Mosaic.Demo.Scene;
using Mosaic.Demo.Tests.Support;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Tests;

/// <summary>
/// Sky level and noise in empty regions, measured with numpy on astropy-read data (Debian), against the sky model,
/// the gain and the read noise the field was asked for.
/// </summary>
[Collection(SmallFieldCollection.Name)]
public sealed class BackgroundNoiseTests(SmallField field)
{
    private const int Box = 64;

    [Theory]
    [InlineData("blue")]
    [InlineData("green")]
    [InlineData("red")]
    public void Empty_sky_has_the_requested_level_and_photon_plus_read_noise(string bandName)
    {
        var scene = field.Scene;
        var bandIndex = scene.Options.Bands.ToList().FindIndex(b => b.Name == bandName);
        var file = field.FileOf(bandName);

        var picked = new List<(ChipLayout Chip, int[] Box)>();
        foreach (var chip in scene.Chips)
            for (var y = 8; y + Box <= chip.Height - 8; y += Box / 2)
            for (var x = 8; x + Box <= chip.Width - 8; x += Box / 2)
                if (IsEmpty(scene, chip, bandIndex, x, y)) picked.Add((chip, [x, y, x + Box - 1, y + Box - 1]));
        Assert.True(picked.Count >= 6, $"only {picked.Count} empty boxes found in {bandName}");

        var operations = new List<object>();
        foreach (var (chip, box) in picked)
        {
            operations.Add(new { op = "box_stats", file, ext = chip.ExtName, boxes = new[] { box } });
            operations.Add(new { op = "pix2world", file, ext = chip.ExtName, pixels = new[] { new[] { (box[0] + box[2]) / 2.0, (box[1] + box[3]) / 2.0 } } });
            operations.Add(new { op = "header", file, ext = chip.ExtName, keys = new[] { "GAIN", "RDNOISE" } });
        }
        var results = AstropyProbe.Run(operations.ToArray());

        var levelRatios = new List<double>();
        var sigmaRatios = new List<double>();
        for (var i = 0; i < picked.Count; i++)
        {
            var stats = results[3 * i]!["boxes"]![0]!;
            var centre = results[3 * i + 1]!["world"]![0]!;
            var gain = (double)results[3 * i + 2]!["GAIN"]!;
            var readNoise = (double)results[3 * i + 2]!["RDNOISE"]!;
            // The sky model: a plane in the TAN intermediate coordinates about the field centre.
            var (xi, eta) = Sky.Tangent(scene.FieldCentre, centre[0]!.GetValue<double>(), centre[1]!.GetValue<double>());
            var sky = scene.Backgrounds[bandIndex];
            var electrons = sky.CentreElectrons * (1 + sky.GradientEastPerDegree * xi + sky.GradientNorthPerDegree * eta);
            // CCD noise in ADU: sqrt(N_sky + RN²) / gain (the CCD equation for a single pixel; common practice).
            var expectedSigma = Math.Sqrt(electrons + readNoise * readNoise) / gain;
            levelRatios.Add((double)stats["median"]! / (electrons / gain));
            sigmaRatios.Add((double)stats["madSigma"]! / expectedSigma);
        }

        foreach (var r in levelRatios) Assert.InRange(r, 0.985, 1.015);
        foreach (var r in sigmaRatios) Assert.InRange(r, 0.9, 1.1);
        Assert.InRange(levelRatios.Average(), 0.995, 1.005);
        Assert.InRange(sigmaRatios.Average(), 0.97, 1.03);
    }

    /// <summary>No star, galaxy, nebula, ghost or defect within reach of the box.</summary>
    private static bool IsEmpty(DemoScene scene, ChipLayout chip, int band, int x0, int y0)
    {
        var b = scene.Options.Bands[band];
        double cx = x0 + Box / 2.0, cy = y0 + Box / 2.0, half = Box / 2.0;
        bool Near(PixelPosition p, double reach) => Math.Abs(p.X - cx) < half + reach && Math.Abs(p.Y - cy) < half + reach;

        foreach (var s in scene.Stars)
        {
            var p = chip.Wcs.SkyToPixel(s.Position);
            // Moffat wing down to 0.05 e-/pixel, bleed trails for the bright ones.
            var peak = s.FluxElectrons[band] * SaturationTests.MoffatPeakFraction(b.PsfFwhmPixels, b.PsfBeta);
            var alpha = b.PsfFwhmPixels / (2 * Math.Sqrt(Math.Pow(2, 1 / b.PsfBeta) - 1));
            var reach = alpha * Math.Sqrt(Math.Pow(Math.Max(peak / 0.05, 1), 1 / b.PsfBeta)) + 3 * b.PsfFwhmPixels;
            if (s.Placed) reach = Math.Max(reach, s.FluxElectrons[band] / 50_000 + 60);
            if (Near(p, reach)) return false;
        }
        foreach (var g in scene.Galaxies)
            if (Near(chip.Wcs.SkyToPixel(g.Position), 10 * g.EffectiveRadiusPixels + 4 * b.PsfFwhmPixels)) return false;

        var boxCentre = chip.Wcs.PixelToSky(new PixelPosition(cx, cy));
        var boxRadiusArcsec = half * Math.Sqrt(2) * DemoScene.PixelScaleArcsec;
        if (Sky.DistanceArcsec(scene.Nebula.Centre, boxCentre.RaDegrees, boxCentre.DecDegrees) < scene.Nebula.OuterRadiusArcsec + boxRadiusArcsec + 2)
            return false;
        if (Sky.DistanceArcsec(scene.Ghost.Centre, boxCentre.RaDegrees, boxCentre.DecDegrees) < scene.Ghost.OuterRadiusArcsec + boxRadiusArcsec + 2)
            return false;
        if (chip.Defects.BadColumns.Any(c => c.X >= x0 - 1 && c.X <= x0 + Box)) return false;
        if (chip.Defects.HotPixels.Any(h => h.X >= x0 && h.X < x0 + Box && h.Y >= y0 && h.Y < y0 + Box)) return false;
        return true;
    }
}
