namespace Mosaic.Fits.Tests.Compressed;

/// <summary>Reads decode only the tiles they touch, the tile cache stays within its bound, and concurrent reads agree.</summary>
[Collection(FpackCollection.Name)]
public sealed class RandomAccessTests(FpackReferenceFiles files)
{
    [Fact]
    public void OneRowDecodesOnlyTheTilesOfItsRow()
    {
        // i32 is 150 x 97 in 64 x 64 tiles: 3 x 2 tiles, the last column and row of tiles partial.
        using var file = FitsFile.Open(files.PathOf("i32_rice_t64"));
        var plane = Assert.IsType<TiledImagePlane>(file.Hdus[1].Image);
        Assert.Equal((64, 64), (plane.TileWidth, plane.TileHeight));
        Assert.Equal(0, plane.CachedTiles);

        plane.ReadRow(70, 10, new float[20]);
        Assert.Equal(1, plane.CachedTiles);
        plane.ReadRow(70, 0, new float[150]);
        Assert.Equal(3, plane.CachedTiles);
        plane.ReadValue(149, 96);
        Assert.Equal(3, plane.CachedTiles);
        plane.ReadValue(0, 0);
        Assert.Equal(4, plane.CachedTiles);
    }

    [Fact]
    public void PartialRowsAndWholeRowsAgree()
    {
        var reference = files.Funpack("i16_rice_t16");
        using var file = FitsFile.Open(files.PathOf("i16_rice_t16"));
        var plane = file.Hdus[1].Image!;
        // Spans that start and end inside tiles and cross tile edges (16-pixel tiles of a 53-pixel row).
        foreach (var (y, x, n) in new[] { (0, 0, 53), (17, 15, 2), (36, 47, 6), (20, 3, 40), (31, 52, 1), (5, 53, 0) })
        {
            var row = new float[n];
            plane.ReadRow(y, x, row);
            for (var i = 0; i < n; i++) Assert.Equal((float)reference[y * 53 + x + i], row[i]);
        }
        var rows = new float[53 * 5];
        plane.ReadRows(14, 5, rows);
        for (var i = 0; i < rows.Length; i++)
            if (!rows[i].Equals((float)reference[14 * 53 + i])) Assert.Fail($"pixel {i}");
    }

    [Fact]
    public void ConcurrentReadersGetTheSameRows()
    {
        var reference = files.Funpack("f32_dither1_seed");
        using var file = FitsFile.Open(files.PathOf("f32_dither1_seed"));
        var plane = file.Hdus[1].Image!;
        Parallel.For(0, 400, new ParallelOptions { MaxDegreeOfParallelism = 8 }, i =>
        {
            var y = i * 37 % plane.Height;
            var row = new float[plane.Width];
            plane.ReadRow(y, 0, row);
            for (var x = 0; x < row.Length; x++)
                if (!row[x].Equals((float)reference[y * plane.Width + x])) Assert.Fail($"({x + 1}, {y + 1})");
        });
    }

    [Fact]
    public void ReadsAfterTheFileIsClosedFailClearly()
    {
        var file = FitsFile.Open(files.PathOf("u8_rice"));
        var plane = file.Hdus[1].Image!;
        file.Dispose();
        Assert.Throws<ObjectDisposedException>(() => plane.ReadRow(0, 0, new float[plane.Width]));
    }

    [Fact]
    public void ArgumentsAreCheckedLikeEveryPlane()
    {
        using var file = FitsFile.Open(files.PathOf("u8_rice"));
        var plane = file.Hdus[1].Image!;
        Assert.Throws<ArgumentOutOfRangeException>(() => plane.ReadRow(plane.Height, 0, new float[1]));
        Assert.Throws<ArgumentOutOfRangeException>(() => plane.ReadRow(0, 1, new float[plane.Width]));
        Assert.Throws<ArgumentOutOfRangeException>(() => plane.ReadRows(1, plane.Height, new float[plane.Width * plane.Height]));
        Assert.Throws<ArgumentOutOfRangeException>(() => plane.ReadValue(-1, 0));
    }
}
