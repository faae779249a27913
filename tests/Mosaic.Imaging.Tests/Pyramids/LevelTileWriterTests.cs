using System.Runtime.InteropServices;
using Mosaic.Imaging.Pyramids;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>
/// A level written strip by strip lands in the fixed tile layout whatever the strip height: the file equals the
/// one numpy (Debian python3-numpy) makes by padding the level with NaN to whole 256x256 tiles and laying the tiles
/// out row-major, each tile row-major (top row first), word for word (NaN matched as NaN: only its sign bit is free).
/// </summary>
public sealed class LevelTileWriterTests(LevelTileReference reference) : IClassFixture<LevelTileReference>, IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("mosaic-level-writer-").FullName;

    public static TheoryData<string, int> Cases()
    {
        var data = new TheoryData<string, int>();
        foreach (var name in LevelTileReference.Sizes.Keys)
            foreach (var rows in new[] { 1, 2, 16, 64, 256 })
                data.Add(name, rows);
        return data;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Strips_of_any_height_write_numpys_tile_layout(string name, int stripRows)
    {
        var (width, height) = LevelTileReference.Sizes[name];
        var rows = reference.Rows(name);
        var path = Path.Combine(_folder, $"{name}-{stripRows}.f32");
        using (var writer = new LevelTileWriter(path, width, height, stripRows))
        {
            // Rows come bottom-up, as a pyramid build delivers them.
            for (var r = height - 1; r >= 0; r--) writer.WriteRow(r, rows.AsSpan(r * width, width));
            writer.Complete();
        }
        var expected = reference.Tiles(name);
        var actual = MemoryMarshal.Cast<byte, float>(File.ReadAllBytes(path));
        Assert.Equal(expected.Length, actual.Length);
        for (var i = 0; i < expected.Length; i++)
        {
            var same = float.IsNaN(expected[i])
                ? float.IsNaN(actual[i])
                : BitConverter.SingleToUInt32Bits(expected[i]) == BitConverter.SingleToUInt32Bits(actual[i]);
            Assert.True(same, $"{name}, {stripRows}-row strips: word {i} (tile {i / (256 * 256)}) is {actual[i]}, numpy has {expected[i]}");
        }
    }

    [Theory]
    [InlineData(256, 64)]
    [InlineData(8192, 64)]
    [InlineData(16384, 32)]
    [InlineData(32768, 16)]
    [InlineData(200_000, 2)]
    [InlineData(1_000_000, 1)]
    public void Strips_shrink_as_the_level_widens_so_the_buffer_stays_bounded(int width, int expectedRows)
    {
        // Common practice: a fixed buffer budget per level, so memory does not grow with the frame's width. The rows
        // are the largest power of two up to 64 with rows x (width rounded up to whole tiles) <= 2^19 floats.
        Assert.Equal(expectedRows, LevelTileWriter.StripRowsFor(width));
        var padded = (width + 255) / 256 * 256L;
        Assert.True(expectedRows == 1 || expectedRows * padded <= LevelTileWriter.StripPixels);
    }

    [Theory]
    [InlineData(4096)]
    [InlineData(32768)]
    [InlineData(65536)]
    public void A_cascades_level_strips_stay_within_twice_the_budget_however_wide_the_frame(int width)
    {
        // Common practice (bounded buffers): the strips of all levels together hold at most 2 x StripPixels floats;
        // beyond them the cascade keeps two level rows per level and one blank row (about 3 x width floats in all).
        var geometry = new PyramidGeometry(width, 2);
        var folder = Directory.CreateDirectory(Path.Combine(_folder, $"cascade-{width}")).FullName;
        using var cascade = new LevelCascade(geometry, folder, storeNative: false);
        long rows = width;
        for (var z = 0; z < geometry.MaxZoom; z++) rows += 2L * geometry.LevelWidth(z);
        var strips = cascade.HeldPixels - rows;
        Assert.True(strips > 0 && strips <= 2L * LevelTileWriter.StripPixels, $"{width} wide: strips hold {strips} floats");
        // A writer holding a whole row of tiles per level would need 256 rows of every level.
        long tileRows = 0;
        for (var z = 0; z < geometry.MaxZoom; z++) tileRows += 256L * geometry.TilesX(z) * 256;
        if (width >= 32768) Assert.True(strips * 8 <= tileRows, $"{width} wide: {strips} floats against {tileRows} for whole tile rows");
    }

    [Theory]
    [InlineData(0)]
    [InlineData(3)]
    [InlineData(512)]
    public void A_strip_height_that_is_not_a_power_of_two_up_to_a_tile_is_refused(int stripRows)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new LevelTileWriter(Path.Combine(_folder, $"bad-{stripRows}.f32"), 10, 10, stripRows));
    }

    [Fact]
    public void Rows_out_of_order_are_refused()
    {
        using var writer = new LevelTileWriter(Path.Combine(_folder, "order.f32"), 10, 10, 4);
        writer.WriteRow(9, new float[10]);
        Assert.Throws<InvalidOperationException>(() => writer.WriteRow(7, new float[10]));
        Assert.Throws<InvalidOperationException>(() => writer.Complete());
    }

    public void Dispose() => Directory.Delete(_folder, recursive: true);
}
