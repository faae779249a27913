using System.Buffers;
using System.Globalization;
using System.IO.Hashing;
using System.Text;
using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Composite;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;
using Mosaic.TileCache;

namespace Mosaic.Server.Tiles;

/// <summary>
/// Turns a tile request into PNG bytes: pyramid, field-wide tone map, encoder, with the cache tiers in front. A
/// request is prepared first (checked, keyed) so a client that already holds the tile is answered before any lookup.
/// </summary>
public sealed class TileService(PyramidService pyramids, DisplayCompiler displays, TileCacheService cache)
{
    /// <summary>Checks the tile and keys it; the pyramid and tone map are fetched only when the tile must be rendered.</summary>
    public PreparedTile Prepare(FieldHdu hdu, int z, int x, int y, DisplaySettings display)
    {
        ArgumentNullException.ThrowIfNull(hdu);
        ArgumentNullException.ThrowIfNull(display);
        CheckTile(hdu, z, x, y);
        // Built once: the settings make their key afresh on every read.
        var displayKey = display.CanonicalKey;
        var key = $"{hdu.PyramidKey}/{displayKey}/{z}/{x}/{y}";
        return new PreparedTile(key, ETagOf(key), () =>
        {
            var pyramid = pyramids.GetReady(hdu);
            return TileRenderer.RenderPng(pyramid, z, x, y, displays.ToneMapFor(hdu.Band, display, displayKey));
        });
    }

    /// <summary>A colour tile of three bands on one grid; the key carries all three HDUs' pixels and the composite's settings.</summary>
    public PreparedTile PrepareComposite(CompositeTarget target, int z, int x, int y, ICompositeSettings composite)
    {
        ArgumentNullException.ThrowIfNull(target);
        ArgumentNullException.ThrowIfNull(composite);
        CheckTile(target.Hdus.Red, z, x, y);
        var hdus = target.Hdus;
        var key = $"{hdus.Red.PyramidKey}+{hdus.Green.PyramidKey}+{hdus.Blue.PyramidKey}/{composite.CanonicalKey}/{z}/{x}/{y}";
        return new PreparedTile(key, ETagOf(key), () =>
        {
            var sources = target.Hdus.Select(pyramids.GetReady);
            return CompositeRenderer.RenderTile(sources, z, x, y, displays.CompositeFor(target.Bands, composite));
        });
    }

    /// <summary>The tile from the nearest tier that has it, else rendered (429 when the render queue is full, 503 while the pyramid is built).</summary>
    public async ValueTask<RenderedTile> GetAsync(PreparedTile tile, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(tile);
        var lookup = await cache.GetOrCreateAsync(tile.Key, tile.Render, cancellationToken).ConfigureAwait(false);
        return new RenderedTile(lookup.Bytes, tile.ETag, lookup.Source);
    }

    public ValueTask<RenderedTile> GetTileAsync(FieldHdu hdu, int z, int x, int y, DisplaySettings display, CancellationToken cancellationToken = default) =>
        GetAsync(Prepare(hdu, z, x, y, display), cancellationToken);

    public ValueTask<RenderedTile> GetCompositeTileAsync(CompositeTarget target, int z, int x, int y, ICompositeSettings composite, CancellationToken cancellationToken = default) =>
        GetAsync(PrepareComposite(target, z, x, y, composite), cancellationToken);

    /// <summary>A strong ETag from the key: a fast 128-bit hash (it needs to tell keys apart, not resist forgery), in hex.</summary>
    private static string ETagOf(string key)
    {
        var most = Encoding.UTF8.GetMaxByteCount(key.Length);
        byte[]? rented = null;
        var utf8 = most <= 1024 ? stackalloc byte[1024] : (rented = ArrayPool<byte>.Shared.Rent(most));
        var hash = XxHash128.HashToUInt128(utf8[..Encoding.UTF8.GetBytes(key, utf8)]);
        if (rented is not null) ArrayPool<byte>.Shared.Return(rented);
        return string.Create(34, hash, static (tag, h) =>
        {
            tag[0] = '"';
            h.TryFormat(tag[1..33], out _, "x32", CultureInfo.InvariantCulture);
            tag[33] = '"';
        });
    }

    private static void CheckTile(FieldHdu hdu, int z, int x, int y)
    {
        var geometry = hdu.Geometry;
        if (z < 0 || z > geometry.MaxZoom)
            throw MosaicRequestException.NotFound("Tile", $"Zoom {z} is outside 0 to {geometry.MaxZoom} for {hdu.Description}.", "z");
        if (!geometry.Contains(z, x, y))
            throw MosaicRequestException.NotFound("Tile", $"Tile {x},{y} is outside the {geometry.TilesX(z)} x {geometry.TilesY(z)} tiles of zoom {z} for {hdu.Description}.");
    }
}
