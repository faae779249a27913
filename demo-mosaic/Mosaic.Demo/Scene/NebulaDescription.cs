using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Scene;

/// <summary>
/// Where the emission nebula is. Its shell (strongest in red) lies near ShellRadius, its compact core (strongest in
/// green) within about CoreRadius of the centre, and none of it beyond OuterRadius.
/// </summary>
public sealed record NebulaDescription(SkyCoordinate Centre, double ShellRadiusArcsec, double CoreRadiusArcsec,
    double OuterRadiusArcsec, ulong NoiseSeed);
