namespace Mosaic.Imaging.Pyramids;

/// <summary>
/// Turns native rows, arriving bottom-up in storage order, into every reduced level at once: each level holds
/// the odd (lower) row of a block until its even partner arrives, then passes the block means one level up.
/// </summary>
internal sealed class LevelCascade : IDisposable
{
    private readonly PyramidGeometry _geometry;
    private readonly LevelTileWriter[] _writers;
    private readonly float[][] _pending;
    private readonly float[][] _rows;
    private readonly float[] _missingRow;
    private readonly LevelTileWriter? _native;

    public LevelCascade(PyramidGeometry geometry, string folder, bool storeNative)
    {
        _geometry = geometry;
        var levels = geometry.MaxZoom;
        _writers = new LevelTileWriter[levels];
        _pending = new float[levels][];
        _rows = new float[levels][];
        _missingRow = new float[geometry.Width];
        _missingRow.AsSpan().Fill(float.NaN);
        try
        {
            for (var z = 0; z < levels; z++)
            {
                // Halving the budget a level down keeps all strips within 2 x StripPixels: at most a few MiB,
                // whatever the frame's width (a very wide frame gets strips of few rows, i.e. smaller writes).
                var budget = LevelTileWriter.StripPixels >> Math.Min(levels - 1 - z, 30);
                _writers[z] = new LevelTileWriter(Path.Combine(folder, PyramidLayout.LevelFile(z)), geometry.LevelWidth(z), geometry.LevelHeight(z),
                    LevelTileWriter.StripRowsFor(geometry.LevelWidth(z), budget));
                _pending[z] = new float[geometry.LevelWidth(z)];
                _rows[z] = new float[geometry.LevelWidth(z)];
            }
            if (storeNative)
                _native = new LevelTileWriter(Path.Combine(folder, PyramidLayout.LevelFile(geometry.MaxZoom)), geometry.Width, geometry.Height,
                    LevelTileWriter.StripRowsFor(geometry.Width));
        }
        catch
        {
            Dispose();
            throw;
        }
    }

    /// <summary>Native stored rows [y, y + rowCount), row y first. A strip must not split a block: its first row is row 0 or the lower row of a block.</summary>
    public void AddNativeRows(int y, int rowCount, ReadOnlySpan<float> rows)
    {
        int width = _geometry.Width, height = _geometry.Height;
        if (_native is not null)
        {
            // Stored rows arrive bottom-up, which is the descending top-anchored order the writer takes.
            for (var i = 0; i < rowCount; i++) _native.WriteRow(height - 1 - (y + i), rows.Slice(i * width, width));
        }
        var top = _geometry.MaxZoom - 1;
        if (top < 0) return;
        for (var i = 0; i < rowCount;)
        {
            var fromTop = height - 1 - (y + i);
            var row = rows.Slice(i * width, width);
            if (fromTop % 2 == 0)
            {
                // An even row from the top comes first only at the bottom edge of an odd height: no partner.
                if (fromTop != height - 1) throw new InvalidOperationException($"stored row {y + i} opens a strip inside a block");
                BlockMean.Reduce(row, _missingRow, _rows[top]);
                i++;
            }
            else
            {
                if (i + 1 >= rowCount) throw new InvalidOperationException($"strip ends inside a block at stored row {y + i}");
                BlockMean.Reduce(rows.Slice((i + 1) * width, width), row, _rows[top]);
                i += 2;
            }
            AddLevelRow(top, fromTop / 2, _rows[top]);
        }
    }

    /// <summary>Floats held by the level strips, the rows waiting for a partner and the blank row: what the cascade costs in memory.</summary>
    public long HeldPixels
    {
        get
        {
            long held = _missingRow.LongLength + (_native?.HeldPixels ?? 0);
            for (var z = 0; z < _writers.Length; z++) held += _writers[z].HeldPixels + _pending[z].LongLength + _rows[z].LongLength;
            return held;
        }
    }

    public void Complete()
    {
        foreach (var writer in _writers) writer.Complete();
        _native?.Complete();
    }

    public void Dispose()
    {
        foreach (var writer in _writers) writer?.Dispose();
        _native?.Dispose();
    }

    private void AddLevelRow(int z, int row, float[] values)
    {
        _writers[z].WriteRow(row, values);
        if (z == 0) return;
        if (row % 2 == 1)
        {
            values.CopyTo(_pending[z], 0);
            return;
        }
        var width = _geometry.LevelWidth(z);
        // The writer has checked the order, so an even row's lower partner is the one pending, unless there is none.
        ReadOnlySpan<float> lower = row == _geometry.LevelHeight(z) - 1 ? _missingRow.AsSpan(0, width) : _pending[z];
        BlockMean.Reduce(values, lower, _rows[z - 1]);
        AddLevelRow(z - 1, row / 2, _rows[z - 1]);
    }
}
