namespace Mosaic.Server.Api;

/// <summary>256 physical values v_i at stretched t = i / 255, and the palette's colour (rrggbb) at each.</summary>
public sealed record ColorbarDto(IReadOnlyList<double> Values, IReadOnlyList<string> Colors);
