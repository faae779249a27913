namespace Mosaic.Server.Api;

/// <summary>The Lupton composite's resolved numbers: Q, the linear range, each band's minimum (red, green, blue) and the 8-bit slope.</summary>
public sealed record LuptonDto(double Q, double Range, double[] Min, double Slope);
