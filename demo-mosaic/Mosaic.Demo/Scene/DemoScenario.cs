using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Scene;

/// <summary>The invented setting of the demo field. Every name here is fictional.</summary>
internal static class DemoScenario
{
    public const string Observatory = "Sornhavn Ridge Observatory";
    public const string Telescope = "Sornhavn 1.4 m survey reflector";
    public const string Instrument = "Lanternwing mosaic imager";
    public const string Target = "Quiet Field 7";
    public const string DateObs = "2031-10-14T03:12:45.000";
    public const string Origin = "Mosaic demo field generator";

    /// <summary>An unremarkable patch of high-latitude sky, chosen for nothing in particular.</summary>
    public static SkyCoordinate FieldCentre { get; } = new(37.8125, -21.45);
}
