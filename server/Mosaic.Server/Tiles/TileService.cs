using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Composite;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;
using Mosaic.TileCache;

namespace Mosaic.Server.Tiles;

/// <summary>Turns a tile request into PNG bytes: pyramid, field-wide tone map, encoder, with the cache in front.</summary>
public sealed class TileService(PyramidService pyramids, DisplayCompiler displays, TileCacheService cache)
{
    public async ValueTask<RenderedTile> GetTileAsync(FieldHdu hdu, int z, int x, int y, DisplaySettings display)
    {
        CheckTile(hdu, z, x, y);

        var pyramid = pyramids.GetReady(hdu);
        var toneMap = displays.ToneMapFor(hdu.Band, display);
        var key = $"{hdu.PyramidKey}/{display.CanonicalKey}/{z}/{x}/{y}";
        var (bytes, hit) = await cache.GetOrCreateAsync(key, () => TileRenderer.RenderPng(pyramid, z, x, y, toneMap));
        return new RenderedTile(bytes, ETagOf(key), hit);
    }

    private static string ETagOf(string key)
    {
        Span<byte> hash = stackalloc byte[32];
        System.Security.Cryptography.SHA256.HashData(System.Text.Encoding.UTF8.GetBytes(key), hash);
        return "\"" + Convert.ToHexStringLower(hash[..12]) + "\"";
    }

    /// <summary>A colour tile of three bands on one grid; the key carries all three HDUs' pixels and the composite's settings.</summary>
    public async ValueTask<RenderedTile> GetCompositeTileAsync(CompositeTarget target, int z, int x, int y, ICompositeSettings composite)
    {
        ArgumentNullException.ThrowIfNull(target);
        ArgumentNullException.ThrowIfNull(composite);
        CheckTile(target.Hdus.Red, z, x, y);
        var sources = target.Hdus.Select(pyramids.GetReady);
        var map = displays.CompositeFor(target.Bands, composite);
        var hdus = target.Hdus;
        var key = $"{hdus.Red.PyramidKey}+{hdus.Green.PyramidKey}+{hdus.Blue.PyramidKey}/{composite.CanonicalKey}/{z}/{x}/{y}";
        var (bytes, hit) = await cache.GetOrCreateAsync(key, () => CompositeRenderer.RenderTile(sources, z, x, y, map));
        return new RenderedTile(bytes, ETagOf(key), hit);
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
