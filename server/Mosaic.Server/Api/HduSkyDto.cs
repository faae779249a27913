namespace Mosaic.Server.Api;

/// <summary>An HDU's celestial WCS: projection code, distortion ("SIP", "TPV" or null), frame name and arcseconds per pixel at the image centre.</summary>
public sealed record HduSkyDto(string Projection, string? Distortion, string Frame, double? PixelScale);
