namespace Mosaic.Server.Tiles;

/// <summary>A checked tile request: its cache key, the ETag derived from it, and the render to run if no tier has it.</summary>
public sealed record PreparedTile(string Key, string ETag, Func<byte[]> Render);
