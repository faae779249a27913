using Mosaic.TileCache;

namespace Mosaic.Server.Tiles;

public sealed record RenderedTile(byte[] Png, string ETag, TileSource Source);
