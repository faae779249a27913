namespace Mosaic.Server.Pyramids;

/// <summary>How far the pyramid of one HDU is, as the UI shows it.</summary>
public sealed record PyramidStatus(PyramidState State, double Progress, string? Error);
