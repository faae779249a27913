using System.Numerics;
using Mosaic.Demo.Camera;
using Mosaic.Demo.Randomness;
using Mosaic.Demo.Scene;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Rendering;

/// <summary>
/// Renders one chip in one band into a caller-owned buffer, in ADU: sky and nebula, ghost, galaxies, stars, charge
/// bleeding, defects, then noise. One instance per worker: it owns that worker's scratch buffers.
/// </summary>
internal sealed class ChipRenderer
{
    /// <summary>Stars are drawn out to where they fall below this many electrons per pixel.</summary>
    private const double StarThresholdElectrons = 0.05;

    private const double MaxStarRadius = 600;
    private const double GalaxyReach = 340;

    private readonly SmoothLayer _smooth = new();
    private readonly GalaxyStamp _galaxy = new();
    private readonly List<(int X0, int Y0, int X1, int Y1)> _saturating = [];
    private float[] _gaussian = [];

    public void Render(DemoScene scene, int bandIndex, ChipLayout chip, Span<float> image, CancellationToken ct)
    {
        var width = chip.Width;
        var height = chip.Height;
        if (image.Length != width * height) throw new ArgumentException("The buffer must hold exactly one chip.", nameof(image));
        var band = scene.Options.Bands[bandIndex];
        var wcs = chip.Wcs;
        var pixelScale = DemoScene.PixelScaleArcsec;

        _smooth.Build(scene, bandIndex, chip);
        for (var y = 0; y < height; y++) _smooth.FillRow(y, image.Slice(y * width, width));
        ct.ThrowIfCancellationRequested();

        var ghost = scene.Ghost;
        var ghostPixel = wcs.SkyToPixel(ghost.Centre);
        if (!double.IsNaN(ghostPixel.X))
            GhostStamp.Add(image, width, height, ghostPixel.X, ghostPixel.Y, ghost.OuterRadiusArcsec / pixelScale,
                ghost.InnerRadiusArcsec / pixelScale, ghost.SurfaceBrightnessElectrons[bandIndex]);

        var (xiMin, xiMax, etaMin, etaMax) = PlaneBounds(chip, GalaxyReach);
        foreach (var galaxy in scene.Galaxies)
        {
            if (!Inside(scene.FieldCentre, galaxy.Position, xiMin, xiMax, etaMin, etaMax)) continue;
            var p = wcs.SkyToPixel(galaxy.Position);
            if (!chip.Contains(p, -GalaxyReach)) continue;
            _galaxy.Add(image, width, height, p.X, p.Y, galaxy.FluxElectrons[bandIndex], galaxy.SersicIndex,
                galaxy.EffectiveRadiusPixels, galaxy.AxisRatio, MajorAxisAngle(wcs, galaxy.PositionAngleDegrees), band.PsfFwhmPixels);
        }
        ct.ThrowIfCancellationRequested();

        _saturating.Clear();
        var fullWell = chip.FullWellElectrons;
        var peakFraction = MoffatProfile.PeakFraction(band.PsfFwhmPixels, band.PsfBeta);
        (xiMin, xiMax, etaMin, etaMax) = PlaneBounds(chip, MaxStarRadius);
        foreach (var star in scene.Stars)
        {
            if (!Inside(scene.FieldCentre, star.Position, xiMin, xiMax, etaMin, etaMax)) continue;
            var flux = star.FluxElectrons[bandIndex];
            var radius = StampRadius(flux, band);
            var p = wcs.SkyToPixel(star.Position);
            if (!chip.Contains(p, -radius)) continue;
            StarStamp.Add(image, width, height, p.X, p.Y, flux, band.PsfFwhmPixels, band.PsfBeta, radius);
            // Sky and nebula add at most a few thousand electrons, so half a well from the star alone flags it.
            if (flux * peakFraction >= 0.5 * fullWell)
                _saturating.Add(((int)(p.X - radius), (int)(p.Y - radius), (int)(p.X + radius) + 1, (int)(p.Y + radius) + 1));
        }
        ChargeBleed.Apply(image, width, height, (float)fullWell, _saturating);
        DefectPainter.Apply(image, width, height, chip.Defects);
        ct.ThrowIfCancellationRequested();

        var rng = Xoshiro256StarStar.For(scene.Options.Seed, RandomStream.PixelNoise, bandIndex, chip.Index);
        var block = 2 * Vector<float>.Count;
        var padded = (width + block - 1) / block * block;
        if (_gaussian.Length < padded) _gaussian = new float[padded];
        var gaussian = _gaussian.AsSpan(0, padded);
        for (var y = 0; y < height; y++)
        {
            if ((y & 127) == 0) ct.ThrowIfCancellationRequested();
            GaussianNoise.Fill(rng, gaussian);
            DetectorNoise.Apply(image.Slice(y * width, width), gaussian, (float)chip.ReadNoiseElectrons, (float)chip.Gain, chip.SaturateAdu);
        }
    }

    /// <summary>Radius of a star's stamp in pixels: bright stars reach further, never less than 3 FWHM.</summary>
    internal static double StampRadius(double flux, DemoBand band) =>
        Math.Clamp(MoffatProfile.RadiusAtLevel(flux, band.PsfFwhmPixels, band.PsfBeta, StarThresholdElectrons),
            3 * band.PsfFwhmPixels, MaxStarRadius);

    /// <summary>Position angle east of north → angle of the major axis in the chip's pixel frame.</summary>
    private static double MajorAxisAngle(TanSipWcs wcs, double positionAngleDegrees)
    {
        var (sin, cos) = Math.SinCos(positionAngleDegrees * Math.PI / 180.0);
        var (u, v) = wcs.LinearInverse(sin, cos);
        return Math.Atan2(v, u);
    }

    /// <summary>The chip's box in intermediate world coordinates (degrees about the field centre), grown by a margin.</summary>
    private static (double XiMin, double XiMax, double EtaMin, double EtaMax) PlaneBounds(ChipLayout chip, double marginPixels)
    {
        double xiMin = double.MaxValue, xiMax = double.MinValue, etaMin = double.MaxValue, etaMax = double.MinValue;
        foreach (var (x, y) in new[] { (-0.5, -0.5), (chip.Width - 0.5, -0.5), (-0.5, chip.Height - 0.5), (chip.Width - 0.5, chip.Height - 0.5) })
        {
            Gnomonic.TryToPlane(chip.Wcs.ReferenceValue, chip.Wcs.PixelToSky(new PixelPosition(x, y)), out var xi, out var eta);
            xiMin = Math.Min(xiMin, xi); xiMax = Math.Max(xiMax, xi);
            etaMin = Math.Min(etaMin, eta); etaMax = Math.Max(etaMax, eta);
        }
        var margin = (marginPixels + 8) * DemoScene.PixelScaleArcsec / 3600.0;
        return (xiMin - margin, xiMax + margin, etaMin - margin, etaMax + margin);
    }

    private static bool Inside(SkyCoordinate centre, SkyCoordinate position, double xiMin, double xiMax, double etaMin, double etaMax) =>
        Gnomonic.TryToPlane(centre, position, out var xi, out var eta) && xi >= xiMin && xi <= xiMax && eta >= etaMin && eta <= etaMax;
}
