using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Tests.Display;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Imaging.Tests.Rendering;

/// <summary>Rendered tiles, decoded by ImageSharp 2.1.13: gray where nothing is masked, gray + alpha with masked and outside pixels clear.</summary>
public sealed class TileRendererTests : IDisposable
{
    private const int T = PyramidGeometry.TileSize;
    private const int Width = 300, Height = 200;
    private readonly TemporaryFolder _folder = new();
    private readonly ToneMap _toneMap = ToneMap.Create(new ValueRange(0, 400), new AsinhCurve(0, 400, 20, 0), new GrayPalette());

    [Fact]
    public void A_tile_without_masked_pixels_is_plain_gray()
    {
        var tile = SyntheticSky.Make(T, T, seed: 2, background: 100, noise: 15);
        var png = TileRenderer.RenderPng(tile, _toneMap);
        Assert.Equal(0, png[25]); // IHDR colour type byte (8 signature + 8 chunk header + 9): 0 = greyscale
        using var image = Image.Load<L8>(png);
        Assert.Equal(PngColorType.Grayscale, image.Metadata.GetPngMetadata().ColorType);
        var levels = new byte[tile.Length];
        _toneMap.Apply(tile, levels);
        for (var y = 0; y < T; y++)
            for (var x = 0; x < T; x++)
                Assert.Equal(levels[y * T + x], image[x, y].PackedValue);
    }

    [Fact]
    public void Masked_pixels_are_transparent_and_the_rest_opaque()
    {
        var tile = SyntheticSky.Make(T, T, seed: 3, background: 100, noise: 15, holes: true);
        for (var x = 0; x < T; x++) tile[77 * T + x] = float.NaN; // a masked row
        var png = TileRenderer.RenderPng(tile, _toneMap);
        Assert.Equal(4, png[25]); // colour type 4 = greyscale with alpha
        using var image = Image.Load<La16>(png);
        var levels = new byte[tile.Length];
        _toneMap.Apply(tile, levels);
        for (var y = 0; y < T; y++)
            for (var x = 0; x < T; x++)
            {
                var masked = float.IsNaN(tile[y * T + x]);
                Assert.Equal(masked ? 0 : 255, image[x, y].A);
                if (!masked) Assert.Equal(levels[y * T + x], image[x, y].L);
            }
    }

    [Fact]
    public void Tiles_from_a_pyramid_put_the_highest_row_on_top_and_clear_what_lies_outside()
    {
        // A 300 x 200 frame: at the native zoom it spans two tiles across and one down, with 56 rows and (in the
        // second tile) 212 columns outside the image.
        var data = SyntheticSky.Make(Width, Height, seed: 6, background: 100, noise: 15, holes: true);
        var path = _folder.File("frame.fits");
        using (var writer = new FitsWriter(File.Create(path))) writer.WriteFloatImage([], Width, Height, data);
        using var fits = FitsFile.Open(path);
        var plane = fits.Hdus[0].Image!;
        var pyramidFolder = _folder.File("pyramid");
        PyramidBuilder.Build(plane, pyramidFolder, null, CancellationToken.None);
        using var pyramid = Pyramid.Open(pyramidFolder, plane);
        var z = pyramid.Geometry.MaxZoom;
        Assert.Equal(1, z);

        for (var tx = 0; tx < 2; tx++)
        {
            using var image = Image.Load<La16>(TileRenderer.RenderPng(pyramid, z, tx, 0, _toneMap));
            Assert.Equal(T, image.Width);
            Assert.Equal(T, image.Height);
            for (var py = 0; py < T; py++)
                for (var px = 0; px < T; px++)
                {
                    var column = tx * T + px;
                    // Tile row 0 is the image's top, the highest FITS y: stored row Height - 1 - py.
                    var inside = column < Width && py < Height;
                    var value = inside ? data[(Height - 1 - py) * Width + column] : float.NaN;
                    var pixel = image[px, py];
                    if (float.IsNaN(value)) Assert.Equal(0, pixel.A);
                    else
                    {
                        Assert.Equal(255, pixel.A);
                        Assert.Equal(_toneMap.LevelOf(value), pixel.L);
                    }
                }
        }
    }

    [Fact]
    public void A_tile_outside_the_pyramid_is_refused()
    {
        var data = new float[Width * Height];
        var path = _folder.File("flat.fits");
        using (var writer = new FitsWriter(File.Create(path))) writer.WriteFloatImage([], Width, Height, data);
        using var fits = FitsFile.Open(path);
        var plane = fits.Hdus[0].Image!;
        PyramidBuilder.Build(plane, _folder.File("flat"), null, CancellationToken.None);
        using var pyramid = Pyramid.Open(_folder.File("flat"), plane);
        Assert.Throws<ArgumentOutOfRangeException>(() => TileRenderer.RenderPng(pyramid, 1, 2, 0, _toneMap));
        Assert.Throws<ArgumentOutOfRangeException>(() => TileRenderer.RenderPng(pyramid, 2, 0, 0, _toneMap));
        Assert.Throws<ArgumentOutOfRangeException>(() => TileRenderer.RenderPng(pyramid, 0, 0, -1, _toneMap));
    }

    [Fact]
    public void A_tile_of_the_wrong_size_is_refused()
    {
        var error = Assert.Throws<ArgumentException>(() => TileRenderer.RenderPng(new float[T * T - 1], _toneMap));
        Assert.Equal("tile", error.ParamName);
    }

    [Fact]
    public void The_default_display_renders_a_sky_tile_end_to_end()
    {
        var tile = SyntheticSky.Make(T, T, seed: 8);
        var (statistics, histogram) = SyntheticSky.Statistics(tile);
        var toneMap = DisplaySettings.Default.Compile(statistics, histogram);
        using var image = Image.Load<L8>(TileRenderer.RenderPng(tile, toneMap));
        var levels = new byte[tile.Length];
        toneMap.Apply(tile, levels);
        Assert.Equal(levels[12345], image[12345 % T, 12345 / T].PackedValue);
        Assert.Equal(levels[^1], image[T - 1, T - 1].PackedValue);
    }

    public void Dispose() => _folder.Dispose();
}
