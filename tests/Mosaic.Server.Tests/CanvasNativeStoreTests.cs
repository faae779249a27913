using System.Globalization;
using System.Net;
using System.Runtime.InteropServices;
using System.Text.Json;
using System.Text.Json.Nodes;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.Imaging.Pyramids;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Server.Tests;

/// <summary>
/// A canvas is resampled once, while its pyramid is built: the canvas pyramid folder holds the native level as a
/// level file, its native tiles equal the canvas plane's resampled rows bit for bit, and the native tiles,
/// render.png and box statistics of a canvas are read from that file (shown by replacing its pixels in a copy of
/// the cache). Chip pyramids keep reading their FITS planes. PNGs are decoded by ImageSharp 2.1 (outside decoder).
/// </summary>
public sealed class CanvasNativeStoreTests(CanvasDataFixture data) : IClassFixture<CanvasDataFixture>
{
    private const int T = PyramidGeometry.TileSize;

    /// <summary>A value no resampled pixel of the fixture takes (its backgrounds are some hundreds).</summary>
    private const float Marker = 1234.5f;

    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    [Theory]
    [InlineData("r")]
    [InlineData("g")]
    public void The_canvas_pyramid_stores_its_native_level_and_chip_pyramids_do_not(string band)
    {
        var (canvas, pyramid) = Ready(data.Factory.Services, band);
        Assert.True(pyramid.StoresNative);
        var folder = Path.Combine(data.Root, "cache", "pyramids", canvas.PyramidKey);
        var manifest = JsonNode.Parse(File.ReadAllText(Path.Combine(folder, "manifest.json")))!;
        Assert.True(manifest["nativeStored"]!.GetValue<bool>());
        var g = pyramid.Geometry;
        Assert.Equal((long)g.TilesX(g.MaxZoom) * g.TilesY(g.MaxZoom) * T * T * sizeof(float),
            new FileInfo(Path.Combine(folder, $"level-{g.MaxZoom:D2}.f32")).Length);

        var pyramids = data.Factory.Services.GetRequiredService<PyramidService>();
        foreach (var chip in canvas.Band.Hdus)
        {
            var chipPyramid = pyramids.GetReady(chip);
            Assert.False(chipPyramid.StoresNative, $"{chip.Description} copied its native level");
            Assert.False(File.Exists(Path.Combine(data.Root, "cache", "pyramids", chip.PyramidKey, $"level-{chipPyramid.Geometry.MaxZoom:D2}.f32")));
        }
    }

    [Theory]
    [InlineData("r")]
    [InlineData("g")]
    public void Stored_native_canvas_tiles_equal_the_canvas_plane_resampled_directly(string band)
    {
        // In-project reference: the canvas plane's own rows (checked against astropy and numpy in CanvasEndpointTests), flipped top-down.
        var (canvas, pyramid) = Ready(data.Factory.Services, band);
        var g = pyramid.Geometry;
        var plane = canvas.Plane;
        var tile = new float[T * T];
        var row = new float[g.Width];
        var rows = new float[g.Height][];
        for (var r = 0; r < g.Height; r++)
        {
            plane.ReadRow(g.Height - 1 - r, 0, row);
            rows[r] = (float[])row.Clone();
        }
        for (var ty = 0; ty < g.TilesY(g.MaxZoom); ty++)
        for (var tx = 0; tx < g.TilesX(g.MaxZoom); tx++)
        {
            pyramid.ReadTile(g.MaxZoom, tx, ty, tile);
            for (var j = 0; j < T; j++)
            for (var i = 0; i < T; i++)
            {
                int x = tx * T + i, y = ty * T + j;
                var expected = x < g.Width && y < g.Height ? rows[y][x] : float.NaN;
                var actual = tile[j * T + i];
                Assert.True(expected.Equals(actual), $"{band} canvas native ({x},{y}) from the top: plane {expected}, pyramid {actual}");
            }
        }
    }

    [Fact]
    public async Task Native_canvas_tiles_render_png_and_box_statistics_read_the_stored_level()
    {
        var (dataDir, cache, rVersion) = await BuiltCopyAsync();
        var canvasFolder = CanvasFolder(cache, rVersion);
        var maxZoom = JsonNode.Parse(File.ReadAllText(Path.Combine(canvasFolder, "manifest.json")))!["maxZoom"]!.GetValue<int>();
        // Every stored native pixel, chip gaps included, becomes the marker; the chips and their planes are untouched.
        var level = Path.Combine(canvasFolder, $"level-{maxZoom:D2}.f32");
        var marked = new float[new FileInfo(level).Length / sizeof(float)];
        marked.AsSpan().Fill(Marker);
        File.WriteAllBytes(level, MemoryMarshal.AsBytes(marked.AsSpan()).ToArray());

        using var factory = new MosaicFactory(dataDir, cache);
        using var client = factory.CreateClient();
        var camera = await CanvasDataFixture.WaitForCanvasesAsync(client, "camera");
        var canvas = camera.GetProperty("bands").EnumerateArray().Single(b => b.GetProperty("name").GetString() == "r").GetProperty("canvas");
        Assert.Equal(maxZoom, canvas.GetProperty("maxZoom").GetInt32());
        int height = canvas.GetProperty("height").GetInt32();
        var gap = data.Ref.GetProperty("gap");
        int gx = gap.GetProperty("pixelX").GetInt32(), gy = gap.GetProperty("pixelY").GetInt32();
        // Linear limits Marker ± 0.5: the marker is grey 127 or 128 (DN = round(255 (v - lo) / (hi - lo)), common practice).
        var display = $"stretch=linear&palette=gray&lo={Num(Marker - 0.5)}&hi={Num(Marker + 0.5)}";

        // The gap between CHIP01 and CHIP02 resamples to NaN (transparent) from the plane; from the stored level it is the marker.
        int column = gx - 1, fromTop = height - gy;
        using var tile = await GetPngAsync(client, $"/tiles/camera/{maxZoom}/{column / T}/{fromTop / T}.png?band=r&hdu=canvas&{display}");
        AssertMarkerGrey(tile[column % T, fromTop % T], "native tile in the gap");

        using var render = await GetPngAsync(client, $"/api/fields/camera/render.png?band=r&hdu=canvas&x0={gx - 1}&y0={gy - 1}&x1={gx + 1}&y1={gy + 1}&{display}");
        Assert.Equal((3, 3), (render.Width, render.Height));
        for (var j = 0; j < 3; j++)
        for (var i = 0; i < 3; i++) AssertMarkerGrey(render[i, j], $"render.png ({i},{j})");

        var box = await SkyAssert.Get(client, $"/api/fields/camera/stats?band=r&hdu=canvas&x0={gx - 1}&y0={gy - 1}&x1={gx + 1}&y1={gy + 1}");
        Assert.Equal(9, box.GetProperty("count").GetInt64());
        Assert.Equal(Marker, box.GetProperty("mean").GetDouble());

        // The probe keeps reading the original chips: astropy.io.fits's float32 chip value, not the marker.
        var point = data.Ref.GetProperty("r").GetProperty("points")[0];
        var probe = await SkyAssert.Get(client, $"/api/fields/camera/probe?band=r&hdu=canvas&x={Num(point.GetProperty("canvasX").GetDouble())}&y={Num(point.GetProperty("canvasY").GetDouble())}");
        Assert.Equal(point.GetProperty("value").GetDouble(), probe.GetProperty("value").GetDouble());
    }

    [Fact]
    public async Task A_cached_canvas_pyramid_without_its_native_level_is_rebuilt_with_it()
    {
        var (dataDir, cache, rVersion) = await BuiltCopyAsync();
        var canvasFolder = CanvasFolder(cache, rVersion);
        // As a build before canvases stored their native level left it: no flag, no native level file.
        var manifestPath = Path.Combine(canvasFolder, "manifest.json");
        var manifest = JsonNode.Parse(File.ReadAllText(manifestPath))!.AsObject();
        var maxZoom = manifest["maxZoom"]!.GetValue<int>();
        Assert.True(manifest.Remove("nativeStored"));
        File.WriteAllText(manifestPath, manifest.ToJsonString());
        File.Delete(Path.Combine(canvasFolder, $"level-{maxZoom:D2}.f32"));

        using var factory = new MosaicFactory(dataDir, cache);
        using var client = factory.CreateClient();
        await CanvasDataFixture.WaitForCanvasesAsync(client, "camera");
        var (_, pyramid) = Ready(factory.Services, "r");
        Assert.True(pyramid.StoresNative);
        Assert.True(File.Exists(Path.Combine(CanvasFolder(cache, rVersion), $"level-{maxZoom:D2}.f32")));
        Assert.True(JsonNode.Parse(File.ReadAllText(manifestPath))!["nativeStored"]!.GetValue<bool>());
    }

    private static (FieldHdu Canvas, Pyramid Pyramid) Ready(IServiceProvider services, string band)
    {
        var canvas = services.GetRequiredService<FieldCatalog>().Get("camera").ResolveBand(band).ResolveHdu("canvas");
        Assert.True(canvas.IsCanvas);
        return (canvas, services.GetRequiredService<PyramidService>().GetReady(canvas));
    }

    /// <summary>A copy of the camera data and a cache where a first server has built every pyramid and stopped.</summary>
    private async Task<(string DataDir, string Cache, string RVersion)> BuiltCopyAsync()
    {
        var dataDir = Path.Combine(data.Root, $"native-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Path.Combine(dataDir, "camera"));
        foreach (var file in Directory.GetFiles(Path.Combine(data.DataDirectory, "camera")))
            File.Copy(file, Path.Combine(dataDir, "camera", Path.GetFileName(file)));
        var cache = Path.Combine(data.Root, $"native-cache-{Guid.NewGuid():N}");
        JsonElement listing;
        using (var first = new MosaicFactory(dataDir, cache))
        using (var client = first.CreateClient())
            listing = await CanvasDataFixture.WaitForCanvasesAsync(client, "camera");
        var rVersion = listing.GetProperty("bands").EnumerateArray().Single(b => b.GetProperty("name").GetString() == "r").GetProperty("version").GetString()!;
        return (dataDir, cache, rVersion);
    }

    /// <summary>A canvas pyramid's folder is named by its band's version, then "-canvas-" and the plan's hash.</summary>
    private static string CanvasFolder(string cache, string version) =>
        Assert.Single(Directory.GetDirectories(Path.Combine(cache, "pyramids"), $"{version}-canvas-*"));

    private static async Task<Image<Rgba32>> GetPngAsync(HttpClient client, string url)
    {
        var response = await client.GetAsync(url);
        var bytes = await response.Content.ReadAsByteArrayAsync();
        Assert.True(response.StatusCode == HttpStatusCode.OK, $"{url}: {(int)response.StatusCode} {System.Text.Encoding.UTF8.GetString(bytes)}");
        return Image.Load<Rgba32>(bytes);
    }

    private static void AssertMarkerGrey(Rgba32 pixel, string where)
    {
        Assert.Equal(255, pixel.A);
        Assert.True(pixel.R is 127 or 128 && pixel.G == pixel.R && pixel.B == pixel.R, $"{where}: {pixel} is not the marker's grey");
    }
}
