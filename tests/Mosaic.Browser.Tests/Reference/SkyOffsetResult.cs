namespace Mosaic.Browser.Tests.Reference;

/// <summary>What <see cref="SkyOffsets.Compute"/> found: the centre's pixel, each offset point's pixel, the position sexagesimal.</summary>
public sealed record SkyOffsetResult((double X, double Y) Centre, IReadOnlyList<(double X, double Y)> Offsets, string RaHours, string DecDegrees);
