using System.Buffers;
using Microsoft.Win32.SafeHandles;
using Mosaic.Fits.Compression;
using Mosaic.Fits.Pixels;

namespace Mosaic.Fits;

/// <summary>
/// The plane of a tile-compressed image (FITS 4.0 section 10): reads decode only the tiles they touch, and keep the
/// most recent decoded tiles in a small bounded cache. Thread-safe.
/// </summary>
public sealed class TiledImagePlane : ImagePlane
{
    private const long MinCacheBytes = 16L << 20;
    private const long MaxCacheBytes = 256L << 20;

    private readonly CompressedImageLayout _layout;
    private readonly TileDecoder _decoder;
    private readonly TileCache _cache;
    private readonly SafeFileHandle _handle;

    internal TiledImagePlane(SafeFileHandle handle, string filePath, int hduIndex, CompressedImageLayout layout, TileEntry[] entries,
        double bScale, double bZero)
        : base(filePath, hduIndex, layout.ZBitPix, layout.Width, layout.Height)
    {
        _handle = handle;
        _layout = layout;
        _decoder = new TileDecoder(handle, layout, entries, bScale, bZero);
        // Two full rows of tiles, so a reader walking down the image decodes each tile once (within the bounds).
        var band = 2L * layout.TileHeight * layout.Width * BytesPerSample * layout.PlanesPerTile;
        _cache = new TileCache(Math.Clamp(band, MinCacheBytes, MaxCacheBytes));
    }

    /// <summary>ZCMPTYPE as written in the file.</summary>
    public string Compression => _layout.CodecName;

    public int TileWidth => _layout.TileWidth;
    public int TileHeight => _layout.TileHeight;

    /// <summary>Upper bound of the decoded-tile cache in bytes.</summary>
    public long CacheCapacityBytes => _cache.CapacityBytes;

    /// <summary>Decoded tiles held now.</summary>
    public int CachedTiles => _cache.Count;

    private int BytesPerSample => Math.Abs(BitPix) / 8;

    protected override void ReadRowCore(int y, int x, Span<float> destination) => Copy(y, 1, x, destination.Length, destination);

    protected override void ReadRowsCore(int y, int rowCount, Span<float> destination) => Copy(y, rowCount, 0, Width, destination);

    protected override double ReadValueCore(int x, int y)
    {
        var tx = x / _layout.TileWidth;
        var ty = y / _layout.TileHeight;
        var tile = Tile(tx, ty);
        var index = (y - ty * _layout.TileHeight) * tile.Width + (x - tx * _layout.TileWidth);
        return SampleDecoder.DecodeOne(BitPix, tile.Samples.AsSpan(index * BytesPerSample, BytesPerSample), tile.Scaling);
    }

    /// <summary>Rows [y, y + rowCount), columns [x, x + width), into destination with a row stride of width.</summary>
    private void Copy(int y, int rowCount, int x, int width, Span<float> destination)
    {
        int tw = _layout.TileWidth, th = _layout.TileHeight, bytes = BytesPerSample;
        var scratch = ArrayPool<byte>.Shared.Rent(Math.Min(tw, width) * bytes);
        try
        {
            for (var ty = y / th; ty <= (y + rowCount - 1) / th; ty++)
            {
                var rowStart = Math.Max(y, ty * th);
                var rowEnd = Math.Min(y + rowCount, (ty + 1) * th);
                for (var tx = x / tw; tx <= (x + width - 1) / tw; tx++)
                {
                    var tile = Tile(tx, ty);
                    var colStart = Math.Max(x, tx * tw);
                    var colEnd = Math.Min(x + width, tx * tw + tile.Width);
                    var count = colEnd - colStart;
                    for (var r = rowStart; r < rowEnd; r++)
                    {
                        var source = tile.Samples.AsSpan(((r - ty * th) * tile.Width + (colStart - tx * tw)) * bytes, count * bytes);
                        var work = scratch.AsSpan(0, count * bytes);
                        source.CopyTo(work);
                        SampleDecoder.Decode(BitPix, work, destination.Slice((r - y) * width + (colStart - x), count), tile.Scaling);
                    }
                }
            }
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(scratch);
        }
    }

    private DecodedTile Tile(int tx, int ty)
    {
        var key = ty * _layout.TilesX + tx;
        if (_cache.TryGet(key, out var tile)) return tile;
        ObjectDisposedException.ThrowIf(_handle.IsClosed, this);
        try
        {
            tile = _decoder.Decode(tx, ty);
        }
        catch (TileDataException e)
        {
            throw new FitsFormatException(FilePath, HduIndex, "ZCMPTYPE", $"tile {key + 1} ({_layout.CodecName}): {e.Message}", e);
        }
        catch (IOException e)
        {
            throw new FitsFormatException(FilePath, HduIndex, null, $"cannot read tile {key + 1}: {e.Message}", e);
        }
        _cache.Add(key, tile);
        return tile;
    }
}
