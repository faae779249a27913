using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Imaging.Tests.Rendering;

/// <summary>
/// render.png read a band of rows at a time must give the very PNG of the in-memory path (itself checked against
/// ImageSharp and Pillow in <see cref="ColorRenderingTests"/>), asking for no more than the band bound at once.
/// </summary>
public sealed class StreamingRegionTests
{
    private const double Lo = 0, Hi = 400;
    private const int Wide = RegionRenderer.BandFloats + 3; // one row is more than a band

    public enum Mask { None, FirstRow, LastRow, Scattered }

    [Theory]
    [InlineData(1, 1)]
    [InlineData(300, 7)]
    [InlineData(1500, 1100)] // bands of 699 rows: 699 + 401
    [InlineData(4096, 700)] // bands of 256 rows: 256 + 256 + 188
    [InlineData(Wide, 2)]
    public void Streaming_gives_the_same_bytes_as_the_span_overload(int width, int height)
    {
        var values = Values(width, height);
        var palettes = new IPalette[] { new GrayPalette(), new CubehelixPalette() };
        var maskedColours = new[] { MaskedColor.Transparent, MaskedColor.Parse("ff00ff") };
        foreach (var mask in Enum.GetValues<Mask>())
        {
            var masked = WithMask(values, width, height, mask);
            foreach (var palette in palettes)
                foreach (var maskedColour in maskedColours)
                {
                    var map = ToneMap.Create(new ValueRange(Lo, Hi), new SqrtStretch(), palette);
                    var expected = RegionRenderer.RenderPng(masked, width, height, map, maskedColour);
                    var streamed = RegionRenderer.RenderPng(Reader(masked, width), width, height, map, maskedColour);
                    Assert.True(expected.AsSpan().SequenceEqual(streamed),
                        $"{width} x {height}, {mask}, {palette.GetType().Name}, masked {maskedColour}: {streamed.Length} bytes streamed, {expected.Length} in memory");
                }
        }
        // One decode by an outside reader (ImageSharp 2.1): size and the masked pixels.
        var lastRow = WithMask(values, width, height, Mask.LastRow);
        var gray = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), new GrayPalette());
        using var image = Image.Load<La16>(RegionRenderer.RenderPng(Reader(lastRow, width), width, height, gray, MaskedColor.Transparent));
        Assert.Equal((width, height), (image.Width, image.Height));
        for (var x = 0; x < Math.Min(width, 5000); x++)
            Assert.Equal(0, image[x, height - 1].A);
        if (height > 1) Assert.Equal(255, image[0, 0].A);
    }

    [Theory]
    [InlineData(1500, 1100, Mask.None)]
    [InlineData(1500, 1100, Mask.FirstRow)]
    [InlineData(1500, 1100, Mask.LastRow)]
    [InlineData(4096, 700, Mask.Scattered)]
    [InlineData(1024, 2048, Mask.LastRow)] // bands of exactly 1024 rows
    [InlineData(Wide, 3, Mask.LastRow)]
    public void Reader_is_asked_for_whole_rows_in_bands_no_larger_than_the_bound(int width, int height, Mask mask)
    {
        var values = WithMask(Values(width, height), width, height, mask);
        var inner = Reader(values, width);
        var calls = new List<(int First, int Rows)>();
        var largest = 0;
        RowBandReader recording = (first, destination) =>
        {
            Assert.Equal(0, destination.Length % width);
            largest = Math.Max(largest, destination.Length);
            calls.Add((first, destination.Length / width));
            inner(first, destination);
        };
        var map = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), new GrayPalette());
        var png = RegionRenderer.RenderPng(recording, width, height, map, MaskedColor.Transparent);

        Assert.InRange(largest, 1, Math.Max(RegionRenderer.BandFloats, width));
        // Sequential runs from the top: at most two (look for NaN, then encode), the last one ending at the bottom.
        var runs = new List<(int Start, int End)>();
        foreach (var (first, rows) in calls)
        {
            if (runs.Count > 0 && runs[^1].End == first) runs[^1] = (runs[^1].Start, first + rows);
            else runs.Add((first, first + rows));
        }
        Assert.All(runs, run => Assert.Equal(0, run.Start));
        Assert.InRange(runs.Count, 1, 2);
        Assert.Equal(height, runs[^1].End);
        // The first pass stops at the band holding a NaN and that band is encoded without being read again
        // (every case here has more than one band, so a full first pass ends on a band the encoder must re-read).
        var bands = Bands(height, Math.Max(1, RegionRenderer.BandFloats / width));
        Assert.True(bands > 1);
        var expectedReads = mask is Mask.FirstRow or Mask.Scattered ? bands : 2 * bands;
        Assert.Equal(expectedReads, calls.Count);
        Assert.Equal(RegionRenderer.RenderPng(values, width, height, map, MaskedColor.Transparent), png);
    }

    [Fact]
    public void Streaming_refuses_what_the_span_overload_refuses()
    {
        var map = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), new GrayPalette());
        RowBandReader never = (_, _) => throw new InvalidOperationException("no read expected");
        Assert.Throws<ArgumentOutOfRangeException>(() => RegionRenderer.RenderPng(never, 10_000, 5_001, map, MaskedColor.Transparent));
        Assert.Throws<ArgumentOutOfRangeException>(() => RegionRenderer.RenderPng(never, 0, 3, map, MaskedColor.Transparent));
        Assert.Throws<ArgumentOutOfRangeException>(() => RegionRenderer.RenderPng(never, 3, -1, map, MaskedColor.Transparent));
        Assert.Throws<ArgumentNullException>(() => RegionRenderer.RenderPng((RowBandReader)null!, 3, 3, map, MaskedColor.Transparent));
    }

    private static int Bands(int height, int bandRows) => (height + bandRows - 1) / bandRows;

    private static RowBandReader Reader(float[] values, int width) =>
        (first, destination) => values.AsSpan(first * width, destination.Length).CopyTo(destination);

    // A ramp across lo..hi plus a deterministic ripple, changing from row to row so a misplaced band would show.
    private static float[] Values(int width, int height)
    {
        var values = new float[(long)width * height];
        for (var y = 0; y < height; y++)
            for (var x = 0; x < width; x++)
                values[(long)y * width + x] = (float)(-20 + 440.0 * ((x * 7 + y * 13) % 997) / 996.0);
        return values;
    }

    private static float[] WithMask(float[] values, int width, int height, Mask mask)
    {
        var copy = (float[])values.Clone();
        switch (mask)
        {
            case Mask.FirstRow: copy.AsSpan(0, width).Fill(float.NaN); break;
            case Mask.LastRow: copy.AsSpan((height - 1) * width, width).Fill(float.NaN); break;
            case Mask.Scattered: for (var i = 5; i < copy.Length; i += 1009) copy[i] = float.NaN; break;
        }
        return copy;
    }
}
