using System.Numerics;
using System.Runtime.InteropServices;
using Microsoft.Win32.SafeHandles;

namespace Mosaic.Imaging.Pyramids;

/// <summary>
/// Writes one level as a file of 256x256 tiles (tile index ty * TilesX + tx, row 0 of a tile at the top), from its
/// rows arriving bottom-up. Only a strip of <see cref="StripRows"/> rows is held (a power of two, so strips never
/// cross a tile row); when its top row arrives each tile's part of the strip goes straight to its place in the file
/// in one positional write. The caller picks the strip's height from a budget (<see cref="StripRowsFor"/>), so the
/// buffer shrinks in rows, not grows in bytes, as the level widens.
/// </summary>
internal sealed class LevelTileWriter : IDisposable
{
    private const int T = PyramidGeometry.TileSize;

    /// <summary>Floats held per level at most (2 MiB), unless a single row is wider.</summary>
    public const int StripPixels = 1 << 19;

    /// <summary>Rows per strip at most: 64 KiB per tile and write.</summary>
    public const int MaxStripRows = 64;

    private readonly SafeFileHandle _file;
    private readonly float[] _strip;
    private readonly int _width;
    private readonly int _tilesX;
    private readonly int _stripRows;
    private readonly int _height;
    private int _nextRow;

    /// <param name="stripRows">Rows held per strip: a power of two from 1 to 256.</param>
    public LevelTileWriter(string path, int width, int height, int stripRows)
    {
        PyramidLayout.EnsureLittleEndian();
        if (stripRows < 1 || stripRows > T || !BitOperations.IsPow2(stripRows))
            throw new ArgumentOutOfRangeException(nameof(stripRows), stripRows, $"a strip holds a power of two rows from 1 to {T}");
        _width = width;
        _height = height;
        _stripRows = stripRows;
        _tilesX = (width + T - 1) / T;
        var tilesY = (height + T - 1) / T;
        _nextRow = height - 1;
        // Columns past the width are never copied into and stay NaN in every strip.
        _strip = new float[_tilesX * stripRows * T];
        _strip.AsSpan().Fill(float.NaN);
        _file = File.OpenHandle(path, FileMode.CreateNew, FileAccess.Write, FileShare.None, FileOptions.None,
            preallocationSize: (long)_tilesX * tilesY * PyramidLayout.TileBytes);
        try
        {
            FillBelowTheLevel(height, tilesY);
        }
        catch
        {
            _file.Dispose();
            throw;
        }
    }

    /// <summary>Rows held per strip.</summary>
    public int StripRows => _stripRows;

    /// <summary>Floats this writer holds.</summary>
    public long HeldPixels => _strip.LongLength;

    /// <summary>The largest power of two up to <see cref="MaxStripRows"/> whose strip fits <paramref name="budgetPixels"/> floats; at least 1.</summary>
    public static int StripRowsFor(int width, long budgetPixels = StripPixels)
    {
        var paddedWidth = (long)(width + T - 1) / T * T;
        var rows = (int)Math.Clamp(budgetPixels / paddedWidth, 1, MaxStripRows);
        return 1 << BitOperations.Log2((uint)rows);
    }

    /// <summary>Level row <paramref name="row"/> counted from the top; rows must come in descending order.</summary>
    public void WriteRow(int row, ReadOnlySpan<float> values)
    {
        if (row != _nextRow || values.Length != _width)
            throw new InvalidOperationException($"level row {row} of {values.Length} pixels arrived; expected row {_nextRow} of {_width}");
        var tileStride = _stripRows * T;
        var local = (row & (_stripRows - 1)) * T;
        for (var tx = 0; tx < _tilesX; tx++)
        {
            var x0 = tx * T;
            values.Slice(x0, Math.Min(T, _width - x0)).CopyTo(_strip.AsSpan(tx * tileStride + local));
        }
        if ((row & (_stripRows - 1)) == 0) Flush(row);
        _nextRow--;
    }

    public void Complete()
    {
        if (_nextRow != -1) throw new InvalidOperationException($"level ended with rows 0..{_nextRow} never written");
    }

    public void Dispose() => _file.Dispose();

    /// <summary>The strip's rows [row, row + n) (n = rows since the last flush) into each tile, one write per tile.</summary>
    private void Flush(int row)
    {
        // A strip starts after the previous flush or at the level's bottom row.
        var count = Math.Min(_stripRows, _height - row);
        var bytes = MemoryMarshal.AsBytes(_strip.AsSpan());
        var tileStrideBytes = _stripRows * PyramidLayout.TileBytes / T;
        var rowOffset = (long)(row % T) * T * sizeof(float);
        var tileRow = (long)(row / T) * _tilesX;
        for (var tx = 0; tx < _tilesX; tx++)
            RandomAccess.Write(_file, bytes.Slice(tx * tileStrideBytes, count * T * sizeof(float)), (tileRow + tx) * PyramidLayout.TileBytes + rowOffset);
    }

    /// <summary>The last tile row's rows below the level's height are never written by the strips: NaN, as every pixel outside the level.</summary>
    private void FillBelowTheLevel(int height, int tilesY)
    {
        var first = height - (tilesY - 1) * T;
        if (first == T) return;
        var nan = new float[Math.Min(T - first, MaxStripRows) * T];
        nan.AsSpan().Fill(float.NaN);
        var bytes = MemoryMarshal.AsBytes(nan.AsSpan());
        var rowsPerWrite = nan.Length / T;
        for (var tx = 0; tx < _tilesX; tx++)
        {
            var tile = ((long)(tilesY - 1) * _tilesX + tx) * PyramidLayout.TileBytes;
            for (var r = first; r < T; r += rowsPerWrite)
            {
                var rows = Math.Min(rowsPerWrite, T - r);
                RandomAccess.Write(_file, bytes[..(rows * T * sizeof(float))], tile + (long)r * T * sizeof(float));
            }
        }
    }
}
