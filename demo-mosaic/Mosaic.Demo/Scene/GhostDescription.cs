using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Scene;

/// <summary>
/// The out-of-focus reflection of the brightest star: an annulus (the pupil with its central obstruction), offset
/// from the star away from the boresight, with a uniform surface brightness per band.
/// </summary>
public sealed record GhostDescription(int SourceStarId, SkyCoordinate Centre, double OuterRadiusArcsec,
    double InnerRadiusArcsec, IReadOnlyList<double> SurfaceBrightnessElectrons);
