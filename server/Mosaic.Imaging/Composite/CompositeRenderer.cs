using System.Buffers;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Composite;

/// <summary>Colour PNGs from three bands on one pixel grid: tiles from three pyramids, or any box streamed row by row.</summary>
public static class CompositeRenderer
{
    private const int T = PyramidGeometry.TileSize;

    /// <summary>One 256 x 256 tile; the three pyramids must have one geometry. Masked as in the map.</summary>
    public static byte[] RenderTile(Channels<Pyramid> pyramids, int z, int x, int y, CompositeMap map)
    {
        ArgumentNullException.ThrowIfNull(map);
        foreach (var pyramid in pyramids.AsEnumerable()) ArgumentNullException.ThrowIfNull(pyramid, nameof(pyramids));
        var geometry = pyramids.Red.Geometry;
        if (pyramids.Green.Geometry != geometry || pyramids.Blue.Geometry != geometry)
            throw new ArgumentException("the three pyramids are of different image sizes: a composite needs one pixel grid", nameof(pyramids));
        if (!geometry.Contains(z, x, y))
            throw new ArgumentOutOfRangeException(nameof(z), $"tile z={z} x={x} y={y} is outside the pyramid (max zoom {geometry.MaxZoom})");
        var values = ArrayPool<float>.Shared.Rent(3 * TileRenderer.TilePixels);
        try
        {
            var red = values.AsSpan(0, TileRenderer.TilePixels);
            var green = values.AsSpan(TileRenderer.TilePixels, TileRenderer.TilePixels);
            var blue = values.AsSpan(2 * TileRenderer.TilePixels, TileRenderer.TilePixels);
            pyramids.Red.ReadTile(z, x, y, red);
            pyramids.Green.ReadTile(z, x, y, green);
            pyramids.Blue.ReadTile(z, x, y, blue);
            var r = new SpanRows(red, T);
            var g = new SpanRows(green, T);
            var b = new SpanRows(blue, T);
            return CompositeComposer.Render(ref r, ref g, ref b, T, T, T, map, map.Masked, HoldsNoNaN(pyramids, z, x, y));
        }
        finally
        {
            ArrayPool<float>.Shared.Return(values);
        }
    }

    /// <summary>
    /// A native tile inside the image of bands whose histograms count no masked pixel (NaN, BLANK or infinite) holds
    /// no NaN, so the composer need not look for one: that pass over three tiles is about 3 % of a colour tile.
    /// </summary>
    private static bool HoldsNoNaN(Channels<Pyramid> pyramids, int z, int x, int y)
    {
        var geometry = pyramids.Red.Geometry;
        if (z != geometry.MaxZoom || (x + 1L) * T > geometry.Width || (y + 1L) * T > geometry.Height) return false;
        foreach (var pyramid in pyramids.AsEnumerable())
            if (pyramid.Histogram.MaskedCount != 0) return false;
        return true;
    }

    /// <summary>width x height values per band, the top row first, NaN where masked.</summary>
    public static byte[] RenderPng(ReadOnlySpan<float> red, ReadOnlySpan<float> green, ReadOnlySpan<float> blue,
        int width, int height, CompositeMap map, MaskedColor masked)
    {
        Validate(width, height, map);
        var n = (long)width * height;
        if (red.Length != n || green.Length != n || blue.Length != n)
            throw new ArgumentException($"each band must hold {width} x {height} = {n} values; got {red.Length}, {green.Length}, {blue.Length}", nameof(red));
        var r = new SpanRows(red, width);
        var g = new SpanRows(green, width);
        var b = new SpanRows(blue, width);
        return CompositeComposer.Render(ref r, ref g, ref b, height, width, height, map, masked);
    }

    /// <summary>
    /// The same PNG with each band's rows read on demand, at most <see cref="RegionRenderer.BandFloats"/> floats (or
    /// one row) a band at a time, so a region never sits in memory whole.
    /// </summary>
    public static byte[] RenderPng(Channels<RowBandReader> readers, int width, int height, CompositeMap map, MaskedColor masked)
    {
        foreach (var reader in readers.AsEnumerable()) ArgumentNullException.ThrowIfNull(reader, nameof(readers));
        Validate(width, height, map);
        if ((long)width * height > RegionRenderer.MaxPixels)
            throw new ArgumentOutOfRangeException(nameof(width), $"{width} x {height} pixels exceed the {RegionRenderer.MaxPixels / 1_000_000} megapixel limit");
        var rowsPerBand = Math.Clamp(RegionRenderer.BandFloats / width, 1, height);
        var floats = rowsPerBand * width;
        var band = ArrayPool<float>.Shared.Rent(3 * floats);
        try
        {
            var r = new ReaderRows(readers.Red, band, width);
            var g = new ReaderRows(readers.Green, band, width, floats);
            var b = new ReaderRows(readers.Blue, band, width, 2 * floats);
            return CompositeComposer.Render(ref r, ref g, ref b, rowsPerBand, width, height, map, masked);
        }
        finally
        {
            ArrayPool<float>.Shared.Return(band);
        }
    }

    private static void Validate(int width, int height, CompositeMap map)
    {
        ArgumentNullException.ThrowIfNull(map);
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
    }
}
