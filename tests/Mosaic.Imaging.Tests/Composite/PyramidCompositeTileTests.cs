using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Tests.Display;

namespace Mosaic.Imaging.Tests.Composite;

/// <summary>
/// Colour tiles from three pyramids at the native level (read from the FITS files, not stored), against
/// astropy.visualization.make_lupton_rgb (Debian python3-astropy) on the same files as astropy.io.fits reads them:
/// interior tiles of bands with no masked pixel (the path that skips looking for one), edge tiles, and bands with holes.
/// </summary>
public sealed class PyramidCompositeTileTests
{
    private const int T = PyramidGeometry.TileSize;
    private const int Width = 600, Height = 300;

    // The frame as astropy reads it, flipped so the top row (the highest FITS y) comes first, as in a tile.
    private const string Script = """
        import sys, json
        import numpy as np
        from astropy.io import fits
        from astropy.visualization import make_lupton_rgb
        p = json.loads(sys.argv[1])
        bands = [fits.getdata(f"{c}.fits").astype(np.float32)[::-1] for c in "rgb"]
        scaled = [((b - np.float32(m)) * np.float32(1)).astype(np.float32) for b, m in zip(bands, p["min"])]
        with np.errstate(invalid="ignore"):
            rgb = make_lupton_rgb(*scaled, minimum=0, stretch=p["range"], Q=p["q"])
        rgb.astype(np.uint8).tofile("reference.u8")
        print(rgb.shape[1], rgb.shape[0])
        """;

    [Theory]
    [InlineData(-1)]
    [InlineData(1)]
    public void Native_tiles_agree_with_make_lupton_rgb_within_1_DN(int holesIn)
    {
        using var folder = new TemporaryFolder();
        var bands = CompositeImages.Bands(Width, Height, holesIn);
        var files = new FitsFile[3];
        var pyramids = new Pyramid[3];
        try
        {
            for (var c = 0; c < 3; c++)
            {
                // Band rows as FITS rows: row 0 is FITS y = 1, the bottom of the frame.
                var path = folder.File($"{"rgb"[c]}.fits");
                using (var stream = File.Create(path))
                using (var writer = new FitsWriter(stream))
                    writer.WriteFloatImage([], Width, Height, bands[c]);
                files[c] = FitsFile.Open(path);
                var plane = files[c].Hdus[0].Image!;
                PyramidBuilder.Build(plane, folder.File($"pyramid-{c}"), null, CancellationToken.None);
                pyramids[c] = Pyramid.Open(folder.File($"pyramid-{c}"), plane);
                Assert.False(pyramids[c].StoresNative);
            }
            Assert.Equal(holesIn < 0, pyramids.All(p => p.Histogram.MaskedCount == 0));

            double q = 8, range = 60;
            double[] min = [32, 30, 21];
            var channels = new Channels<ChannelBand>(
                new ChannelBand(pyramids[0].Statistics, pyramids[0].Histogram),
                new ChannelBand(pyramids[1].Statistics, pyramids[1].Histogram),
                new ChannelBand(pyramids[2].Statistics, pyramids[2].Histogram));
            var map = new LuptonSettings(q, range, new Channels<double>(min[0], min[1], min[2])).Compile(channels);

            var printed = Mosaic.Testing.DebianPython.RunCode(Script,
                [System.Text.Json.JsonSerializer.Serialize(new { q, range, min })], workingDirectory: folder.Path);
            Assert.Equal($"{Width} {Height}", printed.Trim());
            var reference = File.ReadAllBytes(folder.File("reference.u8"));

            var g = pyramids[0].Geometry;
            var z = g.MaxZoom;
            Assert.Equal((3, 2), (g.TilesX(z), g.TilesY(z)));
            int worst = 0, differing = 0, compared = 0, masked = 0;
            for (var ty = 0; ty < g.TilesY(z); ty++)
            for (var tx = 0; tx < g.TilesX(z); tx++)
            {
                var png = CompositeRenderer.RenderTile(new Channels<Pyramid>(pyramids[0], pyramids[1], pyramids[2]), z, tx, ty, map);
                var ours = CompositeImages.Rgba(png, out var w, out var h);
                Assert.Equal((T, T), (w, h));
                for (var r = 0; r < T; r++)
                for (var c = 0; c < T; c++)
                {
                    int i = tx * T + c, j = ty * T + r, k = r * T + c;
                    var outside = i >= Width || j >= Height;
                    var isMasked = outside || float.IsNaN(bands[1][(Height - 1 - j) * Width + i]) && holesIn == 1;
                    // Masked and outside pixels are transparent (alpha 0, W3C PNG 2003 section 6.1); the rest opaque.
                    Assert.Equal(isMasked ? 0 : 255, ours[4 * k + 3]);
                    if (isMasked)
                    {
                        if (!outside) masked++;
                        continue;
                    }
                    for (var ch = 0; ch < 3; ch++)
                    {
                        var d = Math.Abs(ours[4 * k + ch] - reference[3 * (j * Width + i) + ch]);
                        worst = Math.Max(worst, d);
                        if (d > 0) differing++;
                    }
                    compared++;
                }
            }
            Assert.Equal(Width * Height - masked, compared);
            Assert.True(worst <= 1, $"largest difference {worst} DN");
            Assert.True(differing < compared * 3 / 100, $"{differing} channel values differ by 1 DN");
            if (holesIn == 1) Assert.True(masked >= 100, $"only {masked} masked pixels");
            else Assert.Equal(0, masked);
        }
        finally
        {
            foreach (var pyramid in pyramids) pyramid?.Dispose();
            foreach (var file in files) file?.Dispose();
        }
    }
}
