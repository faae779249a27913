using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Scene;

/// <summary>A galaxy of the synthetic sky: a Sérsic profile, seen through each band's seeing.</summary>
/// <param name="SersicIndex">1 (exponential disc) or 4 (de Vaucouleurs spheroid).</param>
/// <param name="EffectiveRadiusPixels">Half-light radius along the major axis.</param>
/// <param name="AxisRatio">Minor over major axis, in (0, 1].</param>
/// <param name="PositionAngleDegrees">Major axis, east of north.</param>
public sealed record CatalogueGalaxy(int Id, SkyCoordinate Position, double Magnitude, double ColourIndex,
    double SersicIndex, double EffectiveRadiusPixels, double AxisRatio, double PositionAngleDegrees,
    IReadOnlyList<double> FluxElectrons);
