using System.Runtime.InteropServices;
using Microsoft.Win32.SafeHandles;

namespace Mosaic.Imaging.Pyramids;

/// <summary>
/// Writes one level as a file of 256x256 tiles (tile index ty * TilesX + tx, row 0 of a tile at the top), from its
/// rows arriving bottom-up: one row of tiles is held, and written in one positional write when its top row arrives.
/// </summary>
internal sealed class LevelTileWriter : IDisposable
{
    private const int T = PyramidGeometry.TileSize;

    private readonly SafeFileHandle _file;
    private readonly float[] _band;
    private readonly int _width;
    private readonly int _tilesX;
    private int _nextRow;

    public LevelTileWriter(string path, int width, int height)
    {
        PyramidLayout.EnsureLittleEndian();
        _width = width;
        _tilesX = (width + T - 1) / T;
        var tilesY = (height + T - 1) / T;
        _nextRow = height - 1;
        // Pixels outside the level are never written and stay NaN: columns past the width, rows below the height.
        _band = new float[_tilesX * PyramidLayout.TilePixels];
        _band.AsSpan().Fill(float.NaN);
        _file = File.OpenHandle(path, FileMode.CreateNew, FileAccess.Write, FileShare.None, FileOptions.None,
            preallocationSize: (long)_tilesX * tilesY * PyramidLayout.TileBytes);
    }

    /// <summary>Level row <paramref name="row"/> counted from the top; rows must come in descending order.</summary>
    public void WriteRow(int row, ReadOnlySpan<float> values)
    {
        if (row != _nextRow || values.Length != _width)
            throw new InvalidOperationException($"level row {row} of {values.Length} pixels arrived; expected row {_nextRow} of {_width}");
        var local = (row % T) * T;
        for (var tx = 0; tx < _tilesX; tx++)
        {
            var x0 = tx * T;
            values.Slice(x0, Math.Min(T, _width - x0)).CopyTo(_band.AsSpan(tx * PyramidLayout.TilePixels + local));
        }
        if (row % T == 0)
            RandomAccess.Write(_file, MemoryMarshal.AsBytes(_band.AsSpan()), (long)(row / T) * _tilesX * PyramidLayout.TileBytes);
        _nextRow--;
    }

    public void Complete()
    {
        if (_nextRow != -1) throw new InvalidOperationException($"level ended with rows 0..{_nextRow} never written");
    }

    public void Dispose() => _file.Dispose();
}
