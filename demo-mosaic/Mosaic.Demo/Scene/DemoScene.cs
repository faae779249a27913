using Mosaic.Demo.Camera;
using Mosaic.Demo.Nebulae;
using Mosaic.Demo.Randomness;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Scene;

/// <summary>
/// Everything the generator draws, defined once on the sky, with the camera that sees it. Building it is cheap (no
/// pixels); the same options always give the same scene. Positions are ICRS degrees; chip pixels are 0-based.
/// </summary>
public sealed class DemoScene
{
    private DemoScene(DemoFieldOptions options, CameraModel camera, IReadOnlyList<CatalogueStar> stars,
        IReadOnlyList<CatalogueGalaxy> galaxies, NebulaDescription nebula, GhostDescription ghost,
        IReadOnlyList<SkyBackground> backgrounds)
    {
        Options = options;
        Camera = camera;
        Stars = stars;
        Galaxies = galaxies;
        Nebula = nebula;
        Ghost = ghost;
        Backgrounds = backgrounds;
        NebulaField = new NebulaField(nebula.NoiseSeed);
    }

    public DemoFieldOptions Options { get; }

    /// <summary>Pointing of the camera: CRVAL of every chip.</summary>
    public SkyCoordinate FieldCentre => Camera.Boresight;

    public static double PixelScaleArcsec => CameraModel.PixelScaleArcsec;

    public IReadOnlyList<ChipLayout> Chips => Camera.Chips;

    public IReadOnlyList<CatalogueStar> Stars { get; }

    public IReadOnlyList<CatalogueGalaxy> Galaxies { get; }

    public NebulaDescription Nebula { get; }

    public GhostDescription Ghost { get; }

    /// <summary>One per band, in the order of the options' bands.</summary>
    public IReadOnlyList<SkyBackground> Backgrounds { get; }

    internal CameraModel Camera { get; }

    internal NebulaField NebulaField { get; }

    /// <summary>Validates the options (throwing <see cref="ArgumentException"/>) and lays out the scene.</summary>
    public static DemoScene Build(DemoFieldOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        var camera = CameraModel.Build(options, DemoScenario.FieldCentre);
        var (stars, ghostSourceId) = StarCatalogue.Build(options, camera);
        var galaxies = GalaxyCatalogue.Build(options, camera);

        var scale = CameraModel.PixelScaleArcsec;
        var rng = Xoshiro256StarStar.For(options.Seed, RandomStream.Nebula);
        var shell = 0.2 * Math.Min(camera.FieldWidth, camera.FieldHeight) * scale;
        var nebula = new NebulaDescription(
            camera.FocalPlaneToSky(0.12 * camera.FieldWidth, -0.05 * camera.FieldHeight),
            shell, NebulaField.CoreRadius * shell, NebulaField.OuterRadius * shell, rng.NextUInt64());

        var ghost = PlaceGhost(options, camera, stars[ghostSourceId]);

        var widthDegrees = camera.FieldWidth * CameraModel.DegreesPerPixel;
        var heightDegrees = camera.FieldHeight * CameraModel.DegreesPerPixel;
        var backgrounds = options.Bands
            .Select(b => new SkyBackground(b.SkyElectrons, b.SkyGradientEast / widthDegrees, b.SkyGradientNorth / heightDegrees))
            .ToArray();
        return new DemoScene(options, camera, stars, galaxies, nebula, ghost, backgrounds);
    }

    /// <summary>The ghost falls outward from the boresight, further for stars further out (a tilted-filter reflection).</summary>
    private static GhostDescription PlaceGhost(DemoFieldOptions options, CameraModel camera, CatalogueStar source)
    {
        var host = camera.Chips[Math.Min(1, options.ChipColumns - 1)];
        var (sx, sy) = host.ToFocalPlane(host.Wcs.SkyToPixel(source.Position));
        var r = Math.Sqrt(sx * sx + sy * sy);
        var (ux, uy) = r > 1 ? (sx / r, sy / r) : (0.0, -1.0);
        var shift = 0.12 * r + 0.08 * options.ChipHeight;
        var outer = 0.05 * options.ChipHeight;
        var inner = 0.38 * outer;
        var area = Math.PI * (outer * outer - inner * inner);
        // 3 % of the star's light, spread evenly over the annulus.
        var brightness = source.FluxElectrons.Select(f => 0.03 * f / area).ToArray();
        var scale = CameraModel.PixelScaleArcsec;
        return new GhostDescription(source.Id, camera.FocalPlaneToSky(sx + ux * shift, sy + uy * shift),
            outer * scale, inner * scale, brightness);
    }
}
